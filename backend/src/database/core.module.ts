import { Module } from '@nestjs/common';
import { ConfigModule, ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { DataSource } from 'typeorm';
import {
  appConfig,
  authConfig,
  databaseConfig,
  mailConfig,
  paymentsConfig,
  type DatabaseConfig,
} from '../config/app.config';
import { ClockModule } from '../common/clock/clock';
import { boundPool, type DeadlinePool } from './pool-deadlines';
import { typeormOptions } from './typeorm-options';

/**
 * What every Nest context of Loamline needs, the HTTP app and the demo seed alike: the validated
 * config namespaces (global), TypeORM on MariaDB (global) and the clock (global, CLOCK).
 */
@Module({
  imports: [
    ClockModule,
    ConfigModule.forRoot({
      isGlobal: true,
      ignoreEnvFile: true,
      load: [appConfig, databaseConfig, authConfig, mailConfig, paymentsConfig],
    }),
    TypeOrmModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService) => {
        const db = config.getOrThrow<DatabaseConfig>('database');
        return {
          ...typeormOptions(db),
          // every query of the app has a deadline (the migrations do not: they run through the CLI)
          enableQueryTimeout: true,
          maxQueryExecutionTime: db.queryTimeoutMs,
          autoLoadEntities: true,
          retryAttempts: 3,
          retryDelay: 1000,
        };
      },
      // no request waits forever on a database that stopped answering (pool-deadlines.ts)
      dataSourceFactory: async (options) => {
        const dataSource = await new DataSource(options!).initialize();
        const { acquireTimeoutMs } = databaseConfig();
        boundPool((dataSource.driver as unknown as { pool: DeadlinePool }).pool, { acquireTimeoutMs });
        return dataSource;
      },
    }),
  ],
})
export class CoreModule {}
