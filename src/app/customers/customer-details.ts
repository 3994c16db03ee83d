import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';

import { customerPatch, type CustomerJson } from '../../../shared/api/customers';
import { apiErrorMessage } from '../core/api-error';
import { FieldMarks } from '../core/field-errors';
import { CustomersApi } from './customers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';

const FIELDS = ['name', 'phone', 'email', 'acceptsEmail', 'notes'] as const;

/** A customer's contact details, read at a glance and edited in place. */
@Component({
  selector: 'app-customer-details',
  imports: [
    ShopDatePipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  templateUrl: './customer-details.html',
  styleUrl: './customer-details.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerDetails {
  private readonly api = inject(CustomersApi);
  private readonly fb = inject(NonNullableFormBuilder);

  readonly customer = input.required<CustomerJson>();
  readonly canEdit = input(false);
  readonly saved = output<CustomerJson>();

  protected readonly editing = signal(false);
  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  protected readonly form = this.fb.group({
    name: [''],
    phone: [''],
    email: [''],
    acceptsEmail: [false],
    notes: [''],
  });
  protected readonly marks = new FieldMarks(this.form, FIELDS);

  protected edit(): void {
    const c = this.customer();
    this.form.setValue({
      name: c.name,
      phone: c.phone ?? '',
      email: c.email ?? '',
      acceptsEmail: c.acceptsEmail,
      notes: c.notes,
    });
    this.marks.clear();
    this.problem.set('');
    this.editing.set(true);
  }

  protected save(): void {
    if (this.busy()) return;
    const v = this.form.getRawValue();
    // The schema the server checks with: the same words before the round trip.
    const checked = customerPatch.safeParse(v);
    if (!checked.success) {
      this.marks.showIssues(checked.error.issues);
      return;
    }
    this.busy.set(true);
    this.api
      .update(this.customer().id, {
        name: v.name,
        phone: v.phone.trim() || null,
        email: v.email.trim() || null,
        acceptsEmail: v.acceptsEmail,
        notes: v.notes,
      })
      .subscribe({
        next: (customer) => {
          this.busy.set(false);
          this.editing.set(false);
          this.saved.emit(customer);
        },
        error: (error: unknown) => {
          this.busy.set(false);
          if (!this.marks.showServer(error)) this.problem.set(apiErrorMessage(error));
        },
      });
  }
}
