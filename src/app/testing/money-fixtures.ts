import type { EstimateJson, EstimateLineJson } from '../../../shared/api/money';

/** Two hours of boring at 55.00: 2 × 55.00 = 110.00 (by hand). */
export const BORE_LINE: EstimateLineJson = {
  id: 'l1',
  kind: 'labour',
  description: 'Bore one cylinder',
  quantity: '2',
  unitPrice: '55.00',
  total: '110.00',
  fromJob: true,
};

/**
 * A draft estimate in euros of the one bore line, prices before tax: subtotal 110.00, tax at
 * 20 % on it 22.00, total 132.00 (worked by hand). A spec that changes the lines gives its own
 * totals, worked the same way.
 */
export function estimateJson(extra: Partial<EstimateJson> = {}): EstimateJson {
  return {
    state: 'draft',
    lines: [BORE_LINE],
    subtotal: '110.00',
    tax: '22.00',
    total: '132.00',
    currency: 'EUR',
    taxRate: '20',
    pricesIncludeTax: false,
    version: 1,
    sentAt: null,
    decidedAt: null,
    approval: null,
    approvedVersion: null,
    ...extra,
  };
}
