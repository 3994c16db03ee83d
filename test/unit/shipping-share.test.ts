// An order's shipping spread over its units, worked by hand.
import { shippingPerUnit } from '../../shared/shipping-share';

// Two lines: 2 × 40.00 and 1 × 20.00 (value 100.00, 3 units), shipping 10.00.
const lines = [
  { quantity: 2, unitPrice: '40.00' },
  { quantity: 1, unitPrice: '20.00' },
];

describe('shippingPerUnit', () => {
  it('when spread by value, then each unit carries shipping × its price ÷ the order value', () => {
    // 10 × 40 / 100 = 4.00 a unit on the first line; 10 × 20 / 100 = 2.00 on the second;
    // 2 × 4 + 1 × 2 = 10, the whole shipping.
    expect(shippingPerUnit(lines, '10.00', '40.00', 'value').toFixed()).toBe('4');
    expect(shippingPerUnit(lines, '10.00', '20.00', 'value').toFixed()).toBe('2');
  });

  it('when spread by count, then every unit carries the same share', () => {
    // 10 / 3 = 3.333… on every unit.
    expect(shippingPerUnit(lines, '10.00', '40.00', 'quantity').toFixed(4)).toBe('3.3333');
  });

  it('when not spread, or there is no shipping, then nothing is added', () => {
    expect(shippingPerUnit(lines, '10.00', '40.00', 'none').toFixed()).toBe('0');
    expect(shippingPerUnit(lines, '0', '40.00', 'value').toFixed()).toBe('0');
  });

  it('when nothing on the order has a price, then it is spread by count', () => {
    const free = [{ quantity: 4, unitPrice: '0' }];
    expect(shippingPerUnit(free, '10.00', '0', 'value').toFixed()).toBe('2.5');
  });
});
