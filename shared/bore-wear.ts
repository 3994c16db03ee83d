// Bore wear from bore-gauge readings. A bore is measured at up to three depths (top of ring travel, middle,
// bottom) in two directions (along the piston-pin axis and at 90° to it, the thrust axis). Taper is the
// difference between depths, out-of-round the difference between directions; both are on the diameter.
import { formatLengthsApart, isNm } from './lengths';
import type { LengthUnit, Nm } from './lengths';

export type Depth = 'top' | 'middle' | 'bottom';
export type Axis = 'pin' | 'thrust';
export interface Reading {
  depth: Depth;
  axis: Axis;
  nm: Nm;
}

export const DEPTHS: readonly Depth[] = ['top', 'middle', 'bottom'];
export const AXES: readonly Axis[] = ['pin', 'thrust'];

export interface Wear {
  largest: Nm;
  smallest: Nm;
  /** Largest difference between depths along one axis (0 when no axis has two depths; see taperKnown). */
  taper: Nm;
  /** Largest difference between the two axes at one depth (0 when no depth has both; see outOfRoundKnown). */
  outOfRound: Nm;
  /** Largest reading minus the standard bore (negative if under it); null without a standard bore. */
  overStandard: Nm | null;
  /** True when some axis was read at two depths or more, so taper means something. */
  taperKnown: boolean;
  /** True when some depth was read on both axes, so out-of-round means something. */
  outOfRoundKnown: boolean;
}

export interface WearLimits {
  maxTaperNm?: Nm;
  maxOutOfRoundNm?: Nm;
}

export class ReadingsError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ReadingsError';
  }
}

export function computeWear(readings: readonly Reading[], standardBoreNm?: Nm): Wear {
  validate(readings);
  if (standardBoreNm !== undefined && (!isNm(standardBoreNm) || standardBoreNm <= 0)) {
    throw new ReadingsError('The standard bore must be a positive whole number of nanometres.');
  }
  const values = readings.map((r) => r.nm);
  const largest = Math.max(...values);
  const smallest = Math.min(...values);

  let taper = 0;
  let taperKnown = false;
  for (const axis of AXES) {
    const along = readings.filter((r) => r.axis === axis).map((r) => r.nm);
    if (along.length >= 2) {
      taperKnown = true;
      taper = Math.max(taper, Math.max(...along) - Math.min(...along));
    }
  }

  let outOfRound = 0;
  let outOfRoundKnown = false;
  for (const depth of DEPTHS) {
    const pin = readings.find((r) => r.depth === depth && r.axis === 'pin');
    const thrust = readings.find((r) => r.depth === depth && r.axis === 'thrust');
    if (pin && thrust) {
      outOfRoundKnown = true;
      outOfRound = Math.max(outOfRound, Math.abs(pin.nm - thrust.nm));
    }
  }

  return {
    largest,
    smallest,
    taper,
    outOfRound,
    overStandard: standardBoreNm === undefined ? null : largest - standardBoreNm,
    taperKnown,
    outOfRoundKnown,
  };
}

/** Plain-words warnings when wear is past the engine maker's limits (the limits come from the caller). */
export function wearWarnings(wear: Wear, limits: WearLimits, unit: LengthUnit = 'mm'): string[] {
  const warnings: string[] = [];
  if (limits.maxTaperNm !== undefined) {
    checkLimit(limits.maxTaperNm, 'taper');
    if (!wear.taperKnown) {
      warnings.push('Taper is unknown: measure at two depths or more along one axis.');
    } else if (wear.taper > limits.maxTaperNm) {
      // Compared exactly; shown with the digits that make the difference visible.
      const [taper, limit] = formatLengthsApart(wear.taper, limits.maxTaperNm, unit);
      warnings.push(`Taper ${taper} is over the limit of ${limit}.`);
    }
  }
  if (limits.maxOutOfRoundNm !== undefined) {
    checkLimit(limits.maxOutOfRoundNm, 'out-of-round');
    if (!wear.outOfRoundKnown) {
      warnings.push('Out-of-round is unknown: measure both axes at one depth or more.');
    } else if (wear.outOfRound > limits.maxOutOfRoundNm) {
      const [outOfRound, limit] = formatLengthsApart(wear.outOfRound, limits.maxOutOfRoundNm, unit);
      warnings.push(`Out-of-round ${outOfRound} is over the limit of ${limit}.`);
    }
  }
  return warnings;
}

function checkLimit(limit: Nm, name: string): void {
  if (!isNm(limit) || limit < 0) {
    throw new ReadingsError(
      `The ${name} limit must be zero or a positive whole number of nanometres.`,
    );
  }
}

function validate(readings: readonly Reading[]): void {
  if (!Array.isArray(readings) || readings.length === 0) {
    throw new ReadingsError('Enter at least one bore reading.');
  }
  if (readings.length > DEPTHS.length * AXES.length) {
    throw new ReadingsError('At most 6 readings: three depths on two axes.');
  }
  const seen = new Set<string>();
  readings.forEach((r, index) => {
    const where = `Reading ${index + 1}`;
    if (!DEPTHS.includes(r.depth))
      throw new ReadingsError(`${where}: depth must be top, middle or bottom.`);
    if (!AXES.includes(r.axis)) throw new ReadingsError(`${where}: axis must be pin or thrust.`);
    if (!isNm(r.nm) || r.nm <= 0) {
      throw new ReadingsError(
        `${where}: the diameter must be a positive whole number of nanometres.`,
      );
    }
    const key = `${r.depth}/${r.axis}`;
    if (seen.has(key))
      throw new ReadingsError(`${where}: ${r.depth} on the ${r.axis} axis is entered twice.`);
    seen.add(key);
  });
}
