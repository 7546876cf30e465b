// E-mail end to end: the outbox row is written with the business change, the pg-boss queue sends it
// through nodemailer to the SMTP stand-in, which parses it with mailparser and keeps it in PostgreSQL.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { eq, sql } from 'drizzle-orm';
import { createTestApp, type TestApp, type TestMail } from '../support/app.ts';
import { makeCompany, makeStockPart, makeSupplier, makeWarehouse, makeUser, putStock, DEMO_PASSWORD } from '../../seed/factories.ts';
import { jobs, mailOutbox, stockLimits } from '../../server/db/schema/index.ts';
import { enqueueMail } from '../../server/services/mail.ts';
import { TEST_ORIGIN } from '../support/app.ts';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let t: TestApp;
let mail: TestMail;
let installer: Agent;
let sales: Agent;
let admin: Agent;
let company: { id: string; name: string };
let warehouse: { id: string };
let seq = 0;
const ref = () => `MAIL-${++seq}`;

beforeAll(async () => {
  t = await createTestApp();
  mail = await t.startMail({ retryLimit: 2, retryDelaySeconds: 1 });
  warehouse = await makeWarehouse(t.db, { code: 'MWH', rank: 0 });
  company = await makeCompany(t.db, { name: 'Ironbark Sparks' });
  admin = await t.signIn('admin');
  sales = await t.signIn('sales');
  installer = await t.signIn('installer', { companyId: company.id, email: 'ops@ironbark.test' });
}, 60_000);
afterAll(() => t.close());

type Received = { envelope_to: string[]; subject: string; text: string; html: string | null; raw: string };
async function inbox(to: string): Promise<Received[]> {
  const { rows } = await t.db.execute<Received>(sql`select envelope_to, subject, text, html, raw from standin_mailbox where ${to} = any(envelope_to) order by received_at`);
  return rows;
}

async function part(qty: number, price = 12_500) {
  const p = await makeStockPart(t.db, { listPriceCents: price });
  if (qty > 0) await putStock(t.db, p.id, warehouse.id, 'M-1', qty);
  return p;
}

async function order(lines: { sku: string; qty: number }[], agent: Agent = installer) {
  const created = await agent.post('/api/jobs').send({ reference: ref(), lines });
  expect(created.status, created.text).toBe(201);
  const ordered = await agent.post(`/api/jobs/${created.body.data.id}/order`);
  expect(ordered.status, ordered.text).toBe(200);
  return ordered.body.data as { id: string; reference: string };
}

