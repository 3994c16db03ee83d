import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';

import type { FamilyJson, LadderStepJson } from '../../../shared/api/catalog';
import type { ReorderDefaultJson } from '../../../shared/api/purchasing';
import { apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { DataTable } from '../ui/data-table';
import { RowActions } from '../ui/row-actions';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { PurchasingApi } from './purchasing-api';
import { FormAlert } from '../ui/form-alert';

/**
 * Reorder points a family's parts start from: one per step, or one for every step of the family.
 * A part's own rule wins over its step's default, which wins over the family's.
 */
@Component({
  selector: 'app-reorder-defaults-page',
  imports: [
    FormAlert,
    MatButtonModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    DataTable,
    RowActions,
    TableColumn,
    TableEmpty,
    ReactiveFormsModule,
  ],
  templateUrl: './reorder-defaults-page.html',
  styleUrl: './reorder-defaults-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReorderDefaultsPage {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['step', 'kind', 'reorderPoint', 'orderUpTo', 'actions'];
  protected readonly families = signal<FamilyJson[]>([]);
  protected readonly steps = signal<LadderStepJson[]>([]);
  protected readonly defaults = signal<ReorderDefaultJson[]>([]);
  protected readonly loading = signal(true);
  protected readonly loadError = signal('');
  protected readonly saving = signal(false);
  protected readonly fieldErrors = signal<Record<string, string>>({});

  protected readonly familyId = new FormControl('', { nonNullable: true });
  protected readonly form = new FormGroup({
    /** '' means every step of the family. */
    stepId: new FormControl('', { nonNullable: true }),
    kind: new FormControl<'piston' | 'rings'>('piston', { nonNullable: true }),
    reorderPoint: new FormControl(1, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(0), Validators.max(100000)],
    }),
    orderUpTo: new FormControl(3, {
      nonNullable: true,
      validators: [Validators.required, Validators.min(0), Validators.max(100000)],
    }),
  });

  constructor() {
    this.api.families().subscribe({
      next: (page) => {
        this.families.set(page.items);
        this.loading.set(false);
        if (page.items[0]) this.chooseFamily(page.items[0].id);
      },
      error: (e: unknown) => {
        this.loading.set(false);
        this.loadError.set(apiErrorMessage(e));
      },
    });
  }

  protected chooseFamily(familyId: string): void {
    this.familyId.setValue(familyId);
    this.form.controls.stepId.setValue('');
    this.api.ladder(familyId).subscribe({
      next: (ladder) => this.steps.set(ladder.steps),
      error: (e: unknown) => this.loadError.set(apiErrorMessage(e)),
    });
    this.loadDefaults();
  }

  private loadDefaults(): void {
    this.api.defaults(this.familyId.value).subscribe({
      next: (r) => this.defaults.set(r.items),
      error: (e: unknown) => this.loadError.set(apiErrorMessage(e)),
    });
  }

  protected edit(d: ReorderDefaultJson): void {
    this.form.setValue({
      stepId: d.stepId ?? '',
      kind: d.kind,
      reorderPoint: d.reorderPoint,
      orderUpTo: d.orderUpTo,
    });
  }

  protected save(): void {
    if (this.form.invalid || !this.familyId.value) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    this.saving.set(true);
    this.fieldErrors.set({});
    this.api
      .setDefault({
        familyId: this.familyId.value,
        stepId: v.stepId || null,
        kind: v.kind,
        reorderPoint: Number(v.reorderPoint),
        orderUpTo: Number(v.orderUpTo),
      })
      .subscribe({
        next: (saved) => {
          this.saving.set(false);
          void this.notifier.success(
            `Default saved: ${saved.kind === 'piston' ? 'pistons' : 'ring sets'} at ${saved.stepLabel ?? 'every step'} reorder at ${saved.reorderPoint}.`,
          );
          this.loadDefaults();
        },
        error: (e: unknown) => {
          this.saving.set(false);
          this.fieldErrors.set(apiFieldErrors(e));
          void this.notifier.error(apiErrorMessage(e));
        },
      });
  }

  protected remove(d: ReorderDefaultJson): void {
    this.api.deleteDefault(d.id).subscribe({
      next: () => {
        void this.notifier.success('Default removed.');
        this.loadDefaults();
      },
      error: (e: unknown) => void this.notifier.error(apiErrorMessage(e)),
    });
  }
}
