// Supplier rules: who a supplier is, what they offer, each offer's price history, and mapping their
// items to catalog parts (helped by suggestions from sizes, family codes, SKUs and GTINs).
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { toLengthJson } from '../../shared/lengths';
import type {
  PriceHistoryJson,
  SuggestionJson,
  SupplierData,
  SupplierItemJson,
  SupplierJson,
  SupplierPatch,
  UnmappedItemJson,
  WaitingItemJson,
} from '../../shared/api/suppliers';
import * as repo from './suppliers-repository';
import { isUniqueViolation } from '../db/pg-errors';
import type { Page } from '../../shared/api/common';

type Conn = Knex;

export function supplierJson(r: repo.SupplierRow): SupplierJson {
  return {
    id: r.id,
    name: r.name,
    contacts: r.contacts,
    email: r.email,
    currency: r.currency,
    leadDays: r.lead_days,
    minOrder: r.min_order,
    shippingCost: r.shipping_cost,
    notes: r.notes,
    active: r.active,
    items: Number(r.items ?? 0),
    unmapped: Number(r.unmapped ?? 0),
    lastImportAt: r.last_import_at ? r.last_import_at.toISOString() : null,
    createdAt: r.created_at.toISOString(),
    updatedAt: r.updated_at.toISOString(),
  };
}

export function itemJson(r: repo.ItemRow): SupplierItemJson {
  return {
    id: r.id,
    supplierId: r.supplier_id,
    sku: r.sku,
    description: r.description,
    size: r.size_nm === null ? null : toLengthJson(r.size_nm),
    oversize: r.oversize_nm === null ? null : toLengthJson(r.oversize_nm),
    part:
      r.part_id === null
        ? null
        : {
            id: r.part_id,
            sku: r.part_sku ?? '',
            description: r.part_description ?? '',
            kind: r.part_kind ?? '',
            familyCode: r.family_code,
            stepLabel: r.step_label,
          },
    price: r.price,
    currency: r.currency,
    available: r.available,
    leadDays: r.lead_days,
    gtin: r.gtin,
    lastImportId: r.last_import_id,
    lastSeenAt: r.last_seen_at ? r.last_seen_at.toISOString() : null,
    dropped: r.dropped,
    updatedAt: r.updated_at.toISOString(),
  };
}

function columnsOf(input: SupplierPatch): repo.SupplierColumns {
  const c: repo.SupplierColumns = {};
  if (input.name !== undefined) c.name = input.name;
  if (input.email !== undefined) c.email = input.email ?? null;
  if (input.currency !== undefined) c.currency = input.currency;
  if (input.leadDays !== undefined) c.lead_days = input.leadDays;
  if (input.contacts !== undefined) c.contacts = input.contacts;
  if (input.minOrder !== undefined) c.min_order = input.minOrder;
  if (input.shippingCost !== undefined) c.shipping_cost = input.shippingCost;
  if (input.notes !== undefined) c.notes = input.notes;
  if (input.active !== undefined) c.active = input.active;
  return c;
}

function nameConflict(name: string | undefined): Conflict {
  return new Conflict(`A supplier named "${name ?? ''}" already exists.`, 'duplicate_name');
}

export async function listSuppliers(
  query: { q?: string; sort?: string; dir?: 'asc' | 'desc'; page: number; pageSize: number },
  k: Conn = db,
): Promise<Page<SupplierJson>> {
  const { rows, total } = await repo.listSuppliers(query, k);
  return { items: rows.map(supplierJson), total };
}

export async function getSupplier(id: string, k: Conn = db): Promise<SupplierJson> {
  const row = await repo.findSupplier(id, k);
  if (!row) throw new NotFound('That supplier');
  return supplierJson(row);
}

/**
 * Holds the supplier's row until the transaction ends, so two price lists of one supplier commit
 * one after the other (the second sees what the first wrote).
 */
export async function lockSupplier(trx: Knex, id: string): Promise<void> {
  await repo.lockSupplier(trx, id);
}

