import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';

import type { ShopSettingsJson } from '../../../shared/settings-api';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { SettingsApi } from './settings-api';

/** A percent as the server takes it: 0 to 100 with at most 3 decimals. */
const PERCENT = /^(100(\.0{1,3})?|\d{1,2}(\.\d{1,3})?)$/;

/** The owner's shop settings: name and hours for e-mails, bench and buying policies, tax, deposits. */
@Component({
  selector: 'app-settings-page',
  imports: [
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './settings-page.html',
  styleUrl: './settings-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SettingsPage {
  private readonly api = inject(SettingsApi);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly loading = signal(true);
  protected readonly saving = signal(false);
  protected readonly loadError = signal('');
  protected readonly fieldErrors = signal<Record<string, string>>({});

  protected readonly form = this.fb.group({
    shopName: ['', [Validators.required, Validators.maxLength(120)]],
    shopHours: ['', Validators.maxLength(300)],
    timeZone: ['', Validators.required],
    holdExpiryDays: [14, [Validators.required, Validators.min(1), Validators.max(365)]],
    clearancePolicy: ['mid' as ShopSettingsJson['clearancePolicy']],
    maxCutPerPass: ['', Validators.required],
    finishPass: [''],
    truingPass: [''],
    minCutPerPass: ['', Validators.required],
    barResolution: ['0.0001 in' as ShopSettingsJson['barResolution']],
    skipMarginalStep: [false],
    stepPolicy: ['first-that-cleans' as ShopSettingsJson['stepPolicy']],
    marginalCleanup: ['', Validators.required],
    orderCost: ['', Validators.required],
    holdingCostRate: ['', Validators.required],
    serviceLevel: [0.95, [Validators.required, Validators.min(0.5), Validators.max(0.999)]],
    homeCurrency: ['', [Validators.required, Validators.pattern(/^[A-Z]{3}$/)]],
    taxRate: ['', [Validators.required, Validators.pattern(PERCENT)]],
    pricesIncludeTax: [false],
    depositPercent: ['', [Validators.required, Validators.pattern(PERCENT)]],
    cutOnlyAfterApproval: [true],
  });

  constructor() {
    this.api.get().subscribe({
      next: (s) => {
        this.form.setValue(s);
        this.loading.set(false);
      },
      error: (e) => {
        this.loadError.set(apiErrorMessage(e));
        this.loading.set(false);
      },
    });
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    this.saving.set(true);
    this.fieldErrors.set({});
    this.api.save(this.form.getRawValue()).subscribe({
      next: (s) => {
        this.form.setValue(s);
        this.form.markAsPristine();
        this.saving.set(false);
        void this.notifier.success('Shop settings saved.');
      },
      error: (e) => {
        this.saving.set(false);
        this.fieldErrors.set(apiFieldErrors(e));
        void this.notifier.error(apiErrorMessage(e));
      },
    });
  }
}
