import { ChangeDetectionStrategy, Component, inject, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { RouterLink } from '@angular/router';

import type { AlertJson, AlertsPageJson, AlertState } from '../../../shared/api/alerts';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { DataTable } from '../ui/data-table';
import { TableColumn, TableEmpty } from '../ui/table-column';
import { AlertsApi, type MailMode } from './alerts-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { ListState } from '../ui/list-state';
import { PartBuyingLinks } from '../purchasing/part-buying-links';

/** Parts that fell to their reorder point, newest first; the buyer marks each as seen. */
@Component({
  selector: 'app-alert-list',
  imports: [
    PartBuyingLinks,
    ListState,
    ShopDatePipe,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    DataTable,
    TableColumn,
    TableEmpty,
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
  protected readonly busy = signal<string | null>(null);
  protected readonly mailMode = signal<MailMode | null>(null);
  protected readonly alertsByMail = signal(false);

  protected readonly list = new PagedList<AlertJson, never, { state: AlertState }, AlertsPageJson>({
    filters: { state: 'open' },
    load: (request) => this.api.alerts(request),
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

  protected acknowledge(alert: AlertJson): void {
    this.busy.set(alert.id);
    this.api.acknowledge(alert.id).subscribe({
      next: () => {
        this.busy.set(null);
        void this.notifier.success(`Marked ${alert.sku} as seen.`);
        this.list.reload();
      },
      error: (error: unknown) => {
        this.busy.set(null);
        void this.notifier.error(apiErrorMessage(error));
        this.list.reload();
      },
    });
  }
}
