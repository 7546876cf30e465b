// Every message Stackyard sends, as plain text and HTML, in our own words. Pure functions: the
// mail service renders one when it writes the outbox row, so the outbox shows exactly what went out.
import { formatCents } from '@shared/domain/money.ts';
import type { MailEvent } from '@shared/contracts/mail.ts';

export interface Rendered {
  subject: string;
  text: string;
  html: string;
}

export interface MailLine {
  sku: string;
  name: string;
  qty: number;
}

/** What each event's template needs. */
export interface MailData {
  invitation: { name: string; inviterName: string; companyName: string; url: string };
  'password-reset': { name: string; url: string };
  'order-received': { reference: string; companyName: string; lines: MailLine[]; totalCents: number; unpricedLines: number; paymentTerms: 'trade' | 'cash'; url: string };
  backorders: { reference: string; lines: (MailLine & { expected: string | null })[]; url: string };
  'ready-for-collection': { reference: string; place: string | null; url: string };
  dispatched: { reference: string; carrier: string | null; trackingRef: string | null; url: string };
  'payment-received': { reference: string; amountCents: number; url: string };
  refund: { reference: string; amountCents: number };
  'purchase-order': { supplierName: string; poNumber: string; lines: (MailLine & { supplierSku: string | null; unitCostCents: number | null })[]; deliverTo: string; expectedBy: string | null; buyerName: string };
  'price-list-applied': { supplierName: string; fileName: string; added: number; changed: number; unchanged: number; missing: number; appliedBy: string; url: string };
  'low-stock-digest': { date: string; lines: { sku: string; name: string; available: number; reorderAt: number; backordered: number }[]; url: string };
}

const esc = (s: string) => s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c]!);

/** The HTML frame every message shares: our colours, readable without images or styles. */
function page(title: string, body: string): string {
  return `<!doctype html><html lang="en-AU"><head><meta charset="utf-8"><title>${esc(title)}</title></head>
<body style="margin:0;background:#f7f5f0;color:#1c2430;font-family:Inter,Arial,sans-serif;font-size:15px;line-height:1.5">
<div style="max-width:600px;margin:0 auto;padding:24px">
<p style="font-weight:700;color:#a8482a;margin:0 0 16px">Stackyard</p>
${body}
<p style="margin-top:32px;font-size:13px;color:#4a5563">Sent by Stackyard for Lowtide Battery Wholesale. Reply to this message to reach the trade desk.</p>
</div></body></html>`;
}

const p = (s: string) => `<p>${esc(s)}</p>`;
const link = (url: string, label: string) => `<p><a href="${esc(url)}" style="color:#a8482a;font-weight:600">${esc(label)}</a></p>`;

function table(head: string[], rows: (string | number)[][]): string {
  const th = head.map((h) => `<th align="left" style="border-bottom:1px solid #1c2430;padding:4px 8px">${esc(h)}</th>`).join('');
  const tr = rows.map((r) => `<tr>${r.map((c) => `<td style="border-bottom:1px solid #d9d4c7;padding:4px 8px;font-family:'JetBrains Mono',monospace">${esc(String(c))}</td>`).join('')}</tr>`).join('');
  return `<table style="border-collapse:collapse;width:100%;font-size:14px"><thead><tr>${th}</tr></thead><tbody>${tr}</tbody></table>`;
}

const textLines = (rows: string[]) => rows.map((r) => `  ${r}`).join('\n');
const signOff = '\n\n— Stackyard, for Lowtide Battery Wholesale';

type Templates = { [E in MailEvent]: (d: MailData[E]) => Rendered };

