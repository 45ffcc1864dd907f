import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

const src = fileURLToPath(new URL('./src', import.meta.url));
// shared-types is compiled to CommonJS for the server; the browser build takes its TypeScript source.
const sharedTypes = fileURLToPath(new URL('../shared-types/src/index.ts', import.meta.url));

export default defineConfig({
  plugins: [react()],
  resolve: {
    alias: { '@': src, '@loamline/shared-types': sharedTypes },
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': `http://127.0.0.1:${process.env.APP_PORT ?? 3000}` },
  },
  // Maps are written but not linked from the bundles; the server serves them only when configured
  // (SERVE_SOURCE_MAPS, off in production: docs/security.md).
  build: { sourcemap: 'hidden', chunkSizeWarningLimit: 800 },
  test: {
    environment: 'jsdom',
    globals: false,
    setupFiles: ['./src/testing/setup-tests.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
    // generous: on a busy 2-core machine a lazy chunk and MUI's first render can take seconds
    testTimeout: 20_000,
  },
});
