// Card payments for cash-account companies through the provider's hosted checkout. The order is
// confirmed only by a verified webhook, once: the event id and the payment row are written in the
// transaction that orders the job, so a repeated delivery finds its work done and changes nothing.
import { and, desc, eq, inArray } from 'drizzle-orm';
import type Stripe from 'stripe';
import type { Db } from '../db/client.ts';
import { companies, jobs, paymentEvents, payments } from '../db/schema/index.ts';
import { authorize, type Actor } from '../policies/actor.ts';
import { AppError, ConflictError } from '../errors.ts';
import { jobTotals } from '@shared/domain/quote.ts';
import { PAYABLE, type JobService } from './jobs.ts';
import type { MailService } from './mail.ts';

export interface PaymentDeps {
  db: Db;
  provider: Stripe;
  webhookSecret: string;
  appUrl: string;
  jobs: Pick<JobService, 'priced' | 'orderInTx' | 'firmUp'>;
  mail: Pick<MailService, 'paymentReceived' | 'refunded'>;
  logger: { error(obj: object, msg: string): void };
}

/** A webhook the provider did not sign (or that was changed or is too old): refused, nothing done. */
export class BadSignatureError extends AppError {
  constructor(message: string) {
    super(400, 'bad_signature', message);
  }
}


export function createPaymentService({ db, provider, webhookSecret, appUrl, jobs: jobService, mail, logger }: PaymentDeps) {
  return {
    /** Opens a hosted checkout for the job's total inc GST (or hands back the one already open for the same amount). */
    async start(actor: Actor, jobId: string) {
      authorize(actor, 'payments.create');
      const d = await jobService.priced(actor, jobId); // visibility: another company's job is 404
      const [company] = await db.select({ accountType: companies.accountType }).from(companies).where(eq(companies.id, d.company.id));
      if (company?.accountType !== 'cash') throw new ConflictError(`${d.company.name} is on trade account terms: this job is invoiced, not paid by card.`);
      if (!PAYABLE.includes(d.job.status)) throw new ConflictError(`This job is already ${d.job.status}: card payments are taken to place an order.`);
      const { totalCents: incCents, unpricedLines } = jobTotals(d.lines);
      if (d.lines.length === 0 || incCents <= 0) throw new ConflictError('This job has no priced lines to pay for.');
      if (unpricedLines > 0) throw new ConflictError('Some lines have no price yet; the trade desk will price them before you pay.');

      const existing = await db.select().from(payments).where(eq(payments.jobId, jobId)).orderBy(desc(payments.createdAt));
      if (existing.some((p) => p.status === 'paid')) throw new ConflictError('This job is already paid.');
      const open = existing.find((p) => p.status === 'pending' && p.amountCents === incCents);
      if (open) return { paymentId: open.id, checkoutUrl: open.checkoutUrl };

      const jobUrl = `${appUrl}/jobs/${jobId}`;
      const session = await provider.checkout.sessions.create({
        mode: 'payment',
        client_reference_id: jobId,
        metadata: { jobId },
        line_items: [{ quantity: 1, price_data: { currency: 'aud', unit_amount: incCents, product_data: { name: `Job ${d.job.reference} (inc GST)` } } }],
        success_url: `${jobUrl}?paid=1`,
        cancel_url: jobUrl,
      });
      if (!session.url) throw new AppError(502, 'payment_provider', 'The payment provider did not open a checkout. Try again in a moment.');
      const [row] = await db
        .insert(payments)
        .values({ jobId, sessionId: session.id, amountCents: incCents, currency: 'aud', checkoutUrl: session.url, createdBy: actor.userId })
        .returning();
      return { paymentId: row!.id, checkoutUrl: row!.checkoutUrl };
    },

    /**
     * A provider event, verified against its signature header and the raw body it was computed on.
     * A forged, altered or stale (older than five minutes: a replay) event is refused; an event seen
     * before is acknowledged and changes nothing.
     */
    async webhook(rawBody: Buffer | undefined, signature: string | undefined) {
      if (!Buffer.isBuffer(rawBody) || rawBody.length === 0) throw new BadSignatureError('The webhook has no body.');
      if (!signature) throw new BadSignatureError('The webhook has no signature header.');
      let event: Stripe.Event;
      try {
        event = provider.webhooks.constructEvent(rawBody, signature, webhookSecret, 300);
      } catch (e) {
        throw new BadSignatureError(`The webhook signature does not match: ${(e as Error).message.split('.')[0]}.`);
      }
      if (event.type !== 'checkout.session.completed') return { handled: false, duplicate: false };
      const session = event.data.object as Stripe.Checkout.Session;
      if (session.payment_status !== 'paid') return { handled: false, duplicate: false };

      const outcome = await db.transaction(async (tx) => {
        const [fresh] = await tx.insert(paymentEvents).values({ eventId: event.id, type: event.type }).onConflictDoNothing().returning();
        if (!fresh) return { duplicate: true, hadHolds: false, jobId: null };
        const [payment] = await tx.select().from(payments).where(eq(payments.sessionId, session.id)).for('update');
        // A checkout we never opened (another system on the same account): acknowledged, nothing done.
        if (!payment) return { duplicate: false, hadHolds: false, jobId: null };
        if (payment.status !== 'pending') return { duplicate: true, hadHolds: false, jobId: null };
        if (session.amount_total !== payment.amountCents) throw new ConflictError('The amount paid does not match the checkout.');
        const intent = typeof session.payment_intent === 'string' ? session.payment_intent : (session.payment_intent?.id ?? null);
        await tx.update(payments).set({ status: 'paid', paymentIntentId: intent, paidAt: new Date() }).where(eq(payments.id, payment.id));
        const [job] = await tx.select({ status: jobs.status }).from(jobs).where(eq(jobs.id, payment.jobId)).for('update');
        const hadHolds = job?.status === 'draft' ? await jobService.orderInTx(tx, payment.jobId, null, 'Paid by card') : false;
        await mail.paymentReceived(tx, payment.jobId, payment.amountCents);
        return { duplicate: false, hadHolds, jobId: payment.jobId };
      });
      if (outcome.hadHolds && outcome.jobId) await jobService.firmUp(null, outcome.jobId);
      return { handled: true, duplicate: outcome.duplicate };
    },

    /** Refunds a cancelled job's card payment. A refusal is kept on the payment for the desk to see, never thrown at the cancel. */
    async refundJob(jobId: string) {
      const paid = await db.select().from(payments).where(and(eq(payments.jobId, jobId), inArray(payments.status, ['paid'])));
      for (const p of paid) {
        try {
          if (!p.paymentIntentId) throw new Error('no payment id from the provider');
          const refund = await provider.refunds.create({ payment_intent: p.paymentIntentId }, { idempotencyKey: `refund-${p.id}` });
          await db.transaction(async (tx) => {
            await tx.update(payments).set({ status: 'refunded', refundId: refund.id, refundedAt: new Date(), refundError: null }).where(eq(payments.id, p.id));
            await mail.refunded(tx, jobId, p.amountCents);
          });
        } catch (e) {
          logger.error({ err: e, paymentId: p.id }, 'refund refused; the payment stays paid for the desk to refund');
          await db.update(payments).set({ refundError: String((e as Error).message ?? e).slice(0, 500) }).where(eq(payments.id, p.id));
        }
      }
    },
  };
}

export type PaymentService = ReturnType<typeof createPaymentService>;
