import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import type { ExchangeRateJson } from '../../../shared/api/purchasing';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { DataTable } from '../ui/data-table';
import { RowActions } from '../ui/row-actions';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { PurchasingApi } from './purchasing-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { FormAlert } from '../ui/form-alert';

/** The rates the owner keeps to land foreign prices in the home currency; buyers read them. */
@Component({
  selector: 'app-rates-page',
  imports: [
    FormAlert,
    ShopDatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    DataTable,
    RowActions,
    TableColumn,
    TableEmpty,
    ReactiveFormsModule,
  ],
  templateUrl: './rates-page.html',
  styleUrl: './rates-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class RatesPage {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  protected readonly canSetRates = computed(() => this.session.may('setRates'));
  protected readonly columns = computed(() =>
    this.canSetRates()
      ? ['currency', 'rate', 'updated', 'actions']
      : ['currency', 'rate', 'updated'],
  );
  protected readonly rates = signal<ExchangeRateJson[]>([]);
  protected readonly home = signal('');
  protected readonly loading = signal(true);
  protected readonly loadError = signal('');
  protected readonly saving = signal(false);
  protected readonly fieldErrors = signal<Record<string, string>>({});

  protected readonly form = new FormGroup({
    currency: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(/^[A-Za-z]{3}$/)],
    }),
    rate: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(/^\d{1,6}(\.\d{1,8})?$/)],
    }),
  });

  constructor() {
    this.load();
  }

  protected load(): void {
    this.loading.set(true);
    this.api.rates().subscribe({
      next: (r) => {
        this.loading.set(false);
        this.loadError.set('');
        this.rates.set(r.items);
        this.home.set(r.homeCurrency);
      },
      error: (e: unknown) => {
        this.loading.set(false);
        this.loadError.set(apiErrorMessage(e));
      },
    });
  }

  protected edit(rate: ExchangeRateJson): void {
    this.form.setValue({ currency: rate.currency, rate: rate.rate });
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { currency, rate } = this.form.getRawValue();
    this.saving.set(true);
    this.fieldErrors.set({});
    this.api.setRate(currency.toUpperCase(), rate).subscribe({
      next: (saved) => {
        this.saving.set(false);
        this.form.reset();
        void this.notifier.success(
          `1 ${saved.currency} = ${saved.rate} ${saved.homeCurrency} saved.`,
        );
        this.load();
      },
      error: (e: unknown) => {
        this.saving.set(false);
        this.fieldErrors.set(apiFieldErrors(e));
        void this.notifier.error(apiErrorMessage(e));
      },
    });
  }

  protected remove(rate: ExchangeRateJson): void {
    this.api.deleteRate(rate.currency).subscribe({
      next: () => {
        void this.notifier.success(`The ${rate.currency} rate is removed.`);
        this.load();
      },
      error: (e: unknown) => void this.notifier.error(apiErrorMessage(e)),
    });
  }
}
