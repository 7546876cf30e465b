import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { DEMO_PASSWORD, makeUser } from '../../seed/factories.ts';
import { ROLES } from '../../shared/roles.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const signIn = (email: string, password: string) =>
  request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email, password });

describe('sign-in', () => {
  it('accepts the right password and sets an httpOnly session cookie', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'sales' });
    const res = await signIn(u.email, DEMO_PASSWORD);
    expect(res.status).toBe(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/session_token=/);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
  });

  it('refuses a wrong password with 401', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'sales' });
    const res = await signIn(u.email, 'not-the-password');
    expect(res.status).toBe(401);
  });

  it('refuses an unknown user with 401', async () => {
    const res = await signIn('nobody@example.test', DEMO_PASSWORD);
    expect(res.status).toBe(401);
  });

  it('offers no self sign-up', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-up/email')
      .set('origin', TEST_ORIGIN)
      .send({ email: 'new@example.test', password: 'long-enough-password', name: 'New' });
    expect(res.status).toBeGreaterThanOrEqual(400);
    const me = await signIn('new@example.test', 'long-enough-password');
    expect(me.status).toBe(401);
  });

  it('refuses sign-in from an untrusted origin', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'sales' });
    const res = await request(t.app).post('/api/auth/sign-in/email').set('origin', 'https://evil.example').send({ email: u.email, password: DEMO_PASSWORD });
    expect(res.status).toBe(403);
  });

  it('signs out, and sign-out everywhere ends other sessions', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'warehouse' });
    const a = request.agent(t.app);
    const b = request.agent(t.app);
    await a.post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: u.email, password: DEMO_PASSWORD }).expect(200);
    await b.post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: u.email, password: DEMO_PASSWORD }).expect(200);
    await a.get('/api/me').expect(200);
    await b.get('/api/me').expect(200);
    await a.post('/api/auth/revoke-sessions').set('origin', TEST_ORIGIN).send({}).expect(200);
    await a.get('/api/me').expect(401);
    await b.get('/api/me').expect(401);
  });
});

describe('sign-in rate limit', () => {
  it('answers 429 after too many attempts in a minute', async () => {
    const limited = await createTestApp({ signInLimitPerMinute: 3 });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 5; i++) {
        const res = await request(limited.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'x@example.test', password: 'wrong-password' });
        statuses.push(res.status);
      }
      expect(statuses.slice(0, 3)).toEqual([401, 401, 401]);
      expect(statuses.slice(3)).toEqual([429, 429]);
    } finally {
      await limited.close();
    }
  });
});

describe('/api/me', () => {
  it('answers 401 with the error envelope without a session', async () => {
    const res = await request(t.app).get('/api/me');
    expect(res.status).toBe(401);
    expect(res.body).toMatchObject({ error: { code: 'unauthenticated' } });
    expect(typeof res.body.requestId).toBe('string');
  });

  it.each(ROLES)('tells a %s who they are, their company and abilities', async (role) => {
    const agent = await t.signIn(role);
    const res = await agent.get('/api/me');
    expect(res.status).toBe(200);
    expect(res.body.data.role).toBe(role);
    expect(res.body.data.company.kind).toBe(role === 'installer' ? 'installer' : 'wholesaler');
    expect(res.body.data.abilities.includes('users.manage')).toBe(role === 'admin');
    expect(res.body.data.abilities.includes('costs.view')).toBe(['admin', 'purchasing', 'sales'].includes(role));
  });
});
