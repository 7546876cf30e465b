// Scan-to-confirm picking through the API: right and wrong scans, serials, over-picks, replays of
// one scan id, pause and resume, and completion issuing the kit once, with the ledger agreeing.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import request from 'supertest';
import { sql } from 'drizzle-orm';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { ledgerDifferences, stockSnapshot } from '../support/ledger.ts';
import { makePart, makeWarehouse } from '../../seed/factories.ts';
import { makeKit, pickKit, post, scanId, type Agent } from '../support/pick-kit.ts';

let t: TestApp;
let warehouse: Agent;
let warehouse2: Agent;
let sales: Agent;
let installer: Agent;
let otherInstaller: Agent;
let main: { id: string };
let north: { id: string };
beforeAll(async () => {
  t = await createTestApp();
  main = await makeWarehouse(t.db, { code: 'MAIN', rank: 1 });
  north = await makeWarehouse(t.db, { code: 'NTH', rank: 2 });
  warehouse = await t.signIn('warehouse');
  [warehouse2, sales, installer, otherInstaller] = await Promise.all([t.signIn('warehouse'), t.signIn('sales'), t.signIn('installer'), t.signIn('installer')]);
});
afterAll(() => t.close());
afterEach(async () => expect(await ledgerDifferences(t.db)).toEqual([]));

const kit = (reference?: string) => makeKit(t, { sales, installer }, { main, north }, reference);

const scan = (jobId: string, code: string, extra: { qty?: number; scanId?: string } = {}, agent = warehouse) => post(agent, `/api/jobs/${jobId}/pick/scans`, { code, scanId: extra.scanId ?? scanId(), ...(extra.qty ? { qty: extra.qty } : {}) });
const pickState = async (jobId: string) => (await t.db.execute(sql`select (select count(*)::int from pick_scans where job_id = ${jobId}) as scans, (select status from jobs where id = ${jobId}) as status, (select current_line_id from pick_sessions where job_id = ${jobId}) as current`)).rows[0];

describe('the pick list', () => {
  it('groups lines by warehouse and walks bins in pick order', async () => {
    const k = await kit();
    const res = await warehouse.get(`/api/jobs/${k.id}/pick`);
    expect(res.status).toBe(200);
    const list = res.body.data;
    expect(list.groups.map((g: { warehouse: string }) => g.warehouse)).toEqual(['MAIN', 'NTH']);
    expect(list.groups[0].lines.map((l: { sku: string }) => l.sku)).toEqual([k.bracket.sku, k.module.sku]); // A-10 (order 10) before B-20 (order 20)
    expect(list.groups[0].lines[1]).toMatchObject({ serialised: true, lithium: 'UN 3480 lithium ion batteries, Class 9, 5,120 Wh per unit', places: [{ warehouse: 'MAIN', bin: 'B-20', qty: 2 }] });
    expect(list).toMatchObject({ state: 'waiting', progress: { units: 10, picked: 0, lines: 3, linesDone: 0 } });
    const queue = await warehouse.get('/api/pick-queue');
    expect(queue.body.data.find((q: { id: string }) => q.id === k.id)).toMatchObject({ state: 'waiting', units: 10, picked: 0 });
  });
});

