import { computed, linkedSignal, signal, type Signal, type WritableSignal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import type { PageEvent } from '@angular/material/paginator';
import type { Sort } from '@angular/material/sort';
import { debounce, distinctUntilChanged, map, timer, type Observable } from 'rxjs';

import type { Page } from '../../../shared/api/common';
import { loadEach, type Loaded } from './load';
import { looksScanned } from './scan';

/** A list's own narrowing (state, part, bin…): a select or a toggle per field. */
export type Filters = Record<string, string | number | boolean | undefined>;

/** A filter that may be '' (or undefined) is optional in the request: at '' it is not sent. */
type Emptyable<F> = {
  [K in keyof F]: '' extends F[K] ? K : undefined extends F[K] ? K : never;
}[keyof F];
/** Every list here reads "no value" as "all", so an empty filter is left out of the request. */
type Sent<F> = { [K in Emptyable<F>]?: Exclude<F[K], ''> } & {
  [K in Exclude<keyof F, Emptyable<F>>]: F[K];
};

/** What a server-side list is asked for: ?q&sort&dir&page&pageSize plus its own filters. */
export type ListRequest<S extends string, F> = Sent<F> & {
  q?: string;
  /** 1-based, as the API counts. */
  page: number;
  pageSize: number;
} & ([S] extends [never] ? unknown : { sort: S; dir: 'asc' | 'desc' });

export interface PagedListOptions<S extends string, F extends Filters, P> {
  /** The fields the server sorts by; leave out for a list in the server's own fixed order. */
  sortable?: readonly S[];
  /** The sort before the person picks one (default: the first sortable field, ascending). */
  sort?: S;
  dir?: 'asc' | 'desc';
  pageSize?: number;
  /** The first filters; a function when they come from the address (route inputs). */
  filters?: F | (() => F);
  /** The first search text, e.g. ?q= from the address. */
  text?: () => string;
  load: (request: ListRequest<S, F>) => Observable<P>;
}

/**
 * The state of one server-paged table: search text (debounced), filters, MatSort and MatPaginator
 * merged into one request at a time (a newer one cancels an older one), with the loader's value,
 * loading, error and reload. Changing the search, a filter or the sort goes back to the first page:
 * page 3 of the old answer means nothing in the new one. Create it in a field initializer (it needs
 * the component's injection context).
 */
export class PagedList<
  Row,
  S extends string = never,
  F extends Filters = Filters,
  P extends Page<Row> = Page<Row>,
> {
  readonly text: WritableSignal<string>;
  readonly filters: WritableSignal<F>;
  readonly sort: WritableSignal<Sort>;
  readonly pageSize: WritableSignal<number>;
  readonly pageIndex: WritableSignal<number>;

  /** Counts Enter presses: a scanner types a code and Enter, and waits for no debounce. */
  private readonly enter = signal(0);
  private readonly q: Signal<string>;
  private readonly loaded: Loaded<P>;

  /** The whole last answer (some lists carry more than rows: facets, names of referenced records). */
  readonly value: Signal<P | null>;
  readonly loading: Signal<boolean>;
  readonly error: Signal<string>;
  /** The rows on screen; a saved change may replace its row here without reloading the page. */
  readonly rows: WritableSignal<Row[]>;
  readonly total = computed(() => this.value()?.total ?? 0);

  constructor(options: PagedListOptions<S, F, P>) {
    const sortable = options.sortable ?? [];
    const firstSort = options.sort ?? sortable[0];
    const text = options.text;
    this.text = text ? linkedSignal(() => text()) : signal('');
    const filters = options.filters;
    this.filters =
      typeof filters === 'function' ? linkedSignal(filters) : signal(filters ?? ({} as F));
    this.sort = signal<Sort>({ active: firstSort ?? '', direction: options.dir ?? 'asc' });
    this.pageSize = signal(options.pageSize ?? 25);
    this.q = toSignal(
      toObservable(computed(() => ({ text: this.text(), enter: this.enter() }))).pipe(
        debounce((v) => (v.enter && looksScanned(v.text) ? timer(0) : timer(250))),
        map((v) => v.text.trim()),
        distinctUntilChanged(),
      ),
      { initialValue: '' },
    );
    this.pageIndex = linkedSignal({
      source: () => [this.q(), this.filters(), this.sort()],
      computation: () => 0,
    });
    const request = computed(() => {
      const sent: Record<string, unknown> = {};
      for (const [key, value] of Object.entries(this.filters())) {
        if (value !== '' && value !== undefined) sent[key] = value;
      }
      const q = this.q();
      if (q) sent['q'] = q;
      if (firstSort !== undefined) {
        const sort = this.sort();
        sent['sort'] = sortable.find((field) => field === sort.active) ?? firstSort;
        sent['dir'] = sort.direction === '' ? (options.dir ?? 'asc') : sort.direction;
      }
      sent['page'] = this.pageIndex() + 1;
      sent['pageSize'] = this.pageSize();
      return sent as ListRequest<S, F>;
    });
    this.loaded = loadEach(request, options.load);
    this.value = this.loaded.value;
    this.loading = this.loaded.loading;
    this.error = this.loaded.error;
    this.rows = linkedSignal(() => this.value()?.items ?? []);
  }

  /** Narrows by one or more filters (and so goes back to the first page). */
  setFilters(changes: Partial<F>): void {
    this.filters.update((filters) => ({ ...filters, ...changes }));
  }

  onSearch(value: string): void {
    this.text.set(value);
  }

  /** Enter in the search: a scanned code is looked up at once instead of after the pause. */
  onEnter(): void {
    this.enter.update((n) => n + 1);
  }

  onSort(sort: Sort): void {
    this.sort.set(sort);
  }

  onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  reload(): void {
    this.loaded.reload();
  }
}
