import {
  ChangeDetectionStrategy,
  Component,
  computed,
  inject,
  linkedSignal,
  signal,
} from '@angular/core';
import { toObservable, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatPaginatorModule, PageEvent } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectChange, MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import { catchError, map, of, switchMap, tap } from 'rxjs';

import { ROLES, type Role } from '../../../shared/session-types';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { ROLE_LABELS } from '../core/role-labels';
import { Session } from '../core/session';
import { PasswordResetDialog } from './password-reset-dialog';
import { UserAddDialog } from './user-add-dialog';
import {
  UsersApi,
  type UserListQuery,
  type UserPage,
  type UserRow,
  type UserSortField,
} from './users-api';
import { ShopDatePipe } from '../core/shop-date-pipe';

type Loaded = { ok: true; page: UserPage } | { ok: false; message: string };

const SORTABLE: UserSortField[] = ['name', 'email', 'role', 'createdAt'];

/** The owner's list of everyone who may sign in, with what each may do. */
@Component({
  selector: 'app-user-list',
  imports: [
    MatTooltipModule,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatPaginatorModule,
    MatProgressBarModule,
    MatSelectModule,
    MatSortModule,
    MatTableModule,
  ],
  templateUrl: './user-list.html',
  styleUrl: './user-list.scss',
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class UserList {
  private readonly api = inject(UsersApi);
  private readonly dialog = inject(MatDialog);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);

  protected readonly columns = ['name', 'email', 'role', 'active', 'createdAt', 'actions'];
  protected readonly roles = ROLES;
  protected readonly roleLabels = ROLE_LABELS;
  protected readonly pageSizes = [25, 50, 100];

  protected readonly sort = signal<Sort>({ active: 'name', direction: 'asc' });
  protected readonly pageIndex = signal(0);
  protected readonly pageSize = signal(25);
  private readonly reloads = signal(0);

  /** Sort, page and reloads feed one request at a time; a newer one cancels an older one. */
  private readonly query = computed<UserListQuery & { reload: number }>(() => {
    const sort = this.sort();
    const field = SORTABLE.find((name) => name === sort.active) ?? 'name';
    return {
      sort: field,
      dir: sort.direction === 'desc' ? 'desc' : 'asc',
      page: this.pageIndex() + 1,
      pageSize: this.pageSize(),
      reload: this.reloads(),
    };
  });

  protected readonly loading = signal(true);
  private readonly loaded = toSignal(
    toObservable(this.query).pipe(
      tap(() => this.loading.set(true)),
      switchMap(({ reload: _reload, ...query }) =>
        this.api.list(query).pipe(
          map((page): Loaded => ({ ok: true, page })),
          catchError((error: unknown) =>
            of<Loaded>({ ok: false, message: apiErrorMessage(error) }),
          ),
        ),
      ),
      tap(() => this.loading.set(false)),
    ),
  );

  /** The rows on screen; a saved change replaces its row here without reloading the page. */
  protected readonly rows = linkedSignal(() => {
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
  protected readonly myId = computed(() => this.session.user()?.id ?? '');

  protected onSort(sort: Sort): void {
    this.sort.set(sort);
    this.pageIndex.set(0);
  }

  protected onPage(event: PageEvent): void {
    this.pageSize.set(event.pageSize);
    this.pageIndex.set(event.pageIndex);
  }

  protected reload(): void {
    this.reloads.update((count) => count + 1);
  }

  protected addUser(): void {
    this.dialog
      .open<UserAddDialog, void, UserRow>(UserAddDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((user) => {
        if (user) {
          this.notifier.success(`${user.name} can now sign in as ${ROLE_LABELS[user.role]}.`);
          this.reload();
        }
      });
  }

  protected changeRole(row: UserRow, change: MatSelectChange<Role>): void {
    const role = change.value;
    this.api.update(row.id, { role }).subscribe({
      next: (user) => {
        this.replace(user);
        this.notifier.success(`${user.name} is now ${ROLE_LABELS[user.role]}.`);
      },
      error: (error: unknown) => {
        change.source.value = row.role; // the select shows the role that is still in force
        this.notifier.error(apiErrorMessage(error));
      },
    });
  }

  protected setActive(row: UserRow, active: boolean): void {
    this.api.update(row.id, { active }).subscribe({
      next: (user) => {
        this.replace(user);
        this.notifier.success(
          active ? `${user.name} can sign in again.` : `${user.name} can no longer sign in.`,
        );
      },
      error: (error: unknown) => this.notifier.error(apiErrorMessage(error)),
    });
  }

  protected resetPassword(row: UserRow): void {
    this.dialog
      .open<PasswordResetDialog, UserRow, UserRow>(PasswordResetDialog, { data: row })
      .afterClosed()
      .subscribe((user) => {
        if (user) {
          this.notifier.success(`New password set for ${user.name}.`);
        }
      });
  }

  private replace(user: UserRow): void {
    this.rows.update((rows) => rows.map((row) => (row.id === user.id ? user : row)));
  }
}
