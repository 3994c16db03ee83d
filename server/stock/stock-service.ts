// Stock rules. Every change is one transaction that locks the part's levels row, writes the ledger,
// updates levels (and units) and the audit trail together; the database CHECKs are the last guard.
// Lock order, kept by every writer to avoid deadlocks: the piston unit row first, then the part's
// levels row.
import { randomUUID } from 'node:crypto';
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { Conflict, NotAvailable, NotFound } from '../errors';
import { faultPoint } from '../testing-faults';
import Decimal from 'decimal.js';
import { receiptValue } from '../../shared/average-cost';
import type {
  AdjustmentInput,
  BinInput,
  BinJson,
  LedgerJson,
  MoveInput,
  ReceiptInput,
  ReceiptJson,
  StockChangeJson,
  UnitJson,
} from '../../shared/api/stock';
import * as repo from './stock-repository';
import { binJson, ledgerJson, levelsJson, unitJson } from './stock-json';
import { isCheckViolation, isUniqueViolation } from '../db/pg-errors';
import * as moves from './stock-movements';
import {
  checkSkirt,
  fieldError,
  ledgerOut,
  unitChangeOut,
  requireBin,
  requirePart,
  STATUS_WORDS,
} from './stock-checks';
import type { Page } from '../../shared/api/common';

type Conn = Knex;

// ---- Bins -------------------------------------------------------------------------------------

export async function listBins(
  query: { q?: string; page: number; pageSize: number },
  k: Conn = db,
): Promise<Page<BinJson>> {
  const { rows, total } = await repo.listBins(query, k);
  return { items: rows.map(binJson), total };
}

export async function createBin(
  actorId: string | null,
  input: BinInput,
  k: Conn = db,
): Promise<BinJson> {
  try {
    const id = await k.transaction(async (trx) => {
      const newId = await repo.insertBin(trx, { code: input.code, name: input.name ?? '' });
      await recordAudit(trx, {
        userId: actorId,
        action: 'bin.create',
        entity: 'bin',
        entityId: newId,
        after: { code: input.code, name: input.name ?? '' },
      });
      return newId;
    });
    const bin = await repo.binById(id, k);
    if (!bin) throw new NotFound('The new bin');
    return binJson(bin);
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(`A bin with the code "${input.code}" already exists.`);
    }
    throw e;
  }
}

// ---- Receipts ---------------------------------------------------------------------------------

/**
 * Takes a delivery into stock: pistons one unit each (measured or "to measure"), other parts as a
 * count, at the unit cost paid, blended into the part's moving average cost.
 */
