// Everything the shop holds about one customer, for the customer's own request: the record, their
// jobs, their cylinders and bores, and the e-mail queued to their address. JSON whole, or CSV
// with one line per record for a spreadsheet.
import type { Knex } from 'knex';
import { db } from '../db/knex';
import type { CsvTable } from '../insights/insights-csv';
import type { CustomerExportJson } from '../../shared/api/customers';
import * as repo from './customers-repository';
import { getCustomer } from './customers-service';
import { listCylinders } from './cylinders-service';

export async function exportCustomer(id: string, k: Conn = db): Promise<CustomerExportJson> {
  const customer = await getCustomer(id, k);
  const [jobs, { items: cylinders }, mail] = await Promise.all([
    repo.jobsOfCustomer(id, k),
    listCylinders(id, k),
    customer.email ? repo.mailToAddress(customer.email, k) : Promise.resolve([]),
  ]);
  return {
    exportedAt: new Date().toISOString(),
    customer,
    cylinders,
    jobs: jobs.map((j) => ({
      id: j.id,
      number: j.number,
      state: j.state,
      familyCode: j.family_code,
      cylinders: j.cylinders,
      askedFor: j.asked_for,
      notes: j.notes,
      dueDate: j.due_date,
      notifyCustomer: j.notify_customer,
      createdAt: j.created_at.toISOString(),
      closedAt: j.closed_at ? j.closed_at.toISOString() : null,
    })),
    mail: mail.map((m) => ({
      template: m.template ?? 'message',
      status: m.status,
      createdAt: m.created_at.toISOString(),
    })),
  };
}

type Conn = Knex;

interface ExportLine {
  record: string;
  id: string;
  reference: string;
  name?: string | null;
  phone?: string | null;
  email?: string | null;
  acceptsEmail?: string;
  state?: string;
  family?: string;
  date?: string | null;
  step?: string | null;
  finishedBoreMm?: string;
  notes?: string;
}

export function exportCsvTable(data: CustomerExportJson): CsvTable<ExportLine> {
  const c = data.customer;
  const lines: ExportLine[] = [
    {
      record: 'customer',
      id: c.id,
      reference: '',
      name: c.name,
      phone: c.phone,
      email: c.email,
      acceptsEmail: c.acceptsEmail ? 'yes' : 'no',
      date: c.createdAt.slice(0, 10),
      notes: c.notes,
    },
    ...data.jobs.map((j) => ({
      record: 'job',
      id: j.id,
      reference: j.number,
      state: j.state,
      family: j.familyCode,
      date: j.createdAt.slice(0, 10),
      notes: [j.askedFor, j.notes].filter((t) => t !== '').join(' / '),
    })),
    ...data.cylinders.flatMap((y) => [
      {
        record: 'cylinder',
        id: y.id,
        reference: y.mark,
        family: y.familyCode,
        notes: y.castNumber ?? '',
      },
      ...y.bores.map((b) => ({
        record: 'bore',
        id: y.id,
        reference: `${y.mark} in ${b.jobNumber}`,
        family: y.familyCode,
        date: b.date,
        step: b.stepLabel,
        finishedBoreMm: b.finishedBore.mm,
      })),
    ]),
    ...data.mail.map((m) => ({
      record: 'mail',
      id: '',
      reference: m.template,
      state: m.status,
      date: m.createdAt.slice(0, 10),
    })),
  ];
  return {
    name: `customer-${c.id.slice(0, 8)}`,
    rows: lines,
    columns: [
      { header: 'record', value: (l) => l.record },
      { header: 'id', value: (l) => l.id },
      { header: 'reference', text: (l) => l.reference },
      { header: 'name', text: (l) => l.name },
      { header: 'phone', text: (l) => l.phone },
      { header: 'email', text: (l) => l.email },
      { header: 'accepts email', value: (l) => l.acceptsEmail },
      { header: 'state', value: (l) => l.state },
      { header: 'family', text: (l) => l.family },
      { header: 'date', value: (l) => l.date },
      { header: 'step', text: (l) => l.step },
      { header: 'finished bore mm', value: (l) => l.finishedBoreMm },
      { header: 'notes', text: (l) => l.notes },
    ],
  };
}
