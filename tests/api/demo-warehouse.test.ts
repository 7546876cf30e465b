import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createTestApp, type TestApp } from '../support/app.ts';
import { ledgerDifferences } from '../support/ledger.ts';
import { seedDemo } from '../../seed/demo.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await seedDemo(t.db, t.auth);
});
afterAll(() => t.close());

describe('the demo warehouse', () => {
  it('has a job picked by scans with every serialised unit’s serial, and reserved jobs waiting to pick', async () => {
    const warehouse = await t.signIn('warehouse', { email: 'warehouse@stackyard.test' });
    const queue = (await warehouse.get('/api/pick-queue')).body.data as { reference: string; state: string }[];
    expect(queue.map((q) => q.reference)).toEqual(expect.arrayContaining(['BG-2041 Fern St', 'SS-0322 Bluff Rd']));
    const { rows } = await t.db.execute<{ id: string; status: string; units: number; serials: number }>(sql`
      select j.id, j.status,
        (select coalesce(sum(jl.qty), 0) from job_lines jl join parts p on p.id = jl.part_id where jl.job_id = j.id and p.category in ('module', 'controller', 'inverter'))::int as units,
        (select count(*) from part_serials s where s.job_id = j.id and s.state = 'issued')::int as serials
      from jobs j where j.reference = 'SS-0317 Jetty Rd'`);
    expect(rows[0]).toMatchObject({ status: 'ready' });
    expect(rows[0]!.serials).toBe(rows[0]!.units);
    expect(rows[0]!.units).toBeGreaterThan(0);
    const handover = await warehouse.get(`/api/jobs/${rows[0]!.id}/handover`);
    expect(handover.body.data.systems[0]).toMatchObject({ stacks: expect.any(Number), usableKwh: expect.any(Number), nominalVoltage: expect.any(Number), dvc: expect.stringMatching(/^[ABC]$/) });
    expect(handover.body.data.serials.flatMap((s: { serials: string[] }) => s.serials)).toHaveLength(rows[0]!.units);
    const prefix = await t.db.execute<{ value: { prefix: string } }>(sql`select value from settings where key = 'gs1.companyPrefix'`);
    expect(prefix.rows[0]!.value.prefix).toBe('0614141'); // GS1's documentation company prefix
    expect(await ledgerDifferences(t.db)).toEqual([]);
  });
});
