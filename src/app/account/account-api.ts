import { HttpClient, HttpContext } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { map, Observable, tap } from 'rxjs';

import type { LengthUnit, SessionUser } from '../../../shared/session-types';
import { HANDLES_OWN_401 } from '../core/http-context';
import { Session } from '../core/session';

/** The signed-in person's own settings. */
@Injectable({ providedIn: 'root' })
export class AccountApi {
  private readonly http = inject(HttpClient);
  private readonly session = inject(Session);

  /** 204 on success; 401 means the current password was wrong, which the form explains. */
  changePassword(currentPassword: string, newPassword: string): Observable<void> {
    return this.http.post<void>(
      '/api/account/password',
      { currentPassword, newPassword },
      { context: new HttpContext().set(HANDLES_OWN_401, true) },
    );
  }

  /** Saves the display unit and puts the answer into the session, so every length on screen follows. */
  setUnit(unit: LengthUnit): Observable<SessionUser> {
    return this.http.patch<{ user: SessionUser }>('/api/account', { unit }).pipe(
      map((response) => response.user),
      tap((user) => this.session.updateUser(user)),
    );
  }
}
