import { Module } from '@nestjs/common';
import { ConfigModule, ConfigService } from '@nestjs/config';
import { TypeOrmModule } from '@nestjs/typeorm';
import { BaselineSheetsModule } from '../../baseline-sheets/baseline-sheets.module';
import { BikesModule } from '../../bikes/bikes.module';
import {
  appConfig,
  authConfig,
  databaseConfig,
  mailConfig,
  paymentsConfig,
  type DatabaseConfig,
} from '../../config/app.config';
import { ShopsModule } from '../../shops/shops.module';
import { UsersModule } from '../../users/users.module';
import { typeormOptions } from '../typeorm-options';

/**
 * What the demo seed needs of the app: config, the database and the services that create shops,
 * users, bikes and sheets (the same code the API runs), without an HTTP server.
 */
@Module({
  imports: [
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
      }),
    }),
    UsersModule,
    ShopsModule,
    BikesModule,
    BaselineSheetsModule,
  ],
})
export class SeedModule {}
