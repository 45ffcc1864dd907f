/**
 * The figures of `npm run bench` as table rows, and the two files they go to: artifacts/bench.md
 * (this run) and docs/performance.md (the explained copy kept in the repository).
 */
import { execSync } from 'node:child_process';
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, totalmem } from 'node:os';
import { join } from 'node:path';

/**
 * One figure. Every module of the bench (the server's here, the first screen's in frontend.ts)
 * returns these; `pass` is null for a figure without a budget.
 */
export interface Row {
  figure: string;
  /** what the app did: e.g. "1490 req/s" */
  measured: string;
  /** the baseline measured in the same run, or "—" */
  baseline: string;
  /** app ÷ baseline, or "—" */
  ratio: string;
  /** the app's p50 / p99 in ms, or "—" */
  latency: string;
  budget: string;
  pass: boolean | null;
}

const HEAD = ['figure', 'app', 'baseline (same run)', 'ratio', 'app p50 / p99 ms', 'budget', 'result'];

export function table(rows: Row[]): string {
  const cells = rows.map((r) => [
    r.figure,
    r.measured,
    r.baseline,
    r.ratio,
    r.latency,
    r.budget,
    r.pass === null ? '—' : r.pass ? 'pass' : '**FAIL**',
  ]);
  const widths = HEAD.map((h, i) => Math.max(h.length, ...cells.map((c) => c[i].length)));
  const line = (c: string[]): string => `| ${c.map((x, i) => x.padEnd(widths[i])).join(' | ')} |`;
  return [line(HEAD), line(widths.map((w) => '-'.repeat(w))), ...cells.map(line)].join('\n');
}

export function machine(): string {
  const mem = (totalmem() / 2 ** 30).toFixed(1);
  let nproc = String(cpus().length);
  try {
    nproc = execSync('nproc', { encoding: 'utf8' }).trim();
  } catch {
    /* os.cpus() then */
  }
  const load = loadavg()
    .map((l) => l.toFixed(1))
    .join(' / ');
  return `${nproc} cores (\`nproc\`), ${mem} GiB memory, ${cpus()[0]?.model ?? 'unknown CPU'}, Node ${process.version}, load average ${load} (1 / 5 / 15 min) at the end`;
}

export function writeArtifact(root: string, header: string, rows: Row[], notes: string[]): void {
  mkdirSync(join(root, 'artifacts'), { recursive: true });
  writeFileSync(
    join(root, 'artifacts', 'bench.md'),
    `${header}\n\n${table(rows)}\n\n${notes.map((n) => `- ${n}`).join('\n')}\n`,
  );
}
