import { z } from 'zod';
import { text } from './text.ts';

/** pending (checkout open) → paid (a verified webhook said so) → refunded (the job was cancelled). */
export const PAYMENT_STATUSES = ['pending', 'paid', 'refunded', 'expired'] as const;
export type PaymentStatus = (typeof PAYMENT_STATUSES)[number];

export const StartPaymentResponseSchema = z.object({ data: z.object({ paymentId: text(), checkoutUrl: text() }) });

/** How a customer account pays: trade accounts on invoice terms, cash accounts by card before the order stands. */
export const PAYMENT_TERMS = ['trade', 'cash'] as const;
export type PaymentTerms = (typeof PAYMENT_TERMS)[number];
