// One JSON line per figure on stdout, so a run can be piped into a file or a chart; progress goes to
// stderr. A figure whose feature is missing says so instead of printing a number.
import { writeSync } from 'node:fs';
import { quantileSorted } from 'simple-statistics';

export interface Figure {
  name: string;
  value: number;
  unit: string;
  /** The physical limit measured in the same run (raw SQL, raw COPY), in the same unit. */
  baseline?: number;
  /** value ÷ baseline. */
  ratio?: number;
  [extra: string]: unknown;
}

export const printed: Array<Figure | { name: string; skipped: string }> = [];

function round(n: number): number {
  if (!Number.isFinite(n)) return n;
  return Math.abs(n) >= 100 ? Math.round(n) : Math.round(n * 100) / 100;
}

export function figure(f: Figure): void {
  const out: Figure = { ...f, value: round(f.value) };
  if (f.baseline !== undefined) {
    out.baseline = round(f.baseline);
    out.ratio = Math.round((f.value / f.baseline) * 1000) / 1000;
  }
  printed.push(out);
  writeSync(1, `${JSON.stringify(out)}\n`);
}

export function skipped(name: string, reason: string): void {
  printed.push({ name, skipped: reason });
  writeSync(1, `${JSON.stringify({ name, skipped: reason })}\n`);
}

export function say(message: string): void {
  process.stderr.write(`[bench] ${message}\n`);
}

/** Nearest-rank style percentile of milliseconds (simple-statistics' quantile on sorted data). */
export function percentile(ms: number[], p: number): number {
  if (ms.length === 0) return NaN;
  const sorted = [...ms].sort((a, b) => a - b);
  return quantileSorted(sorted, p);
}

/**
 * Keeps stdout for figures only: anything else this process prints (the cluster's and the build
 * check's progress lines) goes to stderr. Figures are written straight to file descriptor 1.
 */
export function figuresOnlyOnStdout(): void {
  process.stdout.write = process.stderr.write.bind(process.stderr) as typeof process.stdout.write;
}
