import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import { formatMoney } from '../../../shared/money';
import type { SupplierItemJson } from '../../../shared/api/suppliers';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { PriceHistoryDialog, type PriceHistoryData } from './price-history-dialog';
import { SuppliersApi } from './suppliers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { loadById } from '../ui/load';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableActions, TableColumn, TableEmpty } from '../ui/table-column';
import { FilterSelect, SearchField, type Choice } from '../ui/list-fields';

const SORTABLE = ['sku', 'description', 'size', 'price', 'available', 'updated'] as const;
type ItemSort = (typeof SORTABLE)[number];
type Listed = 'all' | 'true' | 'false';
/** The supplier is a filter too: another supplier's page starts its items from the first page. */
type ItemFilters = { supplierId: string; mapped: Listed; dropped: Listed };

/** One supplier: their terms and every item of their lists, with the price history of each. */
@Component({
  selector: 'app-supplier-detail',
  imports: [
    DataTable,
    ListState,
    TableActions,
    TableColumn,
    TableEmpty,
    SearchField,
    FilterSelect,
    ShopDatePipe,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
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
  protected readonly canEdit = computed(() => this.session.may('editSuppliers'));
  protected readonly mapped: Choice[] = [
    { value: 'all', label: 'All items' },
    { value: 'true', label: 'Mapped' },
    { value: 'false', label: 'Not mapped yet' },
  ];
  protected readonly dropped: Choice[] = [
    { value: 'false', label: 'Still listed' },
    { value: 'true', label: 'Dropped from the list' },
    { value: 'all', label: 'Both' },
  ];

  protected readonly supplier = loadById(this.id, (id) => this.api.supplier(id));
  protected readonly items = new PagedList<SupplierItemJson, ItemSort, ItemFilters>({
    sortable: SORTABLE,
    filters: () => ({ supplierId: this.id(), mapped: 'all', dropped: 'false' }),
    load: ({ supplierId = '', ...request }) => this.api.items(supplierId, request),
  });

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
  }

  protected history(item: SupplierItemJson): void {
    this.dialog.open<PriceHistoryDialog, PriceHistoryData>(PriceHistoryDialog, {
      data: { supplierId: this.id(), item },
      width: 'min(640px, 96vw)',
      autoFocus: 'dialog',
    });
  }
}
