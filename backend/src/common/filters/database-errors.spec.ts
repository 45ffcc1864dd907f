import { isDatabaseUnavailable, isWriteConflict } from './database-errors';

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
