import { kitFree } from '../../shared/kits';

describe('kitFree', () => {
  it.each([
    [
      'when the components have different free stock, then the scarcest one decides',
      // Worked by hand: pistons 5 ÷ 1 = 5, ring sets 3 ÷ 1 = 3, clips 7 ÷ 2 = 3 (floor) → 3 kits.
      [
        { free: 5, perKit: 1 },
        { free: 3, perKit: 1 },
        { free: 7, perKit: 2 },
      ],
      3,
    ],
    [
      'when clips run short of a pair, then fewer kits are free',
      // 5 clips ÷ 2 per kit = 2 kits (floor), though 4 pistons are free.
      [
        { free: 4, perKit: 1 },
        { free: 5, perKit: 2 },
      ],
      2,
    ],
    [
      'when a component has none free, then no kit is free',
      [
        { free: 0, perKit: 1 },
        { free: 9, perKit: 1 },
      ],
      0,
    ],
  ])('%s', (_name, components, kits) => {
    expect(kitFree(components)).toBe(kits);
  });

  it.each([
    [[], /at least one component/],
    [[{ free: 1, perKit: 0 }], /per kit/],
    [[{ free: -1, perKit: 1 }], /free stock/],
    [[{ free: 1.5, perKit: 1 }], /free stock/],
  ])('when the components are bad (%#), then it throws a clear error', (components, message) => {
    expect(() => kitFree(components)).toThrow(message);
  });
});