describe('messages about a job', () => {
  it('ordering sends “order received” to the company’s users, with the lines and the total inc GST', async () => {
    const p = await part(10, 12_500);
    const job = await order([{ sku: p.sku, qty: 2 }]);
    await mail.settled();
    const got = (await inbox('ops@ironbark.test')).filter((m) => m.subject.includes(job.reference));
    expect(got).toHaveLength(1);
    expect(got[0]!.subject).toBe(`We have your order ${job.reference}`);
    expect(got[0]!.text).toContain(`2 × ${p.sku}`);
    // 2 × $125.00 = $250.00 ex GST; GST 10 % = $25.00; $275.00 inc GST (GST Act s 9-70, worked by hand).
    expect(got[0]!.text).toContain('Total inc GST: $275.00');
    expect(got[0]!.html).toContain(p.sku);
    expect(got[0]!.raw).toMatch(/X-Stackyard-Event: order-received/i);
    expect(got[0]!.text).toContain(`${TEST_ORIGIN}/jobs/${job.id}`);
  });

  it('an order with an unpriced line says its total covers the priced lines only', async () => {
    const priced = await part(10, 12_500);
    const unpriced = await makeStockPart(t.db, { listPriceCents: null });
    const job = await order([{ sku: priced.sku, qty: 1 }, { sku: unpriced.sku, qty: 1 }]);
    await mail.settled();
    const [got] = (await inbox('ops@ironbark.test')).filter((m) => m.subject.includes(job.reference));
    // $125.00 + 10 % GST = $137.50 (GST Act s 9-70, by hand); the unpriced line is not in it and the text says so.
    expect(got!.text).toContain('Total inc GST of the priced lines: $137.50; the trade desk will price the other line.');
    expect(got!.html).toContain('the trade desk will price the other line');
  });

  it('reserving with a short line sends the backorders: which lines and how many', async () => {
    const scarce = await part(1);
    const plenty = await part(20);
    const job = await order([{ sku: scarce.sku, qty: 3 }, { sku: plenty.sku, qty: 1 }]);
    const reserved = await sales.post(`/api/jobs/${job.id}/reserve`);
    expect(reserved.status, reserved.text).toBe(200);
    expect(reserved.body.data.status).toBe('part-reserved');
    await mail.settled();
    const got = (await inbox('ops@ironbark.test')).filter((m) => m.subject === `${job.reference}: some parts are on backorder`);
    expect(got).toHaveLength(1);
    expect(got[0]!.text).toContain(`2 × ${scarce.sku}`);
    expect(got[0]!.text).not.toContain(plenty.sku);
    expect(got[0]!.text).toContain('expected: date to come');
  });

  it('says when a backordered part is expected: the soonest open purchase order still owing it', async () => {
    const scarce = await part(0);
    const supplier = await makeSupplier(t.db, { code: `EXP-${++seq}`, leadTimeDays: 10 });
    // One order sent with an expected date (12 Jan 2027), a later one without (sent + 10 days lead time).
    const { rows: [po] } = await t.db.execute<{ id: string }>(sql`insert into purchase_orders (number, supplier_id, warehouse_id, status, sent_at, expected_at) values (${`PO-EXP-${seq}`}, ${supplier.id}, ${warehouse.id}, 'sent', '2027-01-02T00:00:00Z', '2027-01-12T00:00:00Z') returning id`);
    const { rows: [later] } = await t.db.execute<{ id: string }>(sql`insert into purchase_orders (number, supplier_id, warehouse_id, status, sent_at) values (${`PO-EXP-${seq}b`}, ${supplier.id}, ${warehouse.id}, 'sent', '2027-01-20T00:00:00Z') returning id`);
    for (const o of [po!, later!]) await t.db.execute(sql`insert into purchase_order_lines (purchase_order_id, line_no, part_id, supplier_sku, qty, unit_cost_cents) values (${o.id}, 1, ${scarce.id}, 'X-1', 5, 100)`);
    const job = await order([{ sku: scarce.sku, qty: 2 }]);
    expect((await sales.post(`/api/jobs/${job.id}/reserve`)).status).toBe(200);
    await mail.settled();
    const got = (await inbox('ops@ironbark.test')).filter((m) => m.subject === `${job.reference}: some parts are on backorder`);
    expect(got).toHaveLength(1);
    // en-AU date in Melbourne time (CLDR, Node's ICU data): 12 Jan 2027 11:00 AEDT.
    expect(got[0]!.text).toContain('expected: 12 Jan 2027');
  });

  it('ready for collection and dispatched go out when the status changes (the warehouse calls the hook)', async () => {
    const p = await part(5);
    const job = await order([{ sku: p.sku, qty: 1 }]);
    await t.db.transaction(async (tx) => {
      await tx.update(jobs).set({ status: 'ready' }).where(eq(jobs.id, job.id));
      await t.services.mail.jobStatusChanged(tx, job.id, 'ready', { place: 'the Northside trade counter' });
    });
    await t.db.transaction((tx) => t.services.mail.jobStatusChanged(tx, job.id, 'dispatched', { carrier: 'Tasman Freight', trackingRef: 'TF-001' }));
    await t.db.transaction((tx) => t.services.mail.jobStatusChanged(tx, job.id, 'picking'));
    await mail.settled();
    const got = (await inbox('ops@ironbark.test')).filter((m) => m.subject.startsWith(job.reference));
    expect(got.map((m) => m.subject)).toEqual([`${job.reference} is packed and ready to collect`, `${job.reference} is on its way`]);
    expect(got[0]!.text).toContain('at the Northside trade counter');
    expect(got[1]!.text).toContain('Tasman Freight, reference TF-001');
  });

  it('an order that is refused writes no message (the outbox row rolls back with it)', async () => {
    const before = await t.db.select().from(mailOutbox);
    const created = await installer.post('/api/jobs').send({ reference: ref(), lines: [{ sku: (await part(3)).sku, qty: 1 }] });
    await installer.post(`/api/jobs/${created.body.data.id}/order`).expect(200);
    const again = await installer.post(`/api/jobs/${created.body.data.id}/order`);
    expect(again.status).toBe(409);
    const after = await t.db.select().from(mailOutbox);
    expect(after.length - before.length).toBe(1); // the first order's message only
  });
});

