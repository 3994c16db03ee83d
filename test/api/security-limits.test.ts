// Security checks against denial of service and against taking or locking accounts, named after the
// OWASP Application Security Verification Standard 4.0.3, level 2. Each test title starts with the
// requirement it shows. Floods are bounded (a few hundred requests) and go to 127.0.0.1 only.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomUUID } from 'node:crypto';
import { db } from '../../server/db/knex';
import { config } from '../../server/config';
import { MAX_FAILURES } from '../../server/session/sign-in-service';
import { Client, closeTestApp, makeUser, signedIn, testApp, uniq } from '../support/api';
import { makeFamily } from '../support/catalog-fixtures';

let server: http.Server;
let base = '';

beforeAll(async () => {
  server = http.createServer(testApp());
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await closeTestApp();
});

/** Every sign-in counter starts empty, so one test's failures do not spill into the next. */
beforeEach(async () => {
  await db('rate_limit_buckets').where('bucket', 'like', 'sign-in-%').delete();
});

async function timed<T>(work: () => Promise<T>): Promise<{ value: T; ms: number }> {
  const started = performance.now();
  const value = await work();
  return { value, ms: performance.now() - started };
}

/** Polls /api/health every 50 ms until `until` settles; answers the slowest poll and every status. */
async function healthDuring(until: Promise<unknown>) {
  let done = false;
  void until.finally(() => (done = true));
  const polls: Array<{ ms: number; status: number }> = [];
  while (!done) {
    const { value, ms } = await timed(() =>
      fetch(`${base}/api/health`, { signal: AbortSignal.timeout(10_000) }).then((r) => r.status),
    );
    polls.push({ ms, status: value });
    await new Promise((r) => setTimeout(r, 50));
  }
  return { slowest: Math.max(...polls.map((p) => p.ms)), statuses: polls.map((p) => p.status) };
}

