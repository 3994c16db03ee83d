// What the catalog API accepts and answers: engine families, step series, parts and the step
// ladder. The zod schemas are used by the server routes and by the Angular forms, so both refuse
// the same input with the same words.
import * as z from '../zod';
import { normalizeGtin, gtinProblem } from '../gtin';
import type { LengthJson } from '../lengths';
import { idField, lengthField, moneyText, optionalLengthField } from './common';
import { atMost, singleLine } from '../text-rules';
import type { NeededPart } from '../part-needs';

export const STROKE_TYPES = ['two', 'four'] as const;
export type StrokeType = (typeof STROKE_TYPES)[number];
export const COOLING_TYPES = ['air', 'liquid'] as const;
export type Cooling = (typeof COOLING_TYPES)[number];
export const PART_KINDS = ['piston', 'rings', 'kit', 'other'] as const;
export type PartKind = (typeof PART_KINDS)[number];
export const PISTON_MATERIALS = ['cast', 'forged'] as const;
export type PistonMaterial = (typeof PISTON_MATERIALS)[number];

/**
 * A GTIN (EAN-13, UPC-A, GTIN-8 or GTIN-14) with a valid check digit, stored in its 14-digit form;
 * null or "" clears it.
 */
export const gtinField = z.pipe(
  z.nullable(
    z.string({ error: 'must be the digits under the barcode' }).check(z.maxLength(40, atMost(40))),
  ),
  z.transform((text, ctx): string | null => {
    if (text === null || text.trim() === '') return null;
    const problem = gtinProblem(text);
    const normal = problem ? null : normalizeGtin(text);
    if (problem || !normal) {
      return z.refuse(ctx, problem ?? 'not a valid GTIN');
    }
    return normal;
  }),
);

/** The shortest usual form of a stored 14-digit GTIN: UPC-A (12) or EAN-13 when the leading zeros allow. */
export function displayGtin(gtin14: string): string {
  if (gtin14.startsWith('00')) return gtin14.slice(2);
  if (gtin14.startsWith('0')) return gtin14.slice(1);
  return gtin14;
}

const code = z.pipe(singleLine(24), z.string().check(z.minLength(1, 'enter a code')));
const name = z.pipe(singleLine(120), z.string().check(z.minLength(1, 'enter a name')));
const bore = lengthField({ max: 500_000_000 });
const smallLength = lengthField({ allowZero: true, max: 10_000_000 });
const optionalSmallLength = optionalLengthField({ allowZero: true, max: 10_000_000 });

/** A whole number of pieces between two bounds, refused in words the form can show as they are. */
const count = (min: number, max: number) =>
  z
    .number({ error: 'must be a whole number' })
    .check(
      z.int('must be a whole number'),
      z.gte(min, `must be ${min} or more`),
      z.lte(max, `at most ${max}`),
    );

const ringGapFactor = z.string({ error: 'must be a decimal such as 0.004' }).check(
  z.trim(),
  z.maxLength(8, 'at most 5 decimals, such as 0.00450'),
  z.regex(/^0?\.\d{1,5}$/, 'must be a decimal below 1 such as 0.004'),
  z.refine((v) => Number(v) > 0 && Number(v) < 0.02, 'must be above 0 and below 0.02 of the bore'),
);

