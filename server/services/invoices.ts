// Tax invoices for jobs: numbered and dated the first time one is issued, then always the same.
import { and, eq, inArray } from 'drizzle-orm';
import { businessDate } from '../lib/dates.ts';
import type { Db } from '../db/client.ts';
import { companies, invoices, payments } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError } from '../errors.ts';
import { lineTotalCents } from '@shared/domain/money.ts';
import { jobTotals } from '@shared/domain/quote.ts';
import type { InvoiceDoc } from '../documents/invoice-pdf.ts';
import { INVOICED, type JobService } from './jobs.ts';

const place = (c: { suburb: string | null; postcode: string | null }) => [c.suburb, c.postcode].filter(Boolean).join(' ') || null;

export function createInvoiceService({ db, jobs }: { db: Db; jobs: Pick<JobService, 'detail'> }) {
  /** The job's invoice row, numbered the first time only: a number is drawn (and never wasted) just when none exists. */
  async function issued(jobId: string) {
    const found = await db.select().from(invoices).where(eq(invoices.jobId, jobId));
    if (found.length) return found;
    await db.insert(invoices).values({ jobId }).onConflictDoNothing();
    return db.select().from(invoices).where(eq(invoices.jobId, jobId));
  }

  return {
    async forJob(actor: Actor, jobId: string): Promise<InvoiceDoc> {
      authorize(actor, 'invoices.view');
      const d = await jobs.detail(actor, jobId); // another company's job is 404
      if (!INVOICED.includes(d.job.status)) throw new ConflictError(d.job.status === 'draft' ? 'A draft has no tax invoice yet: it is issued when the job is ordered.' : 'A cancelled job has no tax invoice.');
      const unpriced = d.lines.filter((l) => l.unitPriceCents === null);
      if (unpriced.length) throw new ConflictError(`${unpriced.length} line(s) have no price yet; the trade desk prices them before invoicing.`);
      const [[inv], [seller], [buyer], paid] = await Promise.all([
        issued(jobId),
        db.select().from(companies).where(eq(companies.kind, 'wholesaler')).limit(1),
        db.select().from(companies).where(eq(companies.id, d.company.id)),
        db.select().from(payments).where(and(eq(payments.jobId, jobId), inArray(payments.status, ['paid', 'refunded']))),
      ]);
      const lines = d.lines.map((l) => ({ sku: l.sku, description: l.name, qty: l.qty, unitExCents: l.unitPriceCents!, lineExCents: lineTotalCents(l.unitPriceCents!, l.qty) }));
      // GST on the invoice total (s 9-90), as on the job page.
      const totals = jobTotals(d.lines);
      const card = paid[0];
      const paymentNote = card?.paidAt ? `Paid by card on ${businessDate(card.paidAt)}${card.status === 'refunded' ? '; refunded when the job was cancelled' : ''}.` : buyer?.accountType === 'cash' ? 'Payable by card before the order is released.' : 'Charged to your trade account on its agreed terms.';
      return {
        number: `SY-${String(inv!.number).padStart(6, '0')}`,
        issuedAt: inv!.issuedAt,
        seller: { name: seller?.name ?? 'Lowtide Battery Wholesale', abn: seller?.abn ?? null, place: seller ? place(seller) : null },
        buyer: { name: buyer!.name, abn: buyer!.abn, place: place(buyer!) },
        reference: d.job.reference,
        lines,
        subtotalExCents: totals.subtotalCents,
        gstCents: totals.gstCents,
        totalIncCents: totals.totalCents,
        paymentNote,
      };
    },
  };
}

export type InvoiceService = ReturnType<typeof createInvoiceService>;
