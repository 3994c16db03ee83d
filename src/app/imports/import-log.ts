import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { Router, RouterLink } from '@angular/router';
import { catchError, map, of, switchMap, tap } from 'rxjs';

import type { ImportLogEntryJson, ImportStatus } from '../../../shared/api/suppliers';
import { apiErrorMessage } from '../core/api-error';
import { ImportsApi } from './imports-api';
import { STATUS_WORDS } from './import-words';
import { ShopDatePipe } from '../core/shop-date-pipe';
import type { Page } from '../../../shared/api/common';

type Loaded = { ok: true; page: Page<ImportLogEntryJson> } | { ok: false; message: string };

/** Every price list brought in: who, when, which file, for which supplier, and what it changed. */
@Component({
  selector: 'app-import-log',
  imports: [
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './import-log.html',
  styleUrl: './import-log.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class ImportLog {
  private readonly api = inject(ImportsApi);
  private readonly router = inject(Router);

  /** Only this supplier's lists (from ?supplierId=). */
  readonly supplierId = input<string>();

  protected readonly columns = ['uploadedAt', 'supplier', 'file', 'status', 'counts', 'who'];
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);

  private readonly query = computed(() => ({
    supplierId: this.supplierId() || undefined,
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.log(query).pipe(
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

  protected statusText(status: ImportStatus): string {
    return STATUS_WORDS[status];
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected open(entry: ImportLogEntryJson): void {
    void this.router.navigate(['/imports', entry.importId]);
  }
}
