// The outbox: every message is rendered and written in the transaction of the change it reports
// (so a rolled-back order sends nothing), and PostgreSQL's NOTIFY, delivered only on commit, wakes
// the mail queue (server/jobs/mail-queue.ts), which sends it with retries. A refused or slow SMTP
// server therefore never blocks or undoes the business action.
import { and, desc, eq, ilike, inArray, isNull, sql, type SQL } from 'drizzle-orm';
import { lowStockRows } from './stock.ts';
import { businessDate } from '../lib/dates.ts';
import { likeLiteral } from '../db/like.ts';
import { isUuid } from '../db/errors.ts';
import type { Transporter } from 'nodemailer';
import type { Db, DbOrTx } from '../db/client.ts';
import { companies, jobs, mailOutbox, user } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { NotFoundError } from '../errors.ts';
import { OUTBOX_PAGE_SIZE, type MailEvent, type OutboxQuery } from '@shared/contracts/mail.ts';
import type { JobStatus } from '@shared/contracts/jobs.ts';
import type { Role } from '@shared/roles.ts';
import { jobTotals } from '@shared/domain/quote.ts';
import { render, type MailData } from '../mail/templates.ts';

/** The channel the mail queue listens on; the payload is the outbox row's id. */
export const MAIL_CHANNEL = 'stackyard_mail';
export const MAIL_FROM = 'Stackyard <trade-desk@stackyard.test>';

export interface Outgoing<E extends MailEvent> {
  event: E;
  to: string;
  data: MailData[E];
  refs?: Record<string, string>;
}

/**
 * Writes a message to the outbox in the caller's transaction; it is sent after that transaction
 * commits, and never if it rolls back. The hook other services call (purchase orders, price lists).
 */
export async function enqueueMail<E extends MailEvent>(tx: DbOrTx, message: Outgoing<E>): Promise<string> {
  const [id] = await enqueueToAll(tx, [message.to], message.event, message.data, message.refs ?? {});
  return id!;
}

/** One message to each address, rendered once (the same words go to everyone). */
async function enqueueToAll<E extends MailEvent>(tx: DbOrTx, to: string[], event: E, data: MailData[E], refs: Record<string, string>): Promise<string[]> {
  if (to.length === 0) return [];
  const { subject, text, html } = render(event, data);
  const rows = await tx.insert(mailOutbox).values(to.map((address) => ({ event, to: address, subject, text, html, refs }))).returning({ id: mailOutbox.id });
  const ids = rows.map((r) => r.id);
  await tx.execute(sql`select pg_notify(${MAIL_CHANNEL}, id) from unnest(${sql.param(ids)}::text[]) as id`);
  return ids;
}

/** Expected arrival of short parts, by part id. The purchasing work (purchase orders) supplies it at merge. */
export type ExpectedArrivals = (tx: DbOrTx, partIds: string[]) => Promise<Map<string, Date>>;
const noExpectedDates: ExpectedArrivals = async () => new Map();

export interface MailDeps {
  db: Db;
  /** The address people open links at (PUBLIC_URL, or the local one). */
  appUrl: string;
  expectedArrivals?: ExpectedArrivals;
}


