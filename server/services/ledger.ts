// The stock ledger's building blocks, used inside a caller's transaction.
//
// Lock order, everywhere stock changes (so two transactions can never wait on each other in a circle):
//   0. the parts rows, ordered by id (FOR NO KEY UPDATE: catalogue foreign keys still pass)
//   1. stock_levels rows, ordered by (part_id, warehouse_id, bin)
//   2. backorders, ordered by (created_at, id)  — a job's own backorders by id
//   3. jobs, ordered by id
// The part lock makes everything that changes one part's stock take turns. Without it a receipt
// into a new bin and a reservation of the same part could each miss the other's uncommitted row
// (units left free while a backorder waits). Reservations are only written under these locks.
import { randomBytes } from 'node:crypto';
import { pgCode, pgConstraint } from '../db/errors.ts';
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import { executePrepared, type Db, type DbOrTx, type Tx } from '../db/client.ts';
import { backorders, defaultBins, jobLines, jobs, jobStatusHistory, parts, reservations, stockMovements, warehouses } from '../db/schema/index.ts';
import { ConflictError, ValidationError } from '../errors.ts';
import type { MovementKind } from '@shared/contracts/stock.ts';

export interface LevelKey {
  partId: string;
  warehouseId: string;
  bin: string;
}
export interface LockedLevel extends LevelKey {
  onHand: number;
  reserved: number;
}

const keyOf = (k: LevelKey) => `${k.partId}|${k.warehouseId}|${k.bin}`;
// PostgreSQL compares uuids bytewise, which for their canonical text is the same as comparing
// the lowercase strings; bins are text compared under the "C" collation below.
const compareKeys = (a: LevelKey, b: LevelKey) => (a.partId < b.partId ? -1 : a.partId > b.partId ? 1 : a.warehouseId < b.warehouseId ? -1 : a.warehouseId > b.warehouseId ? 1 : a.bin < b.bin ? -1 : a.bin > b.bin ? 1 : 0);


/**
 * Runs `fn` in one transaction and runs it again when PostgreSQL gives up on it for a reason
 * that a retry cures (serialization failure, deadlock): callers never see those. The CHECK
 * constraints on stock_levels stay the last line: a breach becomes a 409 saying what is short.
 */
export async function inStockTransaction<T>(db: Db, fn: (tx: Tx) => Promise<T>, attempts = 10): Promise<T> {
  for (let attempt = 1; ; attempt++) {
    try {
      return await db.transaction(fn);
    } catch (e) {
      if (isRetryable(e) && attempt < attempts) {
        await new Promise((r) => setTimeout(r, Math.random() * 5 * attempt));
        continue;
      }
      throw stockError(e);
    }
  }
}

/** A deadlock or serialization failure: running the whole transaction again cures it. */
export const isRetryable = (e: unknown) => ['40001', '40P01'].includes(pgCode(e) ?? '');

/** The error a caller sees: a breach of a stock CHECK constraint becomes a 409 saying what is short. */
export function stockError(e: unknown) {
  if (pgCode(e) === '23514' && /^stock_/.test(pgConstraint(e) ?? '')) {
    return new ConflictError('There is not enough stock for that: it would take on hand below zero or below what is reserved.', { constraint: pgConstraint(e) });
  }
  return e;
}

/**
 * Locks the given level rows in the global order, creating empty ones that do not exist yet
 * (a receipt into a new bin), and returns them by key.
 */
