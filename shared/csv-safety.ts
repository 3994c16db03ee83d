// Spreadsheet formula injection: a CSV cell that begins with =, +, -, @, tab, carriage return or NUL may be
// run as a formula (a leading NUL is dropped by some spreadsheets, exposing what follows it) when the export is opened in a spreadsheet. Such cells get a leading single quote so they
// are shown as text. Numbers we write ourselves (including negative ones) should go through as numbers,
// not through this function.

const DANGEROUS_START = /^[=+\-@\t\r\0]/;

export function neutralizeCell(value: string): string {
  if (typeof value !== 'string') throw new Error('neutralizeCell takes text.');
  return DANGEROUS_START.test(value) ? `'${value}` : value;
}

export function neutralizeRow(values: readonly string[]): string[] {
  return values.map(neutralizeCell);
}
