import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { controlError, placeApiErrors } from '../core/field-errors';
import { Notifier } from '../core/notifier';
import { MoneyApi } from './money-api';
import { AMOUNT_PATTERN, formatAmount } from './money-words';
import { FormAlert } from '../ui/form-alert';

/**
 * A correction of an issued invoice: the invoice itself never changes, a credit note takes an
 * amount off it, with the reason, under its own number. Priced like the invoice's lines (with or
 * without tax as the invoice says), so the server works out the tax on it.
 */
@Component({
  selector: 'app-credit-note-form',
  imports: [
    FormAlert,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    @if (!open()) {
      <button mat-stroked-button type="button" class="no-print" (click)="open.set(true)">
        <mat-icon>remove_circle_outline</mat-icon>
        Correct with a credit note
      </button>
    } @else {
      <form class="panel-form no-print" [formGroup]="form" (ngSubmit)="issue()">
        <h3>Credit note against invoice {{ invoiceNumber() }}</h3>
        <mat-form-field appearance="outline" class="wide">
          <mat-label>Why the invoice is corrected</mat-label>
          <input matInput formControlName="reason" maxlength="300" autocomplete="off" />
          <mat-hint>e.g. one ring set was not fitted after all</mat-hint>
          <mat-error>{{ reasonError() }}</mat-error>
        </mat-form-field>
        <mat-form-field appearance="outline" class="short">
          <mat-label>Amount off</mat-label>
          <input matInput formControlName="amount" inputmode="decimal" autocomplete="off" />
          <mat-hint
            >{{ pricesIncludeTax() ? 'Tax included' : 'Before tax' }}, as the invoice's
            lines</mat-hint
          >
          <mat-error>{{ amountError() }}</mat-error>
        </mat-form-field>
        <div class="buttons">
          <button mat-flat-button type="submit" [disabled]="busy()">Issue credit note</button>
          <button mat-button type="button" (click)="open.set(false)">Cancel</button>
        </div>
        <app-form-alert [message]="error()" />
      </form>
    }
  `,
  styleUrl: './credit-note-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CreditNoteForm {
  private readonly api = inject(MoneyApi);
  private readonly notifier = inject(Notifier);

  readonly jobId = input.required<string>();
  readonly invoiceNumber = input.required<string>();
  readonly currency = input.required<string>();
  readonly pricesIncludeTax = input(false);
  /** A credit note was issued: the invoice panel reads the invoice again. */
  readonly issued = output<void>();

  protected readonly open = signal(false);
  protected readonly busy = signal(false);
  protected readonly error = signal('');

  protected readonly form = new FormGroup({
    reason: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(300)],
    }),
    amount: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(AMOUNT_PATTERN)],
    }),
  });

  protected reasonError(): string {
    return controlError(this.form.controls.reason, 'the reason for the correction');
  }

  protected amountError(): string {
    const control = this.form.controls.amount;
    if (control.errors?.['pattern']) return 'Digits with at most 2 decimals, e.g. 20.00.';
    return controlError(control, 'an amount');
  }

  protected issue(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const { reason, amount } = this.form.getRawValue();
    this.busy.set(true);
    this.error.set('');
    this.api.creditNote(this.jobId(), reason.trim(), amount.trim()).subscribe({
      next: (note) => {
        this.busy.set(false);
        this.open.set(false);
        this.form.reset();
        void this.notifier.success(
          `Credit note ${note.number} issued: ${formatAmount(note.total, this.currency())} off invoice ${note.invoiceNumber}.`,
        );
        this.issued.emit();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.error.set(placeApiErrors(this.form, e));
      },
    });
  }
}
