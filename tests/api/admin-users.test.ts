import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { eq, sql as drizzleSql } from 'drizzle-orm';
import { makeCompany, wholesaler } from '../../seed/factories.ts';
import { user } from '../../server/db/schema/index.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const NOT_ADMIN = ['purchasing', 'warehouse', 'sales', 'installer'] as const;

describe('admin user routes', () => {
  it('answer 401 without a session', async () => {
    await request(t.app).get('/api/admin/users').expect(401);
    await request(t.app).post('/api/admin/users').send({}).expect(401);
  });

  it.each(NOT_ADMIN)('answer 403 to %s', async (role) => {
    const agent = await t.signIn(role);
    const list = await agent.get('/api/admin/users');
    expect(list.status).toBe(403);
    expect(list.body.error.code).toBe('forbidden');
    const create = await agent.post('/api/admin/users').send({ name: 'X', email: 'x@example.test', role: 'admin', password: 'long-enough-pw' });
    expect(create.status).toBe(403);
    await agent.get('/api/admin/companies').expect(403);
  });

  it('create an installer in a company, who can then sign in and sees that company', async () => {
    const admin = await t.signIn('admin');
    const company = await makeCompany(t.db, { name: 'Ridgeback Electrical' });
    const res = await admin.post('/api/admin/users').send({ name: 'Jo Installer', email: 'Jo@Ridgeback.test', role: 'installer', companyId: company.id, password: 'a-good-password' });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ email: 'jo@ridgeback.test', role: 'installer', companyName: 'Ridgeback Electrical', active: true });

    const jo = request.agent(t.app);
    await jo.post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'jo@ridgeback.test', password: 'a-good-password' }).expect(200);
    const me = await jo.get('/api/me').expect(200);
    expect(me.body.data.company.name).toBe('Ridgeback Electrical');
  });

  it('refuse bad input with field-level 400s and create nothing', async () => {
    const admin = await t.signIn('admin');
    const before = (await admin.get('/api/admin/users')).body.data.length;
    const res = await admin.post('/api/admin/users').send({ name: '', email: 'not-an-email', role: 'owner', password: 'short' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const paths = res.body.error.details.fields.map((f: { path: string }) => f.path);
    expect(paths).toEqual(expect.arrayContaining(['name', 'email', 'role', 'password']));
    const noCompany = await admin.post('/api/admin/users').send({ name: 'A', email: 'a@example.test', role: 'installer', password: 'a-good-password' });
    expect(noCompany.status).toBe(400);
    expect(noCompany.body.error.details.fields[0].path).toBe('companyId');
    const staffInCustomer = await admin.post('/api/admin/users').send({ name: 'B', email: 'b@example.test', role: 'sales', companyId: (await makeCompany(t.db)).id, password: 'a-good-password' });
    expect(staffInCustomer.status).toBe(400);
    expect((await admin.get('/api/admin/users')).body.data.length).toBe(before);
  });

  it('refuse a duplicate e-mail with 409', async () => {
    const admin = await t.signIn('admin');
    const body = { name: 'Dup', email: 'dup@example.test', role: 'sales', password: 'a-good-password' };
    await admin.post('/api/admin/users').send(body).expect(201);
    const again = await admin.post('/api/admin/users').send(body);
    expect(again.status).toBe(409);
  });

  it('search users by name, e-mail or company', async () => {
    const admin = await t.signIn('admin');
    await admin.post('/api/admin/users').send({ name: 'Zanzibar Quill', email: 'zq@example.test', role: 'warehouse', password: 'a-good-password' }).expect(201);
    const res = await admin.get('/api/admin/users').query({ q: 'zanzi' });
    expect(res.body.data.map((u: { name: string }) => u.name)).toEqual(['Zanzibar Quill']);
  });

  it('deactivate a user: their session ends and sign-in is refused; reactivating lets them back', async () => {
    const admin = await t.signIn('admin');
    const victim = await t.signIn('sales', { email: 'leaving@example.test' });
    await victim.get('/api/me').expect(200);
    await admin.patch(`/api/admin/users/${victim.userId}`).send({ active: false }).expect(200);
    await victim.get('/api/me').expect(401);
    const again = await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'leaving@example.test', password: 'stackyard-demo' });
    expect(again.status).toBe(403);
    await admin.patch(`/api/admin/users/${victim.userId}`).send({ active: true }).expect(200);
    await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'leaving@example.test', password: 'stackyard-demo' }).expect(200);
  });

  it('change a role, which ends their sessions', async () => {
    const admin = await t.signIn('admin');
    const user = await t.signIn('warehouse');
    const res = await admin.patch(`/api/admin/users/${user.userId}`).send({ role: 'purchasing' });
    expect(res.body.data.role).toBe('purchasing');
    await user.get('/api/me').expect(401);
  });

  it('set a new password: the old one stops working', async () => {
    const admin = await t.signIn('admin');
    const user = await t.signIn('sales', { email: 'forgetful@example.test' });
    await admin.post(`/api/admin/users/${user.userId}/password`).send({ password: 'short' }).expect(400);
    await admin.post(`/api/admin/users/${user.userId}/password`).send({ password: 'brand-new-password' }).expect(204);
    await user.get('/api/me').expect(401);
    await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'forgetful@example.test', password: 'stackyard-demo' }).expect(401);
    await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'forgetful@example.test', password: 'brand-new-password' }).expect(200);
  });

  it('do not let an admin lock themselves out', async () => {
    const admin = await t.signIn('admin');
    const res = await admin.patch(`/api/admin/users/${admin.userId}`).send({ active: false });
    expect(res.status).toBe(409);
  });

  it('answer 404 for an unknown user', async () => {
    const admin = await t.signIn('admin');
    await admin.patch('/api/admin/users/nope').send({ name: 'x' }).expect(404);
  });

  it('list companies for the user form', async () => {
    const admin = await t.signIn('admin');
    const home = await wholesaler(t.db);
    const res = await admin.get('/api/admin/companies').expect(200);
    expect(res.body.data.some((c: { id: string; kind: string }) => c.id === home.id && c.kind === 'wholesaler')).toBe(true);
  });
});

