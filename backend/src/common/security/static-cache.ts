import { sep } from 'node:path';
import type { ServerResponse } from 'node:http';

/** A year: the longest max-age caches honour (RFC 9111 leaves it open; a year is common practice, no source). */
const YEAR_S = 31_536_000;

/**
 * Cache headers for the built app: files under `assets/` carry a content hash in their names
 * (Vite's build), so they never change and may be kept a year without asking again (`immutable`,
 * RFC 8246); everything else (index.html, the icon) is revalidated on every visit (`no-cache`),
 * so a new release is picked up at once.
 */
export function staticCacheHeaders(res: ServerResponse, path: string): void {
  const hashed = path.includes(`${sep}assets${sep}`);
  res.setHeader('Cache-Control', hashed ? `public, max-age=${YEAR_S}, immutable` : 'no-cache');
}
