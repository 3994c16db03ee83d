import { familyWarning, settingWarning } from '../../shared/settings-ranges';

// The usual ranges are common practice (no source), as shared/settings-ranges.ts marks them; these
// checks hold the trade's plain cases: a few hundredths of a millimetre to a millimetre per pass.
describe('settingWarning', () => {
  it('when the deepest cut per pass is a usual 0.020 in or 0.25 mm, then there is no caution', () => {
    expect(settingWarning('maxCutPerPass', '0.020 in')).toBeNull();
    expect(settingWarning('maxCutPerPass', '0.25 mm')).toBeNull();
  });

  it('when the deepest cut per pass is 0.5 in, then the caution gives the usual range in both units', () => {
    expect(settingWarning('maxCutPerPass', '0.5 in')).toBe(
      "Far outside the usual 0.0020–0.0394 in (0.050–1.000 mm) for a boring pass. Check the value; the machine maker's figures come first.",
    );
  });

  it('when a setting is not readable or has no usual range, then the schema speaks, not this', () => {
    expect(settingWarning('maxCutPerPass', 'deep')).toBeNull();
    expect(settingWarning('shopName', 'x')).toBeNull();
  });

  it('when a tax rate of 45 % is set, then it is questioned', () => {
    expect(settingWarning('taxRate', '45')).toBe(
      'Outside the usual 0–27 % for a tax rate. Check the value.',
    );
    expect(settingWarning('taxRate', '20')).toBeNull();
  });
});

describe('familyWarning', () => {
  // Usual piston-to-wall clearance and hone stock: common practice (no source), a few hundredths of
  // a millimetre; 0.5 mm of clearance is a slip of the decimal point.
  it('when a clearance of 0.5 mm is typed, then the usual range is shown', () => {
    expect(familyWarning('clearanceMin', '0.5', 'mm')).toBe(
      "Far outside the usual 0.010–0.150 mm (0.0004–0.0059 in) for a piston-to-wall clearance. Check the value; the machine maker's figures come first.",
    );
  });

  it('when a usual 0.0015 in clearance or 0.002 in of hone stock is typed, then there is no caution', () => {
    expect(familyWarning('clearanceMin', '0.0015', 'in')).toBeNull();
    expect(familyWarning('honeAllowance', '0.002', 'in')).toBeNull();
  });

  it('when a figure has no usual range (the stroke), then nothing is said', () => {
    expect(familyWarning('stroke', '500', 'mm')).toBeNull();
  });
});
