// How far V8 lets the JavaScript heap grow past what the last full collection kept. A price-list
// import streams its file (disk → decoder → parser → COPY) and keeps little per row, about 15 MB
// for 180,000 rows; but it makes garbage fast, and by default V8 lets the old space grow to up to
// four times the live heap before it collects it, so two 50 MB imports at once took the heap from
// about 75 to 195 MB, nearly all of it garbage waiting for a collection. A fixed, smaller growth
// step makes V8 collect sooner: the same imports then peak about 60 MB over the idle server at a
// few percent more CPU. Process-wide, so set once when the server starts.
import { setFlagsFromString } from 'node:v8';

/** 0 leaves V8's own heuristics; n lets the heap grow by n % before the next full collection. */
export function limitHeapGrowth(percent: number): void {
  if (percent > 0) setFlagsFromString(`--heap-growing-percent=${Math.round(percent)}`);
}
