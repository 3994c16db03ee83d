// The demo shop's catalog and stock: invented engine families on metric and imperial step series,
// their pistons, ring sets, kits and small parts, bins, and measured pistons on the shelf. Built
// through the same service code as the API (so receipts write ledger, levels, average cost and
// audit rows exactly as a person receiving would), from a seeded pseudo-random sequence so every
// run gives the same shop. Later seeds (jobs, sales history) read the ids with readDemoCatalog().
import type { Knex } from 'knex';
import { gtinCheckDigit } from '../../shared/gtin';
import { formatIn, formatMm, inToNm, mmToNm, type Nm } from '../../shared/lengths';
import { METRIC_SERIES, IMPERIAL_SERIES, IMPERIAL_SERIES_060 } from '../../shared/step-series';
import type { PartInput, StrokeType, Cooling } from '../../shared/api/catalog';
import { createFamily, createPart, createStepSeries } from '../../server/catalog/catalog-service';
import { createBin, receive } from '../../server/stock/stock-service';

/** mulberry32: a small, well-known 32-bit PRNG; plenty for demo data, the same sequence every run. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type SeriesKey = 'metric' | 'imperial' | 'imperial060' | 'metricHalf';

export interface DemoFamilySpec {
  code: string;
  name: string;
  strokeType: StrokeType;
  cylinders: number;
  cooling: Cooling;
  series: SeriesKey;
  /** Lengths as the maker's sheet gives them. */
  standardBore: string;
  stroke: string;
  clearanceMin: string;
  clearanceMax: string;
  honeAllowance: string;
  cleanup: string;
  maxOversize: string;
  maxTaper: string;
  maxOutOfRound: string;
  ringGapMin: string;
  ringGapMax: string;
  pinDiameter: string;
  ringCount: number;
  /** Forged pistons are stocked next to the cast ones. */
  forged: boolean;
  /** A second ring set (chrome-faced top ring) is stocked. */
  chromeRings: boolean;
  kits: boolean;
  /** Pistons on the shelf per step, STD first, before the shop's history took its toll. */
  unitsPerStep: number[];
  notes: string;
}

const SERIES: Record<
  SeriesKey,
  { code: string; name: string; unit: 'mm' | 'in'; offsets: string[] }
> = {
  metric: {
    code: 'MET-025',
    name: 'Metric, 0.25 mm steps to +1.00 mm',
    unit: 'mm',
    offsets: METRIC_SERIES.map((s) => `${formatMm(s.offsetNm)} mm`),
  },
  imperial: {
    code: 'IMP-010',
    name: 'Imperial, 0.010 in steps to +0.040 in',
    unit: 'in',
    offsets: IMPERIAL_SERIES.map((s) => `${formatIn(s.offsetNm)} in`),
  },
  imperial060: {
    code: 'IMP-060',
    name: 'Imperial, 0.010 in steps to +0.040 in, then +0.060 in',
    unit: 'in',
    offsets: IMPERIAL_SERIES_060.map((s) => `${formatIn(s.offsetNm)} in`),
  },
  metricHalf: {
    code: 'MET-050',
    name: 'Metric racing, 0.50 mm steps to +1.50 mm (our own)',
    unit: 'mm',
    offsets: ['0', '0.50', '1.00', '1.50'],
  },
};

