import { ChangeDetectionStrategy, Component, computed, inject, signal } from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { catchError, map, of, switchMap, tap } from 'rxjs';

import type { AlertJson, AlertsPageJson, AlertState } from '../../../shared/api/alerts';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { AlertsApi, type MailMode } from './alerts-api';
import { ShopDatePipe } from '../core/shop-date-pipe';

type Loaded = { ok: true; page: AlertsPageJson } | { ok: false; message: string };

/** Parts that fell to their reorder point, newest first; the buyer marks each as seen. */
@Component({
  selector: 'app-alert-list',
  imports: [
    MatTooltipModule,
    ShopDatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatTableModule,
    RouterLink,
  ],
  templateUrl: './alert-list.html',
  styleUrl: './alert-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class AlertList {
  private readonly api = inject(AlertsApi);
  private readonly notifier = inject(Notifier);

  protected readonly columns = ['raisedAt', 'part', 'point', 'now', 'actions'];
  protected readonly pageSizes = [25, 50, 100];
  protected readonly state = signal<AlertState>('open');
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  protected readonly busy = signal<string | null>(null);
  protected readonly mailMode = signal<MailMode | null>(null);
  protected readonly alertsByMail = signal(false);
  private readonly reloads = signal(0);

  private readonly query = computed(() => ({
    state: this.state(),
    page: this.pageIndex() + 1,
    pageSize: this.pageSize(),
    reload: this.reloads(),
  }));

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.alerts(query).pipe(
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

  constructor() {
    this.api.mailMode().subscribe({
      next: (m) => {
        this.mailMode.set(m.mailMode);
        this.alertsByMail.set(m.alertsByMail);
      },
      error: () => this.alertsByMail.set(false),
    });
  }

  protected onMailMode(mode: MailMode): void {
    const before = this.mailMode();
    this.mailMode.set(mode);
    this.api.setMailMode(mode).subscribe({
      next: () =>
        void this.notifier.success(
          mode === 'instant'
            ? 'You will get each alert by e-mail as it happens.'
            : mode === 'digest'
              ? 'You will get one summary of the alerts each morning.'
              : 'You will get no alert e-mail; they stay on this page.',
        ),
      error: (error: unknown) => {
        this.mailMode.set(before);
        void this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  protected onState(state: AlertState): void {
    this.state.set(state);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((n) => n + 1);
  }

  protected acknowledge(alert: AlertJson): void {
    this.busy.set(alert.id);
    this.api.acknowledge(alert.id).subscribe({
      next: () => {
        this.busy.set(null);
        void this.notifier.success(`Marked ${alert.sku} as seen.`);
        this.reload();
      },
      error: (error: unknown) => {
        this.busy.set(null);
        void this.notifier.error(apiErrorMessage(error));
        this.reload();
      },
    });
  }
}
