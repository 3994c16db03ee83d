import { HttpErrorResponse } from '@angular/common/http';
import { DestroyRef, effect, inject, Injectable, signal, untracked } from '@angular/core';
import { firstValueFrom, Observable, Subject } from 'rxjs';

import { AXIS_LABELS, DEPTH_LABELS, type ReadingJson } from '../../../shared/api/jobs';
import type { LengthJson } from '../../../shared/lengths';
import { apiErrorMessage } from '../core/api-error';
import { OFFLINE_STORAGE } from '../core/offline-store';
import { OfflineStatus } from '../core/offline-status';
import { Session } from '../core/session';
import { JobsApi, type FinishBasedOn, type ReadingBody } from './jobs-api';

/** The after-honing sizes, as typed ("2.5582 in"). */
export interface FinishChanges {
  measuredAfterHone?: string;
  ringGap?: string;
}

interface EntryBase {
  /** `<user id>:<order>`: sorted, these are the order the entries were typed in. */
  key: string;
  jobId: string;
  jobNumber: string;
  cylinder: number;
  typedAt: string;
  /** Set when the server refused the entry; it then waits for the machinist's choice. */
  refusal?: Refusal;
}
export interface ReadingsEntry extends EntryBase {
  kind: 'readings';
  readings: ReadingBody[];
  /** The cylinder's measuredAt when the readings were typed (null: it had none). */
  basedOn: string | null;
}
export interface FinishEntry extends EntryBase {
  kind: 'finish';
  changes: FinishChanges;
  basedOn: FinishBasedOn;
}
export interface PassesEntry extends EntryBase {
  kind: 'passes';
  /** How many passes are done with this tick. */
  done: number;
  /** How many were done when it was ticked. */
  basedOn: number;
}
export type WaitingEntry = ReadingsEntry | FinishEntry | PassesEntry;

export interface Refusal {
  status: number;
  code: string;
  message: string;
  /** What the server holds now, line by line, when it said (a stale entry). */
  theirs: string[];
  /** What this entry would have stored. */
  yours: string[];
  /** For a stale entry: what to base it on to send it again over theirs ("Keep mine"). */
  rebase?: string | null | FinishBasedOn | number;
}

/** While an entry waits, the server is asked again this often (and at once when the network is back). */
const RETRY_MS = 20_000;
const ONLINE_SETTLE_MS = 1_500;

/** No answer from the server itself: no network, the service worker's 504, or a proxy's 502/503. */
export function serverUnreachable(error: unknown): boolean {
  return error instanceof HttpErrorResponse && [0, 502, 503, 504].includes(error.status);
}

/**
 * Bore readings and after-honing sizes typed while the server could not be reached: kept in this
 * browser (IndexedDB), shown as waiting, and sent in the order typed when the network is back.
 * Each carries what it was based on, so the server refuses one typed against an older state
 * (409) instead of letting it overwrite newer data; a refused entry waits for the machinist to
 * keep theirs or take the server's. Nothing is dropped without their say.
 */
@Injectable({ providedIn: 'root' })
export class BenchQueue {
  private readonly api = inject(JobsApi);
  private readonly storage = inject(OFFLINE_STORAGE);
  private readonly session = inject(Session);
  private readonly status = inject(OfflineStatus);

  private readonly list = signal<WaitingEntry[]>([]);
  /** Every entry of the signed-in person, in the order typed. */
  readonly entries = this.list.asReadonly();
  private readonly sentEntries = new Subject<WaitingEntry>();
  /** Each entry the server took, so a page showing its cylinder reads it again. */
  readonly sent: Observable<WaitingEntry> = this.sentEntries.asObservable();

  private flushing: Promise<void> | null = null;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private counter = 0;

  constructor() {
    // A new person (or nobody) on the tablet: show only their own entries.
    effect(() => {
      const user = this.session.user();
      untracked(() => void this.loadFor(user?.id ?? null));
    });
    // Sent a moment after the network is back: Wi-Fi says "online" before its route is ready.
    effect(() => {
      if (this.status.online()) untracked(() => this.scheduleRetry(ONLINE_SETTLE_MS));
    });
    inject(DestroyRef).onDestroy(() => this.stopRetry());
  }

