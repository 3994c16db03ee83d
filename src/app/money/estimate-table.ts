import { ChangeDetectionStrategy, Component, input, output } from '@angular/core';

import type { EstimateLineJson, InvoiceJson, InvoiceLineJson } from '../../../shared/api/money';
import { formatAmount, LINE_KIND_LABELS } from './money-words';
import { RowActions } from '../ui/row-actions';

/** The figures an estimate and an invoice share: lines, totals, and the tax they were worked with. */
export type PricedFigures = Pick<
  InvoiceJson,
  'subtotal' | 'tax' | 'total' | 'currency' | 'taxRate' | 'pricesIncludeTax'
> & { lines: (InvoiceLineJson | EstimateLineJson)[] };

/**
 * An estimate's (or an invoice's) lines and totals, as staff and the customer both read them; with `canEdit` each
 * line gets Change and Remove (a discount only Remove: it is given anew, never edited). Rows
 * projected into it (the invoice's paid and owed) follow the total.
 */
@Component({
  selector: 'app-estimate-table',
  imports: [RowActions],
  templateUrl: './estimate-table.html',
  styleUrl: './estimate-table.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EstimateTable {
  readonly estimate = input.required<PricedFigures>();
  readonly canEdit = input(false);
  readonly busy = input(false);
  readonly editingId = input<string | null>(null);
  readonly edit = output<EstimateLineJson>();
  readonly remove = output<EstimateLineJson>();

  protected readonly kindLabels = LINE_KIND_LABELS;
  protected readonly money = formatAmount;

  /** An invoice line for a part issued that the agreed estimate did not have. */
  protected addedSince(line: PricedFigures['lines'][number]): boolean {
    return 'sinceEstimate' in line && line.sinceEstimate;
  }

  /** The estimate's own lines (they say whether they came from the job) can be changed. */
  protected asLine(line: PricedFigures['lines'][number]): EstimateLineJson | null {
    return 'fromJob' in line ? line : null;
  }
}
