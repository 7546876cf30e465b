import { z } from 'zod';
import { text } from './text.ts';
import { JOB_STATUSES } from './jobs.ts';
import { StackPlanRequestSchema } from './stack-plans.ts';

export const ATTENTION_REASONS = ['unpaid', 'backorder', 'ready', 'quote-expiring'] as const;
export type AttentionReason = (typeof ATTENTION_REASONS)[number];

/** The installer's home: their jobs counted by status, and the ones that need them now. */
export const PortalSummarySchema = z.object({
  byStatus: z.array(z.object({ status: z.enum(JOB_STATUSES), count: z.number() })),
  attention: z.array(
    z.object({
      id: text(),
      reference: text(),
      status: z.enum(JOB_STATUSES),
      reason: z.enum(ATTENTION_REASONS),
      /** Units backordered (backorder), the amount to pay inc GST (unpaid), when a quote hold lapses (quote-expiring). */
      units: z.number().nullable(),
      amountCents: z.number().nullable(),
      at: text().nullable(),
    }),
  ),
});
export type PortalSummary = z.infer<typeof PortalSummarySchema>;

/** A plan that is fully available now, offered instead of one with short lines. */
export const PlanAlternativeSchema = z.object({
  kind: z.enum(['modules', 'range']),
  request: StackPlanRequestSchema,
  rangeName: text(),
  rangeCode: text(),
  stacks: z.number(),
  modulesPerStack: z.number(),
  usableKwh: z.number(),
  totalCents: z.number(),
  /** Total inc GST against the plan asked for (negative: cheaper). */
  differenceCents: z.number(),
  /** What changes, in words: module count, usable energy, range, height. */
  changes: z.array(text()),
});
export type PlanAlternative = z.infer<typeof PlanAlternativeSchema>;

export const PlanAlternativesSchema = z.object({
  data: z.object({ short: z.array(z.object({ sku: text(), name: text(), short: z.number() })), alternatives: z.array(PlanAlternativeSchema) }),
});
export type PlanAlternatives = z.infer<typeof PlanAlternativesSchema>['data'];
