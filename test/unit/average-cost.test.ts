import {
  AverageCostError,
  issueAtCost,
  receiveAtCost,
  stockValue,
} from '../../shared/average-cost';

describe('weighted-average cost method (perpetual moving average)', () => {
  // Weighted-average cost method (perpetual moving average): each receipt sets
  // new average = (quantity × average + received × unit cost) ÷ (quantity + received); issues leave the
  // average unchanged. Worked by hand for an invented piston part:
  //   receive 10 @ 12.00 → 10 @ 12.0000
  //   issue 4           →  6 @ 12.0000 (issued 48.0000)
  //   receive 6 @ 15.00  → (6×12 + 6×15) ÷ 12 = 162 ÷ 12 = 13.5000, 12 in stock
  //   issue 5           →  7 @ 13.5000 (issued 67.5000)
  //   receive 3 @ 14.20  → (7×13.5 + 3×14.2) ÷ 10 = (94.5 + 42.6) ÷ 10 = 13.7100
  it('when receipts at different prices come between issues, then the average moves only on receipts', () => {
    let state = receiveAtCost({ quantity: 0, averageCost: '0' }, 10, '12.00');
    expect(state).toEqual({ quantity: 10, averageCost: '12.0000' });

    const first = issueAtCost(state, 4);
    expect(first).toEqual({ quantity: 6, averageCost: '12.0000', issuedValue: '48.0000' });

    state = receiveAtCost(first, 6, '15.00');
    expect(state).toEqual({ quantity: 12, averageCost: '13.5000' });

    const second = issueAtCost(state, 5);
    expect(second).toEqual({ quantity: 7, averageCost: '13.5000', issuedValue: '67.5000' });

    state = receiveAtCost(second, 3, '14.20');
    expect(state).toEqual({ quantity: 10, averageCost: '13.7100' });
    expect(stockValue(state)).toBe('137.1000');
  });

  it('when the average repeats forever, then it is rounded half-up to 4 decimals', () => {
    // (3 × 10 + 6 × 11) ÷ 9 = 96 ÷ 9 = 10.6666… → 10.6667.
    expect(receiveAtCost({ quantity: 3, averageCost: '10' }, 6, '11')).toEqual({
      quantity: 9,
      averageCost: '10.6667',
    });
  });

  it('when money would drift in binary floats, then decimal arithmetic keeps it exact', () => {
    // 0.1 + 0.2 in floats is 0.30000000000000004; (1 × 0.1 + 1 × 0.2) ÷ 2 = 0.15 exactly.
    expect(receiveAtCost({ quantity: 1, averageCost: '0.1' }, 1, '0.2').averageCost).toBe('0.1500');
  });

  it('when stock runs out and is received again, then the new receipt sets the average', () => {
    const empty = issueAtCost({ quantity: 2, averageCost: '9.5000' }, 2);
    expect(empty.quantity).toBe(0);
    expect(receiveAtCost(empty, 4, '11.25')).toEqual({ quantity: 4, averageCost: '11.2500' });
  });

  it.each([
    [() => issueAtCost({ quantity: 2, averageCost: '1' }, 3), /only 2 in stock/],
    [() => issueAtCost({ quantity: 2, averageCost: '1' }, 0), /issued quantity/],
    [() => receiveAtCost({ quantity: 2, averageCost: '1' }, 1.5, '1'), /received quantity/],
    [() => receiveAtCost({ quantity: 2, averageCost: '1' }, 1, '-1'), /unit cost/],
    [() => receiveAtCost({ quantity: 2, averageCost: '1' }, 1, '1e3'), /unit cost/],
    [() => receiveAtCost({ quantity: -1, averageCost: '1' }, 1, '1'), /quantity in stock/],
    [() => receiveAtCost({ quantity: 1, averageCost: 'abc' }, 1, '1'), /average cost/],
  ])('when the input is bad (%#), then an AverageCostError explains', (act, message) => {
    expect(act).toThrow(AverageCostError);
    expect(act).toThrow(message);
  });
});
