import { isDatabaseUnavailable, isWriteConflict } from './database-errors';

/** Which errors mean "the database is not there" (503) and which are a bad query (500). */
describe('isDatabaseUnavailable', () => {
  it.each([
    ['connection refused (mysql2, Node sockets)', { code: 'ECONNREFUSED' }],
    ['connection lost mid-query (mysql2)', { code: 'PROTOCOL_CONNECTION_LOST', fatal: true }],
    ['a query past its deadline (mysql2)', { code: 'PROTOCOL_SEQUENCE_TIMEOUT' }],
    ['no connection within the acquire deadline (pool-deadlines.ts)', { code: 'POOL_ACQUIRE_TIMEOUT' }],
    ['the server shutting down (MariaDB 1053)', { code: 'ER_SERVER_SHUTDOWN' }],
    ['the connection killed (MariaDB 1927)', { code: 'ER_CONNECTION_KILLED' }],
    ['wrapped by TypeORM (QueryFailedError.driverError)', { driverError: { code: 'ECONNRESET' } }],
    [
      'a closed connection (mysql2 message only)',
      { message: "Can't add new command when connection is in closed state" },
    ],
  ])('%s → unavailable', (_what, err) => {
    expect(isDatabaseUnavailable(err)).toBe(true);
  });

  it.each([
    ['a duplicate key', { code: 'ER_DUP_ENTRY' }],
    ['a syntax error', { code: 'ER_PARSE_ERROR' }],
    ['a lock wait timeout (the server answered)', { code: 'ER_LOCK_WAIT_TIMEOUT' }],
    ['no error object', null],
  ])('%s → not unavailable', (_what, err) => {
    expect(isDatabaseUnavailable(err)).toBe(false);
  });
});

/* Error numbers and names: MariaDB Server error codes; mysql2's messages from its connection code. */
describe('database errors', () => {
  it('a deadlock or a Galera certification conflict (1213) and a lock wait timeout (1205) are write conflicts', () => {
    expect(isWriteConflict({ errno: 1213, code: 'ER_LOCK_DEADLOCK' })).toBe(true);
    expect(isWriteConflict({ driverError: { errno: 1205 } })).toBe(true); // TypeORM's QueryFailedError
    expect(isWriteConflict({ errno: 1062, code: 'ER_DUP_ENTRY' })).toBe(false);
    expect(isWriteConflict(new Error('boom'))).toBe(false);
  });

  it('a Galera node outside the primary component (1047) and a pooled connection to a dead node are "unavailable"', () => {
    expect(isDatabaseUnavailable({ driverError: { code: 'ER_UNKNOWN_COM_ERROR', errno: 1047 } })).toBe(true);
    expect(isDatabaseUnavailable(new Error("Can't add new command when connection is in closed state"))).toBe(
      true,
    );
    expect(isDatabaseUnavailable({ code: 'PROTOCOL_CONNECTION_LOST' })).toBe(true);
    expect(isDatabaseUnavailable({ errno: 1213, code: 'ER_LOCK_DEADLOCK' })).toBe(false);
  });
});
