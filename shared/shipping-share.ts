// An order's shipping spread over what it brings in, as part of each unit's cost: by value (each
// unit carries shipping × its price ÷ the order's value), by count (shipping ÷ units ordered), or
// not at all. Shares are worked on the order as ordered, so a delivery in parts costs each unit
// the same as one in full. Exact decimals; the caller rounds the unit cost to its 4 decimals.
import Decimal from 'decimal.js';

export const SHIPPING_ALLOCATIONS = ['value', 'quantity', 'none'] as const;
export type ShippingAllocation = (typeof SHIPPING_ALLOCATIONS)[number];

export interface OrderedLine {
  quantity: number;
  unitPrice: string;
}

/** One unit's share of the order's shipping on a line with this unit price. */
export function shippingPerUnit(
  lines: readonly OrderedLine[],
  shipping: string,
  unitPrice: string,
  how: ShippingAllocation,
): Decimal {
  const total = new Decimal(shipping);
  if (how === 'none' || total.isZero() || lines.length === 0) return new Decimal(0);
  if (how === 'quantity') {
    const units = lines.reduce((n, l) => n + l.quantity, 0);
    return units === 0 ? new Decimal(0) : total.dividedBy(units);
  }
  const value = lines.reduce(
    (sum, l) => sum.plus(new Decimal(l.unitPrice).times(l.quantity)),
    new Decimal(0),
  );
  // Nothing priced (free samples): spread by count instead of dividing by zero.
  if (value.isZero()) return shippingPerUnit(lines, shipping, unitPrice, 'quantity');
  return total.times(unitPrice).dividedBy(value);
}
