// Reserving a job: one transaction across all its lines, never more than is available.
import { asc, eq, inArray, sql } from 'drizzle-orm';
import type { Db, Tx } from '../db/client.ts';
import { bins, defaultBins, jobLines, warehouses } from '../db/schema/index.ts';
import { ConflictError, NotFoundError } from '../errors.ts';
import { lockPartLevels, type LockedLevel } from './ledger.ts';

export interface ReserveOutcome {
  reservedUnits: number;
  backorderedUnits: number;
}

/** What does not change while a job is reserved: its lines, the warehouses, bins and default bins. Read before any lock is taken. */
export async function reservationPlan(db: Db | Tx, jobId: string) {
  const lines = await db.select({ id: jobLines.id, partId: jobLines.partId, qty: jobLines.qty }).from(jobLines).where(eq(jobLines.jobId, jobId)).orderBy(asc(jobLines.lineNo));
  const partIds = [...new Set(lines.map((l) => l.partId))];
  const [whRows, binRows, defaults] = await Promise.all([
    db.select({ id: warehouses.id, rank: warehouses.rank, code: warehouses.code }).from(warehouses),
    partIds.length
      ? db
          .select({ warehouseId: bins.warehouseId, code: bins.code, pickOrder: bins.pickOrder })
          .from(bins)
          .where(sql`(${bins.warehouseId}, ${bins.code}) in (select warehouse_id, bin from stock_levels where part_id = any(${`{${partIds.join(',')}}`}::uuid[]))`)
      : [],
    partIds.length ? db.select().from(defaultBins).where(inArray(defaultBins.partId, partIds)) : [],
  ]);
  return { lines, partIds, whRows, binRows, defaults };
}
export type ReservationPlan = Awaited<ReturnType<typeof reservationPlan>>;

/**
 * Takes what each line still needs from the job's preferred warehouse first, then the others
 * by rank (those holds need a transfer); within a warehouse the part's default bin first, then
 * bins in pick order. What is still short becomes a backorder, unless the job is only a quote.
 * Lock order as in ledger.ts: the parts, their level rows, then the job. (The job's backorders
 * are only ever written under their part's lock, which this transaction holds for every line.)
 * Few round trips while the locks are held: the writes go as one statement each.
 */
