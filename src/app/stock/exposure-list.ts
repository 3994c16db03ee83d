import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';

import type { ExposureItemJson } from '../../../shared/api/catalog';
import { emptyStepWords } from '../../../shared/part-needs';
import { LengthPipe } from '../core/length-pipe';
import { StockApi } from './stock-api';
import { PagedList } from '../ui/paged-list';
import { ListState } from '../ui/list-state';

/**
 * Shop-wide: every step of every family with no free piston or no free ring set (the server's one
 * rule), the most asked-for first, and which part is missing. A worn cylinder that needs one waits.
 */
@Component({
  selector: 'app-exposure-list',
  imports: [
    ListState,
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatTableModule,
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
