import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { catchError, firstValueFrom, map, Observable, of, tap, throwError } from 'rxjs';

import type { SessionResponse, SessionUser } from '../../../shared/session-types';
import { HANDLES_OWN_401 } from './http-context';

/**
 * Who is signed in. The server holds the session (an HttpOnly cookie); this keeps the answer of
 * GET /api/session as signals so the shell, guards and length display follow it.
 */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly http = inject(HttpClient);

  private readonly current = signal<SessionResponse | null>(null);
  private inFlight: Promise<SessionUser | null> | null = null;
  private loaded = false;

  /** The signed-in user, or null when nobody is (or the session has not been asked yet). */
  readonly user = computed(() => this.current()?.user ?? null);
  readonly shopName = computed(() => this.current()?.shop?.name || 'Stepstock');
  /** How the shop writes dates, and the zone its times are shown in (shop settings). */
  readonly locale = computed(() => this.current()?.shop?.locale || 'en-GB');
  readonly timeZone = computed(() => this.current()?.shop?.timeZone || 'UTC');
  /** The shop's home currency: stock is valued in it. */
  readonly currency = computed(() => this.current()?.shop?.currency || 'EUR');
  readonly unit = computed(() => this.user()?.unit ?? 'mm');

  /**
   * Asks the server who is signed in: the user, or null on 401. Other failures (server down)
   * reject, so the caller can say so instead of pretending the person is signed out.
   */
  load(): Promise<SessionUser | null> {
    this.inFlight ??= firstValueFrom(
      this.http.get<SessionResponse>('/api/session', {
        context: new HttpContext().set(HANDLES_OWN_401, true),
      }),
    )
      .then(
        (response) => this.accept(response),
        (error: unknown) => {
          if (error instanceof HttpErrorResponse && error.status === 401) {
            this.clear();
            return null;
          }
          throw error;
        },
      )
      .finally(() => (this.inFlight = null));
    return this.inFlight;
  }

  /** Loads the session once; later calls answer from memory. */
  ensureLoaded(): Promise<SessionUser | null> {
    return this.loaded ? Promise.resolve(this.user()) : this.load();
  }

  signIn(email: string, password: string): Observable<SessionUser> {
    return this.http
      .post<SessionResponse>(
        '/api/session',
        { email, password },
        // A 401 here means a wrong e-mail or password, which the sign-in page explains itself.
        { context: new HttpContext().set(HANDLES_OWN_401, true) },
      )
      .pipe(map((response) => this.accept(response)));
  }

  /** Ends the session; one that had already ended (401) counts as signed out too. */
  signOut(): Observable<void> {
    return this.http
      .delete<void>('/api/session', { context: new HttpContext().set(HANDLES_OWN_401, true) })
      .pipe(
        catchError((error: unknown) =>
          error instanceof HttpErrorResponse && error.status === 401
            ? of(undefined)
            : throwError(() => error),
        ),
        tap(() => this.clear()),
      );
  }

  /** Replaces the user after the server changed them (for example the display unit). */
  updateUser(user: SessionUser): void {
    const current = this.current();
    this.current.set({ ...current, user });
  }

  /** Forgets the user, e.g. after the server answered 401 because the session ended. */
  clear(): void {
    this.current.set(null);
    this.loaded = true;
  }

  private accept(response: SessionResponse): SessionUser {
    this.current.set(response);
    this.loaded = true;
    return response.user;
  }
}
