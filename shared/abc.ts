// ABC classification of parts by yearly value (Pareto convention 80/15/5): the few parts making up the first
// 80% of value are A (watch closely), the next 15% B, the long tail of the last 5% C.
import Decimal from 'decimal.js';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });

export type AbcClass = 'A' | 'B' | 'C';

export interface AbcItem {
  id: string;
  value: string | number;
}

export interface AbcRow {
  id: string;
  /** The value as a plain decimal string. */
  value: string;
  /** Fraction of the total, 4 decimals ("0.6250"). */
  share: string;
  /** Fraction of the total up to and including this item, 4 decimals. */
  cumulative: string;
  class: AbcClass;
}

export interface AbcCutoffs {
  a: number;
  b: number;
}

export class AbcError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AbcError';
  }
}

/**
 * Items sorted by value, largest first (ties by id, so the result never depends on input order). An item is
 * A while the cumulative share before it is below cutoffs.a, B while it is below cutoffs.b, otherwise C:
 * the item that crosses 80% is still A. Comparisons use exact decimals, not the rounded strings.
 */
export function abcClassify(
  items: readonly AbcItem[],
  cutoffs: AbcCutoffs = { a: 0.8, b: 0.95 },
): AbcRow[] {
  if (!(cutoffs.a > 0 && cutoffs.a < cutoffs.b && cutoffs.b <= 1)) {
    throw new AbcError('Cut-offs must satisfy 0 < A < B ≤ 1 (for example 0.8 and 0.95).');
  }
  const parsed = items.map((item, index) => {
    const value = toDecimal(item.value);
    if (!value)
      throw new AbcError(`Item ${item.id ?? index + 1}: the value must be a number, 0 or more.`);
    return { id: item.id, value };
  });
  const ids = new Set(parsed.map((p) => p.id));
  if (ids.size !== parsed.length) throw new AbcError('Each item may appear only once.');

  parsed.sort((x, y) => y.value.comparedTo(x.value) || (x.id < y.id ? -1 : x.id > y.id ? 1 : 0));
  const total = parsed.reduce((sum, p) => sum.plus(p.value), new D(0));
  const a = new D(cutoffs.a);
  const b = new D(cutoffs.b);

  let before = new D(0);
  return parsed.map((p) => {
    // With no value at all nothing is worth watching: everything is C.
    const share = total.isZero() ? new D(0) : p.value.dividedBy(total);
    const cls: AbcClass = total.isZero()
      ? 'C'
      : before.lessThan(a)
        ? 'A'
        : before.lessThan(b)
          ? 'B'
          : 'C';
    before = before.plus(share);
    return {
      id: p.id,
      value: p.value.toFixed(),
      share: share.toFixed(4),
      cumulative: before.toFixed(4),
      class: cls,
    };
  });
}

function toDecimal(value: string | number): Decimal | null {
  if (typeof value === 'number' && !Number.isFinite(value)) return null;
  if (typeof value === 'string' && !/^\d+(\.\d+)?$/.test(value.trim())) return null;
  if (typeof value !== 'string' && typeof value !== 'number') return null;
  const d = new D(typeof value === 'string' ? value.trim() : value);
  return d.isNegative() ? null : d;
}
