import { HttpClient } from '@angular/common/http';
import { inject, Injectable } from '@angular/core';
import { Observable } from 'rxjs';

import type { AlertJson, AlertsPageJson, AlertState } from '../../../shared/api/alerts';
import type { MailboxPageJson } from '../../../shared/api/mail';
import { queryParams } from '../core/query-params';

export type MailMode = 'instant' | 'digest' | 'none';

/** The alerts feature's one door to the server: stock alerts and the local mailbox. */
@Injectable({ providedIn: 'root' })
export class AlertsApi {
  private readonly http = inject(HttpClient);

  alerts(query: { state: AlertState; page: number; pageSize: number }): Observable<AlertsPageJson> {
    return this.http.get<AlertsPageJson>('/api/alerts', { params: queryParams(query) });
  }

  acknowledge(alertId: string): Observable<AlertJson> {
    return this.http.post<AlertJson>(`/api/alerts/${encodeURIComponent(alertId)}/acknowledge`, {});
  }

  /** How alert e-mail reaches the signed-in person. */
  mailMode(): Observable<{ mailMode: MailMode; alertsByMail: boolean }> {
    return this.http.get<{ mailMode: MailMode; alertsByMail: boolean }>('/api/alerts/mail-mode');
  }

  /** The person's own choice, kept with their account. */
  setMailMode(mailMode: MailMode): Observable<unknown> {
    return this.http.patch('/api/account', { mailMode });
  }

  mailbox(query: { q?: string; page: number; pageSize: number }): Observable<MailboxPageJson> {
    return this.http.get<MailboxPageJson>('/api/mailbox', { params: queryParams(query) });
  }
}
