// The jobs contract: what the API answers (below), with its states (jobs-states.ts) and what it
// accepts (jobs-inputs.ts) re-exported, so client and server import one module.
import { type LengthJson, type LengthUnit } from '../lengths';
import type { Axis, Depth } from '../bore-wear';
import type { NeededPart } from '../part-needs';
import type { BarResolution, PassKind } from '../pass-plan';
import type { StepAlternative } from '../bore-choice';

export * from './jobs-states';
export * from './jobs-inputs';
import type { JobState } from './jobs-states';
import type { FamilyJson } from './catalog';

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

/** The family as a job shows it: what its bore sheet and readings are checked against. */
export type JobFamilyJson = Pick<
  FamilyJson,
  | 'id'
  | 'code'
  | 'name'
  | 'cylinders'
  | 'standardBore'
  | 'clearance'
  | 'honeAllowance'
  | 'cleanup'
  | 'maxOversize'
  | 'maxTaper'
  | 'maxOutOfRound'
  | 'ringGap'
>;

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
  /** Its estimate was sent to the customer and they have not answered yet. */
  awaitingApproval: boolean;
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
  /** How many of the passes are ticked done, in order. */
  passesDone: number;
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
