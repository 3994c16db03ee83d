// Scrapping a piston (or counted stock) and measuring a piston's skirt: changes to what a unit is,
// each in one transaction with its ledger row and audit trail, like every stock change.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotAvailable, NotFound } from '../errors';
import { issueAtCost } from '../../shared/average-cost';
import { formatLength, type Nm } from '../../shared/lengths';
import type { StockChangeJson } from '../../shared/api/stock';
import * as repo from './stock-repository';
import { isCheckViolation } from '../db/pg-errors';
import * as moves from './stock-movements';
import { checkSkirt, STATUS_WORDS, unitChangeOut } from './stock-checks';

type Conn = Knex;

// ---- Scrap and measure ------------------------------------------------------------------------

/** Writes off a free piston (damaged, dropped, lost at a count). A held one is released first. */
export async function scrap(
  actorId: string | null,
  unitId: string,
  reason: string,
  k: Conn = db,
): Promise<StockChangeJson> {
  try {
    return await k.transaction(async (trx) => {
      const unit = await repo.lockUnit(trx, unitId);
      if (!unit) throw new NotFound('That piston unit');
      if (unit.status === 'held') {
        throw new NotAvailable(
          `${unit.label} is held for a job; release the hold before scrapping it.`,
        );
      }
      if (unit.status !== 'free') {
        throw new Conflict(
          `${unit.label} is ${STATUS_WORDS[unit.status]}; only a piston on the shelf can be scrapped.`,
        );
      }
      const levels = await moves.lockLevels(trx, unit.part_id);
      // Stock leaves at the average cost, which stays as it was (weighted-average cost method).
      const cost = issueAtCost({ quantity: levels.on_hand, averageCost: levels.average_cost }, 1);
      const ids = await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: unit.part_id,
          unit_id: unit.id,
          kind: 'scrap',
          quantity: -1,
          unit_cost: cost.issuedValue,
          reason,
          from_bin_id: unit.bin_id,
        },
      ]);
      await repo.updateUnit(trx, unit.id, { status: 'scrapped' });
      const after = await moves.changeLevels(trx, unit.part_id, { onHand: -1 });
      await recordAudit(trx, {
        userId: actorId,
        action: 'stock.scrap',
        entity: 'piston_unit',
        entityId: unit.id,
        before: { status: unit.status },
        after: { status: 'scrapped', reason },
      });
      return unitChangeOut(trx, ids, after, levels.average_cost, unit.id);
    });
  } catch (e) {
    if (isCheckViolation(e)) {
      throw new NotAvailable('That piston cannot be scrapped: it is counted as held for a job.');
    }
    throw e;
  }
}

/** Records a piston's measured skirt diameter (first measurement, or a correction while it is free). */
export async function measure(
  actorId: string | null,
  unitId: string,
  skirtNm: Nm,
  k: Conn = db,
): Promise<StockChangeJson> {
  return k.transaction(async (trx) => {
    const unit = await repo.lockUnit(trx, unitId);
    if (!unit) throw new NotFound('That piston unit');
    if (unit.status !== 'free' && unit.status !== 'held') {
      throw new Conflict(
        `${unit.label} is ${STATUS_WORDS[unit.status]}; only a piston on the shelf can be measured.`,
      );
    }
    if (unit.status === 'held' && unit.skirt_nm !== null) {
      throw new Conflict(
        `${unit.label} is held for a job whose bore was worked out from its measured size; release the hold before measuring it again.`,
      );
    }
    const part = await repo.stockPart(unit.part_id, trx);
    if (part) checkSkirt('skirt', skirtNm, part);
    const levels = await moves.lockLevels(trx, unit.part_id);
    const was =
      unit.skirt_nm === null
        ? null
        : `${formatLength(unit.skirt_nm, 'mm')} / ${formatLength(unit.skirt_nm, 'in')}`;
    const now = `${formatLength(skirtNm, 'mm')} / ${formatLength(skirtNm, 'in')}`;
    const ids = await moves.insertLedger(trx, [
      {
        user_id: actorId,
        part_id: unit.part_id,
        unit_id: unit.id,
        kind: 'measure',
        quantity: 0,
        reason: was ? `re-measured ${now} (was ${was})` : `measured ${now}`,
      },
    ]);
    await repo.updateUnit(trx, unit.id, { skirt_nm: skirtNm, measured: true });
    await recordAudit(trx, {
      userId: actorId,
      action: 'stock.measure',
      entity: 'piston_unit',
      entityId: unit.id,
      before: { skirtNm: unit.skirt_nm },
      after: { skirtNm },
    });
    return unitChangeOut(trx, ids, levels, levels.average_cost, unit.id);
  });
}
