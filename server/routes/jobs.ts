import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { CreateJobSchema, DispatchInputSchema, JobListQuerySchema, JobListSchema, JobSchema } from '@shared/contracts/jobs.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentJob, presentJobSummary } from '../presenters/jobs.ts';
import { sendCsv } from '../http/csv.ts';
import { JOB_STATUS_LABELS } from '@shared/contracts/jobs.ts';

const JobResponse = z.object({ data: JobSchema });

export function jobRoutes(api: Api, { jobs }: Pick<AppDeps, 'jobs'>) {
  api.route({ method: 'post', path: '/jobs', summary: 'Create a job from saved plans and lines by SKU (installers: for their own company)', tag: 'jobs', ability: 'jobs.create', body: CreateJobSchema, response: JobResponse, status: 201 }, async ({ actor, body }) => ({
    data: presentJob(await jobs.create(actor, body)),
  }));

  api.route({ method: 'get', path: '/jobs', summary: 'Jobs, filtered by status, company, reference and date (installers: their own company only)', tag: 'jobs', ability: 'jobs.view', query: JobListQuerySchema, response: JobListSchema }, async ({ actor, query }) => {
    const { rows, total } = await jobs.list(actor, query);
    return { data: rows.map(presentJobSummary), total };
  });

  api.route({ method: 'get', path: '/jobs.csv', summary: 'The job list as CSV, same filters (up to 5,000 rows)', tag: 'jobs', ability: 'jobs.view', query: JobListQuerySchema.omit({ page: true, pageSize: true }), produces: 'text/csv' }, async ({ actor, query, res }) => {
    const { rows } = await jobs.list(actor, { ...query, page: 1, pageSize: 5000 });
    sendCsv(
      res,
      rows.map(presentJobSummary).map((j) => ({
        Reference: j.reference,
        Status: JOB_STATUS_LABELS[j.status],
        Customer: j.company.name,
        Suburb: j.siteSuburb ?? '',
        Postcode: j.sitePostcode ?? '',
        Lines: j.lines,
        Units: j.units,
        Reserved: j.reserved,
        Backordered: j.backordered,
        Created: j.createdAt.slice(0, 10),
      })),
      `jobs-${new Date().toISOString().slice(0, 10)}`,
    );
  });

  api.route({ method: 'get', path: '/jobs/:id', summary: 'A job with its lines, reservations, backorders and history', tag: 'jobs', ability: 'jobs.view', params: IdParams, response: JobResponse }, async ({ actor, params }) => ({
    data: presentJob(await jobs.detail(actor, params.id)),
  }));

  const actions = [
    { verb: 'order', ability: 'jobs.create', summary: 'Order a draft: its plans’ BOM lines are copied in' },
    { verb: 'reserve', ability: 'jobs.reserve', summary: 'Reserve stock for every line in one transaction (a draft is held as a quote); what is short is backordered' },
    { verb: 'release', ability: 'jobs.reserve', summary: 'Release every unit the job holds and drop its backorders' },
    { verb: 'cancel', ability: 'jobs.cancel', summary: 'Cancel the job and release its stock' },
    { verb: 'collect', ability: 'jobs.handover', summary: 'A ready job was collected at the counter' },
    { verb: 'close', ability: 'jobs.handover', summary: 'Close a dispatched or collected job' },
    { verb: 'gather', ability: 'stock.transfer', summary: 'Move the units the job holds in other warehouses to its preferred warehouse (transfer out and in; the units stay the job’s)' },
  ] as const;
  api.route({ method: 'post', path: '/jobs/:id/dispatch', summary: 'A ready job has left with a carrier, optionally named with its tracking reference (the customer is told)', tag: 'jobs', ability: 'jobs.handover', params: IdParams, body: DispatchInputSchema, response: JobResponse }, async ({ actor, params, body }) => ({
    data: presentJob(await jobs.dispatch(actor, params.id, body)),
  }));
  for (const a of actions) {
    api.route({ method: 'post', path: `/jobs/:id/${a.verb}`, summary: a.summary, tag: 'jobs', ability: a.ability, params: IdParams, response: JobResponse }, async ({ actor, params }) => ({
      data: presentJob(await jobs[a.verb](actor, params.id)),
    }));
  }
}
