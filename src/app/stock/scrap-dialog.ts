import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MAT_DIALOG_DATA } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { DialogForm } from '../ui/dialog-form';

/** Writes a piston off (damaged, dropped, missing at a count), with the reason on record. */
@Component({
  selector: 'app-scrap-dialog',
  imports: [DialogForm, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <app-dialog-form
      [heading]="'Scrap ' + unit.label + '?'"
      [formGroup]="form"
      (ngSubmit)="submit()"
      [save]="save"
      action="Scrap"
      cancel="Keep it"
      danger
    >
      <p>It leaves stock for good; the ledger keeps who did it and why.</p>
      <mat-form-field appearance="outline">
        <mat-label>Reason</mat-label>
        <input matInput formControlName="reason" autocomplete="off" required cdkFocusInitial />
        <mat-hint>e.g. skirt scored, dropped, missing at the count</mat-hint>
        <mat-error>Say why it is scrapped.</mat-error>
      </mat-form-field>
    </app-dialog-form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ScrapDialog {
  private readonly api = inject(StockApi);
  protected readonly unit = inject<UnitJson>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group({
    reason: ['', [Validators.required, Validators.maxLength(500)]],
  });
  protected readonly save = new DialogSave<StockChangeJson>();

  protected submit(): void {
    this.save.submit(this.form, () =>
      this.api.scrap(this.unit.id, this.form.getRawValue().reason.trim()),
    );
  }
}
