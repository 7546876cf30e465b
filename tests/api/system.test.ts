import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import pg from 'pg';
import { sql } from 'drizzle-orm';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { startPgProxy } from '../support/pg-proxy.ts';
import { seedDemo } from '../../seed/demo.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('system routes', () => {
  it('report health of the database and search', async () => {
    const res = await request(t.app).get('/api/health').expect(200);
    expect(res.body).toEqual({ status: 'ok', db: 'up', search: 'up' });
  });

  it('serve an OpenAPI 3.1 document listing the routes', async () => {
    const res = await request(t.app).get('/api/openapi.json').expect(200);
    expect(res.body.openapi).toBe('3.1.0');
    expect(Object.keys(res.body.paths)).toEqual(expect.arrayContaining(['/api/health', '/api/me', '/api/admin/users', '/api/admin/users/{id}']));
    expect(res.body.paths['/api/admin/users'].post.requestBody).toBeTruthy();
  });

  it('answer unknown API paths with a 404 envelope, not the client page', async () => {
    const res = await request(t.app).get('/api/no-such-thing');
    expect(res.status).toBe(404);
    expect(res.headers['content-type']).toMatch(/json/);
    expect(res.body.error.code).toBe('not_found');
  });

  it('answer malformed JSON with a 400 envelope', async () => {
    const agent = await t.signIn('admin');
    const res = await agent.post('/api/admin/users').set('content-type', 'application/json').send('{"name": ');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('malformed_json');
    expect(res.text).not.toMatch(/at .*\.ts:\d+/);
  });

  it('answer an oversized body with 413', async () => {
    const agent = await t.signIn('admin');
    const res = await agent.post('/api/admin/users').send({ name: 'x'.repeat(2_000_000) });
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe('body_too_large');
  });

  it('refuse state-changing requests from another site', async () => {
    const agent = await t.signIn('admin');
    const res = await agent.post('/api/admin/users').set('origin', 'https://evil.example').send({});
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
    const ok = await agent.post('/api/admin/users').set('origin', TEST_ORIGIN).send({});
    expect(ok.status).toBe(400);
  });

  it('recover when the database drops every connection (as on a restart)', async () => {
    const agent = await t.signIn('sales');
    await agent.get('/api/me').expect(200);
    const name = new URL(t.dbUrl).pathname.slice(1);
    const admin = new pg.Client({ connectionString: process.env.TEST_PG_URL });
    await admin.connect();
    await admin.query('select pg_terminate_backend(pid) from pg_stat_activity where datname = $1', [name]);
    await admin.end();
    // The first requests may find dead connections and fail cleanly; then the pool reconnects.
    const first = await request(t.app).get('/api/health');
    expect([200, 503]).toContain(first.status);
    if (first.status === 503) expect(first.body.db).toBe('down');
    await expect.poll(async () => (await request(t.app).get('/api/health')).status, { timeout: 5000 }).toBe(200);
    await new Promise((r) => setTimeout(r, 3100)); // past the remembered session
    await agent.get('/api/me').expect(200);
  });

  it('answer clean 503s while PostgreSQL restarts under load, and recover by themselves', async () => {
    const proxy = await startPgProxy(new URL(process.env.TEST_PG_URL!));
    const flaky = await createTestApp({ connectVia: proxy.via });
    try {
      const agents = await Promise.all([flaky.signIn('sales'), flaky.signIn('installer'), flaky.signIn('purchasing')]);
      const seen: { status: number; code?: string; db?: string; during: boolean }[] = [];
      let outage = false;
      let flowing = true;
      // Clients keep asking for things that need the database, the whole time.
      const clients = agents.flatMap((agent) =>
        ['/api/makers', '/api/stack-plans/saved', '/api/health'].map(async (path) => {
          while (flowing) {
            const res = await agent.get(path);
            seen.push({ status: res.status, code: res.body?.error?.code, db: res.body?.db, during: outage });
            await new Promise((r) => setTimeout(r, 20));
          }
        }),
      );
      await new Promise((r) => setTimeout(r, 300));
      outage = true;
      await proxy.down();
      await new Promise((r) => setTimeout(r, 1_500));
      await proxy.up();
      outage = false;
      // Back by itself: health says so, and the same clients are answered again.
      await expect.poll(async () => (await request(flaky.app).get('/api/health')).body, { timeout: 15_000 }).toEqual({ status: 'ok', db: 'up', search: 'up' });
      await new Promise((r) => setTimeout(r, 500));
      flowing = false;
      await Promise.all(clients);

      const bad = seen.filter((r) => r.status !== 200 && !(r.status === 503 && (r.code === 'database_unavailable' || r.db === 'down')));
      expect(bad).toEqual([]); // only 200s and clean 503s
      expect(seen.filter((r) => r.during && r.status === 503).length).toBeGreaterThan(0);
      for (const agent of agents) await agent.get('/api/makers').expect(200);
    } finally {
      await flaky.close();
      await proxy.close();
    }
  }, 60_000);

  it('keep planning and everything else working while the search engine is down; the catalogue says so', async () => {
    const noSearch = await createTestApp();
    try {
      await seedDemo(noSearch.db, noSearch.auth, noSearch.services.partsIndex);
      const installer = await noSearch.signIn('installer');
      const purchasing = await noSearch.signIn('purchasing');
      const { rows } = await noSearch.db.execute<{ id: string; sku: string }>(sql`select r.id, p.sku from ranges r join parts p on p.id = r.module_id order by r.code limit 1`);
      const { id: rangeId, sku } = rows[0]!;
      await noSearch.stopSearch();

      const catalogue = await installer.get('/api/parts').query({ q: 'module' });
      expect(catalogue.status).toBe(503);
      expect(catalogue.body.error).toMatchObject({ code: 'search_unavailable', message: expect.stringMatching(/search is not reachable/i) });
      expect((await request(noSearch.app).get('/api/health').expect(200)).body).toEqual({ status: 'degraded', db: 'up', search: 'down' });

      await installer.get('/api/me').expect(200);
      const plan = await installer.post('/api/stack-plans').send({ rangeId, modules: 3 }).expect(200);
      expect(plan.body.data.bom.length).toBeGreaterThan(0);
      await installer.post('/api/stack-plans/saved').send({ name: 'Search is down', request: { rangeId, modules: 3 } }).expect(201);
      await installer.get('/api/stack-plans/saved').expect(200);
      await installer.get(`/api/ranges/${rangeId}`).expect(200);
      await installer.get(`/api/parts/${encodeURIComponent(sku)}`).expect(200);
      await purchasing.get('/api/makers').expect(200);
      await purchasing.get('/api/customers').expect(200);
    } finally {
      await noSearch.close();
    }
  }, 60_000);

  it('set security headers and a request id', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
