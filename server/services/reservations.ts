// Reserving a job: one transaction across all its lines, never more than is available.
import { and, asc, eq, inArray, sql } from 'drizzle-orm';
import type { Tx } from '../db/client.ts';
import { backorders, bins, defaultBins, jobLines, jobs, reservations, warehouses } from '../db/schema/index.ts';
import { ConflictError, NotFoundError } from '../errors.ts';
import { addReservation, heldByLine, lockPartLevels, settleStatus, type LockedLevel } from './ledger.ts';

export interface ReserveOutcome {
  reservedUnits: number;
  backorderedUnits: number;
}

/**
 * Takes what each line still needs from the job's preferred warehouse first, then the others
 * by rank (those holds need a transfer); within a warehouse the part's default bin first, then
 * bins in pick order. What is still short becomes a backorder, unless the job is only a quote.
 * Lock order as in ledger.ts: level rows, then the job's backorders, then the job.
 */
export async function reserveInTx(tx: Tx, jobId: string, opts: { userId: string | null; now: Date; quoteHoldMs: number; firmUpOnly?: boolean }): Promise<ReserveOutcome> {
  const lines = await tx.select({ id: jobLines.id, partId: jobLines.partId, qty: jobLines.qty, lineNo: jobLines.lineNo }).from(jobLines).where(eq(jobLines.jobId, jobId)).orderBy(asc(jobLines.lineNo));
  const partIds = [...new Set(lines.map((l) => l.partId))];
  const levels = await lockPartLevels(tx, partIds);
  await tx.execute(sql`select id from backorders where job_line_id in (select id from job_lines where job_id = ${jobId}) order by id for update`);
  // The job as it is now, under its lock: another request may have reserved, ordered or cancelled it meanwhile.
  const [job] = await tx.select({ id: jobs.id, status: jobs.status, preferredWarehouseId: jobs.preferredWarehouseId }).from(jobs).where(eq(jobs.id, jobId)).for('update');
  if (!job) throw new NotFoundError('That job');
  if (!opts.firmUpOnly) assertReservable(job.status);

  // One connection: its queries go one after another.
  const whRows = await tx.select({ id: warehouses.id, rank: warehouses.rank, code: warehouses.code }).from(warehouses);
  const binRows = await tx.select({ warehouseId: bins.warehouseId, code: bins.code, pickOrder: bins.pickOrder }).from(bins);
  const defaults = partIds.length ? await tx.select().from(defaultBins).where(inArray(defaultBins.partId, partIds)) : [];
  const preferred = job.preferredWarehouseId ?? [...whRows].sort((a, b) => a.rank - b.rank || a.code.localeCompare(b.code))[0]?.id ?? null;
  const whOrder = new Map(whRows.map((w) => [w.id, w.id === preferred ? -1 : w.rank]));
  const pickOrder = new Map(binRows.map((b) => [`${b.warehouseId}|${b.code}`, b.pickOrder]));
  const isDefault = new Set(defaults.map((d) => `${d.partId}|${d.warehouseId}|${d.bin}`));
  const place = (l: LockedLevel) => [whOrder.get(l.warehouseId) ?? 999, isDefault.has(`${l.partId}|${l.warehouseId}|${l.bin}`) ? 0 : 1, pickOrder.get(`${l.warehouseId}|${l.bin}`) ?? Number.MAX_SAFE_INTEGER] as const;
  const ordered = [...levels].sort((a, b) => {
    const pa = place(a);
    const pb = place(b);
    return pa[0] - pb[0] || pa[1] - pb[1] || pa[2] - pb[2] || (a.bin < b.bin ? -1 : a.bin > b.bin ? 1 : 0);
  });

  const { rows: held, full } = await heldByLine(tx, job.id);
  if (full && !opts.firmUpOnly) throw new ConflictError('Every line of this job is already reserved.');
  const heldOf = new Map(held.map((h) => [h.lineId, h.held]));
  // A draft's reservation is a quote: it holds what is free for a while and queues for nothing.
  const isQuote = job.status === 'draft';
  const holdUntil = isQuote ? new Date(opts.now.getTime() + opts.quoteHoldMs) : null;
  let reservedUnits = 0;
  let backorderedUnits = 0;
  for (const line of lines) {
    let need = line.qty - (heldOf.get(line.id) ?? 0);
    for (const level of ordered) {
      if (need <= 0) break;
      if (level.partId !== line.partId) continue;
      const take = Math.min(need, level.onHand - level.reserved);
      if (take <= 0) continue;
      await addReservation(tx, { partId: level.partId, warehouseId: level.warehouseId, bin: level.bin, jobLineId: line.id, qty: take, needsTransfer: preferred !== null && level.warehouseId !== preferred, expiresAt: holdUntil });
      level.reserved += take;
      need -= take;
      reservedUnits += take;
    }
    if (isQuote) continue;
    // The backorder keeps its place in the queue (created_at) while it shrinks.
    if (need > 0) {
      await tx
        .insert(backorders)
        .values({ jobLineId: line.id, partId: line.partId, qty: need, createdAt: opts.now })
        .onConflictDoUpdate({ target: backorders.jobLineId, set: { qty: need } });
      backorderedUnits += need;
    } else {
      await tx.delete(backorders).where(eq(backorders.jobLineId, line.id));
    }
  }
  if (!isQuote) {
    // A firm reservation makes any quote holds on the job firm too.
    await tx.update(reservations).set({ expiresAt: null }).where(and(inArray(reservations.jobLineId, lines.map((l) => l.id)), sql`${reservations.expiresAt} is not null`));
    await settleStatus(tx, job.id, opts.userId, opts.now, null);
  }
  return { reservedUnits, backorderedUnits };
}

/** Why a job cannot be reserved now, as a 409 the trade desk can act on. */
export function assertReservable(status: string) {
  if (status === 'cancelled') throw new ConflictError('This job is cancelled; its stock cannot be reserved.');
  if (status === 'closed') throw new ConflictError('This job is closed; its stock cannot be reserved.');
  if (status === 'reserved') throw new ConflictError('Every line of this job is already reserved.');
  if (!['draft', 'ordered', 'part-reserved'].includes(status)) throw new ConflictError(`This job is ${status}; reservations are settled once picking starts.`);
}
