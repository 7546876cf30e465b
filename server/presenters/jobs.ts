import type { Job, JobSummary } from '@shared/contracts/jobs.ts';
import { lineTotalCents } from '@shared/domain/money.ts';
import { jobTotals } from '@shared/domain/quote.ts';
import type { JobService } from '../services/jobs.ts';

type Detail = Awaited<ReturnType<JobService['detail']>>;
type ListRow = Awaited<ReturnType<JobService['list']>>['rows'][number];

const iso = (d: Date | null) => (d ? d.toISOString() : null);

/** A job as its page shows it; lines carry available and short, never on-hand figures. */
export function presentJob(d: Detail): Job {
  // GST on the invoice total (s 9-90), the one method used throughout.
  const { subtotalCents, gstCents, totalCents, unpricedLines } = jobTotals(d.lines);
  return {
    id: d.job.id,
    reference: d.job.reference,
    status: d.job.status,
    company: d.company,
    siteSuburb: d.job.siteSuburb,
    sitePostcode: d.job.sitePostcode,
    contact: d.job.contact,
    notes: d.job.notes,
    preferredWarehouse: d.preferred,
    createdAt: d.job.createdAt.toISOString(),
    updatedAt: d.job.updatedAt.toISOString(),
    orderedAt: iso(d.job.orderedAt),
    holdExpiresAt: iso(d.holdExpiresAt),
    plans: d.plans.map((p) => {
      const s = (p.summary ?? {}) as { usableKwh?: number; stacks?: number; modulesPerStack?: number };
      return { id: p.id, name: p.name, rangeName: p.rangeName, usableKwh: s.usableKwh ?? null, stacks: s.stacks ?? null, modulesPerStack: s.modulesPerStack ?? null };
    }),
    lines: d.lines.map((l) => ({
      id: l.id,
      lineNo: l.lineNo,
      sku: l.sku,
      name: l.name,
      qty: l.qty,
      reserved: l.reserved,
      backordered: l.backordered,
      available: Math.max(0, l.available),
      short: Math.max(0, l.qty - l.reserved - Math.max(0, l.available)),
      plan: l.planId ? { id: l.planId, name: l.planName ?? '' } : null,
      reason: l.reason,
      unitPriceCents: l.unitPriceCents,
      lineTotalCents: l.unitPriceCents === null ? null : lineTotalCents(l.unitPriceCents, l.qty),
    })),
    reservations: d.held.map((r) => ({ sku: r.sku, warehouse: r.warehouse, bin: r.bin, qty: r.qty, needsTransfer: r.needsTransfer, expiresAt: iso(r.expiresAt) })),
    backorders: d.queue.map((b) => ({ sku: b.sku, qty: b.qty, since: b.since.toISOString(), position: b.position, unitsAhead: b.unitsAhead })),
    history: d.history.map((h) => ({ status: h.status, at: h.at.toISOString(), by: h.by, note: h.note })),
    totals: { subtotalCents, gstCents, totalCents, unpricedLines },
    paymentTerms: d.paymentTerms,
    payment: d.payment ? { status: d.payment.status, amountCents: Number(d.payment.amountCents), paidAt: d.payment.paidAt.toISOString() } : null,
    abilities: d.abilities,
  };
}

export function presentJobSummary(r: ListRow): JobSummary {
  return {
    id: r.id,
    reference: r.reference,
    status: r.status,
    company: { id: r.companyId, name: r.companyName },
    siteSuburb: r.siteSuburb,
    sitePostcode: r.sitePostcode,
    createdAt: r.createdAt.toISOString(),
    updatedAt: r.updatedAt.toISOString(),
    lines: r.lines,
    units: r.units,
    reserved: r.reserved,
    backordered: r.backordered,
  };
}
