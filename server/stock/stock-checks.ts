// What the stock services check before a change: the part and the bin exist, a measured skirt is
// plausible for its step, and how a ledger answer is read back.
import type { Knex } from 'knex';
import { BadRequest } from '../errors';
import { formatLength, type Nm } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type { UnitStatus } from '../../shared/api/catalog';
import type { LedgerJson, StockChangeJson } from '../../shared/api/stock';
import * as repo from './stock-repository';
import { ledgerJson, levelsJson, unitJson } from './stock-json';

type Conn = Knex;

export function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

export const STATUS_WORDS: Record<UnitStatus, string> = {
  free: 'free on the shelf',
  held: 'held for a job',
  issued: 'already issued',
  returned: 'sent back to the supplier',
  scrapped: 'scrapped',
};

/**
 * A measured skirt far from the step's nominal bore is almost always a unit mix-up (a size in
 * inches typed as mm, or the reverse: a factor of 25.4). Our own guard, kept wide (a quarter of
 * the bore) so it never second-guesses a real measurement.
 */
export function checkSkirt(field: string, skirtNm: Nm, part: repo.StockPartRow): void {
  if (part.standard_bore_nm === null || part.offset_nm === null) return;
  const nominal = stepNominalBore(part.standard_bore_nm, part.offset_nm);
  if (Math.abs(skirtNm - nominal) * 4 > nominal) {
    throw fieldError(
      field,
      `${formatLength(skirtNm, 'mm')} (${formatLength(skirtNm, 'in')}) is far from this step's nominal bore of ${formatLength(nominal, 'mm')} (${formatLength(nominal, 'in')}); check the number and its unit`,
    );
  }
}

export async function requirePart(
  k: Conn,
  partId: string,
  field = 'partId',
): Promise<repo.StockPartRow> {
  const part = await repo.stockPart(partId, k);
  if (!part) throw fieldError(field, 'no part has this id');
  if (part.kind === 'kit') {
    throw fieldError(
      field,
      `${part.sku} is a kit: its stock is the stock of its parts; count those`,
    );
  }
  return part;
}

export async function requireBin(
  k: Conn,
  binId: string,
  field: string,
): Promise<{ id: string; code: string }> {
  const bin = await repo.findBin(binId, k);
  if (!bin) throw fieldError(field, 'no bin has this id');
  return bin;
}

export async function ledgerOut(k: Conn, ids: number[]): Promise<LedgerJson[]> {
  return (await repo.ledgerByIds(ids, k)).map(ledgerJson);
}

/** What a change to one piston answers: its ledger rows, the part's levels, the piston as it is now. */
export async function unitChangeOut(
  k: Conn,
  ids: number[],
  levels: repo.LevelsRow,
  averageCost: string,
  unitId: string,
): Promise<StockChangeJson> {
  const row = await repo.findUnit({ id: unitId }, k);
  return {
    ledger: await ledgerOut(k, ids),
    levels: levelsJson(levels, averageCost),
    unit: row ? unitJson(row) : undefined,
  };
}
