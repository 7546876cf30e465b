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

describe('the demo jobs', () => {
  it('a dozen jobs for two installer companies in different states, one part-reserved with backorders waiting', async () => {
    const byStatus = await t.db.execute<{ status: string; n: number }>(sql`select status, count(*)::int as n from jobs group by status`);
    const counts = Object.fromEntries(byStatus.rows.map((r) => [r.status, r.n]));
    expect(Object.values(counts).reduce((a, b) => a + b, 0)).toBe(12);
    expect(Object.keys(counts).length).toBeGreaterThanOrEqual(5);
    const companies = await t.db.execute<{ n: number }>(sql`select count(distinct company_id)::int as n from jobs`);
    expect(companies.rows[0]!.n).toBe(2);
    const waiting = await t.db.execute<{ reference: string; qty: number }>(sql`
      select j.reference, sum(b.qty)::int as qty from backorders b join job_lines l on l.id = b.job_line_id join jobs j on j.id = l.job_id
      where j.status = 'part-reserved' group by j.reference`);
    expect(waiting.rows.length).toBeGreaterThanOrEqual(1);
    expect(await ledgerDifferences(t.db)).toEqual([]);
    // seeding again adds nothing
    await seedDemo(t.db, t.auth);
    const again = await t.db.execute<{ n: number }>(sql`select count(*)::int as n from jobs`);
    expect(again.rows[0]!.n).toBe(12);
  });

  it('shows shortages: several parts below their minimum', async () => {
    const low = await t.services.stock.lowStock({ userId: 'x', name: 'x', email: 'x', role: 'sales', companyId: null });
    expect(low.length).toBeGreaterThan(3);
  });
});
