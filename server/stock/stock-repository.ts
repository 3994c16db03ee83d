// Every Knex query of stock: bins, part levels, piston units and the ledger. Writers take the
// caller's transaction; the row locks (FOR UPDATE) order concurrent changes to one part.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { insertRow } from '../db/rows';
import { pageOf } from '../db/paging';
import { containsPattern } from '../db/like-pattern';
import type { PartKind, UnitStatus } from '../../shared/api/catalog';
import type { LedgerKind } from '../../shared/api/stock';

export interface BinRow {
  id: string;
  code: string;
  name: string;
  units: number;
  parts: number;
}

export interface StockPartRow {
  id: string;
  kind: PartKind;
  sku: string;
  active: boolean;
  family_id: string | null;
  average_cost: string;
  standard_bore_nm: number | null;
  offset_nm: number | null;
}

export interface LevelsRow {
  on_hand: number;
  held: number;
  bin_id: string | null;
}

export interface UnitRow {
  id: string;
  label: string;
  part_id: string;
  sku: string;
  description: string;
  family_id: string | null;
  family_code: string | null;
  family_name: string | null;
  step_id: string | null;
  step_label: string | null;
  standard_bore_nm: number | null;
  offset_nm: number | null;
  skirt_nm: number | null;
  status: UnitStatus;
  bin_id: string | null;
  bin_code: string | null;
  received_at: Date;
  measured_at: Date | null;
  unit_cost: string;
  held_for_job_id: string | null;
  held_cylinder: number | null;
  hold_expires_at: Date | null;
}

export interface LedgerRow {
  id: number;
  at: Date;
  user_id: string | null;
  user_name: string | null;
  part_id: string;
  sku: string;
  unit_id: string | null;
  unit_label: string | null;
  kind: LedgerKind;
  quantity: number;
  held_delta: number;
  unit_cost: string | null;
  sale_price: string | null;
  job_id: string | null;
  reason: string | null;
  from_bin_id: string | null;
  from_bin: string | null;
  to_bin_id: string | null;
  to_bin: string | null;
  ref: string | null;
}

// ---- Bins -------------------------------------------------------------------------------------

/** A bin with what is in it: pistons on the shelf and counted parts with stock. */
function binColumns(k: Knex) {
  return [
    'b.id',
    'b.code',
    'b.name',
    k.raw(
      `(SELECT count(*) FROM piston_units u WHERE u.bin_id = b.id AND u.status IN ('free', 'held'))::int AS units`,
    ),
    k.raw(
      `(SELECT count(*) FROM part_levels pl WHERE pl.bin_id = b.id AND pl.on_hand > 0)::int AS parts`,
    ),
  ];
}

export async function listBins(
  opts: { q?: string; page: number; pageSize: number },
  k: Knex = db,
): Promise<{ rows: BinRow[]; total: number }> {
  const base = k('bins as b');
  if (opts.q) {
    const like = containsPattern(opts.q);
    base.where((w) => w.whereILike('b.code', like).orWhereILike('b.name', like));
  }
  return pageOf<BinRow>(base, opts, (list) => list.select(binColumns(k)).orderBy('b.code'));
}

export async function findBin(
  id: string,
  k: Knex = db,
): Promise<{ id: string; code: string } | undefined> {
  return k('bins').select('id', 'code').where({ id }).first();
}

export function insertBin(k: Knex, bin: { code: string; name: string }): Promise<string> {
  return insertRow(k, 'bins', bin);
}

export async function binById(id: string, k: Knex = db): Promise<BinRow | undefined> {
  return (await k('bins as b').select(binColumns(k)).where('b.id', id).first()) as
    BinRow | undefined;
}

// ---- Parts and levels -------------------------------------------------------------------------

export async function stockPart(id: string, k: Knex = db): Promise<StockPartRow | undefined> {
  return k('parts as p')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as ss', 'ss.id', 'p.step_id')
    .select(
      'p.id',
      'p.kind',
      'p.sku',
      'p.active',
      'p.family_id',
      'p.average_cost',
      'f.standard_bore_nm',
      'ss.offset_nm',
    )
    .where('p.id', id)
    .first();
}

// ---- Piston units -----------------------------------------------------------------------------

export async function insertUnits(
  k: Knex,
  units: { part_id: string; skirt_nm: number | null; bin_id: string; unit_cost: string }[],
): Promise<{ id: string; label: string }[]> {
  if (units.length === 0) return [];
  const rows = units.map((u) => ({
    ...u,
    measured_at: u.skirt_nm === null ? null : k.fn.now(),
  }));
  // One INSERT keeps the labels of one delivery consecutive.
  return k('piston_units').insert(rows).returning<{ id: string; label: string }[]>(['id', 'label']);
}

export async function lockUnit(
  k: Knex,
  id: string,
): Promise<
  | {
      id: string;
      part_id: string;
      label: string;
      status: UnitStatus;
      skirt_nm: number | null;
      bin_id: string | null;
    }
  | undefined
> {
  return k('piston_units')
    .select('id', 'part_id', 'label', 'status', 'skirt_nm', 'bin_id')
    .where({ id })
    .forUpdate()
    .first();
}

export async function updateUnit(
  k: Knex,
  id: string,
  change: { status?: UnitStatus; bin_id?: string; skirt_nm?: number; measured?: boolean },
): Promise<void> {
  const update: Record<string, unknown> = { updated_at: k.fn.now() };
  if (change.status !== undefined) update.status = change.status;
  if (change.bin_id !== undefined) update.bin_id = change.bin_id;
  if (change.skirt_nm !== undefined) update.skirt_nm = change.skirt_nm;
  if (change.measured) update.measured_at = k.fn.now();
  await k('piston_units').update(update).where({ id });
}

