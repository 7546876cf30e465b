import { z } from 'zod';
import { text } from '@shared/contracts/text.ts';
import multer from 'multer';
import { MakerSchema, MediaSchema, PartDetailSchema, PartInputSchema, PartListQuerySchema, PartListResponseSchema, RangeSummarySchema } from '@shared/contracts/parts.ts';
import { sendCsv } from '../http/csv.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentMedia, presentPartCsvRow, presentPartDetail, presentPartSummary } from '../presenters/parts.ts';
import { DATASHEET_LIMIT } from '../services/media.ts';
import { AppError } from '../errors.ts';

const SkuParams = z.object({ sku: text().min(1).max(64) });
const MediaParams = z.object({ id: text().uuid('Unknown file.') });
/** The upload form: one file, its type decided by its content (OpenAPI "binary" string). */
const MediaUploadForm = z.object({ file: text().meta({ format: 'binary', description: 'A JPEG, PNG or WebP photo, or a PDF datasheet' }) });
const detail = z.object({ data: PartDetailSchema });

/** Multer errors (too big, too many files) as our 4xx envelope. */
const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: DATASHEET_LIMIT, files: 1, fields: 5 } }).single('file');
const uploadOne: import('express').RequestHandler = (req, res, next) =>
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    const e = err as { code?: string };
    if (e.code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'file_too_large', 'Files can be at most 20 MB (photos 5 MB).'));
    next(new AppError(400, 'bad_upload', 'Send one file in the form field "file".'));
  });

export function partRoutes(api: Api, { catalogue, media }: Pick<AppDeps, 'catalogue' | 'media'>) {
  api.route({ method: 'get', path: '/parts', summary: 'Search and filter the catalogue', tag: 'catalogue', ability: 'catalogue.view', query: PartListQuerySchema, response: PartListResponseSchema }, async ({ actor, query }) => {
    const r = await catalogue.list(actor, query);
    return { data: r.hits.map(presentPartSummary), facets: r.facets, total: r.total, page: query.page, pageSize: query.pageSize, exactSku: r.exactSku };
  });

  api.route({ method: 'get', path: '/parts/export.csv', summary: 'The filtered catalogue as CSV', tag: 'catalogue', ability: 'catalogue.view', query: PartListQuerySchema, produces: 'text/csv' }, async ({ actor, query, res }) => {
    sendCsv(res, (await catalogue.exportRows(actor, query)).map(presentPartCsvRow), 'stackyard-catalogue');
  });

  api.route({ method: 'get', path: '/parts/lookup', summary: 'Find a part by scanned SKU, GTIN or supplier SKU', tag: 'catalogue', ability: 'catalogue.view', query: z.object({ code: text().trim().min(1).max(64) }), response: z.object({ data: z.object({ sku: text() }) }) }, async ({ actor, query }) => {
    const { sku } = await catalogue.lookup(actor, query.code);
    return { data: { sku } };
  });

  api.route({ method: 'get', path: '/parts/:sku', summary: 'One part with attributes, media and stock', tag: 'catalogue', ability: 'catalogue.view', params: SkuParams, response: detail }, async ({ actor, params }) => ({
    data: presentPartDetail(actor, await catalogue.detail(actor, params.sku)),
  }));

  api.route({ method: 'post', path: '/parts', summary: 'Create a part', tag: 'catalogue', ability: 'catalogue.edit', body: PartInputSchema, response: detail, status: 201 }, async ({ actor, body }) => {
    const row = await catalogue.create(actor, body);
    return { data: presentPartDetail(actor, await catalogue.detail(actor, row.sku)) };
  });

  api.route({ method: 'patch', path: '/parts/:sku', summary: 'Change a part (send the whole part)', tag: 'catalogue', ability: 'catalogue.edit', params: SkuParams, body: PartInputSchema, response: detail }, async ({ actor, params, body }) => {
    const row = await catalogue.update(actor, params.sku, body);
    return { data: presentPartDetail(actor, await catalogue.detail(actor, row.sku)) };
  });

  for (const [verb, archived] of [['archive', true], ['restore', false]] as const) {
    api.route({ method: 'post', path: `/parts/:sku/${verb}`, summary: archived ? 'Archive a part (hidden from search)' : 'Restore an archived part', tag: 'catalogue', ability: 'catalogue.edit', params: SkuParams, response: detail }, async ({ actor, params }) => {
      const row = await catalogue.setArchived(actor, params.sku, archived);
      return { data: presentPartDetail(actor, await catalogue.detail(actor, row.sku)) };
    });
  }

  api.route({ method: 'post', path: '/parts/:sku/media', summary: 'Upload a photo (JPEG/PNG/WebP ≤ 5 MB) or datasheet (PDF ≤ 20 MB)', tag: 'catalogue', params: SkuParams, upload: MediaUploadForm, response: z.object({ data: MediaSchema }), status: 201, ability: 'catalogue.edit', middleware: [uploadOne] }, async ({ actor, params, req }) => {
    const row = await media.upload(actor, params.sku, req.file);
    return { data: presentMedia(row) };
  });

  api.route({ method: 'delete', path: '/parts/:sku/media/:id', summary: 'Remove a photo or datasheet', tag: 'catalogue', ability: 'catalogue.edit', params: SkuParams.extend(MediaParams.shape), status: 204 }, async ({ actor, params, res }) => {
    await media.remove(actor, params.sku, params.id);
    res.status(204).end();
  });

  for (const variant of ['original', 'thumbnail'] as const) {
    api.route({ method: 'get', path: variant === 'original' ? '/media/:id' : '/media/:id/thumbnail', summary: variant === 'original' ? 'A stored photo or datasheet' : 'A photo’s thumbnail', tag: 'catalogue', ability: 'catalogue.view', params: MediaParams, produces: 'application/octet-stream' }, async ({ actor, params, res }) => {
      const file = await media.read(actor, params.id, variant);
      res.setHeader('content-type', file.contentType);
      res.setHeader('cache-control', 'private, max-age=31536000, immutable');
      res.setHeader('x-content-type-options', 'nosniff');
      // Stored names are already reduced to letters, digits, spaces, dots and dashes (media service).
      res.setHeader('content-disposition', `inline; filename="${file.fileName}"`);
      res.send(file.bytes);
    });
  }

  api.route({ method: 'get', path: '/makers', summary: 'Makers with their part counts', tag: 'catalogue', ability: 'catalogue.view', response: z.object({ data: z.array(MakerSchema) }) }, async ({ actor }) => ({
    data: await catalogue.makers(actor),
  }));

  api.route({ method: 'get', path: '/ranges', summary: 'Stackable ranges', tag: 'catalogue', ability: 'catalogue.view', response: z.object({ data: z.array(RangeSummarySchema) }) }, async ({ actor }) => ({
    data: await catalogue.ranges(actor),
  }));
}
