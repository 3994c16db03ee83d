// After honing, through the API: a forged piston's own clearance range, the honed bore checked
// against it, the ring end gap suggested from the bore and checked, and the honing lines of the
// sheet — each figure worked by hand in inches (1 in = 25.4 mm exactly, NIST SP 811).
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp } from '../support/api';
import {
  benchShop,
  CUT_SETTINGS,
  jobAtStep,
  makePart,
  receivePistons,
} from '../support/jobs-fixtures';

const { owner, machinist, staff, family, bin } = benchShop({ cylinders: 1, machinistUnit: 'in' });

beforeAll(async () => {
  await saveSettings(null, { ...CUT_SETTINGS, cutOnlyAfterApproval: false });
});
afterAll(closeTestApp);

describe('a family with a forged range, a ring-gap factor and honing figures', () => {
  it('when the owner sets them, then they read back; half a forged range, a factor of 0.05 or a 5° crosshatch are refused by field', async () => {
    const saved = await owner.patch(`/api/engine-families/${family.id}`, {
      forgedClearanceMin: '0.0025 in',
      forgedClearanceMax: '0.0035 in',
      ringGapPerBore: '0.0045',
      honeCrosshatch: 50,
      honeGrits: 'coarse 280, plateau 400',
    });
    expect(saved.status).toBe(200);
    expect(saved.body.forgedClearance).toEqual({
      min: { mm: '0.0635', in: '0.0025' },
      max: { mm: '0.0889', in: '0.0035' },
    });
    expect(saved.body.ringGapPerBore).toBe('0.0045');
    expect(saved.body.hone).toEqual({ crosshatchDeg: 50, grits: 'coarse 280, plateau 400' });

    const half = await owner.patch(`/api/engine-families/${family.id}`, {
      forgedClearanceMax: null,
    });
    expect(half.status).toBe(400);
    expect(half.body.error.details[0].field).toBe('forgedClearanceMax');
    for (const [field, value] of [
      ['ringGapPerBore', '0.05'],
      ['ringGapPerBore', 'a lot'],
      ['honeCrosshatch', 5],
    ] as const) {
      const res = await owner.patch(`/api/engine-families/${family.id}`, { [field]: value });
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
    }
  });
});

describe('a forged piston through the sheet, the cut and the hone', () => {
  let job: { id: string };

  beforeAll(async () => {
    const part = await makePart(owner, family, '+0.040 in', 'piston');
    expect((await owner.patch(`/api/parts/${part}`, { material: 'forged' })).status).toBe(200);
    const [unit] = await receivePistons(owner, part, bin.id, ['2.5555 in']);
    job = await jobAtStep(staff, machinist, family, '+0.040 in');
    expect(
      (await machinist.post(`/api/jobs/${job.id}/holds`, { cylinder: 1, unitId: unit.id })).status,
    ).toBe(201);
  });

  it('when the sheet is printed, then the forged range sets the clearance and the ring gap is suggested from the finished bore', async () => {
    const res = await machinist.get(`/api/jobs/${job.id}/cylinders/1/bore-sheet`);
    expect(res.status).toBe(200);
    // The shop's policy is the least clearance of the range; for a forged piston 0.0025 in, so the
    // finished bore is 2.5555 + 0.0025 = 2.5580 in.
    expect(res.body.clearance.in).toBe('0.0025');
    expect(res.body.clearanceRange).toEqual({
      min: { mm: '0.0635', in: '0.0025' },
      max: { mm: '0.0889', in: '0.0035' },
    });
    expect(res.body.finishedBore.in).toBe('2.5580');
    // Gap: 2.5580 in = 64.9732 mm; × 0.0045 = 0.2923794 mm, rounded up to 0.293 mm = 0.011535 in.
    expect(res.body.ringGapSuggested).toEqual({ mm: '0.293', in: '0.0115' });
    expect(res.body.honedFit).toBeNull();
    expect(res.body.honing).toEqual([
      'Grits: coarse 280, plateau 400.',
      "Crosshatch: aim for about 50° included angle; set spindle speed and stroke rate by the hone maker's chart.",
      "Engine stroke 2.2000 in: set the hone's travel so the stones run just past both ends of ring travel, without dropping out of the bore.",
      'Hone after the ports are chamfered, so the stones do not catch a sharp port edge.',
    ]);
  });

  it('when the honed bore and ring gap are recorded, then the job and the sheet say in range, loose or tight, and by how much', async () => {
    expect((await machinist.post(`/api/jobs/${job.id}/cylinders/1/cut`)).status).toBe(200);
    // 2.5582 − 2.5555 = 0.0027 in: inside the forged 0.0025–0.0035 in (loose for a cast piston).
    const inRange = await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, {
      measuredAfterHone: '2.5582 in',
    });
    expect(inRange.status).toBe(200);
    expect(inRange.body.honedFit.verdict).toBe('in_range');
    expect(inRange.body.honedFit.text).toBe(
      'Clearance 0.0027 in: in range (0.0025 in to 0.0035 in for a forged piston).',
    );
    // Gap for the honed bore: 2.5582 in = 64.97828 mm × 0.0045 = 0.29240 mm → 0.293 mm (0.0115 in).
    expect(inRange.body.ringGapSuggested.mm).toBe('0.293');
    // 0.0100 in = 0.254 mm measured: tight by 0.039 mm = 0.0015 in.
    const gap = await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, { ringGap: '0.0100 in' });
    expect(gap.status).toBe(200);
    expect(gap.body.ringGapCheck).toEqual({
      verdict: 'tight',
      text: 'Ring end gap 0.0100 in: tight by 0.0015 in — file the ring to at least 0.0115 in, or its ends may butt when hot.',
    });

    // Honed on to 2.5600 in: 2.5600 − 2.5555 = 0.0045 in, over 0.0035 by 0.0010 in.
    const loose = await machinist.patch(`/api/jobs/${job.id}/cylinders/1`, {
      measuredAfterHone: '2.5600 in',
    });
    expect(loose.status).toBe(200);
    expect(loose.body.honedFit.verdict).toBe('loose');
    expect(loose.body.honedFit.text).toMatch(/loose by 0\.0010 in .*the piston will rock/);
    const sheet = await machinist.get(`/api/jobs/${job.id}/cylinders/1/bore-sheet`);
    expect(sheet.body.honedFit.verdict).toBe('loose');
  });
});