export async function receive(
  actorId: string | null,
  input: ReceiptInput,
  k: Conn = db,
): Promise<ReceiptJson> {
  const part = await requirePart(k, input.partId);
  if (!part.active) {
    throw fieldError(
      'partId',
      `${part.sku} is marked no longer stocked; make it active before receiving it`,
    );
  }
  await requireBin(k, input.binId, 'binId');
  const units = input.units ?? [];
  if (part.kind === 'piston') {
    if (units.length !== input.quantity) {
      throw fieldError(
        'units',
        `give one entry per piston: ${input.quantity} entries for a quantity of ${input.quantity} (leave the skirt out for a piston still to measure)`,
      );
    }
    units.forEach((u, i) => {
      if (u.skirt !== undefined && u.skirt !== null) checkSkirt(`units.${i}.skirt`, u.skirt, part);
    });
  } else if (units.length > 0) {
    throw fieldError('units', `only pistons are received one by one; ${part.sku} is counted`);
  }

  const receiptId = randomUUID();
  return k.transaction(async (trx) => {
    const before = await moves.lockLevels(trx, part.id);
    const cost = receiptValue(
      { quantity: before.on_hand, value: before.stock_value },
      input.quantity,
      input.unitCost,
    );
    const reason = input.note ? input.note : null;
    let ledgerIds: number[];
    let unitIds: string[] = [];
    if (part.kind === 'piston') {
      const created = await repo.insertUnits(
        trx,
        units.map((u) => ({
          part_id: part.id,
          skirt_nm: u.skirt ?? null,
          bin_id: input.binId,
          unit_cost: input.unitCost,
        })),
      );
      unitIds = created.map((c) => c.id);
      ledgerIds = await moves.insertLedger(
        trx,
        created.map((c) => ({
          user_id: actorId,
          part_id: part.id,
          unit_id: c.id,
          kind: 'receipt' as const,
          quantity: 1,
          unit_cost: input.unitCost,
          reason,
          to_bin_id: input.binId,
          ref: receiptId,
        })),
      );
    } else {
      ledgerIds = await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: part.id,
          kind: 'receipt',
          quantity: input.quantity,
          unit_cost: input.unitCost,
          reason,
          to_bin_id: input.binId,
          ref: receiptId,
        },
      ]);
    }
    faultPoint('stock.receipt.afterLedger');
    const after = await moves.changeLevels(trx, part.id, {
      onHand: input.quantity,
      stockValue: cost.value,
      // A counted part lives in one bin: the delivery's bin becomes its place.
      binId: part.kind === 'piston' ? undefined : input.binId,
    });
    await moves.setAverageCost(trx, part.id, cost.averageCost);
    await recordAudit(trx, {
      userId: actorId,
      action: 'stock.receipt',
      entity: 'part',
      entityId: part.id,
      before: { onHand: before.on_hand, held: before.held, averageCost: before.average_cost },
      after: {
        onHand: after.on_hand,
        held: after.held,
        averageCost: cost.averageCost,
        quantity: input.quantity,
        unitCost: input.unitCost,
        binId: input.binId,
        receiptId,
        units: unitIds,
      },
    });
    return {
      receiptId,
      ledger: await ledgerOut(trx, ledgerIds),
      units: (await repo.unitsByIds(unitIds, trx)).map(unitJson),
      levels: levelsJson(after, cost.averageCost),
    };
  });
}

// ---- Adjustments ------------------------------------------------------------------------------

/** Corrects a counted part's on-hand after a count, with the reason on record. */
export async function adjust(
  actorId: string | null,
  input: AdjustmentInput,
  k: Conn = db,
): Promise<StockChangeJson> {
  const part = await requirePart(k, input.partId);
  if (part.kind === 'piston') {
    throw fieldError(
      'partId',
      `${part.sku} is a piston: each one is a unit with its own label; receive new ones, scrap a missing or damaged one`,
    );
  }
  try {
    return await k.transaction(async (trx) => {
      const before = await moves.lockLevels(trx, part.id);
      const onHand = before.on_hand + input.quantity;
      if (onHand < 0) {
        throw new NotAvailable(
          `Cannot take away ${-input.quantity} of ${part.sku}: only ${before.on_hand} on hand.`,
          { onHand: before.on_hand, held: before.held },
        );
      }
      if (onHand < before.held) {
        throw new NotAvailable(
          `Cannot take away ${-input.quantity} of ${part.sku}: ${before.held} of the ${before.on_hand} on hand are held for jobs, so on hand cannot go below ${before.held}. Release a hold first.`,
          { onHand: before.on_hand, held: before.held },
        );
      }
      const ids = await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: part.id,
          kind: 'adjustment',
          quantity: input.quantity,
          unit_cost: before.average_cost,
          reason: input.reason,
        },
      ]);
      // More found than counted comes in at the average cost; fewer leaves its share of the value.
      const after = await moves.changeLevels(trx, part.id, {
        onHand: input.quantity,
        ...(input.quantity > 0
          ? {
              stockValue: new Decimal(before.stock_value)
                .plus(new Decimal(before.average_cost).times(input.quantity))
                .toFixed(),
            }
          : {}),
      });
      await recordAudit(trx, {
        userId: actorId,
        action: 'stock.adjustment',
        entity: 'part',
        entityId: part.id,
        before: { onHand: before.on_hand, held: before.held },
        after: { onHand: after.on_hand, held: after.held, reason: input.reason },
      });
      return { ledger: await ledgerOut(trx, ids), levels: levelsJson(after, before.average_cost) };
    });
  } catch (e) {
    // The CHECK on part_levels is the last guard should a change slip past the lock above.
    if (isCheckViolation(e)) {
      throw new NotAvailable(`That change would leave ${part.sku} with less on hand than is held.`);
    }
    throw e;
  }
}

