import { defineConfig } from 'vitest/config';

/** Browser journeys: playwright-core drives Debian's Chromium against the running app (BASE_URL). */
export default defineConfig({
  test: {
    environment: 'node',
    include: ['e2e/**/*.e2e.ts'],
    testTimeout: 60_000,
    hookTimeout: 60_000,
    fileParallelism: false,
  },
});
