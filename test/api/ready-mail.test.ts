// The customer's "ready to collect" e-mail is their copy of the job: for each cylinder the
// oversize, the finished bore, the clearance to the piston fitted and the ring end gap, in both
// units, with running-in advice that defers to the engine maker. Delivered to a real SMTP server
// on loopback. Conversions use 1 in = 25.4 mm exactly (the international inch, 1959).
import { db } from '../../server/db/knex';
import { saveSettings } from '../../server/settings/settings-service';
import { closeTestApp, signedInClients } from '../support/api';
import { localMailbox } from '../support/mailbox';
import { jobAtStep, makeFamily, makeJob, pistonsOnShelf } from '../support/jobs-fixtures';

const smtp = localMailbox();
const { owner, machinist, staff } = signedInClients({ owner: 'mm', machinist: 'mm', staff: 'mm' });

beforeAll(async () => {
  await saveSettings(null, { timeZone: 'UTC', shopName: 'Quarry Bend Cylinder Works' });
});
afterAll(closeTestApp);

describe('the ready-to-collect e-mail', () => {
  it('when a bored and honed job is ready, then the e-mail gives the sizes recorded and running-in advice', async () => {
    const { family, units } = await pistonsOnShelf(owner, '+0.020 in', ['2.5360 in']);
    const [unit] = units;
    const job = await jobAtStep(staff, machinist, family, '+0.020 in', {
      customerEmail: 'wenna.stroud@example.test',
    });
    const hold = await machinist.post(`/api/jobs/${job.id}/holds`, {
      cylinder: 1,
      unitId: unit.id,
    });
    expect(hold.status).toBe(201);
    // Bored and honed to 2.5375 in (64 452 500 nm), ring end gap 0.0120 in (304 800 nm).
    await db('job_cylinders')
      .where({ job_id: job.id, n: 1 })
      .update({ cut_at: db.fn.now(), measured_after_hone_nm: 64_452_500, ring_gap_nm: 304_800 });
    expect((await machinist.patch(`/api/jobs/${job.id}`, { state: 'ready_to_go' })).status).toBe(
      200,
    );
    await smtp.deliver();
    const [mail] = smtp.received.filter((m) => m.subject.includes(job.number));
    expect(mail).toBeDefined();
    const text = mail.text.replace(/\s+/g, ' ');
    expect(text).not.toContain('the sizes we recorded.');
    expect(text).toContain('The sizes we recorded are below');
    expect(text).toMatch(/Oversize: \+0\.020 in/);
    // 2.5375 × 25.4 = 64.4525 mm, 64.453 mm at the trade's 0.001 mm (half up).
    expect(text).toMatch(/Finished bore: 64\.453 mm \(2\.5375 in\)/);
    // 2.5375 − 2.5360 = 0.0015 in = 0.0381 mm.
    expect(text).toMatch(/Piston clearance: 0\.038 mm \(0\.0015 in\)/);
    // 0.012 × 25.4 = 0.3048 mm.
    expect(text).toMatch(/Ring end gap: 0\.305 mm \(0\.0120 in\)/);
    expect(text).toContain('Running the engine in');
    expect(text).toContain('engine maker’s running-in instructions');
    expect(mail.html).toContain('Piston clearance');
  });

  it('when nothing was measured after honing, then the e-mail says where the sizes are instead of promising them', async () => {
    const family = await makeFamily(owner, { cylinders: 1 });
    const job = await makeJob(staff, family.id, { customerEmail: 'oren.blythe@example.test' });
    expect((await machinist.patch(`/api/jobs/${job.id}`, { state: 'ready_to_go' })).status).toBe(
      200,
    );
    await smtp.deliver();
    const [mail] = smtp.received.filter((m) => m.subject.includes(job.number));
    const text = mail.text.replace(/\s+/g, ' ');
    expect(text).not.toMatch(/Finished bore|Piston clearance/);
    expect(text).toContain('The sizes we recorded are on the job sheet');
  });
});
