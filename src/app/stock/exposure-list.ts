import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { RouterLink } from '@angular/router';
import { catchError, debounceTime, distinctUntilChanged, map, of, switchMap, tap } from 'rxjs';

import type { ExposureItemJson } from '../../../shared/api/catalog';
import { emptyStepWords } from '../../../shared/part-needs';
import { apiErrorMessage } from '../core/api-error';
import { LengthPipe } from '../core/length-pipe';
import { StockApi } from './stock-api';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<ExposureItemJson> } | { ok: false; message: string };

/**
 * Shop-wide: every step of every family with no free piston or no free ring set (the server's one
 * rule), the most asked-for first, and which part is missing. A worn cylinder that needs one waits.
 */
@Component({
  selector: 'app-exposure-list',
  imports: [
    LengthPipe,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './exposure-list.html',
  styleUrl: './exposure-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ExposureList {
  private readonly api = inject(StockApi);

  protected readonly columns = ['family', 'step', 'missing', 'bore', 'pistons', 'rings', 'issued'];
  /** "no free piston", "no free ring set" or both, in the words every page uses. */
  protected readonly missingWords = emptyStepWords;
  protected readonly text = signal('');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(50);
  private readonly reloads = signal(0);
  private readonly q = toSignal(
    toObservable(this.text).pipe(debounceTime(250), distinctUntilChanged()),
    {
      initialValue: '',
    },
  );
  private readonly query = computed(() => ({
    q: this.q().trim() || undefined,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.exposure(query).pipe(
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
}