  /** Keeps readings typed while offline; they go as soon as the server answers. */
  addReadings(entry: Omit<ReadingsEntry, 'key' | 'kind' | 'typedAt'>): Promise<void> {
    return this.add({ ...entry, kind: 'readings' });
  }

  addFinish(entry: Omit<FinishEntry, 'key' | 'kind' | 'typedAt'>): Promise<void> {
    return this.add({ ...entry, kind: 'finish' });
  }

  addPasses(entry: Omit<PassesEntry, 'key' | 'kind' | 'typedAt'>): Promise<void> {
    return this.add({ ...entry, kind: 'passes' });
  }

  forCylinder(jobId: string, cylinder: number): WaitingEntry[] {
    return this.list().filter((e) => e.jobId === jobId && e.cylinder === cylinder);
  }

  /** Sends every waiting entry in order; stops at the first that finds no server. */
  flush(): Promise<void> {
    this.flushing ??= this.sendAll().finally(() => (this.flushing = null));
    return this.flushing;
  }

  /** "Keep mine": sent again, now based on what the server holds, so it replaces theirs. */
  async keepMine(entry: WaitingEntry): Promise<void> {
    const rebase = entry.refusal?.rebase;
    if (rebase === undefined) return;
    const again = { ...entry, basedOn: rebase, refusal: undefined } as WaitingEntry;
    await this.save(again);
    await this.flush();
  }

  /** "Use theirs" (or, for an entry that cannot go, "Drop it"): this entry is forgotten. */
  async drop(entry: WaitingEntry): Promise<void> {
    await this.storage.remove(entry.key);
    this.list.update((list) => list.filter((e) => e.key !== entry.key));
  }

  private async add(fields: Omit<WaitingEntry, 'key' | 'typedAt'>): Promise<void> {
    const user = this.session.user();
    if (!user) throw new Error('Sign in first: entries are kept for the person who typed them.');
    const order = `${String(Date.now()).padStart(15, '0')}-${String(this.counter++).padStart(4, '0')}`;
    const entry = {
      ...fields,
      key: `${user.id}:${order}`,
      typedAt: new Date().toISOString(),
    } as WaitingEntry;
    await this.save(entry);
    this.scheduleRetry();
  }

  private async save(entry: WaitingEntry): Promise<void> {
    await this.storage.put(entry.key, entry);
    this.list.update((list) =>
      [...list.filter((e) => e.key !== entry.key), entry].sort((a, b) =>
        a.key < b.key ? -1 : a.key > b.key ? 1 : 0,
      ),
    );
  }

  private async loadFor(userId: string | null): Promise<void> {
    if (!userId) {
      this.list.set([]);
      return;
    }
    try {
      const stored = await this.storage.all(userId);
      this.list.set(stored.map(([, value]) => value as WaitingEntry));
      if (this.list().some((e) => !e.refusal)) void this.flush();
    } catch {
      // No IndexedDB (a private window in some browsers): nothing can wait, nothing is lost here.
      this.list.set([]);
    }
  }

  private async sendAll(): Promise<void> {
    this.stopRetry();
    for (const entry of this.list().filter((e) => !e.refusal)) {
      if (!this.list().some((e) => e.key === entry.key)) continue;
      try {
        await firstValueFrom(this.send(entry));
      } catch (error) {
        // Signed out meanwhile (the session ran out): it waits for the same person to sign in again.
        if (error instanceof HttpErrorResponse && error.status === 401) return;
        if (serverUnreachable(error)) {
          this.scheduleRetry();
          return;
        }
        await this.save({ ...entry, refusal: refusalOf(entry, error) });
        continue;
      }
      await this.drop(entry);
      this.sentEntries.next(entry);
    }
  }

