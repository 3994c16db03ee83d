import {
  INK,
  NEUTRAL_COLOUR,
  SERIES_COLOURS,
  contrastRatio,
  relativeLuminance,
  seriesColour,
} from './chart-palette';

describe('chart palette', () => {
  // Relative luminance and contrast ratio as defined in WCAG 2.1 (W3C), section "Relative
  // luminance": white is 1, black 0, contrast (L1 + 0.05) / (L2 + 0.05); black on white is 21:1.
  it('when the WCAG formulas are checked on black and white, then they give 0, 1 and 21:1', () => {
    expect(relativeLuminance('#000000')).toBe(0);
    expect(relativeLuminance('#ffffff')).toBeCloseTo(1, 10);
    expect(contrastRatio('#000000', '#ffffff')).toBeCloseTo(21, 10);
    // Mid grey #777777 on white is about 4.48:1 (just under the 4.5:1 text minimum).
    expect(contrastRatio('#777777', '#ffffff')).toBeCloseTo(4.48, 2);
  });

  it('when printed in black and white, then every two series colours still differ in lightness', () => {
    const colours = [...SERIES_COLOURS, NEUTRAL_COLOUR];
    for (let i = 0; i < SERIES_COLOURS.length; i++) {
      for (let j = i + 1; j < SERIES_COLOURS.length; j++) {
        const gap = Math.abs(relativeLuminance(colours[i]) - relativeLuminance(colours[j]));
        expect({ pair: [colours[i], colours[j]], distinct: gap >= 0.05 }).toEqual({
          pair: [colours[i], colours[j]],
          distinct: true,
        });
      }
    }
  });

  it('when axis text is drawn on white, then it passes the 4.5:1 text contrast of WCAG 2.1', () => {
    expect(contrastRatio(INK, '#ffffff')).toBeGreaterThanOrEqual(4.5);
  });

  it('when there are more series than colours, then the colours repeat in order', () => {
    expect(seriesColour(0)).toBe(SERIES_COLOURS[0]);
    expect(seriesColour(SERIES_COLOURS.length + 1)).toBe(SERIES_COLOURS[1]);
    expect(() => relativeLuminance('navy')).toThrow(/#rrggbb/);
  });
});
