// Weighted-average cost (perpetual moving average): each receipt blends its unit cost into the average,
// weighted by quantity; issues, reservations and holds take stock out at the current average and leave it
// unchanged. Money is exact decimal text; the average is kept to 4 decimals, rounded half-up.
// The value of the stock is kept exactly beside its quantity (receiptValue below) and the average is
// derived from the two, so it never drifts by rounding an average of an average.
import Decimal from 'decimal.js';

const D = Decimal.clone({ precision: 40, rounding: Decimal.ROUND_HALF_UP });

export const AVERAGE_COST_DECIMALS = 4;

export interface CostState {
  quantity: number;
  averageCost: string;
}

export interface IssueResult extends CostState {
  /** Value of the issued units at the average cost, 4 decimals. */
  issuedValue: string;
}

export class AverageCostError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'AverageCostError';
  }
}

export interface ValueState {
  quantity: number;
  /** What the stock on hand is worth, exact decimal text. */
  value: string;
}

export interface ValuedReceipt extends ValueState {
  /** value ÷ quantity, to 4 decimals, half-up: what the part's average cost shows. */
  averageCost: string;
}

/**
 * A receipt against the exact value: value + quantity × unit cost, and the average derived from it.
 * Three receipts of one unit at 1, 1 and 2 are worth 4 with an average of 1.3333 — never the
 * 3 × 1.3333 = 3.9999 that rounding the average at each step gives.
 */
export function receiptValue(state: ValueState, quantity: number, unitCost: string): ValuedReceipt {
  requireCount('quantity in stock', state.quantity, 0);
  requireCount('received quantity', quantity, 1);
  const before = parseCost(state.value, 'stock value');
  const cost = parseCost(unitCost, 'unit cost');
  const newQuantity = state.quantity + quantity;
  const value = before.plus(cost.times(quantity));
  return {
    quantity: newQuantity,
    value: value.toFixed(),
    averageCost: value.dividedBy(newQuantity).toFixed(AVERAGE_COST_DECIMALS),
  };
}

export function issueAtCost(state: CostState, quantity: number): IssueResult {
  const current = checkState(state);
  requireCount('issued quantity', quantity, 1);
  if (quantity > state.quantity) {
    throw new AverageCostError(`Cannot issue ${quantity}: only ${state.quantity} in stock.`);
  }
  return {
    quantity: state.quantity - quantity,
    averageCost: current.toFixed(AVERAGE_COST_DECIMALS),
    issuedValue: current.times(quantity).toFixed(AVERAGE_COST_DECIMALS),
  };
}

/** Value of the stock on hand at its average cost, 4 decimals. */
export function stockValue(state: CostState): string {
  return checkState(state).times(state.quantity).toFixed(AVERAGE_COST_DECIMALS);
}

function checkState(state: CostState): Decimal {
  requireCount('quantity in stock', state.quantity, 0);
  return parseCost(state.averageCost, 'average cost');
}

function parseCost(text: string, name: string): Decimal {
  if (typeof text !== 'string' || !/^\d+(\.\d+)?$/.test(text.trim())) {
    throw new AverageCostError(
      `The ${name} must be a decimal number, 0 or more (got "${String(text)}").`,
    );
  }
  return new D(text.trim());
}

function requireCount(name: string, n: number, min: number): void {
  if (!Number.isSafeInteger(n) || n < min) {
    throw new AverageCostError(`The ${name} must be a whole number, ${min} or more.`);
  }
}
