import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';

import {
  ORDER_STATE_LABELS,
  ORDER_STATES,
  type OrderListItemJson,
  type OrderState,
} from '../../../shared/api/purchasing';
import { Session } from '../core/session';
import { PurchasingApi } from './purchasing-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { choicesOf, FilterSelect, SearchField, type Choice } from '../ui/list-fields';

type OrderFilters = { state: OrderState | 'open' | '' };
const SORTABLE = ['number', 'createdAt', 'expectedOn', 'supplier', 'state'] as const;

/** Every purchase order with where it stands; open ones (sent out, partly in) first by default. */
@Component({
  selector: 'app-order-list',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    SearchField,
    FilterSelect,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
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
  protected readonly states: Choice[] = [
    { value: '', label: 'Any' },
    { value: 'open', label: 'Still to come in' },
    ...choicesOf(ORDER_STATES, (state) => ORDER_STATE_LABELS[state]),
  ];
  protected readonly canOrder = computed(() => this.session.may('buy'));
  protected readonly canReceive = computed(() => this.session.may('receiveStock'));

  protected readonly list = new PagedList<
    OrderListItemJson,
    (typeof SORTABLE)[number],
    OrderFilters
  >({
    sortable: SORTABLE,
    sort: 'createdAt',
    dir: 'desc',
    filters: { state: '' },
    load: (request) => this.api.orders(request),
  });

  protected open(order: OrderListItemJson): void {
    void this.router.navigate(['/purchasing/orders', order.id]);
  }
}
