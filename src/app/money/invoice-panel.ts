import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

import { ShopDatePipe } from '../core/shop-date-pipe';
import { EstimateTable } from './estimate-table';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { invoicePdfUrl, MoneyApi } from './money-api';
import { formatAmount, sameJobVersion, type MoneyJob } from './money-words';

/**
 * The invoice issued when the job was handed back: its number, lines and totals, what was paid and
 * what is still owed, and its printable PDF. An invoice is never changed once issued.
 */
@Component({
  selector: 'app-invoice-panel',
  imports: [EstimateTable, ListState, MatButtonModule, MatIconModule, ShopDatePipe],
  templateUrl: './invoice-panel.html',
  styleUrl: './invoice-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvoicePanel {
  private readonly api = inject(MoneyApi);

  readonly job = input.required<MoneyJob>();

  /** Read again whenever the job page has a newer job (a hold, a hand-back, a state). */
  protected readonly loaded = loadEach(this.job, (job) => this.api.invoice(job.id), {
    equal: sameJobVersion,
  });
  protected readonly invoice = this.loaded.value;

  protected readonly money = formatAmount;
  protected readonly pdfUrl = invoicePdfUrl;
}
