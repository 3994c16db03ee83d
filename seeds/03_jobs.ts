// The demo shop's jobs on the bench: a handful of invented customers' cylinders in every stage, from
// just booked in to handed back, with bore readings, chosen steps, held pistons and ring sets. Built
// through the jobs services (so holds write the ledger, levels and notes exactly as the app does),
// from fixed figures, so every run gives the same bench; dates are relative to the day of seeding.
import type { Knex } from 'knex';
import { DateTime } from 'luxon';
import { formatIn, formatMm, inToNm, mmToNm, type LengthUnit, type Nm } from '../shared/lengths';
import { READING_AXES, READING_DEPTHS, type ReadingsInput } from '../shared/api/jobs';
import { getSettings } from '../server/settings/settings-service';
import { cancelJob, collectJob, createJob, patchJob } from '../server/jobs/jobs-service';
import { patchCylinder, putReadings, recommendation } from '../server/jobs/cylinder-service';
import { boreSheet, markCut } from '../server/jobs/bore-sheet-service';
import { placeHold } from '../server/jobs/holds-service';
import { proposal } from '../server/jobs/proposal-service';
import { getEstimate } from '../server/money/estimate-service';
import { answerByLink, approveAtCounter, sendEstimate } from '../server/money/approval-service';
import { readDemoCatalog } from './demo/catalog';

/**
 * Wear below the worst reading at each gauge position, in the trade's resolution (0.0001 in or
 * 0.001 mm): top pin, top thrust, middle pin, middle thrust, bottom pin, bottom thrust. Worst at
 * the top of ring travel, as a worn bore usually is.
 */
const WEAR_PATTERN = [0, 6, 10, 13, 17, 19];

function sixReadings(largest: string, unit: LengthUnit): ReadingsInput['readings'] {
  const top: Nm = unit === 'in' ? inToNm(largest) : mmToNm(largest);
  const step: Nm = unit === 'in' ? 2540 : 1000;
  const positions = READING_DEPTHS.flatMap((depth) =>
    READING_AXES.map((axis) => ({ depth, axis })),
  );
  return positions.map((p, i) => {
    const nm = top - WEAR_PATTERN[i] * step;
    // Round-tripped through text the way a person types it, so it reads back as typed.
    const text = unit === 'in' ? formatIn(nm) : formatMm(nm);
    return { ...p, diameter: { nm: unit === 'in' ? inToNm(text) : mmToNm(text), unit } };
  });
}

interface DemoJob {
  family: string;
  customer: { name: string; phone?: string; email?: string };
  cylinders: number;
  askedFor: string;
  /** Days from the seeding day; negative is past. */
  dueInDays: number | null;
  notes?: string;
  notify?: boolean;
  /** Largest reading per cylinder, in the family's unit; none: not measured yet. */
  worn?: string[];
  /** Take the suggested step for every measured cylinder. */
  chooseStep?: boolean;
  /** Hold the proposed piston (and a ring set) for every cylinder with a step. */
  hold?: boolean;
  /**
   * The customer's answer to the estimate: agreed at the counter or by phone, or sent by e-mail and
   * not answered yet. Every job with a cut was agreed first (the shop cuts only after approval).
   */
  estimate?: 'counter' | 'phone' | 'sent';
  /** Cylinders marked as cut. */
  cut?: number[];
  /** Record the honed bore (on size, from the bore sheet) and a ring gap mid-range after the cut. */
  honed?: boolean;
  /** Where the job ends up. */
  finish?: 'at_the_hone' | 'ready_to_go' | 'collect' | 'cancel';
}

// Invented customers and jobs; phone numbers in the 555-01xx range kept for fiction.
const JOBS: DemoJob[] = [
  {
    family: 'QV-54A',
    customer: { name: 'Halvard Penrose', phone: '555 0101', email: 'halvard@example.test' },
    cylinders: 1,
    askedFor: 'Bore and hone to the next size that cleans up',
    dueInDays: 6,
    notes: 'Cylinder came with its old piston and a seized ring.',
  },
  {
    family: 'QV-54A',
    customer: { name: 'Tamsin Oakmere', phone: '555 0102' },
    cylinders: 1,
    askedFor: 'Measure and quote before any work',
    dueInDays: -2,
  },
  {
    family: 'BT-72',
    customer: { name: 'Marisol Tenwick', email: 'marisol@example.test' },
    cylinders: 2,
    askedFor: 'Rebore both, matched pair',
    dueInDays: 10,
    worn: ['72.180', '72.140'],
    chooseStep: true,
    notes: 'First oversize is out of stock: the pair waits for a delivery.',
  },
  {
    family: 'MB-350',
    customer: { name: 'Corwin Ashlock', phone: '555 0104', email: 'corwin@example.test' },
    cylinders: 1,
    askedFor: 'Bore and hone to the next size that cleans up',
    dueInDays: 3,
    worn: ['2.9530'],
    chooseStep: true,
    hold: true,
    estimate: 'sent',
  },
  {
    family: 'GR-9W',
    customer: { name: 'Bettany Quayle', phone: '555 0105' },
    cylinders: 2,
    askedFor: 'Rebore both; check the water jacket',
    dueInDays: 1,
    worn: ['2.2010', '2.2004'],
    chooseStep: true,
    hold: true,
    estimate: 'phone',
    cut: [1],
  },
  {
    family: 'WY-600',
    customer: { name: 'Ansel Drummond', email: 'ansel@example.test' },
    cylinders: 2,
    askedFor: 'Rebore and hone both',
    dueInDays: 2,
    worn: ['77.105', '77.098'],
    chooseStep: true,
    hold: true,
    estimate: 'counter',
    cut: [1, 2],
    finish: 'at_the_hone',
  },
  {
    family: 'OR-250L',
    customer: { name: 'Ingram Vessey', phone: '555 0107', email: 'ingram@example.test' },
    cylinders: 1,
    askedFor: 'Race prep: bore to the next size, forged piston',
    dueInDays: 0,
    worn: ['66.520'],
    chooseStep: true,
    hold: true,
    estimate: 'sent',
    cut: [1],
    honed: true,
    finish: 'ready_to_go',
  },
  {
    family: 'MB-350',
    customer: { name: 'Lisette Harrowell', phone: '555 0108' },
    cylinders: 1,
    askedFor: 'Bore and hone to the next size that cleans up',
    dueInDays: -5,
    worn: ['2.9612'],
    chooseStep: true,
    hold: true,
    estimate: 'counter',
    cut: [1],
    honed: true,
    finish: 'collect',
  },
  {
    family: 'QV-54A',
    customer: { name: 'Oswin Marchbank' },
    cylinders: 1,
    askedFor: 'Measure and quote before any work',
    dueInDays: null,
    notify: false,
    finish: 'cancel',
    notes: 'Customer decided to sell the engine as it is.',
  },
];

