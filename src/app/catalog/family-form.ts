import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import {
  FormControl,
  NonNullableFormBuilder,
  ReactiveFormsModule,
  Validators,
} from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of, startWith, Subject, switchMap } from 'rxjs';

import { familyInput, type FamilyJson, type StepSeriesJson } from '../../../shared/api/catalog';
import { familyWarning } from '../../../shared/settings-ranges';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { lengthForField, lengthText, lengthValidator, otherUnitHint } from '../ui/length-input';
import { CatalogApi, type FamilyBody, type FamilyChanges } from './catalog-api';
import { StepSeriesDialog } from './step-series-dialog';
import { fieldRules } from '../core/field-errors';
import { loadIntoForm } from '../ui/load';
import { ListState } from '../ui/list-state';
import { FormAlert } from '../ui/form-alert';
import { FormSave } from '../ui/form-save';

/** The length fields, in form order, with what each one means at the bench. */
const LENGTHS = [
  {
    key: 'standardBore',
    label: 'Standard bore',
    hint: 'Nominal STD bore diameter',
    required: true,
  },
  { key: 'stroke', label: 'Stroke', hint: '', required: true },
  {
    key: 'clearanceMin',
    label: 'Clearance, least',
    hint: 'Piston-to-wall, new piston',
    required: true,
  },
  {
    key: 'clearanceMax',
    label: 'Clearance, most',
    hint: 'Piston-to-wall, new piston',
    required: true,
  },
  {
    key: 'forgedClearanceMin',
    label: 'Forged piston clearance, least',
    hint: 'Empty: forged pistons use the range above',
    required: false,
  },
  {
    key: 'forgedClearanceMax',
    label: 'Forged piston clearance, most',
    hint: 'Empty: forged pistons use the range above',
    required: false,
  },
  {
    key: 'honeAllowance',
    label: 'Hone allowance',
    hint: 'Left on the diameter for the hone',
    required: true,
  },
  {
    key: 'cleanup',
    label: 'Clean-up allowance',
    hint: 'Beyond the worst wear, on the diameter',
    required: true,
  },
  {
    key: 'maxOversize',
    label: 'Largest oversize',
    hint: 'Past it: sleeve or replace',
    required: true,
  },
  { key: 'maxTaper', label: 'Largest taper', hint: 'Leave empty if not known', required: false },
  {
    key: 'maxOutOfRound',
    label: 'Largest out-of-round',
    hint: 'Leave empty if not known',
    required: false,
  },
  {
    key: 'ringGapMin',
    label: 'Ring end gap, least',
    hint: 'Leave empty if not known',
    required: false,
  },
  {
    key: 'ringGapMax',
    label: 'Ring end gap, most',
    hint: 'Leave empty if not known',
    required: false,
  },
] as const;
type LengthKey = (typeof LENGTHS)[number]['key'];

/** The server's own rule for one family field (the lengths have theirs, in the length input). */
const rule = fieldRules(familyInput);

