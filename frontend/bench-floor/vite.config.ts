import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

/** The bench's floor page (main.tsx says what it is); built by scripts/bench/floor.ts. */
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  plugins: [react()],
  resolve: { alias: { '@': fileURLToPath(new URL('../src', import.meta.url)) } },
  build: { emptyOutDir: true, reportCompressedSize: false },
  logLevel: 'warn',
});
