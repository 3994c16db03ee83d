import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';

import {
  ORDER_STATE_LABELS,
  ORDER_STATES,
  type OrderListItemJson,
  type OrderState,
} from '../../../shared/api/purchasing';
import { apiErrorMessage } from '../core/api-error';
import { Session } from '../core/session';
import { PurchasingApi } from './purchasing-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<OrderListItemJson> } | { ok: false; message: string };
const SORTABLE = ['number', 'createdAt', 'expectedOn', 'supplier', 'state'] as const;

/** Every purchase order with where it stands; open ones (sent out, partly in) first by default. */
@Component({
  selector: 'app-order-list',
  imports: [
    ShopDatePipe,
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
  templateUrl: './order-list.html',
  styleUrl: './order-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class OrderList {
  private readonly api = inject(PurchasingApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  protected readonly columns = ['number', 'supplier', 'state', 'expectedOn', 'lines', 'total'];
  protected readonly pageSizes = [25, 50, 100];
  protected readonly states = ORDER_STATES;
  protected readonly stateLabels = ORDER_STATE_LABELS;
  protected readonly canOrder = computed(() => this.session.may('buy'));
  protected readonly canReceive = computed(() => this.session.may('receiveStock'));

  protected readonly text = signal('');
  protected readonly state = signal<OrderState | 'open' | ''>('');
  protected readonly sort = signal<Sort>({ active: 'createdAt', direction: 'desc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );
  private readonly query = computed(() => {
    const sort = this.sort();
    return {
      q: this.q().trim() || undefined,
      state: this.state() || undefined,
      sort: SORTABLE.find((s) => s === sort.active) ?? 'createdAt',
      dir: sort.direction === 'asc' ? 'asc' : 'desc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.orders(query).pipe(
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

  protected onState(value: OrderState | 'open' | ''): void {
    this.state.set(value);
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

  protected open(order: OrderListItemJson): void {
    void this.router.navigate(['/purchasing/orders', order.id]);
  }
}