describe('scans', () => {
  it('counts a part by SKU, by GTIN and by GS1 label with a quantity, and starts the pick', async () => {
    const k = await kit();
    const bySku = await scan(k.id, k.cover.sku.toLowerCase());
    expect(bySku.body.data).toMatchObject({ accepted: true, replay: false, line: { sku: k.cover.sku, picked: 1, qty: 3 }, progress: { units: 10, picked: 1 } });
    expect((await scan(k.id, k.bracketGtin14.slice(1))).body.data).toMatchObject({ accepted: true, line: { sku: k.bracket.sku, picked: 1 } });
    expect((await scan(k.id, `]C101${k.bracketGtin14}400PK-1`, { qty: 4 })).body.data).toMatchObject({ accepted: true, line: { picked: 5 } });
    const after = await pickState(k.id);
    expect(after).toMatchObject({ scans: 3, status: 'picking' });
    const list = (await warehouse.get(`/api/jobs/${k.id}/pick`)).body.data;
    expect(list).toMatchObject({ state: 'active', progress: { picked: 6, linesDone: 1 } });
    expect(list.picker).toBeTruthy();
  });

  it('refuses a wrong part, an unknown barcode, a serial on a counted part and an over-pick, saying what was expected and changing nothing', async () => {
    const k = await kit();
    const stranger = await makePart(t.db, { sku: `${k.cover.sku}-STRANGER` });
    await scan(k.id, k.cover.sku, { qty: 3 });
    const before = { pick: await pickState(k.id), stock: await stockSnapshot(t.db) };

    const wrong = (await scan(k.id, stranger.sku)).body.data;
    expect(wrong).toMatchObject({ accepted: false, message: `Wrong part: ${stranger.sku} is not on this job.` });
    expect(wrong.expected).toContain(`${k.bracket.sku} from MAIN A-10 (5 to go)`);

    const unknown = (await scan(k.id, 'NO-SUCH-THING')).body.data;
    expect(unknown).toMatchObject({ accepted: false });
    expect(unknown.message).toMatch(/^Unknown barcode “NO-SUCH-THING”/);
    // A GS1 label with only an order number (400) names no part: said so, not "GTIN null".
    const noGtin = (await scan(k.id, '(400)PO-77')).body.data;
    expect(noGtin).toMatchObject({ accepted: false, message: 'That GS1 barcode names no part (it has no GTIN, AI 01). Scan the part’s own label.' });

    const serialOnCounted = (await scan(k.id, `(01)${k.bracketGtin14}(21)SN-1`)).body.data;
    expect(serialOnCounted).toMatchObject({ accepted: false, expected: `${k.bracket.sku} without a serial` });
    expect(serialOnCounted.message).toMatch(/is not serialised/);

    const over = (await scan(k.id, k.cover.sku)).body.data;
    expect(over).toMatchObject({ accepted: false });
    expect(over.message).toMatch(/^Over-pick: every TST-CVR-\d+ this job needs \(3\) is already picked\.$/);
    const tooMany = (await scan(k.id, k.bracket.sku, { qty: 6 })).body.data;
    expect(tooMany.message).toBe(`Over-pick: line 2 needs 5 × ${k.bracket.sku} and 0 are picked; at most 5 more.`);

    expect(await pickState(k.id)).toEqual(before.pick);
    expect(await stockSnapshot(t.db)).toEqual(before.stock);
  });

  it('captures serials for a serialised line after its part scan, and refuses a serial scanned twice', async () => {
    const k = await kit();
    const confirm = (await scan(k.id, k.module.sku)).body.data;
    expect(confirm).toMatchObject({ accepted: true, message: `${k.module.sku}: now scan the serial of each unit (2 to go).`, line: { picked: 0 } });
    expect((await scan(k.id, 'HX5-000101')).body.data).toMatchObject({ accepted: true, line: { picked: 1, serials: ['HX5-000101'] } });
    const again = (await scan(k.id, 'HX5-000101')).body.data;
    expect(again).toMatchObject({ accepted: false, message: `Serial HX5-000101 of ${k.module.sku} is already scanned on this pick.` });
    // GS1 with (01) and (21) names the part and the serial in one scan.
    expect((await scan(k.id, `(01)${k.moduleGtin14}(21)HX5-000102`)).body.data).toMatchObject({ accepted: true, line: { picked: 2, serials: ['HX5-000101', 'HX5-000102'] } });
    expect((await scan(k.id, 'HX5-000103')).body.data).toMatchObject({ accepted: false }); // line full: no serial awaited
    expect((await scan(k.id, k.module.sku, { qty: 2 })).body.data).toMatchObject({ accepted: false });
  });

  it('applies one scan id once, however often it arrives (an offline queue replaying)', async () => {
    const k = await kit();
    const id = scanId();
    const first = (await scan(k.id, k.bracket.sku, { scanId: id, qty: 2 })).body.data;
    const replays = await Promise.all([1, 2, 3].map(() => scan(k.id, k.bracket.sku, { scanId: id, qty: 2 })));
    expect(first).toMatchObject({ accepted: true, replay: false, line: { picked: 2 } });
    for (const r of replays) expect(r.body.data).toMatchObject({ accepted: true, replay: true, line: { picked: 2 }, progress: { picked: 2 } });
    expect(await pickState(k.id)).toMatchObject({ scans: 1 });
  });

  it('pauses, refuses scans while paused, and lets another person resume', async () => {
    const k = await kit();
    await scan(k.id, k.cover.sku);
    const paused = await post(warehouse, `/api/jobs/${k.id}/pick/pause`);
    expect(paused.body.data).toMatchObject({ state: 'paused', abilities: { scan: false, resume: true } });
    const refused = (await scan(k.id, k.cover.sku, {}, warehouse2)).body.data;
    expect(refused).toMatchObject({ accepted: false, expected: 'Resume the pick first.' });
    const resumed = await post(warehouse2, `/api/jobs/${k.id}/pick/resume`);
    expect(resumed.body.data).toMatchObject({ state: 'active', picker: 'Test warehouse' });
    expect((await scan(k.id, k.cover.sku, {}, warehouse2)).body.data).toMatchObject({ accepted: true, line: { picked: 2 } });
  });
});

