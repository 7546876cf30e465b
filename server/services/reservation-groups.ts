// Reservations that arrive while another one is committing wait, then commit together.
//
// A reservation holds its parts' row locks until its COMMIT is flushed to disk, so reservations
// of the same scarce part take turns at one flush each (about 10 ms on a shared machine: ~100 a
// second). Grouping is group commit done by the application: the reservations waiting at that
// moment run in one transaction, each job in its own savepoint, and share one flush. Every job is
// still allocated under the same locks and the same rules as alone (reservations.ts); a job that
// is refused rolls back to its savepoint and gets its own error, the others go on. Callers hear
// the outcome only after the group's COMMIT. Durability is unchanged (synchronous commit).
import type { Db } from '../db/client.ts';
import { inStockTransaction, isRetryable, lockParts, stockError } from './ledger.ts';
import { reserveInTx, type ReservationPlan, type ReserveOptions, type ReserveOutcome } from './reservations.ts';

interface Waiting {
  jobId: string;
  plan: ReservationPlan;
  opts: ReserveOptions;
  resolve: (outcome: ReserveOutcome) => void;
  reject: (error: unknown) => void;
}

type Result = { ok: true; outcome: ReserveOutcome } | { ok: false; error: unknown };

/** Returns `reserve(jobId, plan, opts)`, which resolves once that job's reservation is committed. */
export function createReservationGroups(db: Db, { maxGroup = 32 } = {}) {
  const queue: Waiting[] = [];
  let committing = false;

  async function commitGroup(group: Waiting[]) {
    const results = await inStockTransaction(db, async (tx) => {
      // Every part of the group first, in the global order (ledger.ts): a job's own lockParts
      // below then finds its locks already held, so the group waits on nobody in a circle.
      await lockParts(tx, group.flatMap((w) => w.plan.partIds));
      const out: Result[] = [];
      for (const w of group) {
        try {
          out.push({ ok: true, outcome: await tx.transaction((sp) => reserveInTx(sp, w.jobId, w.plan, w.opts)) });
        } catch (error) {
          if (isRetryable(error)) throw error; // the whole group again
          out.push({ ok: false, error: stockError(error) });
        }
      }
      return out;
    });
    results.forEach((r, i) => (r.ok ? group[i]!.resolve(r.outcome) : group[i]!.reject(r.error)));
  }

  async function drain() {
    committing = true;
    try {
      while (queue.length) {
        const group = queue.splice(0, maxGroup);
        await commitGroup(group).catch((error: unknown) => group.forEach((w) => w.reject(error)));
      }
    } finally {
      committing = false;
    }
  }

  return function reserve(jobId: string, plan: ReservationPlan, opts: ReserveOptions) {
    return new Promise<ReserveOutcome>((resolve, reject) => {
      queue.push({ jobId, plan, opts, resolve, reject });
      if (!committing) void drain();
    });
  };
}
