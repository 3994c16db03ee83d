// The estimate's queries: the estimate row, its lines, and what the job tells the proposal (its
// engine's stroke, the cylinders with a step chosen, the holds with their parts' sale prices).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { EstimateState, LineKind } from '../../shared/api/money';

export interface EstimateRow {
  job_id: string;
  state: EstimateState;
  version: number;
  dismissed_keys: string[];
  sent_at: Date | null;
  decided_at: Date | null;
  approval_how: 'link' | 'counter' | 'phone' | null;
  approval_by: string | null;
  approval_by_name: string | null;
  approval_note: string | null;
  approved_version: number | null;
  approved_snapshot: ApprovedSnapshot | null;
  approved_at: Date | null;
}

export interface ApprovedSnapshot {
  lines: Array<{
    kind: LineKind;
    description: string;
    quantity: string;
    unitPrice: string;
    total: string;
    partId: string | null;
  }>;
  subtotal: string;
  tax: string;
  total: string;
  currency: string;
  taxRate: string;
  pricesIncludeTax: boolean;
}

export interface LineRow {
  id: string;
  job_id: string;
  kind: LineKind;
  description: string;
  quantity: string;
  unit_price: string;
  auto_key: string | null;
  labour_operation_id: string | null;
  part_id: string | null;
  position: number;
}

function estimateBase(k: Knex) {
  return k('estimates as e')
    .leftJoin('users as u', 'u.id', 'e.approval_by')
    .select('e.*', 'u.name as approval_by_name');
}

export async function findEstimate(jobId: string, k: Knex = db): Promise<EstimateRow | undefined> {
  return (await estimateBase(k).where('e.job_id', jobId).first()) as EstimateRow | undefined;
}

/** Makes the job's estimate if it has none yet, then locks it for the rest of the transaction. */
export async function lockEstimate(trx: Knex, jobId: string): Promise<EstimateRow> {
  await trx('estimates').insert({ job_id: jobId }).onConflict('job_id').ignore();
  await trx('estimates').where({ job_id: jobId }).forUpdate().first('job_id');
  return (await findEstimate(jobId, trx)) as EstimateRow;
}

export async function updateEstimate(
  trx: Knex,
  jobId: string,
  changes: Record<string, unknown>,
): Promise<void> {
  await trx('estimates')
    .update({ ...changes, updated_at: trx.fn.now() })
    .where({ job_id: jobId });
}

export async function linesOf(jobId: string, k: Knex = db): Promise<LineRow[]> {
  return (await k('estimate_lines')
    .where({ job_id: jobId })
    .orderBy([{ column: 'position' }, { column: 'created_at' }, { column: 'id' }])) as LineRow[];
}

export async function findLine(
  trx: Knex,
  jobId: string,
  lineId: string,
): Promise<LineRow | undefined> {
  return (await trx('estimate_lines').where({ job_id: jobId, id: lineId }).first()) as
    LineRow | undefined;
}

export async function insertLine(
  trx: Knex,
  line: Omit<LineRow, 'id' | 'position'> & { position?: number },
): Promise<LineRow> {
  const position =
    line.position ??
    Number(
      (
        await trx('estimate_lines')
          .where({ job_id: line.job_id })
          .max<{ max: number | null }>('position as max')
          .first()
      )?.max ?? 0,
    ) + 1;
  const [row] = await trx('estimate_lines')
    .insert({ ...line, position })
    .returning('*');
  return row as LineRow;
}

export async function updateLine(
  trx: Knex,
  lineId: string,
  changes: Partial<Omit<LineRow, 'id' | 'job_id'>>,
): Promise<LineRow> {
  const [row] = await trx('estimate_lines').update(changes).where({ id: lineId }).returning('*');
  return row as LineRow;
}

export async function deleteLines(trx: Knex, ids: string[]): Promise<void> {
  if (ids.length) await trx('estimate_lines').whereIn('id', ids).delete();
}

export async function dismissKey(trx: Knex, jobId: string, key: string): Promise<void> {
  await trx('estimates')
    .update({ dismissed_keys: trx.raw('array_append(dismissed_keys, ?)', [key]) })
    .where({ job_id: jobId })
    .whereRaw('NOT (? = ANY (dismissed_keys))', [key]);
}

export interface JobFactsRow {
  stroke_type: 'two' | 'four';
  cylinders: number;
  bored: number[];
}

export async function jobFacts(jobId: string, k: Knex = db): Promise<JobFactsRow | undefined> {
  const row = await k('jobs as j')
    .join('engine_families as f', 'f.id', 'j.family_id')
    .where('j.id', jobId)
    .first(
      'f.stroke_type',
      'j.cylinders',
      k.raw(
        `coalesce((SELECT array_agg(c.n ORDER BY c.n) FROM job_cylinders c
           WHERE c.job_id = j.id AND c.chosen_step_id IS NOT NULL), '{}') AS bored`,
      ),
    );
  return row as JobFactsRow | undefined;
}

export interface EstimateHoldRow {
  id: string;
  cylinder: number;
  part_id: string;
  sku: string;
  description: string;
  sale_price: string;
  quantity: number;
}

export async function activeHolds(jobId: string, k: Knex = db): Promise<EstimateHoldRow[]> {
  return (await k('holds as h')
    .join('parts as p', 'p.id', 'h.part_id')
    .where('h.job_id', jobId)
    .whereNull('h.released_at')
    .orderBy([{ column: 'h.cylinder' }, { column: 'p.kind' }, { column: 'h.created_at' }])
    .select(
      'h.id',
      'h.cylinder',
      'h.part_id',
      'p.sku',
      'p.description',
      'p.sale_price',
      'h.quantity',
    )) as EstimateHoldRow[];
}
