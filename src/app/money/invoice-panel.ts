import {
  ChangeDetectionStrategy,
  Component,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import type { InvoiceJson } from '../../../shared/api/money';
import { apiErrorMessage } from '../core/api-error';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { EstimateTable } from './estimate-table';
import { invoicePdfUrl, MoneyApi } from './money-api';
import { formatAmount, type MoneyJob } from './money-words';

/**
 * The invoice issued when the job was handed back: its number, lines and totals, what was paid and
 * what is still owed, and its printable PDF. An invoice is never changed once issued.
 */
@Component({
  selector: 'app-invoice-panel',
  imports: [EstimateTable, MatButtonModule, MatIconModule, MatProgressBarModule, ShopDatePipe],
  templateUrl: './invoice-panel.html',
  styleUrl: './invoice-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class InvoicePanel {
  private readonly api = inject(MoneyApi);

  readonly job = input.required<MoneyJob>();

  protected readonly money = formatAmount;
  protected readonly pdfUrl = invoicePdfUrl;
  protected readonly invoice = signal<InvoiceJson | null>(null);
  protected readonly loading = signal(true);
  protected readonly loadError = signal('');

  constructor() {
    effect(() => {
      const job = this.job();
      untracked(() => this.load(job.id));
    });
  }

  protected load(jobId = this.job().id): void {
    this.loading.set(true);
    this.api.invoice(jobId).subscribe({
      next: (invoice) => {
        this.loading.set(false);
        this.loadError.set('');
        this.invoice.set(invoice);
      },
      error: (e: unknown) => {
        this.loading.set(false);
        this.loadError.set(
          e instanceof HttpErrorResponse && e.status === 404
            ? 'No invoice was issued for this job.'
            : apiErrorMessage(e),
        );
      },
    });
  }
}
