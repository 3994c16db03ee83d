// What the jobs API accepts and answers: intake, bore readings, the step choice, holds, the bore
// sheet and closing a job. The zod schemas are used by the server routes and the Angular forms, so
// both refuse the same input with the same words.
import { z } from 'zod';
import { atMost, isOneEmailAddress, MAX_EMAIL_LENGTH, singleLine } from './text-rules';
import { optionalLengthField, type Page } from './catalog-api';
import { parseLength, type LengthJson, type LengthUnit } from './lengths';
import type { Axis, Depth } from './bore-wear';
import type { NeededPart } from './part-needs';
import type { BarResolution, PassKind } from './pass-plan';
import type { StepAlternative } from './bore-choice';

export type { Page };

/** A job's states in workshop order; the last two close the job. */
export const JOB_STATES = [
  'booked_in',
  'gauged',
  'parts_set_aside',
  'on_the_bar',
  'at_the_hone',
  'ready_to_go',
  'handed_back',
  'called_off',
] as const;
export type JobState = (typeof JOB_STATES)[number];

/** States a person may move a job between; handing back and calling off have their own commands. */
export const OPEN_STATES = [
  'booked_in',
  'gauged',
  'parts_set_aside',
  'on_the_bar',
  'at_the_hone',
  'ready_to_go',
] as const satisfies readonly JobState[];
export type OpenState = (typeof OPEN_STATES)[number];

export const JOB_STATE_LABELS: Record<JobState, string> = {
  booked_in: 'Booked in',
  gauged: 'Gauged',
  parts_set_aside: 'Parts set aside',
  on_the_bar: 'On the bar',
  at_the_hone: 'At the hone',
  ready_to_go: 'Ready to go',
  handed_back: 'Handed back',
  called_off: 'Called off',
};

export const JOB_STATE_HINTS: Record<JobState, string> = {
  booked_in: 'Taken in; bores not measured yet.',
  gauged: 'Bores measured; choose the step and set the piston aside.',
  parts_set_aside: 'Each measured piston is held for its cylinder.',
  on_the_bar: 'Boring.',
  at_the_hone: 'Honing, chamfering ports, measuring, cleaning.',
  ready_to_go: 'Finished; waiting for the customer.',
  handed_back: 'Collected; the held parts were issued.',
  called_off: 'Cancelled; every hold was released.',
};

export function isOpenState(state: string): state is OpenState {
  return (OPEN_STATES as readonly string[]).includes(state);
}

export const READING_DEPTHS = ['top', 'middle', 'bottom'] as const satisfies readonly Depth[];
export const READING_AXES = ['pin', 'thrust'] as const satisfies readonly Axis[];
export const DEPTH_LABELS: Record<Depth, string> = {
  top: 'Top of ring travel',
  middle: 'Middle',
  bottom: 'Bottom of travel',
};
export const AXIS_LABELS: Record<Axis, string> = {
  pin: 'Along the pin',
  thrust: 'Across (thrust)',
};

/** Most photos one job keeps; intake needs a handful, not an album. */
export const MAX_PHOTOS_PER_JOB = 24;
/** Largest photo accepted, in bytes (10 MB). */
export const MAX_PHOTO_BYTES = 10 * 1024 * 1024;
/** Largest thumbnail the browser may send with a photo. */
export const MAX_THUMBNAIL_BYTES = 512 * 1024;
export const PHOTO_TYPES = ['image/jpeg', 'image/png', 'image/webp'] as const;

const uuid = z.string().uuid('must be a valid id');
/** Optional text: left out stays undefined (no change), "" or null become null (cleared). */
const optionalText = (max: number) =>
  z
    .union([z.null(), z.string().trim().max(max, atMost(max))])
    .optional()
    .transform((v) => (v === '' ? null : v));

/** A calendar date written as YYYY-MM-DD, and a real one (no 31 April). */
export const isoDate = z
  .string({ error: 'must be a date written as YYYY-MM-DD' })
  .max(10, atMost(10, 'must be a date written as YYYY-MM-DD'))
  .regex(/^\d{4}-\d{2}-\d{2}$/, 'must be a date written as YYYY-MM-DD')
  .refine((text) => {
    const [y, m, d] = text.split('-').map(Number);
    const date = new Date(Date.UTC(y, m - 1, d));
    return (
      y >= 2000 &&
      y <= 2200 &&
      date.getUTCFullYear() === y &&
      date.getUTCMonth() === m - 1 &&
      date.getUTCDate() === d
    );
  }, 'is not a date on the calendar');

