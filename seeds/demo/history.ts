// Sixteen months of the demo shop's past: collected cylinder jobs with their readings, holds and the
// ledger's receipts, reservations and issues, so the owner's insights mean something on first start.
//
// Invented and deterministic (one seeded sequence). Busier in spring, quieter in winter — an
// invented season, common practice for a shop whose customers ride in the warm months (no source).
// Every part's history nets to zero: all it received in the past it also issued, so the stock the
// catalog seed put on the shelf today stays exactly as that seed intended (on-hand, holds, average
// cost; the average restarts at today's receipt because the part ran out before it). Moving average
// costs at each issue follow the weighted-average cost method of shared/average-cost.ts. A piston
// that was not on the shelf when a job needed it is recorded as a shortage and the job waited for
// the delivery. Rows go in as multi-row inserts inside one transaction: a second or two.
import type { Knex } from 'knex';
import Decimal from 'decimal.js';
import { issueAtCost, receiptValue, type ValuedReceipt } from '../../shared/average-cost';
import { inToNm, mmToNm, type Nm } from '../../shared/lengths';
import { DEMO_FAMILIES, seededRandom } from './catalog';

const HOUR = 3_600_000;
const DAY = 24 * HOUR;

/** Relative demand per calendar month, January first (invented; common practice, no source). */
const SEASON = [0.5, 0.65, 1.05, 1.45, 1.55, 1.3, 1.05, 0.9, 0.95, 0.85, 0.65, 0.45];
/** Jobs booked in on an average weekday at a season weight of 1. */
const JOBS_PER_DAY = 2.1;
/** How often each family comes in, relative to the others. */
const FAMILY_WEIGHT: Record<string, number> = {
  'QV-54A': 1.5,
  'BT-72': 1.2,
  'GR-9W': 0.8,
  'OR-250L': 0.7,
  'FH-4A': 0.45,
  'MB-350': 1.0,
  'WY-600': 0.6,
};
/** Which step a worn cylinder goes to, by position in the family's series (STD = a new piston only). */
const STEP_WEIGHT = [0.12, 0.38, 0.24, 0.14, 0.08, 0.04];
/** Steps from this position up sold only in the first months: they sit on the shelf now. */
const SLOW_FROM_POSITION = 4;
const SLOW_MONTHS = 3;

const FIRST_NAMES = [
  'Ardo',
  'Bexa',
  'Corvin',
  'Dalla',
  'Emrik',
  'Fenna',
  'Gorin',
  'Halsey',
  'Ivo',
  'Jessamy',
  'Kellan',
  'Liesl',
  'Marek',
  'Nolwenn',
  'Osric',
  'Pella',
  'Quill',
  'Rosalind',
  'Sten',
  'Tamsin',
  'Ulric',
  'Vesna',
  'Wendel',
  'Yara',
];
const LAST_NAMES = [
  'Ashgrove',
  'Brackwater',
  'Cindermoor',
  'Dunleavy',
  'Eskerby',
  'Fallowfield',
  'Greyhollow',
  'Hartsmere',
  'Inchcombe',
  'Juniperwell',
  'Kestrelton',
  'Larkspur',
  'Mossbank',
  'Nethercott',
  'Oakhurst',
  'Pennyroyal',
  'Quarrendon',
  'Rushbrook',
  'Saltmarsh',
  'Thistlewood',
];
const ASKED_FOR = [
  'Rebore and new piston',
  'Bore to the next oversize, hone, new rings',
  'Hone and new rings if it cleans up',
  'Rebore for the winter rebuild',
  'Race prep: bore and hone',
  'Check wear, bore if needed',
];

interface PartRow {
  id: string;
  sku: string;
  kind: 'piston' | 'rings' | 'kit' | 'other';
  family_code: string | null;
  step_id: string | null;
  position: number | null;
  offset_nm: number | null;
  material: string | null;
  sale_price: string;
  average_cost: string;
}

interface FamilyInfo {
  id: string;
  code: string;
  cylinders: number;
  standardNm: Nm;
  clearanceMidNm: Nm;
  cleanupNm: Nm;
  ringGapMidNm: Nm;
  inch: boolean;
  steps: { id: string; position: number; offsetNm: Nm }[];
}