export async function seed(knex: Knex): Promise<void> {
  const catalog = await readDemoCatalog(knex);
  const staff = await knex('users').where({ role: 'staff' }).orderBy('email').first();
  const machinist = await knex('users').where({ role: 'machinist' }).orderBy('email').first();
  if (!staff || !machinist) throw new Error('The jobs seed needs the demo staff and machinist.');
  const { timeZone } = await getSettings(knex);
  const today = DateTime.now().setZone(timeZone).startOf('day');

  for (const spec of JOBS) {
    const family = catalog.families[spec.family];
    if (!family) throw new Error(`The jobs seed needs the demo family ${spec.family}.`);
    const unit: LengthUnit = spec.family === 'MB-350' || spec.family === 'GR-9W' ? 'in' : 'mm';
    const job = await createJob(
      staff.id,
      {
        customerName: spec.customer.name,
        customerPhone: spec.customer.phone ?? null,
        customerEmail: spec.customer.email ?? null,
        familyId: family.id,
        cylinders: spec.cylinders,
        askedFor: spec.askedFor,
        dueDate: spec.dueInDays === null ? null : today.plus({ days: spec.dueInDays }).toISODate(),
        notes: spec.notes ?? '',
        notifyCustomer: spec.notify ?? true,
      },
      unit,
      knex,
    );

    for (const [i, largest] of (spec.worn ?? []).entries()) {
      const n = i + 1;
      await putReadings(
        machinist.id,
        job.id,
        n,
        { readings: sixReadings(largest, unit) },
        unit,
        knex,
      );
      if (!spec.chooseStep) continue;
      const rec = await recommendation(job.id, n, unit, knex);
      if (!rec.choice) throw new Error(`No step cleans up ${spec.family} at ${largest}.`);
      await patchCylinder(machinist.id, job.id, n, { stepId: rec.choice }, unit, knex);
      if (!spec.hold) continue;
      const offer = await proposal(job.id, n, undefined, knex);
      if (!offer.unit) throw new Error(`No free piston of ${offer.step.label} for ${spec.family}.`);
      await placeHold(machinist.id, job.id, { cylinder: n, unitId: offer.unit.id }, unit, knex);
      const rings = offer.rings.find((r) => r.free > 0);
      if (rings) {
        await placeHold(
          machinist.id,
          job.id,
          { cylinder: n, partId: rings.partId, quantity: 1 },
          unit,
          knex,
        );
      }
    }
    if (spec.estimate) {
      await getEstimate(job.id, knex);
      if (spec.estimate === 'sent' || spec.cut?.length) {
        if (spec.customer.email) await sendEstimate(staff.id, job.id, knex);
      }
      // A sent estimate the customer agreed to from the link, or one taken by phone or at the counter.
      if (spec.cut?.length) {
        if (spec.estimate === 'sent') await answerByLink(job.id, 'approve', knex);
        else
          await approveAtCounter(
            staff.id,
            job.id,
            {
              how: spec.estimate,
              note: spec.estimate === 'phone' ? 'Agreed on the phone.' : undefined,
            },
            knex,
          );
      }
    }
    for (const n of spec.cut ?? []) {
      await markCut(machinist.id, job.id, n, unit, {}, knex);
      if (!spec.honed) continue;
      const sheet = await boreSheet(job.id, n, unit, knex);
      const { min, max } = sheet.ringGap;
      // A gap in the middle of the family's range, on the gauge's resolution.
      const grid = unit === 'in' ? 2540 : 1000;
      const mid = min && max ? (mmToNm(min.mm) + mmToNm(max.mm)) / 2 : null;
      await patchCylinder(
        machinist.id,
        job.id,
        n,
        {
          measuredAfterHone: mmToNm(sheet.finishedBore.mm),
          ringGap: mid === null ? null : Math.round(mid / grid) * grid,
        },
        unit,
        knex,
      );
    }
    const actor = { id: machinist.id, role: 'machinist' as const };
    if (
      spec.finish === 'at_the_hone' ||
      spec.finish === 'ready_to_go' ||
      spec.finish === 'collect'
    ) {
      await patchJob(actor, job.id, { state: 'at_the_hone' }, unit, knex);
    }
    if (spec.finish === 'ready_to_go' || spec.finish === 'collect') {
      await patchJob(actor, job.id, { state: 'ready_to_go' }, unit, knex);
    }
    if (spec.finish === 'collect') await collectJob(staff.id, job.id, unit, knex);
    if (spec.finish === 'cancel') await cancelJob(staff.id, job.id, unit, knex);
  }
}
