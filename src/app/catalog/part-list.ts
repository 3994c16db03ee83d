import { ChangeDetectionStrategy, Component, computed, effect, inject, input } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { Router, RouterLink } from '@angular/router';
import { map } from 'rxjs';

import { PART_KINDS, type PartJson, type PartKind } from '../../../shared/api/catalog';
import type { Page } from '../../../shared/api/common';
import { Session } from '../core/session';
import { CatalogApi } from './catalog-api';
import { looksScanned } from '../ui/scan';
import { KIND_LABELS } from './part-words';
import { PagedList } from '../ui/paged-list';
import { familySteps } from './family-steps';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { choicesOf, FilterSelect, SearchField, type Choice } from '../ui/list-fields';

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
    DataTable,
    ListState,
    TableColumn,
    TableEmpty,
    SearchField,
    FilterSelect,
    MatButtonModule,
    MatIconModule,
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
  protected readonly kinds: Choice[] = [
    { value: '', label: 'All kinds' },
    ...choicesOf(PART_KINDS, (kind) => KIND_LABELS[kind]),
  ];
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
  protected readonly familyChoices = computed(() => [
    { value: '', label: 'All families' },
    ...this.choices.families().map((f) => ({ value: f.id, label: `${f.code} — ${f.name}` })),
  ]);
  protected readonly stepChoices = computed(() => [
    { value: '', label: 'All steps' },
    ...this.choices.steps().map((s) => ({ value: s.id, label: s.label })),
  ]);

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
