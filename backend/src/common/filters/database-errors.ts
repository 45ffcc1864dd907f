import { ServiceUnavailableException } from '@nestjs/common';

/** Error codes of mysql2 and Node's sockets that mean "the database is not there", not "bad query". */
const UNAVAILABLE_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'ETIMEDOUT',
  'EPIPE',
  'EHOSTUNREACH',
  'ENETUNREACH',
  'ENOTFOUND',
  'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST',
  'PROTOCOL_SEQUENCE_TIMEOUT',
  'ER_CON_COUNT_ERROR',
  'ER_SERVER_SHUTDOWN',
  'ER_SERVER_IS_IN_SECURE_AUTH_MODE',
]);

interface MaybeDriverError {
  code?: unknown;
  message?: unknown;
  fatal?: unknown;
  driverError?: MaybeDriverError;
  cause?: MaybeDriverError;
}

/** True for an error (TypeORM's or mysql2's) that says the database cannot be reached. */
export function isDatabaseUnavailable(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 3) return false;
  const e = err as MaybeDriverError;
  if (typeof e.code === 'string' && UNAVAILABLE_CODES.has(e.code)) return true;
  if (typeof e.message === 'string' && /^Pool is closed|Connection lost|connect ETIMEDOUT/i.test(e.message))
    return true;
  return isDatabaseUnavailable(e.driverError, depth + 1) || isDatabaseUnavailable(e.cause, depth + 1);
}

export const DATABASE_UNAVAILABLE_MESSAGE =
  "Loamline can't reach its database just now. Nothing was changed; try again in a minute.";

export const databaseUnavailable = (): ServiceUnavailableException =>
  new ServiceUnavailableException(DATABASE_UNAVAILABLE_MESSAGE);
