// Reserving a job: one transaction across all its lines, never more than is available.
import { sql, type SQL } from 'drizzle-orm';
import { executePrepared, type Db, type Tx } from '../db/client.ts';
import { ConflictError, NotFoundError } from '../errors.ts';
import { lockParts, type LockedLevel } from './ledger.ts';

export interface ReserveOutcome {
  reservedUnits: number;
  backorderedUnits: number;
}

export interface ReserveOptions {
  userId: string | null;
  now: Date;
  quoteHoldMs: number;
  /** Only make quote holds firm (ordering a job that already holds stock); no status checks. */
  firmUpOnly?: boolean;
}

export interface ReservationPlan {
  lines: { id: string; partId: string; qty: number }[];
  partIds: string[];
  whRows: { id: string; rank: number; code: string }[];
  binRows: { warehouseId: string; code: string; pickOrder: number }[];
  defaults: { partId: string; warehouseId: string; bin: string }[];
}

/**
 * What does not change while a job is reserved: its lines, the warehouses, and the bins and
 * default bins of its parts. Read before any lock is taken, in one round trip.
 */
export async function reservationPlan(db: Db | Tx, jobId: string): Promise<ReservationPlan> {
  const rows = await executePrepared<{ lines: ReservationPlan['lines']; wh: ReservationPlan['whRows']; bins: ReservationPlan['binRows']; defaults: ReservationPlan['defaults'] }>(db, sql`
    with l as (select id, part_id, qty, line_no from job_lines where job_id = ${jobId}),
         p as (select distinct part_id from l)
    select
      (select coalesce(json_agg(json_build_object('id', id, 'partId', part_id, 'qty', qty) order by line_no), '[]') from l) as lines,
      (select coalesce(json_agg(json_build_object('id', id, 'rank', rank, 'code', code)), '[]') from warehouses) as wh,
      (select coalesce(json_agg(json_build_object('warehouseId', b.warehouse_id, 'code', b.code, 'pickOrder', b.pick_order)), '[]') from bins b
        where (b.warehouse_id, b.code) in (select warehouse_id, bin from stock_levels where part_id in (select part_id from p))) as bins,
      (select coalesce(json_agg(json_build_object('partId', d.part_id, 'warehouseId', d.warehouse_id, 'bin', d.bin)), '[]') from default_bins d
        where d.part_id in (select part_id from p)) as defaults`);
  const r = rows.rows[0]!;
  return { lines: r.lines, partIds: [...new Set(r.lines.map((l) => l.partId))], whRows: r.wh, binRows: r.bins, defaults: r.defaults };
}

/**
 * Takes what each line still needs from the job's preferred warehouse first, then the others
 * by rank (those holds need a transfer); within a warehouse the part's default bin first, then
 * bins in pick order. What is still short becomes a backorder, unless the job is only a quote.
 * Lock order as in ledger.ts: the parts, their level rows, then the job. (The job's backorders
 * are only ever written under their part's lock, which this transaction holds for every line.)
 * Few round trips while the locks are held: the level rows and the job in one statement, every
 * write in one more, each a prepared statement.
 */
