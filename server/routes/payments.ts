import express from 'express';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { z } from 'zod';
import { StartPaymentResponseSchema } from '@shared/contracts/payments.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { renderInvoicePdf } from '../documents/invoice-pdf.ts';


/**
 * The provider's webhook reads the raw body (the signature is computed over its exact bytes), so
 * app.ts registers it before the JSON parser.
 */
export function paymentWebhookRoute(api: Api, { payments }: Pick<AppDeps, 'payments'>) {
  api.route(
    {
      method: 'post',
      path: '/payments/webhook',
      summary: 'The payment provider’s signed events (a paid checkout orders its job, once)',
      tag: 'payments',
      ability: 'public',
      middleware: [express.raw({ type: () => true, limit: '256kb' })],
      response: z.object({ data: z.object({ handled: z.boolean(), duplicate: z.boolean() }) }),
    },
    async ({ req }) => ({ data: await payments.webhook(req.body as Buffer | undefined, req.get('stripe-signature')) }),
  );
}

export function paymentRoutes(api: Api, { payments, invoices }: Pick<AppDeps, 'payments' | 'invoices'>) {
  api.route({ method: 'post', path: '/jobs/:id/payments', summary: 'Open a card checkout for a cash-account job (409 when paid already or on trade terms)', tag: 'payments', ability: 'payments.create', params: IdParams, response: StartPaymentResponseSchema, status: 201 }, async ({ actor, params }) => ({
    data: await payments.start(actor, params.id),
  }));

  api.route({ method: 'get', path: '/jobs/:id/invoice.pdf', summary: 'The job’s tax invoice as PDF (once ordered)', tag: 'payments', ability: 'invoices.view', params: IdParams, produces: 'application/pdf' }, async ({ actor, params, res }) => {
    const inv = await invoices.forJob(actor, params.id);
    const pdf = await renderInvoicePdf(inv);
    res.setHeader('content-type', 'application/pdf');
    res.setHeader('content-disposition', `inline; filename="tax-invoice-${inv.number}.pdf"`);
    res.send(Buffer.from(pdf));
  });
}
