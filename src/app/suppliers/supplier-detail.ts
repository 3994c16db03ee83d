import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import {
  catchError,
  combineLatest,
  debounceTime,
  distinctUntilChanged,
  filter,
  map,
  of,
  switchMap,
  tap,
} from 'rxjs';

import { formatMoney } from '../../../shared/money';
import type { SupplierItemJson, SupplierJson } from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { PriceHistoryDialog, type PriceHistoryData } from './price-history-dialog';
import { SuppliersApi, type ItemQuery } from './suppliers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import type { Page } from '../../../shared/api/common';

type LoadedItems = { ok: true; page: Page<SupplierItemJson> } | { ok: false; message: string };
type LoadedSupplier =
  | { state: 'loading' }
  | { state: 'ok'; supplier: SupplierJson }
  | { state: 'error'; message: string };
const SORTABLE = ['sku', 'description', 'size', 'price', 'available', 'updated'] as const;

/** One supplier: their terms and every item of their lists, with the price history of each. */
@Component({
  selector: 'app-supplier-detail',
  imports: [
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './supplier-detail.html',
  styleUrl: './supplier-detail.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SupplierDetail {
  private readonly api = inject(SuppliersApi);
  private readonly dialog = inject(MatDialog);
  private readonly session = inject(Session);

  /** The supplier id from the route. */
  readonly id = input.required<string>();

  protected readonly columns = [
    'sku',
    'description',
    'size',
    'price',
    'available',
    'part',
    'actions',
  ];
  protected readonly pageSizes = [25, 50, 100];
  protected readonly canEdit = computed(() => this.session.may('editSuppliers'));

  protected readonly supplier = signal<LoadedSupplier>({ state: 'loading' });
  protected readonly text = signal('');
  protected readonly mapped = signal<'all' | 'true' | 'false'>('all');
  protected readonly dropped = signal<'all' | 'true' | 'false'>('false');
  protected readonly sort = signal<Sort>({ active: 'sku', direction: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );

  private readonly query = computed(() => {
    const sort = this.sort();
    const field = SORTABLE.find((name) => name === sort.active) ?? 'sku';
    return {
      q: this.q().trim() || undefined,
      mapped: this.mapped(),
      dropped: this.dropped(),
      sort: field,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    } satisfies ItemQuery & { reload: number };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    combineLatest([toObservable(this.id), toObservable(this.query)]).pipe(
      filter(([id]) => Boolean(id)),
      tap(() => this.loading.set(true)),
      switchMap(([id, { reload: _reload, ...query }]) =>
        this.api.items(id, query).pipe(
          map((page): LoadedItems => ({ ok: true, page })),
          catchError((error: unknown) =>
            of<LoadedItems>({ ok: false, message: apiErrorMessage(error) }),
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

  constructor() {
    effect(() => {
      const id = this.id();
      this.supplier.set({ state: 'loading' });
      this.api.supplier(id).subscribe({
        next: (supplier) => this.supplier.set({ state: 'ok', supplier }),
        error: (error: unknown) =>
          this.supplier.set({ state: 'error', message: apiErrorMessage(error) }),
      });
    });
  }

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
  }

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onMapped(value: 'all' | 'true' | 'false'): void {
    this.mapped.set(value);
    this.pageIndex.set(0);
  }

  protected onDropped(value: 'all' | 'true' | 'false'): void {
    this.dropped.set(value);
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

  protected history(item: SupplierItemJson): void {
    this.dialog.open<PriceHistoryDialog, PriceHistoryData>(PriceHistoryDialog, {
      data: { supplierId: this.id(), item },
      width: 'min(640px, 96vw)',
      autoFocus: 'dialog',
    });
  }
}