describe('completing the pick', () => {
  it('refuses while lines are open, then issues the kit once: movements, holds consumed, serials attached, job ready', async () => {
    const k = await kit();
    await scan(k.id, k.cover.sku, { qty: 3 });
    const early = await post(warehouse, `/api/jobs/${k.id}/pick/complete`);
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/Not everything is picked yet: .*TST-MOD-\d+ 0 of 2/);
    await scan(k.id, k.bracket.sku, { qty: 5 });
    await scan(k.id, k.module.sku);
    await scan(k.id, 'HX5-7001');
    await scan(k.id, 'HX5-7002');

    const [a, b] = await Promise.all([post(warehouse, `/api/jobs/${k.id}/pick/complete`), post(warehouse2, `/api/jobs/${k.id}/pick/complete`)]);
    expect([a.status, b.status]).toEqual([200, 200]);
    const results = [a.body.data, b.body.data].sort((x, y) => Number(x.alreadyComplete) - Number(y.alreadyComplete));
    expect(results).toEqual([
      { status: 'ready', issued: 10, serials: 2, alreadyComplete: false },
      { status: 'ready', issued: 0, serials: 0, alreadyComplete: true },
    ]);
    const third = await post(warehouse, `/api/jobs/${k.id}/pick/complete`);
    expect(third.body.data).toMatchObject({ alreadyComplete: true, issued: 0 });

    const { rows: moves } = await t.db.execute<{ bin: string; qty: number }>(sql`select bin, qty from stock_movements where job_id = ${k.id} and kind = 'pick-issue' order by bin`);
    expect(moves).toEqual([
      { bin: 'A-10', qty: -5 },
      { bin: 'B-20', qty: -2 },
      { bin: 'C-05', qty: -3 },
    ]);
    const { rows: held } = await t.db.execute(sql`select * from reservations r join job_lines jl on jl.id = r.job_line_id where jl.job_id = ${k.id}`);
    expect(held).toEqual([]);
    const { rows: serials } = await t.db.execute<{ serial: string; state: string }>(sql`select serial, state from part_serials where job_id = ${k.id} order by serial`);
    expect(serials).toEqual([
      { serial: 'HX5-7001', state: 'issued' },
      { serial: 'HX5-7002', state: 'issued' },
    ]);
    const levels = await t.db.execute<{ bin: string; on_hand: number; reserved: number }>(sql`select bin, on_hand, reserved from stock_levels where part_id = ${k.module.id}`);
    expect(levels.rows).toEqual([{ bin: 'B-20', on_hand: 2, reserved: 0 }]); // 4 received − 2 issued
    const job = await sales.get(`/api/jobs/${k.id}`);
    expect(job.body.data.status).toBe('ready');
    expect(job.body.data.history.at(-1)).toMatchObject({ status: 'ready', note: 'Picked: 10 units issued, 2 serials' });
  });

  it('hands a ready kit over: dispatched (the customer is e-mailed, as when it became ready), then closed; out of order is a 409', async () => {
    const k = await kit();
    await pickKit(warehouse, k, ['HX5-8101', 'HX5-8102']);
    expect((await post(warehouse, `/api/jobs/${k.id}/pick/complete`)).body.data.status).toBe('ready');
    const mails = async () => (await t.db.execute<{ event: string }>(sql`select event from mail_outbox where refs->>'jobId' = ${k.id} order by created_at`)).rows.map((r) => r.event);
    expect(await mails()).toContain('ready-for-collection');
    expect((await installer.post(`/api/jobs/${k.id}/dispatch`).set('origin', TEST_ORIGIN)).status).toBe(403);
    const early = await post(sales, `/api/jobs/${k.id}/close`);
    expect(early.status).toBe(409);
    expect(early.body.error.message).toMatch(/only a job that is dispatched or collected can be marked closed/);
    const tooLong = await post(warehouse, `/api/jobs/${k.id}/dispatch`, { carrier: 'x'.repeat(61) });
    expect(tooLong.status).toBe(400);
    expect(tooLong.body.error.message).toMatch(/60 characters/);
    expect((await sales.get(`/api/jobs/${k.id}`)).body.data.status).toBe('ready'); // refused: nothing changed
    const sent = await post(warehouse, `/api/jobs/${k.id}/dispatch`, { carrier: 'Tasman Freight', trackingRef: 'TF-20931' });
    expect(sent.status, sent.text).toBe(200);
    expect(sent.body.data.status).toBe('dispatched');
    expect(sent.body.data.abilities).toMatchObject({ dispatch: false, collect: false, close: true });
    expect(sent.body.data.history.at(-1)).toMatchObject({ status: 'dispatched', note: 'Sent with Tasman Freight, tracking TF-20931' });
    expect(await mails()).toContain('dispatched');
    const [told] = (await t.db.execute<{ text: string }>(sql`select text from mail_outbox where refs->>'jobId' = ${k.id} and event = 'dispatched'`)).rows;
    expect(told!.text).toContain('Tasman Freight');
    expect(told!.text).toContain('TF-20931');
    expect((await post(warehouse, `/api/jobs/${k.id}/collect`)).status).toBe(409);
    const closed = await post(sales, `/api/jobs/${k.id}/close`);
    expect(closed.body.data.status).toBe('closed');
    expect(closed.body.data.history.map((h: { status: string }) => h.status).slice(-3)).toEqual(['ready', 'dispatched', 'closed']);
  });

  it('refuses a serial already issued to another job', async () => {
    const first = await kit();
    await pickKit(warehouse, first, ['HX5-9001', 'HX5-9002']);
    // The same part on a second job: its serial HX5-9001 has gone out already.
    const job = await post(sales, '/api/jobs', { companyId: installer.companyId, reference: `${first.reference} second`, lines: [{ sku: first.module.sku, qty: 1 }] });
    await post(sales, `/api/jobs/${job.body.data.id}/order`);
    await post(sales, `/api/jobs/${job.body.data.id}/reserve`);
    expect((await post(warehouse, `/api/jobs/${first.id}/pick/complete`)).status).toBe(200);
    await scan(job.body.data.id, first.module.sku);
    const dup = (await scan(job.body.data.id, 'HX5-9001')).body.data;
    expect(dup).toMatchObject({ accepted: false });
    expect(dup.message).toBe(`Serial HX5-9001 of ${first.module.sku} is already issued to job ${first.reference}.`);
  });
});

