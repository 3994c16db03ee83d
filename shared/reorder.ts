// Reorder point and order quantity for a part: how low stock may fall before ordering, and how many to
// order at once. Demand is in units per day; lead time in days.
import { errorFunction, mean, probit, sampleStandardDeviation } from 'simple-statistics';

export class ReorderError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReorderError';
  }
}

/**
 * The standard normal z for a cycle service level p (the chance of not running out during a lead time).
 * simple-statistics' probit is a closed-form approximation good to about 0.005 near p = 0.99; three Newton
 * steps on its errorFunction (relative error below 1.2e-7) bring it to the 4 decimals of printed tables.
 */
export function zForServiceLevel(p: number): number {
  if (!Number.isFinite(p) || p <= 0 || p >= 1) {
    throw new ReorderError('The service level must be between 0 and 1 (for example 0.95 for 95%).');
  }
  let z = probit(p);
  for (let i = 0; i < 3; i++) {
    const cdf = 0.5 * (1 + errorFunction(z / Math.SQRT2));
    const pdf = Math.exp((-z * z) / 2) / Math.sqrt(2 * Math.PI);
    z -= (cdf - p) / pdf;
  }
  return z;
}

/** Safety stock = z · σ_daily · √L: buffer for demand variation over the lead time. */
export function safetyStock(z: number, sigmaDaily: number, leadDays: number): number {
  requireNumber('z', z);
  requireNonNegative('daily standard deviation', sigmaDaily);
  requireNonNegative('lead time', leadDays);
  return z * sigmaDaily * Math.sqrt(leadDays);
}

/**
 * Safety stock when the lead time varies too: z · √(L·σd² + d²·σL²), demand per day (mean d,
 * standard deviation σd) and lead time in days (mean L, standard deviation σL), both taken as
 * independent and normal. With σL = 0 it is the formula above.
 */
export function safetyStockVariableLead(
  z: number,
  meanDaily: number,
  sigmaDaily: number,
  leadDays: number,
  sigmaLeadDays: number,
): number {
  requireNumber('z', z);
  requireNonNegative('mean daily demand', meanDaily);
  requireNonNegative('daily standard deviation', sigmaDaily);
  requireNonNegative('lead time', leadDays);
  requireNonNegative('lead-time standard deviation', sigmaLeadDays);
  return z * Math.sqrt(leadDays * sigmaDaily ** 2 + meanDaily ** 2 * sigmaLeadDays ** 2);
}

export interface ReorderPointInput {
  meanDaily: number;
  sigmaDaily: number;
  /** The mean lead time in days. */
  leadDays: number;
  /**
   * The lead time's standard deviation in days, from the supplier's deliveries; absent when there is
   * too little history, and then the lead time is taken as fixed.
   */
  sigmaLeadDays?: number;
  /** Cycle service level, 0 < p < 1. */
  serviceLevel: number;
}

export interface ReorderPoint {
  /** Whole units: demand over the lead time plus safety stock, rounded up. */
  value: number;
  demandOverLead: number;
  safety: number;
  z: number;
  explanation: string[];
}

export function reorderPoint(input: ReorderPointInput): ReorderPoint {
  requireNonNegative('mean daily demand', input.meanDaily);
  requireNonNegative('daily standard deviation', input.sigmaDaily);
  requireNonNegative('lead time', input.leadDays);
  const z = zForServiceLevel(input.serviceLevel);
  const demandOverLead = input.meanDaily * input.leadDays;
  const sigmaLead = input.sigmaLeadDays;
  const safety =
    sigmaLead === undefined
      ? safetyStock(z, input.sigmaDaily, input.leadDays)
      : safetyStockVariableLead(z, input.meanDaily, input.sigmaDaily, input.leadDays, sigmaLead);
  // Safety stock goes negative below a 50% service level; a reorder point below zero means nothing.
  const value = Math.max(0, ceilWhole(demandOverLead + safety));
  const level = `Safety stock for a ${fmt(input.serviceLevel * 100)}% service level`;
  const explanation = [
    `Demand over the lead time: ${fmt(input.meanDaily)} a day × ${fmt(input.leadDays)} days = ${fmt(demandOverLead)}.`,
    sigmaLead === undefined
      ? `${level}: z ${z.toFixed(4)} × σ ${fmt(input.sigmaDaily)} × √${fmt(input.leadDays)} = ${fmt(safety)}.`
      : `${level}, with a lead time that varies: z ${z.toFixed(4)} × √(${fmt(input.leadDays)} days × σ ${fmt(input.sigmaDaily)}² + ${fmt(input.meanDaily)} a day² × σ lead ${fmt(sigmaLead)} days²) = ${fmt(safety)}.`,
    `Reorder point: ${fmt(demandOverLead)} + ${fmt(safety)}, rounded up to ${value}.`,
  ];
  return { value, demandOverLead, safety, z, explanation };
}

export interface EoqInput {
  /** Units a year. */
  annualDemand: number;
  /** Cost of placing one order (money per order). */
  orderCost: number;
  /** Cost of holding one unit for a year. */
  holdingCostPerUnitYear: number;
}

export interface Eoq {
  value: number;
  exact: number;
  explanation: string[];
}

/** Economic order quantity, √(2DS/H) (the Wilson/Harris lot-size formula). */
export function economicOrderQuantity(input: EoqInput): Eoq {
  requireNonNegative('annual demand', input.annualDemand);
  requireNonNegative('order cost', input.orderCost);
  requireNumber('holding cost', input.holdingCostPerUnitYear);
  if (input.holdingCostPerUnitYear <= 0) {
    throw new ReorderError('The holding cost per unit and year must be above zero.');
  }
  const { annualDemand: d, orderCost: s, holdingCostPerUnitYear: h } = input;
  const exact = Math.sqrt((2 * d * s) / h);
  const value = Math.round(exact);
  return {
    value,
    exact,
    explanation: [
      `Order quantity = √(2 × demand ${fmt(d)} × order cost ${fmt(s)} ÷ holding cost ${fmt(h)}) = ${fmt(exact)}.`,
      `Rounded to ${value} units.`,
    ],
  };
}

export interface DemandStats {
  days: number;
  mean: number;
  /** Sample standard deviation (n − 1). */
  sigma: number;
}

/** Mean and sample standard deviation of daily demand; days without sales must be included as 0. */
export function demandStats(dailyQuantities: readonly number[]): DemandStats {
  if (!Array.isArray(dailyQuantities) || dailyQuantities.length < 2) {
    throw new ReorderError('At least two days of demand are needed to estimate its variation.');
  }
  dailyQuantities.forEach((q, i) => {
    if (!Number.isFinite(q) || q < 0)
      throw new ReorderError(`Day ${i + 1}: demand must be 0 or more.`);
  });
  const days = [...dailyQuantities];
  return { days: days.length, mean: mean(days), sigma: sampleStandardDeviation(days) };
}

/** Round up, ignoring float noise below 1e-9 so 10.000000000001 stays 10. */
function ceilWhole(x: number): number {
  return Math.ceil(Math.round(x * 1e9) / 1e9);
}

function fmt(x: number): string {
  // Two decimals at most, without trailing zeros: 1.5, 7.4, 18.
  return String(Number(x.toFixed(2)));
}

function requireNumber(name: string, x: number): void {
  if (typeof x !== 'number' || !Number.isFinite(x))
    throw new ReorderError(`The ${name} must be a number.`);
}

function requireNonNegative(name: string, x: number): void {
  requireNumber(name, x);
  if (x < 0) throw new ReorderError(`The ${name} must not be negative.`);
}
