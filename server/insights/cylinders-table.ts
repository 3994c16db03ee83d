// The CSV form of "cylinders near their last step": the rows the page shows, with the customer's
// contact so the list can be worked through by phone or mail.
import type { NearLastStepAnswer, NearLastStepItemJson } from '../../shared/api/customers';
import type { CsvTable } from './insights-csv';

export function nearLastStepTable(answer: NearLastStepAnswer): CsvTable<NearLastStepItemJson> {
  return {
    name: `cylinders-near-last-step-within-${answer.within}`,
    columns: [
      { header: 'Mark', text: (r) => r.mark },
      { header: 'Customer', text: (r) => r.customerName },
      { header: 'Phone', text: (r) => r.phone },
      { header: 'E-mail', text: (r) => r.email },
      { header: 'Family', text: (r) => r.familyCode },
      { header: 'Bores', value: (r) => r.bores },
      { header: 'Last bore date', value: (r) => r.lastBore.date },
      { header: 'Last step', text: (r) => r.lastBore.stepLabel },
      { header: 'Last finished bore (mm)', value: (r) => r.lastBore.finishedBore.mm },
      { header: 'Last finished bore (in)', value: (r) => r.lastBore.finishedBore.in },
      { header: 'Last job', text: (r) => r.lastBore.jobNumber },
      { header: 'Steps left', value: (r) => r.stepsLeft },
    ],
    rows: answer.items,
  };
}