export async function lockLevels(tx: Tx, keys: LevelKey[]): Promise<Map<string, LockedLevel>> {
  const unique = [...new Map(keys.map((k) => [keyOf(k), k])).values()].sort(compareKeys);
  if (unique.length === 0) return new Map();
  await lockParts(tx, unique.map((k) => k.partId));
  await tx.execute(sql`
    insert into stock_levels (part_id, warehouse_id, bin)
    select * from unnest(${`{${unique.map((k) => k.partId).join(',')}}`}::uuid[], ${`{${unique.map((k) => k.warehouseId).join(',')}}`}::uuid[], ${toPgArray(unique.map((k) => k.bin))}::text[])
    on conflict do nothing`);
  const rows = await tx.execute<{ part_id: string; warehouse_id: string; bin: string; on_hand: number; reserved: number }>(sql`
    select l.part_id, l.warehouse_id, l.bin, l.on_hand, l.reserved
    from stock_levels l
    join unnest(${`{${unique.map((k) => k.partId).join(',')}}`}::uuid[], ${`{${unique.map((k) => k.warehouseId).join(',')}}`}::uuid[], ${toPgArray(unique.map((k) => k.bin))}::text[]) as k(part_id, warehouse_id, bin)
      on k.part_id = l.part_id and k.warehouse_id = l.warehouse_id and k.bin = l.bin
    order by l.part_id, l.warehouse_id, l.bin collate "C"
    for update of l`);
  return new Map(rows.rows.map((r) => [keyOf({ partId: r.part_id, warehouseId: r.warehouse_id, bin: r.bin }), { partId: r.part_id, warehouseId: r.warehouse_id, bin: r.bin, onHand: r.on_hand, reserved: r.reserved }]));
}

/** Locks every level row of these parts, in the global order. */
export async function lockPartLevels(tx: Tx, partIds: string[]): Promise<LockedLevel[]> {
  if (partIds.length === 0) return [];
  await lockParts(tx, partIds);
  const rows = await executePrepared<{ part_id: string; warehouse_id: string; bin: string; on_hand: number; reserved: number }>(tx, sql`
    select part_id, warehouse_id, bin, on_hand, reserved from stock_levels
    where part_id = any(${`{${[...new Set(partIds)].join(',')}}`}::uuid[])
    order by part_id, warehouse_id, bin collate "C"
    for update`);
  return rows.rows.map((r) => ({ partId: r.part_id, warehouseId: r.warehouse_id, bin: r.bin, onHand: r.on_hand, reserved: r.reserved }));
}

/** Step 0 of the lock order; the statements after it see every row committed before it was granted. */
export async function lockParts(tx: Tx, partIds: string[]) {
  await executePrepared(tx, sql`select id from parts where id = any(${`{${[...new Set(partIds)].join(',')}}`}::uuid[]) order by id for no key update`);
}

function toPgArray(values: string[]) {
  return `{${values.map((v) => `"${v.replace(/["\\]/g, (c) => `\\${c}`)}"`).join(',')}}`;
}

export { keyOf as levelKey };

export interface MovementInput extends LevelKey {
  qty: number;
  kind: MovementKind;
  reason?: string | null;
  reference?: string | null;
  jobId?: string | null;
  userId: string | null;
}

/** One immutable movement and its level row's on-hand change, in the caller's transaction (the row is already locked). */
export async function recordMovement(tx: Tx, m: MovementInput) {
  await tx.execute(sql`update stock_levels set on_hand = on_hand + ${m.qty}, updated_at = now() where part_id = ${m.partId} and warehouse_id = ${m.warehouseId} and bin = ${m.bin}`);
  await tx.insert(stockMovements).values({ partId: m.partId, warehouseId: m.warehouseId, bin: m.bin, qty: m.qty, kind: m.kind, reason: m.reason ?? null, reference: m.reference ?? null, jobId: m.jobId ?? null, userId: m.userId });
}

/** Changes a locked level row's reserved count (the CHECK constraint refuses more than on hand). */
export async function changeReserved(tx: Tx, k: LevelKey, delta: number) {
  if (delta === 0) return;
  await tx.execute(sql`update stock_levels set reserved = reserved + ${delta}, updated_at = now() where part_id = ${k.partId} and warehouse_id = ${k.warehouseId} and bin = ${k.bin}`);
}

