import {
  ACQUIRE_TIMEOUT_CODE,
  boundPool,
  type DeadlineConnection,
  type DeadlinePool,
} from './pool-deadlines';

/** A stand-in for a mysql2 pool: the test decides when (and whether) a connection is handed out. */
function fakePool() {
  const waiting: ((err: Error | null, c?: DeadlineConnection) => void)[] = [];
  let onConnection: (c: DeadlineConnection) => void = () => undefined;
  const pool: DeadlinePool = {
    getConnection: (cb) => void waiting.push(cb),
    on: (_event, listener) => {
      onConnection = listener;
      return pool;
    },
  };
  const connection = () => {
    const c = {
      destroyed: false,
      released: 0,
      lastCb: null as ((err: unknown, rows?: unknown) => void) | null,
      query: (...args: unknown[]) => {
        c.lastCb = args[args.length - 1] as (err: unknown, rows?: unknown) => void;
      },
      destroy: () => {
        c.destroyed = true;
      },
      release: () => {
        c.released += 1;
      },
    };
    return c;
  };
  return { pool, waiting, connection, newConnection: (c: DeadlineConnection) => onConnection(c) };
}

describe('pool deadlines (database/pool-deadlines.ts)', () => {
  beforeEach(() => jest.useFakeTimers());
  afterEach(() => jest.useRealTimers());

  it('a connection not got within the deadline is an error with code POOL_ACQUIRE_TIMEOUT', () => {
    const f = fakePool();
    boundPool(f.pool, { acquireTimeoutMs: 500 });
    const cb = jest.fn();
    f.pool.getConnection(cb);
    jest.advanceTimersByTime(499);
    expect(cb).not.toHaveBeenCalled();
    jest.advanceTimersByTime(1);
    expect(cb).toHaveBeenCalledWith(expect.objectContaining({ code: ACQUIRE_TIMEOUT_CODE }));
    // the connection that comes later goes straight back to the pool, the caller hears nothing more
    const late = f.connection();
    f.waiting[0](null, late);
    expect(late.released).toBe(1);
    expect(cb).toHaveBeenCalledTimes(1);
  });

  it('a connection in time is handed over once, and the deadline no longer fires', () => {
    const f = fakePool();
    boundPool(f.pool, { acquireTimeoutMs: 500 });
    const cb = jest.fn();
    f.pool.getConnection(cb);
    const c = f.connection();
    f.waiting[0](null, c);
    jest.advanceTimersByTime(1000);
    expect(cb).toHaveBeenCalledTimes(1);
    expect(cb).toHaveBeenCalledWith(null, c);
    expect(c.released).toBe(0);
  });

  it('a connection whose query timed out is destroyed; other errors and results leave it be', () => {
    const f = fakePool();
    boundPool(f.pool, { acquireTimeoutMs: 500 });
    const c = f.connection();
    f.newConnection(c);
    const seen: unknown[] = [];
    c.query({ sql: 'SELECT 1', timeout: 100 }, [], (err: unknown) => seen.push(err));
    c.lastCb!(null, [{ 1: 1 }]);
    c.query('SELECT x', [], (err: unknown) => seen.push(err));
    c.lastCb!({ code: 'ER_BAD_FIELD_ERROR' });
    expect(c.destroyed).toBe(false);
    c.query({ sql: 'SELECT SLEEP(9)', timeout: 100 }, [], (err: unknown) => seen.push(err));
    c.lastCb!({ code: 'PROTOCOL_SEQUENCE_TIMEOUT' });
    expect(c.destroyed).toBe(true);
    // the caller still gets every answer as it was
    expect(seen).toEqual([null, { code: 'ER_BAD_FIELD_ERROR' }, { code: 'PROTOCOL_SEQUENCE_TIMEOUT' }]);
  });
});
