// Database rows → API answers for jobs. Lengths go out as { mm, in }.
import { assessBore } from '../../shared/bore-assessment';
import type { Reading } from '../../shared/bore-wear';
import {
  checkRingGap,
  clearanceRangeFor,
  honedFit,
  suggestedRingGapNm,
  type ClearanceRange,
  type FamilyClearances,
  type HonedFit,
} from '../../shared/finish-checks';
import { toLengthJson, type LengthJson, type LengthUnit } from '../../shared/lengths';
import { stepNominalBore } from '../../shared/step-series';
import type {
  CylinderJson,
  HoldJson,
  HonedFitJson,
  JobEventJson,
  JobFamilyJson,
  JobListItemJson,
  PhotoJson,
  ReadingJson,
} from '../../shared/api/jobs';
import type {
  CylinderRow,
  EventRow,
  FamilyRow,
  JobListRow,
  PhotoMetaRow,
  ReadingRow,
} from './jobs-repository';
import type { HoldRow } from './holds-repository';

export function lengthOrNull(nm: number | null): LengthJson | null {
  return nm === null ? null : toLengthJson(nm);
}

export function familyLimits(f: FamilyRow) {
  return {
    standardBoreNm: f.standard_bore_nm,
    cleanupNm: f.cleanup_nm,
    maxOversizeNm: f.max_oversize_nm,
    maxTaperNm: f.max_taper_nm,
    maxOutOfRoundNm: f.max_out_of_round_nm,
  };
}

/** The family's clearance ranges, as the shared finish checks read them. */
export function familyClearances(f: FamilyRow): FamilyClearances {
  return {
    clearanceMinNm: f.clearance_min_nm,
    clearanceMaxNm: f.clearance_max_nm,
    forgedMinNm: f.forged_clearance_min_nm,
    forgedMaxNm: f.forged_clearance_max_nm,
  };
}

export function honedFitJson(fit: HonedFit, range: ClearanceRange): HonedFitJson {
  return {
    clearance: toLengthJson(fit.clearanceNm),
    range: { min: toLengthJson(range.minNm), max: toLengthJson(range.maxNm), basis: range.basis },
    verdict: fit.verdict,
    text: fit.text,
  };
}

export function jobFamilyJson(f: FamilyRow): JobFamilyJson {
  return {
    id: f.id,
    code: f.code,
    name: f.name,
    cylinders: f.cylinders,
    standardBore: toLengthJson(f.standard_bore_nm),
    clearance: { min: toLengthJson(f.clearance_min_nm), max: toLengthJson(f.clearance_max_nm) },
    honeAllowance: toLengthJson(f.hone_allowance_nm),
    cleanup: toLengthJson(f.cleanup_nm),
    maxOversize: toLengthJson(f.max_oversize_nm),
    maxTaper: lengthOrNull(f.max_taper_nm),
    maxOutOfRound: lengthOrNull(f.max_out_of_round_nm),
    ringGap: { min: lengthOrNull(f.ring_gap_min_nm), max: lengthOrNull(f.ring_gap_max_nm) },
  };
}

export function holdJson(row: HoldRow): HoldJson {
  return {
    id: row.id,
    jobId: row.job_id,
    jobNumber: row.job_number,
    cylinder: row.cylinder,
    partId: row.part_id,
    sku: row.sku,
    kind: row.kind,
    description: row.description,
    stepLabel: row.step_label,
    unitId: row.unit_id,
    unitLabel: row.unit_label,
    skirt: lengthOrNull(row.skirt_nm),
    bin: row.bin_code,
    quantity: row.quantity,
    expiresAt: row.expires_at ? row.expires_at.toISOString() : null,
    createdAt: row.created_at.toISOString(),
    releasedAt: row.released_at ? row.released_at.toISOString() : null,
    releaseReason: row.release_reason,
  };
}

export function readingJson(r: ReadingRow): ReadingJson {
  return { depth: r.depth, axis: r.axis, diameter: toLengthJson(r.diameter_nm), unit: r.unit };
}

export function toReadings(rows: ReadingRow[]): Reading[] {
  return rows.map((r) => ({ depth: r.depth, axis: r.axis, nm: r.diameter_nm }));
}

