// Catalog rules: what makes an engine family, a step series and a part valid, the step ladder and
// the exposure list. One transaction per change; every change to prices or reorder rules is audited.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import { normalizeGtin } from '../../shared/gtin';
import {
  type FamilyInput,
  type FamilyPatch,
  type Page,
  type PartDetailJson,
  type PartInput,
  type PartJson,
  type PartKind,
  type PartPatch,
  type StepSeriesInput,
  type StepSeriesJson,
} from '../../shared/catalog-api';
import { toLengthJson } from '../../shared/lengths';
import { customSeries, stepNominalBore, StepSeriesError } from '../../shared/step-series';
import * as repo from './catalog-repository';
import { familyJson, partJson, partLevels } from './catalog-json';
import { isUniqueViolation, pgConstraint } from '../db/pg-errors';

type Conn = Knex;

// ---- Step series ------------------------------------------------------------------------------

export async function listStepSeries(k: Conn = db): Promise<Page<StepSeriesJson>> {
  const series = await repo.listSeries(k);
  const steps = await repo.stepsOfSeries(
    series.map((s) => s.id),
    k,
  );
  const items = series.map((s) => ({
    id: s.id,
    code: s.code,
    name: s.name,
    unit: s.unit,
    custom: s.custom,
    steps: steps
      .filter((st) => st.series_id === s.id)
      .map((st) => ({
        id: st.id,
        position: st.position,
        label: st.label,
        offset: toLengthJson(st.offset_nm),
      })),
  }));
  return { items, total: items.length };
}

export async function createStepSeries(
  actorId: string | null,
  input: StepSeriesInput & { custom?: boolean },
  k: Conn = db,
): Promise<StepSeriesJson> {
  let steps;
  try {
    steps = customSeries(input.offsets, input.unit);
  } catch (e) {
    if (e instanceof StepSeriesError) {
      throw new BadRequest(`offsets: ${e.message}`, [{ field: 'offsets', message: e.message }]);
    }
    throw e;
  }
  try {
    const id = await k.transaction(async (trx) => {
      const newId = await repo.insertSeries(
        trx,
        { code: input.code, name: input.name, unit: input.unit, custom: input.custom ?? true },
        steps.map((s) => ({ label: s.label, offset_nm: s.offsetNm })),
      );
      await recordAudit(trx, {
        userId: actorId,
        action: 'step_series.create',
        entity: 'step_series',
        entityId: newId,
        after: {
          code: input.code,
          name: input.name,
          unit: input.unit,
          steps: steps.map((s) => s.label),
        },
      });
      return newId;
    });
    const all = await listStepSeries(k);
    const created = all.items.find((s) => s.id === id);
    if (!created) throw new NotFound('The new step series');
    return created;
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(`A step series with the code "${input.code}" already exists.`);
    }
    throw e;
  }
}

// ---- Engine families --------------------------------------------------------------------------

export async function listFamilies(
  query: {
    q?: string;
    active?: boolean;
    sort?: string;
    dir?: 'asc' | 'desc';
    page: number;
    pageSize: number;
  },
  k: Conn = db,
) {
  const { rows, total } = await repo.listFamilies(query, k);
  return { items: rows.map(familyJson), total };
}

export async function getFamily(id: string, k: Conn = db) {
  const row = await repo.findFamily(id, k);
  if (!row) throw new NotFound('That engine family');
  return familyJson(row);
}

type FamilyColumns = repo.FamilyColumns;

function familyColumns(input: Partial<FamilyInput> & { active?: boolean }): Partial<FamilyColumns> {
  const c: Partial<FamilyColumns> = {};
  if (input.code !== undefined) c.code = input.code;
  if (input.name !== undefined) c.name = input.name;
  if (input.strokeType !== undefined) c.stroke_type = input.strokeType;
  if (input.cylinders !== undefined) c.cylinders = input.cylinders;
  if (input.cooling !== undefined) c.cooling = input.cooling;
  if (input.standardBore !== undefined) c.standard_bore_nm = input.standardBore;
  if (input.stroke !== undefined) c.stroke_nm = input.stroke;
  if (input.clearanceMin !== undefined) c.clearance_min_nm = input.clearanceMin;
  if (input.clearanceMax !== undefined) c.clearance_max_nm = input.clearanceMax;
  if (input.honeAllowance !== undefined) c.hone_allowance_nm = input.honeAllowance;
  if (input.cleanup !== undefined) c.cleanup_nm = input.cleanup;
  if (input.maxOversize !== undefined) c.max_oversize_nm = input.maxOversize;
  if (input.stepSeriesId !== undefined) c.step_series_id = input.stepSeriesId;
  if (input.maxTaper !== undefined) c.max_taper_nm = input.maxTaper;
  if (input.maxOutOfRound !== undefined) c.max_out_of_round_nm = input.maxOutOfRound;
  if (input.ringGapMin !== undefined) c.ring_gap_min_nm = input.ringGapMin;
  if (input.ringGapMax !== undefined) c.ring_gap_max_nm = input.ringGapMax;
  if (input.forgedClearanceMin !== undefined) c.forged_clearance_min_nm = input.forgedClearanceMin;
  if (input.forgedClearanceMax !== undefined) c.forged_clearance_max_nm = input.forgedClearanceMax;
  if (input.ringGapPerBore !== undefined) c.ring_gap_per_bore = input.ringGapPerBore;
  if (input.honeCrosshatch !== undefined) c.hone_crosshatch_deg = String(input.honeCrosshatch);
  if (input.honeGrits !== undefined) c.hone_grits = input.honeGrits;
  if (input.notes !== undefined) c.notes = input.notes;
  if (input.active !== undefined) c.active = input.active;
  return c;
}

