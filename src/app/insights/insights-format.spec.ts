import {
  formatAmount,
  formatAmountShort,
  formatCount,
  formatShare,
  stepPositionName,
} from './insights-format';

describe('insight figures on screen', () => {
  it('when an amount is exact decimal text, then it is rounded half away from zero without float error', () => {
    // 12345678901234.565 has more digits than a binary float keeps (the nearest float is
    // …234.564453125, which would round to .56); as decimal text it is exactly half a cent and
    // rounds up (Intl.NumberFormat "halfExpand", its default rounding).
    expect(formatAmount('12345678901234.565', 'EUR')).toBe('€12,345,678,901,234.57');
    expect(formatAmount('1.005', 'EUR')).toBe('€1.01');
    expect(formatAmount('128045.5', 'EUR')).toBe('€128,045.50');
    expect(formatAmount('-12.3456', 'USD')).toBe('-$12.35');
    // ISO 4217: the yen has no minor unit.
    expect(formatAmount('1234.5', 'JPY')).toBe('¥1,235');
    expect(formatAmount('n/a', 'EUR')).toBe('n/a');
  });

  it('when axes need short amounts, then thousands become K', () => {
    expect(formatAmountShort(12_400, 'EUR')).toBe('€12.4K');
  });

  it('when shares and counts are shown, then they read as percent and grouped digits', () => {
    expect(formatShare('0.8125')).toBe('81.3 %');
    expect(formatShare(null)).toBe('—');
    expect(formatCount(3908)).toBe('3,908');
  });

  it('when steps are named by position, then STD comes first and ordinals follow English rules', () => {
    expect([0, 1, 2, 3, 4, 11, 12, 13, 21].map(stepPositionName)).toEqual([
      'STD',
      '1st oversize',
      '2nd oversize',
      '3rd oversize',
      '4th oversize',
      '11th oversize',
      '12th oversize',
      '13th oversize',
      '21st oversize',
    ]);
    expect(stepPositionName(null)).toMatch(/small parts/);
  });
});
