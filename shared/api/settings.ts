// The shop's settings as GET /api/settings answers them and PATCH /api/settings takes them (owner).
import type { BarResolution } from '../pass-plan';
import type { StepPolicy } from '../bore-choice';
import type { LabelStock } from '../label-stock';

export type ClearancePolicy = 'min' | 'mid' | 'max';

export interface ShopSettingsJson {
  shopName: string;
  shopHours: string;
  timeZone: string;
  /** How dates are written everywhere (day, month and year order, the clock), e.g. "en-GB". */
  locale: string;
  holdExpiryDays: number;
  clearancePolicy: ClearancePolicy;
  /** A length with its unit, e.g. "0.020 in". */
  maxCutPerPass: string;
  /** A length with its unit, or '' for no separate finishing pass. */
  finishPass: string;
  /** A length with its unit, or '' for no light first (truing) pass. */
  truingPass: string;
  /** The lightest cut the bar takes reliably, e.g. "0.001 in". */
  minCutPerPass: string;
  /** What one step of the boring bar's dial is; every size the machinist sets is on it. */
  barResolution: BarResolution;
  skipMarginalStep: boolean;
  /** 'save-steps': on a first rebore from standard, the second step that cleans up. */
  stepPolicy: StepPolicy;
  marginalCleanup: string;
  orderCost: string;
  holdingCostRate: string;
  serviceLevel: number;
  homeCurrency: string;
  /** Percent as decimal text, e.g. "20". */
  taxRate: string;
  /** The prices the shop writes (labour, parts) already include tax. */
  pricesIncludeTax: boolean;
  /** The deposit asked for by default, percent of the estimate's total. */
  depositPercent: string;
  /** A cylinder may be marked as cut only once the customer approved the estimate. */
  cutOnlyAfterApproval: boolean;
  /** How an order's shipping joins the cost of what it brings in. */
  shippingAllocation: 'value' | 'quantity' | 'none';
  /** What labels print on: sticker sheets, or one label per page on a label printer's roll. */
  labelStock: LabelStock;
}
