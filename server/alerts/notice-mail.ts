// The customer's notice that a job is ready to collect, in our own words: the job number, the
// sizes recorded for each cylinder (the customer's copy of the job), advice for running the
// engine in, and the shop's hours. Queued by the database when a job becomes ready (see the
// job-ready migration); written when the worker sends it, so it carries the latest sizes.
import type { Knex } from 'knex';
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import { registerMailTemplate, TemplateError } from '../mail/mail-templates';
import { getSettings } from '../settings/settings-service';
import { formatLength } from '../../shared/lengths';
import { jobReadySizes, type ReadySizeRow } from './alerts-repository';

/** Both units, so the copy reads the same whoever looks at it: "64.453 mm (2.5375 in)". */
function both(nm: number): string {
  return `${formatLength(nm, 'mm')} (${formatLength(nm, 'in')})`;
}

/** Per cylinder: the step, the finished bore, the clearance to its piston and the ring gap. */
export function sizeFacts(rows: ReadySizeRow[]): Array<[string, string]> {
  const facts: Array<[string, string]> = [];
  for (const r of rows) {
    const which = rows.length === 1 ? '' : `Cylinder ${r.n}, `;
    const cap = (s: string) => (which ? s : s.charAt(0).toUpperCase() + s.slice(1));
    if (r.step_label) facts.push([`${which}${cap('oversize')}`, r.step_label]);
    if (r.measured_after_hone_nm !== null) {
      facts.push([`${which}${cap('finished bore')}`, both(r.measured_after_hone_nm)]);
      // Clearance is the finished bore less the measured skirt of the piston fitted to it.
      if (r.skirt_nm !== null && r.measured_after_hone_nm >= r.skirt_nm) {
        facts.push([
          `${which}${cap('piston clearance')}`,
          both(r.measured_after_hone_nm - r.skirt_nm),
        ]);
      }
    }
    if (r.ring_gap_nm !== null) facts.push([`${which}${cap('ring end gap')}`, both(r.ring_gap_nm)]);
  }
  return facts;
}

// Running-in advice in our own words: common practice (no source). The engine maker's own
// instructions come first, and the mail says so.
const RUNNING_IN =
  'Running the engine in: for its first hours, warm it up gently, keep to moderate and varied ' +
  'speeds and loads, avoid long spells at full throttle and long idling, and let it cool between ' +
  'runs. Check for leaks and listen for unusual noise. Where the engine maker’s running-in ' +
  'instructions or oil and fuel-mix advice differ from this, follow theirs.';

export async function jobReadyMail(k: Knex, jobId: string): Promise<MailContent> {
  const job = await k('jobs').where({ id: jobId }).first('number', 'customer_name', 'cylinders');
  if (!job) throw new TemplateError(`The job ${jobId} no longer exists.`);
  const settings = await getSettings(k);
  const one = job.cylinders === 1;
  const what = one ? 'your cylinder' : `your ${job.cylinders as number} cylinders`;
  const sizes = sizeFacts(await jobReadySizes(jobId, k));
  return composeMail({
    shopName: settings.shopName,
    appUrl: config.appUrl,
    subject: `${settings.shopName}: job ${job.number} is ready to collect`,
    heading: `Job ${job.number} is ready`,
    paragraphs: [
      `Dear ${job.customer_name as string}, the work on ${what} is finished: ${one ? 'it is' : 'they are'} ready to collect, with the pistons matched to ${one ? 'it' : 'them'}.`,
      sizes.length > 0
        ? 'The sizes we recorded are below; keep this e-mail as your copy of the job.'
        : 'The sizes we recorded are on the job sheet you get when you collect.',
      RUNNING_IN,
      'Please bring your job number when you come by.',
    ],
    facts: [['Job number', job.number as string], ...sizes],
    closing: settings.shopHours ? `Our hours: ${settings.shopHours}` : undefined,
  });
}

registerMailTemplate('job-ready', (k, data) => {
  const jobId = data['jobId'];
  if (typeof jobId !== 'string') throw new TemplateError('The job notice needs a jobId.');
  return jobReadyMail(k, jobId);
});
