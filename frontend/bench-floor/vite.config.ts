import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';
import { defineConfig } from 'vite';

/**
 * The bench's floor pages (main.tsx and form.tsx say what they are); built by scripts/bench/floor.ts with the same
 * brotli and gzip twins as the app's build (../vite.config.ts), so the app's static middleware serves it.
 */
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  plugins: [
    react(),
    compression({
      algorithms: [defineAlgorithm('brotliCompress'), defineAlgorithm('gzip', { level: 9 })],
      include: /\.(html|js|css|svg|json|txt)$/,
    }),
  ],
  resolve: { alias: { '@': fileURLToPath(new URL('../src', import.meta.url)) } },
  build: {
    emptyOutDir: true,
    reportCompressedSize: false,
    // two pages: the one screen (index.html, scored by Lighthouse) and the least form page (form.html,
    // weighed against the route budget)
    rolldownOptions: {
      input: {
        index: fileURLToPath(new URL('./index.html', import.meta.url)),
        form: fileURLToPath(new URL('./form.html', import.meta.url)),
      },
    },
  },
  logLevel: 'warn',
});
