import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { RouterLink } from '@angular/router';

import type { DraftsJson, ReorderLineJson, RuleSource } from '../../../shared/api/purchasing';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { PurchasingApi } from './purchasing-api';
import { PagedList } from '../ui/paged-list';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableActions, TableColumn, TableEmpty } from '../ui/table-column';
import { SearchField } from '../ui/list-fields';
import { PartBuyingLinks } from './part-buying-links';

const SOURCE_WORDS: Record<RuleSource, string> = {
  part: 'its own rule',
  step: "the step's default",
  family: "the family's default",
  none: 'no rule',
};

/**
 * Parts at or below their reorder point (free + on order), with what to order to reach the
 * order-up-to level; one button turns them into drafts, one per best supplier.
 */
@Component({
  selector: 'app-reorder-list',
  imports: [
    PartBuyingLinks,
    DataTable,
    ListState,
    TableActions,
    TableColumn,
    TableEmpty,
    SearchField,
    MatButtonModule,
    MatIconModule,
    MatSlideToggleModule,
    RouterLink,
  ],
  templateUrl: './reorder-list.html',
  styleUrl: './reorder-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ReorderList {
  private readonly api = inject(PurchasingApi);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['part', 'free', 'rule', 'suggested', 'actions'];
  protected readonly list = new PagedList<ReorderLineJson, never, { low: boolean }>({
    pageSize: 50,
    filters: { low: true },
    load: (request) => this.api.reorder(request),
  });

  protected readonly drafting = signal(false);
  protected readonly drafts = signal<DraftsJson | null>(null);
  protected readonly lowRows = computed(() => this.list.rows().filter((r) => r.low));

  protected sourceWord(source: RuleSource): string {
    return SOURCE_WORDS[source];
  }

  /** Drafts for the low parts on this page, each at its best supplier. */
  protected draft(): void {
    const partIds = this.lowRows().map((r) => r.partId);
    if (partIds.length === 0) return;
    this.drafting.set(true);
    this.api.draftFromSuggestions({ partIds }).subscribe({
      next: (result) => {
        this.drafting.set(false);
        this.drafts.set(result);
        const n = result.orders.length;
        void this.notifier.success(
          n === 0
            ? 'No new drafts: these parts are already on drafts or nobody offers them.'
            : `${n} draft order${n === 1 ? '' : 's'} made.`,
        );
        this.list.reload();
      },
      error: (error: unknown) => {
        this.drafting.set(false);
        void this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