const customerFields = {
  customerName: singleLine(120, "enter the customer's name").pipe(
    z.string().min(1, "enter the customer's name"),
  ),
  customerPhone: optionalText(40).refine(
    (v) => v === null || v === undefined || /^[0-9+()\-./ ]{3,40}$/.test(v),
    'digits, spaces and + ( ) - . / only',
  ),
  customerEmail: optionalText(MAX_EMAIL_LENGTH).refine(
    (v) => v === null || v === undefined || isOneEmailAddress(v),
    'is not one e-mail address (like name@example.test)',
  ),
  askedFor: z.string().trim().max(300, 'at most 300 characters').optional(),
  dueDate: isoDate.nullable().optional(),
  notes: z.string().trim().max(2000, 'at most 2000 characters').optional(),
  notifyCustomer: z.boolean().optional(),
};

export const jobInput = z
  .object({
    ...customerFields,
    /** The customer's record; the typed name, phone and e-mail still work and find or make one. */
    customerId: uuid.optional(),
    customerName: customerFields.customerName.optional(),
    familyId: uuid,
    cylinders: z
      .number({ error: 'must be a whole number' })
      .int('must be a whole number')
      .min(1, 'at least 1')
      .max(24, 'at most 24'),
    /** The customer's known cylinder for each job cylinder, in order (null: not marked). */
    cylinderIds: z.array(uuid.nullable()).max(24, 'at most 24').optional(),
  })
  .strict()
  .refine((j) => (j.customerId === undefined) !== (j.customerName === undefined), {
    message: "give either customerId (a customer's record) or customerName",
    path: ['customerName'],
  })
  .refine((j) => j.customerId === undefined || (!j.customerPhone && !j.customerEmail), {
    message: "with customerId, change the customer's phone and e-mail on their record",
    path: ['customerPhone'],
  })
  .refine((j) => j.cylinderIds === undefined || j.cylinderIds.length <= j.cylinders, {
    message: 'more cylinders marked than the job brings',
    path: ['cylinderIds'],
  });
export type JobInput = z.output<typeof jobInput>;

export const jobPatch = z
  .object({
    ...customerFields,
    state: z.enum(OPEN_STATES, {
      error: `must be one of ${OPEN_STATES.join(', ')} (collect and cancel have their own commands)`,
    }),
  })
  .partial()
  .strict()
  .refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change');
export type JobPatch = z.output<typeof jobPatch>;

export const JOB_SORTS = ['due', 'number', 'customer', 'created', 'state'] as const;

/** A bore diameter as typed ("2.5260 in"), read into nm and the unit it was typed in. */
export const diameterField = z
  .string({ error: 'must be text with its unit, for example "64.91 mm" or "2.5555 in"' })
  .transform((text, ctx): { nm: number; unit: LengthUnit } => {
    const parsed = parseLength(text, { max: 500_000_000 });
    if (!parsed.ok) {
      ctx.addIssue({ code: 'custom', message: parsed.message });
      return z.NEVER;
    }
    return { nm: parsed.nm, unit: parsed.unit };
  });

export const readingsInput = z
  .object({
    readings: z
      .array(
        z
          .object({
            depth: z.enum(READING_DEPTHS, { error: 'must be top, middle or bottom' }),
            axis: z.enum(READING_AXES, { error: 'must be pin or thrust' }),
            diameter: diameterField,
          })
          .strict(),
      )
      .min(1, 'enter at least one reading')
      .max(6, 'at most 6 readings: three depths on two axes'),
    /**
     * The cylinder's `measuredAt` when these readings were typed (null: it had none). When the
     * stored readings have changed since, the answer is 409 with both, and nothing is overwritten.
     */
    basedOn: z.iso
      .datetime({ offset: true, error: 'must be the measuredAt time the readings were based on' })
      .nullable()
      .optional(),
  })
  .strict();
