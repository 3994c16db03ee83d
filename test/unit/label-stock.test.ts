import {
  isLabelStock,
  LABEL_SIZES,
  LABEL_STOCKS,
  labelPageCss,
  rollFor,
} from '../../shared/label-stock';

describe('label stock', () => {
  it('when a roll is chosen, then the printed page is exactly one label of the roll, without margins', () => {
    // Roll sizes as label printer rolls are sold, width × length in mm: common practice (no source).
    expect(labelPageCss('roll-62x29')).toBe('size: 62mm 29mm; margin: 0;');
    expect(labelPageCss('roll-50x25')).toBe('size: 50mm 25mm; margin: 0;');
    expect(labelPageCss('roll-62x35')).toBe('size: 62mm 35mm; margin: 0;');
  });

  it('when sheets are chosen, then the page keeps the paper size and 10 mm margins', () => {
    // 3 × 62 mm + 2 × 2 mm gaps = 190 mm, which A4's 210 mm (ISO 216) holds within 2 × 10 mm.
    expect(labelPageCss('sheet')).toBe('margin: 10mm;');
    expect(LABEL_SIZES.sheet.widthMm * 3 + 2 * 2).toBeLessThanOrEqual(210 - 2 * 10);
  });

  it('when the shop prints on sheets, then a one-per-page print uses the sheet sticker size', () => {
    expect(rollFor('sheet')).toBe('roll-62x35');
    expect(rollFor('roll-50x25')).toBe('roll-50x25');
  });

  it('when a value is not a stock, then it is refused', () => {
    expect(LABEL_STOCKS.every(isLabelStock)).toBe(true);
    expect(isLabelStock('roll-100x50')).toBe(false);
    expect(isLabelStock(62)).toBe(false);
  });
});
