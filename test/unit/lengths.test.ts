import {
  DEFAULT_MAX_NM,
  LengthError,
  formatIn,
  formatLength,
  formatMm,
  inToNm,
  isNm,
  lengthJsonToNm,
  lengthOrThrow,
  mmToNm,
  parseLength,
  toLengthJson,
} from '../../shared/lengths';

// convert-units ships no types; we only need its fluent from/to chain.
// eslint-disable-next-line @typescript-eslint/no-require-imports
const convert = require('convert-units') as (value: number) => {
  from(unit: string): { to(unit: string): number };
};

function nmOf(text: string, opts?: Parameters<typeof parseLength>[1]): number {
  const parsed = parseLength(text, opts);
  if (!parsed.ok) throw new Error(`expected "${text}" to parse, got: ${parsed.message}`);
  return parsed.nm;
}

function messageOf(text: string, opts?: Parameters<typeof parseLength>[1]): string {
  const parsed = parseLength(text, opts);
  if (parsed.ok) throw new Error(`expected "${text}" to be refused, got ${parsed.nm} nm`);
  return parsed.message;
}

describe('parseLength', () => {
  // NIST SP 811 (2008), appendix B: 1 in = 2.54 cm = 25.4 mm exactly, so 1 in = 25 400 000 nm.
  it('when one inch is typed, then it is exactly 25 400 000 nm (NIST SP 811: 1 in = 25.4 mm exactly)', () => {
    expect(nmOf('1 in')).toBe(25_400_000);
    expect(nmOf('25.4 mm')).toBe(25_400_000);
  });

  it('when the inch is written in the usual ways, then each gives the same nanometres', () => {
    // 2.5555 in × 25 400 000 nm/in = 64 909 700 nm (NIST SP 811 factor, multiplied by hand).
    for (const text of [
      '2.5555 in',
      '2.5555in',
      '2.5555"',
      '2.5555 inch',
      '2.5555 inches',
      ' 2.5555 IN ',
    ]) {
      expect(nmOf(text)).toBe(64_909_700);
    }
  });

  it('when millimetres are typed with a point or a decimal comma, then both give the same value', () => {
    expect(nmOf('64.91 mm')).toBe(64_910_000);
    expect(nmOf('64,91 mm')).toBe(64_910_000);
    expect(nmOf('64.91mm')).toBe(64_910_000);
  });

  it('when a comma has exactly three digits after it, then the length is refused as ambiguous', () => {
    // "2,000 mm" is 2000 mm with a thousands separator or 2 mm with a decimal comma; "1,234 mm" is
    // 1234 mm or 1.234 mm. Either guess can be a thousand times wrong, so the reader must ask.
    for (const text of ['2,000 mm', '1,234 mm', '64,910 mm', '2,000 in', '1,234']) {
      const parsed = parseLength(text, { defaultUnit: 'mm' });
      expect(parsed.ok).toBe(false);
      if (!parsed.ok) expect(parsed.message).toMatch(/ambiguous.*decimal point.*fewer digits/);
    }
    const two = parseLength('2,000 mm');
    expect(!two.ok && two.message).toContain('"2.000" or "2000"');
    expect(!two.ok && two.message).toContain('"2,0"');
    // Fewer or more digits after the comma cannot be thousands: read as a decimal comma.
    expect(nmOf('2,00 mm')).toBe(2_000_000);
    expect(nmOf('1,2345 mm')).toBe(1_234_500);
    expect(nmOf('2.000 mm')).toBe(2_000_000);
  });

  it('when a bare number is typed with a default unit, then that unit is used; without one it is refused', () => {
    expect(parseLength('64.91', { defaultUnit: 'mm' })).toEqual({
      ok: true,
      nm: 64_910_000,
      unit: 'mm',
    });
    expect(parseLength('2.5555', { defaultUnit: 'in' })).toEqual({
      ok: true,
      nm: 64_909_700,
      unit: 'in',
    });
    expect(messageOf('64.91')).toMatch(/unit/);
  });

  it('when an explicit unit differs from the default, then the explicit unit wins', () => {
    expect(parseLength('2.5 in', { defaultUnit: 'mm' })).toEqual({
      ok: true,
      nm: 63_500_000,
      unit: 'in',
    });
  });

  it.each([
    ['', /enter a length/i],
    ['   ', /enter a length/i],
    ['abc', /not a length/i],
    ['-1 in', /must not be negative/],
    ['-0.01 in', /must not be negative/],
    ['1e400 mm', /exponent/],
    ['1E3 in', /exponent/],
    ['2.5 furlongs', /unit must be mm or in/],
    ['9 m', /unit must be mm or in/],
    ['3 cm', /unit must be mm or in/],
    ['NaN', /number/],
    ['Infinity mm', /number/],
    ['1.2.3 mm', /decimal separator/],
    ['1,234.5 mm', /decimal separator/],
    ['2.555555 in', /at most 5/],
    ['64.9100001 mm', /at most 6/],
    ['0 mm', /greater than zero/],
    ['0.00000 in', /greater than zero/],
    ['2000.001 mm', /at most 2000.000 mm/],
    ['99999999999999999999999999 mm', /at most/],
  ])('when "%s" is typed, then it is refused with a clear message', (text, message) => {
    expect(messageOf(text)).toMatch(message);
  });

  it('when the value is not text at all, then it is refused rather than read as a float', () => {
    expect(parseLength(64.91 as unknown as string).ok).toBe(false);
  });

  it('when zero is allowed, then 0 is accepted', () => {
    expect(parseLength('0 in', { allowZero: true })).toEqual({ ok: true, nm: 0, unit: 'in' });
  });

  it('when a maximum is given, then values above it are refused and values at it accepted', () => {
    expect(nmOf('100 mm', { max: 100_000_000 })).toBe(100_000_000);
    expect(messageOf('100.001 mm', { max: 100_000_000 })).toMatch(/at most 100.000 mm/);
    expect(nmOf('2000 mm')).toBe(DEFAULT_MAX_NM);
  });

  it('when the finest decimals each unit can hold are typed, then they are exact whole nanometres', () => {
    expect(nmOf('0.00001 in')).toBe(254);
    expect(nmOf('0.000001 mm')).toBe(1);
    expect(nmOf('0.0001 in')).toBe(2540);
  });
});

