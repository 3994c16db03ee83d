// The catalog and stock request schemas that both the server routes and the Angular forms use.
// Length values rest on 1 in = 25.4 mm exactly (international yard and pound agreement of 1959, as
// stated in NIST Special Publication 811, appendix B).
import { displayGtin, familyPatch, gtinField, partInput } from '../../shared/api/catalog';
import { adjustmentInput, moveInput, receiptInput } from '../../shared/api/stock';
import { lengthField, moneyText, optionalLengthField } from '../../shared/api/common';

describe('lengthField', () => {
  const field = lengthField();

  it('when a length is typed in inches, then it is read into exact nanometres', () => {
    // 2.5555 in × 25 400 000 nm/in = 64 909 700 nm.
    expect(field.parse('2.5555 in')).toBe(64_909_700);
    expect(field.parse('64.91 mm')).toBe(64_910_000);
  });

  it.each(['', 'abc', '-0.01 in', '9 m', '2.5 furlongs'])(
    'when the text is "%s", then it is refused with a reason',
    (bad) => {
      const result = field.safeParse(bad);
      expect(result.success).toBe(false);
      expect(result.error?.issues[0].message).toMatch(/length|unit|negative|mm or in/i);
    },
  );

  it('when a number arrives instead of text, then the message asks for text with a unit', () => {
    const result = field.safeParse(64.91);
    expect(result.error?.issues[0].message).toMatch(/with its unit/);
  });
});

describe('optionalLengthField', () => {
  const field = optionalLengthField({ allowZero: true });

  it('when cleared with null or "", then it means "not recorded"', () => {
    expect(field.parse(null)).toBeNull();
    expect(field.parse('  ')).toBeNull();
  });

  it('when a bad length is given, then its own message is kept', () => {
    expect(field.safeParse('3 furlongs').error?.issues[0].message).toMatch(/mm or in/);
  });
});

describe('gtinField and displayGtin', () => {
  it('when a UPC-A is given, then it is stored in the 14-digit form and shown as 12 digits again', () => {
    // 036000291452 is a valid UPC-A (from memory: a widely printed example).
    const stored = gtinField.parse('036000291452');
    expect(stored).toBe('00036000291452');
    expect(displayGtin(stored as string)).toBe('036000291452');
  });

  it('when an EAN-13 is given with spaces, then it is stored padded and shown as 13 digits', () => {
    // 4006381333931 is a valid EAN-13 (from memory: a widely printed example).
    const stored = gtinField.parse('400 6381 33393 1');
    expect(stored).toBe('04006381333931');
    expect(displayGtin(stored as string)).toBe('4006381333931');
  });

  it('when the check digit is wrong, then the message says which digit it should be', () => {
    const result = gtinField.safeParse('4006381333932');
    expect(result.error?.issues[0].message).toMatch(/should be 1/);
  });
});

describe('moneyText', () => {
  it.each(['12.50', '0', '1234567890.1234'])('when the amount is %s, then it is accepted', (ok) => {
    expect(moneyText.safeParse(ok).success).toBe(true);
  });

  it.each(['-1', '1e3', '12.34567', '12,50', ''])(
    'when the amount is "%s", then it is refused',
    (bad) => {
      expect(moneyText.safeParse(bad).success).toBe(false);
    },
  );
});

describe('request schemas', () => {
  it('when a family change names nothing, then it is refused', () => {
    expect(familyPatch.safeParse({}).success).toBe(false);
  });

  it('when a part is sent with an unknown field, then it is refused', () => {
    const result = partInput.safeParse({
      kind: 'other',
      sku: 'X-1',
      description: 'x',
      colour: 'red',
    });
    expect(result.success).toBe(false);
  });

  it('when a receipt unit has no skirt, then it is a piston "to measure"', () => {
    const parsed = receiptInput.parse({
      partId: '00000000-0000-4000-8000-000000000001',
      quantity: 2,
      binId: '00000000-0000-4000-8000-000000000002',
      unitCost: '12.50',
      units: [{ skirt: '2.5555 in' }, {}],
    });
    expect(parsed.units).toEqual([{ skirt: 64_909_700 }, {}]);
  });

  it('when an adjustment is 0, then the message explains the sign', () => {
    const result = adjustmentInput.safeParse({
      partId: '00000000-0000-4000-8000-000000000001',
      quantity: 0,
      reason: 'count',
    });
    expect(result.error?.issues[0].message).toMatch(/\+ to add, - to take away/);
  });

  it('when a move names both a unit and a part, then it is refused', () => {
    const id = '00000000-0000-4000-8000-000000000001';
    expect(moveInput.safeParse({ unitId: id, partId: id, toBinId: id }).success).toBe(false);
    expect(moveInput.safeParse({ unitId: id, toBinId: id }).success).toBe(true);
  });
});
