// The piston proposed for a cylinder at its step: the free measured pistons nearest the step's size,
// and for each whether the bore cut for it (its own skirt + the clearance) cleans up the worst wear.
// One that cleans up is proposed before one that does not, however near the step's size.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import { BadRequest, Conflict, NotFound } from '../errors';
import { getSettings } from '../settings/settings-service';
import { chooseClearance, pistonCleanup } from '../../shared/bore-sheet';
import { clearanceRangeFor } from '../../shared/finish-checks';
import { toLengthJson } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type { ProposalJson, ProposedUnitJson } from '../../shared/api/jobs';
import * as repo from './holds-repository';
import * as jobsRepo from './jobs-repository';
import { familyClearances, holdJson } from './jobs-json';
import { proposedJson } from './hold-common';

export async function proposal(
  jobId: string,
  n: number,
  stepId: string | undefined,
  k: Knex = db,
): Promise<ProposalJson> {
  const job = await jobsRepo.findJob(jobId, k);
  if (!job) throw new NotFound('That job');
  if (n > job.cylinders) {
    throw new NotFound(`Cylinder ${n} of job ${job.number} (it has ${job.cylinders})`);
  }
  const family = await jobsRepo.findFamily(job.family_id, k);
  if (!family) throw new NotFound("That job's engine family");
  const cylinder = (await jobsRepo.cylindersOf(jobId, k)).find((c) => c.n === n);
  const wanted = stepId ?? cylinder?.chosen_step_id ?? null;
  if (!wanted) {
    throw new Conflict(
      `Choose the step for cylinder ${n} first; the proposal is the piston nearest its size.`,
      'no_step',
    );
  }
  const step = await jobsRepo.findStep(wanted, k);
  if (!step || step.series_id !== family.step_series_id) {
    throw new BadRequest(`stepId: not a step of the series ${family.code} uses.`, [
      { field: 'stepId', message: `not a step of ${family.code}'s series` },
    ]);
  }
  const nominal = stepNominalBore(family.standard_bore_nm, step.offset_nm);
  const [units, rings, holds, settings] = await Promise.all([
    repo.nearestFreeUnits(family.id, step.id, nominal, { limit: 6 }, k),
    repo.freeRingParts(family.id, step.id, k),
    repo.holdsOfJob(jobId, { activeOnly: true }, k),
    getSettings(k),
  ]);
  // The clearance for a piston of this material: a forged one may have a range of its own.
  const clearanceFor = (material: string | null) => {
    if (cylinder?.clearance_nm != null) return cylinder.clearance_nm;
    const range = clearanceRangeFor(familyClearances(family), material);
    return chooseClearance(range.minNm, range.maxNm, settings.clearancePolicy);
  };
  const largest = cylinder?.largest_nm ?? null;
  const judged: (ProposedUnitJson & { material: string | null })[] = units.map((u) => ({
    ...proposedJson(u),
    material: u.material,
    ...(largest === null
      ? {}
      : {
          cleansUp: pistonCleanup(u.skirt_nm + clearanceFor(u.material), largest, family.cleanup_nm)
            .cleansUp,
        }),
  }));
  // Stable: nearest first within those that clean up, then the rest.
  const ordered = [
    ...judged.filter((u) => u.cleansUp !== false),
    ...judged.filter((u) => u.cleansUp === false),
  ];
  const piston = holds.find((h) => h.cylinder === n && h.unit_id !== null);
  const basisNm = clearanceFor(piston?.material ?? ordered[0]?.material ?? null);
  const unitJson = ({ material: _material, ...u }: (typeof ordered)[number]): ProposedUnitJson => u;
  return {
    step: { id: step.id, label: step.label, nominalBore: toLengthJson(nominal) },
    unit: ordered[0] ? unitJson(ordered[0]) : null,
    others: ordered.slice(1).map(unitJson),
    rings: rings.map((r) => ({
      partId: r.id,
      sku: r.sku,
      description: r.description,
      free: r.free,
    })),
    piston: piston ? holdJson(piston) : null,
    cleanupBasis:
      largest === null
        ? null
        : {
            clearance: toLengthJson(basisNm),
            largestWorn: toLengthJson(largest),
            allowance: toLengthJson(family.cleanup_nm),
          },
    heldCleansUp:
      piston && piston.skirt_nm !== null && largest !== null
        ? pistonCleanup(piston.skirt_nm + clearanceFor(piston.material), largest, family.cleanup_nm)
            .cleansUp
        : null,
  };
}