describe('lengthOrThrow', () => {
  it('when the text is good, then it returns nanometres', () => {
    expect(lengthOrThrow('54.25 mm')).toBe(54_250_000);
  });

  it('when the text is bad, then it throws a LengthError naming the field', () => {
    expect(() => lengthOrThrow('-1 in', { field: 'skirt' })).toThrow(LengthError);
    expect(() => lengthOrThrow('-1 in', { field: 'skirt' })).toThrow(
      'skirt: Length must not be negative.',
    );
  });
});

describe('formatMm and formatIn', () => {
  it('when nanometres are shown in mm, then at least 3 decimals and more only when needed', () => {
    expect(formatMm(64_909_700)).toBe('64.9097');
    expect(formatMm(64_910_000)).toBe('64.910');
    expect(formatMm(54_000_000)).toBe('54.000');
    expect(formatMm(1)).toBe('0.000001');
    expect(formatMm(0)).toBe('0.000');
    expect(formatMm(-30_000)).toBe('-0.030');
  });

  it('when nanometres are shown in inches, then 4 decimals, 5 only for an exact 5-decimal inch value', () => {
    expect(formatIn(64_909_700)).toBe('2.5555');
    expect(formatIn(254)).toBe('0.00001');
    expect(formatIn(inToNm('2.55551'))).toBe('2.55551');
    // 64.91 mm = 2.555511811… in (64.91 / 25.4, NIST SP 811 factor) → 2.5555 rounded half-up.
    expect(formatIn(64_910_000)).toBe('2.5555');
    // 0.00005 in would be a 5-decimal value: 1270 nm shows as 0.00005, not rounded.
    expect(formatIn(1270)).toBe('0.00005');
    // 1 mm = 0.0393700787… in → 0.0394.
    expect(formatIn(1_000_000)).toBe('0.0394');
  });

  it('when a value lies exactly half-way at trade resolution, then it rounds half-up', () => {
    // 1270 nm = exactly 0.00005 in: formatIn keeps it (a typed 5-decimal value), formatLength rounds up.
    expect(formatLength(1270, 'in')).toBe('0.0001 in');
    // 500 nm = exactly 0.0005 mm → 0.001 mm.
    expect(formatLength(500, 'mm')).toBe('0.001 mm');
    // 1271 nm = 0.0000500393… in, not on the 254 nm grid → rounded to 0.0001.
    expect(formatIn(1271)).toBe('0.0001');
    expect(formatIn(1269)).toBe('0.0000');
  });

  it('when a value is not whole nanometres, then formatting refuses it', () => {
    expect(() => formatMm(1.5)).toThrow(LengthError);
    expect(() => formatIn(Number.NaN)).toThrow(LengthError);
    expect(isNm(3)).toBe(true);
    expect(isNm(3.1)).toBe(false);
  });

  it('when a length goes to the API, then both units come back as strings', () => {
    expect(toLengthJson(64_909_700)).toEqual({ mm: '64.9097', in: '2.5555' });
    expect(toLengthJson(64_910_000)).toEqual({ mm: '64.910', in: '2.5555' });
  });

  it('when a length is shown at trade resolution, then mm has 3 decimals and inches 4', () => {
    expect(formatLength(64_909_700, 'in')).toBe('2.5555 in');
    expect(formatLength(64_910_000, 'mm')).toBe('64.910 mm');
    expect(formatLength(64_909_700, 'mm')).toBe('64.910 mm'); // 64.9097 rounded half-up
    expect(formatLength(64_909_700, 'mm', false)).toBe('64.910');
  });
});