describe('messages for the wholesaler’s own people', () => {
  it('the purchase order and price-list hooks send their templates to whom the caller names', async () => {
    await t.db.transaction((tx) =>
      enqueueMail(tx, {
        event: 'purchase-order',
        to: 'orders@coastal-cells.test',
        data: { supplierName: 'Coastal Cells', poNumber: 'PO-000123', lines: [{ sku: 'QRB-MOD-5', name: 'Module 5 kWh', qty: 4, supplierSku: 'CC-5K', unitCostCents: 180_000 }], deliverTo: 'Lowtide Battery Wholesale, Northside', expectedBy: '10 Dec 2026', buyerName: 'Pat Purchasing' },
      }),
    );
    await t.db.transaction((tx) => enqueueMail(tx, { event: 'price-list-applied', to: 'buyer@stackyard.test', data: { supplierName: 'Coastal Cells', fileName: 'coastal-2026-12.csv', added: 3, changed: 12, unchanged: 40, missing: 1, appliedBy: 'Pat Purchasing', url: `${TEST_ORIGIN}/purchasing` } }));
    await mail.settled();
    const [po] = await inbox('orders@coastal-cells.test');
    expect(po!.subject).toBe('Purchase order PO-000123 from Lowtide Battery Wholesale');
    expect(po!.text).toContain('4 × CC-5K');
    expect(po!.text).toContain('$1,800.00');
    const [pl] = await inbox('buyer@stackyard.test');
    expect(pl!.text).toContain('3 new, 12 changed, 40 unchanged, 1 no longer listed');
  });

  it('the daily low-stock digest lists parts at or below their minimum, to purchasing only', async () => {
    const buyer = await t.signIn('purchasing', { email: 'buyer2@stackyard.test' });
    expect(buyer.userId).toBeTruthy();
    const low = await part(2);
    const fine = await part(50);
    await t.db.insert(stockLimits).values([
      { partId: low.id, minQty: 5, maxQty: 20 },
      { partId: fine.id, minQty: 5, maxQty: 80 },
    ]);
    await t.services.mail.lowStockDigest(new Date('2026-12-03T20:00:00Z'));
    await mail.settled();
    const [digest] = await inbox('buyer2@stackyard.test');
    expect(digest!.subject).toMatch(/^Low stock on 4 Dec 2026: 1 part at or below reorder level$/);
    expect(digest!.text).toContain(`${low.sku}`);
    expect(digest!.text).toContain('available 2, reorder at 5');
    expect(digest!.text).not.toContain(fine.sku);
    // The same parts the low-stock page lists (one query for both).
    const page = (await admin.get('/api/stock/low').expect(200)).body.data as { sku: string }[];
    expect(page.map((r) => r.sku)).toContain(low.sku);
    expect(page.map((r) => r.sku)).not.toContain(fine.sku);
    expect(await inbox('ops@ironbark.test').then((m) => m.filter((x) => x.subject.startsWith('Low stock')))).toEqual([]);
  });
});

describe('invitations and password resets (the auth library’s own hooks)', () => {
  it('a user added by an admin is invited to choose a password; the link’s token sets it', async () => {
    const res = await admin.post('/api/admin/users').send({ name: 'Kit Marlow', email: 'kit@ironbark.test', role: 'installer', companyId: company.id, password: 'temporary-pass-1' });
    expect(res.status, res.text).toBe(201);
    await mail.settled();
    const [invite] = await inbox('kit@ironbark.test');
    expect(invite!.subject).toMatch(/has added you to Ironbark Sparks on Stackyard$/);
    const link = /(http\S+\/api\/auth\/reset-password\/(\w+)\S*)/.exec(invite!.text);
    expect(link).not.toBeNull();
    const token = link![2]!;
    const reset = await request(t.app).post('/api/auth/reset-password').set('origin', TEST_ORIGIN).send({ newPassword: 'chosen-by-kit-1', token });
    expect(reset.status, reset.text).toBe(200);
    const signIn = await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'kit@ironbark.test', password: 'chosen-by-kit-1' });
    expect(signIn.status).toBe(200);
  });

  it('“forgot my password” sends a reset link to a known address only', async () => {
    const u = await makeUser(t.db, t.auth, { role: 'installer', companyId: company.id, email: 'forgetful@ironbark.test' });
    expect(u.email).toBe('forgetful@ironbark.test');
    for (const email of ['forgetful@ironbark.test', 'nobody@ironbark.test']) {
      const res = await request(t.app).post('/api/auth/request-password-reset').set('origin', TEST_ORIGIN).send({ email, redirectTo: `${TEST_ORIGIN}/reset-password` });
      expect(res.status, res.text).toBe(200);
    }
    await mail.settled();
    const [reset] = await inbox('forgetful@ironbark.test');
    expect(reset!.subject).toBe('Choose a new Stackyard password');
    expect(await inbox('nobody@ironbark.test')).toEqual([]);
    // The old password still works until the link is used.
    expect((await request(t.app).post('/api/auth/sign-in/email').set('origin', TEST_ORIGIN).send({ email: 'forgetful@ironbark.test', password: DEMO_PASSWORD })).status).toBe(200);
  });
});

