import { provideHttpClient } from '@angular/common/http';
import { HttpTestingController, provideHttpClientTesting } from '@angular/common/http/testing';
import { TestBed } from '@angular/core/testing';
import { provideRouter } from '@angular/router';

import { OFFLINE_STORAGE } from '../core/offline-store';
import { OfflineStatus } from '../core/offline-status';
import { Session } from '../core/session';
import { memoryStorage } from '../testing/memory-storage';
import { BenchQueue } from './bench-queue';

const READINGS = [
  { depth: 'top' as const, axis: 'pin' as const, diameter: '2.5260 in' },
  { depth: 'top' as const, axis: 'thrust' as const, diameter: '2.5255 in' },
];
const SEEN = '2026-12-03T09:00:00.000Z';

/** Lets the queue's promise chains (storage, then the next request) run. */
async function settle(): Promise<void> {
  for (let i = 0; i < 10; i++) await new Promise((resolve) => setTimeout(resolve));
}

describe('BenchQueue', () => {
  let http: HttpTestingController;
  let storage: ReturnType<typeof memoryStorage>;
  let status: OfflineStatus;
  let queue: BenchQueue;

  beforeEach(async () => {
    localStorage.clear();
    storage = memoryStorage();
    TestBed.configureTestingModule({
      providers: [
        provideRouter([]),
        provideHttpClient(),
        provideHttpClientTesting(),
        { provide: OFFLINE_STORAGE, useValue: storage },
      ],
    });
    http = TestBed.inject(HttpTestingController);
    const session = TestBed.inject(Session);
    const loading = session.load();
    http.expectOne('/api/session').flush({
      user: {
        id: 'u7',
        email: 'm@example.test',
        name: 'Ines Varro',
        role: 'machinist',
        unit: 'in',
      },
    });
    await loading;
    status = TestBed.inject(OfflineStatus);
    status.online.set(false);
    queue = TestBed.inject(BenchQueue);
    TestBed.tick();
    await settle();
  });

  afterEach(() => http.verify());

  /** The queue waits a moment after "online" (the Wi-Fi's route comes up after it says so). */
  async function backOnline(): Promise<void> {
    status.online.set(true);
    TestBed.tick();
    await new Promise((resolve) => setTimeout(resolve, 1600));
  }

  async function typeOffline(): Promise<void> {
    await queue.addReadings({
      jobId: 'j1',
      jobNumber: 'CY-1',
      cylinder: 1,
      readings: READINGS,
      basedOn: SEEN,
    });
    await queue.addFinish({
      jobId: 'j1',
      jobNumber: 'CY-1',
      cylinder: 2,
      changes: { measuredAfterHone: '2.5582 in' },
      basedOn: { measuredAfterHone: null },
    });
  }

  it('when entries are typed offline, then they wait on the device and go in the order typed, each with what it was based on', async () => {
    await typeOffline();
    expect(queue.entries().map((e) => [e.kind, e.cylinder])).toEqual([
      ['readings', 1],
      ['finish', 2],
    ]);
    expect(storage.map.size).toBe(2);
    http.expectNone(() => true);

    await backOnline();
    const first = http.expectOne('/api/jobs/j1/cylinders/1/readings');
    expect(first.request.method).toBe('PUT');
    expect(first.request.body).toEqual({ readings: READINGS, basedOn: SEEN });
    // The second waits for the first: the order typed is the order sent.
    http.expectNone('/api/jobs/j1/cylinders/2');
    first.flush({});
    await settle();
    const second = http.expectOne('/api/jobs/j1/cylinders/2');
    expect(second.request.method).toBe('PATCH');
    expect(second.request.body).toEqual({
      measuredAfterHone: '2.5582 in',
      basedOn: { measuredAfterHone: null },
    });
    second.flush({});
    await settle();
    expect(queue.entries()).toEqual([]);
    expect(storage.map.size).toBe(0);
  });

  it('when the server still cannot be reached (the worker answers 504), then the entry keeps waiting, not refused', async () => {
    await typeOffline();
    await backOnline();
    http
      .expectOne('/api/jobs/j1/cylinders/1/readings')
      .flush(null, { status: 504, statusText: 'Gateway Timeout' });
    await settle();
    http.expectNone('/api/jobs/j1/cylinders/2');
    expect(queue.entries().map((e) => e.refusal)).toEqual([undefined, undefined]);
    expect(storage.map.size).toBe(2);
  });

  it('when the server refuses stale readings (409), then the entry is kept with why and both versions, the next is still sent, and "Keep mine" resends based on theirs', async () => {
    await typeOffline();
    await backOnline();
    const stored = {
      measuredAt: '2026-12-03T09:30:00.000Z',
      readings: [
        { depth: 'top', axis: 'pin', diameter: { mm: '64.1858', in: '2.5270' }, unit: 'in' },
      ],
    };
    http.expectOne('/api/jobs/j1/cylinders/1/readings').flush(
      {
        error: {
          code: 'stale_readings',
          message: 'The readings of cylinder 1 of job CY-1 were changed since these were typed.',
          details: [],
          stored,
          yours: { basedOn: SEEN, readings: [] },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await settle();
    http.expectOne('/api/jobs/j1/cylinders/2').flush({});
    await settle();

    const [kept] = queue.entries();
    expect(kept.refusal).toMatchObject({
      status: 409,
      code: 'stale_readings',
      theirs: ['Top of ring travel, along the pin: 2.5270 in'],
      yours: [
        'Top of ring travel, along the pin: 2.5260 in',
        'Top of ring travel, across (thrust): 2.5255 in',
      ],
      rebase: '2026-12-03T09:30:00.000Z',
    });
    expect(kept.refusal?.message).toMatch(/changed since/);
    // Nothing was overwritten and nothing was dropped: it is still on the device, refused.
    expect([...storage.map.values()]).toEqual([expect.objectContaining({ refusal: kept.refusal })]);

    void queue.keepMine(kept);
    await settle();
    const again = http.expectOne('/api/jobs/j1/cylinders/1/readings');
    expect(again.request.body).toEqual({ readings: READINGS, basedOn: stored.measuredAt });
    again.flush({});
    await settle();
    expect(queue.entries()).toEqual([]);
  });

  it('when passes are ticked offline, then each tick goes in order on the count before it; a tick refused as stale shows both counts', async () => {
    const tick = (done: number, basedOn: number) =>
      queue.addPasses({ jobId: 'j1', jobNumber: 'CY-1', cylinder: 1, done, basedOn });
    await tick(1, 0);
    await tick(2, 1);
    await backOnline();
    const first = http.expectOne('/api/jobs/j1/cylinders/1/passes-done');
    expect(first.request.body).toEqual({ done: 1, basedOn: 0 });
    first.flush(
      {
        error: {
          code: 'stale_passes',
          message:
            'The passes done on cylinder 1 of job CY-1 were changed to 3 since this tick was made.',
          details: [],
          stored: { passesDone: 3 },
          yours: { basedOn: 0, passesDone: 1 },
        },
      },
      { status: 409, statusText: 'Conflict' },
    );
    await settle();
    const second = http.expectOne('/api/jobs/j1/cylinders/1/passes-done');
    expect(second.request.body).toEqual({ done: 2, basedOn: 1 });
    second.flush({ passesDone: 2 });
    await settle();
    const [refused] = queue.entries();
    expect(refused.refusal).toMatchObject({
      code: 'stale_passes',
      theirs: ['Passes done: 3'],
      yours: ['Passes done: 1'],
      rebase: 3,
    });
  });

  it('when the machinist signs out, then their waiting entries are gone from the device and from the page', async () => {
    await typeOffline();
    await storage.put('someone-else:000000000000001-0000', { kept: true });
    TestBed.inject(Session).signOut().subscribe();
    http
      .expectOne({ method: 'DELETE', url: '/api/session' })
      .flush(null, { status: 204, statusText: 'No Content' });
    TestBed.tick();
    await settle();
    expect(queue.entries()).toEqual([]);
    // Only the person who signed out loses theirs; another's entries on a shared tablet stay.
    expect([...storage.map.keys()]).toEqual(['someone-else:000000000000001-0000']);
  });
});