// ---- Moves ------------------------------------------------------------------------------------

/** Moves one piston (by unit) or all of a counted part (by part) to another bin. */
export async function move(
  actorId: string | null,
  input: MoveInput,
  k: Conn = db,
): Promise<StockChangeJson> {
  const toBin = await requireBin(k, input.toBinId, 'toBinId');
  if (input.unitId) {
    const unitId = input.unitId;
    return k.transaction(async (trx) => {
      const unit = await repo.lockUnit(trx, unitId);
      if (!unit) throw fieldError('unitId', 'no piston unit has this id');
      if (unit.status !== 'free' && unit.status !== 'held') {
        throw new Conflict(
          `${unit.label} is ${STATUS_WORDS[unit.status]}; only pistons on the shelf can move.`,
        );
      }
      if (unit.bin_id === toBin.id)
        throw fieldError('toBinId', `${unit.label} is already in bin ${toBin.code}`);
      const levels = await moves.lockLevels(trx, unit.part_id);
      const ids = await moves.insertLedger(trx, [
        {
          user_id: actorId,
          part_id: unit.part_id,
          unit_id: unit.id,
          kind: 'transfer',
          quantity: 0,
          from_bin_id: unit.bin_id,
          to_bin_id: toBin.id,
        },
      ]);
      await repo.updateUnit(trx, unit.id, { bin_id: toBin.id });
      await recordAudit(trx, {
        userId: actorId,
        action: 'stock.move',
        entity: 'piston_unit',
        entityId: unit.id,
        before: { binId: unit.bin_id },
        after: { binId: toBin.id },
      });
      return unitChangeOut(trx, ids, levels, levels.average_cost, unit.id);
    });
  }
  const part = await requirePart(k, input.partId ?? '');
  if (part.kind === 'piston') {
    throw fieldError('partId', `${part.sku} is a piston: move each one by its label (unitId)`);
  }
  return k.transaction(async (trx) => {
    const levels = await moves.lockLevels(trx, part.id);
    if (levels.bin_id === toBin.id)
      throw fieldError('toBinId', `${part.sku} is already in bin ${toBin.code}`);
    const ids = await moves.insertLedger(trx, [
      {
        user_id: actorId,
        part_id: part.id,
        kind: 'transfer',
        quantity: 0,
        from_bin_id: levels.bin_id,
        to_bin_id: toBin.id,
        reason: `${levels.on_hand} moved`,
      },
    ]);
    const after = await moves.changeLevels(trx, part.id, { binId: toBin.id });
    await recordAudit(trx, {
      userId: actorId,
      action: 'stock.move',
      entity: 'part',
      entityId: part.id,
      before: { binId: levels.bin_id },
      after: { binId: toBin.id },
    });
    return { ledger: await ledgerOut(trx, ids), levels: levelsJson(after, levels.average_cost) };
  });
}

// ---- Reads ------------------------------------------------------------------------------------

export async function listUnits(query: repo.UnitFilter, k: Conn = db): Promise<Page<UnitJson>> {
  const { rows, total } = await repo.listUnits(query, k);
  return { items: rows.map(unitJson), total };
}

export async function getUnit(id: string, k: Conn = db): Promise<UnitJson> {
  const row = await repo.findUnit({ id }, k);
  if (!row) throw new NotFound('That piston unit');
  return unitJson(row);
}

export async function unitByLabel(label: string, k: Conn = db): Promise<UnitJson> {
  const row = await repo.findUnit({ label: label.trim().toUpperCase() }, k);
  if (!row) throw new NotFound(`A piston labelled ${label.trim().toUpperCase()}`);
  return unitJson(row);
}

export async function listLedger(
  query: Parameters<typeof repo.listLedger>[0],
  k: Conn = db,
): Promise<Page<LedgerJson>> {
  const { rows, total } = await repo.listLedger(query, k);
  return { items: rows.map(ledgerJson), total };
}