// Invented engines: no real maker, model or code. The older air-cooled two-strokes have their
// first oversizes nearly gone (every worn cylinder wants them first); larger steps sit fuller.
export const DEMO_FAMILIES: DemoFamilySpec[] = [
  {
    code: 'QV-54A',
    name: 'Quivane 54 air-cooled single',
    strokeType: 'two',
    cylinders: 1,
    cooling: 'air',
    series: 'metric',
    standardBore: '54.00 mm',
    stroke: '54.50 mm',
    clearanceMin: '0.040 mm',
    clearanceMax: '0.055 mm',
    honeAllowance: '0.020 mm',
    cleanup: '0.05 mm',
    maxOversize: '1.00 mm',
    maxTaper: '0.05 mm',
    maxOutOfRound: '0.05 mm',
    ringGapMin: '0.15 mm',
    ringGapMax: '0.35 mm',
    pinDiameter: '14.00 mm',
    ringCount: 2,
    forged: false,
    chromeRings: false,
    kits: true,
    unitsPerStep: [4, 1, 6, 12, 16],
    notes: 'Out of production for decades; every first-oversize piston is precious.',
  },
  {
    code: 'BT-72',
    name: 'Brevik 72 air-cooled twin',
    strokeType: 'two',
    cylinders: 2,
    cooling: 'air',
    series: 'metric',
    standardBore: '72.00 mm',
    stroke: '61.00 mm',
    clearanceMin: '0.050 mm',
    clearanceMax: '0.065 mm',
    honeAllowance: '0.020 mm',
    cleanup: '0.05 mm',
    maxOversize: '1.00 mm',
    maxTaper: '0.06 mm',
    maxOutOfRound: '0.05 mm',
    ringGapMin: '0.20 mm',
    ringGapMax: '0.40 mm',
    pinDiameter: '18.00 mm',
    ringCount: 2,
    forged: false,
    chromeRings: true,
    kits: true,
    unitsPerStep: [6, 0, 8, 16, 20],
    notes: 'Twins arrive as a pair; measure and fit each cylinder on its own.',
  },
  {
    code: 'GR-9W',
    name: 'Grellan 9 water-cooled outboard twin',
    strokeType: 'two',
    cylinders: 2,
    cooling: 'liquid',
    series: 'imperial',
    standardBore: '2.1875 in',
    stroke: '1.8125 in',
    clearanceMin: '0.0035 in',
    clearanceMax: '0.0050 in',
    honeAllowance: '0.0010 in',
    cleanup: '0.0020 in',
    maxOversize: '0.030 in',
    maxTaper: '0.0020 in',
    maxOutOfRound: '0.0020 in',
    ringGapMin: '0.0060 in',
    ringGapMax: '0.0160 in',
    pinDiameter: '0.5000 in',
    ringCount: 2,
    forged: false,
    chromeRings: false,
    kits: false,
    unitsPerStep: [5, 1, 9, 14],
    notes: 'Salt-water engines: check the water jacket before boring.',
  },
  {
    code: 'OR-250L',
    name: 'Ortelle 250 liquid-cooled racing single',
    strokeType: 'two',
    cylinders: 1,
    cooling: 'liquid',
    series: 'metricHalf',
    standardBore: '66.40 mm',
    stroke: '72.00 mm',
    clearanceMin: '0.060 mm',
    clearanceMax: '0.075 mm',
    honeAllowance: '0.015 mm',
    cleanup: '0.04 mm',
    maxOversize: '1.50 mm',
    maxTaper: '0.03 mm',
    maxOutOfRound: '0.03 mm',
    ringGapMin: '0.25 mm',
    ringGapMax: '0.45 mm',
    pinDiameter: '18.00 mm',
    ringCount: 1,
    forged: true,
    chromeRings: false,
    kits: true,
    unitsPerStep: [8, 10, 9, 6],
    notes: "Forged pistons grow more when hot: use the forged clearance on the maker's sheet.",
  },
  {
    code: 'FH-4A',
    name: 'Fenhollow air-cooled flat four',
    strokeType: 'four',
    cylinders: 4,
    cooling: 'air',
    series: 'imperial060',
    standardBore: '3.3750 in',
    stroke: '2.7500 in',
    clearanceMin: '0.0010 in',
    clearanceMax: '0.0020 in',
    honeAllowance: '0.0015 in',
    cleanup: '0.0020 in',
    maxOversize: '0.060 in',
    maxTaper: '0.0030 in',
    maxOutOfRound: '0.0020 in',
    ringGapMin: '0.0100 in',
    ringGapMax: '0.0200 in',
    pinDiameter: '0.8750 in',
    ringCount: 3,
    forged: true,
    chromeRings: true,
    kits: false,
    unitsPerStep: [10, 12, 14, 12, 9, 7],
    notes: 'Sets of four: keep the four pistons of one job within 0.0005 in of each other.',
  },
  {
    code: 'MB-350',
    name: 'Marrowby 350 air-cooled single',
    strokeType: 'four',
    cylinders: 1,
    cooling: 'air',
    series: 'imperial',
    standardBore: '2.9375 in',
    stroke: '3.1250 in',
    clearanceMin: '0.0015 in',
    clearanceMax: '0.0025 in',
    honeAllowance: '0.0010 in',
    cleanup: '0.0020 in',
    maxOversize: '0.040 in',
    maxTaper: '0.0020 in',
    maxOutOfRound: '0.0015 in',
    ringGapMin: '0.0100 in',
    ringGapMax: '0.0200 in',
    pinDiameter: '0.7500 in',
    ringCount: 3,
    forged: false,
    chromeRings: false,
    kits: true,
    unitsPerStep: [9, 8, 11, 10, 8],
    notes: '',
  },
  {
    code: 'WY-600',
    name: 'Wystan 600 liquid-cooled twin',
    strokeType: 'four',
    cylinders: 2,
    cooling: 'liquid',
    series: 'metric',
    standardBore: '77.00 mm',
    stroke: '64.00 mm',
    clearanceMin: '0.030 mm',
    clearanceMax: '0.045 mm',
    honeAllowance: '0.025 mm',
    cleanup: '0.04 mm',
    maxOversize: '0.75 mm',
    maxTaper: '0.05 mm',
    maxOutOfRound: '0.05 mm',
    ringGapMin: '0.20 mm',
    ringGapMax: '0.45 mm',
    pinDiameter: '19.00 mm',
    ringCount: 3,
    forged: true,
    chromeRings: true,
    kits: false,
    unitsPerStep: [12, 10, 12, 10],
    notes: 'Plated bores on late engines cannot be bored: sleeve or replate.',
  },
];