/** Adds or edits an engine family: its sizes, the maker's limits and the step series it uses. */
@Component({
  selector: 'app-family-form',
  imports: [
    FormAlert,
    ListState,
    MatButtonModule,
    MatButtonToggleModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './family-form.html',
  styleUrl: './family-form.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FamilyForm {
  private readonly api = inject(CatalogApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly router = inject(Router);
  private readonly session = inject(Session);
  private readonly fb = inject(NonNullableFormBuilder);

  /** The family id from the route when editing; absent for a new family. */
  readonly id = input<string>();

  protected readonly lengths = LENGTHS;
  protected readonly unit = this.session.unit;

  protected readonly form = this.fb.group({
    code: ['', [Validators.required, rule('code')]],
    name: ['', [Validators.required, rule('name')]],
    strokeType: this.fb.control<'two' | 'four'>('two'),
    cylinders: this.fb.control(1, [Validators.required, rule('cylinders')]),
    cooling: this.fb.control<'air' | 'liquid'>('air'),
    stepSeriesId: ['', Validators.required],
    notes: ['', rule('notes')],
    ringGapPerBore: ['0.004', [Validators.required, rule('ringGapPerBore')]],
    honeCrosshatch: this.fb.control(45, [Validators.required, rule('honeCrosshatch')]),
    honeGrits: ['', rule('honeGrits')],
    active: [true],
    lengths: this.fb.group(
      Object.fromEntries(
        LENGTHS.map((l) => [
          l.key,
          new FormControl('', {
            nonNullable: true,
            validators: [
              ...(l.required ? [Validators.required] : []),
              lengthValidator(() => this.unit(), {
                allowZero: l.key !== 'standardBore' && l.key !== 'stroke',
              }),
            ],
          }),
        ]),
      ) as Record<LengthKey, FormControl<string>>,
    ),
  });

  private readonly seriesReloads = new Subject<void>();
  protected readonly series = toSignal(
    this.seriesReloads.pipe(
      startWith(undefined),
      switchMap(() =>
        this.api.stepSeries().pipe(
          map((page) => page.items),
          catchError(() => of<StepSeriesJson[]>([])),
        ),
      ),
    ),
    { initialValue: [] as StepSeriesJson[] },
  );

  protected readonly loaded = loadIntoForm(
    () => this.id() || null,
    (id) => this.api.family(id),
    (family) => this.fill(family),
  );
  protected readonly save = new FormSave();
  protected readonly editing = computed(() => Boolean(this.id()));

  /** A caution (not a refusal) for a figure far outside what shops usually meet. */
  protected warning(key: LengthKey): string | null {
    return familyWarning(key, this.form.controls.lengths.controls[key].value, this.unit());
  }

  protected hint(key: LengthKey): string {
    return otherUnitHint(this.form.controls.lengths.controls[key].value, this.unit());
  }

  protected lengthError(key: LengthKey): string {
    const control = this.form.controls.lengths.controls[key];
    if (control.hasError('required')) return 'Enter this size, e.g. "64.00" or "2.5000 in".';
    const message = control.getError('length') as string | null;
    return message ?? this.save.fieldErrors()[key] ?? '';
  }

  protected addSeries(): void {
    this.dialog
      .open<StepSeriesDialog, void, StepSeriesJson>(StepSeriesDialog, {
        autoFocus: 'first-tabbable',
      })
      .afterClosed()
      .subscribe((series) => {
        if (series) {
          this.seriesReloads.next();
          this.form.controls.stepSeriesId.setValue(series.id);
          this.form.controls.stepSeriesId.markAsDirty();
          this.notifier.success(`Step series ${series.code} added.`);
        }
      });
  }

  protected submit(): void {
    if (!this.save.ready(this.form)) return;
    const body = this.body();
    const id = this.id();
    if (id && Object.keys(body).length === 0) {
      void this.router.navigate(['/catalog/families', id, 'ladder']);
      return;
    }
    const request = id
      ? this.api.updateFamily(id, body)
      : this.api.createFamily(body as FamilyBody);
    this.save.send(request, {
      saved: (family) => {
        this.notifier.success(id ? `${family.code} saved.` : `${family.code} added.`);
        void this.router.navigate(['/catalog/families', family.id, 'ladder']);
      },
      // The sizes sit in their own group; the server names them alone ("standardBore").
      controlOf: (field) => this.form.controls.lengths.get(field) ?? this.form.get(field),
    });
  }

  /** A new family sends everything; an edit sends only what was changed, so nothing drifts. */
  private body(): FamilyChanges {
    const editing = this.editing();
    const v = this.form.getRawValue();
    const body: FamilyChanges = {};
    const take = <K extends keyof FamilyChanges>(
      key: K,
      dirty: boolean,
      value: FamilyChanges[K],
    ) => {
      if (!editing || dirty) body[key] = value;
    };
    const c = this.form.controls;
    take('code', c.code.dirty, v.code.trim());
    take('name', c.name.dirty, v.name.trim());
    take('strokeType', c.strokeType.dirty, v.strokeType);
    take('cylinders', c.cylinders.dirty, Number(v.cylinders));
    take('cooling', c.cooling.dirty, v.cooling);
    take('stepSeriesId', c.stepSeriesId.dirty, v.stepSeriesId);
    take('notes', c.notes.dirty, v.notes);
    take('ringGapPerBore', c.ringGapPerBore.dirty, v.ringGapPerBore.trim());
    take('honeCrosshatch', c.honeCrosshatch.dirty, Number(v.honeCrosshatch));
    take('honeGrits', c.honeGrits.dirty, v.honeGrits.trim());
    if (editing) take('active', c.active.dirty, v.active);
    for (const l of LENGTHS) {
      const control = c.lengths.controls[l.key];
      const text = control.value.trim();
      const value = text === '' ? null : lengthText(text, this.unit());
      if (!editing || control.dirty) {
        if (l.required) (body as Record<string, unknown>)[l.key] = value ?? '';
        else if (value !== null || editing) (body as Record<string, unknown>)[l.key] = value;
      }
    }
    return body;
  }

  private fill(f: FamilyJson): void {
    const unit = this.unit();
    this.form.reset({
      code: f.code,
      name: f.name,
      strokeType: f.strokeType,
      cylinders: f.cylinders,
      cooling: f.cooling,
      stepSeriesId: f.stepSeriesId,
      notes: f.notes,
      ringGapPerBore: f.ringGapPerBore,
      honeCrosshatch: f.hone.crosshatchDeg,
      honeGrits: f.hone.grits,
      active: f.active,
      lengths: {
        standardBore: lengthForField(f.standardBore, unit),
        stroke: lengthForField(f.stroke, unit),
        clearanceMin: lengthForField(f.clearance.min, unit),
        clearanceMax: lengthForField(f.clearance.max, unit),
        honeAllowance: lengthForField(f.honeAllowance, unit),
        cleanup: lengthForField(f.cleanup, unit),
        maxOversize: lengthForField(f.maxOversize, unit),
        maxTaper: lengthForField(f.maxTaper, unit),
        maxOutOfRound: lengthForField(f.maxOutOfRound, unit),
        ringGapMin: lengthForField(f.ringGap.min, unit),
        ringGapMax: lengthForField(f.ringGap.max, unit),
        forgedClearanceMin: lengthForField(f.forgedClearance?.min ?? null, unit),
        forgedClearanceMax: lengthForField(f.forgedClearance?.max ?? null, unit),
      },
    });
  }
}
