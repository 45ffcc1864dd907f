import type { INestApplication } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { Test } from '@nestjs/testing';
import { AppModule } from '../../src/app.module';
import { CLOCK, type Clock } from '../../src/common/clock/clock';
import { APP_OPTIONS, setupApp } from '../../src/setup-app';

/**
 * The real application module against the test run's migrated MariaDB (the DB_* variables that
 * `npm test` sets), with the same pipeline main.ts installs. `clock` replaces the app's clock.
 */
export async function createTestApp(
  env: Record<string, string> = {},
  opts: { clock?: Clock } = {},
): Promise<INestApplication> {
  const saved = { ...process.env };
  Object.assign(process.env, { FRONTEND_DIST: '/nonexistent', ...env });
  try {
    let builder = Test.createTestingModule({ imports: [AppModule] });
    if (opts.clock) builder = builder.overrideProvider(CLOCK).useValue(opts.clock);
    const moduleRef = await builder.compile();
    const app = moduleRef.createNestApplication({ ...APP_OPTIONS, logger: ['error'] });
    setupApp(app);
    await app.init();
    return app;
  } finally {
    process.env = saved;
  }
}

/**
 * The app as main.ts makes it, with NestFactory: unlike the testing module, it mounts the built
 * frontend's static files (FRONTEND_DIST), for tests of what a browser gets on a page.
 */
export async function createServedApp(env: Record<string, string>): Promise<INestApplication> {
  const saved = { ...process.env };
  Object.assign(process.env, env);
  try {
    const app = await NestFactory.create(AppModule, { ...APP_OPTIONS, logger: ['error'] });
    setupApp(app);
    await app.init();
    return app;
  } finally {
    process.env = saved;
  }
}
