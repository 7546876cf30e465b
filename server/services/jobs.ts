import { and, asc, desc, eq, gte, ilike, lt, sql, type SQL } from 'drizzle-orm';
import { likeLiteral } from '../db/like.ts';
import type { Db, Tx } from '../db/client.ts';
import { pgCode, isUuid } from '../db/errors.ts';
import { companies, jobLines, jobPlans, jobs, jobStatusHistory, reservations, warehouses } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { assertCanSeeCompany, companyForNew, companyScopeOf, isCompanyBound } from '../policies/company-scope.ts';
import { can } from '@shared/roles.ts';
import { ConflictError, NotFoundError, ValidationError } from '../errors.ts';
import type { CreateJobInput, DispatchInput, JobListQuery, JobStatus } from '@shared/contracts/jobs.ts';
import type { PlannerService } from './planner.ts';
import { createReservationGroups } from './reservation-groups.ts';
import { heldByLine, inStockTransaction, newReference, partsBySku, releaseJobHolds, warehouseByCode } from './ledger.ts';
import { gatherHolds } from './hold-transfers.ts';
import { assertReservable, reservationPlan, reserveInTx } from './reservations.ts';
import type { MailService } from './mail.ts';
import { customerDiscountPct, unitPriceFor } from './pricing.ts';

export interface JobDeps {
  db: Db;
  planner: Pick<PlannerService, 'replanSaved' | 'findPlan'>;
  /** The clock, injected so quote expiry can be tested by moving time rather than waiting. */
  now?: () => Date;
  /** How long a quote (a draft's reservation) holds its units. */
  quoteHoldDays?: number;
  /** Messages about the job, written in the transaction of the change they report. */
  mail?: Pick<MailService, 'jobOrdered' | 'jobBackorders' | 'jobStatusChanged'>;
  /** Runs after a job is cancelled (a card payment is refunded). */
  onCancelled?: (jobId: string) => Promise<void>;
}

const BEFORE_PICKING: JobStatus[] = ['draft', 'ordered', 'reserved', 'part-reserved'];
/** Card accounts pay to place the order (a draft); what the desk orders for them it settles itself. A job is invoiced once ordered. */
export const PAYABLE: JobStatus[] = ['draft'];
export const INVOICED: JobStatus[] = ['ordered', 'reserved', 'part-reserved', 'picking', 'ready', 'dispatched', 'collected', 'closed'];
type JobRow = typeof jobs.$inferSelect;

