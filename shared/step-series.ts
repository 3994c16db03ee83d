// Oversize step series: the sizes a piston family is made in, as offsets over the standard bore.
import { NM_PER_IN, NM_PER_MM, formatMm, inToNm, isNm, mmToNm, parseLength } from './lengths';
import type { LengthUnit, Nm } from './lengths';
import Decimal from 'decimal.js';

const D = Decimal.clone({ precision: 60 });

export interface StepDef {
  /** Short stable code, e.g. "STD", "+0.25", "+0.010". */
  code: string;
  /** For people, e.g. "STD", "+0.25 mm", "+0.010 in". */
  label: string;
  offsetNm: Nm;
}

export class StepSeriesError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'StepSeriesError';
  }
}

// Common practice (no source): metric pistons come in 0.25 mm steps to +1.00 mm, imperial ones in
// 0.010 in steps to +0.040 in, and some imperial families on to +0.060 in (from memory: +0.050 is rarely
// made, so the long series jumps from +0.040 to +0.060; a family that has it can use customSeries).
export const METRIC_SERIES: readonly StepDef[] = Object.freeze(
  ['0', '0.25', '0.50', '0.75', '1.00'].map((mm) => step(mmToNm(mm), 'mm')),
);
export const IMPERIAL_SERIES: readonly StepDef[] = Object.freeze(
  ['0', '0.010', '0.020', '0.030', '0.040'].map((inch) => step(inToNm(inch), 'in')),
);
export const IMPERIAL_SERIES_060: readonly StepDef[] = Object.freeze(
  ['0', '0.010', '0.020', '0.030', '0.040', '0.060'].map((inch) => step(inToNm(inch), 'in')),
);

/** The nominal (finished) bore of a step: standard bore plus the step's oversize. */
export function stepNominalBore(standardBoreNm: Nm, offsetNm: Nm): Nm {
  if (!isNm(standardBoreNm) || standardBoreNm <= 0) {
    throw new StepSeriesError('The standard bore must be a positive whole number of nanometres.');
  }
  if (!isNm(offsetNm) || offsetNm < 0) {
    throw new StepSeriesError(
      'A step offset must be zero or a positive whole number of nanometres.',
    );
  }
  return standardBoreNm + offsetNm;
}

/**
 * "STD" for zero, otherwise the oversize with its sign: mm with at least 2 decimals ("+0.25 mm"), inches
 * with at least 3 ("+0.010 in"), more decimals only when the offset needs them.
 */
export function stepLabel(offsetNm: Nm, unit: LengthUnit): string {
  return `${stepCode(offsetNm, unit)}${offsetNm === 0 ? '' : ` ${unit}`}`;
}

/** The label without its unit: "STD", "+0.25", "+0.010". */
export function stepCode(offsetNm: Nm, unit: LengthUnit): string {
  if (!isNm(offsetNm) || offsetNm < 0) {
    throw new StepSeriesError(
      'A step offset must be zero or a positive whole number of nanometres.',
    );
  }
  if (offsetNm === 0) return 'STD';
  const minDecimals = unit === 'mm' ? 2 : 3;
  const perUnit = unit === 'mm' ? NM_PER_MM : NM_PER_IN;
  const exact = new D(offsetNm).dividedBy(perUnit);
  // Inch offsets off the 0.00001 in grid (typed in mm) are rounded to the trade's 0.0001 in.
  const shown =
    exact.decimalPlaces() <= minDecimals
      ? exact.toFixed(minDecimals)
      : unit === 'in' && exact.decimalPlaces() > 5
        ? exact.toFixed(4, Decimal.ROUND_HALF_UP)
        : exact.toFixed();
  return `+${shown}`;
}

/**
 * A series of our own: offsets (nm, or text like "0.25" / "+0.25 mm" read in `unit`) strictly ascending.
 * STD is put first when it is not given.
 */
export function customSeries(offsets: ReadonlyArray<Nm | string>, unit: LengthUnit): StepDef[] {
  if (offsets.length === 0) throw new StepSeriesError('A step series needs at least one oversize.');
  const nms = offsets.map((offset, index) => {
    if (typeof offset === 'number') {
      if (!isNm(offset) || offset < 0) {
        throw new StepSeriesError(
          `Offset ${index + 1} must be zero or a positive whole number of nm.`,
        );
      }
      return offset;
    }
    const parsed = parseLength(offset, { defaultUnit: unit, allowZero: true });
    if (!parsed.ok)
      throw new StepSeriesError(`Offset ${index + 1} ("${offset}"): ${parsed.message}`);
    return parsed.nm;
  });
  for (let i = 1; i < nms.length; i++) {
    if (nms[i] <= nms[i - 1]) {
      throw new StepSeriesError(
        `Offsets must go up: offset ${i + 1} (${formatMm(nms[i])} mm) is not above offset ${i} (${formatMm(nms[i - 1])} mm).`,
      );
    }
  }
  const withStd = nms[0] === 0 ? nms : [0, ...nms];
  return withStd.map((nm) => step(nm, unit));
}

function step(offsetNm: Nm, unit: LengthUnit): StepDef {
  return { code: stepCode(offsetNm, unit), label: stepLabel(offsetNm, unit), offsetNm };
}
