import { HttpErrorResponse } from '@angular/common/http';
import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
  untracked,
} from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';

import {
  PAYMENT_STATES,
  type PublicJobJson,
  type PublicPaymentJson,
} from '../../../shared/api/money';
import { apiErrorMessage } from '../core/api-error';
import { EstimateTable } from './estimate-table';
import { MoneyApi } from './money-api';
import { formatAmount, roundingRule } from './money-words';
import { FormAlert } from '../ui/form-alert';

type View =
  | { kind: 'loading' }
  | { kind: 'gone' }
  | { kind: 'failed'; message: string }
  | { kind: 'job'; page: PublicJobJson };

const PURPOSE_WORDS = { deposit: 'deposit', balance: 'balance' } as const;

/**
 * The customer's page, opened from the e-mailed link without signing in: the shop, the job and where
 * it stands, the estimate with Approve and Decline while it waits for them, and the payments asked
 * for. A link that is wrong or has expired gets one plain page that says nothing of any job.
 */
@Component({
  selector: 'app-public-job-page',
  imports: [FormAlert, EstimateTable, MatButtonModule, MatIconModule, MatProgressBarModule],
  templateUrl: './public-job-page.html',
  styleUrl: './public-job-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PublicJobPage {
  private readonly api = inject(MoneyApi);

  /** From the route: /c/:token. */
  readonly token = input.required<string>();

  protected readonly view = signal<View>({ kind: 'loading' });
  protected readonly answering = signal(false);
  protected readonly answerError = signal('');
  /** Said after the customer answers, in a live region. */
  protected readonly answered = signal('');
  protected readonly money = formatAmount;

  protected readonly page = computed(() => {
    const v = this.view();
    return v.kind === 'job' ? v.page : null;
  });
  protected readonly rule = computed(() => {
    const e = this.page()?.estimate;
    return e ? roundingRule(e.pricesIncludeTax, e.taxRate) : '';
  });
  /** Payments still to make (with their link) first, then those made or given back. */
  protected readonly payments = computed(() =>
    [...(this.page()?.payments ?? [])].sort(
      (a, b) => PAYMENT_STATES.indexOf(a.state) - PAYMENT_STATES.indexOf(b.state),
    ),
  );

  constructor() {
    effect(() => {
      const token = this.token();
      untracked(() => this.load(token));
    });
  }

  protected load(token = this.token()): void {
    this.api.publicJob(token).subscribe({
      next: (page) => this.view.set({ kind: 'job', page }),
      error: (e: unknown) =>
        this.view.set(
          e instanceof HttpErrorResponse && e.status === 404
            ? { kind: 'gone' }
            : { kind: 'failed', message: apiErrorMessage(e) },
        ),
    });
  }

  protected answer(answer: 'approve' | 'decline'): void {
    this.answering.set(true);
    this.answerError.set('');
    this.api.answer(this.token(), answer).subscribe({
      next: () => {
        this.answering.set(false);
        this.answered.set(
          answer === 'approve'
            ? 'Thank you: the shop has your agreement and will go ahead.'
            : 'Thank you: the shop knows you turned the estimate down and will be in touch.',
        );
        this.load();
      },
      error: (e: unknown) => {
        this.answering.set(false);
        if (e instanceof HttpErrorResponse && e.status === 404) this.view.set({ kind: 'gone' });
        else this.answerError.set(apiErrorMessage(e));
      },
    });
  }

  protected payWords(p: PublicPaymentJson, currency: string): string {
    const what = `${PURPOSE_WORDS[p.purpose]} of ${this.money(p.amount, currency)}`;
    if (p.state === 'open') return `Pay ${what}`;
    const said = what.charAt(0).toUpperCase() + what.slice(1);
    return p.state === 'paid' ? `${said} paid. Thank you.` : `${said} paid back to you.`;
  }
}
