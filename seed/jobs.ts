// Demo bins, min/max levels and a dozen jobs for two installer companies, made through the
// same services the app uses (so every reservation and backorder is one the ledger explains).
import { eq, sql } from 'drizzle-orm';
import type { Db } from '../server/db/client.ts';
import { jobs, jobStatusHistory, settings, user } from '../server/db/schema/index.ts';
import type { Actor } from '../server/policies/actor.ts';
import { createPlannerService } from '../server/services/planner.ts';
import { createJobService } from '../server/services/jobs.ts';
import type { Role } from '../shared/roles.ts';

const SEED_KEY = 'seed.demo.jobs';

async function actor(db: Db, email: string): Promise<Actor> {
  const [u] = await db.select().from(user).where(eq(user.email, email));
  if (!u) throw new Error(`demo user ${email} is missing`);
  return { userId: u.id, name: u.name, email: u.email, role: u.role as Role, companyId: u.companyId ?? null };
}

/** Seeds once (its own marker, so an existing demo database gains jobs too). */
export async function seedDemoJobs(db: Db) {
  const [done] = await db.select().from(settings).where(eq(settings.key, SEED_KEY));
  if (done) return false;

  // Bins in pick order (aisle, then bay) and each part's default bin: where its stock sits.
  await db.execute(sql`
    insert into bins (warehouse_id, code, pick_order)
    select warehouse_id, bin, (row_number() over (partition by warehouse_id order by bin))::int * 10
    from (select distinct warehouse_id, bin from stock_levels) b
    on conflict do nothing`);
  await db.execute(sql`
    insert into default_bins (part_id, warehouse_id, bin)
    select distinct on (part_id, warehouse_id) part_id, warehouse_id, bin from stock_levels order by part_id, warehouse_id, bin
    on conflict do nothing`);
  // Minimum and maximum per part: big units are held in small numbers, small parts by the box.
  await db.execute(sql`
    insert into stock_limits (part_id, min_qty, max_qty)
    select id, case when category in ('module', 'controller', 'inverter') then 6 else 20 end,
               case when category in ('module', 'controller', 'inverter') then 24 else 80 end
    from parts where archived_at is null and lifecycle <> 'discontinued'
    on conflict do nothing`);

  const now = () => new Date();
  const planner = createPlannerService({ db });
  const service = createJobService({ db, planner, now });
  const sales = await actor(db, 'sales@stackyard.test');
  const ivy = await actor(db, 'installer@stackyard.test');
  const hamish = await actor(db, 'installer2@stackyard.test');

  const [hearth] = await db.execute<{ id: string }>(sql`select id from ranges where code = 'QRB-HEARTH'`).then((r) => r.rows);
  const [tor] = await db.execute<{ id: string }>(sql`select id from ranges where code = 'HLM-TOR'`).then((r) => r.rows);
  const plan = async (who: Actor, name: string, rangeId: string, modules: number, suburb: string, postcode: string) =>
    (await planner.save(who, { name, siteSuburb: suburb, sitePostcode: postcode, request: { rangeId, modules } })).id;

  // Parts the demo jobs ask for by SKU: the scarcest stocked accessory and two plentiful ones.
  const stocked = await db.execute<{ sku: string; available: number }>(sql`
    select p.sku, sum(l.on_hand - l.reserved)::int as available from parts p join stock_levels l on l.part_id = p.id
    where p.category in ('accessory', 'earth-lead', 'wall-bracket', 'cable-set') and p.archived_at is null
    group by p.sku order by available, p.sku`);
  const scarce = stocked.rows[0]!;
  const plenty = stocked.rows.slice(-2);

  const make = async (who: Actor, companyId: string | undefined, reference: string, site: [string, string], body: { planIds?: string[]; lines?: { sku: string; qty: number }[]; preferredWarehouse?: string; contact?: string; notes?: string }) =>
    (await service.create(who, { companyId, reference, siteSuburb: site[0], sitePostcode: site[1], ...body })).job.id;

  const brightgum = ivy.companyId!;
  const southerly = hamish.companyId!;

  // Brightgum Electrical (Ivy)
  const fern = await make(ivy, undefined, 'BG-2041 Fern St', ['Thornbury', '3071'], { planIds: [await plan(ivy, 'Garage wall, 14 Fern St', hearth!.id, 3, 'Thornbury', '3071')], contact: 'Ivy Brennard 0400 000 101' });
  await service.order(ivy, fern);
  await service.reserve(sales, fern);

  const wattle = await make(ivy, undefined, 'BG-2042 Wattle Ave', ['Northcote', '3070'], { planIds: [await plan(ivy, 'Laundry, 3 Wattle Ave', tor!.id, 4, 'Northcote', '3070')], preferredWarehouse: 'NTH' });
  await service.order(ivy, wattle);

  const shortJob = await make(sales, brightgum, 'BG-2043 Creek Rd', ['Preston', '3072'], { lines: [{ sku: scarce.sku, qty: scarce.available + 4 }, { sku: plenty[0]!.sku, qty: 2 }], notes: 'Customer will wait for the rest; call before dispatch.' });
  await service.order(sales, shortJob);
  await service.reserve(sales, shortJob); // part-reserved: backorders waiting

  await make(ivy, undefined, 'BG-2044 Quote, Hill St', ['Reservoir', '3073'], { planIds: [await plan(ivy, 'Carport, 88 Hill St', hearth!.id, 2, 'Reservoir', '3073')] });

  const held = await make(sales, brightgum, 'BG-2045 Quote, Bay Rd', ['Coburg', '3058'], { lines: [{ sku: plenty[1]!.sku, qty: 3 }] });
  await service.reserve(sales, held); // a quote hold that lapses in a week

  const gone = await make(ivy, undefined, 'BG-2046 River Pde', ['Fairfield', '3078'], { lines: [{ sku: plenty[0]!.sku, qty: 1 }] });
  await service.order(ivy, gone);
  await service.cancel(sales, gone);

  // Southerly Solar & Storage (Hamish)
  const jetty = await make(hamish, undefined, 'SS-0317 Jetty Rd', ['Mornington', '3931'], { planIds: [await plan(hamish, 'Shed, 5 Jetty Rd', hearth!.id, 4, 'Mornington', '3931')], preferredWarehouse: 'NTH' });
  await service.order(sales, jetty); // Southerly pays by card: the desk ordered these after taking payment by phone
  await service.reserve(sales, jetty);

  const point = await make(hamish, undefined, 'SS-0318 Point Nepean', ['Sorrento', '3943'], { planIds: [await plan(hamish, 'Plant room, Point Nepean Rd', tor!.id, 5, 'Sorrento', '3943')] });
  await service.order(sales, point);
  await service.reserve(sales, point);

  const esplanade = await make(sales, southerly, 'SS-0319 Esplanade', ['Frankston', '3199'], { lines: [{ sku: scarce.sku, qty: 2 }, { sku: plenty[1]!.sku, qty: 4 }] });
  await service.order(sales, esplanade);
  await service.reserve(sales, esplanade); // queues behind BG-2043 for the scarce part

  await make(hamish, undefined, 'SS-0320 Main St', ['Hastings', '3915'], { lines: [{ sku: plenty[0]!.sku, qty: 6 }] });

  const tanti = await make(hamish, undefined, 'SS-0321 Tanti Ave', ['Mornington', '3931'], { lines: [{ sku: plenty[1]!.sku, qty: 2 }] });
  await service.order(sales, tanti);

  // One job the warehouse has started picking (the pick screen arrives with the warehouse work).
  const bluff = await make(sales, southerly, 'SS-0322 Bluff Rd', ['Mount Martha', '3934'], { lines: [{ sku: plenty[0]!.sku, qty: 2 }] });
  await service.order(sales, bluff);
  await service.reserve(sales, bluff);
  const warehouse = await actor(db, 'warehouse@stackyard.test');
  await db.transaction(async (tx) => {
    await tx.update(jobs).set({ status: 'picking', updatedAt: new Date() }).where(eq(jobs.id, bluff));
    await tx.insert(jobStatusHistory).values({ jobId: bluff, status: 'picking', userId: warehouse.userId });
  });

  await db.insert(settings).values({ key: SEED_KEY, value: { at: new Date().toISOString() } });
  return true;
}
