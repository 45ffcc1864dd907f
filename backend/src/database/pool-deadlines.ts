/**
 * Deadlines for the database pool, so no request waits forever on a database that has stopped
 * answering (a frozen server, a stalled disk, a network partition: the port accepts, nothing
 * replies). mysql2 bounds only the connect (`connectTimeout`); TypeORM's `maxQueryExecutionTime`
 * with `enableQueryTimeout` gives each query a deadline, but mysql2 then leaves the timed-out
 * command at the head of the connection's queue, so the next query on that connection would wait
 * behind it with no deadline of its own. And a request waiting for a free connection waits as
 * long as the pool is full. This module adds the two missing pieces to a mysql2 pool:
 *
 * - a connection whose query timed out is destroyed (a new one is opened when needed);
 * - getting a connection has a deadline (`acquireTimeoutMs`): past it the caller gets an error
 *   with code POOL_ACQUIRE_TIMEOUT, and a connection that comes later goes straight back.
 *
 * The errors read as "database unavailable" (common/filters/database-errors.ts), so the request
 * gets 503. docs/architecture.md, "Failure behaviour".
 */

/** The error code of a query past its deadline (mysql2's). */
export const QUERY_TIMEOUT_CODE = 'PROTOCOL_SEQUENCE_TIMEOUT';
/** The error code of a connection not got within the acquire deadline (ours). */
export const ACQUIRE_TIMEOUT_CODE = 'POOL_ACQUIRE_TIMEOUT';

type Callback<T> = (err: Error | null, value?: T) => void;

/** What this module uses of a mysql2 pool connection. */
export interface DeadlineConnection {
  query: (...args: unknown[]) => unknown;
  destroy: () => void;
  release: () => void;
}

/** What this module uses of a mysql2 pool (callback API). */
export interface DeadlinePool {
  getConnection: (cb: Callback<DeadlineConnection>) => void;
  on: (event: 'connection', listener: (c: DeadlineConnection) => void) => unknown;
}

const BOUND = Symbol('loamline.pool-deadlines');

/** Adds the acquire deadline and destroy-on-query-timeout to `pool` (once; later calls do nothing). */
export function boundPool(pool: DeadlinePool, opts: { acquireTimeoutMs: number }): void {
  const marked = pool as DeadlinePool & { [BOUND]?: true };
  if (marked[BOUND]) return;
  marked[BOUND] = true;

  pool.on('connection', (connection) => {
    const query = connection.query.bind(connection);
    connection.query = (...args: unknown[]) => {
      const last = args.length - 1;
      const cb = args[last];
      if (typeof cb === 'function') {
        args[last] = (err: { code?: string } | null, ...rest: unknown[]) => {
          // its command is stuck at the head of the connection's queue: never reuse it
          if (err?.code === QUERY_TIMEOUT_CODE) connection.destroy();
          return (cb as (...a: unknown[]) => unknown)(err, ...rest);
        };
      }
      return query(...args);
    };
  });

  const getConnection = pool.getConnection.bind(pool);
  pool.getConnection = (cb) => {
    let settled = false;
    const timer = setTimeout(() => {
      settled = true;
      const err = new Error(`No database connection within ${opts.acquireTimeoutMs} ms`) as Error & {
        code: string;
      };
      err.code = ACQUIRE_TIMEOUT_CODE;
      cb(err);
    }, opts.acquireTimeoutMs);
    getConnection((err, connection) => {
      if (settled) {
        connection?.release(); // too late for the caller: back to the pool for the next one
        return;
      }
      settled = true;
      clearTimeout(timer);
      cb(err, connection);
    });
  };
}
