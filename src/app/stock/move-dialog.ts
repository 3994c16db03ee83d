import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MAT_DIALOG_DATA } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { catchError, map, of } from 'rxjs';

import type { BinJson, StockChangeJson } from '../../../shared/api/stock';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { DialogForm } from '../ui/dialog-form';

/** What moves: one piston (by its unit) or all of a counted part. */
export interface MoveTarget {
  unitId?: string;
  partId?: string;
  /** "PU-000123" or the part number, for the title. */
  name: string;
  binId: string | null;
}

/** Moves a piston, or all of a counted part, to another bin; closes with the change. */
@Component({
  selector: 'app-move-dialog',
  imports: [DialogForm, MatFormFieldModule, MatSelectModule, ReactiveFormsModule],
  template: `
    <app-dialog-form
      [heading]="'Move ' + data.name"
      [formGroup]="form"
      (ngSubmit)="submit()"
      [save]="save"
      action="Move"
    >
      <mat-form-field appearance="outline">
        <mat-label>To bin</mat-label>
        <mat-select formControlName="toBinId" required>
          @for (b of bins(); track b.id) {
            <mat-option [value]="b.id" [disabled]="b.id === data.binId">
              {{ b.code }}
              @if (b.name) {
                — {{ b.name }}
              }
              @if (b.id === data.binId) {
                (here now)
              }
            </mat-option>
          }
        </mat-select>
        <mat-error>Choose the bin it goes to.</mat-error>
      </mat-form-field>
    </app-dialog-form>
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MoveDialog {
  private readonly api = inject(StockApi);
  protected readonly data = inject<MoveTarget>(MAT_DIALOG_DATA);

  protected readonly form = inject(NonNullableFormBuilder).group({
    toBinId: ['', Validators.required],
  });
  protected readonly bins = toSignal(
    this.api.bins({ page: 1, pageSize: 500 }).pipe(
      map((page) => page.items),
      catchError(() => of<BinJson[]>([])),
    ),
    { initialValue: [] as BinJson[] },
  );
  protected readonly save = new DialogSave<StockChangeJson>();

  protected submit(): void {
    const toBinId = this.form.getRawValue().toBinId;
    const body = this.data.unitId
      ? { unitId: this.data.unitId, toBinId }
      : { partId: this.data.partId, toBinId };
    this.save.submit(this.form, () => this.api.move(body));
  }
}
