import 'reflect-metadata';
import { Logger } from '@nestjs/common';
import { ConfigService } from '@nestjs/config';
import { NestFactory } from '@nestjs/core';
import type { NestExpressApplication } from '@nestjs/platform-express';
import { AppModule } from './app.module';
import type { AppConfig } from './config/app.config';
import { APP_OPTIONS, setupApp } from './setup-app';

async function bootstrap(): Promise<void> {
  const app = await NestFactory.create<NestExpressApplication>(AppModule, APP_OPTIONS);
  setupApp(app);
  const { port, host, url } = app.get(ConfigService).getOrThrow<AppConfig>('app');
  await app.listen(port, host);
  Logger.log(`Loamline listening on ${url}`, 'Bootstrap');
}

void bootstrap();
