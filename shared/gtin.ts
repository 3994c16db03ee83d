// GTIN check digits (GS1 General Specifications, section 7.9: the standard modulo-10 check digit).
// The shop scans EAN-13 and UPC-A (GTIN-12) codes on piston and ring boxes; GTIN-8 and GTIN-14 are accepted
// too so that a case code or a small-pack code does not get refused at the receiving bench.

export const GTIN_LENGTHS = [8, 12, 13, 14] as const;

/**
 * The check digit for the digits before it. Weights run 3, 1, 3, 1 … from the rightmost body digit, so the
 * same rule serves every GTIN length.
 */
export function gtinCheckDigit(bodyDigits: string): number {
  if (!/^[0-9]+$/.test(bodyDigits)) {
    throw new Error(`A GTIN body must be digits only (got "${bodyDigits}").`);
  }
  let sum = 0;
  for (let i = 0; i < bodyDigits.length; i++) {
    const digit = bodyDigits.charCodeAt(bodyDigits.length - 1 - i) - 48;
    sum += digit * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** Why a code is not a valid GTIN, or null when it is. Spaces and hyphens are ignored. */
export function gtinProblem(code: string): string | null {
  if (typeof code !== 'string') return 'A GTIN must be text.';
  const digits = stripSeparators(code);
  if (digits === '') return 'Enter a GTIN (the number under the barcode).';
  if (!/^[0-9]+$/.test(digits)) return 'A GTIN has digits only.';
  if (!(GTIN_LENGTHS as readonly number[]).includes(digits.length)) {
    return `A GTIN has 8, 12, 13 or 14 digits (got ${digits.length}).`;
  }
  const expected = gtinCheckDigit(digits.slice(0, -1));
  if (Number(digits[digits.length - 1]) !== expected) {
    return `Check digit does not match: the last digit should be ${expected}. Check for a mistyped digit.`;
  }
  return null;
}

export function isValidGtin(code: string): boolean {
  return gtinProblem(code) === null;
}

/**
 * The 14-digit form of a valid GTIN (zeros on the left, as GS1 asks databases to store GTINs), so an EAN-13
 * and the UPC-A it contains compare equal; null when the code is not a valid GTIN.
 */
export function normalizeGtin(code: string): string | null {
  if (!isValidGtin(code)) return null;
  return stripSeparators(code).padStart(14, '0');
}

function stripSeparators(code: string): string {
  return code.replace(/[\s-]/g, '');
}
