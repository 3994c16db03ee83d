// The estimate as the API answers it, with its totals worked out by the shared rule (so the page's
// preview and the stored figures are the same sums).
import type { EstimateJson, EstimateLineJson } from '../../shared/api/money';
import { estimateTotals, fixedMoney, type TaxRule } from '../../shared/estimate-math';
import type { ApprovedSnapshot, EstimateRow, LineRow } from './estimate-repository';
import type { ShopSettings } from '../../shared/settings-schema';

export function taxRule(settings: ShopSettings): TaxRule {
  return {
    ratePercent: settings.taxRate,
    pricesIncludeTax: settings.pricesIncludeTax,
    currency: settings.homeCurrency,
  };
}

/** Quantity as text without trailing zeros: "2", "1.5". */
export function quantityText(q: string): string {
  return q.includes('.') ? q.replace(/0+$/, '').replace(/\.$/, '') : q;
}

export function lineJson(line: LineRow, currency: string): EstimateLineJson {
  const quantity = quantityText(line.quantity);
  const unitPrice = fixedMoney(line.unit_price, currency);
  const [total] = estimateTotals([{ quantity, unitPrice }], {
    ratePercent: '0',
    pricesIncludeTax: false,
    currency,
  }).lineTotals;
  return {
    id: line.id,
    kind: line.kind,
    description: line.description,
    quantity,
    unitPrice,
    total,
    fromJob: line.auto_key !== null,
  };
}

export function estimateJson(
  est: EstimateRow | null,
  lines: LineRow[],
  settings: ShopSettings,
): EstimateJson {
  const rule = taxRule(settings);
  const items = lines.map((l) => lineJson(l, rule.currency));
  const totals = estimateTotals(items, rule);
  return {
    state: est?.state ?? 'draft',
    lines: items,
    subtotal: totals.subtotal,
    tax: totals.tax,
    total: totals.total,
    currency: rule.currency,
    taxRate: rule.ratePercent,
    pricesIncludeTax: rule.pricesIncludeTax,
    version: est?.version ?? 1,
    sentAt: est?.sent_at ? est.sent_at.toISOString() : null,
    decidedAt: est?.decided_at ? est.decided_at.toISOString() : null,
    approval:
      est?.state === 'approved' && est.approval_how
        ? { how: est.approval_how, by: est.approval_by_name, note: est.approval_note }
        : null,
    approvedVersion:
      est?.approved_snapshot && est.approved_version && est.approved_at
        ? {
            version: est.approved_version,
            total: est.approved_snapshot.total,
            approvedAt: est.approved_at.toISOString(),
          }
        : null,
  };
}

/** The copy kept of what the customer approved. */
export function snapshotOf(json: EstimateJson, lines: LineRow[]): ApprovedSnapshot {
  return {
    lines: json.lines.map((l, i) => ({
      kind: l.kind,
      description: l.description,
      quantity: l.quantity,
      unitPrice: l.unitPrice,
      total: l.total,
      partId: lines[i]?.part_id ?? null,
    })),
    subtotal: json.subtotal,
    tax: json.tax,
    total: json.total,
    currency: json.currency,
    taxRate: json.taxRate,
    pricesIncludeTax: json.pricesIncludeTax,
  };
}
