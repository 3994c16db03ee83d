// Uploads cannot exhaust the server's memory (ASVS 4.0.3 V12.1.1: size limits before the file is
// taken in; V11.1.4: limits on concurrent heavy work). An oversize upload is refused by its declared
// size before its body is read; price-list imports run two at a time, one per supplier, the rest
// wait their turn and are then told to come back with Retry-After. The memory ceiling itself is
// measured by the drill test/drills/upload-memory.test.ts.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { withImportSlot, importLoad } from '../../server/imports/import-slots';
import { keepFirst, MAX_ISSUES } from '../../server/imports/imports-service';
import { closeTestApp, signedIn, signedInClients, testApp } from '../support/api';
import { makeFamily, makeJob } from '../support/jobs-fixtures';

let server: http.Server;
let port = 0;
const { staff } = signedInClients({ staff: 'mm' });

beforeAll(async () => {
  server = http.createServer(testApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  port = (server.address() as AddressInfo).port;
});

afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await closeTestApp();
});

/**
 * Starts a multipart upload that declares `declared` bytes but sends only its first kilobyte, and
 * waits for the answer: a server that reads before it checks would wait for the rest forever.
 */
function declareHuge(
  path: string,
  declared: number,
): Promise<{ status: number; body: string; ms: number }> {
  const started = performance.now();
  const cookie = (
    staff.agent as unknown as { jar: { getCookies(o: object): { toValueString(): string }[] } }
  ).jar
    .getCookies({ domain: '127.0.0.1', path: '/', secure: false, script: false })
    .map((c) => c.toValueString())
    .join('; ');
  return new Promise((resolve, reject) => {
    const req = http.request(
      {
        host: '127.0.0.1',
        port,
        path,
        method: 'POST',
        headers: {
          'content-type': 'multipart/form-data; boundary=xyz',
          'content-length': String(declared),
          'x-xsrf-token': staff.xsrf,
          cookie,
        },
      },
      (res) => {
        let body = '';
        res.on('data', (d) => (body += d));
        res.on('end', () =>
          resolve({ status: res.statusCode ?? 0, body, ms: performance.now() - started }),
        );
      },
    );
    req.on('error', reject);
    req.write(`--xyz\r\nContent-Disposition: form-data; name="photo"; filename="big.jpg"\r\n\r\n`);
    req.write(Buffer.alloc(1024));
  });
}

describe('V12.1.1 an oversize upload is refused before its body is read', () => {
  it('when a photo upload declares 60 MB, then 413 comes back at once without the body being sent', async () => {
    const owner = await signedIn('owner');
    const job = await makeJob(staff, (await makeFamily(owner)).id);
    const res = await declareHuge(`/api/jobs/${job.id}/photos`, 60 * 1024 * 1024);
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.message).toMatch(
      /The photo is larger than the limit of 20 MB/,
    );
    expect(res.ms).toBeLessThan(5000);
  });

  it('when a price list declares 80 MB, then 413 comes back at once', async () => {
    const buyer = await signedIn('buyer');
    const supplier = await buyer.post('/api/suppliers', {
      name: `Upload limit supplier ${Date.now()}`,
      currency: 'EUR',
      leadDays: 3,
    });
    expect(supplier.status).toBe(201);
    const res = await declareHuge(
      `/api/suppliers/${supplier.body.id}/price-lists`,
      80 * 1024 * 1024,
    );
    expect(res.status).toBe(413);
    expect(JSON.parse(res.body).error.message).toMatch(
      /The price list is larger than the limit of 50 MB/,
    );
  });
});

describe('V11.1.4 price-list imports run two at a time, one per supplier', () => {
  /** A stand-in import that runs until released, recording when it started. */
  function held(log: string[], name: string) {
    let release = () => undefined as void;
    const done = new Promise<void>((r) => (release = r));
    return {
      work: async () => {
        log.push(`start ${name}`);
        await done;
        log.push(`end ${name}`);
        return name;
      },
      release: () => release(),
    };
  }

  it('when three suppliers import at once, then two run and the third starts when one ends', async () => {
    const log: string[] = [];
    const [a, b, c] = [held(log, 'a'), held(log, 'b'), held(log, 'c')];
    const runs = [
      withImportSlot('supplier-a', a.work, 5000),
      withImportSlot('supplier-b', b.work, 5000),
      withImportSlot('supplier-c', c.work, 5000),
    ];
    await new Promise((r) => setTimeout(r, 20));
    expect(log).toEqual(['start a', 'start b']);
    expect(importLoad()).toEqual({ running: 2, waiting: 1 });
    a.release();
    await runs[0];
    await new Promise((r) => setTimeout(r, 20));
    expect(log).toEqual(['start a', 'start b', 'end a', 'start c']);
    b.release();
    c.release();
    expect(await Promise.all(runs)).toEqual(['a', 'b', 'c']);
    expect(importLoad()).toEqual({ running: 0, waiting: 0 });
  });

  it('when a supplier already has an import running, then a second one for it waits, and past the wait it is a 503 with Retry-After', async () => {
    const log: string[] = [];
    const first = held(log, 'first');
    const running = withImportSlot('supplier-x', first.work, 5000);
    const second = withImportSlot('supplier-x', async () => 'second', 100);
    await expect(second).rejects.toMatchObject({ status: 503, retryAfterSeconds: 5 });
    // Another supplier is not held up by it.
    expect(await withImportSlot('supplier-y', async () => 'other', 100)).toBe('other');
    first.release();
    expect(await running).toBe('first');
  });
});

describe('V11.1.4 a large list where every row has a warning', () => {
  it('when one batch brings 200,000 warnings, then the first ones are kept and nothing overflows the stack', () => {
    const kept: { line: number; message: string }[] = [];
    const batch = Array.from({ length: 200_000 }, (_, i) => ({
      line: 200_001 - i,
      message: 'no lead time given',
    }));
    expect(() => keepFirst(kept, batch, MAX_ISSUES)).not.toThrow();
    expect(kept.length).toBeLessThanOrEqual(MAX_ISSUES * 4);
    const lowest = [...kept].sort((a, b) => a.line - b.line)[0];
    expect(lowest.line).toBe(2);
  });
});
