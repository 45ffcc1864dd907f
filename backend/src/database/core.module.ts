import { Module } from '@nestjs/common';
import { ConfigModule, ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import {
  appConfig,
  authConfig,
  databaseConfig,
  mailConfig,
  paymentsConfig,
  type DatabaseConfig,
} from '../config/app.config';
import { ClockModule } from '../common/clock/clock';
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
      useFactory: (config: ConfigService) => ({
        ...typeormOptions(config.getOrThrow<DatabaseConfig>('database')),
        autoLoadEntities: true,
        retryAttempts: 3,
        retryDelay: 1000,
      }),
    }),
  ],
})
export class CoreModule {}
