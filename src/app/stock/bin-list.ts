import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { NonNullableFormBuilder, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';

import type { BinJson } from '../../../shared/api/stock';
import { apiErrorBody, apiErrorMessage, apiFieldErrors } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { CameraScanButton } from '../ui/camera-scan';
import { StockApi } from './stock-api';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<BinJson> } | { ok: false; message: string };

/** The shop's bins: add one, see what is in each, and print bin labels. */
@Component({
  selector: 'app-bin-list',
  imports: [
    CameraScanButton,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatTableModule,
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
  protected readonly text = signal('');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(50);
  private readonly reloads = signal(0);
  protected readonly picked = signal<ReadonlySet<string>>(new Set());

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    {
      initialValue: '',
    },
  );
  private readonly query = computed(() => ({
    q: this.q().trim() || undefined,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.bins(query).pipe(
          map((page): Loaded => ({ ok: true, page })),
          catchError((error: unknown) =>
            of<Loaded>({ ok: false, message: apiErrorMessage(error) }),
          ),
        ),
      ),
      tap(() => this.loading.set(false)),
    ),
  );
  protected readonly rows = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.items : [];
  });
  protected readonly total = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.total : 0;
  });
  protected readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded && !loaded.ok ? loaded.message : '';
  });
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

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

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
        this.reload();
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
