// import.first / import.reimport: a generated 100,000-row price list through the product's import
// (preview and commit, in a process of its own) beside the raw staging-and-upsert of the same file.
import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import path from 'node:path';
import { figure, say } from './emit';
import type { StatementTime } from './import-worker';

const ROWS = 100_000;
const REPO = path.resolve(__dirname, '..', '..');

/** A supplier's list in a plain layout; `shift` cents on every price so a re-import changes them all. */
function writeList(file: string, shift: number): void {
  const lines = ['sku,description,size_mm,oversize_mm,price,currency,available'];
  for (let i = 1; i <= ROWS; i++) {
    const step = i % 9;
    const bore = 40 + (i % 40) * 1.5;
    const price = (3800 + (i % 1700) + shift) / 100;
    lines.push(
      `BL-${String(i).padStart(6, '0')},Bench piston ${bore.toFixed(2)} mm +${(step * 0.25).toFixed(2)},` +
        `${(bore + step * 0.25).toFixed(2)},${(step * 0.25).toFixed(2)},${price.toFixed(2)},EUR,${i % 12}`,
    );
  }
  writeFileSync(file, `${lines.join('\n')}\n`);
}

interface WorkerResult {
  rows: number;
  ms: number;
  maxRssMb: number;
  previewMs?: number;
  commitMs?: number;
  statements?: StatementTime[];
}

/**
 * Where an import's time went, on stderr: each statement of 5 ms or more, and each stretch of 5 ms
 * or more between statements (time in Node: reading and checking the file while its rows stream
 * into the staging COPY, which Knex does not see, or building the answer).
 */
function sayTimeline(name: string, statements: StatementTime[]): void {
  let end = 0;
  for (const s of [...statements].sort((a, b) => a.at - b.at)) {
    if (s.at - end >= 5) say(`${name}   ${ms(s.at - end)} between statements (Node, COPY)`);
    if (s.ms >= 5) say(`${name}   ${ms(s.ms)} ${s.sql}`);
    end = Math.max(end, s.at + s.ms);
  }
}

function ms(n: number): string {
  return `${String(Math.round(n)).padStart(6)} ms`;
}

function worker(args: string[], databaseUrl: string): WorkerResult {
  const r = spawnSync(
    process.execPath,
    ['--import', 'tsx', path.join(__dirname, 'import-worker.ts'), ...args],
    {
      cwd: REPO,
      env: { ...process.env, DATABASE_URL: databaseUrl, NODE_ENV: 'production', LOG_LEVEL: 'warn' },
      encoding: 'utf8',
      timeout: 15 * 60_000,
    },
  );
  if (r.status !== 0) throw new Error(`import worker ${args[0]} failed:\n${r.stderr}`);
  const last = r.stdout.trim().split('\n').pop() ?? '';
  return JSON.parse(last) as WorkerResult;
}

export async function importBench(opts: {
  databaseUrl: string;
  tmpDir: string;
  supplierId: string;
  userId: string;
}): Promise<void> {
  const first = path.join(opts.tmpDir, 'bench-list-first.csv');
  const second = path.join(opts.tmpDir, 'bench-list-second.csv');
  writeList(first, 0);
  writeList(second, 37);
  const idle = worker(['idle', first], opts.databaseUrl);
  const parsed = worker(['parse', first], opts.databaseUrl);
  say(`reading and checking ${parsed.rows} rows alone (no database): ${ms(parsed.ms)}`);
  for (const [name, file] of [
    ['import.first', first],
    ['import.reimport', second],
  ] as const) {
    say(`${name}: ${ROWS} rows through the import service`);
    const product = worker(['service', file, opts.supplierId, opts.userId], opts.databaseUrl);
    say(`${name}: the same rows through COPY and one upsert`);
    const raw = worker(['raw', file], opts.databaseUrl);
    sayTimeline(name, product.statements ?? []);
    if (product.rows !== ROWS || raw.rows !== ROWS) {
      throw new Error(`${name}: expected ${ROWS} rows, service ${product.rows}, raw ${raw.rows}`);
    }
    figure({
      name,
      value: product.rows / (product.ms / 1000),
      unit: 'rows/s',
      baseline: raw.rows / (raw.ms / 1000),
      seconds: Math.round(product.ms) / 1000,
      previewSeconds: Math.round(product.previewMs ?? 0) / 1000,
      commitSeconds: Math.round(product.commitMs ?? 0) / 1000,
      baselineSeconds: Math.round(raw.ms) / 1000,
    });
    figure({
      name: `${name}.peak_rss`,
      value: product.maxRssMb,
      unit: 'MB',
      baseline: raw.maxRssMb,
      idleProcessMb: Math.round(idle.maxRssMb),
    });
  }
}
