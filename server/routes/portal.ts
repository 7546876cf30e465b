import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { JobSchema } from '@shared/contracts/jobs.ts';
import { StackPlanRequestSchema } from '@shared/contracts/stack-plans.ts';
import { PlanAlternativesSchema, PortalSummarySchema } from '@shared/contracts/portal.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentJob } from '../presenters/jobs.ts';


export function portalRoutes(api: Api, { portal, jobs }: Pick<AppDeps, 'portal' | 'jobs'>) {
  api.route({ method: 'get', path: '/portal/summary', summary: 'Jobs by status and the ones needing attention (unpaid, backordered, ready, quote lapsing); installers: their own company', tag: 'portal', ability: 'jobs.view', response: z.object({ data: PortalSummarySchema }) }, async ({ actor }) => ({
    data: await portal.summary(actor),
  }));

  api.route({ method: 'post', path: '/stack-plans/alternatives', summary: 'For a plan with short lines: the nearest plans fully available now, with what changes and what it costs', tag: 'planner', ability: 'plans.create', body: StackPlanRequestSchema, response: PlanAlternativesSchema }, async ({ actor, body }) => ({
    data: await portal.alternatives(actor, body),
  }));

  api.route({ method: 'post', path: '/jobs/:id/reorder', summary: 'A new draft job with the same lines at today’s prices', tag: 'jobs', ability: 'jobs.create', params: IdParams, response: z.object({ data: JobSchema }), status: 201 }, async ({ actor, params }) => ({
    data: presentJob(await jobs.reorder(actor, params.id)),
  }));
}
