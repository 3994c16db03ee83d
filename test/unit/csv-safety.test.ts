import { neutralizeCell, neutralizeRow } from '../../shared/csv-safety';

describe('neutralizeCell', () => {
  // OWASP "CSV Injection" guidance: prefix cells that begin with =, +, -, @, tab (0x09) or carriage
  // return (0x0D) with a single quote so spreadsheets show them as text instead of running a formula.
  it.each([
    ['=1+2', "'=1+2"],
    ['+41 555 0100', "'+41 555 0100"],
    ['-2+3', "'-2+3"],
    ['@SUM(A1:A2)', "'@SUM(A1:A2)"],
    ['\t=1', "'\t=1"],
    ['\r=1', "'\r=1"],
    // OWASP ASVS 5.0 V1.2.10 names the null character (0x00) too.
    ['\0=1+2', "'\0=1+2"],
  ])(
    'when a cell starts with a formula character (%j), then a single quote is put first',
    (cell, safe) => {
      expect(neutralizeCell(cell)).toBe(safe);
    },
  );

  it.each([['Piston +0.25 mm'], ['54.250'], [''], ["'already quoted"], [' =not first']])(
    'when a cell does not start with one (%j), then it is left alone',
    (cell) => {
      expect(neutralizeCell(cell)).toBe(cell);
    },
  );

  it('when a row is neutralized, then each cell is treated', () => {
    expect(neutralizeRow(['STD', '=HYPERLINK("x")', '3'])).toEqual([
      'STD',
      '\'=HYPERLINK("x")',
      '3',
    ]);
  });

  it('when the cell is not text, then it throws rather than guess', () => {
    expect(() => neutralizeCell(12 as unknown as string)).toThrow(/takes text/);
  });
});
