import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { RouterLink } from '@angular/router';

import type { BinJson } from '../../../shared/api/stock';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { CameraScanButton } from '../ui/camera-scan';
import { StockApi } from './stock-api';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { SearchField } from '../ui/list-fields';

/** The shop's bins: add one, see what is in each, and print bin labels. */
@Component({
  selector: 'app-bin-list',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    SearchField,
    CameraScanButton,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './bin-list.html',
  styleUrl: './bin-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class BinList {
  private readonly api = inject(StockApi);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['pick', 'code', 'name', 'units', 'parts'];
  protected readonly list = new PagedList<BinJson>({
    pageSize: 50,
    load: (request) => this.api.bins(request),
  });

  protected readonly picked = signal<ReadonlySet<string>>(new Set());

  protected readonly pickedIds = computed(() => [...this.picked()].join(','));

  protected readonly form = inject(NonNullableFormBuilder).group({
    code: [
      '',
      [
        Validators.required,
        Validators.maxLength(32),
        Validators.pattern(/^[A-Za-z0-9][A-Za-z0-9._/-]*$/),
      ],
    ],
    name: ['', Validators.maxLength(120)],
  });
  protected readonly busy = signal(false);
  protected readonly problem = signal('');
  protected readonly codeError = signal('');

  protected toggle(id: string, on: boolean): void {
    this.picked.update((set) => {
      const next = new Set(set);
      if (on) next.add(id);
      else next.delete(id);
      return next;
    });
  }

  protected add(): void {
    if (this.busy()) return;
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    const v = this.form.getRawValue();
    this.busy.set(true);
    this.problem.set('');
    this.codeError.set('');
    this.api.createBin({ code: v.code.trim(), name: v.name.trim() || undefined }).subscribe({
      next: (bin) => {
        this.busy.set(false);
        this.form.reset();
        this.notifier.success(`Bin ${bin.code} added.`);
        this.list.reload();
      },
      error: (error: unknown) => {
        this.busy.set(false);
        const field = apiFieldErrors(error)['code'];
        if (field) {
          this.codeError.set(field);
          this.form.controls.code.setErrors({ server: field });
        }
        this.problem.set(apiErrorBody(error)?.error.message ?? apiErrorMessage(error));
      },
    });
  }
}
