import type { StackPlanRequest } from '@shared/contracts/stack-plans.ts';
import { download } from '@/lib/api-client.ts';

export type PlanFile = 'bom.csv' | 'plan.pdf';

/** A file for a plan being worked on (sent as the request) or a saved one (by id). */
export function downloadPlanFile(source: { request: StackPlanRequest } | { savedId: string }, file: PlanFile) {
  return 'savedId' in source
    ? download(`/stack-plans/saved/${encodeURIComponent(source.savedId)}/${file}`)
    : download(`/stack-plans/${file}`, { method: 'POST', body: source.request });
}