export const familyInput = z.strictObject({
  code,
  name,
  strokeType: z.enum(STROKE_TYPES, { error: 'must be "two" or "four"' }),
  cylinders: z.number({ error: 'must be a whole number' }).check(z.int(), z.gte(1), z.lte(24)),
  cooling: z.enum(COOLING_TYPES, { error: 'must be "air" or "liquid"' }),
  standardBore: bore,
  stroke: bore,
  clearanceMin: smallLength,
  clearanceMax: smallLength,
  honeAllowance: smallLength,
  cleanup: smallLength,
  maxOversize: smallLength,
  stepSeriesId: idField,
  maxTaper: z.optional(optionalSmallLength),
  maxOutOfRound: z.optional(optionalSmallLength),
  ringGapMin: z.optional(optionalSmallLength),
  ringGapMax: z.optional(optionalSmallLength),
  /** A clearance range of its own for forged pistons; both empty: the range above for every piston. */
  forgedClearanceMin: z.optional(optionalSmallLength),
  forgedClearanceMax: z.optional(optionalSmallLength),
  /** Ring end gap per unit of bore (in per in, or mm per mm), e.g. "0.004". */
  ringGapPerBore: z.optional(ringGapFactor),
  /** The hone's crosshatch, included angle in degrees. */
  honeCrosshatch: z.optional(
    z
      .number({ error: 'must be a number of degrees' })
      .check(z.gte(10, 'at least 10°'), z.lte(90, 'at most 90°')),
  ),
  /** The stones, as the shop writes them ("coarse 280, plateau 400"). */
  honeGrits: z.optional(singleLine(120)),
  notes: z.optional(z.string().check(z.maxLength(2000))),
});
export type FamilyInput = z.output<typeof familyInput>;

export const familyPatch = z
  .extend(z.partial(familyInput), { active: z.optional(z.boolean()) })
  .check(z.refine((p) => Object.keys(p).length > 0, 'nothing to change'));
export type FamilyPatch = z.output<typeof familyPatch>;

export const stepSeriesInput = z.strictObject({
  code,
  name,
  unit: z.enum(['mm', 'in'], { error: 'must be "mm" or "in"' }),
  /** Oversizes over the standard bore, ascending, in `unit` unless written with their own unit. */
  offsets: z
    .array(z.string().check(z.maxLength(30)))
    .check(z.minLength(1, 'give at least one oversize'), z.maxLength(20)),
});
export type StepSeriesInput = z.output<typeof stepSeriesInput>;

const partFields = {
  kind: z.enum(PART_KINDS, { error: 'must be piston, rings, kit or other' }),
  sku: z
    .string()
    .check(
      z.trim(),
      z.minLength(1, 'enter our part number'),
      z.maxLength(40, atMost(40)),
      z.regex(/^[A-Za-z0-9][A-Za-z0-9._/+-]*$/, 'letters, digits and . _ / + - only'),
    ),
  familyId: z.optional(z.nullable(idField)),
  stepId: z.optional(z.nullable(idField)),
  description: z.pipe(singleLine(300), z.string().check(z.minLength(1, 'enter a description'))),
  material: z.optional(z.nullable(z.enum(PISTON_MATERIALS, { error: 'must be cast or forged' }))),
  ringCount: z.optional(z.nullable(count(1, 6))),
  pinDiameter: z.optional(optionalLengthField({ max: 100_000_000 })),
  gtin: z.optional(gtinField),
  salePrice: z.optional(moneyText),
  reorderPoint: z.optional(z.nullable(count(0, 1_000_000))),
  orderUpTo: z.optional(z.nullable(count(0, 1_000_000))),
  components: z.optional(
    z
      .array(
        z.strictObject({
          partId: idField,
          quantity: z.number().check(z.int(), z.gte(1), z.lte(1000)),
        }),
      )
      .check(z.maxLength(20)),
  ),
};

export const partInput = z.strictObject(partFields);
export type PartInput = z.output<typeof partInput>;

// The kind of a part never changes: a piston with units on the shelf cannot become a ring set.
const { kind: _kind, ...patchableFields } = partFields;
export const partPatch = z
  .partial(z.strictObject({ ...patchableFields, active: z.optional(z.boolean()) }))
  .check(z.refine((p) => Object.keys(p).length > 0, 'nothing to change'));
export type PartPatch = z.output<typeof partPatch>;

// ---- Answers ----------------------------------------------------------------------------------

export interface StepJson {
  id: string;
  position: number;
  label: string;
  offset: LengthJson;
}

export interface StepSeriesJson {
  id: string;
  code: string;
  name: string;
  unit: 'mm' | 'in';
  custom: boolean;
  steps: StepJson[];
}

