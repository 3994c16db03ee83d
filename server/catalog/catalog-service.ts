// Catalog rules: what makes an engine family, a step series and a part valid, the step ladder and
// the exposure list. One transaction per change; every change to prices or reorder rules is audited.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { recordAudit } from '../audit/audit';
import { BadRequest, Conflict, NotFound } from '../errors';
import {
  type FamilyInput,
  type FamilyPatch,
  type StepSeriesInput,
  type StepSeriesJson,
} from '../../shared/api/catalog';
import { toLengthJson } from '../../shared/lengths';
import { customSeries, StepSeriesError } from '../../shared/step-series';
import * as repo from './catalog-repository';
import { familyJson } from './catalog-json';
import { isUniqueViolation } from '../db/pg-errors';
import type { Page } from '../../shared/api/common';
export * from './parts-service';

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

export async function listFamilies(query: repo.FamilyListQuery, k: Conn = db) {
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