export async function reserveInTx(tx: Tx, jobId: string, plan: ReservationPlan, opts: ReserveOptions): Promise<ReserveOutcome> {
  const { lines, partIds, whRows, binRows, defaults } = plan;
  // Step 0 of the lock order (the parts) on its own, so the next statement's snapshot sees every
  // level row committed before the part locks were granted. Then the level rows (step 1) and the
  // job (step 3) in one statement: with the parts held, no other transaction locks these level
  // rows, so the order of those two cannot close a circle.
  await lockParts(tx, partIds);
  // The job as it is now, under its lock: another request may have reserved, ordered or cancelled it meanwhile.
  const jobRows = await executePrepared<{ levels: LockedLevel[]; status: string; preferred_warehouse_id: string | null; held: Record<string, number> | null; quote_holds: boolean }>(tx, sql`
    select
      (select coalesce(json_agg(json_build_object('partId', lv.part_id, 'warehouseId', lv.warehouse_id, 'bin', lv.bin, 'onHand', lv.on_hand, 'reserved', lv.reserved)), '[]')
        from (select part_id, warehouse_id, bin, on_hand, reserved from stock_levels where part_id = any(${`{${partIds.join(',')}}`}::uuid[])
              order by part_id, warehouse_id, bin collate "C" for update) lv) as levels,
      j.status, j.preferred_warehouse_id,
      (select json_object_agg(r.job_line_id, r.qty) from (select job_line_id, sum(qty)::int as qty from reservations where job_line_id in (select id from job_lines where job_id = j.id) group by job_line_id) r) as held,
      exists (select 1 from reservations r join job_lines l on l.id = r.job_line_id where l.job_id = j.id and r.expires_at is not null) as quote_holds
    from jobs j where j.id = ${jobId} for update of j`);
  const job = jobRows.rows[0];
  if (!job) throw new NotFoundError('That job');
  const levels = job.levels;
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

  // Every write goes in one statement (data-modifying CTEs touching different tables); the
  // CHECK constraints on stock_levels still refuse more than on hand.
  const writes: SQL[] = [];
  if (takes.length) {
    writes.push(sql`res as (
      insert into reservations (job_line_id, part_id, warehouse_id, bin, qty, needs_transfer, expires_at)
      select l, p, w, b, q, w <> coalesce(${preferred}::uuid, w), ${holdUntil}::timestamptz
      from unnest(${pgArray(takes.map((t) => t.lineId))}::uuid[], ${pgArray(takes.map((t) => t.level.partId))}::uuid[], ${pgArray(takes.map((t) => t.level.warehouseId))}::uuid[], ${pgArray(takes.map((t) => t.level.bin))}::text[], ${pgArray(takes.map((t) => t.qty))}::int[]) as x(l, p, w, b, q)
      on conflict (job_line_id, warehouse_id, bin) do update set qty = reservations.qty + excluded.qty, expires_at = excluded.expires_at
      returning 1)`);
    // Per level row the units taken by all lines together (one update per row in a statement).
    const byLevel = new Map<string, { level: LockedLevel; qty: number }>();
    for (const t of takes) {
      const k = `${t.level.partId}|${t.level.warehouseId}|${t.level.bin}`;
      byLevel.set(k, { level: t.level, qty: (byLevel.get(k)?.qty ?? 0) + t.qty });
    }
    const rows = [...byLevel.values()];
    writes.push(sql`lv as (
      update stock_levels s set reserved = s.reserved + x.q, updated_at = now()
      from unnest(${pgArray(rows.map((r) => r.level.partId))}::uuid[], ${pgArray(rows.map((r) => r.level.warehouseId))}::uuid[], ${pgArray(rows.map((r) => r.level.bin))}::text[], ${pgArray(rows.map((r) => r.qty))}::int[]) as x(p, w, b, q)
      where s.part_id = x.p and s.warehouse_id = x.w and s.bin = x.b
      returning 1)`);
  }
  // Backorders keep their place in the queue (created_at) while they shrink; settled lines drop theirs.
  // A draft's reservation is a quote: it queues for nothing and leaves the status alone.
  const status = waiting.length === 0 ? 'reserved' : 'part-reserved';
  if (!isQuote) {
    if (waiting.length)
      writes.push(sql`bo as (
        insert into backorders (job_line_id, part_id, qty, created_at)
        select l, p, q, ${opts.now}::timestamptz from unnest(${pgArray(waiting.map((w) => w.lineId))}::uuid[], ${pgArray(waiting.map((w) => w.partId))}::uuid[], ${pgArray(waiting.map((w) => w.qty))}::int[]) as x(l, p, q)
        on conflict (job_line_id) do update set qty = excluded.qty
        returning 1)`);
    if (settled.length) writes.push(sql`bd as (delete from backorders where job_line_id = any(${pgArray(settled)}::uuid[]) returning 1)`);
    if (status !== job.status)
      writes.push(
        sql`moved as (update jobs set status = ${status}, updated_at = ${opts.now} where id = ${jobId} returning id)`,
        sql`hist as (insert into job_status_history (job_id, status, user_id, at) select id, ${status}, ${opts.userId}, ${opts.now} from moved returning 1)`,
      );
  }
  if (writes.length) await executePrepared(tx, sql`with ${sql.join(writes, sql`, `)} select 1`);
  if (isQuote) return { reservedUnits, backorderedUnits: 0 };
  // A firm reservation makes any quote holds on the job firm too (after the upsert above: one change per row per statement).
  if (job.quote_holds) await executePrepared(tx, sql`update reservations set expires_at = null where expires_at is not null and job_line_id in (select id from job_lines where job_id = ${jobId})`);
  return { reservedUnits, backorderedUnits: waiting.reduce((s, w) => s + w.qty, 0) };
}

/** Why a job cannot be reserved now, as a 409 the trade desk can act on. */
export function assertReservable(status: string) {
  if (status === 'cancelled') throw new ConflictError('This job is cancelled; its stock cannot be reserved.');
  if (status === 'closed') throw new ConflictError('This job is closed; its stock cannot be reserved.');
  if (status === 'reserved') throw new ConflictError('Every line of this job is already reserved.');
  if (!['draft', 'ordered', 'part-reserved'].includes(status)) throw new ConflictError(`This job is ${status}; reservations are settled once picking starts.`);
}

/** A PostgreSQL array literal of these values, sent as one parameter. */
function pgArray(values: (string | number)[]) {
  return `{${values.map((v) => `"${String(v).replace(/["\\]/g, '\\$&')}"`).join(',')}}`;
}
