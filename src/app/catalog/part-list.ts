import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { map } from 'rxjs';

import { PART_KINDS, type PartJson, type PartKind } from '../../../shared/api/catalog';
import type { Page } from '../../../shared/api/common';
import { Session } from '../core/session';
import { CatalogApi } from './catalog-api';
import { looksScanned } from '../ui/scan';
import { KIND_LABELS } from './part-words';
import { PagedList } from '../ui/paged-list';
import { ListState } from '../ui/list-state';
import { familySteps } from './family-steps';

const PART_SORT = ['sku', 'description', 'kind', 'family', 'onHand', 'free', 'salePrice'] as const;
type PartSort = (typeof PART_SORT)[number];
type PartFilters = { familyId: string; stepId: string; kind: PartKind | '' };
type ScannedPage = Page<PartJson> & { q: string };

/**
 * Every part, paged and sorted on the server. The search takes a part number, words of the
 * description, a GTIN or a piston label; a barcode scanner types digits and Enter, and when that
 * finds exactly one part the page opens it.
 */
@Component({
  selector: 'app-part-list',
  imports: [
    ListState,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './part-list.html',
  styleUrl: './part-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class PartList {
  private readonly api = inject(CatalogApi);
  private readonly router = inject(Router);
  private readonly session = inject(Session);

  /** Filters that may arrive in the address (?familyId=…&q=…), e.g. from a step ladder. */
  readonly familyId = input<string>();
  readonly q = input<string>();

  protected readonly columns = [
    'sku',
    'description',
    'kind',
    'family',
    'onHand',
    'held',
    'free',
    'salePrice',
  ];
  protected readonly kinds = PART_KINDS;
  protected readonly kindLabels = KIND_LABELS;
  protected readonly pageSizes = [25, 50, 100];
  protected readonly canEdit = computed(() => this.session.may('editCatalog'));

  protected readonly list = new PagedList<PartJson, PartSort, PartFilters, ScannedPage>({
    sortable: PART_SORT,
    text: () => this.q() ?? '',
    filters: () => ({ familyId: this.familyId() ?? '', stepId: '', kind: '' }),
    // The answer remembers the search it is for, so a scan opens its part only once it is in.
    load: (request) =>
      this.api.parts(request).pipe(map((page) => ({ ...page, q: request.q ?? '' }))),
  });

  private readonly choices = familySteps(this.api, () => this.list.filters().familyId);
  protected readonly families = this.choices.families;
  protected readonly steps = this.choices.steps;

  private scanned = '';

  constructor() {
    // A scan that finds exactly one part opens it: the person's hands stay on the scanner.
    effect(() => {
      const page = this.list.value();
      if (!page || !this.scanned || page.q !== this.scanned) return;
      this.scanned = '';
      if (page.total === 1) {
        void this.router.navigate(['/catalog/parts', page.items[0].id]);
      }
    });
  }

  protected kindText(part: PartJson): string {
    return KIND_LABELS[part.kind];
  }

  protected onEnter(): void {
    const text = this.list.text().trim();
    if (looksScanned(text)) this.scanned = text;
    this.list.onEnter();
    // Enter on the same text again: the list is already showing it; open the single match now.
    const page = this.list.value();
    if (this.scanned && page?.q === text && page.total === 1) {
      this.scanned = '';
      void this.router.navigate(['/catalog/parts', page.items[0].id]);
    }
  }

  protected open(part: PartJson): void {
    void this.router.navigate(['/catalog/parts', part.id]);
  }
}
