import { HttpClient, HttpParams } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable } from 'rxjs';

import type { Role } from '../../../shared/session-types';

/** A person who may sign in to the shop, as GET /api/users lists them. */
export interface UserRow {
  id: string;
  email: string;
  name: string;
  role: Role;
  active: boolean;
  /** ISO 8601 timestamp. */
  createdAt: string;
}

export interface UserPage {
  items: UserRow[];
  total: number;
}

export type UserSortField = 'name' | 'email' | 'role' | 'createdAt';

export interface UserListQuery {
  sort: UserSortField;
  dir: 'asc' | 'desc';
  /** 1-based. */
  page: number;
  pageSize: number;
}

export interface NewUser {
  name: string;
  email: string;
  role: Role;
  /** The first password; the person changes it under My account. */
  password: string;
}

export type UserChanges = Partial<Pick<UserRow, 'name' | 'role' | 'active'>> & {
  password?: string;
};

/** The users admin's one door to the server. */
@Injectable({ providedIn: 'root' })
export class UsersApi {
  private readonly http = inject(HttpClient);

  list(query: UserListQuery): Observable<UserPage> {
    const params = new HttpParams({
      fromObject: {
        sort: query.sort,
        dir: query.dir,
        page: query.page,
        pageSize: query.pageSize,
      },
    });
    return this.http.get<UserPage>('/api/users', { params });
  }

  create(user: NewUser): Observable<UserRow> {
    return this.http
      .post<{ user: UserRow }>('/api/users', user)
      .pipe(map((response) => response.user));
  }

  update(id: string, changes: UserChanges): Observable<UserRow> {
    return this.http
      .patch<{ user: UserRow }>(`/api/users/${encodeURIComponent(id)}`, changes)
      .pipe(map((response) => response.user));
  }
}
