// Card payments through the provider's SDK against the local stand-in, the signed webhook that
// confirms them, refunds on cancelling, and the tax invoice read back from its PDF.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import Stripe from 'stripe';
import { eq, sql } from 'drizzle-orm';
import { createTestApp, TEST_WEBHOOK_SECRET, type TestApp } from '../support/app.ts';
import { makeCompany, makeStockPart, makeWarehouse, putStock } from '../../seed/factories.ts';
import { jobs, jobStatusHistory, mailOutbox, payments, paymentEvents } from '../../server/db/schema/index.ts';
import { pdfText } from '../support/pdf-text.ts';

type Agent = Awaited<ReturnType<TestApp['signIn']>>;
let t: TestApp;
let cashInstaller: Agent;
let tradeInstaller: Agent;
let otherCash: Agent;
let sales: Agent;
let warehouseAgent: Agent;
let wh: { id: string };
let seq = 0;
const ref = () => `PAY-${++seq}`;
const signer = new Stripe('sk_test_unused');

beforeAll(async () => {
  t = await createTestApp();
  wh = await makeWarehouse(t.db, { code: 'PWH', rank: 0 });
  const cash = await makeCompany(t.db, { name: 'Paperbark Power', accountType: 'cash', abn: '84 987 650 003', suburb: 'Mornington', postcode: '3931' });
  const trade = await makeCompany(t.db, { name: 'Tallowwood Trade Electrical', accountType: 'trade' });
  const cash2 = await makeCompany(t.db, { name: 'Quandong Cells', accountType: 'cash' });
  sales = await t.signIn('sales');
  [cashInstaller, tradeInstaller, otherCash, warehouseAgent] = await Promise.all([
    t.signIn('installer', { companyId: cash.id, email: 'owner@paperbark.test' }),
    t.signIn('installer', { companyId: trade.id }),
    t.signIn('installer', { companyId: cash2.id }),
    t.signIn('warehouse'),
  ]);
}, 60_000);
afterAll(() => t.close());

async function draft(agent: Agent, qty = 2, priceCents = 12_500) {
  const p = await makeStockPart(t.db, { listPriceCents: priceCents });
  await putStock(t.db, p.id, wh.id, 'P-1', 50);
  const res = await agent.post('/api/jobs').send({ reference: ref(), lines: [{ sku: p.sku, qty }] });
  expect(res.status, res.text).toBe(201);
  return { id: res.body.data.id as string, reference: res.body.data.reference as string, sku: p.sku };
}

/** The body as bytes (supertest leaves a PDF unparsed otherwise). */
const download = (req: request.Test) =>
  req.buffer(true).parse((r, cb) => {
    const chunks: Buffer[] = [];
    r.on('data', (c: Buffer) => chunks.push(c));
    r.on('end', () => cb(null, Buffer.concat(chunks)));
  });

const webhook = (payload: string, header: string) => request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').set('stripe-signature', header).send(payload);

async function snapshot(jobId: string) {
  const [job] = await t.db.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, jobId));
  const pays = await t.db.select({ status: payments.status }).from(payments).where(eq(payments.jobId, jobId));
  const history = await t.db.select().from(jobStatusHistory).where(eq(jobStatusHistory.jobId, jobId));
  const mail = await t.db.select({ id: mailOutbox.id }).from(mailOutbox).where(sql`${mailOutbox.refs}->>'jobId' = ${jobId}`);
  const events = await t.db.select().from(paymentEvents);
  return { job: job!.status, payments: pays.map((p) => p.status), history: history.length, mail: mail.length, events: events.length };
}

