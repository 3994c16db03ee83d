import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';

import type { DraftsJson, ReorderLineJson, RuleSource } from '../../../shared/api/purchasing';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { PurchasingApi } from './purchasing-api';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<ReorderLineJson> } | { ok: false; message: string };

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
    MatTooltipModule,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSlideToggleModule,
    MatTableModule,
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
  protected readonly pageSizes = [25, 50, 100];
  protected readonly text = signal('');
  protected readonly lowOnly = signal(true);
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(50);
  protected readonly drafting = signal(false);
  protected readonly drafts = signal<DraftsJson | null>(null);
  private readonly reloads = signal(0);

  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    { initialValue: '' },
  );
  private readonly query = computed(() => ({
    q: this.q().trim() || undefined,
    low: this.lowOnly(),
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.reorder(query).pipe(
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
  protected readonly lowRows = computed(() => this.rows().filter((r) => r.low));

  protected sourceWord(source: RuleSource): string {
    return SOURCE_WORDS[source];
  }

  protected onSearch(value: string): void {
    this.text.set(value);
    this.pageIndex.set(0);
  }

  protected onLowOnly(value: boolean): void {
    this.lowOnly.set(value);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
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
        this.reload();
      },
      error: (error: unknown) => {
        this.drafting.set(false);
        void this.notifier.error(apiErrorMessage(error));
      },
    });
  }
}