describe('the company rule for users', () => {
  it('moves a user to a staff role in the wholesaler, and an installer only into a customer company', async () => {
    const admin = await t.signIn('admin');
    const installer = await t.signIn('installer');
    const home = await wholesaler(t.db);
    const toSales = await admin.patch(`/api/admin/users/${installer.userId}`).send({ role: 'sales' });
    expect(toSales.status).toBe(200);
    expect(toSales.body.data).toMatchObject({ role: 'sales', companyId: home.id });
    const backWithout = await admin.patch(`/api/admin/users/${installer.userId}`).send({ role: 'installer' });
    expect(backWithout.status).toBe(400);
    expect(backWithout.body.error.details.fields[0].path).toBe('companyId');
    const customer = await makeCompany(t.db);
    const back = await admin.patch(`/api/admin/users/${installer.userId}`).send({ role: 'installer', companyId: customer.id });
    expect(back.body.data).toMatchObject({ role: 'installer', companyId: customer.id });
  });

  it('keeps the auth library’s own admin routes closed, so they cannot bypass the rule', async () => {
    const admin = await t.signIn('admin');
    const installer = await t.signIn('installer');
    const attempts: [string, Record<string, unknown>][] = [
      ['set-role', { userId: installer.userId, role: 'sales' }],
      ['create-user', { email: 'nocompany@example.test', password: 'a-good-password', name: 'No Company', role: 'installer' }],
      ['update-user', { userId: installer.userId, data: { role: 'admin' } }],
      ['ban-user', { userId: installer.userId }],
      ['set-user-password', { userId: installer.userId, newPassword: 'a-good-password' }],
      ['impersonate-user', { userId: installer.userId }],
      ['remove-user', { userId: installer.userId }],
    ];
    for (const [path, body] of attempts) {
      for (const spelling of [`/api/auth/admin/${path}`, `/api/auth/ADMIN/${path}`, `/api/auth/admin/${path}/`]) {
        const res = await admin.post(spelling).set('origin', TEST_ORIGIN).send(body);
        expect(res.status, spelling).toBe(404);
        expect(res.body.error.code, spelling).toBe('not_found');
      }
    }
    await admin.get('/api/auth/admin/list-users').expect(404);
    const [row] = await t.db.select().from(user).where(eq(user.id, installer.userId));
    expect(row).toMatchObject({ role: 'installer', companyId: installer.companyId, banned: false });
    expect(await t.db.select().from(user).where(eq(user.email, 'nocompany@example.test'))).toEqual([]);
    await installer.get('/api/me').expect(200);
  });

  it('is kept by the database too: staff only in the wholesaler, installers only in a customer company', async () => {
    const installer = await t.signIn('installer');
    const sales = await t.signIn('sales');
    const home = await wholesaler(t.db);
    const refused = (query: ReturnType<typeof drizzleSql>) => t.db.execute(query).then(() => null, (e: { cause?: { code?: string } }) => e.cause?.code ?? 'error');
    // 23503: the (company, kind) pair has no match; 23514: the check constraint.
    expect(await refused(drizzleSql`update "user" set role = 'sales' where id = ${installer.userId}`)).toBe('23503');
    expect(await refused(drizzleSql`update "user" set company_id = ${home.id} where id = ${installer.userId}`)).toBe('23503');
    expect(await refused(drizzleSql`update "user" set company_id = ${installer.companyId} where id = ${sales.userId}`)).toBe('23503');
    expect(await refused(drizzleSql`update "user" set company_id = null where id = ${installer.userId}`)).toBe('23514');
    expect(await refused(drizzleSql`insert into "user" (id, name, email, role) values ('x1', 'No Company', 'x1@example.test', 'installer')`)).toBe('23514');
    expect(await refused(drizzleSql`update companies set kind = 'wholesaler' where id = ${installer.companyId}`)).toBe('23503');
    const [row] = await t.db.select().from(user).where(eq(user.id, installer.userId));
    expect(row).toMatchObject({ role: 'installer', companyId: installer.companyId });
  });
});
