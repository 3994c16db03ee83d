// Queries for sourcing: what each supplier offers for a part, and the exchange rates.
import type { Knex } from 'knex';
import { db } from '../db/knex';

export interface OfferRow {
  item_id: string;
  supplier_id: string;
  supplier_name: string;
  supplier_sku: string;
  part_id: string;
  sku: string;
  price: string;
  currency: string;
  available: number | null;
  lead_days: number;
  seen_at: Date;
  shipping_cost: string;
  supplier_currency: string;
}

/** Every active supplier's current (not dropped) offer for the parts. */
export async function offersForParts(partIds: string[], k: Knex = db): Promise<OfferRow[]> {
  if (partIds.length === 0) return [];
  return k('supplier_items as i')
    .join('suppliers as s', 's.id', 'i.supplier_id')
    .join('parts as p', 'p.id', 'i.part_id')
    .leftJoin('price_list_imports as m', 'm.id', 'i.last_import_id')
    .whereIn('i.part_id', partIds)
    .andWhere('i.dropped', false)
    .andWhere('s.active', true)
    .select(
      'i.id as item_id',
      'i.supplier_id',
      's.name as supplier_name',
      'i.sku as supplier_sku',
      'i.part_id',
      'p.sku',
      'i.price',
      'i.currency',
      'i.available',
      k.raw('coalesce(i.lead_days, s.lead_days) AS lead_days'),
      k.raw('coalesce(m.committed_at, i.updated_at) AS seen_at'),
      's.shipping_cost',
      's.currency as supplier_currency',
    )
    .orderBy([{ column: 's.name' }, { column: 'i.sku' }]);
}

export interface SourcedPartRow {
  id: string;
  sku: string;
  kind: string;
  free: number;
}

/** The pistons of a family at a step (the step a cylinder needs), with their free stock. */
export async function pistonsAtStep(
  familyId: string,
  stepId: string,
  k: Knex = db,
): Promise<SourcedPartRow[]> {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .where({ 'p.family_id': familyId, 'p.step_id': stepId, 'p.kind': 'piston', 'p.active': true })
    .select('p.id', 'p.sku', 'p.kind', k.raw('(pl.on_hand - pl.held)::int AS free'))
    .orderBy('p.sku');
}

export interface SourcedPartDetailRow extends SourcedPartRow {
  description: string;
  family_id: string | null;
  step_id: string | null;
}

export async function partForSourcing(
  partId: string,
  k: Knex = db,
): Promise<SourcedPartDetailRow | undefined> {
  return k('parts as p')
    .join('part_levels as pl', 'pl.part_id', 'p.id')
    .where('p.id', partId)
    .first(
      'p.id',
      'p.sku',
      'p.kind',
      'p.description',
      'p.family_id',
      'p.step_id',
      k.raw('(pl.on_hand - pl.held)::int AS free'),
    );
}

export async function familyStepExists(
  familyId: string,
  stepId: string,
  k: Knex = db,
): Promise<{ family: boolean; step: boolean }> {
  const family = await k('engine_families').where({ id: familyId }).first('step_series_id');
  if (!family) return { family: false, step: false };
  const step = await k('series_steps')
    .where({ id: stepId, series_id: family.step_series_id })
    .first('id');
  return { family: true, step: Boolean(step) };
}

export interface RateRow {
  currency: string;
  rate: string;
  updated_at: Date;
  updated_by_name: string | null;
}

export async function listRates(k: Knex = db): Promise<RateRow[]> {
  return k('exchange_rates as r')
    .leftJoin('users as u', 'u.id', 'r.updated_by')
    .select('r.currency', 'r.rate', 'r.updated_at', 'u.name as updated_by_name')
    .orderBy('r.currency');
}

export async function findRate(currency: string, k: Knex = db): Promise<RateRow | undefined> {
  return (await listRates(k)).find((r) => r.currency === currency);
}

export async function upsertRate(
  k: Knex,
  currency: string,
  rate: string,
  userId: string,
): Promise<void> {
  await k('exchange_rates')
    .insert({ currency, rate, updated_by: userId, updated_at: k.fn.now() })
    .onConflict('currency')
    .merge(['rate', 'updated_by', 'updated_at']);
}

export async function deleteRate(k: Knex, currency: string): Promise<boolean> {
  return (await k('exchange_rates').where({ currency }).delete()) > 0;
}
