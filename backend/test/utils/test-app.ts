import type { INestApplication } from '@nestjs/common';
import { Test } from '@nestjs/testing';
import { AppModule } from '../../src/app.module';
import { setupApp } from '../../src/setup-app';

/**
 * The real application module against the test run's migrated MariaDB (the DB_* variables that
 * `npm test` sets), with the same pipeline main.ts installs.
 */
export async function createTestApp(env: Record<string, string> = {}): Promise<INestApplication> {
  const saved = { ...process.env };
  Object.assign(process.env, { FRONTEND_DIST: '/nonexistent', ...env });
  try {
    const moduleRef = await Test.createTestingModule({ imports: [AppModule] }).compile();
    const app = moduleRef.createNestApplication({ rawBody: true, logger: ['error'] });
    setupApp(app);
    await app.init();
    return app;
  } finally {
    process.env = saved;
  }
}
