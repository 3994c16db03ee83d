// Database rows → API answers for the catalog. Lengths go out as { mm, in }, money as exact text.
import { displayGtin, type FamilyJson, type PartJson } from '../../shared/api/catalog';
import { kitFree } from '../../shared/kits';
import { toLengthJson, type LengthJson } from '../../shared/lengths';
import type { ComponentRow, FamilyRow, PartRow } from './catalog-repository';

export function lengthOrNull(nm: number | null): LengthJson | null {
  return nm === null ? null : toLengthJson(nm);
}

/** NUMERIC(14,4) text as the API writes money: no trailing zeros past the cents ("12.50", "0.1234"). */
export function moneyJson(value: string | null): string {
  if (value === null) return '0.00';
  const [whole, fraction = ''] = value.split('.');
  const trimmed = fraction.replace(/0+$/, '');
  return `${whole}.${trimmed.padEnd(2, '0')}`;
}

export function familyJson(row: FamilyRow): FamilyJson {
  return {
    id: row.id,
    code: row.code,
    name: row.name,
    strokeType: row.stroke_type,
    cylinders: row.cylinders,
    cooling: row.cooling,
    standardBore: toLengthJson(row.standard_bore_nm),
    stroke: toLengthJson(row.stroke_nm),
    clearance: { min: toLengthJson(row.clearance_min_nm), max: toLengthJson(row.clearance_max_nm) },
    honeAllowance: toLengthJson(row.hone_allowance_nm),
    cleanup: toLengthJson(row.cleanup_nm),
    maxOversize: toLengthJson(row.max_oversize_nm),
    maxTaper: lengthOrNull(row.max_taper_nm),
    maxOutOfRound: lengthOrNull(row.max_out_of_round_nm),
    ringGap: { min: lengthOrNull(row.ring_gap_min_nm), max: lengthOrNull(row.ring_gap_max_nm) },
    forgedClearance:
      row.forged_clearance_min_nm !== null && row.forged_clearance_max_nm !== null
        ? {
            min: toLengthJson(row.forged_clearance_min_nm),
            max: toLengthJson(row.forged_clearance_max_nm),
          }
        : null,
    // NUMERIC text without the padding zeros: "0.004", not "0.00400".
    ringGapPerBore: String(Number(row.ring_gap_per_bore)),
    hone: { crosshatchDeg: Number(row.hone_crosshatch_deg), grits: row.hone_grits },
    stepSeriesId: row.step_series_id,
    stepSeries: { id: row.step_series_id, code: row.series_code, name: row.series_name },
    notes: row.notes,
    active: row.active,
    stock: {
      pistonsOnHand: Number(row.pistons_on_hand ?? 0),
      pistonsFree: Number(row.pistons_free ?? 0),
      emptySteps: Number(row.empty_steps ?? 0),
    },
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

/**
 * Levels of a part. A kit is never counted itself: it has as many as its scarcest component allows,
 * on the shelf (onHand) and free of holds (free); the difference is what holds block.
 */
export function partLevels(
  row: Pick<PartRow, 'kind' | 'on_hand' | 'held'>,
  components: ComponentRow[] = [],
): { onHand: number; held: number; free: number } {
  if (row.kind !== 'kit') {
    return { onHand: row.on_hand, held: row.held, free: row.on_hand - row.held };
  }
  if (components.length === 0) return { onHand: 0, held: 0, free: 0 };
  const onHand = kitFree(components.map((c) => ({ free: c.on_hand, perKit: c.quantity })));
  const free = kitFree(components.map((c) => ({ free: c.on_hand - c.held, perKit: c.quantity })));
  return { onHand, held: onHand - free, free };
}

export function partJson(row: PartRow, components: ComponentRow[] = []): PartJson {
  return {
    id: row.id,
    sku: row.sku,
    kind: row.kind,
    familyId: row.family_id,
    familyCode: row.family_code,
    stepId: row.step_id,
    stepLabel: row.step_label,
    description: row.description,
    material: row.material,
    ringCount: row.ring_count,
    pinDiameter: lengthOrNull(row.pin_diameter_nm),
    gtin: row.gtin === null ? null : displayGtin(row.gtin),
    salePrice: moneyJson(row.sale_price),
    averageCost: moneyJson(row.average_cost),
    ...partLevels(row, components),
    reorderPoint: row.reorder_point,
    orderUpTo: row.order_up_to,
    binId: row.bin_id,
    bin: row.bin_code,
    active: row.active,
  };
}
