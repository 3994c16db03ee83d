// The boring bar's passes. A worn bore is widest in the ring travel and close to its standard size
// below it, so the bar cuts deepest where the bore is least worn: every pass is planned from the
// smallest reading, and no pass may take more than the shop's largest cut there. Each size the
// machinist sets is on the grid the bar's dial reads (0.0001 in, 0.001 mm or 0.0005 in), and no pass
// is lighter than the shop's smallest cut, which a bar cannot hold reliably.
// Every size and cut is on the diameter.
import { isNm, NM_PER_IN, NM_PER_MM } from './lengths';
import type { LengthUnit, Nm } from './lengths';

/** The resolutions boring bars are read at. */
export type BarResolution = '0.0001 in' | '0.001 mm' | '0.0005 in';
export const BAR_RESOLUTIONS: readonly BarResolution[] = ['0.0001 in', '0.001 mm', '0.0005 in'];

/** One step of the bar's dial in nanometres: 0.0001 in = 2540 nm, 0.001 mm = 1000 nm, 0.0005 in = 12 700 nm. */
export function barGridNm(resolution: BarResolution): Nm {
  switch (resolution) {
    case '0.0001 in':
      return NM_PER_IN / 10_000;
    case '0.001 mm':
      return NM_PER_MM / 1000;
    case '0.0005 in':
      return NM_PER_IN / 2000;
  }
  throw new PassPlanError(`Unknown bar resolution "${String(resolution)}".`);
}

/** The unit the bar's dial reads in. */
export function barUnit(resolution: BarResolution): LengthUnit {
  return resolution.endsWith('mm') ? 'mm' : 'in';
}

export function gridDown(nm: Nm, gridNm: Nm): Nm {
  return Math.floor(nm / gridNm) * gridNm;
}

export function gridNearest(nm: Nm, gridNm: Nm): Nm {
  return Math.round(nm / gridNm) * gridNm;
}

/**
 * Where the passes start: the smallest reading when the bottom of the bore (below the ring travel) was
 * read; otherwise the standard bore, unless a reading is smaller still.
 */
export function passStartNm(
  readings: ReadonlyArray<{ depth: string; nm: Nm }>,
  standardBoreNm: Nm,
): { nm: Nm; from: 'readings' | 'standard' } {
  const smallest = readings.length > 0 ? Math.min(...readings.map((r) => r.nm)) : null;
  if (
    smallest !== null &&
    (readings.some((r) => r.depth === 'bottom') || smallest <= standardBoreNm)
  ) {
    return { nm: smallest, from: 'readings' };
  }
  return { nm: standardBoreNm, from: 'standard' };
}

export type PassKind = 'truing' | 'roughing' | 'finish';

export interface Pass {
  kind: PassKind;
  /** The size the bar is set to for this pass (on the bar's grid). */
  sizeNm: Nm;
  /** Depth of this cut where the bore is least worn: the deepest it cuts anywhere. */
  cutUnwornNm: Nm;
  /** Depth of this cut where the bore is most worn (0 while the bar has not reached the wear). */
  cutWornNm: Nm;
}

export interface PassPlanInput {
  /** The smallest reading, or the standard bore when there are no readings below the ring travel. */
  smallestNm: Nm;
  largestNm: Nm;
  /** The last pass; must be on the grid. */
  boreToNm: Nm;
  /** Deepest cut allowed anywhere in the bore. */
  maxCutNm: Nm;
  /** Lightest cut the bar takes reliably. */
  minCutNm: Nm;
  gridNm: Nm;
  /** A light last pass for the finish. */
  finishPassNm?: Nm;
  /** A light first pass that shows the bore's shape before the real cuts. */
  truingPassNm?: Nm;
}

export interface PassPlan {
  passes: Pass[];
  /** What was left out and why (a truing or finish pass that did not fit). */
  notes: string[];
  /** Why no passes can be planned; passes is then empty. */
  error?: string;
}

export class PassPlanError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PassPlanError';
  }
}

export const MAX_PASSES = 50;

export function planPasses(input: PassPlanInput): PassPlan {
  validate(input);
  const { smallestNm, largestNm, boreToNm, maxCutNm, minCutNm } = input;
  const total = boreToNm - smallestNm;
  if (total <= 0)
    return { passes: [], notes: [], error: 'the bore is already at or past the bore-to size' };
  if (minCutNm > maxCutNm) {
    return {
      passes: [],
      notes: [],
      error: 'the smallest cut is larger than the largest cut per pass',
    };
  }
  if (total < minCutNm) {
    return {
      passes: [],
      notes: [],
      error:
        'what is left to cut is lighter than the smallest cut the bar takes; hone to size instead',
    };
  }
  const finish = input.finishPassNm;
  const truing = input.truingPassNm;
  if (finish !== undefined && finish > maxCutNm) {
    return {
      passes: [],
      notes: [],
      error: 'the finish pass is deeper than the largest cut per pass',
    };
  }
  if (truing !== undefined && truing > maxCutNm) {
    return {
      passes: [],
      notes: [],
      error: 'the truing pass is deeper than the largest cut per pass',
    };
  }

  // With the light passes first; when the bore has too little to cut for them, without them.
  const tries: Array<{ truing: boolean; finish: boolean }> = [
    { truing: truing !== undefined, finish: finish !== undefined },
    { truing: truing !== undefined, finish: false },
    { truing: false, finish: finish !== undefined },
    { truing: false, finish: false },
  ];
  let tooMany = false;
  for (const t of tries) {
    const sizes = arrange(input, t.truing, t.finish);
    if (sizes === 'too-many') {
      tooMany = true;
      continue;
    }
    if (!sizes) continue;
    const notes: string[] = [];
    if (truing !== undefined && !t.truing) notes.push('no truing pass: too little to cut for one');
    if (finish !== undefined && !t.finish)
      notes.push('no separate finish pass: too little to cut for one');
    return { passes: describe(sizes, smallestNm, largestNm), notes };
  }
  return {
    passes: [],
    notes: [],
    error: tooMany
      ? `more than ${MAX_PASSES} passes would be needed; check the largest cut per pass`
      : "no set of passes fits the largest and smallest cut on the bar's grid; check the settings",
  };
}

