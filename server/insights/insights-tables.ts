// The CSV form of each insights answer: the same rows the page shows in its table, with headers a
// spreadsheet reader understands without the page beside it.
import type {
  AbcAnswer,
  DeadStockAnswer,
  ExposureAnswer,
  MonthlyAnswer,
  SalesAnswer,
  StockValueAnswer,
  SupplierReliabilityAnswer,
  TopSellersAnswer,
} from '../../shared/api/insights';
import type { CsvColumn, CsvTable } from './insights-csv';

const NO_FAMILY = 'No engine family';

interface PartNames {
  sku: string;
  description: string;
  familyCode: string | null;
  stepLabel: string | null;
}

/** The part a row is about, the same four columns in every report of parts. */
function partColumns<T extends PartNames>(): CsvColumn<T>[] {
  return [
    { header: 'Part number', text: (r) => r.sku },
    { header: 'Description', text: (r) => r.description },
    { header: 'Family', text: (r) => r.familyCode ?? NO_FAMILY },
    { header: 'Step', text: (r) => r.stepLabel ?? '' },
  ];
}

/** What was sold: units, revenue and margin, in every sales report. */
function salesColumns<
  T extends { units: number; revenue: string; margin: string },
>(): CsvColumn<T>[] {
  return [
    { header: 'Units', value: (r) => r.units },
    { header: 'Revenue', value: (r) => r.revenue },
    { header: 'Margin', value: (r) => r.margin },
  ];
}

type SalesRowOut = SalesAnswer['rows'][number] | (SalesAnswer['totals'] & { total: true });

export function salesTable(answer: SalesAnswer): CsvTable<SalesRowOut> {
  const { from, to } = answer.period;
  const byFamily = answer.by.includes('family');
  const byStep = answer.by.includes('step');
  const isTotal = (r: SalesRowOut): r is SalesAnswer['totals'] & { total: true } => 'total' in r;
  return {
    name: `sales-${from}-to-${to}`,
    columns: [
      ...(byFamily
        ? [
            {
              header: 'Family',
              text: (r: SalesRowOut) =>
                isTotal(r) ? 'Total' : r.familyId ? r.familyCode : NO_FAMILY,
            },
            { header: 'Family name', text: (r: SalesRowOut) => (isTotal(r) ? '' : r.familyName) },
          ]
        : []),
      ...(byStep
        ? [
            {
              header: 'Step',
              text: (r: SalesRowOut) =>
                isTotal(r) ? (byFamily ? '' : 'Total') : (r.stepLabel ?? 'No step'),
            },
          ]
        : []),
      ...salesColumns(),
      { header: 'Family id', value: (r) => (isTotal(r) ? '' : r.familyId) },
      { header: 'Step id', value: (r) => (isTotal(r) ? '' : r.stepId) },
    ],
    rows: [...answer.rows, { ...answer.totals, total: true }],
  };
}

export function monthlyTable(answer: MonthlyAnswer): CsvTable<MonthlyAnswer['months'][number]> {
  return {
    name: `sales-by-month-${answer.period.from}-to-${answer.period.to}`,
    columns: [{ header: 'Month', value: (r) => r.month }, ...salesColumns()],
    rows: answer.months,
  };
}

export function topSellersTable(
  answer: TopSellersAnswer,
): CsvTable<TopSellersAnswer['items'][number]> {
  return {
    name: `top-sellers-by-${answer.rank}-${answer.period.from}-to-${answer.period.to}`,
    columns: [...partColumns(), ...salesColumns(), { header: 'Part id', value: (r) => r.partId }],
    rows: answer.items,
  };
}

type StockValueRow = StockValueAnswer['items'][number];

