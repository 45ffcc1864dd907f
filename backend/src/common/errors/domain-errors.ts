import type { Role } from '@loamline/shared-types';

/**
 * Who is doing something: the signed-in user, or the system (a scheduled job, a payment webhook).
 * Services take an actor instead of a request, so jobs and webhooks can call them too.
 */
export type Actor =
  { kind: 'user'; userId: string; role: Role; shopId: string | null } | { kind: 'system'; reason: string };

export const systemActor = (reason: string): Actor => ({ kind: 'system', reason });

/**
 * Errors of the domain, free of HTTP. The one exception filter maps each to its status; `fields`
 * names the inputs at fault, as the validation pipe does.
 */
export abstract class DomainError extends Error {
  abstract readonly status: number;
  constructor(
    message: string,
    readonly fields?: Record<string, string>,
  ) {
    super(message);
  }
}

/** The thing does not exist, or the actor may not know it exists (404). */
export class NotFoundError extends DomainError {
  override readonly name = 'NotFoundError';
  readonly status = 404;
}

/** The actor may not do this (403). */
export class ForbiddenError extends DomainError {
  override readonly name = 'ForbiddenError';
  readonly status = 403;
}

/** The state of things does not allow it now: a taken time, a transition not in the table (409). */
export class ConflictError extends DomainError {
  override readonly name = 'ConflictError';
  readonly status = 409;
}

/** The input is well-formed but not acceptable (400). */
export class InvalidInputError extends DomainError {
  override readonly name = 'InvalidInputError';
  readonly status = 400;
}

/** The upload is larger than the route takes (413). */
export class TooLargeError extends DomainError {
  override readonly name = 'TooLargeError';
  readonly status = 413;
}

/** A service the app depends on is not there (503). */
export class UnavailableError extends DomainError {
  override readonly name = 'UnavailableError';
  readonly status = 503;
}
