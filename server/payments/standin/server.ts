// A local fake of the card payment provider for `npm start` and the tests: only the API calls the
// app makes through the official SDK (create and retrieve a checkout session, create a refund), in
// the provider's answer and error shapes, plus a hosted checkout page of its own. Paying on that
// page marks the session paid and posts a `checkout.session.completed` event to the app's webhook,
// signed with the SDK's own test-header helper, so the app verifies it exactly as it would verify
// the real provider's. Anything else is refused with an error rather than ignored.
import { randomBytes } from 'node:crypto';
import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import express, { type NextFunction, type Request, type Response } from 'express';
import Stripe from 'stripe';

interface Session {
  id: string;
  object: 'checkout.session';
  mode: 'payment';
  status: 'open' | 'complete' | 'expired';
  payment_status: 'unpaid' | 'paid';
  amount_total: number;
  currency: string;
  client_reference_id: string | null;
  metadata: Record<string, string>;
  success_url: string;
  cancel_url: string | null;
  url: string | null;
  payment_intent: string | null;
  created: number;
  livemode: false;
  line_items_description: string;
}

export interface SignedEvent {
  payload: string;
  header: string;
  event: { id: string; type: string };
}

export interface PaymentStandin {
  url: string;
  /** Where paid sessions are announced; settable after start (a test app's port is known later). */
  webhookUrl: string | null;
  /** Pays a session as the hosted page would, returning the signed event (and posting it when webhookUrl is set). */
  pay(sessionId: string): Promise<SignedEvent>;
  session(id: string): Session | undefined;
  refunds: { id: string; payment_intent: string; amount: number }[];
  close(): Promise<void>;
}

const id = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;

class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly type: string,
    message: string,
    readonly param?: string,
  ) {
    super(message);
  }
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);
const money = (cents: number, currency: string) => `${currency.toUpperCase()} ${(cents / 100).toFixed(2)}`;

