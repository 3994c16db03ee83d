import { ChangeDetectionStrategy, Component, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';

import type { ImportLogEntryJson, ImportStatus } from '../../../shared/api/suppliers';
import { ImportsApi } from './imports-api';
import { STATUS_WORDS } from './import-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';

/** Every price list brought in: who, when, which file, for which supplier, and what it changed. */
@Component({
  selector: 'app-import-log',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './import-log.html',
  styleUrl: './import-log.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportLog {
  private readonly api = inject(ImportsApi);
  private readonly router = inject(Router);

  /** Only this supplier's lists (from ?supplierId=). */
  readonly supplierId = input<string>();

  protected readonly columns = ['uploadedAt', 'supplier', 'file', 'status', 'counts', 'who'];
  protected readonly list = new PagedList<ImportLogEntryJson, never, { supplierId: string }>({
    filters: () => ({ supplierId: this.supplierId() ?? '' }),
    load: (request) => this.api.log(request),
  });

  protected statusText(status: ImportStatus): string {
    return STATUS_WORDS[status];
  }

  protected open(entry: ImportLogEntryJson): void {
    void this.router.navigate(['/imports', entry.importId]);
  }
}
