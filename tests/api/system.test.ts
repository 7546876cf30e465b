import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import pg from 'pg';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';

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

  it('set security headers and a request id', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-security-policy']).toMatch(/default-src 'self'/);
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
    expect(res.headers['x-powered-by']).toBeUndefined();
  });
});