function signInOnce(email: string, password: string, cookie?: string) {
  return fetch(`${base}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', ...(cookie ? { cookie } : {}) },
    body: JSON.stringify({ email, password }),
    signal: AbortSignal.timeout(60_000),
  });
}

// A value just under the 1 MB body limit shaped like the e-mail that used to cost quadratic time.
const MEGABYTE_EMAIL = 'a@' + '.'.repeat(1_000_000) + '@';

describe('V5.1.4 / V11.1.4 a huge value is refused before any pattern looks at it', () => {
  it('when a supplier e-mail of 1 MB is sent, then it is refused in well under a second and health keeps answering', async () => {
    const buyer = await signedIn('buyer');
    const post = timed(() =>
      buyer.post('/api/suppliers', {
        name: uniq('Huge mail'),
        email: MEGABYTE_EMAIL,
        currency: 'EUR',
        leadDays: 3,
      }),
    );
    const health = await healthDuring(post);
    const { value: res, ms } = await post;
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({
      field: 'email',
      message: 'at most 200 characters',
    });
    expect(ms).toBeLessThan(1000);
    expect(health.statuses.every((s) => s === 200)).toBe(true);
    expect(health.slowest).toBeLessThan(1000);
  });

  it('when other pattern-checked fields (a customer e-mail, a date, a length, a bin code) get 1 MB, then each is refused at once by its length', async () => {
    const staff = await signedIn('staff');
    const owner = await signedIn('owner');
    const fixture = await makeFamily(owner, { unit: 'mm' });
    const megabyte = '1'.repeat(1_000_000);
    const cases: Array<
      [
        string,
        () => Promise<{ status: number; body: { error: { details: Array<{ field?: string }> } } }>,
      ]
    > = [
      [
        'customerEmail',
        () =>
          staff.post('/api/jobs', {
            customerName: 'Odile Farrant',
            customerEmail: MEGABYTE_EMAIL,
            familyId: fixture.familyId,
            cylinders: 1,
          }),
      ],
      [
        'dueDate',
        () =>
          staff.post('/api/jobs', {
            customerName: 'Odile Farrant',
            dueDate: megabyte,
            familyId: fixture.familyId,
            cylinders: 1,
          }),
      ],
      ['code', () => owner.post('/api/bins', { code: `A${megabyte}` })],
      [
        'standardBore',
        () =>
          owner.post('/api/engine-families', {
            code: uniq('F'),
            name: 'Huge bore',
            strokeType: 'four',
            cylinders: 4,
            cooling: 'liquid',
            standardBore: `${megabyte} mm`,
          }),
      ],
    ];
    for (const [field, send] of cases) {
      const { value: res, ms } = await timed(send);
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe(field);
      expect(ms).toBeLessThan(1000);
    }
  });

  it('V5.1.3 an address with brackets or a list of addresses is refused for a supplier, with the field named', async () => {
    const buyer = await signedIn('buyer');
    for (const email of ['orders<x@sup.test', 'first,second@sup.test', 'Orders <x@sup.test>']) {
      const res = await buyer.post('/api/suppliers', {
        name: uniq('Odd mail'),
        email,
        currency: 'EUR',
        leadDays: 3,
      });
      expect(res.status).toBe(400);
      expect(res.body.error.details[0].field).toBe('email');
    }
  });
});

describe('V2.2.1 / V11.1.4 sign-in floods and guessing', () => {
  it('when 200 sign-ins with made-up e-mails arrive at once from one address, then only the per-address allowance is checked and health keeps answering', async () => {
    const flood = Promise.all(
      Array.from({ length: 200 }, () =>
        signInOnce(`${randomUUID()}@nowhere.test`, 'a-guessed-password').then((r) => r.status),
      ),
    );
    const health = await healthDuring(flood);
    const statuses = await flood;
    const checked = statuses.filter((s) => s === 401).length;
    // Each 401 is one password comparison; everything past the allowance was refused before it.
    expect(checked).toBeLessThanOrEqual(config.SIGN_IN_FAILURES_PER_ADDRESS);
    // The rest were refused (429), or told the server is busy (503), never a failure.
    expect(statuses.filter((s) => s !== 401 && s !== 429 && s !== 503)).toEqual([]);
    // Health never reports the database down and never waits behind the flood (it used to take
    // 10-12 s). Here the flood's 200 clients share this process with the server, so the bound is
    // generous; the 1 s figure against a server process of its own is measured by the bench.
    expect(health.statuses.every((s) => s === 200)).toBe(true);
    expect(health.slowest).toBeLessThan(3000);
    // The answer says when to come back.
    const refused = await signInOnce(`${randomUUID()}@nowhere.test`, 'a-guessed-password');
    expect(refused.status).toBe(429);
    expect(Number(refused.headers.get('retry-after'))).toBeGreaterThan(0);
    // Thirty full-cost hash comparisons in one worker on a busy two-core machine take a while.
  }, 180_000);

  it('V2.2.1 when 60 wrong passwords for one account arrive at once, then no more than ten are checked', async () => {
    const victim = await makeUser('buyer');
    const statuses = await Promise.all(
      Array.from({ length: 60 }, (_, i) =>
        signInOnce(victim.email, `guess-${i}-wrong`).then((r) => r.status),
      ),
    );
    // Never more than the limit checked (it used to be 16); the rest refused, or told the server
    // is busy when the database is slow to hand out connections.
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(MAX_FAILURES);
    expect(statuses.filter((s) => s !== 401 && s !== 429 && s !== 503)).toEqual([]);
  });

  it('V2.2.1 when a stranger fails ten times on an account in any casing, then the person still signs in on a browser they used before, and an owner reset lifts the lock everywhere', async () => {
    const owner = await signedIn('owner');
    const victim = await makeUser('buyer');
    // The person's own browser signed in before: it holds the device cookie.
    const own = new Client();
    expect((await own.signIn(victim)).status).toBe(200);
    await own.delete('/api/session');

    const stranger = new Client();
    for (let i = 0; i < MAX_FAILURES; i++) {
      const res = await stranger.signIn({
        ...victim,
        email: victim.email.toUpperCase(),
        password: `guess-${i}-wrong`,
      });
      expect(res.status).toBe(401);
    }
    // From this address without the device cookie the account is locked, whatever the casing…
    const locked = await new Client().signIn(victim);
    expect(locked.status).toBe(429);
    expect(locked.body.error.message).toMatch(/reset the password/);
    // …but the person's own browser gets in.
    expect((await own.signIn(victim)).status).toBe(200);

    // The message's promise holds: the owner's reset lifts the lock for a fresh browser too.
    const reset = await owner.patch(`/api/users/${victim.id}`, {
      password: 'a-fresh-password-set',
    });
    expect(reset.status).toBe(200);
    expect(
      (await new Client().signIn({ ...victim, password: 'a-fresh-password-set' })).status,
    ).toBe(200);
  });

  it('V2.2.1 failed sign-in counters are swept once their window has passed', async () => {
    await db('rate_limit_buckets').insert([
      {
        bucket: 'sign-in-address',
        key: 'old',
        hits: 5,
        expires_at: db.raw("now() - interval '1 minute'"),
      },
      {
        bucket: 'sign-in-address',
        key: 'live',
        hits: 5,
        expires_at: db.raw("now() + interval '1 minute'"),
      },
    ]);
    const { pruneRateLimits } = await import('../../server/http/rate-limit');
    expect(await pruneRateLimits()).toBeGreaterThanOrEqual(1);
    const left = await db('rate_limit_buckets').whereIn('key', ['old', 'live']).pluck('key');
    expect(left).toEqual(['live']);
  });
});

describe('V2.1.6 / V3.3.3 a signed-in screen left alone cannot take the account', () => {
  it("when the owner's own id is given a new password through the users route, then it is refused and the old password still works", async () => {
    const owner = await signedIn('owner');
    const me = owner.user as NonNullable<typeof owner.user>;
    const res = await owner.patch(`/api/users/${me.id}`, { password: 'taken-over-password' });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('password');
    expect((await new Client().signIn(me)).status).toBe(200);
    expect((await new Client().signIn({ ...me, password: 'taken-over-password' })).status).toBe(
      401,
    );
  });

  it("when the owner resets someone else's password, then every session of that person ends", async () => {
    const owner = await signedIn('owner');
    const other = await signedIn('machinist');
    expect((await other.get('/api/session')).status).toBe(200);
    const id = (other.user as NonNullable<typeof other.user>).id;
    expect(
      (await owner.patch(`/api/users/${id}`, { password: 'another-fresh-password' })).status,
    ).toBe(200);
    expect((await other.get('/api/session')).status).toBe(401);
  });
});
