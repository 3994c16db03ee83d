import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';

import { Session } from '../core/session';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { CreditNoteForm } from './credit-note-form';
import { EstimateTable } from './estimate-table';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { invoicePdfUrl, MoneyApi } from './money-api';
import { formatAmount, sameJobVersion, type MoneyJob } from './money-words';

/**
 * The invoice issued when the job was handed back: its number, lines and totals, what was paid and
 * what is still owed, and its printable PDF. An invoice is never changed once issued: staff correct
 * it with a credit note, listed under it.
 */
@Component({
  selector: 'app-invoice-panel',
  imports: [CreditNoteForm, EstimateTable, ListState, MatButtonModule, MatIconModule, ShopDatePipe],
  templateUrl: './invoice-panel.html',
  styleUrl: './invoice-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvoicePanel {
  private readonly api = inject(MoneyApi);
  private readonly session = inject(Session);

  readonly job = input.required<MoneyJob>();

  /** Read again whenever the job page has a newer job (a hold, a hand-back, a state). */
  protected readonly loaded = loadEach(this.job, (job) => this.api.invoice(job.id), {
    equal: sameJobVersion,
  });
  protected readonly invoice = this.loaded.value;

  /** Corrections are money given back: staff and the owner. */
  protected readonly canCorrect = computed(() => this.session.may('takeMoney'));
  protected readonly money = formatAmount;
  protected readonly pdfUrl = invoicePdfUrl;
}
