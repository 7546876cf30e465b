// Tax invoices for jobs: numbered and dated the first time one is issued, then always the same.
import { and, eq, inArray } from 'drizzle-orm';
import { businessDate } from '../lib/dates.ts';
import type { Db } from '../db/client.ts';
import { companies, invoices, payments } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { ConflictError } from '../errors.ts';
import { invoiceGst, lineTotalCents } from '@shared/domain/money.ts';
import type { InvoiceDoc } from '../documents/invoice-pdf.ts';
import { INVOICED, type JobService } from './jobs.ts';

const place = (c: { suburb: string | null; postcode: string | null }) => [c.suburb, c.postcode].filter(Boolean).join(' ') || null;

export function createInvoiceService({ db, jobs }: { db: Db; jobs: Pick<JobService, 'detail'> }) {
  return {
    async forJob(actor: Actor, jobId: string): Promise<InvoiceDoc> {
      authorize(actor, 'invoices.view');
      const d = await jobs.detail(actor, jobId); // another company's job is 404
      if (!INVOICED.includes(d.job.status)) throw new ConflictError(d.job.status === 'draft' ? 'A draft has no tax invoice yet: it is issued when the job is ordered.' : 'A cancelled job has no tax invoice.');
      const unpriced = d.lines.filter((l) => l.unitPriceCents === null);
      if (unpriced.length) throw new ConflictError(`${unpriced.length} line(s) have no price yet; the trade desk prices them before invoicing.`);
      await db.insert(invoices).values({ jobId }).onConflictDoNothing();
      const [[inv], [seller], [buyer], paid] = await Promise.all([
        db.select().from(invoices).where(eq(invoices.jobId, jobId)),
        db.select().from(companies).where(eq(companies.kind, 'wholesaler')).limit(1),
        db.select().from(companies).where(eq(companies.id, d.company.id)),
        db.select().from(payments).where(and(eq(payments.jobId, jobId), inArray(payments.status, ['paid', 'refunded']))),
      ]);
      const lines = d.lines.map((l) => ({ sku: l.sku, description: l.name, qty: l.qty, unitExCents: l.unitPriceCents!, lineExCents: lineTotalCents(l.unitPriceCents!, l.qty) }));
      // GST on the invoice total (s 9-90), the method the job page uses.
      const gst = invoiceGst(lines.map((l) => ({ exCents: l.unitExCents, qty: l.qty })), 'per-invoice');
      const card = paid[0];
      const paymentNote = card?.paidAt ? `Paid by card on ${businessDate(card.paidAt)}${card.status === 'refunded' ? '; refunded when the job was cancelled' : ''}.` : buyer?.accountType === 'cash' ? 'Payable by card before the order is released.' : 'Charged to your trade account on its agreed terms.';
      return {
        number: `SY-${String(inv!.number).padStart(6, '0')}`,
        issuedAt: inv!.issuedAt,
        seller: { name: seller?.name ?? 'Lowtide Battery Wholesale', abn: seller?.abn ?? null, place: seller ? place(seller) : null },
        buyer: { name: buyer!.name, abn: buyer!.abn, place: place(buyer!) },
        reference: d.job.reference,
        lines,
        subtotalExCents: gst.exCents,
        gstCents: gst.gstCents,
        totalIncCents: gst.incCents,
        paymentNote,
      };
    },
  };
}

export type InvoiceService = ReturnType<typeof createInvoiceService>;