describe('negative differences (a step that falls short of the wear)', () => {
  it('when a difference is negative, then it reads with a minus sign at trade resolution', () => {
    // 0.12 mm short: 120 000 nm. 0.12 / 25.4 = 0.0047244… in → 0.0047 (NIST SP 811 factor, by hand).
    expect(formatLength(-120_000, 'mm')).toBe('\u22120.120 mm');
    expect(formatLength(-120_000, 'in')).toBe('\u22120.0047 in');
    // 0.030 in short: 762 000 nm.
    expect(formatLength(-762_000, 'in', false)).toBe('\u22120.0300');
  });

  it('when a negative difference rounds to nothing at trade resolution, then it reads as zero', () => {
    // 400 nm = 0.0004 mm → 0.000; 1000 nm = 0.0000394 in → 0.0000.
    expect(formatLength(-400, 'mm')).toBe('0.000 mm');
    expect(formatLength(-1000, 'in')).toBe('0.0000 in');
  });

  it('when the API sends a negative length, then it reads back to the same nanometres', () => {
    // The API's own form of -762 000 nm: formatMm gives "-0.762", formatIn "-0.0300".
    expect(lengthJsonToNm({ mm: '-0.762', in: '-0.0300' }, 'mm')).toBe(-762_000);
    expect(lengthJsonToNm({ mm: '-0.762', in: '-0.0300' }, 'in')).toBe(-762_000);
    expect(lengthJsonToNm({ mm: '64.9097', in: '2.5555' }, 'in')).toBe(64_909_700);
    expect(lengthJsonToNm({ mm: '-0.000', in: '-0.0000' }, 'mm')).toBe(0);
    expect(() => lengthJsonToNm({ mm: '--1', in: '1' }, 'mm')).toThrow(LengthError);
  });
});

describe('exact arithmetic and read-back', () => {
  it('when 0.0015 in clearance is added to a 2.5555 in skirt, then the sum is 2.5570 in exactly', () => {
    // Decimal addition by hand: 2.5555 + 0.0015 = 2.5570; in nm 64 909 700 + 38 100 = 64 947 800.
    const sum = inToNm('2.5555') + inToNm('0.0015');
    expect(sum).toBe(64_947_800);
    expect(formatIn(sum)).toBe('2.5570');
    expect(sum).toBe(inToNm('2.5570'));
  });

  it('when every 4- and 5-decimal inch value is typed, then it reads back digit for digit', () => {
    // A sweep of 0.0001 in steps over a bore range, plus 5-decimal values: no drift anywhere.
    for (let tenThousandths = 10_000; tenThousandths <= 50_000; tenThousandths += 7) {
      const typed = (tenThousandths / 10_000).toFixed(4);
      expect(formatIn(inToNm(typed))).toBe(typed);
    }
    for (const typed of ['0.00001', '2.55551', '3.12345', '1.99999', '0.0001', '4.0000']) {
      expect(formatIn(inToNm(typed))).toBe(typed);
    }
  });

  it('when millimetre values are typed, then formatMm reads them back exactly', () => {
    for (const typed of ['54.000', '54.250', '64.910', '0.001', '72.9995', '1999.999999']) {
      expect(formatMm(mmToNm(typed))).toBe(typed);
    }
  });

  it('when the convenience helpers get another unit or bad text, then they throw', () => {
    expect(() => inToNm('64 mm')).toThrow(LengthError);
    expect(() => mmToNm('abc')).toThrow(LengthError);
    expect(inToNm('0')).toBe(0);
  });
});

describe('agreement with the npm library convert-units', () => {
  // convert-units 2.3.4 converts through feet and metres with the rounded factor 3.28084 ft/m, so it
  // differs from the exact 25.4 mm/in by a few parts in 10^7; we expect agreement to 0.00001 mm.
  it.each([
    ['1', 25.4],
    ['2.5555', 64.9097],
    ['2.5570', 64.9478],
    ['0.0015', 0.0381],
    ['3.1250', 79.375],
    ['0.010', 0.254],
  ])(
    'when %s in is converted, then it agrees with convert-units and with 25.4 mm/in exactly',
    (inches, mm) => {
      const nm = inToNm(inches);
      expect(nm / 1_000_000).toBe(mm); // exact factor (NIST SP 811), multiplied by hand
      expect(convert(Number(inches)).from('in').to('mm')).toBeCloseTo(mm, 5);
    },
  );

  it.each([['54.00'], ['54.25'], ['64.91'], ['100'], ['0.25']])(
    'when %s mm is converted to inches, then formatIn agrees with convert-units at 4 decimals',
    (mm) => {
      const fromLibrary = convert(Number(mm)).from('mm').to('in');
      expect(Number(formatIn(mmToNm(mm)))).toBeCloseTo(fromLibrary, 4);
    },
  );
});