export interface FamilyJson {
  id: string;
  code: string;
  name: string;
  strokeType: StrokeType;
  cylinders: number;
  cooling: Cooling;
  standardBore: LengthJson;
  stroke: LengthJson;
  clearance: { min: LengthJson; max: LengthJson };
  honeAllowance: LengthJson;
  cleanup: LengthJson;
  maxOversize: LengthJson;
  maxTaper: LengthJson | null;
  maxOutOfRound: LengthJson | null;
  ringGap: { min: LengthJson | null; max: LengthJson | null };
  /** Null: forged pistons use the family's one range. */
  forgedClearance: { min: LengthJson; max: LengthJson } | null;
  ringGapPerBore: string;
  hone: { crosshatchDeg: number; grits: string };
  stepSeriesId: string;
  stepSeries: { id: string; code: string; name: string };
  notes: string;
  active: boolean;
  /** Pistons of this family: on the shelf, free, and steps (within the largest oversize) with none free. */
  stock: { pistonsOnHand: number; pistonsFree: number; emptySteps: number };
  createdAt: string;
  updatedAt: string;
}

export interface CountsJson {
  onHand: number;
  held: number;
  free: number;
  onOrder: number;
}

export type UnitStatus = 'free' | 'held' | 'issued' | 'returned' | 'scrapped';

export interface LadderUnitJson {
  id: string;
  partId: string;
  label: string;
  skirt: LengthJson | null;
  status: UnitStatus;
  bin: string | null;
  binId: string | null;
}

export interface LadderStepJson {
  stepId: string;
  label: string;
  offset: LengthJson;
  nominalBore: LengthJson;
  pistons: CountsJson;
  rings: CountsJson;
  /** Free pistons not yet measured: on hand, but not free for a bore until measured. */
  pistonsToMeasure: number;
  /** Kits that could be put together for this step from free parts. */
  kitsFree: number;
  /** The step is empty: no free piston or no free ring set (shared/part-needs), so a job waits. */
  nothingFree: boolean;
  /** What it lacks, piston first. */
  missing: NeededPart[];
  /**
   * A few of the step's pistons on the shelf (free or held): the free measured ones nearest the
   * nominal bore first. `unitsTotal` counts them all; the rest come from the step's units route.
   */
  units: LadderUnitJson[];
  unitsTotal: number;
}

export interface LadderJson {
  family: FamilyJson;
  steps: LadderStepJson[];
}

export interface ExposureItemJson {
  familyId: string;
  familyCode: string;
  familyName: string;
  stepId: string;
  stepLabel: string;
  offset: LengthJson;
  nominalBore: LengthJson;
  /** Piston part numbers the catalog has for this step (0: none listed yet). */
  pistonParts: number;
  pistonsOnHand: number;
  pistonsHeld: number;
  /** Measured pistons nobody holds, and free ones still to measure. */
  pistonsFree: number;
  pistonsToMeasure: number;
  ringsFree: number;
  /** What the step lacks (no free piston, no free ring set, or both), piston first. */
  missing: NeededPart[];
  /** Pistons of this step ever issued: how often it is asked for. */
  issued: number;
}

export interface PartJson {
  id: string;
  sku: string;
  kind: PartKind;
  familyId: string | null;
  familyCode: string | null;
  stepId: string | null;
  stepLabel: string | null;
  description: string;
  material: PistonMaterial | null;
  ringCount: number | null;
  pinDiameter: LengthJson | null;
  gtin: string | null;
  salePrice: string;
  /** Absent for roles that may not see costs (shared/money-visibility.ts). */
  averageCost?: string;
  onHand: number;
  held: number;
  free: number;
  reorderPoint: number | null;
  orderUpTo: number | null;
  binId: string | null;
  bin: string | null;
  active: boolean;
}

export interface PartDetailJson extends PartJson {
  family: { id: string; code: string; name: string } | null;
  step: { id: string; label: string; offset: LengthJson; nominalBore: LengthJson | null } | null;
  components: {
    partId: string;
    sku: string;
    description: string;
    quantity: number;
    free: number;
  }[];
  createdAt: string;
  updatedAt: string;
}

export const PART_SORTS = [
  'sku',
  'description',
  'kind',
  'family',
  'step',
  'onHand',
  'free',
  'salePrice',
] as const;
export const FAMILY_SORTS = ['code', 'name', 'standardBore', 'strokeType'] as const;