export function createJobService({ db, planner, now = () => new Date(), quoteHoldDays = 7, mail, onCancelled }: JobDeps) {
  const reserveGrouped = createReservationGroups(db);
  const jobByIdQuery = db.select().from(jobs).where(eq(jobs.id, sql.placeholder('id'))).prepare('job_by_id');
  /** The job if the actor may see it; another company's job is "not found". */
  async function visibleJob(actor: Actor, id: string, tx: Db | Tx = db): Promise<JobRow> {
    if (!isUuid(id)) throw new NotFoundError('That job');
    const [row] = tx === db ? await jobByIdQuery.execute({ id }) : await tx.select().from(jobs).where(eq(jobs.id, id));
    if (!row) throw new NotFoundError('That job');
    assertCanSeeCompany(actor, row.companyId, 'That job');
    return row;
  }

  async function record(tx: Tx, jobId: string, status: JobStatus, userId: string | null, note: string | null = null) {
    const at = now();
    await tx.update(jobs).set({ status, updatedAt: at }).where(eq(jobs.id, jobId));
    await tx.insert(jobStatusHistory).values({ jobId, status, userId, note, at });
  }

  /** The saved plans' BOM lines as they are today, ready to copy into the job. */
  async function planLines(actor: Actor, jobId: string) {
    const attached = await db.select({ planId: jobPlans.planId }).from(jobPlans).where(eq(jobPlans.jobId, jobId));
    const out: { sku: string; qty: number; planId: string; reason: string }[] = [];
    for (const { planId } of attached) {
      const { plan } = await planner.replanSaved(actor, planId);
      for (const l of plan.bom) if (l.qtyUnits > 0) out.push({ sku: l.sku, qty: l.qtyUnits, planId, reason: l.reason });
    }
    return out;
  }

  /** Copies the plans' lines in once (at ordering, or when a quote first holds stock). */
  async function copyPlanLines(tx: Tx, job: JobRow, lines: { sku: string; qty: number; planId: string; reason: string }[]) {
    if (job.linesCopiedAt) return;
    const found = await partsBySku(tx, lines.map((l) => l.sku));
    const [last] = await tx.select({ n: sql<number>`coalesce(max(${jobLines.lineNo}), 0)::int` }).from(jobLines).where(eq(jobLines.jobId, job.id));
    let lineNo = last?.n ?? 0;
    const discount = await customerDiscountPct(tx, job.companyId);
    if (lines.length)
      await tx.insert(jobLines).values(lines.map((l) => ({ jobId: job.id, lineNo: ++lineNo, partId: found.get(l.sku)!.id, qty: l.qty, planId: l.planId, reason: l.reason, unitPriceCents: unitPriceFor(found.get(l.sku)!, discount) })));
    await tx.update(jobs).set({ linesCopiedAt: now() }).where(eq(jobs.id, job.id));
  }

  // The job with its company, preferred warehouse, plans, lines, holds, backorders and history
  // in one round trip (the lists as JSON, timestamps turned back into dates in detail()). A named
  // prepared statement: each connection plans it once instead of on every read.
  const jobDetailQuery = db
    .select({
      job: jobs,
      company: { id: companies.id, name: companies.name },
      accountType: companies.accountType,
      payment: sql<{ status: 'paid' | 'refunded'; amountCents: number; paidAt: string } | null>`(select json_build_object('status', p.status, 'amountCents', p.amount_cents, 'paidAt', p.paid_at)
        from payments p where p.job_id = "jobs"."id" and p.status in ('paid', 'refunded') order by p.paid_at desc limit 1)`,
      preferredCode: warehouses.code,
      preferredName: warehouses.name,
      plans: sql<{ id: string; name: string; rangeName: string; summary: unknown }[]>`(select coalesce(json_agg(json_build_object('id', sp.id, 'name', sp.name, 'rangeName', rg.name, 'summary', sp.summary) order by sp.name), '[]')
        from job_plans jp join stack_plans sp on sp.id = jp.plan_id join ranges rg on rg.id = sp.range_id where jp.job_id = "jobs"."id")`,
      lines: sql<{ id: string; lineNo: number; sku: string; name: string; qty: number; planId: string | null; planName: string | null; reason: string; unitPriceCents: number; reserved: number; backordered: number; available: number }[]>`(select coalesce(json_agg(json_build_object(
          'id', jl.id, 'lineNo', jl.line_no, 'sku', p.sku, 'name', p.name, 'qty', jl.qty, 'planId', jl.plan_id, 'planName', sp.name, 'reason', jl.reason, 'unitPriceCents', jl.unit_price_cents,
          'reserved', coalesce((select sum(r.qty) from reservations r where r.job_line_id = jl.id), 0)::int,
          'backordered', coalesce((select b.qty from backorders b where b.job_line_id = jl.id), 0)::int,
          'available', coalesce((select sum(l.on_hand - l.reserved) from stock_levels l where l.part_id = jl.part_id), 0)::int) order by jl.line_no), '[]')
        from job_lines jl join parts p on p.id = jl.part_id left join stack_plans sp on sp.id = jl.plan_id where jl.job_id = "jobs"."id")`,
      held: sql<{ sku: string; warehouse: string; bin: string; qty: number; needsTransfer: boolean; expiresAt: string | null }[]>`(select coalesce(json_agg(json_build_object('sku', p.sku, 'warehouse', w.code, 'bin', r.bin, 'qty', r.qty, 'needsTransfer', r.needs_transfer, 'expiresAt', r.expires_at) order by jl.line_no, w.rank, r.bin), '[]')
        from reservations r join job_lines jl on jl.id = r.job_line_id join parts p on p.id = r.part_id join warehouses w on w.id = r.warehouse_id where jl.job_id = "jobs"."id")`,
      queue: sql<{ sku: string; qty: number; since: string; position: number; unitsAhead: number }[]>`(select coalesce(json_agg(json_build_object('sku', p.sku, 'qty', b.qty, 'since', b.created_at,
          'position', (select count(*) + 1 from backorders o where o.part_id = b.part_id and (o.created_at, o.id) < (b.created_at, b.id))::int,
          'unitsAhead', (select coalesce(sum(o.qty), 0) from backorders o where o.part_id = b.part_id and (o.created_at, o.id) < (b.created_at, b.id))::int) order by jl.line_no), '[]')
        from backorders b join job_lines jl on jl.id = b.job_line_id join parts p on p.id = b.part_id where jl.job_id = "jobs"."id")`,
      history: sql<{ status: string; at: string; by: string | null; note: string | null }[]>`(select coalesce(json_agg(json_build_object('status', h.status, 'at', h.at, 'by', u.name, 'note', h.note) order by h.at, h.id), '[]')
        from job_status_history h left join "user" u on u.id = h.user_id where h.job_id = "jobs"."id")`,
    })
    .from(jobs)
    .innerJoin(companies, eq(companies.id, jobs.companyId))
    .leftJoin(warehouses, eq(warehouses.id, jobs.preferredWarehouseId))
    .where(eq(jobs.id, sql.placeholder('id')))
    .prepare('job_detail');

  async function detail(actor: Actor, id: string) {
    authorize(actor, 'jobs.view');
    if (!isUuid(id)) throw new NotFoundError('That job');
    const [head] = await jobDetailQuery.execute({ id });
    if (!head) throw new NotFoundError('That job');
    assertCanSeeCompany(actor, head.job.companyId, 'That job');
    const { job, company, plans, lines } = head;
    const preferred = head.preferredCode && head.preferredName ? { code: head.preferredCode, name: head.preferredName } : null;
    const held = head.held.map((r) => ({ ...r, expiresAt: r.expiresAt ? new Date(r.expiresAt) : null }));
    const queue = head.queue.map((b) => ({ ...b, since: new Date(b.since) }));
    const history = head.history.map((h) => ({ ...h, status: h.status as JobStatus, at: new Date(h.at) }));
    const holding = held.length > 0;
    const fullyHeld = lines.length > 0 && lines.every((l) => l.reserved >= l.qty);
    const hasWork = lines.length > 0 || plans.length > 0;
    const payment = head.payment ? { ...head.payment, paidAt: new Date(head.payment.paidAt) } : null;
    const abilities = {
      // A card-paying customer orders by paying; the desk may still order for them (paid another way).
      order: can(actor.role, 'jobs.create') && job.status === 'draft' && hasWork && !(head.accountType === 'cash' && isCompanyBound(actor)),
      pay: can(actor.role, 'payments.create') && head.accountType === 'cash' && !payment && hasWork && PAYABLE.includes(job.status),
      invoice: can(actor.role, 'invoices.view') && INVOICED.includes(job.status),
      reorder: can(actor.role, 'jobs.create') && hasWork,
      reserve: can(actor.role, 'jobs.reserve') && ['draft', 'ordered', 'part-reserved'].includes(job.status) && !fullyHeld && (lines.length > 0 || plans.length > 0),
      release: can(actor.role, 'jobs.reserve') && BEFORE_PICKING.includes(job.status) && (holding || queue.length > 0),
      cancel: can(actor.role, 'jobs.cancel') && BEFORE_PICKING.includes(job.status),
      dispatch: can(actor.role, 'jobs.handover') && job.status === 'ready',
      collect: can(actor.role, 'jobs.handover') && job.status === 'ready',
      close: can(actor.role, 'jobs.handover') && (job.status === 'dispatched' || job.status === 'collected'),
      gather: can(actor.role, 'stock.transfer') && (job.status === 'reserved' || job.status === 'part-reserved') && held.some((r) => r.needsTransfer),
    };
    const holdExpiresAt = held.reduce<Date | null>((min, r) => (r.expiresAt && (!min || r.expiresAt < min) ? r.expiresAt : min), null);
    return { job, company, preferred, plans, lines, held, queue, history, abilities, holdExpiresAt, paymentTerms: head.accountType, payment };
  }

  /** Shared by reserve (as a quote on a draft) and order: the plans' lines are copied in first. */
  async function materialise(actor: Actor, job: JobRow) {
    if (job.linesCopiedAt) return;
    const lines = await planLines(actor, job.id);
    await db.transaction(async (tx) => {
      const [locked] = await tx.select().from(jobs).where(eq(jobs.id, job.id)).for('update');
      await copyPlanLines(tx, locked!, lines);
    });
  }

  /** Orders a draft inside the caller's transaction (an installer's order, or a confirmed card payment). True when a quote held units. */
  async function orderInTx(tx: Tx, id: string, userId: string | null, note: string | null, lines: { sku: string; qty: number; planId: string; reason: string }[] = []) {
    const [locked] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
    if (locked!.status !== 'draft') throw new ConflictError(`This job is already ${locked!.status}; only a draft can be ordered.`);
    await copyPlanLines(tx, locked!, lines);
    const { rows } = await heldByLine(tx, id);
    if (rows.length === 0) throw new ConflictError('This job has no lines to order.');
    await tx.update(jobs).set({ orderedAt: now() }).where(eq(jobs.id, id));
    await record(tx, id, 'ordered', userId, note);
    await mail?.jobOrdered(tx, id);
    return rows.some((r) => r.held > 0);
  }

  /** Makes a quote's holds firm after ordering; the backorders message follows if anything is short. */
  async function firmUp(userId: string | null, id: string) {
    const plan = await reservationPlan(db, id);
    if (plan.lines.length === 0) return;
    await inStockTransaction(db, (tx) => reserveInTx(tx, id, plan, { userId, now: now(), quoteHoldMs: quoteHoldDays * 86_400_000, firmUpOnly: true }));
    await announceBackorders(id, 0);
  }

  const backorderedUnits = async (id: string) => {
    const { rows } = await db.execute<{ n: number }>(sql`select coalesce(sum(b.qty), 0)::int as n from backorders b join job_lines jl on jl.id = b.job_line_id where jl.job_id = ${id}`);
    return rows[0]?.n ?? 0;
  };

  /** Tells the customer which lines wait on backorder, when reserving left more short than before. */
  async function announceBackorders(id: string, before: number) {
    if (!mail) return;
    if ((await backorderedUnits(id)) <= before) return;
    await db.transaction((tx) => mail.jobBackorders(tx, id));
  }

  /** Atomic per job (a savepoint in a group's transaction, retried on deadlock or serialization failure); the last check is the database's. */
  async function reserveJob(actor: Actor, jobId: string, firmUpOnly = false) {
    const plan = await reservationPlan(db, jobId);
    if (plan.lines.length === 0) throw new ConflictError('This job has no lines to reserve.');
    return reserveGrouped(jobId, plan, { userId: actor.userId, now: now(), quoteHoldMs: quoteHoldDays * 86_400_000, firmUpOnly });
  }

  /** One step after picking, checked again under the job's lock; the customer hears of a dispatch. */
  async function handOver(actor: Actor, id: string, from: JobStatus[], to: JobStatus, sent: DispatchInput = {}) {
    authorize(actor, 'jobs.handover');
    const job = await visibleJob(actor, id);
    const refuse = (status: JobStatus) => new ConflictError(`This job is ${status}; only a job that is ${from.join(' or ')} can be marked ${to}.`);
    if (!from.includes(job.status)) throw refuse(job.status);
    await db.transaction(async (tx) => {
      const [locked] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
      if (!from.includes(locked!.status)) throw refuse(locked!.status);
      const carrier = sent.carrier || null;
      const trackingRef = sent.trackingRef || null;
      const note = carrier || trackingRef ? [carrier && `Sent with ${carrier}`, trackingRef && `tracking ${trackingRef}`].filter(Boolean).join(', ') : null;
      await record(tx, id, to, actor.userId, note);
      if (to === 'dispatched') await mail?.jobStatusChanged(tx, id, 'dispatched', { carrier, trackingRef });
    });
    return detail(actor, id);
  }

  const service = {
    detail,

    async create(actor: Actor, input: CreateJobInput & { reason?: string }) {
      authorize(actor, 'jobs.create');
      const companyId = companyForNew(actor, input.companyId);
      if (!companyId) throw new ValidationError('Choose the customer account this job is for.', { fields: [{ path: 'companyId', message: 'Choose a customer account.' }] });
      if (!isCompanyBound(actor)) {
        const [c] = await db.select().from(companies).where(and(eq(companies.id, companyId), eq(companies.kind, 'installer')));
        if (!c) throw new ValidationError('There is no such customer account.', { fields: [{ path: 'companyId', message: 'Unknown customer account.' }] });
      }
      const wh = input.preferredWarehouse ? await warehouseByCode(db, input.preferredWarehouse, 'preferredWarehouse') : null;
      const planIds = [...new Set(input.planIds ?? [])];
      for (const [i, planId] of planIds.entries()) {
        const plan = await planner.findPlan(actor, planId);
        if (plan.companyId !== companyId) throw new ValidationError(`Plan “${plan.name}” belongs to another customer account.`, { fields: [{ path: `planIds.${i}`, message: 'Another account’s plan.' }] });
      }
      const extra = input.lines ?? [];
      const found = await partsBySku(db, extra.map((l) => l.sku), 'lines');
      if (planIds.length === 0 && extra.length === 0) throw new ValidationError('A job needs a saved plan or at least one line.', { fields: [{ path: 'planIds', message: 'Add a plan or a line.' }] });
      try {
        const id = await db.transaction(async (tx) => {
          const at = now();
          const [row] = await tx
            .insert(jobs)
            .values({ companyId, reference: input.reference, siteSuburb: input.siteSuburb ?? null, sitePostcode: input.sitePostcode ?? null, contact: input.contact ?? null, notes: input.notes ?? null, preferredWarehouseId: wh?.id ?? null, createdBy: actor.userId, createdAt: at, updatedAt: at })
            .returning({ id: jobs.id });
          const jobId = row!.id;
          if (planIds.length) await tx.insert(jobPlans).values(planIds.map((planId) => ({ jobId, planId })));
          const discount = await customerDiscountPct(tx, companyId);
          if (extra.length) await tx.insert(jobLines).values(extra.map((l, i) => ({ jobId, lineNo: i + 1, partId: found.get(l.sku)!.id, qty: l.qty, reason: input.reason ?? 'Added by SKU', unitPriceCents: unitPriceFor(found.get(l.sku)!, discount) })));
          if (planIds.length === 0) await tx.update(jobs).set({ linesCopiedAt: at }).where(eq(jobs.id, jobId));
          await tx.insert(jobStatusHistory).values({ jobId, status: 'draft', userId: actor.userId, at });
          return jobId;
        });
        return detail(actor, id);
      } catch (e) {
        if (pgCode(e) === '23505') throw new ConflictError(`This account already has a job ${input.reference}.`, { fields: [{ path: 'reference', message: 'Already used for this account.' }] });
        throw e;
      }
    },

    async list(actor: Actor, q: JobListQuery) {
      authorize(actor, 'jobs.view');
      const where: SQL[] = [];
      const scope = companyScopeOf(actor);
      if (scope) where.push(eq(jobs.companyId, scope));
      else if (q.companyId) where.push(eq(jobs.companyId, q.companyId));
      if (q.status) where.push(eq(jobs.status, q.status));
      if (q.q) where.push(ilike(jobs.reference, `%${likeLiteral(q.q)}%`));
      if (q.from) where.push(gte(jobs.createdAt, new Date(`${q.from}T00:00:00Z`)));
      if (q.to) where.push(lt(jobs.createdAt, new Date(new Date(`${q.to}T00:00:00Z`).getTime() + 86_400_000)));
      const cond = where.length ? and(...where) : undefined;
      const [rows, [count]] = await Promise.all([
        db
          .select({
            id: jobs.id,
            reference: jobs.reference,
            status: jobs.status,
            companyId: companies.id,
            companyName: companies.name,
            siteSuburb: jobs.siteSuburb,
            sitePostcode: jobs.sitePostcode,
            createdAt: jobs.createdAt,
            updatedAt: jobs.updatedAt,
            lines: sql<number>`(select count(*) from job_lines jl where jl.job_id = "jobs"."id")::int`,
            units: sql<number>`(select coalesce(sum(jl.qty), 0) from job_lines jl where jl.job_id = "jobs"."id")::int`,
            reserved: sql<number>`(select coalesce(sum(r.qty), 0) from reservations r join job_lines jl on jl.id = r.job_line_id where jl.job_id = "jobs"."id")::int`,
            backordered: sql<number>`(select coalesce(sum(b.qty), 0) from backorders b join job_lines jl on jl.id = b.job_line_id where jl.job_id = "jobs"."id")::int`,
          })
          .from(jobs)
          .innerJoin(companies, eq(companies.id, jobs.companyId))
          .where(cond)
          .orderBy(desc(jobs.createdAt), asc(jobs.reference))
          .limit(q.pageSize)
          .offset((q.page - 1) * q.pageSize),
        db.select({ n: sql<number>`count(*)::int` }).from(jobs).where(cond),
      ]);
      return { rows, total: count?.n ?? 0 };
    },

    async order(actor: Actor, id: string) {
      authorize(actor, 'jobs.create');
      const job = await visibleJob(actor, id);
      if (job.status !== 'draft') throw new ConflictError(`This job is already ${job.status}; only a draft can be ordered.`);
      const lines = job.linesCopiedAt ? [] : await planLines(actor, job.id);
      if (isCompanyBound(actor)) {
        const [c] = await db.select({ accountType: companies.accountType }).from(companies).where(eq(companies.id, job.companyId));
        if (c?.accountType === 'cash') throw new ConflictError('Your account pays by card: pay for this job to place the order.');
      }
      const hadHolds = await db.transaction((tx) => orderInTx(tx, id, actor.userId, null, lines));
      // Units a quote held become the order's: made firm (and topped up) in the reservation's own transaction.
      if (hadHolds) await firmUp(actor.userId, id);
      return detail(actor, id);
    },

    async reserve(actor: Actor, id: string) {
      authorize(actor, 'jobs.reserve');
      const job = await visibleJob(actor, id);
      assertReservable(job.status);
      if (job.status === 'draft') await materialise(actor, job);
      const before = await backorderedUnits(id);
      await reserveJob(actor, id);
      if (job.status !== 'draft') await announceBackorders(id, before);
      return detail(actor, id);
    },

    async release(actor: Actor, id: string) {
      authorize(actor, 'jobs.reserve');
      const job = await visibleJob(actor, id);
      if (!BEFORE_PICKING.includes(job.status)) throw new ConflictError(`This job is ${job.status}; its stock can no longer be released here.`);
      await inStockTransaction(db, async (tx) => {
        const { units } = await releaseJobHolds(tx, id, { now: now() });
        const [locked] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
        if (!BEFORE_PICKING.includes(locked!.status)) throw new ConflictError(`This job is ${locked!.status}; its stock can no longer be released here.`);
        if (locked!.status === 'reserved' || locked!.status === 'part-reserved') await record(tx, id, 'ordered', actor.userId, `Released ${units} reserved units`);
        else if (units > 0) await tx.insert(jobStatusHistory).values({ jobId: id, status: locked!.status, userId: actor.userId, note: `Released ${units} held units`, at: now() });
      });
      return detail(actor, id);
    },

    async cancel(actor: Actor, id: string) {
      authorize(actor, 'jobs.cancel');
      const job = await visibleJob(actor, id);
      if (!BEFORE_PICKING.includes(job.status)) throw new ConflictError(`This job is ${job.status} and can no longer be cancelled.`);
      await inStockTransaction(db, async (tx) => {
        const { units } = await releaseJobHolds(tx, id, { now: now() });
        const [locked] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
        if (!BEFORE_PICKING.includes(locked!.status)) throw new ConflictError(`This job is ${locked!.status} and can no longer be cancelled.`);
        await record(tx, id, 'cancelled', actor.userId, units ? `Released ${units} reserved units` : null);
      });
      await onCancelled?.(id);
      return detail(actor, id);
    },

    /** A picked kit leaves: sent with a carrier (the customer hears of it) or collected at the counter. */
    dispatch: (actor: Actor, id: string, sent: DispatchInput = {}) => handOver(actor, id, ['ready'], 'dispatched', sent),
    collect: (actor: Actor, id: string) => handOver(actor, id, ['ready'], 'collected'),
    /** The job is done: nothing more is expected of it. */
    close: (actor: Actor, id: string) => handOver(actor, id, ['dispatched', 'collected'], 'closed'),

    /** Moves the units the job holds in other warehouses to its preferred one (stock.transfer). */
    async gather(actor: Actor, id: string) {
      authorize(actor, 'stock.transfer');
      const job = await visibleJob(actor, id);
      if (job.status !== 'reserved' && job.status !== 'part-reserved') throw new ConflictError(`This job is ${job.status}; only reserved stock is moved between warehouses.`);
      // The warehouse its reservation took from first: the preferred one, else the first by rank.
      const [preferred] = job.preferredWarehouseId
        ? await db.select({ id: warehouses.id, code: warehouses.code }).from(warehouses).where(eq(warehouses.id, job.preferredWarehouseId))
        : await db.select({ id: warehouses.id, code: warehouses.code }).from(warehouses).orderBy(asc(warehouses.rank), asc(warehouses.code)).limit(1);
      const reference = newReference('TRF', now());
      await inStockTransaction(db, async (tx) => {
        const { units } = await gatherHolds(tx, { jobId: id, preferred: preferred!, reference, userId: actor.userId });
        const [locked] = await tx.select().from(jobs).where(eq(jobs.id, id)).for('update');
        if (locked!.status !== 'reserved' && locked!.status !== 'part-reserved') throw new ConflictError(`This job is ${locked!.status}; only reserved stock is moved between warehouses.`);
        await tx.insert(jobStatusHistory).values({ jobId: id, status: locked!.status, userId: actor.userId, note: `Moved ${units} held units to ${preferred!.code} (${reference})`, at: now() });
      });
      return detail(actor, id);
    },

    /**
     * A new draft with the same lines (at today's prices) or, for a draft whose plans were never
     * copied in, the same plans. Its reference is the old one marked "again".
     */
    async reorder(actor: Actor, id: string) {
      authorize(actor, 'jobs.create');
      const d = await detail(actor, id);
      const lines = d.lines.map((l) => ({ sku: l.sku, qty: l.qty }));
      const planIds = lines.length ? [] : d.plans.map((p) => p.id);
      if (!lines.length && !planIds.length) throw new ConflictError('This job has nothing to order again.');
      const base = d.job.reference.replace(/ \(again(?: \d+)?\)$/, '');
      // The first "(again n)" the company has not used: one read, then one create, whose own
      // duplicate check still answers if another reorder took the same reference meanwhile.
      const marked = (n: number) => {
        const mark = n === 1 ? ' (again)' : ` (again ${n})`;
        return base.slice(0, 40 - mark.length) + mark;
      };
      const taken = new Set(
        (await db.select({ reference: jobs.reference }).from(jobs).where(and(eq(jobs.companyId, d.company.id), ilike(jobs.reference, `${likeLiteral(base.slice(0, 29))}%(again%`)))).map((r) => r.reference.toLowerCase()),
      );
      let n = 1;
      while (taken.has(marked(n).toLowerCase())) n++;
      return service.create(actor, { companyId: d.company.id, reference: marked(n), siteSuburb: d.job.siteSuburb ?? undefined, sitePostcode: d.job.sitePostcode ?? undefined, contact: d.job.contact ?? undefined, planIds, lines, reason: `Ordered again from ${d.job.reference}` });
    },

    /** A draft with its plans' lines copied in, so it can be priced (before a card payment). */
    async priced(actor: Actor, id: string) {
      authorize(actor, 'jobs.view');
      const job = await visibleJob(actor, id);
      if (job.status === 'draft') await materialise(actor, job);
      return detail(actor, id);
    },

    orderInTx,
    firmUp,

    /** Releases quote holds that have lapsed by `at` (the scheduled job calls this). Returns the jobs touched. */
    async expireQuoteHolds(at: Date = now()) {
      const due = await db
        .selectDistinct({ jobId: jobLines.jobId })
        .from(reservations)
        .innerJoin(jobLines, eq(jobLines.id, reservations.jobLineId))
        .where(sql`${reservations.expiresAt} <= ${at}`);
      let units = 0;
      for (const { jobId } of due) {
        units += await inStockTransaction(db, async (tx) => {
          const { units: released } = await releaseJobHolds(tx, jobId, { onlyExpiredBy: at, now: at });
          const [locked] = await tx.select().from(jobs).where(eq(jobs.id, jobId)).for('update');
          if (released > 0) await tx.insert(jobStatusHistory).values({ jobId, status: locked!.status, userId: null, note: `Quote hold lapsed: ${released} units released`, at });
          return released;
        });
      }
      return { jobs: due.length, units };
    },
  };
  return service;
}

export type JobService = ReturnType<typeof createJobService>;
