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
  // database/pool-deadlines.ts: no free connection within DB_ACQUIRE_TIMEOUT_MS
  'POOL_ACQUIRE_TIMEOUT',
  // MariaDB ends its clients' connections with these while it shuts down
  'ER_CONNECTION_KILLED',
  'ER_QUERY_INTERRUPTED',
  'ER_CLIENT_INTERACTION_TIMEOUT',
  // 1047 from a Galera node that is not part of the primary component (yet): "WSREP has not yet
  // prepared node for application use" (MariaDB docs, Galera cluster: wsrep_ready); another
  // connection reaches a node that is.
  'ER_UNKNOWN_COM_ERROR',
]);

/**
 * 1213 (a deadlock, or on a Galera cluster a write that lost certification to another node's) and
 * 1205 (a lock wait timeout) that were still there after the retries a transaction got: another
 * request changed the same rows at the same moment (MariaDB Server error codes).
 */
const CONFLICT_ERRNOS = new Set([1213, 1205]);

export function isWriteConflict(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 3) return false;
  const e = err as { errno?: unknown; driverError?: unknown; cause?: unknown };
  if (typeof e.errno === 'number' && CONFLICT_ERRNOS.has(e.errno)) return true;
  return isWriteConflict(e.driverError, depth + 1) || isWriteConflict(e.cause, depth + 1);
}

export const WRITE_CONFLICT_MESSAGE =
  'Someone else changed this at the same moment, so nothing was changed. Reload and try again.';

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
  // mysql2's words for a pooled connection whose server went away (a server shutting down, a cluster
  // node killed mid-query)
  if (
    typeof e.message === 'string' &&
    /^Pool is closed|Connection lost|connect ETIMEDOUT|closed state|Server shutdown in progress/i.test(
      e.message,
    )
  )
    return true;
  return isDatabaseUnavailable(e.driverError, depth + 1) || isDatabaseUnavailable(e.cause, depth + 1);
}

/**
 * Not "nothing was changed": a connection that dies after the server committed but before it
 * answered leaves a change made that the request could not confirm (docs/architecture.md, Failure
 * behaviour).
 */
export const DATABASE_UNAVAILABLE_MESSAGE =
  "Loamline can't reach its database just now. Try again in a minute; if you were saving something, check whether it went through first.";

/** Seconds a client should wait before asking again after a 503 (RFC 9110, section 10.2.3). */
export const RETRY_AFTER_SECONDS = 5;

export const databaseUnavailable = (): ServiceUnavailableException =>
  new ServiceUnavailableException(DATABASE_UNAVAILABLE_MESSAGE);