function unitBase(k: Knex) {
  return k('piston_units as u')
    .join('parts as p', 'p.id', 'u.part_id')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as ss', 'ss.id', 'p.step_id')
    .leftJoin('bins as b', 'b.id', 'u.bin_id');
}

const UNIT_COLUMNS = [
  'u.id',
  'u.label',
  'u.part_id',
  'p.sku',
  'p.description',
  'p.family_id',
  'f.code as family_code',
  'f.name as family_name',
  'p.step_id',
  'ss.label as step_label',
  'f.standard_bore_nm',
  'ss.offset_nm',
  'u.skirt_nm',
  'u.status',
  'u.bin_id',
  'b.code as bin_code',
  'u.received_at',
  'u.measured_at',
  'u.unit_cost',
  'u.held_for_job_id',
  'u.held_cylinder',
  'u.hold_expires_at',
];

const UNIT_SORTS: Record<string, string> = {
  label: 'u.label',
  sku: 'p.sku',
  skirt: 'u.skirt_nm',
  status: 'u.status',
  bin: 'b.code',
  receivedAt: 'u.received_at',
};

export interface UnitFilter {
  partId?: string;
  familyId?: string;
  stepId?: string;
  binId?: string;
  status?: UnitStatus;
  onShelf?: boolean;
  receiptId?: string;
  ids?: string[];
  q?: string;
  sort?: string;
  dir?: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export async function listUnits(
  opts: UnitFilter,
  k: Knex = db,
): Promise<{ rows: UnitRow[]; total: number }> {
  const base = unitBase(k);
  if (opts.partId) base.where('u.part_id', opts.partId);
  if (opts.familyId) base.where('p.family_id', opts.familyId);
  if (opts.stepId) base.where('p.step_id', opts.stepId);
  if (opts.binId) base.where('u.bin_id', opts.binId);
  if (opts.status) base.where('u.status', opts.status);
  if (opts.onShelf) base.whereIn('u.status', ['free', 'held']);
  if (opts.ids) base.whereIn('u.id', opts.ids);
  if (opts.receiptId) {
    base.whereIn(
      'u.id',
      k('stock_ledger')
        .select('unit_id')
        .where({ kind: 'receipt', ref: opts.receiptId })
        .whereNotNull('unit_id'),
    );
  }
  if (opts.q) {
    const q = opts.q.trim();
    const like = containsPattern(q);
    base.where((w) =>
      w
        .where('u.label', q.toUpperCase())
        .orWhereILike('p.sku', like)
        .orWhereILike('p.description', like)
        .orWhereILike('f.code', like),
    );
  }
  const column = UNIT_SORTS[opts.sort ?? 'label'] ?? 'u.label';
  const order = opts.dir === 'desc' ? 'DESC' : 'ASC';
  return pageOf<UnitRow>(base, opts, (list) =>
    list.select(UNIT_COLUMNS).orderByRaw(`${column} ${order} NULLS LAST, u.label ASC`),
  );
}

export async function findUnit(
  where: { id: string } | { label: string },
  k: Knex = db,
): Promise<UnitRow | undefined> {
  const query = unitBase(k).select(UNIT_COLUMNS);
  if ('id' in where) query.where('u.id', where.id);
  else query.where('u.label', where.label);
  return (await query.first()) as UnitRow | undefined;
}

export async function unitsByIds(ids: string[], k: Knex = db): Promise<UnitRow[]> {
  if (ids.length === 0) return [];
  return (await unitBase(k)
    .select(UNIT_COLUMNS)
    .whereIn('u.id', ids)
    .orderBy('u.label')) as UnitRow[];
}

// ---- Ledger -----------------------------------------------------------------------------------

function ledgerBase(k: Knex) {
  return k('stock_ledger as l')
    .join('parts as p', 'p.id', 'l.part_id')
    .leftJoin('users as us', 'us.id', 'l.user_id')
    .leftJoin('piston_units as u', 'u.id', 'l.unit_id')
    .leftJoin('bins as fb', 'fb.id', 'l.from_bin_id')
    .leftJoin('bins as tb', 'tb.id', 'l.to_bin_id');
}

const LEDGER_COLUMNS = [
  'l.*',
  'us.name as user_name',
  'p.sku',
  'u.label as unit_label',
  'fb.code as from_bin',
  'tb.code as to_bin',
];

export async function ledgerByIds(ids: number[], k: Knex = db): Promise<LedgerRow[]> {
  if (ids.length === 0) return [];
  return (await ledgerBase(k)
    .select(LEDGER_COLUMNS)
    .whereIn('l.id', ids)
    .orderBy('l.id')) as LedgerRow[];
}

export async function listLedger(
  opts: {
    partId?: string;
    unitId?: string;
    kind?: LedgerKind;
    jobId?: string;
    q?: string;
    page: number;
    pageSize: number;
  },
  k: Knex = db,
): Promise<{ rows: LedgerRow[]; total: number }> {
  const base = ledgerBase(k);
  if (opts.partId) base.where('l.part_id', opts.partId);
  if (opts.unitId) base.where('l.unit_id', opts.unitId);
  if (opts.kind) base.where('l.kind', opts.kind);
  if (opts.jobId) base.where('l.job_id', opts.jobId);
  if (opts.q?.trim()) {
    // The part number, the unit's label, or the reason or reference written with the movement.
    const like = containsPattern(opts.q.trim());
    base.where((w) =>
      w
        .whereILike('p.sku', like)
        .orWhereILike('u.label', like)
        .orWhereILike('l.reason', like)
        .orWhereILike('l.ref', like),
    );
  }
  return pageOf<LedgerRow>(base, opts, (list) =>
    list.select(LEDGER_COLUMNS).orderBy('l.id', 'desc'),
  );
}
