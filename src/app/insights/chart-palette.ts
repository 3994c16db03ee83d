// Stepstock's chart colours: blues against ambers (the pair colour-blind readers tell apart most
// easily), each a clearly different lightness so a black-and-white print still separates them.

/** Series colours in the order charts use them (STD, 1st oversize, 2nd … or one per family). */
export const SERIES_COLOURS = [
  '#17324d', // deep navy
  '#e3b448', // wheat gold
  '#4a8bc2', // mid blue
  '#6b4c8a', // plum
  '#a9d3ee', // pale sky
  '#b85c00', // burnt amber
] as const;

/** For "everything else" and totals. */
export const NEUTRAL_COLOUR = '#7d7d7d';
/** Lines drawn over bars (cumulative share, units on a second axis). */
export const LINE_COLOUR = '#b85c00';
/** Axis text and grid: dark enough on paper, quiet on screen. */
export const INK = '#2b2f33';
export const GRID = '#d5d9de';

/** The series colour for index i, repeating after the palette runs out. */
export function seriesColour(i: number): string {
  return SERIES_COLOURS[
    ((i % SERIES_COLOURS.length) + SERIES_COLOURS.length) % SERIES_COLOURS.length
  ];
}

/** WCAG 2.x relative luminance of a #rrggbb colour (0 = black, 1 = white). */
export function relativeLuminance(hex: string): number {
  const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
  if (!m) throw new Error(`Not a #rrggbb colour: ${hex}`);
  const [r, g, b] = [m[1], m[2], m[3]].map((part) => {
    const c = parseInt(part, 16) / 255;
    return c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
  });
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2.x contrast ratio of two colours (1 to 21). */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}