/** Rules across fields, checked on the family as it will be after the change. */
async function checkFamily(k: Conn, f: FamilyColumns): Promise<void> {
  if (f.clearance_max_nm < f.clearance_min_nm) {
    throw new BadRequest('clearanceMax: must not be smaller than clearanceMin.', [
      { field: 'clearanceMax', message: 'must not be smaller than clearanceMin' },
    ]);
  }
  if (
    f.ring_gap_min_nm !== null &&
    f.ring_gap_max_nm !== null &&
    f.ring_gap_max_nm < f.ring_gap_min_nm
  ) {
    throw new BadRequest('ringGapMax: must not be smaller than ringGapMin.', [
      { field: 'ringGapMax', message: 'must not be smaller than ringGapMin' },
    ]);
  }
  const forgedMin = f.forged_clearance_min_nm ?? null;
  const forgedMax = f.forged_clearance_max_nm ?? null;
  if ((forgedMin === null) !== (forgedMax === null)) {
    const field = forgedMin === null ? 'forgedClearanceMin' : 'forgedClearanceMax';
    throw new BadRequest(`${field}: give both ends of the forged range, or neither.`, [
      { field, message: 'give both ends of the forged range, or neither' },
    ]);
  }
  if (forgedMin !== null && forgedMax !== null && forgedMax < forgedMin) {
    throw new BadRequest('forgedClearanceMax: must not be smaller than forgedClearanceMin.', [
      { field: 'forgedClearanceMax', message: 'must not be smaller than forgedClearanceMin' },
    ]);
  }
  if (!(await repo.findSeries(f.step_series_id, k))) {
    throw new BadRequest('stepSeriesId: no step series has this id.', [
      { field: 'stepSeriesId', message: 'no step series has this id' },
    ]);
  }
}

export async function createFamily(actorId: string | null, input: FamilyInput, k: Conn = db) {
  const columns: FamilyColumns = {
    max_taper_nm: null,
    max_out_of_round_nm: null,
    ring_gap_min_nm: null,
    ring_gap_max_nm: null,
    notes: '',
    active: true,
    ...familyColumns(input),
  } as FamilyColumns;
  await checkFamily(k, columns);
  try {
    const id = await k.transaction(async (trx) => {
      const newId = await repo.insertFamily(trx, columns);
      await recordAudit(trx, {
        userId: actorId,
        action: 'engine_family.create',
        entity: 'engine_family',
        entityId: newId,
        after: columns,
      });
      return newId;
    });
    return getFamily(id, k);
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(`An engine family with the code "${input.code}" already exists.`);
    }
    throw e;
  }
}

export async function updateFamily(
  actorId: string | null,
  id: string,
  patch: FamilyPatch,
  k: Conn = db,
) {
  try {
    await k.transaction(async (trx) => {
      if (!(await repo.lockFamily(trx, id))) throw new NotFound('That engine family');
      const before = await repo.findFamily(id, trx);
      if (!before) throw new NotFound('That engine family');
      const changes = familyColumns(patch);
      const merged = { ...before, ...changes } as FamilyColumns;
      await checkFamily(trx, merged);
      if (
        changes.step_series_id !== undefined &&
        changes.step_series_id !== before.step_series_id &&
        (await repo.countSizedParts(trx, id)) > 0
      ) {
        throw new Conflict(
          'This family has parts sized to the steps of its current series; give those parts a new step before changing the series.',
        );
      }
      await repo.updateFamily(trx, id, changes);
      const beforeView: Partial<FamilyColumns> = {};
      for (const key of Object.keys(changes) as (keyof FamilyColumns)[]) {
        (beforeView as Record<string, unknown>)[key] = before[key];
      }
      await recordAudit(trx, {
        userId: actorId,
        action: 'engine_family.update',
        entity: 'engine_family',
        entityId: id,
        before: beforeView,
        after: changes,
      });
    });
  } catch (e) {
    if (isUniqueViolation(e)) {
      throw new Conflict(`An engine family with the code "${patch.code ?? ''}" already exists.`);
    }
    throw e;
  }
  return getFamily(id, k);
}

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