export async function createSupplier(
  actorId: string | null,
  input: SupplierData,
  k: Conn = db,
): Promise<SupplierJson> {
  const columns = columnsOf(input);
  try {
    const id = await k.transaction(async (trx) => {
      const newId = await repo.insertSupplier(trx, columns);
      await recordAudit(trx, {
        userId: actorId,
        action: 'supplier.create',
        entity: 'supplier',
        entityId: newId,
        after: columns,
      });
      return newId;
    });
    return getSupplier(id, k);
  } catch (e) {
    if (isUniqueViolation(e)) throw nameConflict(input.name);
    throw e;
  }
}

export async function updateSupplier(
  actorId: string | null,
  id: string,
  input: SupplierPatch,
  k: Conn = db,
): Promise<SupplierJson> {
  const columns = columnsOf(input);
  if (Object.keys(columns).length === 0) throw new BadRequest('Nothing to change.');
  try {
    await k.transaction(async (trx) => {
      const before = await repo.lockSupplier(trx, id);
      if (!before) throw new NotFound('That supplier');
      await repo.updateSupplier(trx, id, columns);
      await recordAudit(trx, {
        userId: actorId,
        action: 'supplier.update',
        entity: 'supplier',
        entityId: id,
        before,
        after: columns,
      });
    });
  } catch (e) {
    if (isUniqueViolation(e)) throw nameConflict(input.name);
    throw e;
  }
  return getSupplier(id, k);
}

export async function listItems(
  supplierId: string,
  query: Omit<repo.ItemFilter, 'supplierId'>,
  k: Conn = db,
): Promise<Page<SupplierItemJson>> {
  await getSupplier(supplierId, k);
  const { rows, total } = await repo.listItems({ ...query, supplierId }, k);
  return { items: rows.map(itemJson), total };
}

export async function priceHistory(
  supplierId: string,
  itemId: string,
  page: { page: number; pageSize: number },
  k: Conn = db,
): Promise<Page<PriceHistoryJson> & { item: SupplierItemJson }> {
  const item = await repo.findItem(supplierId, itemId, k);
  if (!item) throw new NotFound('That supplier item');
  const { rows, total } = await repo.priceHistory(itemId, page.page, page.pageSize, k);
  return {
    item: itemJson(item),
    items: rows.map((r) => ({
      price: r.price,
      currency: r.currency,
      effectiveFrom: r.effective_from.toISOString(),
      importId: r.import_id,
      fileName: r.file_name,
    })),
    total,
  };
}

// ---- The mapping queue ---------------------------------------------------------------------------

const RING_WORDS = /ring|segment/i;
const KIT_WORDS = /\b(kit|set|satz)\b|-satz\b/i;

/** What a supplier's description says the item is, to prefer the matching kind of part. */
export function kindFromDescription(description: string): 'rings' | 'kit' | 'piston' {
  if (RING_WORDS.test(description)) return 'rings';
  if (KIT_WORDS.test(description)) return 'kit';
  return 'piston';
}

function words(text: string): Set<string> {
  return new Set(
    text
      .toLowerCase()
      .normalize('NFD')
      .replace(/[\u0300-\u036f]/g, '')
      .split(/[^a-z0-9]+/)
      .filter((w) => w.length >= 3),
  );
}

/**
 * Ranks candidate parts for one item. A GTIN or SKU match is near certain; the same size at the right
 * kind of part is strong; a family code named in the description helps; shared words break ties.
 */