describe('a failing SMTP server', () => {
  // A company with one user, so each order makes exactly one message.
  let solo: Agent;
  beforeAll(async () => {
    solo = await t.signIn('installer', { companyId: (await makeCompany(t.db, { name: 'Lone Gum Solar' })).id, email: 'solo@lonegum.test' });
  });

  it('is retried until it takes the message, and the order stands meanwhile', async () => {
    mail.standin.refuseNext(2);
    const p = await part(4);
    const job = await order([{ sku: p.sku, qty: 1 }], solo);
    const [row] = await t.db.select().from(mailOutbox).where(sql`${mailOutbox.refs}->>'jobId' = ${job.id}`);
    expect(row!.status).not.toBe('sent'); // the order answered before any attempt succeeded
    await mail.settled(30_000);
    const [sent] = await t.db.select().from(mailOutbox).where(eq(mailOutbox.id, row!.id));
    expect(sent!.status).toBe('sent');
    expect(sent!.attempts).toBe(3);
    expect((await inbox('solo@lonegum.test')).filter((m) => m.subject.includes(job.reference))).toHaveLength(1);
    const [stored] = await t.db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, job.id));
    expect(stored!.status).toBe('ordered');
  }, 40_000);

  it('gives up after its last attempt: the message is marked failed, the order is untouched', async () => {
    mail.standin.refuseNext(10);
    const p = await part(4);
    const job = await order([{ sku: p.sku, qty: 1 }], solo);
    await mail.settled(30_000);
    const [row] = await t.db.select().from(mailOutbox).where(sql`${mailOutbox.refs}->>'jobId' = ${job.id}`);
    expect(row!.status).toBe('failed');
    expect(row!.attempts).toBe(3); // the first try and retryLimit (2) retries
    expect(row!.lastError).toMatch(/451|try again/i);
    mail.standin.refuseNext(0);
    const [stored] = await t.db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, job.id));
    expect(stored!.status).toBe('ordered');
  }, 40_000);
});

describe('the sweep for stranded messages', () => {
  it('takes up a message a dead sender left, by its last attempt, and leaves an old one a sender took up just now', async () => {
    const hoursAgo = (h: number) => new Date(Date.now() - h * 3_600_000);
    const base = { event: 'order-received' as const, subject: 'Sweep check', text: 'x', html: '<p>x</p>' };
    const [dead, busy, waiting] = await t.db
      .insert(mailOutbox)
      .values([
        { ...base, to: 'dead@sweep.test', status: 'sending', createdAt: hoursAgo(5), attemptedAt: hoursAgo(3) },
        { ...base, to: 'busy@sweep.test', status: 'sending', createdAt: hoursAgo(5), attemptedAt: new Date() },
        { ...base, to: 'waiting@sweep.test', status: 'queued', createdAt: hoursAgo(1) },
      ])
      .returning({ id: mailOutbox.id });
    const found = await t.services.mail.stranded(new Date(Date.now() - 60_000));
    // From memory of the failure it guards against: a message queued hours ago and picked up a
    // moment ago was swept by its age and sent twice.
    expect(found).toEqual(expect.arrayContaining([dead!.id, waiting!.id]));
    expect(found).not.toContain(busy!.id);
    const [still] = await t.db.select({ status: mailOutbox.status }).from(mailOutbox).where(eq(mailOutbox.id, busy!.id));
    expect(still!.status).toBe('sending');
    await t.db.delete(mailOutbox).where(sql`${mailOutbox.to} like '%@sweep.test'`);
  });
});

describe('the outbox API', () => {
  it('admins list messages newest first, filter by recipient and read both parts', async () => {
    const list = await admin.get('/api/admin/outbox?to=ironbark');
    expect(list.status, list.text).toBe(200);
    expect(list.body.total).toBeGreaterThan(3);
    expect(list.body.data.every((m: { to: string }) => m.to.includes('ironbark'))).toBe(true);
    const first = list.body.data[0];
    expect(Object.keys(first).sort()).toEqual(['createdAt', 'event', 'id', 'sentAt', 'status', 'subject', 'to']);
    const one = await admin.get(`/api/admin/outbox/${first.id}`);
    expect(one.status).toBe(200);
    expect(one.body.data.html).toContain('<html');
    expect(one.body.data.text.length).toBeGreaterThan(20);
    expect((await admin.get('/api/admin/outbox?to=no-such-recipient')).body).toEqual({ data: [], total: 0 });
  });

  it('401 without a session, 403 for every other role, 404 for an unknown message, 400 on a bad page', async () => {
    expect((await request(t.app).get('/api/admin/outbox')).status).toBe(401);
    expect((await request(t.app).get('/api/admin/outbox/00000000-0000-0000-0000-000000000000')).status).toBe(401);
    for (const agent of [installer, sales]) {
      expect((await agent.get('/api/admin/outbox')).status).toBe(403);
      expect((await agent.get('/api/admin/outbox/00000000-0000-0000-0000-000000000000')).status).toBe(403);
    }
    const missing = await admin.get('/api/admin/outbox/00000000-0000-0000-0000-000000000000');
    expect(missing.status).toBe(404);
    expect(missing.body.error.code).toBe('not_found');
    expect((await admin.get('/api/admin/outbox/not-a-uuid')).status).toBe(404);
    const bad = await admin.get('/api/admin/outbox?page=0');
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
  });
});
