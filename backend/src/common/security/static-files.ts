import { existsSync } from 'node:fs';
import type { RequestHandler } from 'express';
import expressStaticGzip from 'express-static-gzip';
import { staticCacheHeaders } from './static-cache';

/** A path whose last segment has a file extension (`/assets/index-3f9a1c2b.js`, `/favicon.svg`). */
const FILE_LIKE = /\/[^/]*\.[a-z0-9]+$/i;

/**
 * The built front end (`vite build`, with `.br` and `.gz` twins of every text file made at build time):
 *
 * - each file is sent precompressed when the client accepts it — brotli first, then gzip, else the
 *   file itself (identity) — with `Content-Encoding`, the original's `Content-Type` and
 *   `Vary: Accept-Encoding` (RFC 9110 §8.4, §12.5.5), by express-static-gzip over serve-static;
 * - a deep link (`/shops/x`: a GET outside /api and /assets whose last segment has no extension) gets
 *   index.html the same way, so the router in the browser draws the page (the "history API fallback",
 *   common practice, no source);
 * - cache headers as in `staticCacheHeaders` (hashed assets immutable, the rest revalidated).
 *
 * Anything else (an /api route, a missing file) falls through to the app, which answers 404.
 */
export function frontendFiles(dist: string): RequestHandler {
  if (!existsSync(dist)) return (_req, _res, next) => next();
  const serve = expressStaticGzip(dist, {
    enableBrotli: true,
    orderPreference: ['br', 'gzip'],
    index: 'index.html',
    serveStatic: {
      index: false,
      fallthrough: true,
      setHeaders: (res, path) => {
        staticCacheHeaders(res, path);
        // a file without a compressed twin (an icon, an image) does not vary; say it anyway, a cache
        // that stores one answer for every client is then never wrong
        res.setHeader('Vary', 'Accept-Encoding');
      },
    },
  }) as RequestHandler;
  return (req, res, next) => {
    if (req.method !== 'GET' && req.method !== 'HEAD') return next();
    if (req.path === '/api' || req.path.startsWith('/api/')) return next();
    const deepLink = !req.path.startsWith('/assets/') && !FILE_LIKE.test(req.path);
    if (!deepLink) return serve(req, res, next);
    const url = req.url;
    req.url = '/index.html';
    serve(req, res, (err?: unknown) => {
      req.url = url;
      next(err);
    });
  };
}
