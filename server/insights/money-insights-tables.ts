// The CSV form of the money figures: the rows the page shows, a total row where the page has one,
// and the currency named in the headers so the file reads without the page beside it.
import type {
  DepositsHeldAnswer,
  EstimatesAnswer,
  OutstandingAnswer,
  RevenueAnswer,
} from '../../shared/api/insights';
import type { CsvTable } from './insights-csv';

type RevenueRow = RevenueAnswer['months'][number];

export function revenueTable(answer: RevenueAnswer): CsvTable<RevenueRow> {
  const c = answer.currency;
  return {
    name: `revenue-by-month-${answer.period.from}-to-${answer.period.to}`,
    columns: [
      { header: 'Month', value: (r) => r.month },
      { header: 'Invoices', value: (r) => r.invoices },
      { header: `Labour (${c})`, value: (r) => r.labour },
      { header: `Parts (${c})`, value: (r) => r.parts },
      { header: `Other lines (${c})`, value: (r) => r.other },
      { header: `Tax (${c})`, value: (r) => r.tax },
      { header: `Invoiced (${c})`, value: (r) => r.invoiced },
      { header: `Credit notes (${c})`, value: (r) => r.credited },
    ],
    rows: [...answer.months, { month: 'Total', ...answer.totals }],
  };
}

type EstimateRow = Omit<EstimatesAnswer['months'][number], 'month'> & { month: string };

export function estimatesTable(answer: EstimatesAnswer): CsvTable<EstimateRow> {
  return {
    name: `estimates-by-month-${answer.period.from}-to-${answer.period.to}`,
    columns: [
      { header: 'Month first sent', value: (r) => r.month },
      { header: 'Sent', value: (r) => r.sent },
      { header: 'Approved', value: (r) => r.approved },
      { header: 'Declined', value: (r) => r.declined },
      { header: 'Waiting', value: (r) => r.waiting },
      { header: 'Approval rate', value: (r) => r.approvalRate },
      { header: 'Median days to approve', value: (r) => r.medianDaysToApprove },
    ],
    rows: [...answer.months, { ...answer.totals, month: 'Total' }],
  };
}

type OutstandingRow = OutstandingAnswer['items'][number];

export function outstandingTable(answer: OutstandingAnswer): CsvTable<OutstandingRow> {
  const c = answer.currency;
  return {
    name: 'balances-owed',
    columns: [
      { header: 'Job', text: (r) => r.jobNumber },
      { header: 'Customer', text: (r) => r.customerName },
      { header: 'Invoice', value: (r) => r.invoiceNumber },
      { header: 'Issued', value: (r) => r.issuedAt },
      { header: `Total (${c})`, value: (r) => r.total },
      { header: `Credit notes (${c})`, value: (r) => r.credited },
      { header: `Paid (${c})`, value: (r) => r.paid },
      { header: `Still owed (${c})`, value: (r) => r.balance },
      { header: 'Days owed', value: (r) => r.daysOwed },
    ],
    rows: answer.items,
  };
}

type DepositRow = DepositsHeldAnswer['items'][number];

export function depositsHeldTable(answer: DepositsHeldAnswer): CsvTable<DepositRow> {
  return {
    name: 'deposits-held',
    columns: [
      { header: 'Job', text: (r) => r.jobNumber },
      { header: 'Customer', text: (r) => r.customerName },
      { header: 'Job state', value: (r) => r.jobState },
      { header: `Deposit (${answer.currency})`, value: (r) => r.amount },
      { header: 'Paid', value: (r) => r.paidAt },
      { header: 'To give back', value: (r) => (r.toGiveBack ? 'yes' : 'no') },
    ],
    rows: answer.items,
  };
}