export function createMailService({ db, appUrl, expectedArrivals = noExpectedDates }: MailDeps) {
  const jobUrl = (id: string) => `${appUrl}/jobs/${id}`;

  /** Who hears about a job: its company's active users. */
  async function jobAudience(tx: DbOrTx, jobId: string) {
    const [job] = await tx.select({ id: jobs.id, reference: jobs.reference, companyId: jobs.companyId, companyName: companies.name, accountType: companies.accountType }).from(jobs).innerJoin(companies, eq(companies.id, jobs.companyId)).where(eq(jobs.id, jobId));
    if (!job) throw new NotFoundError('That job');
    const people = await tx
      .select({ email: user.email })
      .from(user)
      .where(and(eq(user.companyId, job.companyId), sql`coalesce(${user.banned}, false) = false`))
      .orderBy(user.email);
    return { job, to: people.map((p) => p.email) };
  }

  /** Active staff with these roles. */
  async function staffAddresses(tx: DbOrTx, roles: Role[]) {
    const rows = await tx.select({ email: user.email }).from(user).where(and(inArray(user.role, roles), sql`coalesce(${user.banned}, false) = false`)).orderBy(user.email);
    return rows.map((r) => r.email);
  }

  const toAll = enqueueToAll;

  const jobLinesQuery = (jobId: string) => sql`select p.id as "partId", p.sku, p.name, jl.qty, jl.unit_price_cents as "unitPriceCents",
      coalesce((select b.qty from backorders b where b.job_line_id = jl.id), 0)::int as backordered
    from job_lines jl join parts p on p.id = jl.part_id where jl.job_id = ${jobId} order by jl.line_no`;

  return {
    /** A purchase order marked sent goes to the supplier's contact (none on file: nothing is sent). */
    async purchaseOrderSent(tx: DbOrTx, poId: string) {
      const { rows } = await tx.execute<{ number: string; supplier: string; email: string | null; deliver_to: string; expected: Date | null; buyer: string | null }>(sql`
        select po.number, s.name as supplier, s.contact_email as email, w.name as deliver_to, po.expected_at as expected, u.name as buyer
        from purchase_orders po join suppliers s on s.id = po.supplier_id join warehouses w on w.id = po.warehouse_id left join "user" u on u.id = po.created_by
        where po.id = ${poId}`);
      const po = rows[0];
      if (!po) throw new NotFoundError('That purchase order');
      if (!po.email) return [];
      const { rows: lines } = await tx.execute<{ sku: string; name: string; qty: number; supplier_sku: string; cost: string | null }>(sql`
        select p.sku, p.name, l.qty, l.supplier_sku, l.unit_cost_cents as cost from purchase_order_lines l join parts p on p.id = l.part_id
        where l.purchase_order_id = ${poId} order by l.line_no`);
      return toAll(tx, [po.email], 'purchase-order', {
        supplierName: po.supplier,
        poNumber: po.number,
        lines: lines.map((l) => ({ sku: l.sku, name: l.name, qty: l.qty, supplierSku: l.supplier_sku, unitCostCents: l.cost === null ? null : Number(l.cost) })),
        deliverTo: po.deliver_to,
        expectedBy: po.expected ? businessDate(po.expected) : null,
        buyerName: po.buyer ?? 'our purchasing team',
      }, { purchaseOrderId: poId });
    },

    /** The order has reached the desk (installer ordered, or a card payment confirmed it). */
    async jobOrdered(tx: DbOrTx, jobId: string) {
      const { job, to } = await jobAudience(tx, jobId);
      const { rows } = await tx.execute<{ sku: string; name: string; qty: number; unitPriceCents: number | null }>(jobLinesQuery(jobId));
      const total = jobTotals(rows);
      return toAll(tx, to, 'order-received', { reference: job.reference, companyName: job.companyName, lines: rows.map((l) => ({ sku: l.sku, name: l.name, qty: l.qty })), totalCents: total.totalCents, unpricedLines: total.unpricedLines, paymentTerms: job.accountType, url: jobUrl(jobId) }, { jobId });
    },

    /** After reserving: which lines wait on backorder and when they are expected. Nothing when none do. */
    async jobBackorders(tx: DbOrTx, jobId: string) {
      const { rows } = await tx.execute<{ partId: string; sku: string; name: string; backordered: number }>(jobLinesQuery(jobId));
      const short = rows.filter((l) => l.backordered > 0);
      if (short.length === 0) return [];
      const { job, to } = await jobAudience(tx, jobId);
      const expected = await expectedArrivals(tx, short.map((l) => l.partId));
      const lines = short.map((l) => ({ sku: l.sku, name: l.name, qty: l.backordered, expected: expected.has(l.partId) ? businessDate(expected.get(l.partId)!) : null }));
      return toAll(tx, to, 'backorders', { reference: job.reference, lines, url: jobUrl(jobId) }, { jobId });
    },

    /**
     * A job moved to a status its customer hears about (ready, dispatched). The warehouse work calls
     * this in the transaction that changes the status; other statuses send nothing.
     */
    async jobStatusChanged(tx: DbOrTx, jobId: string, status: JobStatus, detail: { place?: string | null; carrier?: string | null; trackingRef?: string | null } = {}) {
      if (status !== 'ready' && status !== 'dispatched') return [];
      const { job, to } = await jobAudience(tx, jobId);
      if (status === 'ready') return toAll(tx, to, 'ready-for-collection', { reference: job.reference, place: detail.place ?? null, url: jobUrl(jobId) }, { jobId });
      return toAll(tx, to, 'dispatched', { reference: job.reference, carrier: detail.carrier ?? null, trackingRef: detail.trackingRef ?? null, url: jobUrl(jobId) }, { jobId });
    },

    async paymentReceived(tx: DbOrTx, jobId: string, amountCents: number) {
      const { job, to } = await jobAudience(tx, jobId);
      return toAll(tx, to, 'payment-received', { reference: job.reference, amountCents, url: jobUrl(jobId) }, { jobId });
    },

    async refunded(tx: DbOrTx, jobId: string, amountCents: number) {
      const { job, to } = await jobAudience(tx, jobId);
      return toAll(tx, to, 'refund', { reference: job.reference, amountCents }, { jobId });
    },

    /** Staff of these roles (the digest's and the price list's readers). */

    /** Purchasing hears that a supplier's price list was applied, with what it changed. */
    async priceListApplied(tx: DbOrTx, info: { importId: string; supplierName: string; fileName: string; counts: { new: number; changed: number; unchanged: number; missing: number }; appliedBy: string }) {
      const to = await staffAddresses(tx, ['purchasing']);
      const { counts } = info;
      return toAll(tx, to, 'price-list-applied', { supplierName: info.supplierName, fileName: info.fileName, added: counts.new, changed: counts.changed, unchanged: counts.unchanged, missing: counts.missing, appliedBy: info.appliedBy, url: `${appUrl}/purchasing/imports/${info.importId}` }, { importId: info.importId });
    },

    /** The daily digest for purchasing: parts whose available stock is at or below their minimum. Sends nothing when none are. */
    async lowStockDigest(at: Date = new Date()) {
      return db.transaction(async (tx) => {
        const rows = (await lowStockRows(tx)).map((r) => ({ sku: r.sku, name: r.name, available: r.available, reorderAt: r.min, backordered: r.backordered }));
        if (rows.length === 0) return [];
        const to = await staffAddresses(tx, ['purchasing']);
        return toAll(tx, to, 'low-stock-digest', { date: businessDate(at), lines: rows, url: `${appUrl}/stock` }, { digest: at.toISOString().slice(0, 10) });
      });
    },

    async outbox(actor: Actor, q: OutboxQuery) {
      authorize(actor, 'outbox.view');
      const where: SQL[] = [];
      if (q.to) where.push(ilike(mailOutbox.to, `%${likeLiteral(q.to)}%`));
      const cond = where.length ? and(...where) : undefined;
      const [rows, [count]] = await Promise.all([
        db
          .select({ id: mailOutbox.id, to: mailOutbox.to, subject: mailOutbox.subject, event: mailOutbox.event, status: mailOutbox.status, createdAt: mailOutbox.createdAt, sentAt: mailOutbox.sentAt })
          .from(mailOutbox)
          .where(cond)
          .orderBy(desc(mailOutbox.createdAt), desc(mailOutbox.id))
          .limit(OUTBOX_PAGE_SIZE)
          .offset((q.page - 1) * OUTBOX_PAGE_SIZE),
        db.select({ n: sql<number>`count(*)::int` }).from(mailOutbox).where(cond),
      ]);
      return { rows, total: count?.n ?? 0 };
    },

    async outboxMessage(actor: Actor, id: string) {
      authorize(actor, 'outbox.view');
      if (!isUuid(id)) throw new NotFoundError('That message');
      const [row] = await db.select().from(mailOutbox).where(eq(mailOutbox.id, id));
      if (!row) throw new NotFoundError('That message');
      return row;
    },

    /**
     * Sends one outbox message (the queue's worker calls this). Claims the row first, so a message
     * woken twice goes out once. A refused attempt is recorded and thrown for the queue to retry;
     * after `maxAttempts` the message is marked failed and stays in the outbox to be seen.
     */
    async deliver(transport: Transporter, id: string, maxAttempts: number) {
      const [row] = await db
        .update(mailOutbox)
        .set({ status: 'sending', attempts: sql`${mailOutbox.attempts} + 1`, attemptedAt: new Date() })
        .where(and(eq(mailOutbox.id, id), inArray(mailOutbox.status, ['queued', 'retrying'])))
        .returning();
      if (!row) return { sent: false as const };
      try {
        const info = await transport.sendMail({ from: MAIL_FROM, to: row.to, subject: row.subject, text: row.text, html: row.html, headers: { 'X-Stackyard-Event': row.event } });
        await db.update(mailOutbox).set({ status: 'sent', sentAt: new Date(), messageId: info.messageId ?? null, lastError: null }).where(eq(mailOutbox.id, id));
        return { sent: true as const };
      } catch (e) {
        const final = row.attempts >= maxAttempts;
        await db.update(mailOutbox).set({ status: final ? 'failed' : 'retrying', lastError: String((e as Error).message ?? e).slice(0, 500) }).where(eq(mailOutbox.id, id));
        if (final) return { sent: false as const, failed: true };
        throw e;
      }
    },

    /**
     * Messages nobody is sending: still `queued` (their notification was missed while the queue was
     * down), or left `sending` for hours by a sender that died (longer than every retry together).
     * `retrying` ones belong to pg-boss's own retries.
     */
    async stranded(olderThan: Date, stuckSince = new Date(olderThan.getTime() - 2 * 3_600_000)) {
      // By the last attempt, not the message's age: an old message a sender took up a minute ago is not stranded.
      await db.update(mailOutbox).set({ status: 'retrying' }).where(and(eq(mailOutbox.status, 'sending'), sql`${mailOutbox.attemptedAt} < ${stuckSince}`));
      const rows = await db
        .select({ id: mailOutbox.id })
        .from(mailOutbox)
        .where(and(sql`(${mailOutbox.status} = 'queued' and ${mailOutbox.createdAt} < ${olderThan}) or (${mailOutbox.status} = 'retrying' and ${mailOutbox.attemptedAt} < ${stuckSince})`, isNull(mailOutbox.sentAt)))
        .limit(500);
      return rows.map((r) => r.id);
    },
  };
}

export type MailService = ReturnType<typeof createMailService>;
