// Who may see which money. A route that answers money names its money fields by kind (beside its
// roles, in its route() declaration); the server drops the kinds a role may not see from the
// answer before it leaves, and the client treats those fields as optional.
//
// - cost: what stock cost the shop (unit costs, average costs, purchase prices, stock value).
// - sold: what the shop took for what it sold (the sale price on an issue, sale totals).
// - margin: the difference, and anything it can be read from directly.
//
// The owner sees everything. The buyer orders stock, so sees costs, but not what it sold for or
// the margin. Staff take payment at the counter, so see what things sold for, but not what they
// cost. Machinists see neither: a machinist summing issues' sale prices, or on hand × average
// cost, would otherwise rebuild the owner's sales and stock value.
import type { Role } from './session-types';

export type MoneyKind = 'cost' | 'sold' | 'margin';

/** A route's money fields by kind: property names, wherever they occur in its answer. */
export type MoneyFields = Partial<Record<MoneyKind, readonly string[]>>;

export const MONEY_SEEN_BY: Record<Role, readonly MoneyKind[]> = {
  owner: ['cost', 'sold', 'margin'],
  buyer: ['cost'],
  staff: ['sold'],
  machinist: [],
};

export function maySeeMoney(role: Role, kind: MoneyKind): boolean {
  return MONEY_SEEN_BY[role].includes(kind);
}

/** The property names a role may not see in an answer with these money fields. */
export function hiddenMoneyFields(role: Role, fields: MoneyFields): Set<string> {
  const hidden = new Set<string>();
  for (const [kind, names] of Object.entries(fields) as [MoneyKind, readonly string[]][]) {
    if (!maySeeMoney(role, kind)) for (const name of names) hidden.add(name);
  }
  return hidden;
}

/**
 * A copy of `answer` without the hidden properties, at any depth. Money travels as decimal
 * strings (or null when unknown), so only string or null values are dropped: a page's `total`
 * (a count, a number) is never taken for an order's `total` (an amount, a string).
 */
export function withoutMoney<T>(answer: T, hidden: ReadonlySet<string>): T {
  if (hidden.size === 0) return answer;
  const walk = (value: unknown): unknown => {
    if (Array.isArray(value)) return value.map(walk);
    if (value === null || typeof value !== 'object' || value instanceof Date) return value;
    const out: Record<string, unknown> = {};
    for (const [key, v] of Object.entries(value)) {
      if (hidden.has(key) && (typeof v === 'string' || v === null)) continue;
      out[key] = walk(v);
    }
    return out;
  };
  return walk(answer) as T;
}
