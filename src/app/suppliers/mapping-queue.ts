import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  input,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import {
  catchError,
  combineLatest,
  debounceTime,
  distinctUntilChanged,
  map,
  of,
  switchMap,
  tap,
} from 'rxjs';

import type { PartJson } from '../../../shared/api/catalog';
import { formatMoney } from '../../../shared/money';
import type { SuggestionJson, UnmappedItemJson } from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { SuppliersApi } from './suppliers-api';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<UnmappedItemJson> } | { ok: false; message: string };

/**
 * Supplier items no catalog part is linked to yet. The buyer links each to our part, helped by
 * suggestions from the size, the family named in the description, and the SKU or GTIN.
 */
@Component({
  selector: 'app-mapping-queue',
  imports: [
    LengthPipe,
    MatAutocompleteModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    RouterLink,
  ],
  templateUrl: './mapping-queue.html',
  styleUrl: './mapping-queue.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MappingQueue {
  private readonly api = inject(SuppliersApi);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  /** Only this supplier's items (from ?supplierId=). */
  readonly supplierId = input<string>();
  /** A search to start with (from ?q=, e.g. a supplier SKU linked from Sourcing or Reorder). */
  readonly q = input<string>();

  protected readonly canMap = computed(() => this.session.may('editSuppliers'));
  protected readonly text = linkedSignal(() => this.q() ?? '');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);
  protected readonly busyItem = signal<string | null>(null);
  /** The item whose "another part" search is open. */
  protected readonly searching = signal<string | null>(null);
  protected readonly partText = signal('');

  private readonly typed = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );

  private readonly query = computed(() => ({
    supplierId: this.supplierId() || undefined,
    q: this.typed().trim() || undefined,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.unmapped(query).pipe(
          map((page): Loaded => ({ ok: true, page })),
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

  protected readonly partOptions = toSignal(
    combineLatest([toObservable(this.partText), toObservable(this.searching)]).pipe(
      debounceTime(200),
      switchMap(([text, item]) =>
        item && text.trim().length >= 2
          ? this.api.findParts(text.trim()).pipe(
              map((page) => page.items),
              catchError(() => of<PartJson[]>([])),
            )
          : of<PartJson[]>([]),
      ),
    ),
    { initialValue: [] as PartJson[] },
  );

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
  }

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected searchFor(itemId: string | null): void {
    this.partText.set('');
    this.searching.set(itemId);
  }

  protected reasons(s: SuggestionJson): string {
    return s.reasons.join(', ');
  }

  protected map(item: UnmappedItemJson, part: { id: string; sku: string }): void {
    if (this.busyItem()) return;
    this.busyItem.set(item.id);
    this.api.mapItem(item.id, part.id).subscribe({
      next: () => {
        this.busyItem.set(null);
        this.searching.set(null);
        this.notifier.success(`${item.sku} of ${item.supplierName} is now ${part.sku}.`);
        this.reload();
      },
      error: (error: unknown) => {
        this.busyItem.set(null);
        void this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
