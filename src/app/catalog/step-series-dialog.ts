import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import type { StepSeriesJson } from '../../../shared/api/catalog';
import { formatIn, formatMm } from '../../../shared/lengths';
import {
  customSeries,
  IMPERIAL_SERIES,
  IMPERIAL_SERIES_060,
  METRIC_SERIES,
  StepSeriesError,
  type StepDef,
} from '../../../shared/step-series';
import { CatalogApi } from './catalog-api';
import { DialogSave } from '../ui/dialog-save';
import { DialogForm } from '../ui/dialog-form';

interface Preset {
  label: string;
  code: string;
  name: string;
  unit: 'mm' | 'in';
  steps: readonly StepDef[];
}

const PRESETS: Preset[] = [
  {
    label: 'Metric to +1.00 mm',
    code: 'MET-025',
    name: 'Metric, 0.25 mm steps',
    unit: 'mm',
    steps: METRIC_SERIES,
  },
  {
    label: 'Imperial to +0.040 in',
    code: 'IMP-010',
    name: 'Imperial, 0.010 in steps',
    unit: 'in',
    steps: IMPERIAL_SERIES,
  },
  {
    label: 'Imperial to +0.060 in',
    code: 'IMP-060',
    name: 'Imperial to +0.060 in',
    unit: 'in',
    steps: IMPERIAL_SERIES_060,
  },
];

/** Adds a step series: the oversizes a piston family is made in. Closes with the new series. */
@Component({
  selector: 'app-step-series-dialog',
  imports: [
    DialogForm,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  template: `
    <app-dialog-form
      heading="New step series"
      [formGroup]="form"
      (ngSubmit)="submit()"
      [save]="save"
      action="Add series"
    >
      <p class="presets">
        Start from:
        @for (p of presets; track p.code) {
          <button mat-stroked-button type="button" (click)="usePreset(p)">{{ p.label }}</button>
        }
      </p>
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Code</mat-label>
        <input matInput formControlName="code" autocomplete="off" required />
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Name</mat-label>
        <input matInput formControlName="name" autocomplete="off" required />
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Steps are named in</mat-label>
        <mat-select formControlName="unit">
          <mat-option value="mm">millimetres</mat-option>
          <mat-option value="in">inches</mat-option>
        </mat-select>
      </mat-form-field>
      <mat-form-field appearance="outline" subscriptSizing="dynamic">
        <mat-label>Oversizes</mat-label>
        <input matInput formControlName="offsets" autocomplete="off" required />
        <mat-hint
          >Ascending, separated by spaces or semicolons, e.g. 0.25; 0.50; 0.75; 1.00</mat-hint
        >
        @if (offsetsError()) {
          <mat-error>{{ offsetsError() }}</mat-error>
        }
      </mat-form-field>
      @if (preview().length) {
        <p class="preview">Steps: {{ preview().join(' · ') }}</p>
      }
    </app-dialog-form>
  `,
  styles: `
    .presets {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      align-items: center;
      margin: 0 0 16px;
    }
    .preview {
      margin: 8px 0 0;
      color: var(--mat-sys-on-surface-variant);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class StepSeriesDialog {
  private readonly api = inject(CatalogApi);
  private readonly fb = inject(NonNullableFormBuilder);

  protected readonly presets = PRESETS;
  protected readonly form = this.fb.group({
    code: ['', [Validators.required, Validators.maxLength(24)]],
    name: ['', [Validators.required, Validators.maxLength(120)]],
    unit: this.fb.control<'mm' | 'in'>('mm'),
    offsets: ['', Validators.required],
  });
  protected readonly save = new DialogSave<StepSeriesJson>();
  protected readonly offsetsError = signal('');
  protected readonly preview = signal<string[]>([]);

  constructor() {
    this.form.valueChanges.subscribe(() => this.check());
  }

  protected usePreset(p: Preset): void {
    const offsets = p.steps
      .filter((s) => s.offsetNm > 0)
      .map((s) =>
        p.unit === 'mm'
          ? formatMm(s.offsetNm).replace(/0$/, '')
          : formatIn(s.offsetNm).replace(/0$/, ''),
      );
    this.form.setValue({ code: p.code, name: p.name, unit: p.unit, offsets: offsets.join('; ') });
  }

  private offsetList(): string[] {
    return this.form.controls.offsets.value
      .split(/[;\s]+/)
      .map((s) => s.trim())
      .filter(Boolean);
  }

  /** The same reader the server uses, so the preview and the saved series agree. */
  private check(): boolean {
    const offsets = this.offsetList();
    if (offsets.length === 0) {
      this.preview.set([]);
      this.offsetsError.set('');
      return false;
    }
    try {
      this.preview.set(customSeries(offsets, this.form.controls.unit.value).map((s) => s.label));
      this.offsetsError.set('');
      return true;
    } catch (e) {
      this.preview.set([]);
      this.offsetsError.set(
        e instanceof StepSeriesError ? e.message : 'These oversizes cannot be read.',
      );
      this.form.controls.offsets.setErrors({ series: true });
      return false;
    }
  }

  protected submit(): void {
    // The offsets are read again first: a series they do not make marks the field invalid.
    this.check();
    const value = this.form.getRawValue();
    this.save.submit(this.form, () =>
      this.api.createStepSeries({
        code: value.code.trim(),
        name: value.name.trim(),
        unit: value.unit,
        offsets: this.offsetList(),
      }),
    );
  }
}