export type ReadingsInput = z.output<typeof readingsInput>;

const smallLength = optionalLengthField({ allowZero: true, max: 10_000_000 });

export const cylinderPatch = z
  .object({
    /** The customer's cylinder this job cylinder is (null: unlink). */
    cylinderId: uuid.nullable(),
    stepId: uuid.nullable(),
    clearance: smallLength,
    measuredAfterHone: optionalLengthField({ max: 500_000_000 }),
    ringGap: smallLength,
  })
  .partial()
  .strict()
  .refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change');
export type CylinderPatch = z.output<typeof cylinderPatch>;

/** Marking a cylinder cut; the reason is needed only when the held piston's bore does not clean up. */
export const cutInput = z
  .object({
    overrideReason: z
      .string()
      .trim()
      .min(3, 'say why the cylinder is cut although the bore does not clean up')
      .max(500)
      .optional(),
  })
  .strict();
export type CutInput = z.output<typeof cutInput>;

const cylinderNumber = z
  .number({ error: 'must be the cylinder number' })
  .int('must be a whole number')
  .min(1, 'at least 1')
  .max(24, 'at most 24');

export const holdInput = z
  .object({
    cylinder: cylinderNumber,
    unitId: uuid.optional(),
    partId: uuid.optional(),
    quantity: z.number().int('must be a whole number').min(1).max(24).optional(),
    /** Days until the hold lapses; null for no expiry; left out: the shop's default. */
    expiresInDays: z.number().int().min(1).max(365).nullable().optional(),
  })
  .strict()
  .refine((h) => (h.unitId ? 1 : 0) + (h.partId ? 1 : 0) === 1, {
    message: 'give either unitId (one measured piston) or partId with a quantity (ring sets)',
    path: ['unitId'],
  })
  .refine((h) => !(h.unitId && h.quantity !== undefined && h.quantity !== 1), {
    message: 'a piston unit is held one at a time',
    path: ['quantity'],
  });
export type HoldInput = z.output<typeof holdInput>;

export const holdMoveInput = z.object({ jobId: uuid, cylinder: cylinderNumber }).strict();
export type HoldMoveInput = z.output<typeof holdMoveInput>;

export const noteInput = z
  .object({
    text: z.string().trim().min(1, 'write the note').max(2000, 'at most 2000 characters'),
  })
  .strict();

// ---- Answers ----------------------------------------------------------------------------------

export interface ReadingJson {
  depth: Depth;
  axis: Axis;
  diameter: LengthJson;
  /** The unit the reading was typed in. */
  unit: LengthUnit;
}

export interface WearJson {
  largest: LengthJson;
  taper: LengthJson;
  outOfRound: LengthJson;
}

/** Answer of PUT …/readings. */
export interface ReadingsResultJson {
  wear: WearJson;
  overStandard: LengthJson | null;
  taperKnown: boolean;
  outOfRoundKnown: boolean;
  warnings: string[];
  cylinder: CylinderJson;
}

export interface HoldJson {
  id: string;
  jobId: string;
  jobNumber: string;
  cylinder: number;
  partId: string;
  sku: string;
  kind: 'piston' | 'rings' | 'other';
  description: string;
  stepLabel: string | null;
  unitId: string | null;
  unitLabel: string | null;
  skirt: LengthJson | null;
  bin: string | null;
  quantity: number;
  expiresAt: string | null;
  createdAt: string;
  releasedAt: string | null;
  releaseReason: 'released' | 'moved' | 'expired' | 'cancelled' | 'issued' | null;
}

