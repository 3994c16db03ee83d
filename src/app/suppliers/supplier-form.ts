import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { Router, RouterLink } from '@angular/router';

import { supplierInput } from '../../../shared/api/suppliers';
import { Notifier } from '../core/notifier';
import { SuppliersApi, type SupplierBody } from './suppliers-api';
import { fieldRules } from '../core/field-errors';
import { loadIntoForm } from '../ui/load';
import { ListState } from '../ui/list-state';
import { FormAlert } from '../ui/form-alert';
import { FormSave } from '../ui/form-save';

/** The server's own rule for one supplier field. */
const rule = fieldRules(supplierInput);

/** A supplier's details: who they are, where orders go, their currency, lead time and terms. */
@Component({
  selector: 'app-supplier-form',
  imports: [
    FormAlert,
    ListState,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './supplier-form.html',
  styleUrl: './supplier-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SupplierForm {
  private readonly api = inject(SuppliersApi);
  private readonly notifier = inject(Notifier);
  private readonly router = inject(Router);
  private readonly fb = inject(NonNullableFormBuilder);

  /** The supplier id from the route when editing; absent for a new supplier. */
  readonly id = input<string>();

  protected readonly form = this.fb.group({
    name: ['', [Validators.required, rule('name')]],
    email: ['', rule('email')],
    currency: ['EUR', [Validators.required, rule('currency')]],
    leadDays: this.fb.control(14, [Validators.required, rule('leadDays')]),
    contacts: ['', rule('contacts')],
    minOrder: ['0', [Validators.required, rule('minOrder')]],
    shippingCost: ['0', [Validators.required, rule('shippingCost')]],
    notes: ['', rule('notes')],
    active: [true],
  });

  protected readonly loaded = loadIntoForm(
    () => this.id() || null,
    (id) => this.api.supplier(id),
    (supplier) =>
      this.form.reset({
        name: supplier.name,
        email: supplier.email ?? '',
        currency: supplier.currency,
        leadDays: supplier.leadDays,
        contacts: supplier.contacts,
        minOrder: supplier.minOrder,
        shippingCost: supplier.shippingCost,
        notes: supplier.notes,
        active: supplier.active,
      }),
  );
  protected readonly save = new FormSave();
  protected readonly editing = computed(() => Boolean(this.id()));

  protected submit(): void {
    if (!this.save.ready(this.form)) return;
    const v = this.form.getRawValue();
    const body: SupplierBody = {
      name: v.name.trim(),
      email: v.email.trim() || null,
      currency: v.currency.trim().toUpperCase(),
      leadDays: Number(v.leadDays),
      contacts: v.contacts,
      minOrder: v.minOrder.trim(),
      shippingCost: v.shippingCost.trim(),
      notes: v.notes,
      ...(this.editing() ? { active: v.active } : {}),
    };
    const id = this.id();
    this.save.send(id ? this.api.updateSupplier(id, body) : this.api.createSupplier(body), {
      saved: (supplier) => {
        this.notifier.success(id ? `${supplier.name} saved.` : `${supplier.name} added.`);
        void this.router.navigate(['/suppliers', supplier.id]);
      },
      controlOf: (field) => this.form.get(field),
    });
  }
}
