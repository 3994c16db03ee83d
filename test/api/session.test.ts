import { Client, closeTestApp, makeUser, signedIn, testApp } from '../support/api';
import request from 'supertest';
import { db } from '../../server/db/knex';
import { ROLES } from '../../shared/session-types';

afterAll(closeTestApp);

describe('sign-in and sign-out', () => {
  it.each(ROLES)(
    'when a %s signs in with the right password, then the session says who they are and sign-out ends it',
    async (role) => {
      const client = new Client();
      const user = await makeUser(role);
      const res = await client.signIn(user);
      expect(res.status).toBe(200);
      expect(res.body.user).toEqual({
        id: user.id,
        email: user.email,
        name: `Test ${role}`,
        role,
        unit: 'mm',
      });
      expect(String(res.headers['set-cookie'])).toMatch(/stepstock\.sid=.*HttpOnly.*SameSite=Lax/i);
      expect((await client.get('/api/session')).status).toBe(200);
      expect((await client.delete('/api/session')).status).toBe(204);
      expect((await client.get('/api/session')).status).toBe(401);
    },
  );

  it('when the password is wrong, then 401 with the error model and no session', async () => {
    const user = await makeUser('staff');
    const client = new Client();
    const res = await client.signIn({ ...user, password: 'not-the-password' });
    expect(res.status).toBe(401);
    expect(res.body.error).toMatchObject({ code: 'unauthorized' });
    expect(typeof res.body.error.message).toBe('string');
    expect((await client.get('/api/session')).status).toBe(401);
  });

  it('when a signed-in user is deactivated, then their open session ends and they cannot sign in again', async () => {
    const owner = await signedIn('owner');
    const victim = new Client();
    const user = await makeUser('machinist');
    expect((await victim.signIn(user)).status).toBe(200);
    const res = await owner.patch(`/api/users/${user.id}`, { active: false });
    expect(res.status).toBe(200);
    expect(res.body.user.active).toBe(false);
    expect((await victim.get('/api/session')).status).toBe(401);
    expect((await new Client().signIn(user)).status).toBe(401);
  });

  it("when the owner changes a signed-in person's role and length unit, then that person's very next request has both", async () => {
    const owner = await signedIn('owner');
    const person = new Client();
    const user = await makeUser('staff');
    expect((await person.signIn(user)).status).toBe(200);
    expect((await person.get('/api/session')).body.user).toMatchObject({
      role: 'staff',
      unit: 'mm',
    });
    expect((await person.get('/api/reorder')).status).toBe(403);
    await db('users').where({ id: user.id }).update({ unit: 'in' });
    expect((await owner.patch(`/api/users/${user.id}`, { role: 'buyer' })).status).toBe(200);
    expect((await person.get('/api/session')).body.user).toMatchObject({
      role: 'buyer',
      unit: 'in',
    });
    expect((await person.get('/api/reorder')).status).toBe(200);
  });

  it('when sign-in fails ten times for one account and address, then the next attempt is throttled with 429', async () => {
    const user = await makeUser('buyer');
    const client = new Client();
    for (let i = 0; i < 10; i++)
      expect((await client.signIn({ ...user, password: `wrong-${i}` })).status).toBe(401);
    const res = await client.signIn(user);
    expect(res.status).toBe(429);
    expect(res.body.error.message).toMatch(/Too many failed sign-ins/);
  });

  it('when a mutating request lacks the X-XSRF-TOKEN header, then 403 and nothing changes', async () => {
    const owner = await signedIn('owner');
    const target = await makeUser('staff');
    const res = await owner.agent.patch(`/api/users/${target.id}`).send({ role: 'buyer' });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('xsrf_missing');
    const row = await db('users').where({ id: target.id }).first();
    expect(row.role).toBe('staff');
    const forged = await owner.agent
      .patch(`/api/users/${target.id}`)
      .set('X-XSRF-TOKEN', 'forged.token')
      .send({ role: 'buyer' });
    expect(forged.status).toBe(403);
  });

  it('when GET /api/session is called signed out, then 401 and an XSRF-TOKEN cookie is set', async () => {
    const res = await request(testApp()).get('/api/session');
    expect(res.status).toBe(401);
    expect(String(res.headers['set-cookie'])).toMatch(/XSRF-TOKEN=/);
  });

  it('when /api/health is asked, then it reports the database as ok', async () => {
    const res = await request(testApp()).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', db: 'ok' });
  });
});

describe('the users list', () => {
  it('when the owner asks for users sorted by e-mail descending, one page at a time, then the page and total are right', async () => {
    const owner = await signedIn('owner');
    const page1 = await owner.get('/api/users?sort=email&dir=desc&page=1&pageSize=2');
    expect(page1.status).toBe(200);
    expect(page1.body.items).toHaveLength(2);
    expect(page1.body.total).toBeGreaterThanOrEqual(2);
    const emails = page1.body.items.map((u: { email: string }) => u.email);
    expect([...emails].sort().reverse()).toEqual(emails);
    expect(page1.body.items[0]).not.toHaveProperty('password_hash');
  });

  it('when the sort field is unknown, then 400 names the query field', async () => {
    const owner = await signedIn('owner');
    const res = await owner.get('/api/users?sort=password_hash');
    expect(res.status).toBe(400);
    expect(res.body.error.details[0].field).toBe('sort');
  });
});

describe('password length', () => {
  it('when the owner gives a new user an 11-character password, then 400 names the field and no user is made (OWASP ASVS 4.0.3 V2.1.1: at least 12)', async () => {
    const owner = await signedIn('owner');
    const email = `short-${Date.now()}@example.test`;
    const res = await owner.post('/api/users', {
      name: 'Short Pass',
      email,
      role: 'staff',
      password: 'eleven-char',
    });
    expect(res.status).toBe(400);
    expect(res.body.error.details[0]).toMatchObject({ field: 'password' });
    expect(await db('users').where({ email })).toHaveLength(0);
    const ok = await owner.post('/api/users', {
      name: 'Long Pass',
      email,
      role: 'staff',
      password: 'twelve-chars',
    });
    expect(ok.status).toBe(201);
  });
});
