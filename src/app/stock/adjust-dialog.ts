import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import type { PartJson } from '../../../shared/api/catalog';
import type { StockChangeJson } from '../../../shared/api/stock';
import { PartPicker } from './part-picker';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { DialogForm } from '../ui/dialog-form';

/** Corrects a counted part's on-hand after a count (+ found, − missing), with the reason. */
@Component({
  selector: 'app-adjust-dialog',
  imports: [
    DialogForm,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    PartPicker,
    ReactiveFormsModule,
  ],
  template: `
    <app-dialog-form
      heading="Correct a count"
      [formGroup]="form"
      (ngSubmit)="submit()"
      [save]="save"
      action="Save"
      [blocked]="!part() || part()?.kind === 'piston'"
    >
      @if (part(); as p) {
        <p>
          <strong>{{ p.sku }}</strong> {{ p.description }}<br />
          On hand {{ p.onHand }}, held {{ p.held }}, free {{ p.free }}
          @if (!data) {
            <button mat-button type="button" (click)="part.set(null)">Change</button>
          }
        </p>
        @if (p.kind === 'piston') {
          <p class="note">
            Pistons are counted one by one: scrap a missing one from its row under Pistons, or
            receive a found one.
          </p>
        }
      } @else {
        <app-part-picker label="Part counted" (picked)="part.set($event)" />
      }
      <mat-form-field appearance="outline">
        <mat-label>Change</mat-label>
        <input matInput type="number" formControlName="quantity" required />
        <mat-hint>+2 when two more were found, −3 when three are missing</mat-hint>
        <mat-error>A whole number other than 0.</mat-error>
      </mat-form-field>
      <mat-form-field appearance="outline">
        <mat-label>Reason</mat-label>
        <input matInput formControlName="reason" autocomplete="off" required />
        <mat-error>Say why the count changes.</mat-error>
      </mat-form-field>
    </app-dialog-form>
  `,
  // p.note, not .note as in the measure dialog: see ui/list-fields.ts on identical inline styles
  styles: `
    p.note {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AdjustDialog {
  private readonly api = inject(StockApi);
  protected readonly data = inject<PartJson | null>(MAT_DIALOG_DATA, { optional: true });

  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly part = signal<PartJson | null>(this.data);
  protected readonly form = this.fb.group({
    quantity: this.fb.control<number | null>(null, [
      Validators.required,
      (c) => (c.value === 0 || !Number.isInteger(Number(c.value)) ? { zero: true } : null),
    ]),
    reason: ['', [Validators.required, Validators.maxLength(500)]],
  });
  protected readonly save = new DialogSave<StockChangeJson>();

  protected submit(): void {
    const part = this.part();
    if (!part) return;
    const v = this.form.getRawValue();
    this.save.submit(this.form, () =>
      this.api.adjust({ partId: part.id, quantity: Number(v.quantity), reason: v.reason.trim() }),
    );
  }
}