/** Adds units to a line's reservation in one bin. */
export async function addReservation(tx: Tx, r: LevelKey & { jobLineId: string; qty: number; needsTransfer: boolean; expiresAt: Date | null }) {
  await tx.execute(sql`
    insert into reservations (job_line_id, part_id, warehouse_id, bin, qty, needs_transfer, expires_at)
    values (${r.jobLineId}, ${r.partId}, ${r.warehouseId}, ${r.bin}, ${r.qty}, ${r.needsTransfer}, ${r.expiresAt})
    on conflict (job_line_id, warehouse_id, bin) do update set qty = reservations.qty + excluded.qty, expires_at = excluded.expires_at`);
  await changeReserved(tx, r, r.qty);
}

export function newReference(prefix: string, now = new Date()) {
  return `${prefix}-${now.toISOString().slice(0, 10).replace(/-/g, '')}-${randomBytes(3).toString('hex').toUpperCase()}`;
}

/** SKUs to part ids; an unknown SKU is a 400 naming it. */
export async function partsBySku(db: DbOrTx, skus: string[], path = 'sku') {
  const wanted = [...new Set(skus.map((s) => s.toUpperCase()))];
  const rows = wanted.length ? await db.select({ id: parts.id, sku: parts.sku, name: parts.name, listPriceCents: parts.listPriceCents }).from(parts).where(inArray(parts.sku, wanted)) : [];
  const found = new Map(rows.map((r) => [r.sku, r]));
  const missing = wanted.filter((s) => !found.has(s));
  if (missing.length) throw new ValidationError(`There is no part ${missing.join(', ')}.`, { fields: missing.map((s) => ({ path, message: `There is no part ${s}.` })) });
  return found;
}

/** A warehouse by code; an unknown one is a 400 naming it. */
export async function warehouseByCode(db: DbOrTx, code: string, path = 'warehouse') {
  const [row] = await db.select().from(warehouses).where(eq(warehouses.code, code.toUpperCase()));
  if (!row) throw new ValidationError(`There is no warehouse ${code}.`, { fields: [{ path, message: `There is no warehouse ${code}.` }] });
  return row;
}

/** The bin to use: the one given, else the part's default bin there, else the bin it already sits in. */
export async function resolveBin(db: DbOrTx, partId: string, warehouseId: string, given: string | undefined, path = 'bin') {
  if (given) return given.toUpperCase();
  const [d] = await db.select({ bin: defaultBins.bin }).from(defaultBins).where(and(eq(defaultBins.partId, partId), eq(defaultBins.warehouseId, warehouseId)));
  if (d) return d.bin;
  const rows = await db.execute<{ bin: string }>(sql`select bin from stock_levels where part_id = ${partId} and warehouse_id = ${warehouseId} order by on_hand desc, bin limit 1`);
  if (rows.rows[0]) return rows.rows[0].bin;
  throw new ValidationError('This part has no bin in that warehouse yet: name one.', { fields: [{ path, message: 'Name the bin.' }] });
}

export interface FilledJob {
  id: string;
  reference: string;
  company: string;
  status: string;
  units: number;
}

/**
 * After units arrive in a (locked) level row, hands them to waiting backorders of that part,
 * oldest first, and moves jobs whose every line is now held to "reserved".
 */
export async function fillBackorders(tx: Tx, arrivals: LockedLevel[], now: Date): Promise<Map<string, number>> {
  const given = new Map<string, number>(); // job id → units
  for (const level of arrivals) {
    let free = level.onHand - level.reserved;
    if (free <= 0) continue;
    const waiting = await tx
      .select({ id: backorders.id, jobLineId: backorders.jobLineId, qty: backorders.qty, jobId: jobLines.jobId, preferred: jobs.preferredWarehouseId })
      .from(backorders)
      .innerJoin(jobLines, eq(jobLines.id, backorders.jobLineId))
      .innerJoin(jobs, eq(jobs.id, jobLines.jobId))
      .where(eq(backorders.partId, level.partId))
      .orderBy(asc(backorders.createdAt), asc(backorders.id))
      .for('update', { of: backorders });
    for (const b of waiting) {
      if (free <= 0) break;
      const take = Math.min(free, b.qty);
      await addReservation(tx, { ...level, jobLineId: b.jobLineId, qty: take, needsTransfer: b.preferred !== null && b.preferred !== level.warehouseId, expiresAt: null });
      if (take === b.qty) await tx.delete(backorders).where(eq(backorders.id, b.id));
      else await tx.update(backorders).set({ qty: b.qty - take }).where(eq(backorders.id, b.id));
      free -= take;
      level.reserved += take;
      given.set(b.jobId, (given.get(b.jobId) ?? 0) + take);
    }
  }
  for (const jobId of [...given.keys()].sort()) await settleStatus(tx, jobId, null, now, 'Backorder filled from a receipt');
  return given;
}

