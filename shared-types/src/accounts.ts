import type { BaselineInput, BaselineResult, ForkInput, ShockInput } from './baselines';
import type { Role, RidingFeel, RidingStyle } from './enums';

/**
 * Accounts, the rider's garage and saved baseline sheets: request and response bodies of the
 * routes in docs/api (sign-in and roles, baselines). Ids are UUID strings; dates ISO-8601 (UTC).
 */

/** Passwords: at least this long (NIST SP 800-63B §5.1.1.1 asks for 8 or more; we ask a little more). */
export const PASSWORD_MIN_LENGTH = 10;
/** ... and at most this long (SP 800-63B: allow at least 64). */
export const PASSWORD_MAX_LENGTH = 128;

/** The name of the httpOnly session cookie that carries the signed JWT. */
export const SESSION_COOKIE = 'loamline_session';

/** Roles a shop owner may invite. */
export const STAFF_ROLES = ['technician', 'owner'] as const;
export type StaffRole = (typeof STAFF_ROLES)[number];

/** The signed-in user, as `GET /api/auth/me` answers. Never carries the password or its hash. */
export interface AuthUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  /** the shop a technician or owner works for; null for riders */
  shopId: string | null;
}

/** `POST /api/auth/register` */
export interface RegisterRequest {
  email: string;
  password: string;
  name: string;
}
/** 201, with the session cookie set */
export interface RegisterResponse {
  user: AuthUser;
}

/** `POST /api/auth/sign-in` */
export interface SignInRequest {
  email: string;
  password: string;
}
/** 200, with the session cookie set; `accessToken` is the same JWT for `Authorization: Bearer` */
export interface SignInResponse {
  user: AuthUser;
  accessToken: string;
}

/** `POST /api/auth/password-reset` → 202 whether or not the address has an account */
export interface PasswordResetRequest {
  email: string;
}
/** `POST /api/auth/password-reset/confirm` → 204; the token comes from the e-mailed link `/reset-password?token=…` */
export interface PasswordResetConfirmRequest {
  token: string;
  password: string;
}

/* ------------------------------------------------------------------ shops and their team */

export interface ShopSummary {
  id: string;
  slug: string;
  name: string;
  town: string;
  /** IANA time-zone name, e.g. `America/Denver` */
  timeZone: string;
  /** ISO 4217 code, e.g. `USD` */
  currency: string;
}

/** `POST /api/workshop/team/invitations` (owner) → 201 `InvitationView` */
export interface CreateInvitationRequest {
  email: string;
  role: StaffRole;
}

export interface InvitationView {
  id: string;
  email: string;
  role: StaffRole;
  createdAt: string;
  expiresAt: string;
  /** name of the owner who sent it, null when that account is gone */
  invitedByName: string | null;
}

/** `GET /api/invitations/:token` (public): what the join page shows; 404 when unknown, used or expired */
export interface InvitationLookup {
  shopName: string;
  email: string;
  role: StaffRole;
}

/** `POST /api/invitations/accept` (public) → 201 `RegisterResponse`, signed in as staff of the shop */
export interface AcceptInvitationRequest {
  token: string;
  name: string;
  password: string;
}

export interface TeamMember {
  id: string;
  name: string;
  email: string;
  role: StaffRole;
  createdAt: string;
}

/** `GET /api/workshop/team` (staff): the shop, its members and the invitations not yet used or expired */
export interface TeamResponse {
  shop: ShopSummary;
  members: TeamMember[];
  invitations: InvitationView[];
}

/* ------------------------------------------------------------------ the garage */

/**
 * `POST /api/bikes` and (every field optional) `PATCH /api/bikes/:id`. The specs are the wizard's
 * Bike step as the compute API takes them (`ForkInput` / `ShockInput`, optional real geometry
 * included), so picking a bike fills that step as is. Either part may be null (a hardtail: no shock).
 */
export interface BikeRequest {
  name: string;
  fork?: ForkInput | null;
  shock?: ShockInput | null;
}
export type UpdateBikeRequest = Partial<BikeRequest>;

export interface Bike {
  id: string;
  name: string;
  fork: ForkInput | null;
  shock: ShockInput | null;
  createdAt: string;
  updatedAt: string;
}

/* ------------------------------------------------------------------ baseline sheets */

/** `POST /api/baseline-sheets` → 201 `BaselineSheet`; the server computes the result with the model */
export interface CreateBaselineSheetRequest {
  name: string;
  input: BaselineInput;
}

/** `PATCH /api/baseline-sheets/:id` (rename) → 200 `BaselineSheet` */
export interface RenameBaselineSheetRequest {
  name: string;
}

/** A saved baseline: the input and the result exactly as computed when it was saved. */
export interface BaselineSheet {
  id: string;
  name: string;
  input: BaselineInput;
  result: BaselineResult;
  createdAt: string;
  updatedAt: string;
}

/** The key figures of one part of a sheet, for lists (no curves). */
export interface BaselineSheetPartSummary {
  targetSagPct: number;
  targetSagMm: number;
  /** unrounded starting pressure, null for a coil spring */
  pressurePsi: number | null;
  rangePsi: [number, number] | null;
  /** suggested stocked coil rate, null for an air spring */
  coilLbPerIn: number | null;
  warnings: number;
}

/** `GET /api/baseline-sheets` → `BaselineSheetListItem[]`, newest first, without the curves */
export interface BaselineSheetListItem {
  id: string;
  name: string;
  massKg: number;
  style: RidingStyle;
  feel: RidingFeel;
  fork: BaselineSheetPartSummary | null;
  shock: BaselineSheetPartSummary | null;
  createdAt: string;
  updatedAt: string;
}
