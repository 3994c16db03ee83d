// A customer's cylinders: adding one under the shop's mark, linking it to a job's cylinder, and
// its bores, read from the cut job cylinders linked to it. The steps it has left come from the
// shared history rule the step choice applies, so the page and the bench agree.
import type { Knex } from 'knex';
import { DateTime } from 'luxon';
import { db } from '../db/knex';
import { BadRequest, Conflict, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import { findFamily, stepsOfSeries, type FamilyRow } from '../jobs/jobs-repository';
import { stepsLeftAfter, type Ladder, type LastBore } from '../../shared/bore-history';
import { lengthJsonToNm, toLengthJson, type Nm } from '../../shared/lengths';
import type {
  BoreJson,
  CustomerCylinderJson,
  CylinderByMarkJson,
  CylinderDetailJson,
  CylinderInput,
  NearLastStepAnswer,
  NearLastStepItemJson,
} from '../../shared/api/customers';
import * as repo from './customers-repository';

type Conn = Knex;

async function shopZone(k: Conn): Promise<string> {
  return (await getSettings(k)).timeZone;
}

export function shopDate(at: Date, zone: string): string {
  const local = DateTime.fromJSDate(at).setZone(zone);
  return (local.isValid ? local : DateTime.fromJSDate(at).toUTC()).toISODate() as string;
}

function boreJson(b: repo.BoreRow, zone: string): BoreJson {
  return {
    jobId: b.job_id,
    jobNumber: b.job_number,
    n: b.n,
    stepId: b.step_id,
    stepLabel: b.step_label,
    finishedBore: toLengthJson(b.finished_bore_nm),
    measured: b.measured,
    date: shopDate(b.cut_at, zone),
    piston: b.piston_label,
  };
}

/** The family's ladder as the history rule reads it. */
export async function ladderOf(family: FamilyRow, k: Conn = db): Promise<Ladder> {
  const steps = await stepsOfSeries(family.step_series_id, k);
  return {
    standardBoreNm: family.standard_bore_nm,
    cleanupNm: family.cleanup_nm,
    maxOversizeNm: family.max_oversize_nm,
    steps: steps.map((s) => ({ offsetNm: s.offset_nm })),
  };
}

/** The largest finished bore so far: a later bore is never smaller, but a mistyped one might be. */
function lastOf(bores: repo.BoreRow[]): repo.BoreRow | null {
  return bores.reduce<repo.BoreRow | null>(
    (best, b) => (best === null || b.finished_bore_nm >= best.finished_bore_nm ? b : best),
    null,
  );
}

export function lastBoreWords(b: repo.BoreRow, zone: string): LastBore {
  return {
    finishedBoreNm: b.finished_bore_nm as Nm,
    where: `job ${b.job_number} on ${shopDate(b.cut_at, zone)}${b.step_label ? ` at ${b.step_label}` : ''}`,
  };
}

/** The cylinder's last bore before the given job, for the step choice and the bore sheet. */
export async function lastBoreBefore(
  cylinderId: string,
  jobId: string,
  k: Conn = db,
): Promise<{ row: repo.BoreRow; last: LastBore; json: BoreJson } | null> {
  const [bores, zone] = await Promise.all([
    repo.boresOf([cylinderId], k, { exceptJobId: jobId }),
    shopZone(k),
  ]);
  const row = lastOf(bores);
  return row ? { row, last: lastBoreWords(row, zone), json: boreJson(row, zone) } : null;
}

async function cylindersJson(rows: repo.CylinderRow[], k: Conn): Promise<CustomerCylinderJson[]> {
  const [bores, zone] = await Promise.all([
    repo.boresOf(
      rows.map((r) => r.id),
      k,
    ),
    shopZone(k),
  ]);
  const ladders = new Map<string, Ladder>();
  for (const familyId of new Set(rows.map((r) => r.family_id))) {
    const family = await findFamily(familyId, k);
    if (family) ladders.set(familyId, await ladderOf(family, k));
  }
  return rows.map((r) => {
    const own = bores.filter((b) => b.cylinder_id === r.id);
    const last = lastOf(own);
    const ladder = ladders.get(r.family_id);
    return {
      id: r.id,
      mark: r.mark,
      castNumber: r.cast_number,
      familyId: r.family_id,
      familyCode: r.family_code,
      customerId: r.customer_id,
      bores: own.map((b) => boreJson(b, zone)),
      stepsLeft: ladder ? stepsLeftAfter(ladder, last?.finished_bore_nm ?? null) : 0,
    };
  });
}

export async function listCylinders(
  customerId: string,
  k: Conn = db,
): Promise<{ items: CustomerCylinderJson[] }> {
  if (!(await repo.findCustomer(customerId, k))) throw new NotFound('That customer');
  return { items: await cylindersJson(await repo.cylindersOfCustomer(customerId, k), k) };
}

export async function addCylinder(
  actorId: string,
  customerId: string,
  input: CylinderInput,
  k: Conn = db,
): Promise<CustomerCylinderJson> {
  const id = await k.transaction(async (trx) => {
    const customer = await repo.lockCustomer(trx, customerId);
    if (!customer) throw new NotFound('That customer');
    if (customer.erased_at) {
      throw new Conflict("This customer's data was erased; start a new customer.", 'erased');
    }
    const family = await findFamily(input.familyId, trx);
    if (!family) {
      throw new BadRequest('familyId: no engine family has this id.', [
        { field: 'familyId', message: 'no engine family has this id' },
      ]);
    }
    const taken = await repo.findCylinderByMark(input.mark, trx);
    if (taken) {
      const message = `the shop's mark ${input.mark} is already on another cylinder${taken.customer_id === customerId ? ' of this customer' : ''}`;
      throw new Conflict(`mark: ${message}.`, 'mark_taken');
    }
    return repo.insertCylinder(trx, {
      customer_id: customerId,
      family_id: family.id,
      mark: input.mark,
      cast_number: input.castNumber ?? null,
      created_by: actorId,
    });
  });
  const row = await repo.findCylinder(id, k);
  if (!row) throw new NotFound('That cylinder');
  return (await cylindersJson([row], k))[0];
}

export async function cylinderDetail(id: string, k: Conn = db): Promise<CylinderDetailJson> {
  const row = await repo.findCylinder(id, k);
  if (!row) throw new NotFound('That cylinder');
  const family = await findFamily(row.family_id, k);
  if (!family) throw new NotFound("That cylinder's engine family");
  const [[json], steps, open] = await Promise.all([
    cylindersJson([row], k),
    stepsOfSeries(family.step_series_id, k),
    repo.openLinksOf(id, k),
  ]);
  return {
    ...json,
    customerName: row.customer_name,
    family: {
      id: family.id,
      code: family.code,
      name: family.name,
      standardBore: toLengthJson(family.standard_bore_nm),
      cleanup: toLengthJson(family.cleanup_nm),
      maxOversize: toLengthJson(family.max_oversize_nm),
    },
    steps: steps.map((s) => ({
      id: s.id,
      label: s.label,
      offset: toLengthJson(s.offset_nm),
      finishedBore: toLengthJson(family.standard_bore_nm + s.offset_nm),
      pastWall: s.offset_nm > family.max_oversize_nm,
    })),
    openJobs: open.map((o) => ({
      jobId: o.job_id,
      jobNumber: o.job_number,
      n: o.n,
      state: o.state,
    })),
  };
}

/**
 * Checks that a cylinder may be linked to cylinder n of a job: it is this customer's, of the
 * job's engine family, and not already another cylinder of the same job. Answers its mark.
 */
export async function checkLink(
  trx: Conn,
  /** id null: a job being booked in (its own list of cylinders is checked by the caller). */
  job: { id: string | null; number: string; customer_id: string; family_id: string },
  n: number,
  cylinderId: string,
  field = 'cylinderId',
): Promise<string> {
  const cylinder = await repo.findCylinder(cylinderId, trx);
  if (!cylinder) {
    throw new BadRequest(`${field}: no cylinder has this id.`, [
      { field, message: 'no cylinder has this id' },
    ]);
  }
  if (cylinder.customer_id !== job.customer_id) {
    const message = `cylinder ${cylinder.mark} belongs to another customer`;
    throw new BadRequest(`${field}: ${message}.`, [{ field, message }]);
  }
  if (cylinder.family_id !== job.family_id) {
    const message = `cylinder ${cylinder.mark} is a ${cylinder.family_code}, not of this job's engine family`;
    throw new BadRequest(`${field}: ${message}.`, [{ field, message }]);
  }
  const links = job.id === null ? [] : await repo.cylinderIdsOfJob(job.id, trx);
  const other = links.find((l) => l.cylinder_id === cylinderId && l.n !== n);
  if (other) {
    const message = `cylinder ${cylinder.mark} is already cylinder ${other.n} of job ${job.number}`;
    throw new Conflict(`${field}: ${message}.`, 'already_linked');
  }
  return cylinder.mark;
}

/**
 * The owner's insight: bored cylinders with at most `within` steps left, fewest first (then the
 * most recent last bore). No step left means the next rebore is a sleeve or a new cylinder; one
 * left means the customer is worth telling before the next job.
 */
export async function nearLastStep(within: number, k: Conn = db): Promise<NearLastStepAnswer> {
  const rows = await repo.boredCylinders(k);
  const contact = new Map(rows.map((r) => [r.id, r]));
  const items: NearLastStepItemJson[] = [];
  for (const c of await cylindersJson(rows, k)) {
    if (c.stepsLeft > within || c.bores.length === 0) continue;
    // The same last bore the rule counts from: the largest finished bore so far.
    const last = c.bores.reduce((best, b) =>
      lengthJsonToNm(b.finishedBore, 'mm') >= lengthJsonToNm(best.finishedBore, 'mm') ? b : best,
    );
    const row = contact.get(c.id);
    items.push({
      cylinderId: c.id,
      mark: c.mark,
      customerId: c.customerId,
      customerName: row?.customer_name ?? '',
      phone: row?.customer_phone ?? null,
      email: row?.customer_email ?? null,
      familyCode: c.familyCode,
      bores: c.bores.length,
      lastBore: {
        date: last.date,
        stepLabel: last.stepLabel,
        finishedBore: last.finishedBore,
        jobNumber: last.jobNumber,
      },
      stepsLeft: c.stepsLeft,
    });
  }
  items.sort(
    (a, b) =>
      a.stepsLeft - b.stepsLeft ||
      b.lastBore.date.localeCompare(a.lastBore.date) ||
      a.mark.localeCompare(b.mark),
  );
  return {
    within,
    items,
    sleevesToExpect: items.filter((i) => i.stepsLeft === 0).length,
    lastStepNext: items.filter((i) => i.stepsLeft === 1).length,
  };
}

/** The cylinder a scanned tag names, found by its exact mark (case aside); none is an empty list. */
export async function cylindersByMark(mark: string, k: Conn = db): Promise<CylinderByMarkJson> {
  const found = await repo.findCylinderByMark(mark, k);
  return {
    items: found ? [{ id: found.id, mark: found.mark, customerId: found.customer_id }] : [],
  };
}