/** Units held per line of a job, and whether every line is fully held. */
export async function heldByLine(tx: DbOrTx, jobId: string) {
  const rows = await tx
    .select({ lineId: jobLines.id, qty: jobLines.qty, held: sql<number>`coalesce((select sum(r.qty) from reservations r where r.job_line_id = "job_lines"."id"), 0)::int` })
    .from(jobLines)
    .where(eq(jobLines.jobId, jobId));
  return { rows, full: rows.length > 0 && rows.every((r) => r.held >= r.qty) };
}

/** For an ordered job: "reserved" when every line is held, else "part-reserved"; records the change. */
export async function settleStatus(tx: Tx, jobId: string, userId: string | null, now: Date, note: string | null) {
  const [job] = await tx.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, jobId)).for('update');
  if (!job || !['ordered', 'reserved', 'part-reserved'].includes(job.status)) return job?.status;
  const { full } = await heldByLine(tx, jobId);
  const status = full ? 'reserved' : 'part-reserved';
  if (status !== job.status) {
    await tx.update(jobs).set({ status, updatedAt: now }).where(eq(jobs.id, jobId));
    await tx.insert(jobStatusHistory).values({ jobId, status, userId, note, at: now });
  }
  return status;
}

/**
 * Releases every unit a job holds (or only lapsed quote holds) and drops its backorders; the
 * freed units go to other jobs' waiting backorders at once, oldest first. Locks every level
 * row of the job's parts first, as reserving does, so the two queue behind each other.
 */
export async function releaseJobHolds(tx: Tx, jobId: string, { onlyExpiredBy, now }: { onlyExpiredBy?: Date; now: Date }) {
  const lineParts = await tx.selectDistinct({ partId: jobLines.partId }).from(jobLines).where(eq(jobLines.jobId, jobId));
  const levels = await lockPartLevels(tx, lineParts.map((l) => l.partId));
  await tx.execute(sql`select id from backorders where job_line_id in (select id from job_lines where job_id = ${jobId}) order by id for update`);
  const held = await tx
    .select({ id: reservations.id, partId: reservations.partId, warehouseId: reservations.warehouseId, bin: reservations.bin, qty: reservations.qty, expiresAt: reservations.expiresAt })
    .from(reservations)
    .innerJoin(jobLines, eq(jobLines.id, reservations.jobLineId))
    .where(eq(jobLines.jobId, jobId));
  const toRelease = onlyExpiredBy ? held.filter((r) => r.expiresAt && r.expiresAt <= onlyExpiredBy) : held;
  const byKey = new Map(levels.map((l) => [keyOf(l), l]));
  for (const r of toRelease) {
    await changeReserved(tx, r, -r.qty);
    await tx.delete(reservations).where(eq(reservations.id, r.id));
    const level = byKey.get(keyOf(r));
    if (level) level.reserved -= r.qty;
  }
  if (!onlyExpiredBy) await tx.delete(backorders).where(inArray(backorders.jobLineId, tx.select({ id: jobLines.id }).from(jobLines).where(eq(jobLines.jobId, jobId))));
  const freed = new Set(toRelease.map((r) => keyOf(r)));
  const given = await fillBackorders(tx, levels.filter((l) => freed.has(keyOf(l))), now);
  return { units: toRelease.reduce((s, r) => s + r.qty, 0), given };
}
