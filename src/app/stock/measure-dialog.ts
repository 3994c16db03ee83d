import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { lengthText, lengthValidator, otherUnitHint } from '../ui/length-input';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { FormAlert } from '../ui/form-alert';

/** Records a piston's measured skirt diameter; closes with the change. */
@Component({
  selector: 'app-measure-dialog',
  imports: [
    FormAlert,
    LengthPipe,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    ReactiveFormsModule,
  ],
  template: `
    <h2 mat-dialog-title>Measure {{ unit.label }}</h2>
    <form [formGroup]="form" (ngSubmit)="submit()" novalidate>
      <mat-dialog-content class="dialog-form">
        <app-form-alert [message]="save.problem()" />
        <p>
          {{ unit.sku }} · {{ unit.stepLabel }}
          @if (unit.nominalBore) {
            · bore {{ unit.nominalBore | length }}
          }
          @if (unit.skirt) {
            · measured before: {{ unit.skirt | length }}
          }
        </p>
        <p class="note">Across the skirt at the maker's height, at 90° to the pin.</p>
        <mat-form-field appearance="outline">
          <mat-label>Skirt diameter</mat-label>
          <input
            matInput
            formControlName="skirt"
            inputmode="decimal"
            autocomplete="off"
            required
            cdkFocusInitial
          />
          <span matTextSuffix>{{ session.unit() }}</span>
          @if (hint(); as h) {
            <mat-hint>{{ h }}</mat-hint>
          }
          <mat-error>{{ error() }}</mat-error>
        </mat-form-field>
      </mat-dialog-content>
      <mat-dialog-actions align="end">
        <button mat-button type="button" mat-dialog-close>Cancel</button>
        <button mat-flat-button type="submit" [disabled]="save.busy()">Save size</button>
      </mat-dialog-actions>
    </form>
  `,
  styles: `
    .note {
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MeasureDialog {
  private readonly api = inject(StockApi);
  protected readonly unit = inject<UnitJson>(MAT_DIALOG_DATA);
  protected readonly session = inject(Session);

  protected readonly form = inject(NonNullableFormBuilder).group({
    skirt: [
      '',
      [Validators.required, lengthValidator(() => this.session.unit(), { max: 500_000_000 })],
    ],
  });
  protected readonly save = new DialogSave<StockChangeJson>();
  private readonly serverError = signal('');

  protected hint(): string {
    return otherUnitHint(this.form.controls.skirt.value, this.session.unit());
  }

  protected error(): string {
    const c = this.form.controls.skirt;
    if (c.hasError('required')) return 'Type the measured size.';
    if (c.hasError('length')) return String(c.getError('length'));
    return this.serverError();
  }

  protected submit(): void {
    this.save.submit(
      this.form,
      () =>
        this.api.measure(
          this.unit.id,
          lengthText(this.form.getRawValue().skirt, this.session.unit()),
        ),
      {
        failed: (error) => {
          const field = apiFieldErrors(error)['skirt'];
          if (field) {
            this.serverError.set(field);
            this.form.controls.skirt.setErrors({ server: field });
          }
        },
      },
    );
  }
}
