import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import type { Observable } from 'rxjs';

import { ESTIMATE_STATE_LABELS, type EstimateLineJson } from '../../../shared/api/money';
import { isOpenState } from '../../../shared/api/jobs';
import { formatShopDate } from '../../../shared/dates';
import { minusMoney } from '../../../shared/estimate-math';
import { apiErrorMessage } from '../core/api-error';
import { controlError, placeApiErrors } from '../core/field-errors';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { EstimateTable } from './estimate-table';
import { ListState } from '../ui/list-state';
import { loadEach } from '../ui/load';
import { MoneyApi } from './money-api';
import {
  AMOUNT_PATTERN,
  formatAmount,
  sameJobVersion,
  type MoneyJob,
  QUANTITY_PATTERN,
  roundingRule,
  standingText,
} from './money-words';
import { FormAlert } from '../ui/form-alert';

/**
 * The job's estimate on the job page: its lines and totals, the rule behind the sums, where it
 * stands with the customer, and (for staff and the owner) changing lines, a discount, sending it
 * and recording an approval taken at the counter or by phone.
 */
@Component({
  selector: 'app-estimate-panel',
  imports: [
    FormAlert,
    ListState,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    EstimateTable,
    ReactiveFormsModule,
    ShopDatePipe,
  ],
  templateUrl: './estimate-panel.html',
  styleUrl: './estimate-panel.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class EstimatePanel {
  private readonly api = inject(MoneyApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  readonly job = input.required<MoneyJob>();

  /** Read again whenever the job page has a newer job (a hold, a hand-back, a state). */
  protected readonly loaded = loadEach(this.job, (job) => this.api.estimate(job.id), {
    equal: sameJobVersion,
  });
  protected readonly estimate = this.loaded.value;

  protected readonly stateLabels = ESTIMATE_STATE_LABELS;
  protected readonly money = formatAmount;

  protected readonly busy = signal(false);
  /** A refusal of Send or Approve (no e-mail, nothing to send), said beside the buttons. */
  protected readonly actionError = signal('');
  protected readonly lineError = signal('');
  protected readonly discountError = signal('');
  /** The line being changed, or null while the form adds one. */
  protected readonly editing = signal<EstimateLineJson | null>(null);
  protected readonly showDiscount = signal(false);
  protected readonly showApproval = signal(false);

  /** Staff and the owner change the estimate while the job is open; everyone else reads it. */
  protected readonly canEdit = computed(
    () => this.session.may('takeMoney') && isOpenState(this.job().state),
  );
  protected readonly rule = computed(() => {
    const e = this.estimate();
    return e ? roundingRule(e.pricesIncludeTax, e.taxRate) : '';
  });
  /** Where the estimate stands with the customer, in a sentence. */
  protected readonly standing = computed(() => {
    const e = this.estimate();
    return e ? standingText(e, (at) => this.date(at)) : '';
  });
  /** Said when the estimate changed after the customer saw it or agreed to it. */
  protected readonly changes = computed(() => {
    const e = this.estimate();
    if (!e || e.state !== 'draft') return null;
    const agreed = e.approvedVersion;
    if (agreed) {
      const difference = minusMoney(e.total, agreed.total, e.currency);
      return {
        sentAt: e.sentAt,
        agreed,
        difference: difference.startsWith('-')
          ? `${this.money(difference.slice(1), e.currency)} less`
          : `${this.money(difference, e.currency)} more`,
      };
    }
    return e.sentAt ? { sentAt: e.sentAt, agreed: null, difference: '' } : null;
  });

  protected readonly lineForm = new FormGroup({
    description: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(200)],
    }),
    quantity: new FormControl('1', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(QUANTITY_PATTERN)],
    }),
    unitPrice: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(AMOUNT_PATTERN)],
    }),
  });
  protected readonly discountForm = new FormGroup({
    amount: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(AMOUNT_PATTERN)],
    }),
    reason: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(200)],
    }),
  });
  protected readonly approvalForm = new FormGroup({
    how: new FormControl<'counter' | 'phone'>('counter', { nonNullable: true }),
    note: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(500)] }),
  });

  private date(at: string | null): string {
    return formatShopDate(at, 'datetime', {
      locale: this.session.locale(),
      timeZone: this.session.timeZone(),
    });
  }

  protected fieldError(form: FormGroup, name: string, what: string): string {
    const control = form.get(name);
    if (control?.errors?.['pattern']) {
      return name === 'quantity'
        ? 'A number more than 0 with at most 3 decimals, e.g. 2 or 1.5.'
        : 'Digits with at most 2 decimals, e.g. 42.50.';
    }
    return controlError(control, what);
  }

  protected editLine(line: EstimateLineJson): void {
    this.editing.set(line);
    this.lineError.set('');
    this.lineForm.setValue({
      description: line.description,
      quantity: line.quantity,
      unitPrice: line.unitPrice,
    });
  }

  protected cancelLine(): void {
    this.editing.set(null);
    this.lineError.set('');
    this.lineForm.reset();
  }

  protected saveLine(): void {
    if (this.lineForm.invalid) {
      this.lineForm.markAllAsTouched();
      return;
    }
    const raw = this.lineForm.getRawValue();
    const line = {
      description: raw.description.trim(),
      quantity: raw.quantity.trim(),
      unitPrice: raw.unitPrice.trim(),
    };
    const editing = this.editing();
    const jobId = this.job().id;
    this.act(
      editing ? this.api.changeLine(jobId, editing.id, line) : this.api.addLine(jobId, line),
      editing ? 'Line changed.' : 'Line added.',
      (e) => this.lineError.set(placeApiErrors(this.lineForm, e)),
      () => this.cancelLine(),
    );
  }

  protected removeLine(line: EstimateLineJson): void {
    this.act(
      this.api.removeLine(this.job().id, line.id),
      `“${line.description}” removed.`,
      (e) => void this.notifier.error(apiErrorMessage(e)),
      () => {
        if (this.editing()?.id === line.id) this.cancelLine();
      },
    );
  }

  protected saveDiscount(): void {
    if (this.discountForm.invalid) {
      this.discountForm.markAllAsTouched();
      return;
    }
    const { amount, reason } = this.discountForm.getRawValue();
    this.act(
      this.api.addDiscount(this.job().id, amount.trim(), reason.trim()),
      'Discount given.',
      (e) => this.discountError.set(placeApiErrors(this.discountForm, e)),
      () => {
        this.discountForm.reset();
        this.showDiscount.set(false);
      },
    );
  }

  protected send(): void {
    this.act(
      this.api.send(this.job().id),
      `The estimate of job ${this.job().number} is on its way to the customer.`,
      (e) => this.actionError.set(apiErrorMessage(e)),
    );
  }

  protected recordApproval(): void {
    if (this.approvalForm.invalid) return;
    const { how, note } = this.approvalForm.getRawValue();
    this.act(
      this.api.approveAtCounter(this.job().id, how, note.trim()),
      'The customer’s agreement is recorded: the cylinders may be cut.',
      (e) => this.actionError.set(apiErrorMessage(e)),
      () => {
        this.approvalForm.reset();
        this.showApproval.set(false);
      },
    );
  }

  /** Runs one change, then reads the estimate again (its totals and state follow the change). */
  private act<T>(
    request: Observable<T>,
    success: string,
    failed: (error: unknown) => void,
    after?: () => void,
  ): void {
    this.busy.set(true);
    this.actionError.set('');
    this.lineError.set('');
    this.discountError.set('');
    request.subscribe({
      next: () => {
        this.busy.set(false);
        void this.notifier.success(success);
        after?.();
        this.loaded.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        failed(e);
      },
    });
  }
}
