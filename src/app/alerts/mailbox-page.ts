import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { HttpErrorResponse } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatIconModule } from '@angular/material/icon';
import { MatPaginatorModule } from '@angular/material/paginator';
import { catchError, map, of, throwError } from 'rxjs';

import type { MailboxPageJson } from '../../../shared/api/mail';
import { AlertsApi } from './alerts-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList, type Filters } from '../ui/paged-list';
import { ListState } from '../ui/list-state';
import { SearchField } from '../ui/list-fields';

/** A page of the mailbox, or none at all when mail goes to the shop's own server. */
type Mailbox = MailboxPageJson & { realSmtp: boolean };

/** Every e-mail the local SMTP server received (demo and trial use), newest first. */
@Component({
  selector: 'app-mailbox-page',
  imports: [
    SearchField,
    ListState,
    ShopDatePipe,
    MatButtonModule,
    MatExpansionModule,
    MatIconModule,
    MatPaginatorModule,
  ],
  templateUrl: './mailbox-page.html',
  styleUrl: './mailbox-page.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class MailboxPage {
  private readonly api = inject(AlertsApi);

  protected readonly pageSizes = [25, 50, 100];

  protected readonly list = new PagedList<
    MailboxPageJson['items'][number],
    never,
    Filters,
    Mailbox
  >({
    load: (request) =>
      this.api.mailbox(request).pipe(
        map((page): Mailbox => ({ ...page, realSmtp: false })),
        // No local mailbox (404): mail goes to the shop's own server, which is no failure.
        catchError((error: unknown) =>
          error instanceof HttpErrorResponse && error.status === 404
            ? of<Mailbox>({ items: [], total: 0, realSmtp: true })
            : throwError(() => error),
        ),
      ),
  });
}
