// The customer's notice that a job is ready to collect, in our own words, with the job number and
// the shop's hours. Queued by the database when a job becomes ready (see the job-ready migration).
import type { Knex } from 'knex';
import { config } from '../config';
import { composeMail, type MailContent } from '../mail/mail-layout';
import { registerMailTemplate, TemplateError } from '../mail/mail-templates';
import { getSettings } from '../settings/settings-service';

export async function jobReadyMail(k: Knex, jobId: string): Promise<MailContent> {
  const job = await k('jobs').where({ id: jobId }).first('number', 'customer_name', 'cylinders');
  if (!job) throw new TemplateError(`The job ${jobId} no longer exists.`);
  const settings = await getSettings(k);
  const one = job.cylinders === 1;
  const what = one ? 'your cylinder' : `your ${job.cylinders as number} cylinders`;
  return composeMail({
    shopName: settings.shopName,
    appUrl: config.appUrl,
    subject: `${settings.shopName}: job ${job.number} is ready to collect`,
    heading: `Job ${job.number} is ready`,
    paragraphs: [
      `Dear ${job.customer_name as string}, the work on ${what} is finished: ${one ? 'it is' : 'they are'} ready to collect, with the pistons matched to ${one ? 'it' : 'them'} and the sizes we recorded.`,
      'Please bring your job number when you come by.',
    ],
    facts: [['Job number', job.number as string]],
    closing: settings.shopHours ? `Our hours: ${settings.shopHours}` : undefined,
  });
}

registerMailTemplate('job-ready', (k, data) => {
  const jobId = data['jobId'];
  if (typeof jobId !== 'string') throw new TemplateError('The job notice needs a jobId.');
  return jobReadyMail(k, jobId);
});
