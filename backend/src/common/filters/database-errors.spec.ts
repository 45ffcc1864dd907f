import { isDatabaseUnavailable } from './database-errors';

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
