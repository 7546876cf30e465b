import { z } from 'zod';
import { IdParamsSchema as IdParams } from '@shared/contracts/common.ts';
import type { Response } from 'express';
import { text } from '@shared/contracts/text.ts';
import { HandoverSchema, LabelLayoutQuerySchema, LabelPngQuerySchema, LabelSchema, PickCompleteResultSchema, PickListSchema, PickQueueItemSchema, PickScanResultSchema, PickScanSchema } from '@shared/contracts/warehouse.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { barcodePng } from '../documents/barcodes.ts';
import { renderLabelsPdf } from '../documents/labels-pdf.ts';
import { renderHandoverPdf } from '../documents/handover-pdf.ts';
import { fileStem, presentLabel } from '../presenters/warehouse.ts';

const LabelParams = z.object({ id: text().min(1).max(64), n: z.coerce.number().int().min(1).max(100_000) });
const PickListResponse = z.object({ data: PickListSchema });

function sendFile(res: Response, type: string, body: Buffer, fileName: string) {
  res.setHeader('content-type', type);
  res.setHeader('content-disposition', `inline; filename="${fileName}"`);
  res.send(body);
}

export function warehouseRoutes(api: Api, { picking, labels }: Pick<AppDeps, 'picking' | 'labels'>) {
  api.route({ method: 'get', path: '/pick-queue', summary: 'Jobs to pick and being picked, oldest order first, with who is picking', tag: 'warehouse', ability: 'stock.view', response: z.object({ data: z.array(PickQueueItemSchema) }) }, async ({ actor }) => ({
    data: await picking.queue(actor),
  }));
  api.route({ method: 'get', path: '/jobs/:id/pick', summary: 'A job’s pick list: lines by warehouse in bin pick order, progress, who is picking', tag: 'warehouse', ability: 'stock.view', params: IdParams, response: PickListResponse }, async ({ actor, params }) => ({
    data: await picking.pickList(actor, params.id),
  }));
  api.route({ method: 'post', path: '/jobs/:id/pick/scans', summary: 'One scan: confirms a line, counts a quantity or captures a serial; refusals change nothing; a scan id is applied once', tag: 'warehouse', ability: 'jobs.pick', params: IdParams, body: PickScanSchema, response: z.object({ data: PickScanResultSchema }) }, async ({ actor, params, body }) => ({
    data: await picking.scan(actor, params.id, body),
  }));
  api.route({ method: 'post', path: '/jobs/:id/pick/pause', summary: 'Pause a pick (anyone in the warehouse can resume it)', tag: 'warehouse', ability: 'jobs.pick', params: IdParams, response: PickListResponse }, async ({ actor, params }) => ({
    data: await picking.pause(actor, params.id),
  }));
  api.route({ method: 'post', path: '/jobs/:id/pick/resume', summary: 'Resume a paused pick as its picker', tag: 'warehouse', ability: 'jobs.pick', params: IdParams, response: PickListResponse }, async ({ actor, params }) => ({
    data: await picking.resume(actor, params.id),
  }));
  api.route({ method: 'post', path: '/jobs/:id/pick/complete', summary: 'Issue the picked kit in one transaction and make the job ready (twice issues once)', tag: 'warehouse', ability: 'jobs.pick', params: IdParams, response: z.object({ data: PickCompleteResultSchema }) }, async ({ actor, params }) => ({
    data: await picking.complete(actor, params.id),
  }));

  api.route({ method: 'get', path: '/jobs/:id/labels', summary: 'A job’s labels: what each says and exactly what its barcode encodes', tag: 'warehouse', ability: 'labels.print', params: IdParams, response: z.object({ data: z.array(LabelSchema) }) }, async ({ actor, params }) => ({
    data: (await labels.build(actor, params.id)).map((l) => presentLabel(params.id, l)),
  }));
  api.route({ method: 'get', path: '/jobs/:id/labels/:n.png', summary: 'One label’s barcode (or its QR code) as a 300 dpi PNG', tag: 'warehouse', ability: 'labels.print', params: LabelParams, query: LabelPngQuerySchema, produces: 'image/png' }, async ({ actor, params, query, res }) => {
    const label = await labels.one(actor, params.id, params.n);
    const spec = query.symbol === 'qr' && label.qr ? { symbology: 'qrcode' as const, bwipText: label.qr.payload } : label;
    sendFile(res, 'image/png', await barcodePng(spec), `label-${params.n}${query.symbol === 'qr' ? '-qr' : ''}.png`);
  });
  api.route({ method: 'get', path: '/jobs/:id/labels.pdf', summary: 'A job’s labels as a PDF: A4 sheets of 3 × 7, or 100 × 150 mm thermal', tag: 'warehouse', ability: 'labels.print', params: IdParams, query: LabelLayoutQuerySchema, produces: 'application/pdf' }, async ({ actor, params, query, res }) => {
    const built = await labels.build(actor, params.id);
    sendFile(res, 'application/pdf', await renderLabelsPdf(built, query.layout, `Labels ${params.id}`), `labels-${query.layout}.pdf`);
  });

  api.route({ method: 'get', path: '/jobs/:id/handover', summary: 'The handover sheet: system summary, every serial by part, cautions', tag: 'warehouse', ability: 'jobs.view', params: IdParams, response: z.object({ data: HandoverSchema }) }, async ({ actor, params }) => ({
    data: await labels.handover(actor, params.id),
  }));
  api.route({ method: 'get', path: '/jobs/:id/handover.pdf', summary: 'The handover sheet as a PDF', tag: 'warehouse', ability: 'jobs.view', params: IdParams, produces: 'application/pdf' }, async ({ actor, params, res }) => {
    const h = await labels.handover(actor, params.id);
    sendFile(res, 'application/pdf', await renderHandoverPdf(h), `handover-${fileStem(h.job.reference)}.pdf`);
  });
}
