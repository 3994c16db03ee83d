// What the customers API accepts and answers: the customer record, search at intake, merging two
// records of one person, export and erasure, and the customer's cylinders with their bores. The
// zod schemas serve the server routes and the Angular forms alike.
import * as z from '../zod';
import { idField } from './common';
import type { LengthJson } from '../lengths';
import type { JobState } from './jobs';
import { singleLine } from '../text-rules';
import type { EstimateState } from './money';

export const CUSTOMER_NAME_MAX = 120;
/** What an erased customer's name reads as: no trace of the person, still a distinct row. */
export const ERASED_NAME_PREFIX = 'Erased customer';

export const customerName = z.pipe(
  singleLine(CUSTOMER_NAME_MAX, "enter the customer's name"),
  z.string().check(z.minLength(1, "enter the customer's name")),
);

/** Left out: no change; "" or null: cleared. */
const optionalText = (max: number) =>
  z.pipe(
    z.optional(
      z.union([
        z.null(),
        z.string().check(z.trim(), z.maxLength(max, `at most ${max} characters`)),
      ]),
    ),
    z.transform((v) => (v === '' ? null : v)),
  );

export const customerPhone = optionalText(40).check(
  z.refine(
    (v) => v === null || v === undefined || /^[0-9+()\-./ ]{3,40}$/.test(v),
    'digits, spaces and + ( ) - . / only',
  ),
);

export const customerEmail = z.pipe(
  optionalText(254).check(
    z.refine(
      (v) => v === null || v === undefined || z.string().check(z.email()).safeParse(v).success,
      'is not an e-mail address',
    ),
  ),
  z.transform((v) => (typeof v === 'string' ? v.toLowerCase() : v)),
);

const customerNotes = z.string().check(z.trim(), z.maxLength(2000, 'at most 2000 characters'));

export const customerInput = z.strictObject({
  name: customerName,
  phone: customerPhone,
  email: customerEmail,
  acceptsEmail: z.optional(z.boolean({ error: 'must be true or false' })),
  notes: z.optional(customerNotes),
});
export type CustomerInput = z.output<typeof customerInput>;

export const customerPatch = z
  .partial(customerInput)
  .check(z.refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change'));
export type CustomerPatch = z.output<typeof customerPatch>;

export const mergeInput = z.strictObject({ fromId: idField });

export const eraseInput = z.strictObject({});

/** A cylinder's mark as typed or scanned: trimmed, 1 to 40 characters; `missing` when there is none. */
const markText = (missing: string) =>
  z
    .string({ error: missing })
    .check(z.trim(), z.minLength(1, missing), z.maxLength(40, 'at most 40 characters'));

export const cylinderInput = z.strictObject({
  mark: markText("enter the shop's mark for the cylinder").check(
    z.regex(/^[\x20-\x7e]+$/, 'letters, digits and plain punctuation only, so the tag can print'),
  ),
  familyId: idField,
  castNumber: optionalText(60),
});
export type CylinderInput = z.output<typeof cylinderInput>;

export const EXPORT_FORMATS = ['json', 'csv'] as const;

/** The cylinder whose tag was scanned (camera or keyboard-wedge scanner): its exact mark. */
export const cylinderMarkQuery = z.strictObject({
  mark: markText("enter the shop's mark from the cylinder's tag"),
});

// ---- Answers ----------------------------------------------------------------------------------

export interface CustomerListItemJson {
  id: string;
  name: string;
  phone: string | null;
  email: string | null;
  acceptsEmail: boolean;
}

export interface CustomerJobJson {
  id: string;
  number: string;
  state: JobState;
  familyCode: string;
  cylinders: number;
  askedFor: string;
  dueDate: string | null;
  createdAt: string;
  closedAt: string | null;
  /** The job's estimate total as it stands; null while it has no lines. */
  money: CustomerJobMoneyJson | null;
}

export interface CustomerJobMoneyJson {
  /** Left out for roles that may not see what the shop charges (shared/money-visibility). */
  total?: string;
  currency: string;
  estimateState: EstimateState;
}

export interface CustomerJson extends CustomerListItemJson {
  notes: string;
  erasedAt: string | null;
  createdAt: string;
  updatedAt: string;
  jobs: CustomerJobJson[];
}

export interface BoreJson {
  jobId: string;
  jobNumber: string;
  /** The job's cylinder number. */
  n: number;
  stepId: string | null;
  stepLabel: string | null;
  /** Measured after honing when recorded, else the step's nominal bore. */
  finishedBore: LengthJson;
  measured: boolean;
  /** The shop's calendar date of the cut, YYYY-MM-DD. */
  date: string;
  /** The measured piston that went in. */
  piston: string | null;
}

export interface CustomerCylinderJson {
  id: string;
  mark: string;
  castNumber: string | null;
  familyId: string;
  familyCode: string;
  customerId: string;
  /** Oldest first. */
  bores: BoreJson[];
  /** Steps still open to the next rebore, up to the family's largest oversize. */
  stepsLeft: number;
}

export interface CylinderStepJson {
  id: string;
  label: string;
  offset: LengthJson;
  finishedBore: LengthJson;
  /** Past the largest oversize the wall allows. */
  pastWall: boolean;
}

/** The cylinder carrying a mark (none or one: a mark is on one cylinder of the shop only). */
export interface CylinderByMarkJson {
  items: { id: string; mark: string; customerId: string }[];
}

/** The cylinder page: the cylinder, its bores and the family's ladder to draw them against. */
export interface CylinderDetailJson extends CustomerCylinderJson {
  customerName: string;
  family: {
    id: string;
    code: string;
    name: string;
    standardBore: LengthJson;
    cleanup: LengthJson;
    maxOversize: LengthJson;
  };
  steps: CylinderStepJson[];
  /** Linked job cylinders not cut yet. */
  openJobs: { jobId: string; jobNumber: string; n: number; state: JobState }[];
}

export interface CustomerExportJson {
  exportedAt: string;
  customer: CustomerJson;
  cylinders: CustomerCylinderJson[];
  jobs: (Omit<CustomerJobJson, 'money'> & { notes: string; notifyCustomer: boolean })[];
  /** E-mail the shop queued to the customer's address. */
  mail: { template: string; status: string; createdAt: string }[];
}

// ---- The owner's insight: cylinders near their last step --------------------------------------

export const NEAR_LAST_STEP_MAX = 3;

export const nearLastStepQuery = z.strictObject({
  within: z._default(
    z.coerce
      .number({ error: 'must be a whole number of steps' })
      .check(
        z.int('must be a whole number of steps'),
        z.gte(0, 'must be 0 or more'),
        z.lte(NEAR_LAST_STEP_MAX, `at most ${NEAR_LAST_STEP_MAX}`),
      ),
    1,
  ),
});
export type NearLastStepQuery = z.output<typeof nearLastStepQuery>;

export interface NearLastStepItemJson {
  cylinderId: string;
  mark: string;
  customerId: string;
  customerName: string;
  /** To tell the customer: null when erased or never given. */
  phone: string | null;
  email: string | null;
  familyCode: string;
  bores: number;
  lastBore: { date: string; stepLabel: string | null; finishedBore: LengthJson; jobNumber: string };
  stepsLeft: number;
}

export interface NearLastStepAnswer {
  within: number;
  /** Fewest steps left first, then the most recent last bore. */
  items: NearLastStepItemJson[];
  /** Cylinders with no step left: the next rebore is a sleeve or a new cylinder. */
  sleevesToExpect: number;
  /** Cylinders with exactly one step left: their customers are worth telling now. */
  lastStepNext: number;
}
