// client.initial_js and client.largest_lazy_chunk: the production build's JavaScript. The initial
// set is what index.html loads before the first page shows: its module script and every
// modulepreload link. Sizes in kB (1000 bytes), raw and as gzip sends them.
import { execFileSync } from 'node:child_process';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import path from 'node:path';
import { gzipSync } from 'node:zlib';
import { buildIsFresh } from '../../server/build-client';
import { figure, say } from './emit';

const REPO = path.resolve(__dirname, '..', '..');
const DIST = path.join(REPO, 'dist', 'stepstock', 'browser');

function sizes(file: string) {
  const bytes = readFileSync(path.join(DIST, file));
  return { raw: bytes.length, gzip: gzipSync(bytes, { level: 6 }).length };
}

export function clientBench(): void {
  if (buildIsFresh()) {
    say('client: the production build is up to date');
  } else {
    // The same production build as npm start's, its report on stderr so stdout stays figures only.
    say('client: production build');
    execFileSync(
      process.execPath,
      [
        path.join(REPO, 'node_modules', '@angular', 'cli', 'bin', 'ng.js'),
        'build',
        '--configuration',
        'production',
      ],
      {
        cwd: REPO,
        stdio: ['ignore', 2, 2],
        env: { ...process.env, NG_CLI_ANALYTICS: 'false' },
      },
    );
  }
  const index = readFileSync(path.join(DIST, 'index.html'), 'utf8');
  const initial = new Set<string>();
  for (const m of index.matchAll(/<script[^>]*\bsrc="([^"]+\.js)"/g)) initial.add(m[1]);
  for (const m of index.matchAll(/<link[^>]*rel="modulepreload"[^>]*href="([^"]+\.js)"/g))
    initial.add(m[1]);
  if (initial.size === 0) throw new Error('index.html names no script: is the build complete?');
  let raw = 0;
  let gzip = 0;
  for (const f of initial) {
    const s = sizes(f);
    raw += s.raw;
    gzip += s.gzip;
  }
  figure({
    name: 'client.initial_js',
    value: raw / 1000,
    unit: 'kB',
    gzipKb: Math.round(gzip / 100) / 10,
    files: initial.size,
  });
  const lazy = readdirSync(DIST)
    .filter((f) => f.endsWith('.js') && !initial.has(f))
    .map((f) => ({ f, bytes: statSync(path.join(DIST, f)).size }))
    .sort((a, b) => b.bytes - a.bytes);
  const largest = lazy[0];
  figure({
    name: 'client.largest_lazy_chunk',
    value: largest.bytes / 1000,
    unit: 'kB',
    file: largest.f,
    gzipKb: Math.round(sizes(largest.f).gzip / 100) / 10,
    lazyChunks: lazy.length,
  });
}
