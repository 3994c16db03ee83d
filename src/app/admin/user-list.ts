import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatIconModule } from '@angular/material/icon';
import { MatMenuModule } from '@angular/material/menu';
import { MatSelectChange, MatSelectModule } from '@angular/material/select';

import { ROLES, type Role } from '../../../shared/session-types';
import { apiErrorMessage } from '../core/api-error';
import { Notifier } from '../core/notifier';
import { ROLE_LABELS } from '../core/role-labels';
import { Session } from '../core/session';
import { PasswordResetDialog } from './password-reset-dialog';
import { UserAddDialog } from './user-add-dialog';
import { UsersApi, type UserRow, type UserSortField } from './users-api';
import { ShopDatePipe } from '../core/shop-date-pipe';
import { PagedList } from '../ui/paged-list';
import { RowMenu } from '../ui/row-menu';
import { DataTable } from '../ui/data-table';
import { ListState } from '../ui/list-state';
import { TableActions, TableColumn, TableEmpty } from '../ui/table-column';

const SORTABLE: UserSortField[] = ['name', 'email', 'role', 'createdAt'];

/** The owner's list of everyone who may sign in, with what each may do. */
@Component({
  selector: 'app-user-list',
  imports: [
    DataTable,
    ListState,
    TableActions,
    TableColumn,
    TableEmpty,
    RowMenu,
    ShopDatePipe,
    MatButtonModule,
    MatIconModule,
    MatMenuModule,
    MatSelectModule,
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
  /** Someone whose sign-in is switched off keeps a row, shaded. */
  protected readonly rowLook = (user: UserRow): string => (user.active ? '' : 'shaded');

  /** A saved change replaces its row (list.rows) without reloading the page. */
  protected readonly list = new PagedList<UserRow, UserSortField>({
    sortable: SORTABLE,
    load: (request) => this.api.list(request),
  });
  protected readonly myId = computed(() => this.session.user()?.id ?? '');

  protected addUser(): void {
    this.dialog
      .open<UserAddDialog, void, UserRow>(UserAddDialog, { autoFocus: 'first-tabbable' })
      .afterClosed()
      .subscribe((user) => {
        if (user) {
          this.notifier.success(`${user.name} can now sign in as ${ROLE_LABELS[user.role]}.`);
          this.list.reload();
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
    this.list.rows.update((rows) => rows.map((row) => (row.id === user.id ? user : row)));
  }
}