/** One part a job needs, on one cylinder (job-wide parts sit on cylinder 1). */
interface Need {
  job: Job;
  cylinder: number;
  part: PartRow;
  quantity: number;
  holdAt: number;
  unitId?: string;
  holdId: string;
  waitedFrom?: number;
}

interface Job {
  id: string;
  family: FamilyInfo;
  createdAt: number;
  measuredAt: number;
  closedAt: number;
  customer: string;
  askedFor: string;
  cylinders: { n: number; stepId: string; offsetNm: Nm; largestNm: Nm }[];
  needs: Need[];
}

function lengthNm(text: string): Nm {
  const [value, unit] = text.split(' ');
  return unit === 'in' ? inToNm(value) : mmToNm(value);
}

function pick<T>(random: () => number, items: readonly T[], weights: readonly number[]): T {
  const total = weights.reduce((a, b) => a + b, 0);
  let r = random() * total;
  for (let i = 0; i < items.length; i++) {
    r -= weights[i];
    if (r < 0) return items[i];
  }
  return items[items.length - 1];
}

/** A version-4 style id from the seeded sequence, so every run makes the same rows. */
function seededUuid(random: () => number): string {
  const hex = Array.from({ length: 32 }, () => Math.floor(random() * 16).toString(16));
  hex[12] = '4';
  hex[16] = ((parseInt(hex[16], 16) & 0x3) | 0x8).toString(16);
  const h = hex.join('');
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-${h.slice(12, 16)}-${h.slice(16, 20)}-${h.slice(20)}`;
}

/** Cost of a past delivery: a little cheaper the further back (about 3 % a year), ± a few percent. */
function pastCost(current: string, at: number, today: number, random: () => number): string {
  const years = (today - at) / (365 * DAY);
  const base = new Decimal(current === '0' || current === '0.0000' ? '10' : current);
  const factor = new Decimal(1 - 0.03 * years + (random() - 0.5) * 0.08);
  return base.times(factor).toDecimalPlaces(2).toFixed(2);
}

/** The price charged then: today's price, or 5 % less (rounded to 0.50) before last price rise. */
function pastPrice(current: string, at: number, today: number): string {
  if (today - at < 240 * DAY) return new Decimal(current).toFixed(2);
  return new Decimal(current).times(0.95).times(2).toDecimalPlaces(0).dividedBy(2).toFixed(2);
}

export interface HistorySummary {
  jobs: number;
  issues: number;
  shortages: number;
  from: string;
}

export async function seedDemoHistory(knex: Knex, now: Date = new Date()): Promise<HistorySummary> {
  const random = seededRandom(20250301);
  const today = Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate());
  const start = Date.UTC(now.getUTCFullYear(), now.getUTCMonth() - 16, 1);
  // Jobs are booked in up to a few days back, so each is collected before today.
  const lastIntake = today - 4 * DAY;

  const machinist = await knex('users').where({ role: 'machinist' }).orderBy('email').first();
  const staff = await knex('users').where({ role: 'staff' }).orderBy('email').first();
  const parts: PartRow[] = await knex('parts as p')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as ss', 'ss.id', 'p.step_id')
    .select(
      'p.id',
      'p.sku',
      'p.kind',
      'f.code as family_code',
      'p.step_id',
      'ss.position',
      'ss.offset_nm',
      'p.material',
      'p.sale_price',
      'p.average_cost',
    )
    .orderBy('p.sku');
  const bySku = new Map(parts.map((p) => [p.sku, p]));
  const familyRows = await knex('engine_families')
    .select('id', 'code', 'cylinders', 'step_series_id', 'max_oversize_nm')
    .orderBy('code');
  const families: FamilyInfo[] = [];
  for (const f of familyRows) {
    const spec = DEMO_FAMILIES.find((d) => d.code === f.code);
    if (!spec) continue;
    const steps = await knex('series_steps')
      .select('id', 'position', 'offset_nm as offsetNm')
      .where({ series_id: f.step_series_id })
      .andWhere('offset_nm', '<=', f.max_oversize_nm)
      .orderBy('position');
    families.push({
      id: f.id,
      code: f.code,
      cylinders: f.cylinders,
      standardNm: lengthNm(spec.standardBore),
      clearanceMidNm: Math.round((lengthNm(spec.clearanceMin) + lengthNm(spec.clearanceMax)) / 2),
      cleanupNm: lengthNm(spec.cleanup),
      ringGapMidNm: Math.round((lengthNm(spec.ringGapMin) + lengthNm(spec.ringGapMax)) / 2),
      inch: spec.series === 'imperial' || spec.series === 'imperial060',
      steps,
    });
  }
  if (families.length === 0) throw new Error('history seed: the demo catalog is missing');

  const partFor = (family: FamilyInfo, kind: 'piston' | 'rings', stepId: string, variant: string) =>
    parts.find(
      (p) =>
        p.family_code === family.code &&
        p.kind === kind &&
        p.step_id === stepId &&
        (kind === 'piston' ? p.material === variant : p.sku.includes(`-R${variant}-`)),
    );

  // ---- 1. Jobs and what each needed ------------------------------------------------------------
  const jobs: Job[] = [];
  for (let day = start; day <= lastIntake; day += DAY) {
    const date = new Date(day);
    const weekday = date.getUTCDay();
    if (weekday === 0) continue; // closed on Sundays
    const expected = JOBS_PER_DAY * SEASON[date.getUTCMonth()] * (weekday === 6 ? 0.4 : 1);
    const count = Math.floor(expected + random());
    for (let j = 0; j < count; j++) {
      const family = pick(
        random,
        families,
        families.map((f) => FAMILY_WEIGHT[f.code] ?? 1),
      );
      const early = day - start < SLOW_MONTHS * 30 * DAY;
      const steps = family.steps.filter((s) => early || s.position < SLOW_FROM_POSITION);
      const step = pick(
        random,
        steps,
        steps.map((s) => STEP_WEIGHT[s.position] ?? 0.02),
      );
      const createdAt = day + 8 * HOUR + Math.floor(random() * 8 * HOUR);
      const measuredAt = createdAt + DAY + Math.floor(random() * DAY);
      const job: Job = {
        id: seededUuid(random),
        family,
        createdAt,
        measuredAt,
        closedAt: 0,
        customer: `${FIRST_NAMES[Math.floor(random() * FIRST_NAMES.length)]} ${
          LAST_NAMES[Math.floor(random() * LAST_NAMES.length)]
        }`,
        askedFor: ASKED_FOR[Math.floor(random() * ASKED_FOR.length)],
        cylinders: [],
        needs: [],
      };
      for (let n = 1; n <= family.cylinders; n++) {
        // A set usually goes to one step; now and then one cylinder needs the next.
        const next = family.steps.find((s) => s.position === step.position + 1);
        const own = n > 1 && next && random() < 0.12 ? next : step;
        const wornNm = Math.round((0.005 + random() * 0.025) * 1_000_000);
        job.cylinders.push({
          n,
          stepId: own.id,
          offsetNm: own.offsetNm,
          largestNm: family.standardNm + own.offsetNm - family.cleanupNm - wornNm,
        });
        const material =
          partFor(family, 'piston', own.id, 'forged') && random() < 0.35 ? 'forged' : 'cast';
        const piston = partFor(family, 'piston', own.id, material);
        const chrome = partFor(family, 'rings', own.id, 'C');
        const rings = chrome && random() < 0.3 ? chrome : partFor(family, 'rings', own.id, 'S');
        for (const part of [piston, rings]) {
          if (part) job.needs.push({ job, cylinder: n, part, quantity: 1, holdAt: 0, holdId: '' });
        }
        for (const [key, chance] of [
          ['CLP', 0.9],
          ['PIN', 0.3],
          ['SEB', 0.2],
          ['BGK', 0.5],
        ] as const) {
          const part = bySku.get(`${family.code}-${key}`);
          if (part && random() < chance) {
            job.needs.push({ job, cylinder: n, part, quantity: 1, holdAt: 0, holdId: '' });
          }
        }
      }
      const gasket = bySku.get(`${family.code}-GSK`);
      if (gasket && random() < 0.7) {
        job.needs.push({ job, cylinder: 1, part: gasket, quantity: 1, holdAt: 0, holdId: '' });
      }
      const lube = bySku.get('SH-ASSY-LUBE');
      if (lube && random() < 0.35) {
        job.needs.push({ job, cylinder: 1, part: lube, quantity: 1, holdAt: 0, holdId: '' });
      }
      jobs.push(job);
    }
  }

  // ---- 2. Stock for each part: deliveries before the need, or a wait when it ran out ----------
  interface Receipt {
    at: number;
    quantity: number;
    unitCost: string;
    unitIds: string[];
  }
  const receipts = new Map<string, Receipt[]>();
  const needsByPart = new Map<string, Need[]>();
  for (const job of jobs) {
    for (const need of job.needs) {
      const list = needsByPart.get(need.part.id) ?? [];
      list.push(need);
      needsByPart.set(need.part.id, list);
    }
  }
  // Parts in SKU order (ids differ from run to run), so the seeded sequence is drawn the same way.
  const skuOf = (id: string) => (parts.find((p) => p.id === id) as PartRow).sku;
  const bySkuOrder = ([a]: [string, unknown], [b]: [string, unknown]) =>
    skuOf(a) < skuOf(b) ? -1 : 1;
  for (const [partId, needs] of [...needsByPart.entries()].sort(bySkuOrder)) {
    needs.sort((a, b) => a.job.measuredAt - b.job.measuredAt || a.cylinder - b.cylinder);
    const part = needs[0].part;
    let remaining = needs.reduce((n, x) => n + x.quantity, 0);
    let free = 0;
    let lastReceipt = start - 20 * DAY;
    const list: Receipt[] = [];
    // The first oversize of the old air-cooled families is hard to get: jobs often wait for it.
    const scarce =
      part.kind === 'piston' &&
      part.position === 1 &&
      (part.family_code === 'QV-54A' || part.family_code === 'BT-72')
        ? 0.45
        : part.kind === 'piston'
          ? 0.06
          : 0;
    for (const need of needs) {
      const needAt = need.job.measuredAt;
      if (free < need.quantity) {
        const batchSize =
          part.kind === 'piston'
            ? 1 + Math.floor(random() * 4)
            : part.kind === 'rings'
              ? 2 + Math.floor(random() * 5)
              : 4 + Math.floor(random() * 12);
        const quantity = Math.max(need.quantity - free, Math.min(batchSize, remaining - free));
        const lead = (5 + Math.floor(random() * 17)) * DAY;
        const waits = random() < scarce && needAt + lead + 2 * DAY < today - DAY;
        const at = waits
          ? needAt + lead
          : Math.max(lastReceipt + HOUR, needAt - (1 + Math.floor(random() * 4)) * DAY);
        lastReceipt = at;
        const unitIds =
          part.kind === 'piston' ? Array.from({ length: quantity }, () => seededUuid(random)) : [];
        list.push({
          at,
          quantity,
          unitCost: pastCost(part.average_cost, at, today, random),
          unitIds,
        });
        free += quantity;
      }
      const arrived = list[list.length - 1].at;
      need.holdAt = Math.max(needAt + HOUR, arrived + 2 * HOUR);
      // Nothing on the shelf when the step was chosen: the job waited for the delivery.
      if (part.kind === 'piston' && need.holdAt - needAt > DAY) need.waitedFrom = needAt;
      free -= need.quantity;
      remaining -= need.quantity;
    }
    receipts.set(partId, list);
  }

  // Pistons: each delivery's units in order, taken one per need.
  for (const [partId, needs] of needsByPart) {
    const units = (receipts.get(partId) ?? []).flatMap((r) => r.unitIds);
    if (units.length === 0) continue;
    needs.forEach((need, i) => {
      need.unitId = units[i];
    });
  }
  for (const job of jobs) {
    const lastHold = Math.max(...job.needs.map((n) => n.holdAt), job.measuredAt);
    job.closedAt = Math.min(lastHold + (2 + Math.floor(random() * 4)) * DAY, today - 2 * HOUR);
    for (const need of job.needs) need.holdId = seededUuid(random);
  }

  // ---- 3. Rows ----------------------------------------------------------------------------------
  const iso = (ms: number) => new Date(ms).toISOString();
  const numbers: number[] = (
    await knex.raw(`SELECT nextval('job_number_seq') AS n FROM generate_series(1, ?)`, [
      jobs.length,
    ])
  ).rows.map((r: { n: number }) => Number(r.n));
  jobs.sort((a, b) => a.createdAt - b.createdAt);

  // One customer record per invented name, so a regular's past jobs sit under one customer.
  const names = [...new Set(jobs.map((j) => j.customer))].sort();
  const customerIds = new Map<string, string>();
  for (let i = 0; i < names.length; i += 500) {
    const rows: { id: string; name: string }[] = await knex('customers')
      .insert(names.slice(i, i + 500).map((name) => ({ name, accepts_email: false })))
      .returning(['id', 'name']);
    for (const row of rows) customerIds.set(row.name, row.id);
  }

  const jobRows = jobs.map((job, i) => {
    const d = new Date(job.createdAt);
    const yymm = `${String(d.getUTCFullYear()).slice(2)}${String(d.getUTCMonth() + 1).padStart(2, '0')}`;
    return {
      id: job.id,
      number: `CY-${yymm}-${String(numbers[i]).padStart(4, '0')}`,
      customer_id: customerIds.get(job.customer),
      customer_name: job.customer,
      family_id: job.family.id,
      cylinders: job.family.cylinders,
      asked_for: job.askedFor,
      state: 'handed_back',
      notify_customer: false,
      created_by: staff?.id ?? null,
      created_at: iso(job.createdAt),
      updated_at: iso(job.closedAt),
      state_changed_at: iso(job.closedAt),
      closed_at: iso(job.closedAt),
    };
  });
  const cylinderRows = jobs.flatMap((job) =>
    job.cylinders.map((c) => {
      const piston = job.needs.find((n) => n.cylinder === c.n && n.part.kind === 'piston');
      const cutAt = Math.min((piston?.holdAt ?? job.measuredAt) + 20 * HOUR, job.closedAt - HOUR);
      const boreNm = job.family.standardNm + c.offsetNm;
      return {
        job_id: job.id,
        n: c.n,
        largest_nm: c.largestNm,
        taper_nm: Math.round(random() * 0.02 * 1_000_000),
        out_of_round_nm: Math.round(random() * 0.015 * 1_000_000),
        measured_at: iso(job.measuredAt),
        measured_by: machinist?.id ?? null,
        chosen_step_id: c.stepId,
        cut_at: iso(cutAt),
        cut_by: machinist?.id ?? null,
        measured_after_hone_nm: boreNm,
        ring_gap_nm: job.family.ringGapMidNm,
      };
    }),
  );

  const unitRows: Record<string, unknown>[] = [];
  const ledgerRows: Record<string, unknown>[] = [];
  const holdRows: Record<string, unknown>[] = [];
  const shortageRows: Record<string, unknown>[] = [];
  const needByUnit = new Map<string, Need>();
  for (const job of jobs) for (const n of job.needs) if (n.unitId) needByUnit.set(n.unitId, n);

  for (const [partId, list] of [...receipts.entries()].sort(bySkuOrder)) {
    const part = parts.find((p) => p.id === partId) as PartRow;
    const needs = needsByPart.get(partId) ?? [];
    // Receipts and issues in time order give the moving average at each issue.
    type Event = { at: number; receipt?: Receipt; need?: Need };
    const events: Event[] = [
      ...list.map((r): Event => ({ at: r.at, receipt: r })),
      ...needs.map((n): Event => ({ at: n.job.closedAt, need: n })),
    ].sort((a, b) => a.at - b.at || (a.receipt ? -1 : 1));
    let state: ValuedReceipt = { quantity: 0, value: '0', averageCost: '0' };
    for (const e of events) {
      if (e.receipt) {
        state = receiptValue(state, e.receipt.quantity, e.receipt.unitCost);
        const ref = seededUuid(random);
        if (part.kind === 'piston') {
          for (const unitId of e.receipt.unitIds) {
            const need = needByUnit.get(unitId) as Need;
            const family = need.job.family;
            const grid = family.inch ? 2540 : 1000;
            const spread = (random() - 0.5) * 2 * (family.inch ? 5 * 2540 : 8000);
            const skirt =
              family.standardNm + (part.offset_nm ?? 0) - family.clearanceMidNm + spread;
            unitRows.push({
              id: unitId,
              part_id: partId,
              skirt_nm: Math.round(skirt / grid) * grid,
              status: 'issued',
              held_for_job_id: need.job.id,
              held_cylinder: need.cylinder,
              hold_id: need.holdId,
              received_at: iso(e.receipt.at),
              measured_at: iso(e.receipt.at + HOUR),
              unit_cost: e.receipt.unitCost,
              updated_at: iso(need.job.closedAt),
            });
            ledgerRows.push({
              at: iso(e.receipt.at),
              user_id: staff?.id ?? null,
              part_id: partId,
              unit_id: unitId,
              kind: 'receipt',
              quantity: 1,
              unit_cost: e.receipt.unitCost,
              ref,
            });
          }
        } else {
          ledgerRows.push({
            at: iso(e.receipt.at),
            user_id: staff?.id ?? null,
            part_id: partId,
            kind: 'receipt',
            quantity: e.receipt.quantity,
            unit_cost: e.receipt.unitCost,
            ref,
          });
        }
      } else if (e.need) {
        const need = e.need;
        const cost = issueAtCost(state, need.quantity);
        state = {
          quantity: cost.quantity,
          value:
            cost.quantity === 0 ? '0' : new Decimal(state.value).minus(cost.issuedValue).toFixed(),
          averageCost: cost.averageCost,
        };
        holdRows.push({
          id: need.holdId,
          job_id: need.job.id,
          cylinder: need.cylinder,
          part_id: partId,
          unit_id: need.unitId ?? null,
          quantity: need.quantity,
          expires_at: iso(need.holdAt + 14 * DAY),
          created_at: iso(need.holdAt),
          created_by: machinist?.id ?? null,
          released_at: iso(need.job.closedAt),
          release_reason: 'issued',
          released_by: staff?.id ?? null,
        });
        ledgerRows.push({
          at: iso(need.holdAt),
          user_id: machinist?.id ?? null,
          part_id: partId,
          unit_id: need.unitId ?? null,
          kind: 'reservation',
          quantity: 0,
          held_delta: need.quantity,
          job_id: need.job.id,
          ref: need.holdId,
        });
        ledgerRows.push({
          at: iso(need.job.closedAt),
          user_id: staff?.id ?? null,
          part_id: partId,
          unit_id: need.unitId ?? null,
          kind: 'issue',
          quantity: -need.quantity,
          held_delta: -need.quantity,
          unit_cost: cost.averageCost,
          sale_price: pastPrice(part.sale_price, need.job.closedAt, today),
          job_id: need.job.id,
          reason: `handed back, cylinder ${need.cylinder}`,
          ref: need.holdId,
        });
        if (need.waitedFrom !== undefined) {
          shortageRows.push({
            at: iso(need.waitedFrom),
            family_id: need.job.family.id,
            step_id: part.step_id,
            job_id: need.job.id,
            cylinder: need.cylinder,
            source: 'step_chosen',
            user_id: machinist?.id ?? null,
          });
        }
      }
    }
    if (state.quantity !== 0) throw new Error(`history seed: ${part.sku} does not net to zero`);
  }

  const eventRows = jobs.map((job) => ({
    job_id: job.id,
    at: iso(job.closedAt),
    user_id: staff?.id ?? null,
    kind: 'state',
    text: `Handed back. Issued: ${job.needs.map((n) => n.part.sku).join(', ')}.`.slice(0, 2000),
  }));

  await knex.transaction(async (trx) => {
    const insert = (table: string, rows: readonly object[]) =>
      knex.batchInsert(table, rows as Record<string, unknown>[], 1000).transacting(trx);
    await insert('jobs', jobRows);
    await insert('job_cylinders', cylinderRows);
    await insert('job_events', eventRows);
    await insert('piston_units', unitRows);
    await insert('holds', holdRows);
    await insert('stock_ledger', ledgerRows);
    await insert('step_shortages', shortageRows);
  });

  return {
    jobs: jobs.length,
    issues: ledgerRows.filter((r) => r.kind === 'issue').length,
    shortages: shortageRows.length,
    from: iso(start).slice(0, 10),
  };
}
