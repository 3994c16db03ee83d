// Database rows → API answers for stock.
import type { BinJson, LedgerJson, LevelsJson, UnitJson } from '../../shared/api/stock';
import { toLengthJson } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import { lengthOrNull, moneyJson } from '../catalog/catalog-json';
import type { BinRow, LedgerRow, LevelsRow, UnitRow } from './stock-repository';

export function binJson(row: BinRow): BinJson {
  return { id: row.id, code: row.code, name: row.name, units: row.units, parts: row.parts };
}

export function unitJson(row: UnitRow): UnitJson {
  return {
    id: row.id,
    label: row.label,
    partId: row.part_id,
    sku: row.sku,
    description: row.description,
    familyId: row.family_id,
    familyCode: row.family_code,
    familyName: row.family_name,
    stepId: row.step_id,
    stepLabel: row.step_label,
    nominalBore:
      row.standard_bore_nm !== null && row.offset_nm !== null
        ? toLengthJson(stepNominalBore(row.standard_bore_nm, row.offset_nm))
        : null,
    skirt: lengthOrNull(row.skirt_nm),
    status: row.status,
    binId: row.bin_id,
    bin: row.bin_code,
    receivedAt: row.received_at.toISOString(),
    measuredAt: row.measured_at ? row.measured_at.toISOString() : null,
    unitCost: moneyJson(row.unit_cost),
    heldForJobId: row.held_for_job_id,
    heldCylinder: row.held_cylinder,
    holdExpiresAt: row.hold_expires_at ? row.hold_expires_at.toISOString() : null,
  };
}

export function ledgerJson(row: LedgerRow): LedgerJson {
  return {
    id: Number(row.id),
    at: row.at.toISOString(),
    userId: row.user_id,
    userName: row.user_name,
    partId: row.part_id,
    sku: row.sku,
    unitId: row.unit_id,
    unitLabel: row.unit_label,
    kind: row.kind,
    quantity: row.quantity,
    heldDelta: row.held_delta,
    unitCost: row.unit_cost === null ? null : moneyJson(row.unit_cost),
    salePrice: row.sale_price === null ? null : moneyJson(row.sale_price),
    jobId: row.job_id,
    reason: row.reason,
    fromBinId: row.from_bin_id,
    fromBin: row.from_bin,
    toBinId: row.to_bin_id,
    toBin: row.to_bin,
    ref: row.ref,
  };
}

export function levelsJson(row: LevelsRow, averageCost: string): LevelsJson {
  return {
    onHand: row.on_hand,
    held: row.held,
    free: row.on_hand - row.held,
    averageCost: moneyJson(averageCost),
  };
}
