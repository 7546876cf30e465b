// The installer's side of things: what needs their attention, and plans they can have today.
import { asc, sql } from 'drizzle-orm';
import type { Db } from '../db/client.ts';
import { ranges } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { companyScopeOf } from '../policies/company-scope.ts';
import { AppError } from '../errors.ts';
import { jobTotals } from '@shared/domain/quote.ts';
import type { JobStatus } from '@shared/contracts/jobs.ts';
import type { StackPlanRequest, StackPlanResult } from '@shared/contracts/stack-plans.ts';
import type { AttentionReason, PlanAlternative } from '@shared/contracts/portal.ts';
import type { PlannerService } from './planner.ts';
import { PAYABLE } from './jobs.ts';

const kwh = (n: number) => `${n.toLocaleString('en-AU', { maximumFractionDigits: 1 })} kWh`;
const fullyAvailable = (p: StackPlanResult) => p.bom.every((l) => l.short === 0) && p.inverterFit?.fits !== false;

export function createPortalService({ db, planner }: { db: Db; planner: Pick<PlannerService, 'plan'> }) {
  /** A plan, or null when the planner refuses the request (a module count the range does not take). */
  async function tryPlan(actor: Actor, request: StackPlanRequest) {
    try {
      return await planner.plan(actor, request);
    } catch (e) {
      if (e instanceof AppError && e.status === 400) return null;
      throw e;
    }
  }

  return {
    async summary(actor: Actor, now = new Date()) {
      authorize(actor, 'jobs.view');
      const scope = companyScopeOf(actor);
      const mine = scope ? sql`j.company_id = ${scope}` : sql`true`;
      const [counts, attention] = await Promise.all([
        db.execute<{ status: JobStatus; count: number }>(sql`select j.status, count(*)::int as count from jobs j where ${mine} group by j.status`),
        db.execute<{ id: string; reference: string; status: JobStatus; reason: AttentionReason; units: number | null; at: Date | null; lines: { price: number | null; qty: number }[] | null }>(sql`
          select * from (
            select j.id, j.reference, j.status, 'unpaid' as reason, null::int as units, null::timestamptz as at,
              (select json_agg(json_build_object('price', jl.unit_price_cents, 'qty', jl.qty)) from job_lines jl where jl.job_id = j.id) as lines, j.updated_at as sort
            from jobs j join companies c on c.id = j.company_id
            where ${mine} and c.account_type = 'cash' and j.status in (${sql.join(PAYABLE.map((s) => sql`${s}`), sql`, `)})
              and not exists (select 1 from payments p where p.job_id = j.id and p.status in ('paid', 'refunded'))
              and (exists (select 1 from job_lines jl where jl.job_id = j.id) or exists (select 1 from job_plans jp where jp.job_id = j.id))
            union all
            select j.id, j.reference, j.status, 'backorder', (select sum(b.qty) from backorders b join job_lines jl on jl.id = b.job_line_id where jl.job_id = j.id)::int, null, null, j.updated_at
            from jobs j where ${mine} and exists (select 1 from backorders b join job_lines jl on jl.id = b.job_line_id where jl.job_id = j.id)
            union all
            select j.id, j.reference, j.status, 'ready', null, null, null, j.updated_at from jobs j where ${mine} and j.status = 'ready'
            union all
            select j.id, j.reference, j.status, 'quote-expiring', null, min(r.expires_at), null, j.updated_at
            from jobs j join job_lines jl on jl.job_id = j.id join reservations r on r.job_line_id = jl.id
            where ${mine} and j.status = 'draft' and r.expires_at is not null and r.expires_at < ${new Date(now.getTime() + 3 * 86_400_000)}
            group by j.id
          ) a order by sort desc limit 50`),
      ]);
      return {
        byStatus: counts.rows,
        attention: attention.rows.map((r) => {
          const lines = (r.lines ?? []).map((l) => ({ qty: l.qty, unitPriceCents: l.price }));
          return {
            id: r.id,
            reference: r.reference,
            status: r.status,
            reason: r.reason,
            units: r.units,
            // An unpaid draft whose plan lines are not copied yet has no amount until it is priced.
            amountCents: r.reason === 'unpaid' && lines.some((l) => l.unitPriceCents !== null) ? jobTotals(lines).totalCents : null,
            at: r.at ? new Date(r.at).toISOString() : null,
          };
        }),
      };
    },

    /**
     * When a plan has short lines: the nearest plans fully available now. Another module count in
     * the same range (the two nearest), and other ranges that fit the same inverter and reach the
     * same usable energy (the three cheapest), each with what changes and what it costs.
     */
    async alternatives(actor: Actor, request: StackPlanRequest) {
      authorize(actor, 'plans.create');
      const base = await planner.plan(actor, request);
      const short = base.bom.filter((l) => l.short > 0).map((l) => ({ sku: l.sku, name: l.name, short: l.short }));
      if (short.length === 0) return { short, alternatives: [] };
      const common = { inverterSku: request.inverterSku ?? null, stacks: request.stacks, site: request.site, includeInverter: request.includeInverter };
      const all = await db.select({ id: ranges.id, code: ranges.code }).from(ranges).orderBy(asc(ranges.code));
      const codeOf = new Map(all.map((r) => [r.id, r.code]));
      const describe = (kind: PlanAlternative['kind'], req: StackPlanRequest, p: StackPlanResult): PlanAlternative => {
        const changes: string[] = [];
        if (p.rangeId !== base.rangeId) changes.push(`${p.rangeName} instead of ${base.rangeName}`);
        if (p.modulesPerStack !== base.modulesPerStack || p.stacks !== base.stacks) changes.push(`${p.stacks} × ${p.modulesPerStack} modules instead of ${base.stacks} × ${base.modulesPerStack}`);
        const dk = Math.round((p.usableKwh - base.usableKwh) * 10) / 10;
        changes.push(dk === 0 ? `Same usable energy (${kwh(p.usableKwh)})` : `${kwh(p.usableKwh)} usable (${dk > 0 ? `${kwh(dk)} more` : `${kwh(-dk)} less`})`);
        if (p.heightMm !== base.heightMm) changes.push(`Stack ${Math.abs(p.heightMm - base.heightMm)} mm ${p.heightMm > base.heightMm ? 'taller' : 'shorter'}`);
        return { kind, request: req, rangeName: p.rangeName, rangeCode: codeOf.get(p.rangeId) ?? '', stacks: p.stacks, modulesPerStack: p.modulesPerStack, usableKwh: p.usableKwh, totalCents: p.totals.totalCents, differenceCents: p.totals.totalCents - base.totals.totalCents, changes };
      };

      // The same range, one module more or fewer first, then two.
      const sameRange: PlanAlternative[] = [];
      for (const step of [-1, 1, -2, 2, -3, 3]) {
        if (sameRange.length >= 2) break;
        const modules = base.modulesPerStack + step;
        if (modules < 1) continue;
        const req = { rangeId: base.rangeId, modules, ...common, stacks: base.stacks };
        const p = await tryPlan(actor, req);
        if (p && fullyAvailable(p)) sameRange.push(describe('modules', req, p));
      }

      // Other ranges sized for the same usable energy and inverter.
      const otherRanges: PlanAlternative[] = [];
      for (const r of all) {
        if (r.id === base.rangeId) continue;
        const req = { rangeId: r.id, targetUsableKwh: base.usableKwh, ...common, stacks: undefined };
        const p = await tryPlan(actor, req);
        if (p && fullyAvailable(p) && p.usableKwh >= base.usableKwh - 0.05) otherRanges.push(describe('range', req, p));
      }
      otherRanges.sort((a, b) => a.totalCents - b.totalCents);
      return { short, alternatives: [...sameRange, ...otherRanges.slice(0, 3)] };
    },
  };
}

export type PortalService = ReturnType<typeof createPortalService>;
