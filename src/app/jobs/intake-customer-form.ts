import { ChangeDetectionStrategy, Component, inject, output, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { customerInput, type CustomerListItemJson } from '../../../shared/api/customers';
import { apiErrorMessage } from '../core/api-error';
import { FieldMarks } from '../core/field-errors';
import { CustomersApi } from '../customers/customers-api';

const FIELDS = ['name', 'phone', 'email', 'acceptsEmail'] as const;

/** A customer new to the shop, added from the intake form without leaving it. */
@Component({
  selector: 'app-intake-customer-form',
  imports: [
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <div class="new-customer" [formGroup]="form" role="group" aria-labelledby="new-customer-title">
      <h3 id="new-customer-title">New customer</h3>
      <mat-form-field appearance="outline">
        <mat-label>Customer name</mat-label>
        <input matInput formControlName="name" autocomplete="off" />
        @if (marks.errors().name) {
          <mat-error>{{ marks.errors().name }}</mat-error>
        }
      </mat-form-field>
      <div class="row">
        <mat-form-field appearance="outline">
          <mat-label>Phone</mat-label>
          <input matInput type="tel" inputmode="tel" formControlName="phone" autocomplete="off" />
          @if (marks.errors().phone) {
            <mat-error>{{ marks.errors().phone }}</mat-error>
          }
        </mat-form-field>
        <mat-form-field appearance="outline">
          <mat-label>E-mail</mat-label>
          <input matInput type="email" formControlName="email" autocomplete="off" />
          @if (marks.errors().email) {
            <mat-error>{{ marks.errors().email }}</mat-error>
          }
        </mat-form-field>
      </div>
      <mat-checkbox formControlName="acceptsEmail">
        The customer agrees to e-mail from the shop
      </mat-checkbox>
      @if (problem()) {
        <p class="problem" role="alert">{{ problem() }}</p>
      }
      <div class="actions">
        <button mat-button type="button" (click)="cancelled.emit()">Cancel</button>
        <button mat-flat-button type="button" [disabled]="busy()" (click)="save()">
          <mat-icon>person_add</mat-icon>
          {{ busy() ? 'Adding…' : 'Add the customer' }}
        </button>
      </div>
    </div>
  `,
  styles: `
    .new-customer {
      display: flex;
      flex-direction: column;
      gap: 4px;
    }
    h3 {
      margin: 8px 0;
      font: var(--mat-sys-title-small);
    }
    mat-form-field {
      width: 100%;
    }
    .row {
      display: flex;
      flex-wrap: wrap;
      gap: 0 16px;
    }
    .row mat-form-field {
      flex: 1 1 240px;
    }
    .actions {
      display: flex;
      justify-content: flex-end;
      gap: 12px;
    }
    .problem {
      color: var(--mat-sys-error);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class IntakeCustomerForm {
  private readonly api = inject(CustomersApi);
  private readonly fb = inject(NonNullableFormBuilder);

  readonly created = output<CustomerListItemJson>();
  readonly cancelled = output<void>();

  protected readonly form = this.fb.group({
    name: [''],
    phone: [''],
    email: [''],
    acceptsEmail: [true],
  });
  protected readonly marks = new FieldMarks(this.form, FIELDS);
  protected readonly problem = signal('');
  protected readonly busy = signal(false);

  protected save(): void {
    if (this.busy()) return;
    this.problem.set('');
    const v = this.form.getRawValue();
    // The schema the server checks with, so the same words show before the round trip.
    const checked = customerInput.safeParse(v);
    if (!checked.success) {
      this.marks.showIssues(checked.error.issues, sentence);
      return;
    }
    this.busy.set(true);
    this.api
      .create({
        name: checked.data.name,
        phone: checked.data.phone ?? null,
        email: checked.data.email ?? null,
        acceptsEmail: v.acceptsEmail,
      })
      .subscribe({
        next: (customer) => {
          this.busy.set(false);
          this.created.emit(customer);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          if (!this.marks.showServer(error)) this.problem.set(apiErrorMessage(error));
        },
      });
  }
}

function sentence(message: string): string {
  const text = message.trim();
  return text ? `${text[0].toUpperCase()}${text.slice(1)}${/[.!?]$/.test(text) ? '' : '.'}` : text;
}
