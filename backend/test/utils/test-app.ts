import { randomUUID } from 'node:crypto';
import type { INestApplication } from '@nestjs/common';
import { NestFactory } from '@nestjs/core';
import { Test } from '@nestjs/testing';
import { AppModule } from '../../src/app.module';
import { RATE_LIMIT_SCOPE } from '../../src/auth/rate-limits/rate-limit-scope';
import { CLOCK, type Clock } from '../../src/common/clock/clock';
import { APP_OPTIONS, setupApp } from '../../src/setup-app';

/**
 * The real application module against the test run's migrated MariaDB (the DB_* variables that
 * `npm test` sets), with the same pipeline main.ts installs. `clock` replaces the app's clock.
 * The per-IP rate limits are counted in the shared database; each test app counts in a scope of its
 * own (every test's requests come from 127.0.0.1, and a file with a limit of 3 would otherwise
 * spend its budget on other files' requests), unless `rateLimitScope` names one — two apps with
 * the same scope share their limits, as two instances of the app do. (Failed sign-ins are counted
 * per address, and every test makes its own addresses.)
 */
export async function createTestApp(
  env: Record<string, string> = {},
  opts: { clock?: Clock; rateLimitScope?: string } = {},
): Promise<INestApplication> {
  const saved = { ...process.env };
  Object.assign(process.env, { FRONTEND_DIST: '/nonexistent', ...env });
  try {
    let builder = Test.createTestingModule({ imports: [AppModule] })
      .overrideProvider(RATE_LIMIT_SCOPE)
      .useValue(opts.rateLimitScope ?? randomUUID());
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