export interface CylinderJson {
  n: number;
  /** The customer's cylinder this is, by the shop's mark; null until linked. */
  cylinder: { id: string; mark: string } | null;
  readings: ReadingJson[];
  wear: (WearJson & { overStandard: LengthJson | null }) | null;
  warnings: string[];
  measuredAt: string | null;
  step: { id: string; label: string; nominalBore: LengthJson } | null;
  /** Clearance set for this cylinder; null: the shop's policy applies. */
  clearance: LengthJson | null;
  /** The piston held for this cylinder (or issued with it, once the job is handed back). */
  piston: HoldJson | null;
  rings: HoldJson[];
  cutAt: string | null;
  measuredAfterHone: LengthJson | null;
  ringGap: LengthJson | null;
  /** The recorded ring end gap is within the family's range (null: not recorded or no range). */
  ringGapOk: boolean | null;
  /** Honed bore − the held piston's skirt, against the range for its material; null until honed. */
  honedFit: HonedFitJson | null;
  /** The end gap the honed bore calls for (the family's factor × the bore); null until honed. */
  ringGapSuggested: LengthJson | null;
  /** The recorded end gap against that suggestion; null until both are known. */
  ringGapCheck: { verdict: 'ok' | 'tight' | 'wide'; text: string } | null;
}

export interface HonedFitJson {
  clearance: LengthJson;
  range: { min: LengthJson; max: LengthJson; basis: 'family' | 'forged' };
  verdict: 'in_range' | 'tight' | 'loose';
  text: string;
}

export interface PhotoJson {
  id: string;
  contentType: string;
  size: number;
  url: string;
  /** null when no thumbnail was sent with the photo: show the photo scaled down. */
  thumbnailUrl: string | null;
  originalName: string;
  createdAt: string;
}

export interface JobEventJson {
  id: number;
  at: string;
  kind: 'note' | 'state' | 'hold' | 'work' | 'system';
  text: string;
  userName: string | null;
}

export interface JobFamilyJson {
  id: string;
  code: string;
  name: string;
  cylinders: number;
  standardBore: LengthJson;
  clearance: { min: LengthJson; max: LengthJson };
  honeAllowance: LengthJson;
  cleanup: LengthJson;
  maxOversize: LengthJson;
  maxTaper: LengthJson | null;
  maxOutOfRound: LengthJson | null;
  ringGap: { min: LengthJson | null; max: LengthJson | null };
}

export interface JobListItemJson {
  id: string;
  number: string;
  state: JobState;
  customerId: string;
  customerName: string;
  family: { id: string; code: string; name: string };
  cylinders: number;
  askedFor: string;
  dueDate: string | null;
  overdue: boolean;
  /** A cylinder waits for a piston or a ring set (the one rule every page counts: part-needs). */
  waitingForParts: boolean;
  waitingFor: NeededPart[];
  pistonsHeld: number;
  cylindersCut: number;
  createdAt: string;
}

export interface JobJson extends Omit<JobListItemJson, 'family'> {
  customerPhone: string | null;
  customerEmail: string | null;
  family: JobFamilyJson;
  notes: string;
  notifyCustomer: boolean;
  createdBy: string | null;
  updatedAt: string;
  stateChangedAt: string;
  closedAt: string | null;
  cylinderDetails: CylinderJson[];
  /** What is held for the job now; once it is handed back, the parts that went out with it. */
  holds: HoldJson[];
  photos: PhotoJson[];
  events: JobEventJson[];
}

export interface StepChoiceJson {
  stepId: string;
  label: string;
  finishedBore: LengthJson;
  /** Finished bore minus the largest worn diameter (negative: the step does not reach the wear). */
  cleanup: LengthJson;
  freePistons: number;
  freeRings: number;
  onOrder: number;
  suitable: boolean;
  reason: string;
}

export interface RecommendationJson {
  steps: StepChoiceJson[];
  choice: string | null;
  /** Which rule of the shop's step policy chose the step. */
  rule?: string;
  warning?: string;
  /** When the choice has no free piston: the next suitable step that has one, and its cost in steps. */
  alternative?: StepAlternative;
  largestWorn: LengthJson;
  chosenStepId: string | null;
  /** Steps still open after the chosen one (or, with none chosen, after the earlier bore). */
  stepsLeft: number;
  /** The linked cylinder's last bore before this job; null when unlinked or never bored. */
  earlierBore: EarlierBoreJson | null;
  cylinder: { id: string; mark: string } | null;
}

export interface EarlierBoreJson {
  jobId: string;
  jobNumber: string;
  date: string;
  stepLabel: string | null;
  finishedBore: LengthJson;
}

