import { HttpClient, HttpContext, HttpErrorResponse } from '@angular/common/http';
import { computed, inject, Injectable, signal } from '@angular/core';
import { catchError, firstValueFrom, map, Observable, of, tap, throwError } from 'rxjs';

import type { LabelStock } from '../../../shared/label-stock';
import type { SessionResponse, SessionUser } from '../../../shared/session-types';
import { HANDLES_OWN_401 } from './http-context';
import { clearCachedAnswers, OFFLINE_STORAGE, type OfflineStorage } from './offline-store';
import { allows, type Action } from '../../../shared/access';

/**
 * Who was last signed in on this device, so a tablet that reloads with the network down can still
 * open the pages its service worker kept. Only the name, role and unit: the session itself is the
 * server's HttpOnly cookie, and every answer is still the server's decision once it is reachable.
 */
const LAST_SESSION_KEY = 'stepstock.session.last';

/**
 * The server was not reached: the service worker's 504 (its fetch failed), or no network at all.
 * A plain failed request with the network up (a development server stopped) is not offline use.
 */
function unreachable(error: unknown): boolean {
  if (!(error instanceof HttpErrorResponse)) return false;
  return error.status === 504 || (error.status === 0 && !navigator.onLine);
}

function remembered(): SessionResponse | null {
  try {
    const stored = JSON.parse(localStorage.getItem(LAST_SESSION_KEY) ?? 'null') as {
      user?: { id?: unknown } | null;
    } | null;
    // Only a whole remembered session counts: a left-over "nobody signed in" is no one.
    return typeof stored?.user?.id === 'string' ? (stored as SessionResponse) : null;
  } catch {
    return null;
  }
}

function remember(response: SessionResponse | null): void {
  try {
    if (response) localStorage.setItem(LAST_SESSION_KEY, JSON.stringify(response));
    else localStorage.removeItem(LAST_SESSION_KEY);
  } catch {
    /* private mode: offline start-up is not offered */
  }
}

/**
 * Who is signed in. The server holds the session (an HttpOnly cookie); this keeps the answer of
 * GET /api/session as signals so the shell, guards and length display follow it.
 */
@Injectable({ providedIn: 'root' })
export class Session {
  private readonly http = inject(HttpClient);
  private readonly storage = inject(OFFLINE_STORAGE);

  private readonly current = signal<SessionResponse | null>(null);
  private inFlight: Promise<SessionUser | null> | null = null;
  private loaded = false;

  constructor() {
    // Opened offline on the last sign-in: once the network is back the server says who it is.
    addEventListener('online', () => {
      if (this.offline()) this.load().catch(() => undefined);
    });
  }

  /** The signed-in user, or null when nobody is (or the session has not been asked yet). */
  readonly user = computed(() => this.current()?.user ?? null);
  readonly shopName = computed(() => this.current()?.shop?.name || 'Stepstock');
  /** How the shop writes dates, and the zone its times are shown in (shop settings). */
  readonly locale = computed(() => this.current()?.shop?.locale || 'en-GB');
  readonly timeZone = computed(() => this.current()?.shop?.timeZone || 'UTC');
  /** The shop's home currency: stock is valued in it. */
  readonly currency = computed(() => this.current()?.shop?.currency || 'EUR');
  readonly unit = computed(() => this.user()?.unit ?? 'mm');
  /** What the shop prints labels on (shop settings): sheets, or a label printer's roll. */
  readonly labelStock = computed<LabelStock>(() => this.current()?.shop?.labelStock ?? 'sheet');

  /** Whether the signed-in person's role may do the action (read inside `computed` to follow it). */
  may(action: Action): boolean {
    return allows(this.user()?.role, action);
  }
  /** True when the server could not be reached at start-up and the last sign-in on this device stands in. */
  readonly offline = signal(false);

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
          const last = unreachable(error) ? remembered() : null;
          if (last) return this.accept(last, { offline: true });
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

  /**
   * Ends the session; one that had already ended (401) counts as signed out too. What this person
   * left on the device goes with it: the service worker's copies of the bench and their unsent
   * entries, so the next person on a shared tablet sees none of it.
   */
  signOut(): Observable<void> {
    const userId = this.user()?.id ?? null;
    return this.http
      .delete<void>('/api/session', { context: new HttpContext().set(HANDLES_OWN_401, true) })
      .pipe(
        catchError((error: unknown) =>
          error instanceof HttpErrorResponse && error.status === 401
            ? of(undefined)
            : throwError(() => error),
        ),
        tap(() => {
          // Finished in the background, so the sign-in page shows at once while the copies go.
          void forgetDevice(this.storage, userId);
          this.clear();
        }),
      );
  }

  /** Replaces the user after the server changed them (for example the display unit). */
  updateUser(user: SessionUser): void {
    const current = this.current();
    this.current.set({ ...current, user });
    remember({ ...current, user });
  }

  /** Forgets the user, e.g. after the server answered 401 because the session ended. */
  clear(): void {
    this.current.set(null);
    this.offline.set(false);
    this.loaded = true;
    remember(null);
  }

  private accept(response: SessionResponse, how = { offline: false }): SessionUser {
    const before = remembered();
    // Someone else on this tablet: the last person's cached pages are not theirs to read.
    if (!how.offline && before && before.user.id !== response.user?.id) void clearCachedAnswers();
    this.current.set(response);
    this.offline.set(how.offline);
    this.loaded = true;
    if (!how.offline) remember(response);
    return response.user;
  }
}

/** Forgets what one person left on this device; a failure here must not keep them signed in. */
async function forgetDevice(storage: OfflineStorage, userId: string | null): Promise<void> {
  await Promise.all([
    clearCachedAnswers().catch(() => undefined),
    userId ? storage.removeUser(userId).catch(() => undefined) : undefined,
  ]);
}