export function cylinderJson(
  c: CylinderRow,
  family: FamilyRow,
  readings: ReadingRow[],
  holds: HoldRow[],
  unit: LengthUnit,
): CylinderJson {
  const mine = readings.filter((r) => r.n === c.n);
  const assessment =
    mine.length > 0 ? assessBore(toReadings(mine), familyLimits(family), unit) : null;
  // Held now, or issued with the job when it was handed back.
  const active = holds.filter(
    (h) => h.cylinder === c.n && (h.released_at === null || h.release_reason === 'issued'),
  );
  const piston = active.find((h) => h.unit_id !== null);
  const gapMin = family.ring_gap_min_nm;
  const gapMax = family.ring_gap_max_nm;
  const honed = c.measured_after_hone_nm;
  const range = clearanceRangeFor(familyClearances(family), piston?.material ?? null);
  const fit =
    honed !== null && piston?.skirt_nm != null
      ? honedFitJson(honedFit(honed, piston.skirt_nm, range, unit), range)
      : null;
  const gapSuggested = honed === null ? null : suggestedRingGapNm(honed, family.ring_gap_per_bore);
  const gapCheck =
    gapSuggested !== null && c.ring_gap_nm !== null
      ? checkRingGap(c.ring_gap_nm, gapSuggested, gapMax, unit)
      : null;
  return {
    n: c.n,
    cylinder:
      c.cylinder_id !== null && c.cylinder_mark !== null
        ? { id: c.cylinder_id, mark: c.cylinder_mark }
        : null,
    readings: mine.map(readingJson),
    wear: assessment
      ? {
          largest: toLengthJson(assessment.wear.largest),
          taper: toLengthJson(assessment.wear.taper),
          outOfRound: toLengthJson(assessment.wear.outOfRound),
          overStandard: lengthOrNull(assessment.wear.overStandard),
        }
      : null,
    warnings: assessment?.warnings ?? [],
    measuredAt: c.measured_at ? c.measured_at.toISOString() : null,
    step:
      c.chosen_step_id && c.step_label !== null && c.step_offset_nm !== null
        ? {
            id: c.chosen_step_id,
            label: c.step_label,
            nominalBore: toLengthJson(stepNominalBore(family.standard_bore_nm, c.step_offset_nm)),
          }
        : null,
    clearance: lengthOrNull(c.clearance_nm),
    piston: piston ? holdJson(piston) : null,
    rings: active.filter((h) => h.unit_id === null).map(holdJson),
    cutAt: c.cut_at ? c.cut_at.toISOString() : null,
    measuredAfterHone: lengthOrNull(c.measured_after_hone_nm),
    ringGap: lengthOrNull(c.ring_gap_nm),
    ringGapOk:
      c.ring_gap_nm === null || (gapMin === null && gapMax === null)
        ? null
        : (gapMin === null || c.ring_gap_nm >= gapMin) &&
          (gapMax === null || c.ring_gap_nm <= gapMax),
    honedFit: fit,
    ringGapSuggested: lengthOrNull(gapSuggested),
    ringGapCheck: gapCheck ? { verdict: gapCheck.verdict, text: gapCheck.text } : null,
  };
}

export function jobListItemJson(row: JobListRow): JobListItemJson {
  return {
    id: row.id,
    number: row.number,
    state: row.state,
    customerId: row.customer_id,
    customerName: row.customer_name,
    family: { id: row.family_id, code: row.family_code, name: row.family_name },
    cylinders: row.cylinders,
    askedFor: row.asked_for,
    dueDate: row.due_date,
    overdue: row.overdue,
    waitingForParts: row.waiting_for_parts,
    waitingFor: row.waiting_for,
    pistonsHeld: row.pistons_held,
    cylindersCut: row.cylinders_cut,
    awaitingApproval: row.awaiting_approval,
    createdAt: row.created_at.toISOString(),
  };
}

export function photoJson(row: PhotoMetaRow): PhotoJson {
  const url = `/api/jobs/${row.job_id}/photos/${row.id}`;
  return {
    id: row.id,
    contentType: row.content_type,
    size: row.size_bytes,
    url,
    thumbnailUrl: row.has_thumbnail ? `${url}/thumbnail` : null,
    originalName: row.original_name,
    createdAt: row.created_at.toISOString(),
  };
}

export function eventJson(row: EventRow): JobEventJson {
  return {
    id: Number(row.id),
    at: row.at.toISOString(),
    kind: row.kind,
    text: row.text,
    userName: row.user_name,
  };
}
