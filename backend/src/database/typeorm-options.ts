import { join } from 'node:path';
import type { DataSourceOptions } from 'typeorm';
import type { DatabaseConfig } from '../config/app.config';

/**
 * One place for the TypeORM options, used by the Nest module and by the CLI's data source.
 * `synchronize` is never on: the schema comes from migrations only.
 */
export function typeormOptions(
  db: Pick<DatabaseConfig, 'host' | 'port' | 'user' | 'password' | 'name'>,
): DataSourceOptions {
  return {
    type: 'mariadb',
    host: db.host,
    port: db.port,
    username: db.user,
    password: db.password,
    database: db.name,
    charset: 'utf8mb4_unicode_ci',
    timezone: 'Z',
    synchronize: false,
    migrationsRun: false,
    entities: [join(__dirname, '..', '**', '*.entity.{ts,js}')],
    migrations: [join(__dirname, 'migrations', '*.{ts,js}')],
    extra: { connectionLimit: 10, connectTimeout: 5000 },
  };
}
