import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { Router, RouterLink } from '@angular/router';

import type { CustomerListItemJson } from '../../../shared/api/customers';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { CameraScanButton } from '../ui/camera-scan';
import { PagedList } from '../ui/paged-list';
import { CustomersApi } from './customers-api';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { SearchField } from '../ui/list-fields';

/** The search decides the order (names that start with the text, then recent customers). */
const SORTABLE = ['relevance'] as const;

/**
 * Every customer on record, found by name, phone or e-mail; a row opens the customer's page. A
 * cylinder's tag, scanned with the camera or a keyboard-wedge scanner (it types the mark and
 * Enter), opens that cylinder's page.
 */
@Component({
  selector: 'app-customer-list',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    SearchField,
    CameraScanButton,
    RouterLink,
  ],
  templateUrl: './customer-list.html',
  styleUrl: './customer-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CustomerList {
  private readonly api = inject(CustomersApi);
  private readonly router = inject(Router);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['name', 'phone', 'email'];

  protected readonly list = new PagedList<CustomerListItemJson, (typeof SORTABLE)[number]>({
    sortable: SORTABLE,
    load: (request) => this.api.search(request.q ?? '', request.page, request.pageSize),
  });

  protected open(customer: CustomerListItemJson): void {
    void this.router.navigate(['/customers', customer.id]);
  }

  /** Read by the camera: a cylinder's tag opens the cylinder, anything else is searched for. */
  protected onScanned(text: string): void {
    this.list.onSearch(text);
    this.openTag(text);
  }

  /** The whole text is a cylinder's mark (a tag scanned, or typed and Enter): open that cylinder. */
  protected openTag(text: string): void {
    const mark = text.trim();
    if (!mark) return;
    this.api.cylinderByMark(mark).subscribe({
      next: (cylinder) => {
        if (cylinder) {
          void this.router.navigate(['/customers', cylinder.customerId, 'cylinders', cylinder.id]);
        }
      },
      error: (error: unknown) => void this.notifier.error(apiErrorMessage(error)),
    });
  }
}