describe('opening a card checkout', () => {
  it('gives the checkout address for the job’s total inc GST; the order waits for the payment', async () => {
    const job = await draft(cashInstaller);
    const res = await cashInstaller.post(`/api/jobs/${job.id}/payments`);
    expect(res.status, res.text).toBe(201);
    expect(res.body.data.checkoutUrl).toMatch(new RegExp(`^${t.pay.url}/checkout/cs_test_`));
    const sessionId = res.body.data.checkoutUrl.split('/').pop();
    // 2 × $125.00 ex GST = $250.00, plus 10 % GST = $275.00 (GST Act s 9-70, worked by hand).
    expect(t.pay.session(sessionId)!.amount_total).toBe(27_500);
    expect(t.pay.session(sessionId)!.currency).toBe('aud');
    expect((await snapshot(job.id)).job).toBe('draft');
    // Asking again while it is open hands back the same checkout, so nobody pays twice.
    const again = await cashInstaller.post(`/api/jobs/${job.id}/payments`);
    expect(again.body.data).toEqual(res.body.data);
  });

  it('an installer on card terms cannot order without paying', async () => {
    const job = await draft(cashInstaller);
    const res = await cashInstaller.post(`/api/jobs/${job.id}/order`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/pays by card/);
    expect((await snapshot(job.id)).job).toBe('draft');
  });

  it('refuses a trade account (409), another company’s job (404), the wrong roles (403) and no session (401)', async () => {
    const trade = await draft(tradeInstaller);
    const tradeRes = await tradeInstaller.post(`/api/jobs/${trade.id}/payments`);
    expect(tradeRes.status).toBe(409);
    expect(tradeRes.body.error.message).toMatch(/trade account terms/);
    const mine = await draft(cashInstaller);
    const before = await snapshot(mine.id);
    const across = await otherCash.post(`/api/jobs/${mine.id}/payments`);
    expect(across.status).toBe(404);
    expect(across.body.error.code).toBe('not_found');
    expect((await warehouseAgent.post(`/api/jobs/${mine.id}/payments`)).status).toBe(403);
    expect((await request(t.app).post(`/api/jobs/${mine.id}/payments`)).status).toBe(401);
    expect((await cashInstaller.post('/api/jobs/not-a-job/payments')).status).toBe(404);
    expect(await snapshot(mine.id)).toEqual(before);
  });
});

describe('the webhook', () => {
  it('orders the job once a verified payment arrives, and only once when it arrives twice', async () => {
    const job = await draft(cashInstaller);
    const { body } = await cashInstaller.post(`/api/jobs/${job.id}/payments`).expect(201);
    const signed = await t.pay.pay(body.data.checkoutUrl.split('/').pop());
    const first = await webhook(signed.payload, signed.header);
    expect(first.status, first.text).toBe(200);
    expect(first.body.data).toEqual({ handled: true, duplicate: false });
    const after = await snapshot(job.id);
    expect(after.job).toBe('ordered');
    expect(after.payments).toEqual(['paid']);
    const [ordered] = await t.db.select().from(jobStatusHistory).where(sql`${jobStatusHistory.jobId} = ${job.id} and ${jobStatusHistory.status} = 'ordered'`);
    expect(ordered!.note).toBe('Paid by card');
    const subjects = (await t.db.select({ subject: mailOutbox.subject }).from(mailOutbox).where(sql`${mailOutbox.refs}->>'jobId' = ${job.id}`)).map((m) => m.subject).sort();
    expect(subjects).toEqual([`Payment received for ${job.reference}`, `We have your order ${job.reference}`]);

    const second = await webhook(signed.payload, signed.header);
    expect(second.status).toBe(200);
    expect(second.body.data).toEqual({ handled: true, duplicate: true });
    // The provider may also send the same outcome as a new event: still nothing more happens.
    const resent = await t.pay.pay(body.data.checkoutUrl.split('/').pop());
    expect((await webhook(resent.payload, resent.header)).body.data.duplicate).toBe(true);
    const final = await snapshot(job.id);
    expect({ ...final, events: 0 }).toEqual({ ...after, events: 0 });

    const twice = await cashInstaller.post(`/api/jobs/${job.id}/payments`);
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toMatch(/already (paid|ordered)/);
  });

  it('refuses a forged, an altered and a replayed event, and one without a signature; nothing changes', async () => {
    const job = await draft(cashInstaller);
    const { body } = await cashInstaller.post(`/api/jobs/${job.id}/payments`).expect(201);
    const sessionId = body.data.checkoutUrl.split('/').pop();
    const genuine = JSON.parse((await t.pay.pay(sessionId)).payload) as { id: string; data: { object: { amount_total: number } } };
    const before = await snapshot(job.id);

    const payload = JSON.stringify(genuine);
    const forged = signer.webhooks.generateTestHeaderString({ payload, secret: 'whsec_someone_else' });
    const altered = JSON.parse(payload);
    altered.data.object.amount_total = 1;
    const alteredPayload = JSON.stringify(altered);
    const rightHeaderWrongBody = signer.webhooks.generateTestHeaderString({ payload, secret: TEST_WEBHOOK_SECRET });
    const stale = signer.webhooks.generateTestHeaderString({ payload, secret: TEST_WEBHOOK_SECRET, timestamp: Math.floor(Date.now() / 1000) - 3600 });

    for (const [what, res] of [
      ['forged', await webhook(payload, forged)],
      ['altered', await webhook(alteredPayload, rightHeaderWrongBody)],
      ['replayed an hour later', await webhook(payload, stale)],
      ['unsigned', await request(t.app).post('/api/payments/webhook').set('content-type', 'application/json').send(payload)],
      ['garbage signature', await webhook(payload, 't=1,v1=deadbeef')],
    ] as const) {
      expect(res.status, what).toBe(400);
      expect(res.body.error.code, what).toBe('bad_signature');
      expect(typeof res.body.requestId).toBe('string');
    }
    expect(await snapshot(job.id)).toEqual(before);
  });
});

