import { DestroyRef, inject, Injectable, signal } from '@angular/core';
import { NavigationStart, Router } from '@angular/router';
import { filter } from 'rxjs';

/**
 * An answer older than this (after allowing for the device's clock) came from the service
 * worker's cache, not the server: a fresh one is seconds old at most, even on a slow network.
 */
const STALE_AFTER_MS = 30_000;
/** Before any live answer has shown how far the device's clock is off, only this old counts. */
const STALE_UNKNOWN_CLOCK_MS = 5 * 60_000;

/**
 * Whether the page shown is live or the service worker's copy. The worker hands back a cached API
 * answer with the headers it had, so its `Date` says when the server wrote it; a tablet's clock may
 * be minutes off the server's, so the smallest gap seen on live answers is taken as that offset.
 * The offset is learnt afresh at each visit, so a clock put right later cannot mislead it.
 */
@Injectable({ providedIn: 'root' })
export class OfflineStatus {
  /** The browser's own idea of the network (false as soon as Wi-Fi drops). */
  readonly online = signal(typeof navigator === 'undefined' ? true : navigator.onLine);
  /** When the oldest cached answer on the page shown was written by the server; null: all live. */
  readonly shownAsOf = signal<Date | null>(null);

  /** The least gap between a live answer's `Date` and this device's clock, in this visit. */
  private skew: number | null = null;
  /** When each copy on the page shown was written, by the address it answered. */
  private readonly copies = new Map<string, number>();

  constructor() {
    const goOnline = () => this.online.set(true);
    const goOffline = () => this.online.set(false);
    addEventListener('online', goOnline);
    addEventListener('offline', goOffline);
    const destroyRef = inject(DestroyRef);
    destroyRef.onDestroy(() => {
      removeEventListener('online', goOnline);
      removeEventListener('offline', goOffline);
    });
    // Each page starts live; only its own answers can mark it as a cached copy.
    const navigations = inject(Router)
      .events.pipe(filter((event) => event instanceof NavigationStart))
      .subscribe(() => {
        this.copies.clear();
        this.shownAsOf.set(null);
      });
    destroyRef.onDestroy(() => navigations.unsubscribe());
  }

  /** Called with each API answer's address and `Date` header as it arrives. */
  noteAnswer(url: string, dateHeader: string | null, now = Date.now()): void {
    const written = dateHeader ? Date.parse(dateHeader) : NaN;
    if (!Number.isFinite(written)) return;
    const gap = now - written;
    const cached =
      !this.online() ||
      (this.skew === null ? gap > STALE_UNKNOWN_CLOCK_MS : gap - this.skew > STALE_AFTER_MS);
    if (cached) this.copies.set(url, written);
    else this.copies.delete(url);
    // A page read again live (the network is back) stops saying it is a copy.
    const oldest = Math.min(...this.copies.values());
    this.shownAsOf.set(Number.isFinite(oldest) ? new Date(oldest) : null);
    if (cached) return;
    // A live answer: its gap is the clock offset plus the time on the wire, so the least is best.
    if (this.skew === null || gap < this.skew) this.skew = gap;
  }
}
