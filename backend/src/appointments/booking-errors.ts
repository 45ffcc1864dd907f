/** MariaDB error numbers the booking transaction handles (MariaDB Server error codes). */
export const ER_DUP_ENTRY = 1062;
/** A deadlock, or on a Galera cluster a certification conflict with another node's write. */
export const ER_LOCK_DEADLOCK = 1213;
export const ER_LOCK_WAIT_TIMEOUT = 1205;

export function errno(e: unknown): number | undefined {
  const any = e as { errno?: number; driverError?: { errno?: number } };
  return any?.driverError?.errno ?? any?.errno;
}

/**
 * Runs a transaction again when the database aborted it as a deadlock or a cluster conflict, with
 * a short random back-off; anything else is thrown at once.
 */
export async function retryAborted<T>(fn: () => Promise<T>, attempts = 8): Promise<T> {
  for (let i = 1; ; i++) {
    try {
      return await fn();
    } catch (e) {
      const n = errno(e);
      if (i >= attempts || (n !== ER_LOCK_DEADLOCK && n !== ER_LOCK_WAIT_TIMEOUT)) throw e;
      await new Promise((r) => setTimeout(r, 5 + Math.random() * 20 * i));
    }
  }
}
