import { ConflictError } from '../common/errors/domain-errors';
import { CellTakenError, TIME_TAKEN, retryAborted } from './booking-errors';

/* Error numbers: MariaDB Server error codes (1213 ER_LOCK_DEADLOCK, also a Galera certification failure; 1062 ER_DUP_ENTRY). */

/** An error as mysql2 gives it: an Error with the server's errno. */
const dbError = (errno: number): Error => Object.assign(new Error(`errno ${errno}`), { errno });

describe('retryAborted', () => {
  it('runs the transaction again after a deadlock or a taken cell, then returns its result', async () => {
    const failures: Error[] = [dbError(1213), new CellTakenError(TIME_TAKEN)];
    let runs = 0;
    const got = await retryAborted(() => {
      runs++;
      const f = failures.shift();
      return f ? Promise.reject(f) : Promise.resolve('booked');
    });
    expect(got).toBe('booked');
    expect(runs).toBe(3);
  });

  it('a cell still taken after the last attempt is a 409, never a 500', async () => {
    const run = retryAborted(() => Promise.reject(new CellTakenError(TIME_TAKEN)), 3);
    await expect(run).rejects.toBeInstanceOf(ConflictError);
    await expect(retryAborted(() => Promise.reject(new CellTakenError(TIME_TAKEN)), 2)).rejects.toThrow(
      TIME_TAKEN,
    );
  });

  it('anything else is thrown at once (a duplicate key outside the cells, say)', async () => {
    let runs = 0;
    const dup = dbError(1062);
    await expect(
      retryAborted(() => {
        runs++;
        return Promise.reject(dup);
      }),
    ).rejects.toBe(dup);
    expect(runs).toBe(1);
  });
});
