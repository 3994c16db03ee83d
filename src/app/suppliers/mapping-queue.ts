import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { MatAutocompleteModule } from '@angular/material/autocomplete';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { RouterLink } from '@angular/router';

import { formatMoney } from '../../../shared/money';
import type { SuggestionJson, UnmappedItemJson } from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { Notifier } from '../core/notifier';
import { Session } from '../core/session';
import { SuppliersApi } from './suppliers-api';
import { PagedList } from '../ui/paged-list';
import { debounced, loadEach } from '../ui/load';
import { ListState } from '../ui/list-state';
import { SearchField } from '../ui/list-fields';

/**
 * Supplier items no catalog part is linked to yet. The buyer links each to our part, helped by
 * suggestions from the size, the family named in the description, and the SKU or GTIN.
 */
@Component({
  selector: 'app-mapping-queue',
  imports: [
    SearchField,
    ListState,
    LengthPipe,
    MatAutocompleteModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
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
  protected readonly list = new PagedList<UnmappedItemJson, never, { supplierId: string }>({
    text: () => this.q() ?? '',
    filters: () => ({ supplierId: this.supplierId() ?? '' }),
    load: (request) => this.api.unmapped(request),
  });

  protected readonly busyItem = signal<string | null>(null);
  /** The item whose "another part" search is open. */
  protected readonly searching = signal<string | null>(null);
  protected readonly partText = signal('');

  /** Parts matching what is typed in the open "another part" search, from two characters on. */
  private readonly partQuery = debounced(this.partText, 200);
  private readonly partsFound = loadEach(
    () => (this.searching() && this.partQuery().length >= 2 ? this.partQuery() : null),
    (text) => this.api.findParts(text),
  );
  protected readonly partOptions = computed(() => this.partsFound.value()?.items ?? []);

  protected money(price: string, currency: string): string {
    return formatMoney(price, currency);
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
        this.list.reload();
      },
      error: (error: unknown) => {
        this.busyItem.set(null);
        void this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
