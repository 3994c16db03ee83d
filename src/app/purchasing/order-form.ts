import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatDatepickerModule } from '@angular/material/datepicker';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatTooltipModule } from '@angular/material/tooltip';
import { Router, RouterLink } from '@angular/router';
import type { DateTime } from 'luxon';
import { catchError, map, of } from 'rxjs';

import type { PartJson } from '../../../shared/api/catalog';
import { patternHint } from '../../../shared/dates';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { dayOf } from '../core/shop-date-adapter';
import { PurchasingApi } from './purchasing-api';
import { FormAlert } from '../ui/form-alert';

type LineGroup = FormGroup<{
  part: FormControl<PartJson | string | null>;
  quantity: FormControl<number>;
  unitPrice: FormControl<string>;
}>;

const MONEY = /^\d{1,10}(\.\d{1,4})?$/;

/** A purchase order put together by hand: the supplier, the lines, when it is wanted. */
@Component({
  selector: 'app-order-form',
  imports: [
    FormAlert,
    MatTooltipModule,
    MatAutocompleteModule,
    MatButtonModule,
    MatDatepickerModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './order-form.html',
  styleUrl: './order-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OrderForm {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  protected readonly datePattern = computed(() => patternHint(this.session.locale()));

  protected readonly suppliers = toSignal(
    this.api.suppliers().pipe(
      map((p) => p.items.filter((s) => s.active)),
      catchError(() => of([])),
    ),
    { initialValue: [] },
  );
  protected readonly found = signal<PartJson[]>([]);
  protected readonly saving = signal(false);
  protected readonly error = signal('');

  protected readonly form = new FormGroup({
    supplierId: new FormControl('', { nonNullable: true, validators: [Validators.required] }),
    expectedOn: new FormControl<DateTime | null>(null),
    notes: new FormControl('', { nonNullable: true, validators: [Validators.maxLength(2000)] }),
    shipping: new FormControl('', { nonNullable: true, validators: [Validators.pattern(MONEY)] }),
    lines: new FormArray<LineGroup>([this.line()]),
  });

  protected line(): LineGroup {
    return new FormGroup({
      part: new FormControl<PartJson | string | null>(null, [Validators.required, partChosen]),
      quantity: new FormControl(1, {
        nonNullable: true,
        validators: [Validators.required, Validators.min(1), Validators.max(10000)],
      }),
      unitPrice: new FormControl('', {
        nonNullable: true,
        validators: [Validators.required, Validators.pattern(MONEY)],
      }),
    });
  }

  protected addLine(): void {
    this.form.controls.lines.push(this.line());
  }

  protected removeLine(i: number): void {
    this.form.controls.lines.removeAt(i);
  }

  protected search(text: string): void {
    if (text.trim().length < 2) {
      this.found.set([]);
      return;
    }
    this.api.findParts(text.trim()).subscribe({
      next: (page) => this.found.set(page.items.filter((p) => p.kind !== 'kit' && p.active)),
      error: () => this.found.set([]),
    });
  }

  protected partName(part: PartJson | string | null): string {
    if (!part) return '';
    return typeof part === 'string' ? part : `${part.sku} — ${part.description}`;
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      this.error.set(
        'Check the marked fields: each line needs a part chosen from the list, a quantity and a price.',
      );
      return;
    }
    const v = this.form.getRawValue();
    this.saving.set(true);
    this.error.set('');
    this.api
      .createOrder({
        supplierId: v.supplierId,
        expectedOn: dayOf(v.expectedOn),
        notes: v.notes,
        ...(v.shipping.trim() === '' ? {} : { shipping: v.shipping.trim() }),
        lines: v.lines.map((l) => ({
          partId: (l.part as PartJson).id,
          quantity: Number(l.quantity),
          unitPrice: l.unitPrice.trim(),
        })),
      })
      .subscribe({
        next: (order) => {
          this.saving.set(false);
          void this.notifier.success(`Draft ${order.number} saved.`);
          void this.router.navigate(['/purchasing/orders', order.id]);
        },
        error: (e: unknown) => {
          this.saving.set(false);
          this.error.set(apiErrorMessage(e));
        },
      });
  }
}

function partChosen(control: { value: unknown }): Record<string, boolean> | null {
  return control.value === null || typeof control.value === 'object' ? null : { partChosen: true };
}
