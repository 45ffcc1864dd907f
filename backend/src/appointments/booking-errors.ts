import { ConflictError } from '../common/errors/domain-errors';

/** MariaDB error numbers the booking transaction handles (MariaDB Server error codes). */
export const ER_DUP_ENTRY = 1062;
/** A deadlock, or on a Galera cluster a certification conflict with another node's write. */
export const ER_LOCK_DEADLOCK = 1213;
export const ER_LOCK_WAIT_TIMEOUT = 1205;

export function errno(e: unknown): number | undefined {
  const any = e as { errno?: number; driverError?: { errno?: number } };
  return any?.driverError?.errno ?? any?.errno;
}

export const TIME_TAKEN = 'That time is no longer free. Pick another one.';

/**
 * A bench cell the transaction read as free was taken by another booking before it wrote (a
 * duplicate key): the transaction is run again from its start, and its next read sees the cell.
 */
export class CellTakenError extends Error {}

/**
 * Runs a transaction again when the database aborted it as a deadlock or a cluster conflict, or a
 * cell it meant to take was taken meanwhile, with a short random back-off; anything else is thrown
 * at once. A cell still taken after the last attempt is a 409.
 */
export async function retryAborted<T>(fn: () => Promise<T>, attempts = 8): Promise<T> {
  for (let i = 1; ; i++) {
    try {
      return await fn();
    } catch (e) {
      const n = errno(e);
      const again = e instanceof CellTakenError || n === ER_LOCK_DEADLOCK || n === ER_LOCK_WAIT_TIMEOUT;
      if (i >= attempts || !again) throw e instanceof CellTakenError ? new ConflictError(e.message) : e;
      await new Promise((r) => setTimeout(r, 5 + Math.random() * 20 * i));
    }
  }
}