export async function reserveInTx(tx: Tx, jobId: string, plan: ReservationPlan, opts: { userId: string | null; now: Date; quoteHoldMs: number; firmUpOnly?: boolean }): Promise<ReserveOutcome> {
  const { lines, partIds, whRows, binRows, defaults } = plan;
  const levels = await lockPartLevels(tx, partIds);
  // The job as it is now, under its lock: another request may have reserved, ordered or cancelled it meanwhile.
  const jobRows = await tx.execute<{ status: string; preferred_warehouse_id: string | null; held: Record<string, number> | null; quote_holds: boolean }>(sql`
    select j.status, j.preferred_warehouse_id,
      (select json_object_agg(r.job_line_id, r.qty) from (select job_line_id, sum(qty)::int as qty from reservations where job_line_id in (select id from job_lines where job_id = j.id) group by job_line_id) r) as held,
      exists (select 1 from reservations r join job_lines l on l.id = r.job_line_id where l.job_id = j.id and r.expires_at is not null) as quote_holds
    from jobs j where j.id = ${jobId} for update of j`);
  const job = jobRows.rows[0];
  if (!job) throw new NotFoundError('That job');
  if (!opts.firmUpOnly) assertReservable(job.status);
  const heldOf = new Map(Object.entries(job.held ?? {}));
  const full = lines.length > 0 && lines.every((l) => (heldOf.get(l.id) ?? 0) >= l.qty);
  if (full && !opts.firmUpOnly) throw new ConflictError('Every line of this job is already reserved.');

  const preferred = job.preferred_warehouse_id ?? [...whRows].sort((a, b) => a.rank - b.rank || a.code.localeCompare(b.code))[0]?.id ?? null;
  const whOrder = new Map(whRows.map((w) => [w.id, w.id === preferred ? -1 : w.rank]));
  const pickOrder = new Map(binRows.map((b) => [`${b.warehouseId}|${b.code}`, b.pickOrder]));
  const isDefault = new Set(defaults.map((d) => `${d.partId}|${d.warehouseId}|${d.bin}`));
  const place = (l: LockedLevel) => [whOrder.get(l.warehouseId) ?? 999, isDefault.has(`${l.partId}|${l.warehouseId}|${l.bin}`) ? 0 : 1, pickOrder.get(`${l.warehouseId}|${l.bin}`) ?? Number.MAX_SAFE_INTEGER] as const;
  const ordered = [...levels].sort((a, b) => {
    const pa = place(a);
    const pb = place(b);
    return pa[0] - pb[0] || pa[1] - pb[1] || pa[2] - pb[2] || (a.bin < b.bin ? -1 : a.bin > b.bin ? 1 : 0);
  });

  // A draft's reservation is a quote: it holds what is free for a while and queues for nothing.
  const isQuote = job.status === 'draft';
  const holdUntil = isQuote ? new Date(opts.now.getTime() + opts.quoteHoldMs) : null;
  const takes: { lineId: string; level: LockedLevel; qty: number }[] = [];
  const waiting: { lineId: string; partId: string; qty: number }[] = [];
  const settled: string[] = [];
  let reservedUnits = 0;
  for (const line of lines) {
    let need = line.qty - (heldOf.get(line.id) ?? 0);
    for (const level of ordered) {
      if (need <= 0) break;
      if (level.partId !== line.partId) continue;
      const take = Math.min(need, level.onHand - level.reserved);
      if (take <= 0) continue;
      takes.push({ lineId: line.id, level, qty: take });
      level.reserved += take;
      need -= take;
      reservedUnits += take;
    }
    if (need > 0) waiting.push({ lineId: line.id, partId: line.partId, qty: need });
    else settled.push(line.id);
  }

  if (takes.length) {
    const arr = (f: (t: (typeof takes)[number]) => string | number) => `{${takes.map((t) => `"${String(f(t)).replace(/["\\]/g, '\\$&')}"`).join(',')}}`;
    await tx.execute(sql`
      insert into reservations (job_line_id, part_id, warehouse_id, bin, qty, needs_transfer, expires_at)
      select l, p, w, b, q, w <> coalesce(${preferred}::uuid, w), ${holdUntil}::timestamptz
      from unnest(${arr((t) => t.lineId)}::uuid[], ${arr((t) => t.level.partId)}::uuid[], ${arr((t) => t.level.warehouseId)}::uuid[], ${arr((t) => t.level.bin)}::text[], ${arr((t) => t.qty)}::int[]) as x(l, p, w, b, q)
      on conflict (job_line_id, warehouse_id, bin) do update set qty = reservations.qty + excluded.qty, expires_at = excluded.expires_at`);
    // Per level row the units taken by all lines together (the CHECK constraint is the last line).
    const byLevel = new Map<string, { level: LockedLevel; qty: number }>();
    for (const t of takes) {
      const k = `${t.level.partId}|${t.level.warehouseId}|${t.level.bin}`;
      byLevel.set(k, { level: t.level, qty: (byLevel.get(k)?.qty ?? 0) + t.qty });
    }
    const rows = [...byLevel.values()];
    const col = (f: (r: (typeof rows)[number]) => string | number) => `{${rows.map((r) => `"${String(f(r)).replace(/["\\]/g, '\\$&')}"`).join(',')}}`;
    await tx.execute(sql`
      update stock_levels s set reserved = s.reserved + x.q, updated_at = now()
      from unnest(${col((r) => r.level.partId)}::uuid[], ${col((r) => r.level.warehouseId)}::uuid[], ${col((r) => r.level.bin)}::text[], ${col((r) => r.qty)}::int[]) as x(p, w, b, q)
      where s.part_id = x.p and s.warehouse_id = x.w and s.bin = x.b`);
  }
  if (isQuote) return { reservedUnits, backorderedUnits: 0 };

  // Backorders keep their place in the queue (created_at) while they shrink; settled lines drop theirs.
  if (waiting.length)
    await tx.execute(sql`
      insert into backorders (job_line_id, part_id, qty, created_at)
      select l, p, q, ${opts.now}::timestamptz from unnest(${`{${waiting.map((w) => w.lineId).join(',')}}`}::uuid[], ${`{${waiting.map((w) => w.partId).join(',')}}`}::uuid[], ${`{${waiting.map((w) => w.qty).join(',')}}`}::int[]) as x(l, p, q)
      on conflict (job_line_id) do update set qty = excluded.qty`);
  if (settled.length) await tx.execute(sql`delete from backorders where job_line_id = any(${`{${settled.join(',')}}`}::uuid[])`);
  // A firm reservation makes any quote holds on the job firm too.
  if (job.quote_holds) await tx.execute(sql`update reservations set expires_at = null where expires_at is not null and job_line_id in (select id from job_lines where job_id = ${jobId})`);
  const status = waiting.length === 0 ? 'reserved' : 'part-reserved';
  if (status !== job.status)
    await tx.execute(sql`
      with moved as (update jobs set status = ${status}, updated_at = ${opts.now} where id = ${jobId} returning id)
      insert into job_status_history (job_id, status, user_id, at) select id, ${status}, ${opts.userId}, ${opts.now} from moved`);
  return { reservedUnits, backorderedUnits: waiting.reduce((s, w) => s + w.qty, 0) };
}

/** Why a job cannot be reserved now, as a 409 the trade desk can act on. */
export function assertReservable(status: string) {
  if (status === 'cancelled') throw new ConflictError('This job is cancelled; its stock cannot be reserved.');
  if (status === 'closed') throw new ConflictError('This job is closed; its stock cannot be reserved.');
  if (status === 'reserved') throw new ConflictError('Every line of this job is already reserved.');
  if (!['draft', 'ordered', 'part-reserved'].includes(status)) throw new ConflictError(`This job is ${status}; reservations are settled once picking starts.`);
}
