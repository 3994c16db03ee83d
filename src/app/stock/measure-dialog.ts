import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MAT_DIALOG_DATA } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';

import type { StockChangeJson, UnitJson } from '../../../shared/api/stock';
import { apiFieldErrors } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { lengthText, lengthValidator, otherUnitHint } from '../ui/length-input';
import { StockApi } from './stock-api';
import { DialogSave } from '../ui/dialog-save';
import { DialogForm } from '../ui/dialog-form';

/** Records a piston's measured skirt diameter; closes with the change. */
@Component({
  selector: 'app-measure-dialog',
  imports: [DialogForm, LengthPipe, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  template: `
    <app-dialog-form
      [heading]="'Measure ' + unit.label"
      [formGroup]="form"
      (ngSubmit)="submit()"
      [save]="save"
      action="Save size"
    >
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
    </app-dialog-form>
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
