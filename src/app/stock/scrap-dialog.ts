import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { FormAlert } from '../ui/form-alert';

/** Writes a piston off (damaged, dropped, missing at a count), with the reason on record. */
@Component({
  selector: 'app-scrap-dialog',
  imports: [
    FormAlert,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Scrap {{ unit.label }}?</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="dialog-form">
        <app-form-alert [message]="save.problem()" />
        <p>It leaves stock for good; the ledger keeps who did it and why.</p>
        <mat-form-field appearance="outline">
          <mat-label>Reason</mat-label>
          <input matInput formControlName="reason" autocomplete="off" required cdkFocusInitial />
          <mat-hint>e.g. skirt scored, dropped, missing at the count</mat-hint>
          <mat-error>Say why it is scrapped.</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Keep it</button>
        <button mat-flat-button type="submit" class="danger" [disabled]="save.busy()">Scrap</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .danger {
      --mat-button-filled-container-color: var(--mat-sys-error);
      --mat-button-filled-label-text-color: var(--mat-sys-on-error);
    }
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
