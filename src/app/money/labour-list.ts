import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';

import {
  LABOUR_PER,
  PROPOSE_FOR,
  PROPOSE_FOR_LABELS,
  type LabourOperationJson,
  type LabourPer,
  type ProposeFor,
} from '../../../shared/api/money';
import { apiErrorMessage } from '../core/api-error';
import { controlError, placeApiErrors } from '../core/field-errors';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { loadEach } from '../ui/load';
import { MoneyApi } from './money-api';
import { AMOUNT_PATTERN, formatAmount } from './money-words';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { RowActions } from '../ui/row-actions';

export const PER_LABELS: Record<LabourPer, string> = {
  cylinder: 'Per cylinder',
  job: 'Per job',
};

/**
 * The owner's labour price list: each operation with its price per cylinder or per job, whether it
 * is still offered, and for which jobs Stepstock puts it on a new estimate by itself.
 */
@Component({
  selector: 'app-labour-list',
  imports: [
    RowActions,
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatSelectModule,
    ReactiveFormsModule,
  ],
  templateUrl: './labour-list.html',
  styleUrl: './labour-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class LabourList {
  private readonly api = inject(MoneyApi);
  private readonly notifier = inject(Notifier);
  protected readonly currency = inject(Session).currency;

  protected readonly pers = LABOUR_PER;
  protected readonly perLabels = PER_LABELS;
  protected readonly proposals = PROPOSE_FOR;
  protected readonly proposeLabels = PROPOSE_FOR_LABELS;
  protected readonly money = formatAmount;
  protected readonly columns = ['name', 'per', 'price', 'proposeFor', 'active', 'actions'];
  /** An operation no longer offered keeps its row, in greyed words. */
  protected readonly rowLook = (item: LabourOperationJson): string => (item.active ? '' : 'faded');

  protected readonly loaded = loadEach(
    () => 'all',
    () => this.api.labour(),
  );
  protected readonly items = computed(() => this.loaded.value()?.items ?? []);
  protected readonly saving = signal(false);
  protected readonly formError = signal('');
  /** The operation being changed, or null while adding a new one. */
  protected readonly editing = signal<LabourOperationJson | null>(null);

  protected readonly form = new FormGroup({
    name: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(80)],
    }),
    per: new FormControl<LabourPer>('cylinder', { nonNullable: true }),
    price: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.pattern(AMOUNT_PATTERN)],
    }),
    proposeFor: new FormControl<ProposeFor>('never', { nonNullable: true }),
    active: new FormControl(true, { nonNullable: true }),
  });

  protected perLabel(item: LabourOperationJson): string {
    return PER_LABELS[item.per];
  }

  protected proposeLabel(item: LabourOperationJson): string {
    return PROPOSE_FOR_LABELS[item.proposeFor];
  }

  protected errorFor(name: 'name' | 'price'): string {
    const control = this.form.controls[name];
    if (name === 'price' && control.errors?.['pattern'])
      return 'Write the price in digits with at most 2 decimals, e.g. "42.50".';
    return controlError(control, name === 'name' ? 'a name' : 'a price');
  }

  protected edit(item: LabourOperationJson): void {
    this.editing.set(item);
    this.formError.set('');
    this.form.setValue({
      name: item.name,
      per: item.per,
      price: item.price,
      proposeFor: item.proposeFor,
      active: item.active,
    });
  }

  protected cancelEdit(): void {
    this.editing.set(null);
    this.formError.set('');
    this.form.reset();
  }

  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const value = this.form.getRawValue();
    const input = { ...value, name: value.name.trim(), price: value.price.trim() };
    const editing = this.editing();
    this.saving.set(true);
    this.formError.set('');
    const request = editing ? this.api.changeLabour(editing.id, input) : this.api.addLabour(input);
    request.subscribe({
      next: (saved) => {
        this.saving.set(false);
        void this.notifier.success(
          `${saved.name}: ${formatAmount(saved.price, this.currency())} ${PER_LABELS[saved.per].toLowerCase()} saved.`,
        );
        this.cancelEdit();
        this.loaded.reload();
      },
      error: (e: unknown) => {
        this.saving.set(false);
        this.formError.set(placeApiErrors(this.form, e));
      },
    });
  }

  /** Stops or starts offering an operation without touching its price. */
  protected setActive(item: LabourOperationJson, active: boolean): void {
    this.api.changeLabour(item.id, { active }).subscribe({
      next: (saved) => {
        this.loaded.set({ items: this.items().map((i) => (i.id === saved.id ? saved : i)) });
        void this.notifier.success(
          active ? `${saved.name} is offered again.` : `${saved.name} is no longer offered.`,
        );
      },
      error: (e: unknown) => void this.notifier.error(apiErrorMessage(e)),
    });
  }
}