export function stockValueTable(answer: StockValueAnswer): CsvTable<StockValueRow> {
  const total: StockValueRow = {
    familyId: null,
    familyCode: 'Total',
    familyName: '',
    onHand: answer.totalOnHand,
    value: answer.totalValue,
    costOfIssues: answer.totalCostOfIssues,
    openingValue: '',
    turnover: answer.totalTurnover,
    daysOfCover: null,
  };
  return {
    name: `stock-value-${answer.months}-months`,
    columns: [
      { header: 'Family', text: (r) => (r === total ? 'Total' : (r.familyCode ?? NO_FAMILY)) },
      { header: 'Family name', text: (r) => r.familyName },
      { header: 'On hand', value: (r) => r.onHand },
      { header: 'Value at average cost', value: (r) => r.value },
      { header: `Cost of issues, last ${answer.months} months`, value: (r) => r.costOfIssues },
      { header: 'Opening value', value: (r) => r.openingValue },
      { header: 'Turnover', value: (r) => r.turnover },
      { header: 'Days of cover', value: (r) => r.daysOfCover },
    ],
    rows: [...answer.items, total],
  };
}

export function deadStockTable(
  answer: DeadStockAnswer,
): CsvTable<DeadStockAnswer['items'][number]> {
  return {
    name: `dead-stock-${answer.months}-months`,
    columns: [
      ...partColumns(),
      { header: 'On hand', value: (r) => r.onHand },
      { header: 'Held for jobs', value: (r) => r.held },
      { header: 'Value at average cost', value: (r) => r.value },
      { header: 'Last issued', value: (r) => r.lastIssuedAt ?? 'never' },
      { header: 'Last received', value: (r) => r.lastReceivedAt },
      { header: 'Part id', value: (r) => r.partId },
    ],
    rows: answer.items,
  };
}

export function abcTable(answer: AbcAnswer): CsvTable<AbcAnswer['items'][number]> {
  return {
    name: `abc-${answer.months}-months`,
    columns: [
      { header: 'Class', value: (r) => r.class },
      ...partColumns(),
      { header: `Issue value at cost, last ${answer.months} months`, value: (r) => r.value },
      { header: 'Share', value: (r) => r.share },
      { header: 'Cumulative share', value: (r) => r.cumulative },
      { header: 'On hand', value: (r) => r.onHand },
      { header: 'Part id', value: (r) => r.partId },
    ],
    rows: answer.items,
  };
}

export function exposureTable(answer: ExposureAnswer): CsvTable<ExposureAnswer['items'][number]> {
  return {
    name: `exposure-${answer.months}-months`,
    columns: [
      { header: 'Family', text: (r) => r.familyCode },
      { header: 'Family name', text: (r) => r.familyName },
      { header: 'Step', text: (r) => r.stepLabel },
      { header: 'Times nothing was free', value: (r) => r.timesShort },
      { header: 'Jobs that waited', value: (r) => r.jobsWaited },
      { header: 'Days waited', value: (r) => r.daysWaited },
      { header: 'Jobs still waiting', value: (r) => r.stillWaiting },
      { header: 'Short of', text: (r) => r.partsShort.join(' ') },
      { header: 'Last time short', value: (r) => r.lastShortAt },
      { header: 'Family id', value: (r) => r.familyId },
      { header: 'Step id', value: (r) => r.stepId },
    ],
    rows: answer.items,
  };
}

export function supplierReliabilityTable(
  answer: SupplierReliabilityAnswer,
): CsvTable<SupplierReliabilityAnswer['items'][number]> {
  return {
    name: `supplier-reliability-${answer.months}-months`,
    columns: [
      { header: 'Supplier', text: (r) => r.supplierName },
      { header: 'Orders received', value: (r) => r.ordersReceived },
      { header: 'Lines received', value: (r) => r.linesReceived },
      { header: 'Promised days', value: (r) => r.promisedDays },
      { header: 'Actual days', value: (r) => r.actualDays },
      { header: 'Average days late', value: (r) => r.averageDaysLate },
      { header: 'On time share', value: (r) => r.onTimeShare },
      { header: 'Supplier id', value: (r) => r.supplierId },
    ],
    rows: answer.items,
  };
}
