import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import { OfflineStatus } from './offline-status';

describe('OfflineStatus', () => {
  function status(): OfflineStatus {
    TestBed.configureTestingModule({ providers: [provideRouter([])] });
    return TestBed.inject(OfflineStatus);
  }
  const at = (iso: string) => Date.parse(iso);

  it('when answers are live, even from a device whose clock is 4 minutes fast, then nothing is marked', () => {
    const s = status();
    // The server's Date is whole seconds (RFC 9110 IMF-fixdate); the tablet runs 240 s ahead.
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 10:00:00 GMT', at('2026-12-03T10:04:00.300Z'));
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 10:01:00 GMT', at('2026-12-03T10:05:01.100Z'));
    expect(s.shownAsOf()).toBeNull();
  });

  it('when an answer was written well before the clock says, then the page is shown as of then', () => {
    const s = status();
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 10:00:00 GMT', at('2026-12-03T10:00:00.200Z'));
    // The service worker's copy from 09:12, handed back after the network timed out.
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 09:12:00 GMT', at('2026-12-03T10:02:03Z'));
    s.noteAnswer('/api/b', 'Thu, 03 Dec 2026 09:40:00 GMT', at('2026-12-03T10:02:04Z'));
    expect(s.shownAsOf()?.toISOString()).toBe('2026-12-03T09:12:00.000Z');
  });

  it('when the network is back and the page reads its answers again live, then the mark goes', () => {
    const s = status();
    s.online.set(false);
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 09:12:00 GMT', at('2026-12-03T10:00:00Z'));
    s.noteAnswer('/api/b', 'Thu, 03 Dec 2026 09:20:00 GMT', at('2026-12-03T10:00:00Z'));
    s.online.set(true);
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 10:01:00 GMT', at('2026-12-03T10:01:00.100Z'));
    // One copy is still on the page.
    expect(s.shownAsOf()?.toISOString()).toBe('2026-12-03T09:20:00.000Z');
    s.noteAnswer('/api/b', 'Thu, 03 Dec 2026 10:01:01 GMT', at('2026-12-03T10:01:01.100Z'));
    expect(s.shownAsOf()).toBeNull();
  });

  it('when the browser is offline, then every answer read is a copy', () => {
    const s = status();
    s.online.set(false);
    s.noteAnswer('/api/a', 'Thu, 03 Dec 2026 10:00:00 GMT', at('2026-12-03T10:00:01Z'));
    expect(s.shownAsOf()?.toISOString()).toBe('2026-12-03T10:00:00.000Z');
  });

  it('when an answer has no usable Date, then it changes nothing', () => {
    const s = status();
    s.online.set(false);
    s.noteAnswer('/api/a', null);
    s.noteAnswer('/api/a', 'not a date');
    expect(s.shownAsOf()).toBeNull();
  });
});
