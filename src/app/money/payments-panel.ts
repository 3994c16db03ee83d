import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Observable } from 'rxjs';

import { isOpenState } from '../../../shared/api/jobs';
import {
  COUNTER_METHODS,
  PAYMENT_METHOD_LABELS,
  type CounterMethod,
  type PaymentJson,
  type PaymentPurpose,
} from '../../../shared/api/money';
import { SettingsApi } from '../admin/settings-api';
import { controlError, placeApiErrors } from '../core/field-errors';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { MoneyApi } from './money-api';
import { AMOUNT_PATTERN, formatAmount, sameJobVersion, type MoneyJob } from './money-words';
import { FormAlert } from '../ui/form-alert';

export const PAYMENT_STATE_WORDS = { open: 'Waiting', paid: 'Paid', refunded: 'Paid back' };
export const PURPOSE_LABELS: Record<PaymentPurpose, string> = {
  deposit: 'Deposit',
  balance: 'Balance',
};

/**
 * What the customer has paid on a job and what is still owed: online payments asked for (the link
 * goes to the customer), payments taken at the counter, and refunds with their reason. Staff and
 * the owner take payments; everyone else reads.
 */
@Component({
  selector: 'app-payments-panel',
  imports: [
    FormAlert,
    ListState,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    ShopDatePipe,
  ],
  templateUrl: './payments-panel.html',
  styleUrl: './payments-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PaymentsPanel {
  private readonly api = inject(MoneyApi);
  private readonly settingsApi = inject(SettingsApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  readonly job = input.required<MoneyJob>();

  /** Read again whenever the job page has a newer job (a hold, a hand-back, a state). */
  protected readonly loaded = loadEach(this.job, (job) => this.api.payments(job.id), {
    equal: sameJobVersion,
  });
  protected readonly payments = this.loaded.value;

  protected readonly methods = COUNTER_METHODS;
  protected readonly methodLabels = PAYMENT_METHOD_LABELS;
  protected readonly stateWords = PAYMENT_STATE_WORDS;
  protected readonly purposeLabels = PURPOSE_LABELS;
  protected readonly money = formatAmount;

  protected readonly depositPercent = signal<string | null>(null);
  protected readonly busy = signal(false);
  protected readonly requestError = signal('');
  protected readonly counterError = signal('');
  protected readonly refundError = signal('');
  /** The payment whose refund form is open. */
  protected readonly refunding = signal<PaymentJson | null>(null);
  /** The link just asked for, shown so staff can read it out or copy it. */
  protected readonly newLink = signal<PaymentJson | null>(null);

  /** Payments are taken while the job is open, and at hand-back for what is still owed. */
  protected readonly canTake = computed(
    () => this.session.may('takeMoney') && this.job().state !== 'called_off',
  );
  protected readonly canAsk = computed(() => this.canTake() && isOpenState(this.job().state));
  /** A refund is for staff and the owner, of money that came in. */
  protected readonly canRefund = computed(() => this.session.may('takeMoney'));

  protected readonly requestForm = new FormGroup({
    purpose: new FormControl<PaymentPurpose>('deposit', { nonNullable: true }),
    amount: new FormControl('', {
      nonNullable: true,
      validators: [Validators.pattern(AMOUNT_PATTERN)],
    }),
  });
  protected readonly counterForm = new FormGroup({
    method: new FormControl<CounterMethod>('cash', { nonNullable: true }),
    amount: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(AMOUNT_PATTERN)],
    }),
  });
  protected readonly refundForm = new FormGroup({
    reason: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(300)],
    }),
  });

  constructor() {
    this.settingsApi.get().subscribe({
      next: (s) => this.depositPercent.set(s.depositPercent),
      // The hint falls back to words without the figure; the server still applies the setting.
      error: () => this.depositPercent.set(null),
    });
  }

  protected amountError(form: FormGroup): string {
    const control = form.get('amount');
    if (control?.errors?.['pattern']) return 'Digits with at most 2 decimals, e.g. 120.00.';
    return controlError(control, 'an amount');
  }

  protected amountHint(): string {
    if (this.requestForm.controls.purpose.value === 'balance')
      return 'Leave empty for all that is still owed.';
    const percent = this.depositPercent();
    return percent === null
      ? 'Leave empty for the shop’s usual deposit.'
      : `Leave empty for ${percent} % of the estimate.`;
  }

  protected request(): void {
    if (this.requestForm.invalid) {
      this.requestForm.markAllAsTouched();
      return;
    }
    const { purpose, amount } = this.requestForm.getRawValue();
    this.act(
      this.api.requestPayment(this.job().id, purpose, amount.trim() || undefined),
      (made) => {
        this.newLink.set(made);
        this.requestForm.reset();
        return `${PURPOSE_LABELS[made.purpose]} of ${this.amount(made.amount)} asked for: the link is on the customer’s page.`;
      },
      (e) => this.requestError.set(placeApiErrors(this.requestForm, e)),
    );
  }

  protected record(): void {
    if (this.counterForm.invalid) {
      this.counterForm.markAllAsTouched();
      return;
    }
    const { method, amount } = this.counterForm.getRawValue();
    this.act(
      this.api.recordPayment(this.job().id, method, amount.trim()),
      (made) => {
        this.counterForm.reset();
        return `${this.amount(made.amount)} taken (${PAYMENT_METHOD_LABELS[made.method].toLowerCase()}).`;
      },
      (e) => this.counterError.set(placeApiErrors(this.counterForm, e)),
    );
  }

  protected startRefund(payment: PaymentJson): void {
    this.refunding.set(payment);
    this.refundError.set('');
    this.refundForm.reset();
  }

  protected refund(): void {
    const payment = this.refunding();
    if (!payment) return;
    if (this.refundForm.invalid) {
      this.refundForm.markAllAsTouched();
      return;
    }
    this.act(
      this.api.refund(this.job().id, payment.id, this.refundForm.getRawValue().reason.trim()),
      (done) => {
        this.refunding.set(null);
        return `${this.amount(done.amount)} paid back to the customer.`;
      },
      (e) => this.refundError.set(placeApiErrors(this.refundForm, e)),
    );
  }

  protected reasonError(): string {
    return controlError(this.refundForm.controls.reason, 'the reason for the refund');
  }

  private amount(value: string): string {
    return formatAmount(value, this.payments()?.currency ?? this.session.currency());
  }

  private act(
    request: Observable<PaymentJson>,
    success: (made: PaymentJson) => string,
    failed: (error: unknown) => void,
  ): void {
    this.busy.set(true);
    this.requestError.set('');
    this.counterError.set('');
    this.refundError.set('');
    request.subscribe({
      next: (made) => {
        this.busy.set(false);
        void this.notifier.success(success(made));
        this.loaded.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        failed(e);
      },
    });
  }
}
