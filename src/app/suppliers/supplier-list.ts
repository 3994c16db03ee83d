import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';

import type { Page } from '../../../shared/catalog-api';
import type { SupplierJson } from '../../../shared/suppliers-api';
import { apiErrorMessage } from '../core/api-error';
import { Session } from '../core/session';
import { SuppliersApi, type SupplierQuery } from './suppliers-api';

type Loaded = { ok: true; page: Page<SupplierJson> } | { ok: false; message: string };
const SORTABLE = ['name', 'currency', 'leadDays', 'items', 'lastImport'] as const;

/** Every supplier with what they offer, how much of it waits to be mapped, and their last list. */
@Component({
  selector: 'app-supplier-list',
  imports: [
    DatePipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './supplier-list.html',
  styleUrl: './supplier-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SupplierList {
  private readonly api = inject(SuppliersApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  protected readonly columns = ['name', 'currency', 'leadDays', 'items', 'lastImport', 'actions'];
  protected readonly pageSizes = [25, 50, 100];
  protected readonly canEdit = computed(() => {
    const role = this.session.user()?.role;
    return role === 'owner' || role === 'buyer';
  });

  protected readonly text = signal('');
  protected readonly sort = signal<Sort>({ active: 'name', direction: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );

  private readonly query = computed(() => {
    const sort = this.sort();
    const field = SORTABLE.find((name) => name === sort.active) ?? 'name';
    return {
      q: this.q().trim() || undefined,
      sort: field,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    } satisfies SupplierQuery & { reload: number };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.suppliers(query).pipe(
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

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onSort(sort: Sort): void {
    this.sort.set(sort);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected open(supplier: SupplierJson): void {
    void this.router.navigate(['/suppliers', supplier.id]);
  }
}
