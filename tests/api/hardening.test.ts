// Findings of the hardening review, each with its check: secrets kept out of the log, text
// PostgreSQL cannot store refused up front, roles refused before their input is read, every
// error in the envelope, the sign-in limit keyed on the real client, and no caching of user data.
import { Writable } from 'node:stream';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sql } from 'drizzle-orm';
import sharp from 'sharp';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { createLogger } from '../../server/logger.ts';
import { createHttpServer } from '../../server/http/server.ts';
import { makeUser, DEMO_PASSWORD } from '../../seed/factories.ts';
import { seedDemo } from '../../seed/demo.ts';
import { isCleanText } from '../../shared/contracts/text.ts';
import { trustProxySetting } from '../../server/context.ts';

let t: TestApp;
const logLines: string[] = [];
beforeAll(async () => {
  const sink = new Writable({
    write(chunk, _enc, done) {
      logLines.push(String(chunk));
      done();
    },
  });
  t = await createTestApp({ logger: createLogger('trace', sink) });
  await seedDemo(t.db, t.auth, t.services.partsIndex);
}, 120_000);
afterAll(() => t?.close());

function expectEnvelope(res: request.Response, status: number, code?: string) {
  expect(res.status).toBe(status);
  expect(res.headers['content-type']).toMatch(/json/);
  expect(res.body).toEqual({ error: expect.objectContaining({ code: code ?? expect.any(String), message: expect.any(String) }), requestId: expect.any(String) });
}

describe('the log', () => {
  it('holds no session token, cookie or password, even on 403 and 500 lines', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'installer' });
    const agent = request.agent(t.app);
    // The auth library's own lines (a wrong password) go to the same redacted log.
    await agent.post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: u.email, password: 'not-the-password' }).expect(401);
    const signIn = await agent.post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: u.email, password: DEMO_PASSWORD }).expect(200);
    const cookie = String(signIn.headers['set-cookie']);
    const token = /session_token=([^;]+)/.exec(cookie)![1]!;
    const rawToken = decodeURIComponent(token).split('.')[0]!;
    // A 403 (an installer on the admin routes), with a bearer header and a token in the address too.
    await agent.get('/api/admin/users?token=reset-secret-123').set('authorization', `Bearer ${rawToken}`).expect(403);
    // A 500: the makers table is gone for a moment, so the query fails (its message carries the query).
    await t.db.execute(sql`alter table makers rename to makers_away`);
    try {
      await agent.get('/api/makers').expect(500);
    } finally {
      await t.db.execute(sql`alter table makers_away rename to makers`);
    }
    const log = logLines.join('');
    // The lines are there (so the check below means something) …
    expect(log).toMatch(/"statusCode":403/);
    expect(log).toMatch(/"statusCode":500/);
    expect(log).toMatch(/makers/);
    expect(log).toMatch(/"from":"auth".*Invalid password/);
    // … and no secret is.
    expect(log).not.toContain(rawToken);
    expect(log).not.toContain(token);
    expect(log).not.toContain('reset-secret-123');
    expect(log).not.toContain(DEMO_PASSWORD);
    expect(log).not.toContain('not-the-password');
    expect(log).toContain('[Redacted]');
  });
});

describe('text PostgreSQL cannot store', () => {
  it('is told apart from right-to-left text and emoji (common practice: WHATWG "scalar value string")', () => {
    expect(isCleanText('مرحبا 🔋 👩‍🔧 Ünïcödé')).toBe(true);
    expect(isCleanText('a\u0000b')).toBe(false);
    expect(isCleanText('\ud800')).toBe(false);
    expect(isCleanText('x\udfffy')).toBe(false);
    expect(isCleanText('\udc00\ud800')).toBe(false);
    expect(isCleanText('\ud83d\udd0b')).toBe(true); // 🔋 as its surrogate pair
  });

  it('is refused with 400 in bodies, queries and path parameters, for every role that may call the route', async () => {
    const installer = await t.signIn('installer');
    const purchasing = await t.signIn('purchasing');
    const admin = await t.signIn('admin');
    expectEnvelope(await installer.post('/api/stack-plans').send('{"rangeId":"a\\u0000b","modules":3}').set('content-type', 'application/json'), 400, 'validation_failed');
    expectEnvelope(await installer.post('/api/stack-plans').send('{"rangeId":"\\ud800x","modules":3}').set('content-type', 'application/json'), 400, 'validation_failed');
    expectEnvelope(await installer.get('/api/parts/a%00b'), 400, 'validation_failed');
    expectEnvelope(await installer.get('/api/ranges/%00'), 400, 'validation_failed');
    expectEnvelope(await installer.get('/api/ranges/%ED%A0%80'), 400);
    expectEnvelope(await installer.get('/api/parts?q=a%00b'), 400, 'validation_failed');
    expectEnvelope(await installer.get('/api/stack-plans/saved/a%00b'), 400, 'validation_failed');
    expectEnvelope(await purchasing.post('/api/parts').send('{"name":"a\\u0000b"}').set('content-type', 'application/json'), 400, 'validation_failed');
    expectEnvelope(await admin.get('/api/admin/users?q=%00'), 400, 'validation_failed');
    expectEnvelope(await admin.post('/api/admin/users').send('{"name":"\\udfff","email":"x@example.test","role":"sales","password":"long-enough-pw"}').set('content-type', 'application/json'), 400, 'validation_failed');
  });
});

