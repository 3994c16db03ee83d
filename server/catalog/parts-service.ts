// Parts: the list, one part with its levels and kit components, adding and changing one, with the
// rules across fields (a piston's step, a kit's components, a SKU taken); catalog-service.ts
// re-exports these with the rest of the catalog.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { normalizeGtin } from '../../shared/gtin';
import {
  type PartDetailJson,
  type PartInput,
  type PartJson,
  type PartKind,
  type PartPatch,
} from '../../shared/api/catalog';
import { toLengthJson } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import * as repo from './catalog-repository';
import { partJson, partLevels } from './catalog-json';
import { isUniqueViolation, pgConstraint } from '../db/pg-errors';
import type { Page } from '../../shared/api/common';
type Conn = Knex;

// ---- Parts ------------------------------------------------------------------------------------

export async function listParts(
  query: {
    familyId?: string;
    stepId?: string;
    kind?: PartKind;
    active?: boolean;
    q?: string;
    sort?: string;
    dir?: 'asc' | 'desc';
    page: number;
    pageSize: number;
  },
  k: Conn = db,
): Promise<Page<PartJson>> {
  // A scanned EAN-13 or UPC-A finds its part whichever length the scanner sends.
  const gtin = query.q ? normalizeGtin(query.q.trim()) : null;
  const { rows, total } = await repo.listParts({ ...query, gtin }, k);
  const components = await repo.componentsOf(
    rows.filter((r) => r.kind === 'kit').map((r) => r.id),
    k,
  );
  return {
    items: rows.map((r) =>
      partJson(
        r,
        components.filter((c) => c.kit_part_id === r.id),
      ),
    ),
    total,
  };
}

export async function getPart(id: string, k: Conn = db): Promise<PartDetailJson> {
  const row = await repo.findPart(id, k);
  if (!row) throw new NotFound('That part');
  const components = row.kind === 'kit' ? await repo.componentsOf([row.id], k) : [];
  return {
    ...partJson(row, components),
    family: row.family_id
      ? { id: row.family_id, code: row.family_code ?? '', name: row.family_name ?? '' }
      : null,
    step:
      row.step_id && row.step_offset_nm !== null
        ? {
            id: row.step_id,
            label: row.step_label ?? '',
            offset: toLengthJson(row.step_offset_nm),
            nominalBore:
              row.standard_bore_nm !== null
                ? toLengthJson(stepNominalBore(row.standard_bore_nm, row.step_offset_nm))
                : null,
          }
        : null,
    components: components.map((c) => ({
      partId: c.component_part_id,
      sku: c.sku,
      description: c.description,
      quantity: c.quantity,
      free: partLevels({ kind: c.kind, on_hand: c.on_hand, held: c.held }).free,
    })),
    createdAt: row.created_at.toISOString(),
    updatedAt: row.updated_at.toISOString(),
  };
}

type PartColumns = repo.PartColumns;

function partColumns(input: Partial<PartInput> & { active?: boolean }): Partial<PartColumns> {
  const c: Partial<PartColumns> = {};
  if (input.kind !== undefined) c.kind = input.kind;
  if (input.sku !== undefined) c.sku = input.sku;
  if (input.familyId !== undefined) c.family_id = input.familyId;
  if (input.stepId !== undefined) c.step_id = input.stepId;
  if (input.description !== undefined) c.description = input.description;
  if (input.material !== undefined) c.material = input.material;
  if (input.ringCount !== undefined) c.ring_count = input.ringCount;
  if (input.pinDiameter !== undefined) c.pin_diameter_nm = input.pinDiameter;
  if (input.gtin !== undefined) {
    // The route's schema already gives the 14-digit form; callers inside the server (seeds) may not.
    const gtin = input.gtin === null ? null : normalizeGtin(input.gtin);
    if (input.gtin !== null && gtin === null) throw fieldError('gtin', 'not a valid GTIN');
    c.gtin = gtin;
  }
  if (input.salePrice !== undefined) c.sale_price = input.salePrice;
  if (input.reorderPoint !== undefined) c.reorder_point = input.reorderPoint;
  if (input.orderUpTo !== undefined) c.order_up_to = input.orderUpTo;
  if (input.active !== undefined) c.active = input.active;
  return c;
}

function fieldError(field: string, message: string): BadRequest {
  return new BadRequest(`${field}: ${message}`, [{ field, message }]);
}

