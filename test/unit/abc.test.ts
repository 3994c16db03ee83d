import { AbcError, abcClassify } from '../../shared/abc';

describe('abcClassify', () => {
  // Pareto convention 80/15/5 (ABC inventory classification): an item is A while the share of value before
  // it is below 80%, B while below 95%, else C. Worked example, invented parts, computed by hand:
  //   part  value  share  cumulative before → class
  //   P1    5000   0.50   0.00 → A
  //   P2    2500   0.25   0.50 → A
  //   P3    1200   0.12   0.75 → A   (crosses 80%: still A)
  //   P4     600   0.06   0.87 → B
  //   P5     400   0.04   0.93 → B
  //   P6     200   0.02   0.97 → C
  //   P7     100   0.01   0.99 → C   total 10 000
  const items = [
    { id: 'P6', value: 200 },
    { id: 'P1', value: '5000' },
    { id: 'P4', value: 600 },
    { id: 'P7', value: '100.00' },
    { id: 'P2', value: 2500 },
    { id: 'P5', value: '400' },
    { id: 'P3', value: 1200 },
  ];

  it('when the worked example is classified, then A, B and C follow the 80/15/5 convention', () => {
    const rows = abcClassify(items);
    expect(rows.map((r) => `${r.id}:${r.class}`)).toEqual([
      'P1:A',
      'P2:A',
      'P3:A',
      'P4:B',
      'P5:B',
      'P6:C',
      'P7:C',
    ]);
    expect(rows.map((r) => r.share)).toEqual([
      '0.5000',
      '0.2500',
      '0.1200',
      '0.0600',
      '0.0400',
      '0.0200',
      '0.0100',
    ]);
    expect(rows.map((r) => r.cumulative)).toEqual([
      '0.5000',
      '0.7500',
      '0.8700',
      '0.9300',
      '0.9700',
      '0.9900',
      '1.0000',
    ]);
    expect(rows[6].value).toBe('100');
  });

  it('when other cut-offs are given, then they are used', () => {
    // 70/90: P3 starts at 0.75 ≥ 0.70 → B; P4 at 0.87 → B; P5 at 0.93 → C.
    const rows = abcClassify(items, { a: 0.7, b: 0.9 });
    expect(rows.map((r) => r.class).join('')).toBe('AABBCCC');
  });

  it('when shares repeat forever, then comparisons use exact decimals and shares show 4 decimals', () => {
    // Three equal items: 1/3 each; the third starts at 2/3 < 0.8 → all A.
    const rows = abcClassify([
      { id: 'x', value: 1 },
      { id: 'y', value: 1 },
      { id: 'z', value: 1 },
    ]);
    expect(rows.map((r) => r.share)).toEqual(['0.3333', '0.3333', '0.3333']);
    expect(rows.map((r) => r.class)).toEqual(['A', 'A', 'A']);
    expect(rows[2].cumulative).toBe('1.0000');
  });

  it('when values tie, then the order is by id so results never depend on input order', () => {
    const rows = abcClassify([
      { id: 'b', value: 5 },
      { id: 'a', value: 5 },
    ]);
    expect(rows.map((r) => r.id)).toEqual(['a', 'b']);
  });

  it('when nothing has value, then every item is C', () => {
    expect(abcClassify([{ id: 'x', value: 0 }])).toEqual([
      { id: 'x', value: '0', share: '0.0000', cumulative: '0.0000', class: 'C' },
    ]);
    expect(abcClassify([])).toEqual([]);
  });

  it.each([
    [[{ id: 'x', value: -1 }], /value must be a number/],
    [[{ id: 'x', value: 'abc' }], /value must be a number/],
    [[{ id: 'x', value: Number.NaN }], /value must be a number/],
    [
      [
        { id: 'x', value: 1 },
        { id: 'x', value: 2 },
      ],
      /only once/,
    ],
  ])('when the items are bad (%#), then an AbcError explains', (bad, message) => {
    expect(() => abcClassify(bad)).toThrow(AbcError);
    expect(() => abcClassify(bad)).toThrow(message);
  });

  it('when the cut-offs are out of order, then it is refused', () => {
    expect(() => abcClassify(items, { a: 0.95, b: 0.8 })).toThrow(/0 < A < B ≤ 1/);
  });
});
