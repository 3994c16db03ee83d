import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { catchError, debounce, distinctUntilChanged, map, of, switchMap, tap, timer } from 'rxjs';

import {
  PART_KINDS,
  type FamilyJson,
  type PartJson,
  type PartKind,
  type StepSeriesJson,
} from '../../../shared/api/catalog';
import { apiErrorMessage } from '../core/api-error';
import { Session } from '../core/session';
import { CatalogApi, type PartQuery } from './catalog-api';
import { looksScanned } from '../ui/scan';
import { KIND_LABELS } from './part-words';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<PartJson>; q: string } | { ok: false; message: string };

/**
 * Every part, paged and sorted on the server. The search takes a part number, words of the
 * description, a GTIN or a piston label; a barcode scanner types digits and Enter, and when that
 * finds exactly one part the page opens it.
 */
@Component({
  selector: 'app-part-list',
  imports: [
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
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

  protected readonly text = linkedSignal(() => this.q() ?? '');
  protected readonly family = linkedSignal(() => this.familyId() ?? '');
  protected readonly step = signal('');
  protected readonly kind = signal<PartKind | ''>('');
  protected readonly sort = signal<Sort>({ active: 'sku', direction: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);
  /** Set when Enter is pressed in the search: search now, and open a single match. */
  private readonly enterPressed = signal(0);

  protected readonly families = toSignal(
    this.api.families({ page: 1, pageSize: 500 }).pipe(
      map((page) => page.items),
      catchError(() => of<FamilyJson[]>([])),
    ),
    { initialValue: [] as FamilyJson[] },
  );
  private readonly series = toSignal(
    this.api.stepSeries().pipe(
      map((page) => page.items),
      catchError(() => of<StepSeriesJson[]>([])),
    ),
    { initialValue: [] as StepSeriesJson[] },
  );
  protected readonly steps = computed(() => {
    const family = this.families().find((f) => f.id === this.family());
    return family ? (this.series().find((s) => s.id === family.stepSeriesId)?.steps ?? []) : [];
  });

  private readonly searchText = toSignal(
    toObservable(computed(() => ({ text: this.text(), enter: this.enterPressed() }))).pipe(
      debounce((v) => (v.enter > 0 && looksScanned(v.text) ? timer(0) : timer(250))),
      map((v) => v.text.trim()),
      distinctUntilChanged(),
    ),
    { initialValue: '' },
  );

  private readonly query = computed(() => {
    const sort = this.sort();
    return {
      q: this.searchText() || undefined,
      familyId: this.family() || undefined,
      stepId: this.step() || undefined,
      kind: this.kind() || undefined,
      sort: sort.active,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    } satisfies PartQuery & { reload: number };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.parts(query).pipe(
          map((page): Loaded => ({ ok: true, page, q: query.q ?? '' })),
          catchError((error: unknown) =>
            of<Loaded>({ ok: false, message: apiErrorMessage(error) }),
          ),
        ),
      ),
      tap(() => this.loading.set(false)),
    ),
  );
  protected readonly rows = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.items : [];
  });
  protected readonly total = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.total : 0;
  });
  protected readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded && !loaded.ok ? loaded.message : '';
  });

  private scanned = '';

  constructor() {
    // A scan that finds exactly one part opens it: the person's hands stay on the scanner.
    effect(() => {
      const loaded = this.loaded();
      if (!loaded?.ok || !this.scanned || loaded.q !== this.scanned) return;
      this.scanned = '';
      if (loaded.page.total === 1) {
        void this.router.navigate(['/catalog/parts', loaded.page.items[0].id]);
      }
    });
  }

  protected kindText(part: PartJson): string {
    return KIND_LABELS[part.kind];
  }

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onEnter(): void {
    const text = this.text().trim();
    if (looksScanned(text)) this.scanned = text;
    this.enterPressed.update((n) => n + 1);
    // Enter on the same text again: the list is already showing it; open the single match now.
    const loaded = this.loaded();
    if (this.scanned && loaded?.ok && loaded.q === text && loaded.page.total === 1) {
      this.scanned = '';
      void this.router.navigate(['/catalog/parts', loaded.page.items[0].id]);
    }
  }

  protected onFamily(id: string): void {
    this.family.set(id);
    this.step.set('');
    this.pageIndex.set(0);
  }

  protected onStep(id: string): void {
    this.step.set(id);
    this.pageIndex.set(0);
  }

  protected onKind(kind: PartKind | ''): void {
    this.kind.set(kind);
    this.pageIndex.set(0);
  }

  protected onSort(sort: Sort): void {
    this.sort.set(sort);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected open(part: PartJson): void {
    void this.router.navigate(['/catalog/parts', part.id]);
  }
}
