import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { ErrorStateMatcher, ShowOnDirtyErrorStateMatcher } from '@angular/material/core';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';

import type { ShopSettingsJson } from '../../../shared/api/settings';
import { formatShopDate, SHOP_LOCALES } from '../../../shared/dates';
import { LABEL_STOCK_NAMES, LABEL_STOCKS } from '../../../shared/label-stock';
import { settingWarning } from '../../../shared/settings-ranges';
import { shopSettingsSchema } from '../../../shared/settings-schema';
import { apiErrorMessage } from '../core/api-error';
import { controlError, fieldRules, placeApiErrors } from '../core/field-errors';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { SettingsApi } from './settings-api';

type Key = keyof ShopSettingsJson;

/** The server's own rule for one setting, checked at every keystroke. */
const schemaRule = fieldRules(shopSettingsSchema);

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
  // A refused value shows while it is typed, not only after leaving the field or pressing Save.
  providers: [{ provide: ErrorStateMatcher, useClass: ShowOnDirtyErrorStateMatcher }],
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SettingsPage {
  private readonly api = inject(SettingsApi);
  private readonly notifier = inject(Notifier);
  private readonly fb = inject(NonNullableFormBuilder);
  private readonly session = inject(Session);

  /** Each locale with the way it writes a sample day and time, so the choice is seen. */
  protected readonly locales = SHOP_LOCALES.map((l) => ({
    ...l,
    sample: formatShopDate('2026-12-31T14:05:00Z', 'datetime', { locale: l.tag, timeZone: 'UTC' }),
  }));

  protected readonly labelStocks = LABEL_STOCKS.map((value) => ({
    value,
    name: LABEL_STOCK_NAMES[value],
  }));

  protected readonly loading = signal(true);
  protected readonly saving = signal(false);
  protected readonly loadError = signal('');
  protected readonly problem = signal('');

  protected readonly form = this.fb.group({
    shopName: ['', schemaRule('shopName')],
    shopHours: ['', schemaRule('shopHours')],
    timeZone: ['', schemaRule('timeZone')],
    locale: ['en-GB', schemaRule('locale')],
    holdExpiryDays: [14, schemaRule('holdExpiryDays')],
    clearancePolicy: ['mid' as ShopSettingsJson['clearancePolicy'], schemaRule('clearancePolicy')],
    maxCutPerPass: ['', schemaRule('maxCutPerPass')],
    finishPass: ['', schemaRule('finishPass')],
    truingPass: ['', schemaRule('truingPass')],
    minCutPerPass: ['', schemaRule('minCutPerPass')],
    barResolution: ['0.0001 in' as ShopSettingsJson['barResolution'], schemaRule('barResolution')],
    skipMarginalStep: [false, schemaRule('skipMarginalStep')],
    stepPolicy: ['first-that-cleans' as ShopSettingsJson['stepPolicy'], schemaRule('stepPolicy')],
    marginalCleanup: ['', schemaRule('marginalCleanup')],
    orderCost: ['', schemaRule('orderCost')],
    holdingCostRate: ['', schemaRule('holdingCostRate')],
    serviceLevel: [0.95, schemaRule('serviceLevel')],
    homeCurrency: ['', schemaRule('homeCurrency')],
    taxRate: ['', schemaRule('taxRate')],
    pricesIncludeTax: [false, schemaRule('pricesIncludeTax')],
    depositPercent: ['', schemaRule('depositPercent')],
    cutOnlyAfterApproval: [true, schemaRule('cutOnlyAfterApproval')],
    shippingAllocation: [
      'value' as ShopSettingsJson['shippingAllocation'],
      schemaRule('shippingAllocation'),
    ],
    labelStock: ['sheet' as ShopSettingsJson['labelStock'], schemaRule('labelStock')],
  });

  private readonly values = toSignal(this.form.valueChanges, {
    initialValue: this.form.getRawValue(),
  });
  /** Cautions (not refusals) for values far outside what shops usually set, with the range. */
  protected readonly warnings = computed(() => {
    const values = this.values();
    const out: Partial<Record<string, string>> = {};
    for (const key of Object.keys(values) as Key[]) {
      const warning = settingWarning(key, values[key]);
      if (warning) out[key] = warning;
    }
    return out;
  });

  protected errorFor(key: Key): string {
    return controlError(this.form.controls[key]);
  }

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
    this.problem.set('');
    this.api.save(this.form.getRawValue()).subscribe({
      next: (s) => {
        this.form.setValue(s);
        this.form.markAsPristine();
        this.saving.set(false);
        void this.notifier.success('Shop settings saved.');
        // Dates everywhere follow the locale and time zone at once.
        void this.session.load();
      },
      error: (e) => {
        this.saving.set(false);
        this.problem.set(placeApiErrors(this.form, e));
      },
    });
  }
}
