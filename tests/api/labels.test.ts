// Labels and the handover sheet: every barcode we print read back by an independent decoder to
// exactly the payload we meant; label PDFs with the right page size and label count; the
// handover PDF listing every serial.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PDFDocument } from 'pdf-lib';
import { PNG } from 'pngjs';
import { sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { makeWarehouse } from '../../seed/factories.ts';
import { makeKit, pickKit, post, type Agent } from '../support/pick-kit.ts';
import { decodePng } from '../support/barcodes.ts';
import { pdfText } from '../support/pdf-text.ts';
import { GS } from '../../shared/domain/gs1.ts';
import { isValidSscc } from '../../shared/domain/gtin.ts';
import type { Label } from '../../shared/contracts/warehouse.ts';

let t: TestApp;
let warehouse: Agent;
let sales: Agent;
let installer: Agent;
let where: { main: { id: string }; north: { id: string } };

beforeAll(async () => {
  t = await createTestApp();
  where = { main: await makeWarehouse(t.db, { code: 'MAIN', rank: 1 }), north: await makeWarehouse(t.db, { code: 'NTH', rank: 2 }) };
  warehouse = await t.signIn('warehouse');
  [sales, installer] = await Promise.all([t.signIn('sales'), t.signIn('installer')]);
});
afterAll(() => t.close());

const binary = (agent: Agent, path: string) =>
  agent
    .get(path)
    .buffer(true)
    .parse((res, done) => {
      const chunks: Buffer[] = [];
      res.on('data', (c: Buffer) => chunks.push(c));
      res.on('end', () => done(null, Buffer.concat(chunks)));
    });

describe('labels', () => {
  it('prints a label per line and per serialised unit, and a kit label per parcel, each decoding to exactly its payload', async () => {
    const k = await makeKit(t, { sales, installer }, where, 'BG-7001 Fern St');
    await pickKit(warehouse, k, ['HX5-A1', 'HX5-A2']);
    const res = await warehouse.get(`/api/jobs/${k.id}/labels`);
    expect(res.status).toBe(200);
    const labels = res.body.data as Label[];
    // Walking order: A-10 brackets, B-20 modules (one label each), then NTH C-05 covers; then parcels: one per module + one for the rest.
    expect(labels.map((l) => `${l.kind}:${l.symbology}`)).toEqual(['pick:gs1-128', 'unit:gs1-128', 'unit:gs1-128', 'pick:code128', 'kit:gs1-128', 'kit:gs1-128', 'kit:gs1-128']);
    expect(labels.map((l) => l.n)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    // GS1 General Specifications §7.8.5.2: FNC1 (GS) after a variable-length field that is not last; none after (01).
    expect(labels[0]!.payload).toBe(`01${k.bracketGtin14}400BG-7001`);
    expect(labels[1]!.payload).toBe(`01${k.moduleGtin14}21HX5-A1${GS}400BG-7001`);
    expect(labels[1]!.text).toBe(`(01)${k.moduleGtin14}(21)HX5-A1(400)BG-7001`);
    expect(labels[1]!.lines).toContain('Serial HX5-A1');
    expect(labels[1]!.lines.at(-1)).toBe('UN 3480 Class 9 · 5,120 Wh · heavy: two-person lift');
    expect(labels[3]!.payload).toBe(k.cover.sku);
    const kits = labels.filter((l) => l.kind === 'kit');
    expect(kits.map((l) => l.lines[3])).toEqual(['Parcel 1 of 3', 'Parcel 2 of 3', 'Parcel 3 of 3']);
    for (const kit of kits) {
      expect(kit.payload).toMatch(/^0000614141\d{10}$/); // (00) + extension 0 + the documentation prefix 0614141
      expect(isValidSscc(kit.payload.slice(2))).toBe(true); // SSCC check digit, GS1 General Specifications §7.9.1
      expect(kit.qr!.payload).toMatch(new RegExp(`/jobs/${k.id}$`));
    }
    expect(new Set(kits.map((l) => l.payload)).size).toBe(3);

    for (const label of labels) {
      const png = await binary(warehouse, label.png);
      expect(png.status).toBe(200);
      expect(png.headers['content-type']).toBe('image/png');
      // Outside check: ZXing reads GS1-128 as "]C1" + the element string with FNC1 as GS (GS1 General Specifications §5.4.3.7 / ISO/IEC 15417).
      const read = decodePng(png.body as Buffer, { gs1: label.symbology === 'gs1-128' });
      expect(read.text).toBe(label.symbology === 'gs1-128' ? `]C1${label.payload}` : label.payload);
      expect(PNG.sync.read(png.body as Buffer).height).toBeGreaterThan(100); // 12 mm bars at 300 dpi ≈ 140 px
      if (label.qr) {
        const qr = await binary(warehouse, label.qr.png);
        expect(decodePng(qr.body as Buffer).text).toBe(label.qr.payload);
      }
    }
    // The SSCCs are fixed the first time: a second run prints the same ones.
    const again = (await warehouse.get(`/api/jobs/${k.id}/labels`)).body.data as Label[];
    expect(again.map((l) => l.payload)).toEqual(labels.map((l) => l.payload));
  });

  it('lays out A4 sheets of 3 × 7 and 100 × 150 mm thermal labels', async () => {
    const k = await makeKit(t, { sales, installer }, where, 'BG-7002 Hill St');
    const labels = (await warehouse.get(`/api/jobs/${k.id}/labels`)).body.data as Label[];
    expect(labels).toHaveLength(7); // 1 bracket line, 2 module units, 1 cover line, 3 parcels
    const a4 = await binary(warehouse, `/api/jobs/${k.id}/labels.pdf?layout=a4`);
    expect(a4.headers['content-type']).toBe('application/pdf');
    const a4Doc = await PDFDocument.load(a4.body as Buffer);
    expect(a4Doc.getPageCount()).toBe(1);
    const { width, height } = a4Doc.getPage(0).getSize();
    expect(width).toBeCloseTo(595.28, 1); // ISO 216 A4: 210 × 297 mm at 72 pt per inch
    expect(height).toBeCloseTo(841.89, 1);
    const a4Text = await pdfText(a4.body as Buffer);
    expect(a4Text.text.match(/Job BG-7002 Hill St/g)).toHaveLength(7); // every label names the job once
    expect(a4Text.offPage).toEqual([]);

    const thermal = await binary(warehouse, `/api/jobs/${k.id}/labels.pdf?layout=thermal`);
    const thermalDoc = await PDFDocument.load(thermal.body as Buffer);
    expect(thermalDoc.getPageCount()).toBe(7);
    const size = thermalDoc.getPage(0).getSize();
    expect(size.width).toBeCloseTo((100 * 72) / 25.4, 1); // 100 × 150 mm
    expect(size.height).toBeCloseTo((150 * 72) / 25.4, 1);
    const thermalText = await pdfText(thermal.body as Buffer);
    thermalText.pages.forEach((p, i) => expect(p).toContain(labels[i]!.text));
  });

  it('fills more A4 sheets past 21 labels', async () => {
    const k = await makeKit(t, { sales, installer }, where, 'BG-7003 Long St');
    // 20 more serialised units make 27 labels: 2 sheets.
    await t.db.execute(sql`update job_lines set qty = 22 where job_id = ${k.id} and part_id = ${k.module.id}`);
    await t.db.execute(sql`update reservations set qty = 22 where part_id = ${k.module.id} and job_line_id in (select id from job_lines where job_id = ${k.id})`);
    await t.db.execute(sql`update stock_levels set on_hand = 30, reserved = 22 where part_id = ${k.module.id}`);
    await t.db.execute(sql`insert into stock_movements (part_id, warehouse_id, bin, qty, kind, reason) values (${k.module.id}, ${where.main.id}, 'B-20', 26, 'receive', 'Test top-up')`);
    const labels = (await warehouse.get(`/api/jobs/${k.id}/labels`)).body.data as Label[];
    expect(labels).toHaveLength(1 + 22 + 1 + 23);
    const doc = await PDFDocument.load((await binary(warehouse, `/api/jobs/${k.id}/labels.pdf`)).body as Buffer);
    expect(doc.getPageCount()).toBe(Math.ceil(47 / 21));
  });

  it('refuses a job with nothing reserved, clearly and without numbering parcels', async () => {
    const job = await post(sales, '/api/jobs', { companyId: installer.companyId, reference: 'BG-7004 Empty', lines: [{ sku: (await makeKit(t, { sales, installer }, where)).cover.sku, qty: 1 }] });
    const res = await warehouse.get(`/api/jobs/${job.body.data.id}/labels`);
    expect(res.status).toBe(409);
    expect(res.body.error.message).toBe('Nothing is reserved for job BG-7004 Empty yet, so there is nothing to label. Reserve its stock first.');
    const { rows } = await t.db.execute(sql`select * from job_parcels where job_id = ${job.body.data.id}`);
    expect(rows).toEqual([]);
    expect((await warehouse.get(`/api/jobs/${job.body.data.id}/labels/1.png`)).status).toBe(409);
  });
});

describe('the handover sheet', () => {
  it('lists every serial by part for the installer’s company, on the page and in the PDF', async () => {
    const k = await makeKit(t, { sales, installer }, where, 'BG-7005 Jetty Rd');
    await pickKit(warehouse, k, ['HX5-H1', 'HX5-H2']);
    await post(warehouse, `/api/jobs/${k.id}/pick/complete`);
    const page = await installer.get(`/api/jobs/${k.id}/handover`);
    expect(page.status).toBe(200);
    expect(page.body.data.serials).toEqual([{ sku: k.module.sku, name: 'Test module 5 kWh', serials: ['HX5-H1', 'HX5-H2'] }]);
    expect(page.body.data.cautions[0]).toMatch(/AS\/NZS 5139/);
    const pdf = await binary(installer, `/api/jobs/${k.id}/handover.pdf`);
    expect(pdf.headers['content-type']).toBe('application/pdf');
    expect(pdf.headers['content-disposition']).toContain('handover-BG-7005-Jetty-Rd.pdf');
    const { text, offPage } = await pdfText(pdf.body as Buffer);
    for (const s of ['Handover sheet', 'Job BG-7005 Jetty Rd', 'Site: Thornbury 3071', 'HX5-H1', 'HX5-H2', `2 × ${k.module.sku}`, 'AS/NZS 5139', 'ES sign']) expect(text).toContain(s);
    expect(offPage).toEqual([]);
  });
});
