import type {
  CylinderJson,
  JobFamilyJson,
  JobJson,
  JobListItemJson,
  JobState,
} from '../../../shared/api/jobs';
import type { LengthJson } from '../../../shared/lengths';

/** A length as the API sends it, both units (converted by hand with 1 in = 25.4 mm exactly). */
export const L = (mm: string, inch: string): LengthJson => ({ mm, in: inch });

/**
 * An invented air-cooled single: standard bore 2.5170 in, clean-up 0.0030 in, up to +0.040 in,
 * taper limit 0.0040 in, out-of-round 0.0020 in.
 */
export const INVENTED_SINGLE: JobFamilyJson = {
  id: 'f1',
  code: 'TS-64',
  name: 'Invented single',
  cylinders: 1,
  standardBore: L('63.9318', '2.5170'),
  clearance: { min: L('0.0381', '0.0015'), max: L('0.0635', '0.0025') },
  honeAllowance: L('0.0508', '0.0020'),
  cleanup: L('0.0762', '0.0030'),
  maxOversize: L('1.016', '0.0400'),
  maxTaper: L('0.1016', '0.0040'),
  maxOutOfRound: L('0.0508', '0.0020'),
  ringGap: { min: null, max: null },
};

/** A job on the board as the list answers it: booked in, one cylinder, nothing held or waiting. */
export function jobListItem(
  number: string,
  state: JobState,
  extra: Partial<JobListItemJson> = {},
): JobListItemJson {
  return {
    id: number,
    number,
    state,
    customerId: `c-${number}`,
    customerName: `Customer of ${number}`,
    family: { id: 'f1', code: 'TS-64', name: 'Invented single' },
    cylinders: 1,
    askedFor: '',
    dueDate: null,
    overdue: false,
    waitingForParts: false,
    waitingFor: [],
    pistonsHeld: 0,
    cylindersCut: 0,
    awaitingApproval: false,
    createdAt: '2026-12-01T09:00:00.000Z',
    ...extra,
  };
}

/** Cylinder n of a job as the job answers it before anything is read, chosen or held. */
export function cylinderJson(extra: Partial<CylinderJson> = {}): CylinderJson {
  return {
    n: 1,
    cylinder: null,
    readings: [],
    wear: null,
    warnings: [],
    measuredAt: null,
    step: null,
    clearance: null,
    piston: null,
    rings: [],
    cutAt: null,
    measuredAfterHone: null,
    ringGap: null,
    ringGapOk: null,
    honedFit: null,
    ringGapSuggested: null,
    ringGapCheck: null,
    ...extra,
  };
}

/** A whole job as its page loads it: booked in for the invented single, one untouched cylinder. */
export function jobJson(extra: Partial<JobJson> & Pick<JobJson, 'id' | 'number'>): JobJson {
  const createdAt = extra.createdAt ?? '2026-12-01T09:00:00.000Z';
  return {
    ...jobListItem(extra.number, 'booked_in', { customerId: 'c1', createdAt }),
    customerName: 'Odile Farrant',
    customerPhone: null,
    customerEmail: null,
    family: INVENTED_SINGLE,
    notes: '',
    notifyCustomer: true,
    createdBy: null,
    updatedAt: createdAt,
    stateChangedAt: createdAt,
    closedAt: null,
    cylinderDetails: [cylinderJson()],
    holds: [],
    photos: [],
    events: [],
    ...extra,
  };
}