  private send(entry: WaitingEntry): Observable<unknown> {
    switch (entry.kind) {
      case 'readings':
        return this.api.saveReadings(entry.jobId, entry.cylinder, entry.readings, entry.basedOn);
      case 'passes':
        return this.api.passesDone(entry.jobId, entry.cylinder, entry.done, entry.basedOn);
      case 'finish':
        return this.api.updateCylinder(entry.jobId, entry.cylinder, {
          ...entry.changes,
          basedOn: entry.basedOn,
        });
    }
  }

  private scheduleRetry(ms = RETRY_MS): void {
    if (this.timer !== null) {
      if (ms >= RETRY_MS) return;
      clearTimeout(this.timer);
    }
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.flush();
    }, ms);
  }

  private stopRetry(): void {
    if (this.timer !== null) clearTimeout(this.timer);
    this.timer = null;
  }
}

const FINISH_LABELS = { measuredAfterHone: 'Bore after honing', ringGap: 'Ring end gap' } as const;

function readingLine(depth: keyof typeof DEPTH_LABELS, axis: keyof typeof AXIS_LABELS): string {
  return `${DEPTH_LABELS[depth]}, ${AXIS_LABELS[axis].toLowerCase()}`;
}

/** "2.5582 in" in the unit the entry was typed in, from the server's { mm, in }. */
function lengthIn(value: LengthJson | null | undefined, typed: string | undefined): string {
  if (!value) return 'none recorded';
  return typed?.trim().endsWith('in') ? `${value.in} in` : `${value.mm} mm`;
}

function yoursOf(entry: WaitingEntry): string[] {
  if (entry.kind === 'passes') return [`Passes done: ${entry.done}`];
  if (entry.kind === 'readings') {
    return entry.readings.map((r) => `${readingLine(r.depth, r.axis)}: ${r.diameter}`);
  }
  return (Object.keys(FINISH_LABELS) as (keyof FinishChanges)[])
    .filter((k) => entry.changes[k] !== undefined)
    .map((k) => `${FINISH_LABELS[k]}: ${entry.changes[k]}`);
}

/** Why the server refused an entry, and both versions when it said what it holds. */
export function refusalOf(entry: WaitingEntry, error: unknown): Refusal {
  const status = error instanceof HttpErrorResponse ? error.status : 0;
  const body = (error instanceof HttpErrorResponse ? error.error : null) as {
    error?: { code?: string; stored?: Record<string, unknown> };
  } | null;
  const code = body?.error?.code ?? 'refused';
  const stored = body?.error?.stored;
  const refusal: Refusal = {
    status,
    code,
    message: apiErrorMessage(error),
    theirs: [],
    yours: yoursOf(entry),
  };
  if (entry.kind === 'readings' && code === 'stale_readings' && stored) {
    const readings = (stored['readings'] ?? []) as ReadingJson[];
    refusal.theirs = readings.length
      ? readings.map(
          (r) =>
            `${readingLine(r.depth, r.axis)}: ${r.unit === 'in' ? `${r.diameter.in} in` : `${r.diameter.mm} mm`}`,
        )
      : ['No readings'];
    refusal.rebase = (stored['measuredAt'] as string | null | undefined) ?? null;
  }
  if (entry.kind === 'passes' && code === 'stale_passes' && stored) {
    const count = Number(stored['passesDone']);
    refusal.theirs = [`Passes done: ${count}`];
    refusal.rebase = count;
  }
  if (entry.kind === 'finish' && code === 'stale_cylinder' && stored) {
    const keys = (Object.keys(FINISH_LABELS) as (keyof FinishChanges)[]).filter(
      (k) => entry.changes[k] !== undefined,
    );
    const now = stored as Record<keyof FinishChanges, LengthJson | null>;
    refusal.theirs = keys.map((k) => `${FINISH_LABELS[k]}: ${lengthIn(now[k], entry.changes[k])}`);
    refusal.rebase = Object.fromEntries(keys.map((k) => [k, now[k] ?? null])) as FinishBasedOn;
  }
  return refusal;
}
