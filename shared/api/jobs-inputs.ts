// What the jobs API accepts: intake, bore readings, a cylinder's step and clearance, the cut, holds
// and notes. The zod schemas are used by the server routes and the Angular forms, so both refuse
// the same input with the same words.
import * as z from '../zod';
import { atMost, isOneEmailAddress, MAX_EMAIL_LENGTH, singleLine } from '../text-rules';
import { idField, isCalendarDay, optionalLengthField } from './common';
import { parseLength, type LengthUnit } from '../lengths';
import { OPEN_STATES, READING_AXES, READING_DEPTHS } from './jobs-states';

/** Optional text: left out stays undefined (no change), "" or null become null (cleared). */
const optionalText = (max: number) =>
  z.pipe(
    z.optional(z.union([z.null(), z.string().check(z.trim(), z.maxLength(max, atMost(max)))])),
    z.transform((v) => (v === '' ? null : v)),
  );

/** A calendar date written as YYYY-MM-DD, and a real one (no 31 April). */
export const isoDate = z.string({ error: 'must be a date written as YYYY-MM-DD' }).check(
  z.maxLength(10, atMost(10, 'must be a date written as YYYY-MM-DD')),
  z.refine(isCalendarDay, 'is not a date on the calendar'),
  z.refine((text) => {
    const year = Number(text.slice(0, 4));
    return year >= 2000 && year <= 2200;
  }, 'is not a date on the calendar'),
);

const customerFields = {
  customerName: z.pipe(
    singleLine(120, "enter the customer's name"),
    z.string().check(z.minLength(1, "enter the customer's name")),
  ),
  customerPhone: optionalText(40).check(
    z.refine(
      (v) => v === null || v === undefined || /^[0-9+()\-./ ]{3,40}$/.test(v),
      'digits, spaces and + ( ) - . / only',
    ),
  ),
  customerEmail: optionalText(MAX_EMAIL_LENGTH).check(
    z.refine(
      (v) => v === null || v === undefined || isOneEmailAddress(v),
      'is not one e-mail address (like name@example.test)',
    ),
  ),
  askedFor: z.optional(z.string().check(z.trim(), z.maxLength(300, 'at most 300 characters'))),
  dueDate: z.optional(z.nullable(isoDate)),
  notes: z.optional(z.string().check(z.trim(), z.maxLength(2000, 'at most 2000 characters'))),
  notifyCustomer: z.optional(z.boolean()),
};

export const jobInput = z
  .strictObject({
    ...customerFields,
    /** The customer's record; the typed name, phone and e-mail still work and find or make one. */
    customerId: z.optional(idField),
    customerName: z.optional(customerFields.customerName),
    familyId: idField,
    cylinders: z
      .number({ error: 'must be a whole number' })
      .check(z.int('must be a whole number'), z.gte(1, 'at least 1'), z.lte(24, 'at most 24')),
    /** The customer's known cylinder for each job cylinder, in order (null: not marked). */
    cylinderIds: z.optional(z.array(z.nullable(idField)).check(z.maxLength(24, 'at most 24'))),
  })
  .check(
    z.refine((j) => (j.customerId === undefined) !== (j.customerName === undefined), {
      message: "give either customerId (a customer's record) or customerName",
      path: ['customerName'],
    }),
    z.refine((j) => j.customerId === undefined || (!j.customerPhone && !j.customerEmail), {
      message: "with customerId, change the customer's phone and e-mail on their record",
      path: ['customerPhone'],
    }),
    z.refine((j) => j.cylinderIds === undefined || j.cylinderIds.length <= j.cylinders, {
      message: 'more cylinders marked than the job brings',
      path: ['cylinderIds'],
    }),
  );
export type JobInput = z.output<typeof jobInput>;

export const jobPatch = z
  .partial(
    z.strictObject({
      ...customerFields,
      state: z.enum(OPEN_STATES, {
        error: `must be one of ${OPEN_STATES.join(', ')} (collect and cancel have their own commands)`,
      }),
    }),
  )
  .check(z.refine((p) => Object.values(p).some((v) => v !== undefined), 'nothing to change'));
export type JobPatch = z.output<typeof jobPatch>;

export const JOB_SORTS = ['due', 'number', 'customer', 'created', 'state'] as const;

/** A bore diameter as typed ("2.5260 in"), read into nm and the unit it was typed in. */
export const diameterField = z.pipe(
  z.string({ error: 'must be text with its unit, for example "64.91 mm" or "2.5555 in"' }),
  z.transform((text, ctx): { nm: number; unit: LengthUnit } => {
    const parsed = parseLength(text, { max: 500_000_000 });
    if (!parsed.ok) {
      return z.refuse(ctx, parsed.message);
    }
    return { nm: parsed.nm, unit: parsed.unit };
  }),
);