/** Small parts every family needs; the step does not matter for them. */
const SMALL_PARTS = [
  { key: 'PIN', text: 'Piston pin', cost: [6, 14] },
  { key: 'CLP', text: 'Pin clips, pair', cost: [0.8, 2.4] },
  { key: 'GSK', text: 'Top-end gasket set', cost: [9, 24] },
  { key: 'BGK', text: 'Base gasket', cost: [2, 6] },
  { key: 'SEB', text: 'Small-end bearing', cost: [8, 18] },
] as const;

const SHOP_PARTS = [
  { sku: 'SH-ASSY-LUBE', text: 'Assembly lube, 50 ml', cost: [4, 6] },
  { sku: 'SH-RING-CMP', text: 'Ring compressor band, 50–80 mm', cost: [11, 16] },
  { sku: 'SH-BASE-SHEET', text: 'Base gasket sheet, 0.5 mm', cost: [5, 8] },
  { sku: 'SH-CLIP-ASST', text: 'Pin clip assortment box', cost: [14, 20] },
  { sku: 'SH-PIN-ASST', text: 'Small-end needle bearing assortment', cost: [30, 42] },
  { sku: 'SH-STUD-M8', text: 'Cylinder stud M8, each', cost: [1.5, 2.5] },
] as const;

export interface DemoCatalog {
  /** By family code. */
  families: Record<
    string,
    { id: string; spec: DemoFamilySpec; steps: { id: string; label: string; offsetNm: Nm }[] }
  >;
  /** By SKU. */
  parts: Record<
    string,
    { id: string; kind: PartInput['kind']; familyCode: string | null; stepLabel: string | null }
  >;
  /** By bin code. */
  bins: Record<string, string>;
  unitCount: number;
}

function money(cents: number): string {
  return `${Math.floor(cents / 100)}.${String(cents % 100).padStart(2, '0')}`;
}

/** The demo's own GTIN-13s: prefix 2 is for restricted, in-store numbering, so none is anyone's. */
function demoGtin(n: number): string {
  const body = `2${String(740_000_000_00 + n).padStart(11, '0')}`;
  return `${body}${gtinCheckDigit(body)}`;
}

function lengthNm(text: string): Nm {
  const [value, unit] = text.split(' ');
  return unit === 'in' ? inToNm(value) : mmToNm(value);
}

