// Demo warehouse state: the GS1 company prefix setting, and one job picked through the pick
// service itself (every part and serial scanned), so its labels and handover sheet have serials.
// BG-2041 Fern St stays reserved, ready to pick; SS-0322 Bluff Rd is being picked.
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../server/db/client.ts';
import { settings, user } from '../server/db/schema/index.ts';
import type { Actor } from '../server/policies/actor.ts';
import type { Role } from '../shared/roles.ts';
import { createPickingService } from '../server/services/picking.ts';
import { COMPANY_PREFIX_SETTING, DOCUMENTATION_COMPANY_PREFIX } from '../server/services/labels.ts';

const SEED_KEY = 'seed.demo.warehouse';
const PICKED_JOB = 'SS-0317 Jetty Rd';

export async function seedDemoWarehouse(db: Db) {
  const [done] = await db.select().from(settings).where(eq(settings.key, SEED_KEY));
  if (done) return false;
  await db.insert(settings).values({ key: COMPANY_PREFIX_SETTING, value: { prefix: DOCUMENTATION_COMPANY_PREFIX, note: 'GS1’s documentation prefix: replace with the company’s own before printing real labels.' } }).onConflictDoNothing();

  const [u] = await db.select().from(user).where(eq(user.email, 'warehouse@stackyard.test'));
  const [job] = (await db.execute<{ id: string; status: string }>(sql`select id, status from jobs where reference = ${PICKED_JOB}`)).rows;
  if (u && job?.status === 'reserved') {
    const picker: Actor = { userId: u.id, name: u.name, email: u.email, role: u.role as Role, companyId: u.companyId ?? null };
    const picking = createPickingService({ db });
    const list = await picking.pickList(picker, job.id);
    let n = 0;
    const scan = (code: string, qty?: number) => picking.scan(picker, job.id, { code, qty, scanId: `demo-seed-${String(++n).padStart(4, '0')}` });
    for (const line of list.groups.flatMap((g) => g.lines)) {
      if (!line.serialised) {
        await scan(line.sku, line.qty);
        continue;
      }
      await scan(line.sku);
      // Invented serials in a maker-like pattern: part code, year-week, unit number.
      const stem = line.sku.replace(/[^A-Z0-9]/g, '').slice(-6);
      for (let i = 1; i <= line.qty; i++) await scan(`${stem}-2648-${String(i).padStart(4, '0')}`);
    }
    await picking.complete(picker, job.id);
  }
  await db.insert(settings).values({ key: SEED_KEY, value: { at: new Date().toISOString() } });
  return true;
}
