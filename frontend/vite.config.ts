import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { compression, defineAlgorithm } from 'vite-plugin-compression2';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';

const src = fileURLToPath(new URL('./src', import.meta.url));
// shared-types is compiled to CommonJS for the server; the browser build takes its TypeScript source.
const sharedTypes = fileURLToPath(new URL('../shared-types/src/index.ts', import.meta.url));

/**
 * The Roboto files the first screen draws with (src/main.tsx imports these weights, Latin only):
 * body text 400, buttons and the app bar's links 500, headings and the wordmark 700.
 */
const FIRST_SCREEN_FONTS = /^assets\/roboto-latin-(400|500|700)-normal-[\w-]+\.woff2$/;

/** The libraries of the shell that every route needs whole (see build.rolldownOptions). */
const VENDOR =
  /[\\/]node_modules[\\/](react|react-dom|scheduler|react-router|@emotion[\\/][\w-]+|@mui[\\/](system|styled-engine|utils|private-theming)|swr|use-sync-external-store|stylis|cookie|set-cookie-parser|@babel[\\/]runtime|hoist-non-react-statics|react-is|prop-types|clsx|react-transition-group)[\\/]/;

/**
 * `<link rel="preload" as="font">` for the first screen's fonts, with their hashed names from the
 * build, so the browser fetches them with the HTML instead of after the CSS (web.dev, "Preload key
 * requests"; fonts are fetched in CORS mode, so the link needs `crossorigin`: MDN, rel=preload).
 */
function preloadFonts(): Plugin {
  return {
    name: 'loamline:preload-fonts',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(html, ctx) {
        const bundle = ctx.bundle ?? {};
        const fonts = Object.keys(bundle)
          .filter((f) => FIRST_SCREEN_FONTS.test(f))
          .sort();
        // The entry's stylesheet is only the @font-face rules (a few hundred bytes): inlined, so the
        // first paint waits for no stylesheet (a <link rel=stylesheet> is render-blocking; Lighthouse's
        // FCP counted its round trips). The fonts themselves stay preloaded and swap in.
        let out = html;
        for (const [file, chunk] of Object.entries(bundle)) {
          if (chunk.type !== 'asset' || !file.endsWith('.css')) continue;
          const link = new RegExp(
            `\\s*<link rel="stylesheet"[^>]*href="/${file.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}"[^>]*>`,
          );
          if (!link.test(out)) continue;
          const css =
            typeof chunk.source === 'string' ? chunk.source : new TextDecoder().decode(chunk.source);
          out = out.replace(link, '');
          out = out.replace('</head>', `<style>${css}</style>\n</head>`);
          // the file itself stays: lazy chunks' preloads name it as a dependency
        }
        // The entry script and its modulepreloads at low priority: they do not draw the first paint (the
        // inline frame does) and must not hold it up (Lighthouse counts high-priority scripts as
        // render-blocking); they are still fetched in parallel, so the route's page is not delayed by a
        // waterfall.
        out = out
          .replace(
            '<script type="module" crossorigin',
            '<script type="module" fetchpriority="low" crossorigin',
          )
          .replaceAll(
            '<link rel="modulepreload" crossorigin',
            '<link rel="modulepreload" fetchpriority="low" crossorigin',
          );
        return {
          html: out,
          tags: fonts.map((f) => ({
            tag: 'link',
            attrs: { rel: 'preload', as: 'font', type: 'font/woff2', href: `/${f}`, crossorigin: '' },
            injectTo: 'head' as const,
          })),
        };
      },
    },
  };
}

export default defineConfig({
  plugins: [
    react(),
    preloadFonts(),
    // a .br and a .gz twin of every text file, made once at build time at the highest levels; the
    // server sends the one the client accepts (backend/src/common/security/static-files.ts)
    compression({
      algorithms: [defineAlgorithm('brotliCompress'), defineAlgorithm('gzip', { level: 9 })],
      include: /\.(html|js|css|svg|json|txt)$/,
    }),
  ],
  resolve: {
    alias: { '@': src, '@loamline/shared-types': sharedTypes },
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': `http://127.0.0.1:${process.env.APP_PORT ?? 3000}` },
  },
  // Maps are written but not linked from the bundles; the server serves them only when configured
  // (SERVE_SOURCE_MAPS, off in production: docs/security.md). The manifest (.vite/manifest.json) says
  // which files each route loads: scripts/bench/frontend.ts sums them against the route budget.
  build: {
    sourcemap: 'hidden',
    chunkSizeWarningLimit: 800,
    manifest: true,
    rolldownOptions: {
      output: {
        // The libraries every page runs (React, the router, MUI's styling core, SWR) in one file
        // rather than ~20 small shared chunks: gzip compresses one file better than many, and a phone
        // makes fewer round trips before the first page draws. MUI's components are left to the
        // default splitting, so a component only one lazy page draws still loads with that page.
        codeSplitting: {
          groups: [{ name: 'vendor', test: VENDOR, priority: 10 }],
        },
      },
    },
  },
  test: {
    environment: 'jsdom',
    globals: false,
    setupFiles: ['./src/testing/setup-tests.ts'],
    include: ['src/**/*.test.{ts,tsx}'],
    css: false,
    // generous: on a busy 2-core machine (npm test runs vitest beside the server's tests) a lazy chunk
    // and MUI's first render can take seconds; nothing here is a timing check
    testTimeout: 60_000,
  },
});
