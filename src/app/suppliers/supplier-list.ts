import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';

import type { SupplierJson } from '../../../shared/api/suppliers';
import { Session } from '../core/session';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { SuppliersApi } from './suppliers-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { ListState } from '../ui/list-state';
import { SearchField } from '../ui/list-fields';
import { IconLink } from '../ui/icon-link';

const SORTABLE = ['name', 'currency', 'leadDays', 'items', 'lastImport'] as const;

/** Every supplier with what they offer, how much of it waits to be mapped, and their last list. */
@Component({
  selector: 'app-supplier-list',
  imports: [
    SearchField,
    ListState,
    IconLink,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    DataTable,
    TableColumn,
    TableEmpty,
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
  protected readonly canEdit = computed(() => this.session.may('editSuppliers'));

  protected readonly list = new PagedList<SupplierJson, (typeof SORTABLE)[number]>({
    sortable: SORTABLE,
    load: (request) => this.api.suppliers(request),
  });

  protected open(supplier: SupplierJson): void {
    void this.router.navigate(['/suppliers', supplier.id]);
  }
}
