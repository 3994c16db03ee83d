import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import type { ExposureItemJson } from '../../../shared/api/catalog';
import { emptyStepWords } from '../../../shared/part-needs';
import { LengthPipe } from '../core/length-pipe';
import { StockApi } from './stock-api';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { SearchField } from '../ui/list-fields';

/**
 * Shop-wide: every step of every family with no free piston or no free ring set (the server's one
 * rule), the most asked-for first, and which part is missing. A worn cylinder that needs one waits.
 */
@Component({
  selector: 'app-exposure-list',
  imports: [
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    SearchField,
    LengthPipe,
    MatIconModule,
    RouterLink,
  ],
  templateUrl: './exposure-list.html',
  styleUrl: './exposure-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ExposureList {
  private readonly api = inject(StockApi);

  protected readonly columns = ['family', 'step', 'missing', 'bore', 'pistons', 'rings', 'issued'];
  /** "no free piston", "no free ring set" or both, in the words every page uses. */
  protected readonly missingWords = emptyStepWords;

  protected readonly list = new PagedList<ExposureItemJson>({
    pageSize: 50,
    load: (request) => this.api.exposure(request),
  });
}
