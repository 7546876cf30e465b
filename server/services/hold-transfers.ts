// Units a job holds in other warehouses, moved to the warehouse it is picked from.
import { sql } from 'drizzle-orm';
import type { Tx } from '../db/client.ts';
import { ConflictError, ValidationError } from '../errors.ts';
import { addReservation, changeReserved, lockLevels, recordMovement, resolveBin, type LevelKey } from './ledger.ts';

interface Held extends LevelKey {
  id: string;
  jobLineId: string;
  sku: string;
  qty: number;
  expiresAt: Date | null;
}

/**
 * For each of the job's holds marked as needing a transfer: a transfer-out and a transfer-in
 * sharing one reference, and the hold moves with its units (into the part's default bin there,
 * else its fullest bin), so they are the job's the whole way and never free for anyone else.
 * Lock order as ledger.ts: the parts and level rows (sources and destinations), then the job.
 * Returns the units moved; the caller records the step in the job's history.
 */
export async function gatherHolds(tx: Tx, { jobId, preferred, reference, userId }: { jobId: string; preferred: { id: string; code: string }; reference: string; userId: string }) {
  const query = () =>
    tx.execute<{ id: string; job_line_id: string; part_id: string; sku: string; warehouse_id: string; bin: string; qty: number; expires_at: Date | null }>(sql`
      select r.id, r.job_line_id, r.part_id, p.sku, r.warehouse_id, r.bin, r.qty, r.expires_at
      from reservations r join job_lines l on l.id = r.job_line_id join parts p on p.id = r.part_id
      where l.job_id = ${jobId} and r.warehouse_id <> ${preferred.id}
      order by r.part_id, r.warehouse_id, r.bin`);
  const before = (await query()).rows;
  if (before.length === 0) throw new ConflictError('Nothing this job holds is outside its preferred warehouse.');
  const destinations = new Map<string, string>();
  for (const r of before) {
    if (destinations.has(r.part_id)) continue;
    const bin = await resolveBin(tx, r.part_id, preferred.id, undefined).catch((e: unknown) => {
      if (e instanceof ValidationError) throw new ConflictError(`${r.sku} has no bin in ${preferred.code} yet: set its default bin there (on the part's page) first.`);
      throw e;
    });
    destinations.set(r.part_id, bin);
  }
  const dest = (partId: string): LevelKey => ({ partId, warehouseId: preferred.id, bin: destinations.get(partId)! });
  await lockLevels(tx, [...before.map((r) => ({ partId: r.part_id, warehouseId: r.warehouse_id, bin: r.bin })), ...[...destinations.keys()].map(dest)]);
  // Holds are only written under their part's lock, which this transaction now has: read them again.
  const held: Held[] = (await query()).rows.map((r) => ({ id: r.id, jobLineId: r.job_line_id, partId: r.part_id, sku: r.sku, warehouseId: r.warehouse_id, bin: r.bin, qty: r.qty, expiresAt: r.expires_at }));
  let units = 0;
  for (const h of held) {
    const to = dest(h.partId);
    if (!destinations.has(h.partId)) continue; // a hold that appeared meanwhile waits for the next move
    // Reserved before on hand at the source, on hand before reserved at the destination: the
    // CHECK constraints (reserved ≤ on hand) hold after every statement.
    await changeReserved(tx, h, -h.qty);
    await tx.execute(sql`delete from reservations where id = ${h.id}`);
    await recordMovement(tx, { ...h, qty: -h.qty, kind: 'transfer-out', reason: 'Held units moved to the job’s warehouse', reference, jobId, userId });
    await recordMovement(tx, { ...to, qty: h.qty, kind: 'transfer-in', reason: 'Held units moved to the job’s warehouse', reference, jobId, userId });
    await addReservation(tx, { ...to, jobLineId: h.jobLineId, qty: h.qty, needsTransfer: false, expiresAt: h.expiresAt });
    units += h.qty;
  }
  return { units, movements: 2 * held.length };
}
