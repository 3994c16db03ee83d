import {
  cylinderPatch,
  holdInput,
  isoDate,
  jobInput,
  jobPatch,
  readingsInput,
} from '../../shared/api/jobs';

const FAMILY = '8f14e45f-ceea-4e6a-a8c9-1c5d2a3b4c5d';
const UNIT = '1b4e28ba-2fa1-41d2-883f-0016d3cca427';

describe('isoDate', () => {
  it.each(['2027-01-15', '2028-02-29'])('when %s is given, then it is a date', (text) => {
    expect(isoDate.safeParse(text).success).toBe(true);
  });
  // 2027 is not a leap year (Gregorian rule: divisible by 4, not by 100 unless by 400).
  it.each(['2027-02-29', '2027-04-31', '15/01/2027', '2027-1-5', ''])(
    'when %s is given, then it is refused',
    (text) => {
      expect(isoDate.safeParse(text).success).toBe(false);
    },
  );
});

describe('jobInput', () => {
  it('when optional contact fields are empty, then they become null and the name is trimmed', () => {
    const parsed = jobInput.parse({
      customerName: '  Odile Farrant ',
      customerPhone: '',
      customerEmail: '',
      familyId: FAMILY,
      cylinders: 2,
    });
    expect(parsed).toEqual(
      expect.objectContaining({
        customerName: 'Odile Farrant',
        customerPhone: null,
        customerEmail: null,
      }),
    );
  });

  it('when the phone has letters or the e-mail no @, then each is refused on its own field', () => {
    const result = jobInput.safeParse({
      customerName: 'Odile Farrant',
      customerPhone: 'call me',
      customerEmail: 'odile.example.test',
      familyId: FAMILY,
      cylinders: 1,
    });
    expect(result.success).toBe(false);
    const fields = result.error?.issues.map((i) => i.path.join('.'));
    expect(fields).toEqual(expect.arrayContaining(['customerPhone', 'customerEmail']));
  });

  it('when an unknown field is sent, then it is refused (strict)', () => {
    const result = jobInput.safeParse({
      customerName: 'Odile Farrant',
      familyId: FAMILY,
      cylinders: 1,
      state: 'ready_to_go',
    });
    expect(result.success).toBe(false);
  });
});

describe('jobPatch', () => {
  it('when nothing is sent, then "nothing to change"', () => {
    const result = jobPatch.safeParse({});
    expect(result.error?.issues[0].message).toBe('nothing to change');
  });

  it('when a closing state is sent, then it is refused: collect and cancel have their own commands', () => {
    expect(jobPatch.safeParse({ state: 'handed_back' }).success).toBe(false);
    expect(jobPatch.safeParse({ state: 'at_the_hone' }).success).toBe(true);
  });

  it('when the due date is cleared, then null is kept as a change', () => {
    expect(jobPatch.parse({ dueDate: null })).toEqual({ dueDate: null });
  });
});

describe('readingsInput', () => {
  it('when diameters are typed in either unit, then each keeps its unit and exact nanometres', () => {
    // 1 in = 25.4 mm exactly (NIST SP 811): 2.5260 in = 64 160 400 nm.
    const parsed = readingsInput.parse({
      readings: [
        { depth: 'top', axis: 'pin', diameter: '2.5260 in' },
        // A decimal comma with four digits is not mistaken for a thousands separator.
        { depth: 'top', axis: 'thrust', diameter: '64,1350 mm' },
      ],
    });
    expect(parsed.readings.map((r) => r.diameter)).toEqual([
      { nm: 64_160_400, unit: 'in' },
      { nm: 64_135_000, unit: 'mm' },
    ]);
  });

  it('when a diameter has no unit or a bad depth, then the failing path is named', () => {
    const result = readingsInput.safeParse({
      readings: [
        { depth: 'top', axis: 'pin', diameter: '2.5260' },
        { depth: 'deep', axis: 'pin', diameter: '2.5260 in' },
      ],
    });
    const paths = result.error?.issues.map((i) => i.path.join('.'));
    expect(paths).toEqual(['readings.0.diameter', 'readings.1.depth']);
  });

  it('when more than six readings are sent, then they are refused', () => {
    const one = { depth: 'top', axis: 'pin', diameter: '2.5 in' };
    expect(readingsInput.safeParse({ readings: Array(7).fill(one) }).success).toBe(false);
  });
});

describe('holdInput', () => {
  it('when a unit or a part with quantity is named, then it is accepted', () => {
    expect(holdInput.safeParse({ cylinder: 1, unitId: UNIT }).success).toBe(true);
    expect(holdInput.safeParse({ cylinder: 1, partId: UNIT, quantity: 2 }).success).toBe(true);
  });

  it('when both or neither are named, or a unit with quantity 2, then refused', () => {
    expect(holdInput.safeParse({ cylinder: 1 }).success).toBe(false);
    expect(holdInput.safeParse({ cylinder: 1, unitId: UNIT, partId: UNIT }).success).toBe(false);
    expect(holdInput.safeParse({ cylinder: 1, unitId: UNIT, quantity: 2 }).success).toBe(false);
    expect(holdInput.safeParse({ cylinder: 0, unitId: UNIT }).success).toBe(false);
  });
});

describe('cylinderPatch', () => {
  it('when a clearance is given, then it is exact nanometres; null puts the shop policy back', () => {
    // 0.0015 in × 25 400 000 nm/in = 38 100 nm.
    expect(cylinderPatch.parse({ clearance: '0.0015 in' })).toEqual({ clearance: 38_100 });
    expect(cylinderPatch.parse({ clearance: null })).toEqual({ clearance: null });
  });
});
