import { computed, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import {
  catchError,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  switchMap,
  tap,
  type Observable,
} from 'rxjs';

import { apiErrorMessage } from '../core/api-error';
import type { Page } from '../../../shared/api/common';

/** What a server-side list is asked for: ?q&sort&dir&page&pageSize. */
export interface PageRequest<S extends string> {
  q?: string;
  sort: S;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

type Loaded<Row> = { ok: true; page: Page<Row> } | { ok: false; message: string };

/**
 * The state of one server-paged table: search text (debounced), MatSort and MatPaginator merged into
 * one request stream, with loading, error and reload. Create it in a field initializer (it needs the
 * component's injection context).
 */
export class PagedList<Row, S extends string> {
  readonly text = signal('');
  readonly sort: ReturnType<typeof signal<Sort>>;
  readonly pageIndex = signal(0);
  readonly pageSize = signal(25);
  readonly loading = signal(true);
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );

  private readonly request = computed(() => {
    const sort = this.sort();
    const field = this.sortable.find((name) => name === sort.active) ?? this.defaultSort;
    const request: PageRequest<S> = {
      q: this.q().trim() || undefined,
      sort: field,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
    };
    return { request, reload: this.reloads() };
  });

  private readonly loaded: () => Loaded<Row> | undefined;

  readonly rows = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.items : [];
  });
  readonly total = computed(() => {
    const loaded = this.loaded();
    return loaded?.ok ? loaded.page.total : 0;
  });
  readonly loadError = computed(() => {
    const loaded = this.loaded();
    return loaded && !loaded.ok ? loaded.message : '';
  });

  constructor(
    private readonly sortable: readonly S[],
    private readonly defaultSort: S,
    load: (request: PageRequest<S>) => Observable<Page<Row>>,
  ) {
    this.sort = signal<Sort>({ active: defaultSort, direction: 'asc' });
    this.loaded = toSignal(
      toObservable(this.request).pipe(
        tap(() => this.loading.set(true)),
        switchMap(({ request }) =>
          load(request).pipe(
            map((page): Loaded<Row> => ({ ok: true, page })),
            catchError((error: unknown) =>
              of<Loaded<Row>>({ ok: false, message: apiErrorMessage(error) }),
            ),
          ),
        ),
        tap(() => this.loading.set(false)),
      ),
    );
  }

  onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  onSort(sort: Sort): void {
    this.sort.set(sort);
    this.pageIndex.set(0);
  }

  onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  reload(): void {
    this.reloads.update((n) => n + 1);
  }
}