export async function seedDemoCatalog(knex: Knex): Promise<DemoCatalog> {
  const random = seededRandom(20261201);
  const between = (lo: number, hi: number) => lo + (hi - lo) * random();
  const cents = (lo: number, hi: number) => Math.round(between(lo, hi) * 100);
  const staff = await knex('users').where({ role: 'staff' }).orderBy('email').first();
  const owner = await knex('users').where({ role: 'owner' }).orderBy('email').first();
  const receiverId: string | null = staff?.id ?? null;
  const ownerId: string | null = owner?.id ?? null;

  const catalog: DemoCatalog = { families: {}, parts: {}, bins: {}, unitCount: 0 };

  const seriesIds: Partial<
    Record<
      SeriesKey,
      { id: string; steps: { id: string; label: string; offset: { mm: string } }[] }
    >
  > = {};
  for (const key of Object.keys(SERIES) as SeriesKey[]) {
    const s = SERIES[key];
    seriesIds[key] = await createStepSeries(
      ownerId,
      {
        code: s.code,
        name: s.name,
        unit: s.unit,
        offsets: s.offsets,
        custom: key === 'metricHalf',
      },
      knex,
    );
  }

  // Shelves: one piston bay per family, ring and small-part drawers shared.
  for (const [i, f] of DEMO_FAMILIES.entries()) {
    const code = `P-${String(i + 1).padStart(2, '0')}`;
    const bin = await createBin(ownerId, { code, name: `Pistons, ${f.name}` }, knex);
    catalog.bins[code] = bin.id;
  }
  for (let i = 1; i <= 4; i++) {
    const code = `R-${String(i).padStart(2, '0')}`;
    catalog.bins[code] = (await createBin(ownerId, { code, name: `Ring drawer ${i}` }, knex)).id;
  }
  for (let i = 1; i <= 3; i++) {
    const code = `S-${String(i).padStart(2, '0')}`;
    catalog.bins[code] = (await createBin(ownerId, { code, name: `Small parts ${i}` }, knex)).id;
  }
  catalog.bins['IN-01'] = (
    await createBin(ownerId, { code: 'IN-01', name: 'Receiving bench' }, knex)
  ).id;

  let gtinCounter = 1;
  const addPart = async (input: PartInput, familyCode: string | null, stepLabel: string | null) => {
    const part = await createPart(ownerId, input, knex);
    catalog.parts[input.sku] = { id: part.id, kind: input.kind, familyCode, stepLabel };
    return part.id;
  };

  for (const [fi, spec] of DEMO_FAMILIES.entries()) {
    const series = seriesIds[spec.series];
    if (!series) throw new Error(`series ${spec.series} missing`);
    const family = await createFamily(
      ownerId,
      {
        code: spec.code,
        name: spec.name,
        strokeType: spec.strokeType,
        cylinders: spec.cylinders,
        cooling: spec.cooling,
        standardBore: lengthNm(spec.standardBore),
        stroke: lengthNm(spec.stroke),
        clearanceMin: lengthNm(spec.clearanceMin),
        clearanceMax: lengthNm(spec.clearanceMax),
        honeAllowance: lengthNm(spec.honeAllowance),
        cleanup: lengthNm(spec.cleanup),
        maxOversize: lengthNm(spec.maxOversize),
        stepSeriesId: series.id,
        maxTaper: lengthNm(spec.maxTaper),
        maxOutOfRound: lengthNm(spec.maxOutOfRound),
        ringGapMin: lengthNm(spec.ringGapMin),
        ringGapMax: lengthNm(spec.ringGapMax),
        notes: spec.notes,
      },
      knex,
    );
    const maxOversize = lengthNm(spec.maxOversize);
    const steps = series.steps
      .map((s) => ({ id: s.id, label: s.label, offsetNm: mmToNm(s.offset.mm) }))
      .filter((s) => s.offsetNm <= maxOversize);
    catalog.families[spec.code] = { id: family.id, spec, steps };

    const pistonBin = catalog.bins[`P-${String(fi + 1).padStart(2, '0')}`];
    const ringBin = catalog.bins[`R-${String((fi % 4) + 1).padStart(2, '0')}`];
    const smallBin = catalog.bins[`S-${String((fi % 3) + 1).padStart(2, '0')}`];
    const standardBore = lengthNm(spec.standardBore);
    const clearanceMid = (lengthNm(spec.clearanceMin) + lengthNm(spec.clearanceMax)) / 2;
    const inch = spec.series === 'imperial' || spec.series === 'imperial060';
    const pistonCost = inch ? [38, 72] : [26, 64];

    // Small parts first, so kits can name them.
    const small: Record<string, string> = {};
    for (const sp of SMALL_PARTS) {
      const sku = `${spec.code}-${sp.key}`;
      const cost = cents(sp.cost[0], sp.cost[1]);
      small[sp.key] = await addPart(
        {
          kind: 'other',
          sku,
          familyId: family.id,
          description: `${sp.text}, ${spec.name}`,
          salePrice: money(Math.round((cost * 1.7) / 50) * 50),
          gtin: random() < 0.5 ? demoGtin(gtinCounter++) : undefined,
          reorderPoint: 4,
          orderUpTo: 12,
        },
        spec.code,
        null,
      );
      const quantity = 3 + Math.floor(random() * 20);
      await receive(
        receiverId,
        { partId: small[sp.key], quantity, binId: smallBin, unitCost: money(cost) },
        knex,
      );
    }

    for (const [si, step] of steps.entries()) {
      // "STD", then thousandths of an inch ("010") or hundredths of a millimetre ("025").
      const stepCode =
        step.offsetNm === 0
          ? 'STD'
          : String(Math.round(step.offsetNm / (inch ? 25_400 : 10_000))).padStart(3, '0');
      const nominal = standardBore + step.offsetNm;
      const variants: { material: 'cast' | 'forged'; share: number }[] = spec.forged
        ? [
            { material: 'cast', share: 0.65 },
            { material: 'forged', share: 0.35 },
          ]
        : [{ material: 'cast', share: 1 }];
      const unitsHere = spec.unitsPerStep[si] ?? 0;
      let left = unitsHere;
      const pistonIds: string[] = [];
      for (const [vi, variant] of variants.entries()) {
        const sku = `${spec.code}-P${variant.material === 'forged' ? 'F' : 'C'}-${stepCode}`;
        const cost =
          cents(pistonCost[0], pistonCost[1]) + (variant.material === 'forged' ? 2500 : 0);
        const firstOversize = si === 1;
        const partId = await addPart(
          {
            kind: 'piston',
            sku,
            familyId: family.id,
            stepId: step.id,
            description: `Piston ${step.label}, ${variant.material}, ${spec.name}`,
            material: variant.material,
            ringCount: spec.ringCount,
            pinDiameter: lengthNm(spec.pinDiameter),
            salePrice: money(Math.round((cost * 1.65) / 50) * 50),
            gtin: random() < 0.6 ? demoGtin(gtinCounter++) : undefined,
            reorderPoint: firstOversize ? 2 : 1,
            orderUpTo: firstOversize ? 6 : 3,
          },
          spec.code,
          step.label,
        );
        pistonIds.push(partId);
        const count = vi === variants.length - 1 ? left : Math.round(unitsHere * variant.share);
        left -= count;
        // Deliveries of one to four pistons, each measured at the bench (a few "to measure").
        let remaining = count;
        while (remaining > 0) {
          const batch = Math.min(remaining, 1 + Math.floor(random() * 4));
          remaining -= batch;
          const units = Array.from({ length: batch }, () => {
            if (random() < 0.06) return { skirt: null };
            // Pistons of one nominal size differ by a few ten-thousandths of an inch.
            const spreadNm = (random() - 0.5) * 2 * (inch ? 5 * 2540 : 8000);
            const raw = nominal - clearanceMid + spreadNm;
            const grid = inch ? 2540 : 1000; // read at 0.0001 in or 0.001 mm
            return { skirt: Math.round(raw / grid) * grid };
          });
          await receive(
            receiverId,
            {
              partId,
              quantity: batch,
              binId: pistonBin,
              unitCost: money(cost + Math.round((random() - 0.5) * 600)),
              units,
            },
            knex,
          );
          catalog.unitCount += batch;
        }
      }

      const ringVariants = spec.chromeRings ? ['standard', 'chrome-faced top ring'] : ['standard'];
      const ringIds: string[] = [];
      for (const variant of ringVariants) {
        const sku = `${spec.code}-R${variant === 'standard' ? 'S' : 'C'}-${stepCode}`;
        const cost = cents(inch ? 16 : 12, inch ? 34 : 30) + (variant === 'standard' ? 0 : 900);
        const ringId = await addPart(
          {
            kind: 'rings',
            sku,
            familyId: family.id,
            stepId: step.id,
            description: `Ring set ${step.label}, ${variant}, ${spec.name}`,
            salePrice: money(Math.round((cost * 1.7) / 50) * 50),
            gtin: random() < 0.5 ? demoGtin(gtinCounter++) : undefined,
            reorderPoint: 2,
            orderUpTo: 6,
          },
          spec.code,
          step.label,
        );
        ringIds.push(ringId);
        // Ring sets follow the pistons: a step with pistons has a few sets beside them.
        const quantity = Math.max(0, Math.round(unitsHere * 0.6 + (random() - 0.5) * 4));
        if (quantity > 0) {
          await receive(
            receiverId,
            { partId: ringId, quantity, binId: ringBin, unitCost: money(cost) },
            knex,
          );
        }
      }

      if (spec.kits) {
        await addPart(
          {
            kind: 'kit',
            sku: `${spec.code}-KIT-${stepCode}`,
            familyId: family.id,
            stepId: step.id,
            description: `Top-end kit ${step.label}: piston, rings, pin, clips, ${spec.name}`,
            salePrice: money(Math.round(between(90, 160)) * 100),
            components: [
              { partId: pistonIds[0], quantity: 1 },
              { partId: ringIds[0], quantity: 1 },
              { partId: small.PIN, quantity: 1 },
              { partId: small.CLP, quantity: 1 },
            ],
          },
          spec.code,
          step.label,
        );
      }
    }
  }

  for (const sp of SHOP_PARTS) {
    const cost = cents(sp.cost[0], sp.cost[1]);
    const id = await addPart(
      {
        kind: 'other',
        sku: sp.sku,
        description: sp.text,
        salePrice: money(Math.round((cost * 1.6) / 50) * 50),
        gtin: demoGtin(gtinCounter++),
      },
      null,
      null,
    );
    await receive(
      receiverId,
      {
        partId: id,
        quantity: 2 + Math.floor(random() * 12),
        binId: catalog.bins['S-01'],
        unitCost: money(cost),
      },
      knex,
    );
  }
  return catalog;
}

