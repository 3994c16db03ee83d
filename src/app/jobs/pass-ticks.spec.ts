import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import type { BoreSheetJson } from '../../../shared/api/jobs';
import { OFFLINE_STORAGE } from '../core/offline-store';
import { OfflineStatus } from '../core/offline-status';
import { Session } from '../core/session';
import { memoryStorage } from '../testing/memory-storage';
import { BenchQueue } from './bench-queue';
import { PassTicks } from './pass-ticks';

/** Just what ticking reads of a bore sheet: its job, cylinder and passes done. */
const SHEET = {
  job: { id: 'j1', number: 'CY-1' },
  cylinder: 2,
  passesDone: 1,
} as unknown as BoreSheetJson;

async function settle(): Promise<void> {
  for (let i = 0; i < 10; i++) await new Promise((resolve) => setTimeout(resolve));
}

describe('PassTicks', () => {
  let http: HttpTestingController;
  let status: OfflineStatus;
  let ticks: PassTicks;

  beforeEach(async () => {
    localStorage.clear();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: OFFLINE_STORAGE, useValue: memoryStorage() },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const loading = TestBed.inject(Session).load();
    http.expectOne('/api/session').flush({
      user: {
        id: 'u7',
        email: 'm@example.test',
        name: 'Tam Oradell',
        role: 'machinist',
        unit: 'mm',
      },
    });
    await loading;
    status = TestBed.inject(OfflineStatus);
    status.online.set(true);
    TestBed.inject(BenchQueue);
    ticks = TestBed.inject(PassTicks);
    TestBed.tick();
    await settle();
  });

  afterEach(() => http.verify());

  it('when the second pass is ticked online, then two passes done goes to the server, based on one', () => {
    const sent = jest.fn();
    ticks.tick(SHEET, 1, sent);
    const req = http.expectOne('/api/jobs/j1/cylinders/2/passes-done');
    expect(req.request.method).toBe('PUT');
    expect(req.request.body).toEqual({ done: 2, basedOn: 1 });
    req.flush({ passesDone: 2 });
    expect(sent).toHaveBeenCalledTimes(1);
  });

  it('when the pass before the current one is taken back, then it and the later ones are undone', () => {
    ticks.tick(SHEET, 0, () => undefined);
    const req = http.expectOne('/api/jobs/j1/cylinders/2/passes-done');
    expect(req.request.body).toEqual({ done: 0, basedOn: 1 });
    req.flush({ passesDone: 0 });
  });

  it('when a pass is ticked offline, then it waits on the tablet and counts as done there', async () => {
    status.online.set(false);
    TestBed.tick();
    ticks.tick(SHEET, 1, () => undefined);
    await settle();
    http.expectNone('/api/jobs/j1/cylinders/2/passes-done');
    expect(ticks.done(SHEET)).toBe(2);
  });
});