describe('cancelling a paid job', () => {
  it('refunds the card payment at the provider and tells the customer', async () => {
    const job = await draft(cashInstaller, 1, 40_000);
    const { body } = await cashInstaller.post(`/api/jobs/${job.id}/payments`).expect(201);
    const signed = await t.pay.pay(body.data.checkoutUrl.split('/').pop());
    await webhook(signed.payload, signed.header).expect(200);
    const cancelled = await sales.post(`/api/jobs/${job.id}/cancel`);
    expect(cancelled.status, cancelled.text).toBe(200);
    const [p] = await t.db.select().from(payments).where(eq(payments.jobId, job.id));
    expect(p!.status).toBe('refunded');
    expect(p!.refundId).toMatch(/^re_/);
    // $400.00 + 10 % GST = $440.00 refunded in full.
    expect(t.pay.refunds.find((r) => r.id === p!.refundId)!.amount).toBe(44_000);
    const refundMail = await t.db.select().from(mailOutbox).where(sql`${mailOutbox.refs}->>'jobId' = ${job.id} and ${mailOutbox.event} = 'refund'`);
    expect(refundMail).toHaveLength(1);
    expect(refundMail[0]!.text).toContain('$440.00');
  });
});

describe('the tax invoice', () => {
  it('shows what domain.md §5 lists: tax invoice, seller and ABN, date, lines, GST, buyer and ABN', async () => {
    const job = await draft(cashInstaller, 3, 33_334);
    const { body } = await cashInstaller.post(`/api/jobs/${job.id}/payments`).expect(201);
    const signed = await t.pay.pay(body.data.checkoutUrl.split('/').pop());
    await webhook(signed.payload, signed.header).expect(200);
    const res = await download(cashInstaller.get(`/api/jobs/${job.id}/invoice.pdf`));
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toBe('application/pdf');
    const { text, offPage } = await pdfText(res.body as Buffer);
    expect(offPage).toEqual([]);
    expect(text).toContain('Tax invoice');
    expect(text).toMatch(/No\. SY-\d{6}/);
    expect(text).toContain('Lowtide Battery Wholesale');
    expect(text).toContain('ABN 33 987 650 001');
    expect(text).toContain('Paperbark Power');
    expect(text).toContain('ABN 84 987 650 003');
    expect(text).toMatch(/Date: \d{1,2} \w+ \d{4}/);
    expect(text).toContain(job.sku);
    // 3 × $333.34 = $1,000.02 ex GST; GST 10 % = $100.00 (rounded to the cent, s 9-90); $1,100.02 inc GST (worked by hand).
    expect(text).toContain('$1,000.02');
    expect(text).toContain('$100.00');
    expect(text).toContain('$1,100.02');
    expect(text).toMatch(/Paid by card on/);
    // The same number every time it is downloaded.
    const again = await pdfText((await download(sales.get(`/api/jobs/${job.id}/invoice.pdf`))).body as Buffer);
    expect(/No\. (SY-\d{6})/.exec(again.text)![1]).toBe(/No\. (SY-\d{6})/.exec(text)![1]);
    // Downloading again draws no number: the next job's invoice is the very next number.
    const next = await draft(cashInstaller, 1, 10_000);
    const paid = await t.pay.pay((await cashInstaller.post(`/api/jobs/${next.id}/payments`).expect(201)).body.data.checkoutUrl.split('/').pop());
    await webhook(paid.payload, paid.header).expect(200);
    const third = await pdfText((await download(cashInstaller.get(`/api/jobs/${next.id}/invoice.pdf`))).body as Buffer);
    const n = (t: string) => Number(/No\. SY-(\d{6})/.exec(t)![1]);
    expect(n(third.text)).toBe(n(text) + 1);
  });

  it('a draft has none yet (409); another company’s job is 404; the warehouse may not (403)', async () => {
    const job = await draft(cashInstaller);
    const res = await cashInstaller.get(`/api/jobs/${job.id}/invoice.pdf`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/draft/);
    expect((await otherCash.get(`/api/jobs/${job.id}/invoice.pdf`)).status).toBe(404);
    expect((await warehouseAgent.get(`/api/jobs/${job.id}/invoice.pdf`)).status).toBe(403);
    expect((await request(t.app).get(`/api/jobs/${job.id}/invoice.pdf`)).status).toBe(401);
  });
});