/** The seeded catalog's ids, for seeds that run after this one (jobs, sales history). */
export async function readDemoCatalog(knex: Knex): Promise<Omit<DemoCatalog, 'unitCount'>> {
  const catalog: Omit<DemoCatalog, 'unitCount'> = { families: {}, parts: {}, bins: {} };
  const families = await knex('engine_families').select(
    'id',
    'code',
    'step_series_id',
    'max_oversize_nm',
  );
  for (const f of families) {
    const spec = DEMO_FAMILIES.find((d) => d.code === f.code);
    if (!spec) continue;
    const steps = await knex('series_steps')
      .select('id', 'label', 'offset_nm')
      .where({ series_id: f.step_series_id })
      .andWhere('offset_nm', '<=', f.max_oversize_nm)
      .orderBy('position');
    catalog.families[f.code] = {
      id: f.id,
      spec,
      steps: steps.map((s) => ({ id: s.id, label: s.label, offsetNm: s.offset_nm })),
    };
  }
  const parts = await knex('parts as p')
    .leftJoin('engine_families as f', 'f.id', 'p.family_id')
    .leftJoin('series_steps as ss', 'ss.id', 'p.step_id')
    .select('p.id', 'p.sku', 'p.kind', 'f.code as family_code', 'ss.label as step_label');
  for (const p of parts) {
    catalog.parts[p.sku] = {
      id: p.id,
      kind: p.kind,
      familyCode: p.family_code,
      stepLabel: p.step_label,
    };
  }
  for (const b of await knex('bins').select('id', 'code')) catalog.bins[b.code] = b.id;
  return catalog;
}