export function rankSuggestions(
  item: { description: string },
  candidates: repo.CandidateRow[],
  limit = 3,
): SuggestionJson[] {
  const kind = kindFromDescription(item.description);
  const itemWords = words(item.description);
  const scored = candidates.map((c) => {
    const reasons: string[] = [];
    let score = 0;
    if (c.same_gtin) {
      score += 6;
      reasons.push('same GTIN');
    }
    if (c.same_sku) {
      score += 5;
      reasons.push('same SKU');
    }
    if (c.size_gap !== null && c.size_gap <= repo.SIZE_MATCH_NM) {
      score += c.size_gap === 0 ? 4 : 3;
      reasons.push(c.size_gap === 0 ? 'same size' : 'size within 0.005 mm');
    }
    if (c.family_named) {
      score += 2;
      reasons.push(`description names ${c.family_code}`);
    }
    if (c.kind === kind) {
      score += 1;
      reasons.push(`a ${kind === 'rings' ? 'ring set' : kind}, as the description says`);
    } else if (c.kind === 'kit' || c.kind === 'other' || kind !== 'piston') {
      score -= 1;
    }
    const partWords = words(c.description);
    const shared = [...itemWords].filter((w) => partWords.has(w)).length;
    const union = new Set([...itemWords, ...partWords]).size;
    if (union > 0) score += (2 * shared) / union;
    return {
      id: c.part_id,
      sku: c.sku,
      description: c.description,
      kind: c.kind,
      familyCode: c.family_code,
      stepLabel: c.step_label,
      reasons,
      score: Math.round(score * 100) / 100,
    };
  });
  return scored
    .filter((s) => s.score >= 2)
    .sort((a, b) => b.score - a.score || a.sku.localeCompare(b.sku))
    .slice(0, limit);
}

export async function listUnmapped(
  query: { supplierId?: string; q?: string; page: number; pageSize: number },
  k: Conn = db,
): Promise<Page<UnmappedItemJson>> {
  const { rows, total } = await repo.listItems(
    { ...query, mapped: false, dropped: false, sort: 'sku' },
    k,
  );
  const candidates = await repo.candidateParts(
    rows.map((r) => r.id),
    k,
  );
  const items = rows.map((r) => ({
    ...itemJson(r),
    supplierName: r.supplier_name ?? '',
    suggestions: rankSuggestions(
      r,
      candidates.filter((c) => c.item_id === r.id),
    ),
  }));
  return { items, total };
}

/**
 * For each part, the items in the mapping queue whose suggestions (exactly as the queue ranks them)
 * include it: what a buyer should map before concluding that nobody offers the part.
 */
export async function waitingItemsFor(
  partIds: string[],
  k: Conn = db,
): Promise<Map<string, WaitingItemJson[]>> {
  const byPart = new Map<string, WaitingItemJson[]>(partIds.map((id) => [id, []]));
  const items = await repo.waitingItemsNear(partIds, k);
  const candidates = await repo.candidateParts(
    items.map((i) => i.id),
    k,
  );
  for (const item of items) {
    const suggestions = rankSuggestions(
      item,
      candidates.filter((c) => c.item_id === item.id),
    );
    for (const s of suggestions) {
      byPart.get(s.id)?.push({
        itemId: item.id,
        supplierId: item.supplier_id,
        supplierName: item.supplier_name ?? '',
        supplierSku: item.sku,
        description: item.description,
        partId: s.id,
        reasons: s.reasons,
      });
    }
  }
  return byPart;
}

/** Maps a supplier item to a catalog part (or unmaps it with null). */
export async function mapItem(
  actorId: string | null,
  itemId: string,
  partId: string | null,
  k: Conn = db,
): Promise<SupplierItemJson> {
  await k.transaction(async (trx) => {
    const before = await repo.lockItem(trx, itemId);
    if (!before) throw new NotFound('That supplier item');
    if (partId !== null && !(await repo.partExists(trx, partId))) {
      throw new BadRequest('partId: no such catalog part.', [
        { field: 'partId', message: 'no such catalog part' },
      ]);
    }
    await repo.setItemPart(trx, itemId, partId);
    await recordAudit(trx, {
      userId: actorId,
      action: partId ? 'supplier_item.map' : 'supplier_item.unmap',
      entity: 'supplier_item',
      entityId: itemId,
      before: { partId: before.part_id },
      after: { partId },
    });
  });
  const row = await repo.findItemById(itemId, k);
  if (!row) throw new NotFound('That supplier item');
  return itemJson(row);
}
