// What the shop prints its labels on: sticker sheets on an office printer, or one label per page on a
// thermal label printer's roll. Piston, bin and cylinder-tag labels all follow the one shop setting.

export const LABEL_STOCKS = ['sheet', 'roll-62x35', 'roll-62x29', 'roll-50x25'] as const;
export type LabelStock = (typeof LABEL_STOCKS)[number];

export interface LabelSize {
  widthMm: number;
  heightMm: number;
}

/** The label's own size on each stock; the sheet's stickers are 62 × 35 mm. */
export const LABEL_SIZES: Readonly<Record<LabelStock, LabelSize>> = {
  sheet: { widthMm: 62, heightMm: 35 },
  'roll-62x35': { widthMm: 62, heightMm: 35 },
  'roll-62x29': { widthMm: 62, heightMm: 29 },
  'roll-50x25': { widthMm: 50, heightMm: 25 },
};

/** The words the settings form and the label pages use for each stock. */
export const LABEL_STOCK_NAMES: Readonly<Record<LabelStock, string>> = {
  sheet: 'Sticker sheets on A4 or Letter (62 × 35 mm, 3 × 7)',
  'roll-62x35': 'Label printer roll, 62 × 35 mm',
  'roll-62x29': 'Label printer roll, 62 × 29 mm',
  'roll-50x25': 'Label printer roll, 50 × 25 mm',
};

export function isLabelStock(value: unknown): value is LabelStock {
  return typeof value === 'string' && (LABEL_STOCKS as readonly string[]).includes(value);
}

/**
 * The roll a one-per-page print goes on: the shop's roll, or the sheet's 62 × 35 mm size when the
 * shop prints on sheets (the size one-per-page labels have always had).
 */
export function rollFor(stock: LabelStock): Exclude<LabelStock, 'sheet'> {
  return stock === 'sheet' ? 'roll-62x35' : stock;
}

/**
 * The printed page for one layout: a sheet page keeps the office printer's paper and 10 mm margins;
 * a roll page is exactly one label, without margins, so the printer feeds one label per page.
 */
export function labelPageCss(stock: LabelStock): string {
  if (stock === 'sheet') return 'margin: 10mm;';
  const { widthMm, heightMm } = LABEL_SIZES[stock];
  return `size: ${widthMm}mm ${heightMm}mm; margin: 0;`;
}
