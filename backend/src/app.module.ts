import { existsSync } from 'node:fs';
import { Module } from '@nestjs/common';
import { ConfigModule, ConfigService } from '@nestjs/config';
import { ServeStaticModule, type ServeStaticModuleOptions } from '@nestjs/serve-static';
import { TypeOrmModule } from '@nestjs/typeorm';
import {
  appConfig,
  authConfig,
  databaseConfig,
  mailConfig,
  paymentsConfig,
  type AppConfig,
  type DatabaseConfig,
} from './config/app.config';
import { typeormOptions } from './database/typeorm-options';
import { HealthModule } from './health/health.module';
import { AuthModule } from './auth/auth.module';
import { ShopsModule } from './shops/shops.module';
import { BikesModule } from './bikes/bikes.module';
import { BaselineSheetsModule } from './baseline-sheets/baseline-sheets.module';
import { BaselinesModule } from './baselines/baselines.module';

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
        retryAttempts: 3,
        retryDelay: 1000,
      }),
    }),
    ServeStaticModule.forRootAsync({
      inject: [ConfigService],
      useFactory: (config: ConfigService): ServeStaticModuleOptions[] => {
        const { frontendDist } = config.getOrThrow<AppConfig>('app');
        if (!existsSync(frontendDist)) return [];
        return [{ rootPath: frontendDist, exclude: ['/api/{*path}'] }];
      },
    }),
    HealthModule,
    AuthModule,
    ShopsModule,
    BikesModule,
    BaselineSheetsModule,
    BaselinesModule,
  ],
})
export class AppModule {}