export async function startPaymentStandin({ port = 0, secretKey, webhookSecret, webhookUrl = null, host = '127.0.0.1' }: { port?: number; secretKey: string; webhookSecret: string; webhookUrl?: string | null; host?: string }): Promise<PaymentStandin> {
  const sessions = new Map<string, Session>();
  const intents = new Map<string, { id: string; amount: number; refunded: number }>();
  const refunds: PaymentStandin['refunds'] = [];
  const signer = new Stripe(secretKey);
  const app = express();
  app.disable('x-powered-by');
  let base = '';

  const api = express.Router();
  api.use((req, _res, next) => {
    if (req.get('authorization') !== `Bearer ${secretKey}`) throw new ApiError(401, 'invalid_request_error', 'Invalid API Key provided.');
    next();
  });
  api.use(express.urlencoded({ extended: true, limit: '100kb' }));

  api.post('/v1/checkout/sessions', (req, res) => {
    const b = req.body as Record<string, unknown>;
    if (b.mode !== 'payment') throw new ApiError(400, 'invalid_request_error', 'The stand-in supports mode=payment only.', 'mode');
    if (typeof b.success_url !== 'string') throw new ApiError(400, 'invalid_request_error', 'Missing required param: success_url.', 'success_url');
    const items = Array.isArray(b.line_items) ? (b.line_items as { quantity?: string; price_data?: { currency?: string; unit_amount?: string; product_data?: { name?: string } } }[]) : [];
    if (items.length === 0) throw new ApiError(400, 'invalid_request_error', 'Missing required param: line_items.', 'line_items');
    let amount = 0;
    let currency = '';
    for (const [i, item] of items.entries()) {
      const unit = Number(item.price_data?.unit_amount);
      const qty = Number(item.quantity ?? 1);
      if (!Number.isInteger(unit) || unit < 1 || !Number.isInteger(qty) || qty < 1) throw new ApiError(400, 'invalid_request_error', `Invalid line_items[${i}].`, `line_items[${i}]`);
      amount += unit * qty;
      currency = item.price_data?.currency ?? currency;
    }
    const s: Session = {
      id: id('cs_test'),
      object: 'checkout.session',
      mode: 'payment',
      status: 'open',
      payment_status: 'unpaid',
      amount_total: amount,
      currency,
      client_reference_id: typeof b.client_reference_id === 'string' ? b.client_reference_id : null,
      metadata: (b.metadata as Record<string, string>) ?? {},
      success_url: b.success_url,
      cancel_url: typeof b.cancel_url === 'string' ? b.cancel_url : null,
      url: null,
      payment_intent: null,
      created: Math.floor(Date.now() / 1000),
      livemode: false,
      line_items_description: items.map((i) => i.price_data?.product_data?.name ?? '').join(', '),
    };
    s.url = `${base}/checkout/${s.id}`;
    sessions.set(s.id, s);
    res.json(publicSession(s));
  });

  api.get('/v1/checkout/sessions/:id', (req, res) => {
    const s = sessions.get(String(req.params.id));
    if (!s) throw new ApiError(404, 'invalid_request_error', `No such checkout.session: '${req.params.id}'`, 'id');
    res.json(publicSession(s));
  });

  api.post('/v1/refunds', (req, res) => {
    const b = req.body as Record<string, string>;
    const intent = intents.get(b.payment_intent ?? '');
    if (!intent) throw new ApiError(400, 'invalid_request_error', `No such payment_intent: '${b.payment_intent}'`, 'payment_intent');
    const amount = b.amount ? Number(b.amount) : intent.amount - intent.refunded;
    if (!Number.isInteger(amount) || amount < 1 || amount > intent.amount - intent.refunded) throw new ApiError(400, 'invalid_request_error', 'Refund amount is greater than unrefunded amount on charge.', 'amount');
    intent.refunded += amount;
    const refund = { id: id('re'), object: 'refund', amount, currency: 'aud', payment_intent: intent.id, status: 'succeeded', created: Math.floor(Date.now() / 1000) };
    refunds.push({ id: refund.id, payment_intent: intent.id, amount });
    res.json(refund);
  });

  api.all('/v1/{*any}', () => {
    throw new ApiError(404, 'invalid_request_error', 'The payment stand-in does not serve this call (only checkout sessions and refunds).');
  });

  function publicSession(s: Session) {
    const { line_items_description: _d, ...rest } = s;
    return rest;
  }

  function sign(s: Session): SignedEvent {
    const event = { id: id('evt'), object: 'event', type: 'checkout.session.completed', created: Math.floor(Date.now() / 1000), livemode: false, api_version: null, pending_webhooks: 1, data: { object: publicSession(s) } };
    const payload = JSON.stringify(event);
    return { payload, header: signer.webhooks.generateTestHeaderString({ payload, secret: webhookSecret }), event };
  }

  async function pay(sessionId: string): Promise<SignedEvent> {
    const s = sessions.get(sessionId);
    if (!s) throw new ApiError(404, 'invalid_request_error', 'No such checkout session.');
    if (s.status === 'open') {
      s.status = 'complete';
      s.payment_status = 'paid';
      s.payment_intent = id('pi');
      intents.set(s.payment_intent, { id: s.payment_intent, amount: s.amount_total, refunded: 0 });
    }
    const signed = sign(s);
    if (standin.webhookUrl) {
      const res = await fetch(standin.webhookUrl, { method: 'POST', headers: { 'content-type': 'application/json', 'stripe-signature': signed.header }, body: signed.payload });
      if (!res.ok) throw new Error(`the app refused the webhook: ${res.status} ${await res.text()}`);
    }
    return signed;
  }

  // The hosted checkout page: a plain form, clearly a test page, no card details kept.
  app.get('/checkout/:id', (req, res) => {
    const s = sessions.get(String(req.params.id));
    if (!s) return void res.status(404).type('html').send('<!doctype html><title>Not found</title><p>No such checkout.</p>');
    const paid = s.payment_status === 'paid';
    res.type('html').send(`<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>Test checkout</title>
<style>body{font-family:system-ui,sans-serif;background:#eef1f4;color:#111;margin:0;padding:24px}main{max-width:420px;margin:0 auto;background:#fff;border-radius:8px;padding:24px;box-shadow:0 1px 3px #0002}
.amount{font-size:28px;font-weight:700;margin:8px 0 16px}label{display:block;font-size:14px;margin:12px 0 4px}input{width:100%;box-sizing:border-box;padding:10px;font-size:16px;border:1px solid #778;border-radius:4px}
button{margin-top:20px;width:100%;padding:12px;font-size:16px;border:0;border-radius:4px;background:#2a4d8f;color:#fff;cursor:pointer}.note{font-size:13px;color:#444}a{color:#2a4d8f}</style></head>
<body><main><p class="note">Payment stand-in: a test checkout, no real card is charged.</p>
<h1 style="font-size:18px;margin:0">${esc(s.line_items_description || 'Order')}</h1><p class="amount">${esc(money(s.amount_total, s.currency))}</p>
${paid ? '<p role="status">This checkout is already paid.</p>' : `<form method="post" action="/checkout/${esc(s.id)}/pay"><label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="off" value="4242 4242 4242 4242"><label for="exp">Expiry</label><input id="exp" name="exp" value="12 / 34"><button type="submit">Pay ${esc(money(s.amount_total, s.currency))}</button></form>`}
${s.cancel_url && !paid ? `<p><a href="${esc(s.cancel_url)}">Cancel and go back</a></p>` : ''}</main></body></html>`);
  });

  app.post('/checkout/:id/pay', (req, res, next) => {
    pay(String(req.params.id)).then(() => {
      const s = sessions.get(String(req.params.id))!;
      res.redirect(303, s.success_url.replace('{CHECKOUT_SESSION_ID}', s.id));
    }, next);
  });

  app.use(api);
  app.use((err: unknown, _req: Request, res: Response, _next: NextFunction) => {
    if (err instanceof ApiError) return void res.status(err.status).json({ error: { type: err.type, message: err.message, ...(err.param ? { param: err.param } : {}) } });
    res.status(500).json({ error: { type: 'api_error', message: (err as Error).message } });
  });

  const server = app.listen(port, host);
  await once(server, 'listening');
  base = `http://${host}:${(server.address() as AddressInfo).port}`;
  const standin: PaymentStandin = {
    url: base,
    webhookUrl,
    pay,
    session: (sid) => sessions.get(sid),
    refunds,
    close: () => new Promise<void>((resolve) => {
      server.closeAllConnections();
      server.close(() => resolve());
    }),
  };
  return standin;
}