/** Rules across fields and tables, checked on the part as it will be after the change. */
async function checkPart(
  k: Conn,
  partId: string | null,
  p: PartColumns,
  components: { partId: string; quantity: number }[] | undefined,
): Promise<void> {
  const sized = p.kind === 'piston' || p.kind === 'rings';
  if (sized && !p.family_id)
    throw fieldError('familyId', `a ${p.kind} part needs its engine family`);
  if (sized && !p.step_id)
    throw fieldError('stepId', `a ${p.kind} part needs its step (STD or an oversize)`);
  if (p.step_id && !p.family_id)
    throw fieldError('familyId', 'a part with a step needs its engine family');
  if (p.family_id) {
    const family = await repo.findFamily(p.family_id, k);
    if (!family) throw fieldError('familyId', 'no engine family has this id');
    if (p.step_id) {
      const step = await repo.findStep(p.step_id, k);
      if (!step || step.series_id !== family.step_series_id) {
        throw fieldError('stepId', `not a step of the series family ${family.code} uses`);
      }
    }
  }
  if (p.kind === 'piston' && !p.material)
    throw fieldError('material', 'say whether the piston is cast or forged');
  if (p.kind !== 'piston' && p.material)
    throw fieldError('material', 'only pistons have a material');
  if (p.kind !== 'piston' && p.ring_count !== null) {
    throw fieldError('ringCount', 'only pistons have a number of rings');
  }
  if (p.reorder_point !== null && p.order_up_to !== null && p.order_up_to < p.reorder_point) {
    throw fieldError('orderUpTo', 'must not be below the reorder point');
  }
  if (p.kind === 'kit') {
    if (components !== undefined) await checkComponents(k, partId, components);
  } else if (components && components.length > 0) {
    throw fieldError('components', 'only a kit has components');
  }
  if (p.kind === 'kit' && partId && (await repo.isComponent(k, partId))) {
    throw fieldError('kind', 'this part is itself in a kit; a kit cannot contain a kit');
  }
}

async function checkComponents(
  k: Conn,
  kitId: string | null,
  components: { partId: string; quantity: number }[],
): Promise<void> {
  if (components.length === 0)
    throw fieldError('components', 'a kit needs at least one part in it');
  const ids = components.map((c) => c.partId);
  if (new Set(ids).size !== ids.length) {
    throw fieldError('components', 'list each part once, with its quantity');
  }
  if (kitId && ids.includes(kitId)) throw fieldError('components', 'a kit cannot contain itself');
  const found = await repo.partsByIds(ids, k);
  for (const [index, id] of ids.entries()) {
    const part = found.find((f) => f.id === id);
    if (!part) throw fieldError(`components.${index}.partId`, 'no part has this id');
    if (part.kind === 'kit')
      throw fieldError(`components.${index}.partId`, 'a kit cannot contain a kit');
  }
}

function uniqueConflict(e: unknown, sku?: string): never {
  const constraint = pgConstraint(e);
  if (constraint.includes('gtin')) {
    throw new Conflict('Another part already has this GTIN; one barcode finds one part.');
  }
  throw new Conflict(`Another part already has the part number "${sku ?? ''}".`);
}

export async function createPart(actorId: string | null, input: PartInput, k: Conn = db) {
  const columns: PartColumns = {
    family_id: null,
    step_id: null,
    material: null,
    ring_count: null,
    pin_diameter_nm: null,
    gtin: null,
    sale_price: '0',
    reorder_point: null,
    order_up_to: null,
    active: true,
    ...partColumns(input),
  } as PartColumns;
  if (input.kind === 'kit' && input.components === undefined) {
    throw fieldError('components', 'a kit needs at least one part in it');
  }
  try {
    const id = await k.transaction(async (trx) => {
      await checkPart(trx, null, columns, input.components);
      const newId = await repo.insertPart(trx, columns);
      if (input.kind === 'kit' && input.components) {
        await repo.replaceComponents(trx, newId, input.components);
      }
      await recordAudit(trx, {
        userId: actorId,
        action: 'part.create',
        entity: 'part',
        entityId: newId,
        after: { ...columns, components: input.components },
      });
      return newId;
    });
    return getPart(id, k);
  } catch (e) {
    if (isUniqueViolation(e)) uniqueConflict(e, input.sku);
    throw e;
  }
}

export async function updatePart(
  actorId: string | null,
  id: string,
  patch: PartPatch,
  k: Conn = db,
) {
  try {
    await k.transaction(async (trx) => {
      if (!(await repo.lockPart(trx, id))) throw new NotFound('That part');
      const before = await repo.findPart(id, trx);
      if (!before) throw new NotFound('That part');
      const changes = partColumns(patch);
      const merged = { ...before, ...changes } as PartColumns;
      const sizeChanged =
        (changes.family_id !== undefined && changes.family_id !== before.family_id) ||
        (changes.step_id !== undefined && changes.step_id !== before.step_id);
      if (sizeChanged && before.kind === 'piston' && before.on_hand > 0) {
        throw new Conflict(
          'Pistons of this part are on the shelf, measured for this step; make a new part for the other size.',
        );
      }
      await checkPart(trx, id, merged, patch.components);
      await repo.updatePart(trx, id, changes);
      if (before.kind === 'kit' && patch.components) {
        await repo.replaceComponents(trx, id, patch.components);
      }
      const beforeView: Record<string, unknown> = {};
      for (const key of Object.keys(changes) as (keyof PartColumns)[])
        beforeView[key] = before[key];
      await recordAudit(trx, {
        userId: actorId,
        action: 'part.update',
        entity: 'part',
        entityId: id,
        before: beforeView,
        after: { ...changes, components: patch.components },
      });
    });
  } catch (e) {
    if (isUniqueViolation(e)) uniqueConflict(e, patch.sku);
    throw e;
  }
  return getPart(id, k);
}