describe('who may pick', () => {
  it('keeps installers and the trade desk from picking, and hides other companies’ jobs', async () => {
    const k = await kit();
    expect((await request(t.app).post(`/api/jobs/${k.id}/pick/scans`).set('origin', TEST_ORIGIN).send({ code: 'X', scanId: scanId() })).status).toBe(401);
    expect((await scan(k.id, k.cover.sku, {}, installer)).status).toBe(403);
    expect((await scan(k.id, k.cover.sku, {}, sales)).status).toBe(403);
    expect((await installer.get(`/api/jobs/${k.id}/pick`)).status).toBe(403);
    expect((await otherInstaller.get(`/api/jobs/${k.id}/handover`)).status).toBe(404);
    expect((await installer.get(`/api/jobs/${k.id}/handover`)).status).toBe(200);
    expect((await installer.get(`/api/jobs/${k.id}/labels`)).status).toBe(403);
    expect(await pickState(k.id)).toMatchObject({ scans: 0, status: 'reserved' });
  });

  it('answers bad input with the envelope and a job that cannot be picked with a clear 409', async () => {
    const k = await kit();
    const bad = await post(warehouse, `/api/jobs/${k.id}/pick/scans`, { code: '', scanId: 'x' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.code).toBe('validation_failed');
    const draft = await post(sales, '/api/jobs', { companyId: installer.companyId, reference: `${k.reference} draft`, lines: [{ sku: k.cover.sku, qty: 1 }] });
    const refused = await scan(draft.body.data.id, k.cover.sku);
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toBe('This job is draft; only a reserved job can be picked.');
    expect(await pickState(draft.body.data.id)).toMatchObject({ scans: 0, status: 'draft' });
    expect((await scan('00000000-0000-4000-8000-000000000000', k.cover.sku)).status).toBe(404);
  });
});
