// What the bore sheet says about the machine work, in one place: the cautions printed on every
// sheet, the ones that depend on the engine, and the ticks to make after honing. The server sends
// the list for one cylinder; the sheet prints it as it is, so wording is never repeated in a page.
import type { StrokeType } from './api/catalog';

/**
 * Why a two-stroke bore needs its ports dressed: the rings pass over the port windows on every
 * stroke, and boring leaves a sharp burr at each window's edge. Common practice (no source); the
 * chamfer size and method come from the engine maker.
 */
export const TWO_STROKE_PORT_CAUTION =
  'Two-stroke: after boring, chamfer and deburr the edge of every port (exhaust, transfer and ' +
  'inlet) all round, then hone. A ring that catches a sharp port edge breaks, and the broken ring ' +
  "takes the piston and the bore with it. Use the engine maker's chamfer size and method.";

/** After-honing ticks; the port check is only for engines with ports in the bore. */
export const CHECK_PORTS_DRESSED = 'Every port edge chamfered and deburred';
export const CHECK_BORE_CLEAN = 'Bore washed clean of honing grit';

export function engineCautions(strokeType: StrokeType): string[] {
  return strokeType === 'two' ? [TWO_STROKE_PORT_CAUTION] : [];
}

export function afterHoningChecks(strokeType: StrokeType): string[] {
  return strokeType === 'two' ? [CHECK_PORTS_DRESSED, CHECK_BORE_CLEAN] : [CHECK_BORE_CLEAN];
}

export interface HoningFacts {
  strokeType: StrokeType;
  /** The family's stroke, in the machinist's unit, ready to print ("54.00 mm"). */
  stroke: string;
  crosshatchDeg: string;
  /** The family's grits, as the shop wrote them ("coarse 280, plateau 400"); '' when not given. */
  grits: string;
}

/**
 * The honing lines of the sheet: grits, the crosshatch the shop aims for, and the stroke to set the
 * hone's travel against. The angle is the included angle between the scratch lines; about 45° is
 * common practice (no source), and the family's figure is printed. The hone maker's speeds and
 * strokes per minute for that angle govern.
 */
export function honingGuidance(f: HoningFacts): string[] {
  const lines = [
    f.grits.trim() === ''
      ? 'Grits: as the hone maker advises for this bore (none set for the family).'
      : `Grits: ${f.grits.trim()}.`,
    `Crosshatch: aim for about ${Number(f.crosshatchDeg)}° included angle; set spindle speed and stroke rate by the hone maker's chart.`,
    `Engine stroke ${f.stroke}: set the hone's travel so the stones run just past both ends of ring travel, without dropping out of the bore.`,
  ];
  if (f.strokeType === 'two') {
    lines.push('Hone after the ports are chamfered, so the stones do not catch a sharp port edge.');
  }
  return lines;
}