describe('authorization comes before validation', () => {
  it('answers 403, not a list of field errors, to a role that may not use the route', async () => {
    const warehouse = await t.signIn('warehouse');
    const sales = await t.signIn('sales');
    const installer = await t.signIn('installer');
    expectEnvelope(await warehouse.post('/api/parts').send({}), 403, 'forbidden');
    expectEnvelope(await sales.post('/api/admin/users').send({}), 403, 'forbidden');
    expectEnvelope(await installer.put('/api/ranges/anything').send({}), 403, 'forbidden');
    expectEnvelope(await installer.get('/api/customers?page=-1'), 403, 'forbidden');
  });
});

describe('every error in the envelope', () => {
  it('wraps the auth library’s own errors', async () => {
    const wrong = await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'nobody@example.test', password: 'wrong-password' });
    expectEnvelope(wrong, 401, 'invalid_email_or_password');
    expectEnvelope(await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'not-an-email', password: 1 }), 400);
    expectEnvelope(await request(t.app).get('/api/auth/no-such-route'), 404);
    expectEnvelope(await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).set('content-type', 'application/json').send('{"email": '), 400);
  });

  it('answers over-long headers and queries (Node’s own 431) in the envelope', async () => {
    const server = createHttpServer(t.app).listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    const { port } = server.address() as AddressInfo;
    const get = (path: string, headers: Record<string, string> = {}) =>
      new Promise<{ status: number; body: string }>((resolve, reject) => {
        http
          .get({ host: '127.0.0.1', port, path, headers }, (res) => {
            let body = '';
            res.on('data', (c) => (body += c));
            res.on('end', () => resolve({ status: res.statusCode!, body }));
          })
          .on('error', reject);
      });
    try {
      for (const answer of [await get(`/api/parts?q=${'x'.repeat(20_000)}`), await get('/api/me', { 'x-filler': 'y'.repeat(20_000) })]) {
        expect(answer.status).toBe(431);
        expect(JSON.parse(answer.body)).toEqual({ error: { code: 'headers_too_large', message: expect.any(String) }, requestId: expect.any(String) });
      }
      // The same server still answers ordinary requests.
      expect((await get('/api/health')).status).toBe(200);
    } finally {
      server.close();
    }
  });

  it('answers unknown addresses and methods outside /api in the envelope too', async () => {
    expectEnvelope(await request(t.app).post('/no-such-page').send({}), 404, 'not_found');
    expectEnvelope(await request(t.app).delete('/api/health'), 404, 'not_found');
  });
});

describe('the sign-in rate limit', () => {
  it('cannot be dodged with X-Forwarded-For when no proxy is trusted (the default)', async () => {
    const limited = await createTestApp({ signInLimitPerMinute: 10 });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 30; i++) {
        const res = await request(limited.app)
          .post('/api/auth/sign-in/email')
          .set('origin', TEST_ORIGIN)
          .set('x-forwarded-for', `203.0.113.${i + 1}`)
          .set('x-stackyard-client-ip', `198.51.100.${i + 1}`)
          .send({ email: 'someone@example.test', password: `wrong-password-${i}` });
        statuses.push(res.status);
      }
      expect(statuses.slice(0, 10).every((s) => s === 401)).toBe(true);
      expect(statuses.slice(10).every((s) => s === 429)).toBe(true);
    } finally {
      await limited.close();
    }
  });

  it('reads TRUST_PROXY as Express expects it, trusting nobody when it is unset', () => {
    expect(trustProxySetting(undefined)).toBe(false);
    expect(trustProxySetting('')).toBe(false);
    expect(trustProxySetting('false')).toBe(false);
    expect(trustProxySetting('true')).toBe(true);
    expect(trustProxySetting('1')).toBe(1);
    expect(trustProxySetting('loopback, 10.0.0.0/8')).toBe('loopback, 10.0.0.0/8');
  });

  it('keys on the forwarded address when TRUST_PROXY names the proxy', async () => {
    const behindProxy = await createTestApp({ signInLimitPerMinute: 3, trustProxy: 'loopback' });
    try {
      const statuses: number[] = [];
      for (let i = 0; i < 6; i++) {
        const res = await request(behindProxy.app)
          .post('/api/auth/sign-in/email')
          .set('origin', TEST_ORIGIN)
          .set('x-forwarded-for', `203.0.113.${i + 1}`)
          .send({ email: 'someone@example.test', password: 'wrong-password' });
        statuses.push(res.status);
      }
      expect(statuses).toEqual([401, 401, 401, 401, 401, 401]);
    } finally {
      await behindProxy.close();
    }
  });
});

describe('caching', () => {
  it('forbids storing API answers that carry user data; stored media and the API description keep their own rules', async () => {
    const agent = await t.signIn('purchasing');
    for (const path of ['/api/me', '/api/parts', '/api/stack-plans/saved', '/api/no-such-route']) {
      expect((await agent.get(path)).headers['cache-control'], path).toBe('no-store');
    }
    expect((await request(t.app).get('/api/me')).headers['cache-control']).toBe('no-store'); // the 401
    expect((await agent.get('/api/auth/get-session').expect(200)).headers['cache-control']).toBe('no-store');
    expect((await agent.post('/api/parts').send({})).headers['cache-control']).toBe('no-store');
    expect((await request(t.app).get('/api/openapi.json')).headers['cache-control']).toBe('no-cache');

    const { rows } = await t.db.execute<{ sku: string }>(sql`select sku from parts order by sku limit 1`);
    const png = await sharp({ create: { width: 8, height: 8, channels: 3, background: '#123456' } }).png().toBuffer();
    const media = await agent.post(`/api/parts/${rows[0]!.sku}/media`).attach('file', png, 'p.png').expect(201);
    expect((await agent.get(media.body.data.url).expect(200)).headers['cache-control']).toBe('private, max-age=31536000, immutable');
  });
});
