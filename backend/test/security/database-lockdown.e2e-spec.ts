import { statSync } from 'node:fs';
import { dirname } from 'node:path';
import { createConnection } from 'mysql2/promise';

/**
 * Finding 4: the private MariaDB's root had no password over TCP and its socket was
 * world-writable, so any local process could read every hash. Now root exists only as
 * root@localhost (the socket) with a generated password, the socket's folder admits only its
 * owner, and the app's own user may only read and write rows of its schema.
 */
describe('security 4: the private MariaDB', () => {
  const port = Number(process.env.DB_PORT);
  const socket = process.env.TEST_DB_SOCKET;
  const connectAs = (user: string, password: string) =>
    createConnection({ host: '127.0.0.1', port, user, password, connectTimeout: 5000 });

  it('refuses root over TCP, without a password and with any password', async () => {
    await expect(connectAs('root', '')).rejects.toMatchObject({ code: 'ER_ACCESS_DENIED_ERROR' });
    await expect(connectAs('root', 'root')).rejects.toMatchObject({ code: 'ER_ACCESS_DENIED_ERROR' });
    await expect(connectAs('', '')).rejects.toMatchObject({ code: 'ER_ACCESS_DENIED_ERROR' });
  });

  it('refuses root on the socket without the generated password', async () => {
    if (!socket) throw new Error('TEST_DB_SOCKET is not set (npm test sets it)');
    await expect(createConnection({ socketPath: socket, user: 'root', password: '' })).rejects.toMatchObject({
      code: 'ER_ACCESS_DENIED_ERROR',
    });
  });

  it('keeps the socket away from other users: neither it nor its folder is open to them', () => {
    if (!socket) throw new Error('TEST_DB_SOCKET is not set (npm test sets it)');
    expect(statSync(socket).mode & 0o077).toBe(0);
    expect(statSync(dirname(socket)).mode & 0o077).toBe(0);
  });

  it("lets the app's user read and write rows, and nothing more", async () => {
    const db = await connectAs(process.env.DB_USER ?? 'loamline', process.env.DB_PASSWORD ?? '');
    try {
      await db.query(`USE \`${process.env.DB_NAME ?? 'loamline'}\``);
      await db.query('SELECT COUNT(*) FROM users');
      await expect(db.query('SELECT * FROM mysql.user')).rejects.toMatchObject({
        code: 'ER_TABLEACCESS_DENIED_ERROR',
      });
      await expect(db.query('SELECT * FROM mysql.global_priv')).rejects.toMatchObject({
        code: 'ER_TABLEACCESS_DENIED_ERROR',
      });
      await expect(db.query('CREATE TABLE probe (id int)')).rejects.toMatchObject({
        code: 'ER_TABLEACCESS_DENIED_ERROR',
      });
      await expect(db.query('DROP TABLE users')).rejects.toMatchObject({
        code: 'ER_TABLEACCESS_DENIED_ERROR',
      });
      await expect(db.query('ALTER TABLE users ADD COLUMN probe int')).rejects.toMatchObject({
        code: 'ER_TABLEACCESS_DENIED_ERROR',
      });
      await expect(db.query('CREATE DATABASE probe')).rejects.toMatchObject({
        code: 'ER_DBACCESS_DENIED_ERROR',
      });
      const [grants] = await db.query('SHOW GRANTS');
      expect(JSON.stringify(grants)).toMatch(/GRANT SELECT, INSERT, UPDATE, DELETE ON `loamline`\.\*/);
    } finally {
      await db.end();
    }
  });
});
