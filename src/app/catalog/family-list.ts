import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';

import type { FamilyJson } from '../../../shared/api/catalog';
import { LengthPipe } from '../core/length-pipe';
import { Session } from '../core/session';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { CatalogApi } from './catalog-api';
import { ListState } from '../ui/list-state';
import { SearchField } from '../ui/list-fields';
import { IconLink } from '../ui/icon-link';

const SORTABLE = ['code', 'name', 'standardBore', 'strokeType'] as const;

/** Every engine family the shop works on, with how its pistons stand; a row opens its step ladder. */
@Component({
  selector: 'app-family-list',
  imports: [
    SearchField,
    ListState,
    IconLink,
    LengthPipe,
    MatButtonModule,
    MatIconModule,
    DataTable,
    TableColumn,
    TableEmpty,
    RouterLink,
  ],
  templateUrl: './family-list.html',
  styleUrl: './family-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class FamilyList {
  private readonly api = inject(CatalogApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  protected readonly columns = ['code', 'name', 'strokeType', 'standardBore', 'stock', 'actions'];
  protected readonly canEdit = computed(() => this.session.may('editCatalog'));

  protected readonly list = new PagedList<FamilyJson, (typeof SORTABLE)[number]>({
    sortable: SORTABLE,
    load: (request) => this.api.families(request),
  });

  protected open(family: FamilyJson): void {
    void this.router.navigate(['/catalog/families', family.id, 'ladder']);
  }
}
