/** The JavaScript the home route loads (the entry chunk and its static imports), gzipped at level 9. */
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { Row } from './report';

export function homeRouteJs(dist: string): Row {
  const html = readFileSync(join(dist, 'index.html'), 'utf8');
  const scripts = [...html.matchAll(/(?:src|href)="\/(assets\/[^"]+\.js)"/g)].map((m) => m[1]);
  let gz = 0;
  let raw = 0;
  for (const s of scripts) {
    const buf = readFileSync(join(dist, s));
    raw += buf.length;
    gz += gzipSync(buf, { level: 9 }).length;
  }
  const all = readdirSync(join(dist, 'assets')).filter((f) => f.endsWith('.js')).length;
  return {
    figure: 'home route JavaScript, gzipped',
    measured: `${(gz / 1024).toFixed(1)} kB (${(raw / 1024).toFixed(0)} kB raw, ${scripts.length} of ${all} chunks)`,
    baseline: '—',
    ratio: '—',
    latency: '—',
    budget: 'none here (the first screen work sets it)',
    pass: null,
  };
}
