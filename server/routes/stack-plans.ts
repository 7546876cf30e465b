import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import { text } from '@shared/contracts/text.ts';
import { InverterOptionSchema, RangeDetailSchema, RangeInputSchema, SavedPlanSchema, SavePlanSchema, StackPlanRequestSchema, StackPlanSchema, type StackPlanResult } from '@shared/contracts/stack-plans.ts';
import { sendCsv } from '../http/csv.ts';
import type { Response } from 'express';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { renderPlanPdf } from '../documents/plan-pdf.ts';
import { bomCsvRows, presentRangeDetail, presentSavedPlan } from '../presenters/stack-plans.ts';


function sendBomCsv(res: Response, plan: StackPlanResult, fileName: string) {
  sendCsv(res, bomCsvRows(plan), fileName);
}

async function sendPlanPdf(res: Response, plan: StackPlanResult, title: string, fileName: string, preparedFor?: string) {
  const pdf = await renderPlanPdf(plan, { title, preparedFor, date: new Date() });
  res.setHeader('content-type', 'application/pdf');
  res.setHeader('content-disposition', `inline; filename="${fileName}.pdf"`);
  res.send(pdf);
}

const fileStem = (s: string) => s.replace(/[^\w-]+/g, '-').replace(/^-+|-+$/g, '').slice(0, 60) || 'stack-plan';

export function stackPlanRoutes(api: Api, { planner }: Pick<AppDeps, 'planner'>) {
  api.route({ method: 'post', path: '/stack-plans', summary: 'Plan a stack: figures, cautions and a BOM with availability', tag: 'planner', ability: 'plans.create', body: StackPlanRequestSchema, response: z.object({ data: StackPlanSchema }) }, async ({ actor, body }) => ({
    data: await planner.plan(actor, body),
  }));

  api.route({ method: 'post', path: '/stack-plans/bom.csv', summary: 'The BOM of a plan as CSV', tag: 'planner', ability: 'plans.create', body: StackPlanRequestSchema, produces: 'text/csv' }, async ({ actor, body, res }) => {
    const plan = await planner.plan(actor, body);
    sendBomCsv(res, plan, `bom-${fileStem(plan.rangeName)}-${plan.stacks}x${plan.modulesPerStack}`);
  });

  api.route({ method: 'post', path: '/stack-plans/plan.pdf', summary: 'A plan as a printable PDF', tag: 'planner', ability: 'plans.create', body: StackPlanRequestSchema, produces: 'application/pdf' }, async ({ actor, body, res }) => {
    const plan = await planner.plan(actor, body);
    await sendPlanPdf(res, plan, `${plan.rangeName}: ${plan.stacks} × ${plan.modulesPerStack} modules`, `plan-${fileStem(plan.rangeName)}`);
  });

  api.route({ method: 'post', path: '/stack-plans/saved', summary: 'Save a plan as a draft for a customer account', tag: 'planner', ability: 'plans.create', body: SavePlanSchema, response: z.object({ data: SavedPlanSchema }), status: 201 }, async ({ actor, body }) => ({
    data: presentSavedPlan(await planner.save(actor, body)),
  }));

  api.route({ method: 'get', path: '/stack-plans/saved', summary: 'Saved plans (installers: their own company only)', tag: 'planner', ability: 'plans.create', response: z.object({ data: z.array(SavedPlanSchema) }) }, async ({ actor }) => ({
    data: (await planner.listPlans(actor)).map(presentSavedPlan),
  }));

  api.route({ method: 'get', path: '/stack-plans/saved/:id', summary: 'One saved plan, recomputed with today’s availability', tag: 'planner', ability: 'plans.create', params: IdParams, response: z.object({ data: SavedPlanSchema.extend({ plan: StackPlanSchema }) }) }, async ({ actor, params }) => {
    const { saved, plan } = await planner.replanSaved(actor, params.id);
    return { data: { ...presentSavedPlan(saved), plan } };
  });

  for (const format of ['bom.csv', 'plan.pdf'] as const) {
    api.route({ method: 'get', path: `/stack-plans/saved/:id/${format}`, summary: format === 'bom.csv' ? 'A saved plan’s BOM as CSV' : 'A saved plan as PDF', tag: 'planner', ability: 'plans.create', params: IdParams, produces: format === 'bom.csv' ? 'text/csv' : 'application/pdf' }, async ({ actor, params, res }) => {
      const { saved, plan } = await planner.replanSaved(actor, params.id);
      if (format === 'bom.csv') sendBomCsv(res, plan, `bom-${fileStem(saved.name)}`);
      else await sendPlanPdf(res, plan, saved.name, `plan-${fileStem(saved.name)}`, saved.companyName);
    });
  }

  api.route({ method: 'get', path: '/ranges/:id', summary: 'A range with its rules and everything the planner needs', tag: 'planner', ability: 'catalogue.view', params: IdParams, response: z.object({ data: RangeDetailSchema }) }, async ({ actor, params }) => ({
    data: presentRangeDetail(await planner.rangeDetail(actor, params.id)),
  }));

  api.route({ method: 'put', path: '/ranges/:id', summary: 'Change a range and its BOM rules', tag: 'planner', ability: 'ranges.edit', params: IdParams, body: RangeInputSchema, response: z.object({ data: RangeDetailSchema }) }, async ({ actor, params, body }) => ({
    data: presentRangeDetail(await planner.updateRange(actor, params.id, body)),
  }));

  api.route({ method: 'get', path: '/customers', summary: 'Customer accounts (staff only)', tag: 'planner', ability: 'customers.view', response: z.object({ data: z.array(z.object({ id: text(), name: text() })) }) }, async ({ actor }) => ({
    data: await planner.customers(actor),
  }));

  api.route({ method: 'get', path: '/inverters', summary: 'Inverters with their battery windows', tag: 'planner', ability: 'catalogue.view', response: z.object({ data: z.array(InverterOptionSchema) }) }, async ({ actor }) => ({
    data: await planner.inverters(actor),
  }));
}
