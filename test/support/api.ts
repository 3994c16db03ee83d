// Helpers for API tests: the real app over supertest, fresh users of each role, signed-in agents
// that carry the XSRF header like the Angular client does.
import request from 'supertest';
import { randomUUID } from 'node:crypto';
import bcrypt from 'bcryptjs';
import type { Express } from 'express';
import { createApp, type CreatedApp } from '../../server/app';
import { db } from '../../server/db/knex';
import type { Role } from '../../shared/session-types';

export const TEST_PASSWORD = 'correct-horse-battery';
// One hash for every test user: hashing is deliberately slow and tests make many users.
const TEST_HASH = bcrypt.hashSync(TEST_PASSWORD, 4);

let created: CreatedApp | null = null;

export function testApp(): Express {
  created ??= createApp({ serveClient: false });
  return created.app;
}

export async function closeTestApp(): Promise<void> {
  // Every file signs in from 127.0.0.1: its failed attempts must not count against the next file.
  await db('rate_limit_buckets')
    .where('bucket', 'like', 'sign-in-%')
    .delete()
    .catch(() => undefined);
  await created?.close();
  created = null;
  await db.destroy();
}

export function uniq(prefix = 't'): string {
  return `${prefix}-${randomUUID().slice(0, 8)}`;
}

export interface TestUser {
  id: string;
  email: string;
  role: Role;
  password: string;
}

export async function makeUser(
  role: Role,
  opts: { unit?: 'mm' | 'in'; active?: boolean } = {},
): Promise<TestUser> {
  const email = `${uniq(role)}@example.test`;
  const [row] = await db('users')
    .insert({
      email,
      name: `Test ${role}`,
      role,
      password_hash: TEST_HASH,
      unit: opts.unit ?? 'mm',
      active: opts.active ?? true,
    })
    .returning(['id']);
  return { id: row.id, email, role, password: TEST_PASSWORD };
}

type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** A supertest agent with a session cookie; mutating calls send the XSRF header automatically. */
export class Client {
  xsrf = '';
  user: TestUser | null = null;
  private made: ReturnType<typeof request.agent> | null = null;

  /** Without `app`, the file's shared test app, made at the first call (not when the client is). */
  constructor(private readonly app?: Express) {}

  get agent(): ReturnType<typeof request.agent> {
    this.made ??= request.agent(this.app ?? testApp());
    return this.made;
  }

  private capture(res: request.Response) {
    const cookies = ([] as string[]).concat(res.headers['set-cookie'] ?? []);
    for (const c of cookies) {
      const m = /^XSRF-TOKEN=([^;]*)/.exec(c);
      if (m) this.xsrf = decodeURIComponent(m[1]);
    }
    return res;
  }

  async prime(): Promise<void> {
    this.capture(await this.agent.get('/api/session'));
  }

  async signIn(user: TestUser): Promise<request.Response> {
    const res = this.capture(
      await this.agent.post('/api/session').send({ email: user.email, password: user.password }),
    );
    if (res.status === 200) this.user = user;
    return res;
  }

  call(method: Method, url: string) {
    const req = this.agent[method](url);
    if (method !== 'get' && this.xsrf) req.set('X-XSRF-TOKEN', this.xsrf);
    req.on('response', (res: request.Response) => this.capture(res));
    return req;
  }

  get(url: string) {
    return this.call('get', url);
  }
  post(url: string, body?: object) {
    return this.call('post', url).send(body ?? {});
  }
  put(url: string, body?: object) {
    return this.call('put', url).send(body ?? {});
  }
  patch(url: string, body?: object) {
    return this.call('patch', url).send(body ?? {});
  }
  delete(url: string) {
    return this.call('delete', url);
  }
}

/** Signs `client` in as a fresh user of the role; a refused sign-in fails the file at once. */
async function signInAsNew(
  client: Client,
  role: Role,
  opts: { unit?: 'mm' | 'in' },
): Promise<void> {
  const res = await client.signIn(await makeUser(role, opts));
  if (res.status !== 200)
    throw new Error(`sign-in as ${role} failed: ${res.status} ${JSON.stringify(res.body)}`);
}

/** A client signed in as a fresh user of the role. */
export async function signedIn(role: Role, opts: { unit?: 'mm' | 'in' } = {}): Promise<Client> {
  const client = new Client();
  await signInAsNew(client, role, opts);
  return client;
}

/**
 * One client per role named, each signed in as a fresh user of that role who reads lengths in the
 * unit given, in a `beforeAll` this registers, so a file names its clients at the top:
 * `const { owner, machinist } = signedInClients({ owner: 'mm', machinist: 'in' })`. Call it before the
 * file's own `beforeAll`s (hooks run in the order they are declared), and still close the app in
 * the file's `afterAll`.
 */
export function signedInClients<R extends Role>(roles: Record<R, 'mm' | 'in'>): Record<R, Client> {
  const clients = {} as Record<R, Client>;
  for (const role of Object.keys(roles) as R[]) clients[role] = new Client();
  beforeAll(async () => {
    for (const role of Object.keys(roles) as R[])
      await signInAsNew(clients[role], role, { unit: roles[role] });
  });
  return clients;
}

/** `signedInClients` for every role, each reading millimetres unless `units` says otherwise. */
export function everyRoleSignedIn(units: Partial<Record<Role, 'mm' | 'in'>> = {}) {
  return signedInClients({ owner: 'mm', buyer: 'mm', staff: 'mm', machinist: 'mm', ...units });
}

/** The body of a fixture call that must answer `expected`; anything else fails with what it said. */
export function ok<T = Record<string, unknown>>(
  res: { status: number; body: unknown },
  expected: number,
  what: string,
): T {
  if (res.status !== expected) {
    throw new Error(`${what}: expected ${expected}, got ${res.status} ${JSON.stringify(res.body)}`);
  }
  return res.body as T;
}