type Sized = { kind: PassKind; sizeNm: Nm };

function arrange(
  input: PassPlanInput,
  withTruing: boolean,
  withFinish: boolean,
): Sized[] | null | 'too-many' {
  const { smallestNm, boreToNm, maxCutNm, minCutNm, gridNm } = input;
  const head: Sized[] = [];
  let from = smallestNm;
  if (withTruing) {
    // Up to the grid, so the truing cut is at least as deep as asked.
    const size = Math.ceil((smallestNm + (input.truingPassNm ?? 0)) / gridNm) * gridNm;
    if (size - from > maxCutNm || size - from < minCutNm) return null;
    head.push({ kind: 'truing', sizeNm: size });
    from = size;
  }
  let roughTo = boreToNm;
  if (withFinish) roughTo = gridNearest(boreToNm - (input.finishPassNm ?? 0), gridNm);
  if (roughTo - from < minCutNm) return null;
  const finishCut = boreToNm - roughTo;
  if (withFinish && (finishCut < minCutNm || finishCut > maxCutNm)) return null;
  const rough = equalPasses(from, roughTo, maxCutNm, minCutNm, gridNm, MAX_PASSES - head.length);
  if (rough === null || rough === 'too-many') return rough;
  const sizes = [...head, ...rough.map((sizeNm): Sized => ({ kind: 'roughing', sizeNm }))];
  if (withFinish) sizes.push({ kind: 'finish', sizeNm: boreToNm });
  return sizes;
}

/**
 * The fewest near-equal passes from `from` to `to` (on the grid), none deeper than maxCut nor lighter
 * than minCut. Intermediate sizes go to the nearest grid line, which can make one cut a grid step deeper
 * than an equal share, so a pass is added when that breaks the limit.
 */
function equalPasses(
  from: Nm,
  to: Nm,
  maxCut: Nm,
  minCut: Nm,
  grid: Nm,
  maxPasses: number,
): Nm[] | null | 'too-many' {
  const total = to - from;
  for (let n = Math.max(1, Math.ceil(total / maxCut)); ; n++) {
    if (n > maxPasses) return 'too-many';
    if (total / n < minCut) return null;
    const sizes: Nm[] = [];
    for (let i = 1; i < n; i++) sizes.push(gridNearest(from + (total * i) / n, grid));
    sizes.push(to);
    let previous = from;
    const fits = sizes.every((size) => {
      const cut = size - previous;
      previous = size;
      return cut >= minCut && cut <= maxCut;
    });
    if (fits) return sizes;
  }
}

function describe(sizes: Sized[], smallestNm: Nm, largestNm: Nm): Pass[] {
  let unworn = smallestNm;
  let worn = largestNm;
  return sizes.map(({ kind, sizeNm }) => {
    const pass = {
      kind,
      sizeNm,
      cutUnwornNm: sizeNm - unworn,
      cutWornNm: Math.max(0, sizeNm - worn),
    };
    unworn = sizeNm;
    worn = Math.max(worn, sizeNm);
    return pass;
  });
}

function validate(input: PassPlanInput): void {
  const positive: Array<[string, Nm]> = [
    ['smallest bore', input.smallestNm],
    ['largest bore', input.largestNm],
    ['bore-to size', input.boreToNm],
    ['largest cut per pass', input.maxCutNm],
    ['smallest cut per pass', input.minCutNm],
    ['bar resolution', input.gridNm],
  ];
  for (const [name, nm] of positive) {
    if (!isNm(nm) || nm <= 0) throw new PassPlanError(`The ${name} must be a positive length.`);
  }
  for (const [name, nm] of [
    ['finish pass', input.finishPassNm],
    ['truing pass', input.truingPassNm],
  ] as const) {
    if (nm !== undefined && (!isNm(nm) || nm <= 0)) {
      throw new PassPlanError(`The ${name} must be a positive length.`);
    }
  }
  if (input.largestNm < input.smallestNm) {
    throw new PassPlanError('The largest reading is smaller than the smallest.');
  }
  if (input.boreToNm % input.gridNm !== 0) {
    throw new PassPlanError("The bore-to size must be on the bar's grid.");
  }
}