export const TEMPLATES: Templates = {
  invitation: (d) => ({
    subject: `${d.inviterName} has added you to ${d.companyName} on Stackyard`,
    text: `Hello ${d.name},\n\n${d.inviterName} has made you a Stackyard account for ${d.companyName}. Choose your password here (the link works for 24 hours):\n\n${d.url}\n\nOnce you are in, you can plan stacks, order them and follow your jobs.${signOff}`,
    html: page('Your Stackyard account', `${p(`Hello ${d.name},`)}${p(`${d.inviterName} has made you a Stackyard account for ${d.companyName}. Choose your password with the link below; it works for 24 hours.`)}${link(d.url, 'Choose my password')}${p('Once you are in, you can plan stacks, order them and follow your jobs.')}`),
  }),
  'password-reset': (d) => ({
    subject: 'Choose a new Stackyard password',
    text: `Hello ${d.name},\n\nSomeone (we hope you) asked to change the password of your Stackyard account. Choose a new one here (the link works for 24 hours):\n\n${d.url}\n\nIf it was not you, ignore this message: your password stays as it is.${signOff}`,
    html: page('Choose a new password', `${p(`Hello ${d.name},`)}${p('Someone (we hope you) asked to change the password of your Stackyard account. The link below works for 24 hours.')}${link(d.url, 'Choose a new password')}${p('If it was not you, ignore this message: your password stays as it is.')}`),
  }),
  'order-received': (d) => {
    const terms = d.paymentTerms === 'cash' ? 'Paid by card.' : 'Invoiced on your trade account terms.';
    // A line without a price is not in the total: say so rather than send a total that looks whole.
    const total = d.unpricedLines > 0 ? `Total inc GST of the priced lines: ${formatCents(d.totalCents)}; the trade desk will price the other ${d.unpricedLines === 1 ? 'line' : `${d.unpricedLines} lines`}.` : `Total inc GST: ${formatCents(d.totalCents)}.`;
    return {
      subject: `We have your order ${d.reference}`,
      text: `Your order ${d.reference} for ${d.companyName} has reached the trade desk. We are setting the stock aside now and will write again if anything has to wait.\n\n${textLines(d.lines.map((l) => `${l.qty} × ${l.sku}  ${l.name}`))}\n\n${total} ${terms}\n\nFollow it here: ${d.url}${signOff}`,
      html: page(`Order ${d.reference}`, `${p(`Your order ${d.reference} for ${d.companyName} has reached the trade desk. We are setting the stock aside now and will write again if anything has to wait.`)}${table(['Qty', 'SKU', 'Part'], d.lines.map((l) => [l.qty, l.sku, l.name]))}${p(`${total} ${terms}`)}${link(d.url, 'Follow the job')}`),
    };
  },
  backorders: (d) => {
    const when = (e: string | null) => e ?? 'date to come';
    return {
      subject: `${d.reference}: some parts are on backorder`,
      text: `We have set aside everything we hold for ${d.reference}. These parts are short and on backorder; they go to your job as soon as they arrive:\n\n${textLines(d.lines.map((l) => `${l.qty} × ${l.sku}  ${l.name}  (expected: ${when(l.expected)})`))}\n\nIf waiting does not suit the site, the planner can suggest a stack that is available now: ${d.url}${signOff}`,
      html: page(`${d.reference}: backorders`, `${p(`We have set aside everything we hold for ${d.reference}. These parts are short and on backorder; they go to your job as soon as they arrive.`)}${table(['Qty', 'SKU', 'Part', 'Expected'], d.lines.map((l) => [l.qty, l.sku, l.name, when(l.expected)]))}${p('If waiting does not suit the site, the planner can suggest a stack that is available now.')}${link(d.url, 'Open the job')}`),
    };
  },
  'ready-for-collection': (d) => ({
    subject: `${d.reference} is packed and ready to collect`,
    text: `Your kit for ${d.reference} is picked, labelled and waiting${d.place ? ` at ${d.place}` : ''}. Bring the job reference when you collect.\n\n${d.url}${signOff}`,
    html: page(`${d.reference} is ready`, `${p(`Your kit for ${d.reference} is picked, labelled and waiting${d.place ? ` at ${d.place}` : ''}. Bring the job reference when you collect.`)}${link(d.url, 'Open the job')}`),
  }),
  dispatched: (d) => {
    const how = [d.carrier, d.trackingRef ? `reference ${d.trackingRef}` : null].filter(Boolean).join(', ');
    return {
      subject: `${d.reference} is on its way`,
      text: `Your kit for ${d.reference} has left the warehouse${how ? ` (${how})` : ''}. Lithium modules travel as dangerous goods: check the packs on arrival and keep the labels on.\n\n${d.url}${signOff}`,
      html: page(`${d.reference} dispatched`, `${p(`Your kit for ${d.reference} has left the warehouse${how ? ` (${how})` : ''}.`)}${p('Lithium modules travel as dangerous goods: check the packs on arrival and keep the labels on.')}${link(d.url, 'Open the job')}`),
    };
  },
  'payment-received': (d) => ({
    subject: `Payment received for ${d.reference}`,
    text: `Thank you: your card payment of ${formatCents(d.amountCents)} for ${d.reference} has gone through, and the order now stands. The tax invoice is on the job page.\n\n${d.url}${signOff}`,
    html: page(`Payment for ${d.reference}`, `${p(`Thank you: your card payment of ${formatCents(d.amountCents)} for ${d.reference} has gone through, and the order now stands.`)}${p('The tax invoice is on the job page.')}${link(d.url, 'Open the job')}`),
  }),
  refund: (d) => ({
    subject: `Refund for ${d.reference}`,
    text: `${d.reference} has been cancelled, so we have refunded your card payment of ${formatCents(d.amountCents)}. Banks usually take a few days to show it.${signOff}`,
    html: page(`Refund for ${d.reference}`, p(`${d.reference} has been cancelled, so we have refunded your card payment of ${formatCents(d.amountCents)}. Banks usually take a few days to show it.`)),
  }),
  'purchase-order': (d) => {
    const cost = (c: number | null) => (c === null ? '' : formatCents(c));
    return {
      subject: `Purchase order ${d.poNumber} from Lowtide Battery Wholesale`,
      text: `Hello ${d.supplierName},\n\nPlease supply the following against purchase order ${d.poNumber}${d.expectedBy ? ` by ${d.expectedBy}` : ''}, delivered to ${d.deliverTo}:\n\n${textLines(d.lines.map((l) => `${l.qty} × ${l.supplierSku ?? l.sku}  ${l.name}  ${cost(l.unitCostCents)}`.trimEnd()))}\n\nQuote the purchase order number on the delivery docket. Questions to ${d.buyerName}.${signOff}`,
      html: page(`Purchase order ${d.poNumber}`, `${p(`Hello ${d.supplierName},`)}${p(`Please supply the following against purchase order ${d.poNumber}${d.expectedBy ? ` by ${d.expectedBy}` : ''}, delivered to ${d.deliverTo}.`)}${table(['Qty', 'Your code', 'Our SKU', 'Part', 'Unit cost ex GST'], d.lines.map((l) => [l.qty, l.supplierSku ?? '', l.sku, l.name, cost(l.unitCostCents)]))}${p(`Quote the purchase order number on the delivery docket. Questions to ${d.buyerName}.`)}`),
    };
  },
  'price-list-applied': (d) => ({
    subject: `${d.supplierName} price list applied`,
    text: `${d.appliedBy} applied ${d.fileName} from ${d.supplierName}: ${d.added} new, ${d.changed} changed, ${d.unchanged} unchanged, ${d.missing} no longer listed. Sell prices have been worked out again from the pricing rules.\n\n${d.url}${signOff}`,
    html: page('Price list applied', `${p(`${d.appliedBy} applied ${d.fileName} from ${d.supplierName}.`)}${table(['New', 'Changed', 'Unchanged', 'No longer listed'], [[d.added, d.changed, d.unchanged, d.missing]])}${p('Sell prices have been worked out again from the pricing rules.')}${link(d.url, 'See the import')}`),
  }),
  'low-stock-digest': (d) => ({
    subject: `Low stock on ${d.date}: ${d.lines.length} part${d.lines.length === 1 ? '' : 's'} at or below reorder level`,
    text: `These parts are at or below their reorder level this morning:\n\n${textLines(d.lines.map((l) => `${l.sku}  ${l.name}  available ${l.available}, reorder at ${l.reorderAt}${l.backordered ? `, ${l.backordered} on backorder` : ''}`))}\n\n${d.url}${signOff}`,
    html: page('Low-stock digest', `${p('These parts are at or below their reorder level this morning.')}${table(['SKU', 'Part', 'Available', 'Reorder at', 'Backordered'], d.lines.map((l) => [l.sku, l.name, l.available, l.reorderAt, l.backordered]))}${link(d.url, 'Open stock')}`),
  }),
};

export function render<E extends MailEvent>(event: E, data: MailData[E]): Rendered {
  return (TEMPLATES[event] as (d: MailData[E]) => Rendered)(data);
}
