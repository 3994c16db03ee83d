import { gtinCheckDigit, gtinProblem, isValidGtin, normalizeGtin } from '../../shared/gtin';

describe('gtinCheckDigit', () => {
  it('when the GS1 worked example body 629104150021 is used, then the check digit is 3', () => {
    // GS1 General Specifications, section 7.9 check digit calculation: weights 1,3,1,3… from the left on the
    // 12-digit body give 6+6+9+3+0+12+1+15+0+0+2+3 = 57; 60 − 57 = 3; full number 6291041500213.
    expect(gtinCheckDigit('629104150021')).toBe(3);
  });

  it('when a UPC-A body is used, then weights start at 3 on the rightmost body digit', () => {
    // GS1 General Specifications, section 7.9 check digit calculation, GTIN-12 row; worked by hand for the
    // UPC-A example 03600029145 (Wikipedia "Universal Product Code", check digit section):
    // 0·3+3·1+6·3+0·1+0·3+0·1+2·3+9·1+1·3+4·1+5·3 = 58 → 60 − 58 = 2.
    expect(gtinCheckDigit('03600029145')).toBe(2);
  });

  it('when the body sum is already a multiple of ten, then the check digit is 0', () => {
    // GS1 General Specifications, section 7.9: "subtract the sum from the nearest equal or higher multiple
    // of ten" — 0 when the sum ends in 0. Body 0000005 (GTIN-8): 5·3 = 15 → 5; body 0000000 → 0.
    expect(gtinCheckDigit('0000000')).toBe(0);
    expect(gtinCheckDigit('0000005')).toBe(5);
  });

  it('when the body has anything but digits, then it throws', () => {
    expect(() => gtinCheckDigit('12a4')).toThrow(/digits only/);
    expect(() => gtinCheckDigit('')).toThrow(/digits only/);
  });
});

describe('isValidGtin and normalizeGtin', () => {
  // Invented GTIN-8 body worked by hand with the GS1 section 7.9 rule:
  // 9638507 → 9·3+6·1+3·3+8·1+5·3+0·1+7·3 = 86 → 90 − 86 = 4.
  it.each([
    ['6291041500213', 'GS1 General Specifications, section 7.9 check digit calculation (GTIN-13)'],
    ['036000291452', 'UPC-A example, Wikipedia "Universal Product Code"'],
    ['96385074', 'GTIN-8 worked by hand with the GS1 section 7.9 rule'],
    ['629 1041 50021 3', 'the GS1 example with spaces as printed under a barcode'],
    ['0-36000-29145-2', 'the UPC-A example with hyphens'],
  ])('when %s is checked, then it is valid (%s)', (code) => {
    expect(isValidGtin(code)).toBe(true);
    expect(gtinProblem(code)).toBeNull();
  });

  it('when a GTIN-14 is built by hand from the GS1 example with indicator 1, then it is valid', () => {
    // GS1 General Specifications, section 7.9: GTIN-14 body 1629104150021, weights 3,1,3… from the left:
    // 3+6+6+9+3+0+12+1+15+0+0+2+3 = 60 → check digit 0.
    expect(gtinCheckDigit('1629104150021')).toBe(0);
    expect(isValidGtin('16291041500210')).toBe(true);
  });

  it.each([
    ['6291041500214', /should be 3/],
    ['036000291453', /should be 2/],
    ['6291041500231', /check digit/i], // two adjacent digits swapped (…0213 → …0231)
    ['62910415002', /8, 12, 13 or 14 digits/],
    ['629104150021X', /digits only/],
    ['', /enter a gtin/i],
  ])('when %s is checked, then it is invalid with a message', (code, message) => {
    expect(isValidGtin(code)).toBe(false);
    expect(gtinProblem(code)).toMatch(message);
  });

  it('when a UPC-A and the EAN-13 with a leading zero are normalized, then they compare equal', () => {
    // GS1 General Specifications: GTINs are held right-justified in a 14-digit field with leading zeros.
    expect(normalizeGtin('036000291452')).toBe('00036000291452');
    expect(normalizeGtin('0036000291452')).toBe('00036000291452');
    expect(normalizeGtin('629 1041 50021 3')).toBe('06291041500213');
    expect(normalizeGtin('6291041500214')).toBeNull();
  });
});
