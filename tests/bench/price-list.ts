// A 100,000-row supplier price list through the running API (upload → columns → preview → apply),
// beside the same rows written into a bare table by one INSERT … SELECT FROM unnest() (pg-copy-streams
// is not a dependency, so the reference is the fastest plain-SQL bulk insert, not COPY FROM STDIN).
import { readFileSync } from 'node:fs';
import { performance } from 'node:perf_hooks';
import { sql } from 'drizzle-orm';
import type { Db } from '../../server/db/client.ts';

export const PRICE_LIST_ROWS = 100_000;
const MATCHED = 50_000;

/** VmRSS of a process in MB (Linux). */
function rssMb(pid: number) {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Math.round(Number(m[1]) / 1024) : 0;
}

export async function benchPriceList(db: Db, base: string, apiPid: number) {
  // Setup (not timed): a supplier selling us the first 50,000 bench parts at a known cost.
  await db.execute(sql`insert into suppliers (code, name) values ('BENCH-PL', 'Benchmark Supply') on conflict (code) do nothing`);
  const [{ id: supplierId }] = (await db.execute<{ id: string }>(sql`select id from suppliers where code = 'BENCH-PL'`)).rows as [{ id: string }];
  await db.execute(sql`
    insert into part_supplier_skus (part_id, supplier_id, supplier_sku, cost_cents)
    select id, ${supplierId}::uuid, 'BPL-' || n, 1000 + n % 5000 from (select id, row_number() over (order by sku) as n from parts where sku like 'BN-%' limit ${MATCHED}) p
    on conflict (part_id, supplier_id) do update set cost_cents = excluded.cost_cents`);

  // The file: 50,000 known SKUs all 3 % dearer, 50,000 new ones (staged and shown, not applied until linked).
  const lines = ['Item code,Description,Cost ex GST,Pack,MOQ'];
  const rows: { sku: string; description: string; cost: string; pack: number; moq: number }[] = [];
  for (let n = 1; n <= PRICE_LIST_ROWS; n++) {
    const sku = n <= MATCHED ? `BPL-${n}` : `BPL-NEW-${n}`;
    const cost = (((1000 + n % 5000) * 1.03) / 100).toFixed(4);
    rows.push({ sku, description: `Bench item ${n}`, cost, pack: 1, moq: 1 });
    lines.push(`${sku},Bench item ${n},${cost},1,1`);
  }
  const file = Buffer.from(`${lines.join('\r\n')}\r\n`);

  const signIn = await fetch(`${base}/api/auth/sign-in/email`, { method: 'POST', headers: { 'content-type': 'application/json', origin: base }, body: JSON.stringify({ email: 'purchasing@stackyard.test', password: 'stackyard-demo' }) });
  const cookie = signIn.headers.getSetCookie().map((c) => c.split(';')[0]).join('; ');
  const headers = { cookie, origin: base };
  const json = async (path: string, init: RequestInit = {}) => {
    const r = await fetch(`${base}/api${path}`, { ...init, headers: { ...headers, ...(init.body && !(init.body instanceof FormData) ? { 'content-type': 'application/json' } : {}) } });
    if (!r.ok) throw new Error(`${path}: ${r.status} ${(await r.text()).slice(0, 200)}`);
    return (await r.json()) as { data: Record<string, unknown> };
  };

  let peak = rssMb(apiPid);
  const sampler = setInterval(() => (peak = Math.max(peak, rssMb(apiPid))), 100);
  const t0 = performance.now();
  const form = new FormData();
  form.set('supplierId', supplierId);
  form.set('file', new Blob([file]), 'bench.csv');
  const up = (await json('/price-lists', { method: 'POST', body: form })).data as { id: string; mapping: Record<string, string> };
  await json(`/price-lists/${up.id}/mapping`, { method: 'PUT', body: JSON.stringify({ mapping: up.mapping }) });
  const preview = (await json(`/price-lists/${up.id}/preview`)).data as { counts: Record<string, number> };
  const applied = (await json(`/price-lists/${up.id}/apply`, { method: 'POST' })).data as { applied: boolean };
  const importSeconds = (performance.now() - t0) / 1000;
  clearInterval(sampler);

  // The reference: the same rows into a bare table, one statement.
  await db.execute(sql`drop table if exists bench_price_rows`);
  await db.execute(sql`create table bench_price_rows (sku text, description text, cost numeric, pack int, moq int)`);
  const t1 = performance.now();
  await db.execute(sql`insert into bench_price_rows select * from unnest(${sql.param(rows.map((r) => r.sku))}::text[], ${sql.param(rows.map((r) => r.description))}::text[], ${sql.param(rows.map((r) => r.cost))}::numeric[], ${sql.param(rows.map((r) => r.pack))}::int[], ${sql.param(rows.map((r) => r.moq))}::int[])`);
  const referenceSeconds = (performance.now() - t1) / 1000;
  await db.execute(sql`drop table bench_price_rows`);

  const ratio = Math.round((importSeconds / referenceSeconds) * 10) / 10;
  return {
    rows: PRICE_LIST_ROWS,
    matched: MATCHED,
    counts: preview.counts,
    applied: applied.applied,
    importSeconds: Math.round(importSeconds * 100) / 100,
    referenceSeconds: Math.round(referenceSeconds * 100) / 100,
    reference: 'INSERT … SELECT FROM unnest() into a bare table (no pg-copy-streams)',
    ratio,
    apiPeakRssMb: peak,
    met: ratio <= 4 && peak <= 400,
  };
}
