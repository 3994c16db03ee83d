import { AverageCostError, issueAtCost, receiptValue, stockValue } from '../../shared/average-cost';

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
    const received = receiptValue({ quantity: 0, value: '0' }, 10, '12.00');
    expect(received).toEqual({ quantity: 10, value: '120', averageCost: '12.0000' });

    const first = issueAtCost({ quantity: 10, averageCost: received.averageCost }, 4);
    expect(first).toEqual({ quantity: 6, averageCost: '12.0000', issuedValue: '48.0000' });

    // 6 left worth 120 − 48 = 72 (by hand).
    const again = receiptValue({ quantity: 6, value: '72' }, 6, '15.00');
    expect(again).toEqual({ quantity: 12, value: '162', averageCost: '13.5000' });

    const second = issueAtCost({ quantity: 12, averageCost: again.averageCost }, 5);
    expect(second).toEqual({ quantity: 7, averageCost: '13.5000', issuedValue: '67.5000' });

    // 7 left worth 162 − 67.5 = 94.5; + 3 × 14.20 = 137.1; ÷ 10 = 13.71.
    const third = receiptValue({ quantity: 7, value: '94.5' }, 3, '14.20');
    expect(third).toEqual({ quantity: 10, value: '137.1', averageCost: '13.7100' });
    expect(stockValue(third)).toBe('137.1000');
  });

  it('when three single units come in at 1, 1 and 2, then the stock is worth 4 exactly, not 3 × 1.3333', () => {
    // By hand: 1 + 1 + 2 = 4 for 3 units; 4 ÷ 3 = 1.3333… → average 1.3333 (half-up). Rounding the
    // average at each receipt and multiplying back would give 3 × 1.3333 = 3.9999.
    let state = receiptValue({ quantity: 0, value: '0' }, 1, '1');
    state = receiptValue(state, 1, '1');
    state = receiptValue(state, 1, '2');
    expect(state).toEqual({ quantity: 3, value: '4', averageCost: '1.3333' });
  });

  it('when the average repeats forever, then it is rounded half-up to 4 decimals', () => {
    // (3 × 10 + 6 × 11) ÷ 9 = 96 ÷ 9 = 10.6666… → 10.6667.
    expect(receiptValue({ quantity: 3, value: '30' }, 6, '11')).toEqual({
      quantity: 9,
      value: '96',
      averageCost: '10.6667',
    });
  });

  it('when money would drift in binary floats, then decimal arithmetic keeps it exact', () => {
    // 0.1 + 0.2 in floats is 0.30000000000000004; (1 × 0.1 + 1 × 0.2) ÷ 2 = 0.15 exactly.
    expect(receiptValue({ quantity: 1, value: '0.1' }, 1, '0.2')).toEqual({
      quantity: 2,
      value: '0.3',
      averageCost: '0.1500',
    });
  });

  it('when stock runs out and is received again, then the new receipt sets the average', () => {
    const empty = issueAtCost({ quantity: 2, averageCost: '9.5000' }, 2);
    expect(empty.quantity).toBe(0);
    expect(receiptValue({ quantity: 0, value: '0' }, 4, '11.25').averageCost).toBe('11.2500');
  });

  it.each([
    [() => issueAtCost({ quantity: 2, averageCost: '1' }, 3), /only 2 in stock/],
    [() => issueAtCost({ quantity: 2, averageCost: '1' }, 0), /issued quantity/],
    [() => receiptValue({ quantity: 2, value: '2' }, 1.5, '1'), /received quantity/],
    [() => receiptValue({ quantity: 2, value: '2' }, 1, '-1'), /unit cost/],
    [() => receiptValue({ quantity: 2, value: '2' }, 1, '1e3'), /unit cost/],
    [() => receiptValue({ quantity: -1, value: '1' }, 1, '1'), /quantity in stock/],
    [() => receiptValue({ quantity: 1, value: 'abc' }, 1, '1'), /stock value/],
    [() => issueAtCost({ quantity: 1, averageCost: 'abc' }, 1), /average cost/],
  ])('when the input is bad (%#), then an AverageCostError explains', (act, message) => {
    expect(act).toThrow(AverageCostError);
    expect(act).toThrow(message);
  });
});