export interface ProposalJson {
  step: { id: string; label: string; nominalBore: LengthJson };
  /** The free measured piston whose skirt is nearest the step's nominal size. */
  unit: ProposedUnitJson | null;
  /** Other free measured pistons of the step, nearest first. */
  others: ProposedUnitJson[];
  rings: { partId: string; sku: string; description: string; free: number }[];
  piston: HoldJson | null;
  /**
   * What a piston's bore is checked against: finished bore = skirt + clearance must exceed the largest
   * worn diameter by the allowance (pistonCleanup). Null before the bore is read.
   */
  cleanupBasis: { clearance: LengthJson; largestWorn: LengthJson; allowance: LengthJson } | null;
  /** Whether the held piston's bore cleans up; null without a held piston or readings. */
  heldCleansUp: boolean | null;
}

export interface ProposedUnitJson {
  id: string;
  label: string;
  partId: string;
  sku: string;
  skirt: LengthJson;
  bin: string | null;
  stepLabel: string | null;
  /** Whether the bore cut for this piston cleans up the wear; absent before the bore is read. */
  cleansUp?: boolean;
}

export interface BorePassJson {
  kind: PassKind;
  size: LengthJson;
  /** Depth of the cut where the bore is least worn: the deepest it cuts anywhere. */
  cutUnworn: LengthJson;
  /** Depth of the cut where the bore is most worn (zero until the bar reaches the wear). */
  cutWorn: LengthJson;
}

export interface CleanupCheckJson {
  allowance: LengthJson;
  /** Finished bore minus the largest worn diameter. */
  removed: LengthJson;
  /** Removed minus the allowance; negative when the bore would not clean up. */
  spare: LengthJson | null;
  short: LengthJson | null;
  cleansUp: boolean;
  /** Why it does not clean up, in plain words; null when it does. */
  message: string | null;
  /** The machinist's reason for cutting anyway, kept with the cylinder. */
  overrideReason: string | null;
}

export interface BoreSheetJson {
  job: { id: string; number: string; customerName: string; state: JobState };
  family: { id: string; code: string; name: string };
  cylinder: number;
  step: { id: string; label: string; nominalBore: LengthJson } | null;
  piston: { unitId: string; label: string; sku: string; material: string | null };
  skirt: LengthJson;
  clearance: LengthJson;
  clearanceRange: { min: LengthJson; max: LengthJson };
  clearanceFrom: 'cylinder' | 'policy';
  finishedBore: LengthJson;
  boreTo: LengthJson;
  honeStock: LengthJson;
  largestWorn: LengthJson;
  /** Where the passes start: the smallest reading, or the standard bore when the bottom was not read. */
  smallestBore: LengthJson;
  smallestFrom: 'readings' | 'standard';
  maxCutPerPass: LengthJson;
  minCutPerPass: LengthJson;
  finishPass: LengthJson | null;
  truingPass: LengthJson | null;
  /** One step of the boring bar's dial; every size to set is on it. */
  barResolution: BarResolution;
  passes: BorePassJson[];
  /** Why no passes are listed (the bore is already past the bore-to size, …). */
  passesNote: string | null;
  /** A truing or finish pass left out, and why. */
  passesNotes: string[];
  /** Whether the bore cut for the held piston (its skirt + clearance) cleans up the worst wear. */
  cleanup: CleanupCheckJson;
  ringGap: { min: LengthJson | null; max: LengthJson | null };
  cutAt: string | null;
  measuredAfterHone: LengthJson | null;
  ringGapMeasured: LengthJson | null;
  /** The end gap this bore calls for: the family's factor × the finished bore. */
  ringGapSuggested: LengthJson;
  /** After honing: the clearance the piston has in the honed bore, checked; null until recorded. */
  honedFit: HonedFitJson | null;
  /** Grits, crosshatch and the hone's travel, printed under the passes. */
  honing: string[];
  /** The cylinder's mark and its last bore before this job, when it has been bored before. */
  cylinderMark: string | null;
  previousBore: EarlierBoreJson | null;
  /** The usual cautions, with the engine's own first (two-stroke ports). */
  cautions: string[];
  /** What to tick after honing, worded for this engine (port edges only on a two-stroke). */
  afterHoningChecks: string[];
}

export interface SweepResultJson {
  /** False when another server process was sweeping at the same moment. */
  ran: boolean;
  released: number;
}