export const readingsInput = z.strictObject({
  readings: z
    .array(
      z.strictObject({
        depth: z.enum(READING_DEPTHS, { error: 'must be top, middle or bottom' }),
        axis: z.enum(READING_AXES, { error: 'must be pin or thrust' }),
        diameter: diameterField,
      }),
    )
    .check(
      z.minLength(1, 'enter at least one reading'),
      z.maxLength(6, 'at most 6 readings: three depths on two axes'),
    ),
  /**
   * The cylinder's `measuredAt` when these readings were typed (null: it had none). When the
   * stored readings have changed since, the answer is 409 with both, and nothing is overwritten.
   */
  basedOn: z.optional(
    z.nullable(
      z.iso.datetime({
        offset: true,
        error: 'must be the measuredAt time the readings were based on',
      }),
    ),
  ),
});
export type ReadingsInput = z.output<typeof readingsInput>;

const smallLength = optionalLengthField({ allowZero: true, max: 10_000_000 });
/** A size as the API answered it ({ mm, in }), or null: none was recorded. */
const seenLength = z.optional(
  z.nullable(
    z.strictObject(
      { mm: z.string().check(z.maxLength(20)), in: z.string().check(z.maxLength(20)) },
      { error: 'must be { mm, in } or null' },
    ),
  ),
);

export const cylinderPatch = z
  .partial(
    z.strictObject({
      /** The customer's cylinder this job cylinder is (null: unlink). */
      cylinderId: z.nullable(idField),
      stepId: z.nullable(idField),
      clearance: smallLength,
      measuredAfterHone: optionalLengthField({ max: 500_000_000 }),
      ringGap: smallLength,
      /**
       * The after-honing sizes as the client last read them for this cylinder. When one sent is
       * stored differently now, and not as it was based on, the answer is 409 `stale_cylinder` with
       * both, and nothing changes. Left out: no check, as before.
       */
      basedOn: z.strictObject({ measuredAfterHone: seenLength, ringGap: seenLength }),
    }),
  )
  .check(
    z.refine(
      ({ basedOn: _seen, ...changes }) => Object.values(changes).some((v) => v !== undefined),
      'nothing to change',
    ),
  );
export type CylinderPatch = z.output<typeof cylinderPatch>;

/** Passes are ticked in order: `done` is how many of the sheet's passes are done now. */
export const passesDoneInput = z.strictObject({
  done: z
    .number({ error: 'must be a whole number of passes' })
    .check(z.int(), z.gte(0), z.lte(100)),
  /**
   * How many were done when this tick was made. When the stored count has changed since (someone
   * else ticked), 409 `stale_passes` with both, and nothing changes. Left out: no check.
   */
  basedOn: z.optional(z.number().check(z.int(), z.gte(0), z.lte(100))),
});
export type PassesDoneInput = z.output<typeof passesDoneInput>;

/** Marking a cylinder cut; the reason is needed only when the held piston's bore does not clean up. */
export const cutInput = z.strictObject({
  overrideReason: z.optional(
    z
      .string()
      .check(
        z.trim(),
        z.minLength(3, 'say why the cylinder is cut although the bore does not clean up'),
        z.maxLength(500),
      ),
  ),
});
export type CutInput = z.output<typeof cutInput>;

const cylinderNumber = z
  .number({ error: 'must be the cylinder number' })
  .check(z.int('must be a whole number'), z.gte(1, 'at least 1'), z.lte(24, 'at most 24'));

export const holdInput = z
  .strictObject({
    cylinder: cylinderNumber,
    unitId: z.optional(idField),
    partId: z.optional(idField),
    quantity: z.optional(z.number().check(z.int('must be a whole number'), z.gte(1), z.lte(24))),
    /** Days until the hold lapses; null for no expiry; left out: the shop's default. */
    expiresInDays: z.optional(z.nullable(z.number().check(z.int(), z.gte(1), z.lte(365)))),
  })
  .check(
    z.refine((h) => (h.unitId ? 1 : 0) + (h.partId ? 1 : 0) === 1, {
      message: 'give either unitId (one measured piston) or partId with a quantity (ring sets)',
      path: ['unitId'],
    }),
    z.refine((h) => !(h.unitId && h.quantity !== undefined && h.quantity !== 1), {
      message: 'a piston unit is held one at a time',
      path: ['quantity'],
    }),
  );
export type HoldInput = z.output<typeof holdInput>;

export const holdMoveInput = z.strictObject({ jobId: idField, cylinder: cylinderNumber });
export type HoldMoveInput = z.output<typeof holdMoveInput>;

export const noteInput = z.strictObject({
  text: z
    .string()
    .check(
      z.trim(),
      z.minLength(1, 'write the note'),
      z.maxLength(2000, 'at most 2000 characters'),
    ),
});
