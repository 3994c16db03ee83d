/**
 * True for what a keyboard-wedge barcode scanner types into a search: the digits of a GTIN (8, 12,
 * 13 or 14 of them) or one of our piston labels (PU-000123).
 */
export function looksScanned(text: string): boolean {
  const t = text.trim();
  return /^[0-9]{8}$|^[0-9]{12,14}$/.test(t) || /^PU-[0-9]{6,}$/i.test(t);
}
