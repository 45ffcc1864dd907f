import { STAFF_ROLES, type AuthUser, type Role } from '@loamline/shared-types';

/** Who is signed in: `GET /api/auth/me` (docs/api/openapi.json). */
export type SessionUser = AuthUser;

export const isStaff = (user: SessionUser | null | undefined): boolean =>
  !!user && (STAFF_ROLES as readonly Role[]).includes(user.role);

export const ROLE_LABELS: Record<Role, string> = {
  rider: 'Rider',
  technician: 'Technician',
  owner: 'Shop owner',
};
