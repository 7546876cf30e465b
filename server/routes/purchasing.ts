import { z } from 'zod';
import multer from 'multer';
import type { RequestHandler } from 'express';
import { text } from '@shared/contracts/text.ts';
import {
  ApplyResultSchema,
  CompanyTierInputSchema,
  DraftFromSuggestionsSchema,
  PartPricingInputSchema,
  PoInputSchema,
  PoQuerySchema,
  PoReceiptSchema,
  PoSummarySchema,
  PreviewQuerySchema,
  PreviewSchema,
  PriceHistorySchema,
  PriceListMappingSchema,
  PriceListSchema,
  PricingRuleInputSchema,
  PricingRuleSchema,
  PurchaseOrderSchema,
  RecomputeSchema,
  RowLinkSchema,
  SuggestionSchema,
  SupplierInputSchema,
  SupplierPartInputSchema,
  SupplierPartSchema,
  SupplierSchema,
  TierInputSchema,
  TierSchema,
} from '@shared/contracts/purchasing.ts';
import { LedgerResultSchema } from '@shared/contracts/stock.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { sendCsv } from '../http/csv.ts';
import { AppError } from '../errors.ts';
import { PRICE_FILE_MAX_BYTES } from '../lib/price-file.ts';
import { renderPurchaseOrderPdf } from '../documents/purchase-order-pdf.ts';
import { presentMoveCsvRow, presentPoSummary, presentPriceHistory, presentPriceList, presentPriceListSummary, presentProblemCsvRow, presentPurchaseOrder, presentRecompute, presentSupplier, presentSupplierPart } from '../presenters/purchasing.ts';

const IdParams = z.object({ id: z.uuid() });
const id = z.object({ data: z.object({ id: text() }) });
const PriceListUploadForm = z.object({ file: text().meta({ format: 'binary', description: 'The price list: CSV (any delimiter, UTF-8) or XLSX, at most 20 MB' }), supplierId: z.uuid() });
const UploadBody = z.object({ supplierId: z.uuid({ error: 'Choose the supplier this price list comes from.' }) });

const upload = multer({ storage: multer.memoryStorage(), limits: { fileSize: PRICE_FILE_MAX_BYTES, files: 1, fields: 5 } }).single('file');
const uploadOne: RequestHandler = (req, res, next) =>
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if ((err as { code?: string }).code === 'LIMIT_FILE_SIZE') return next(new AppError(413, 'file_too_large', `Price lists can be at most ${PRICE_FILE_MAX_BYTES / 1024 / 1024} MB.`));
    next(new AppError(400, 'bad_upload', 'Send one file in the form field "file" and the supplier in "supplierId".'));
  });

export function purchasingRoutes(api: Api, { suppliers, priceLists, pricing, purchaseOrders, stock }: Pick<AppDeps, 'suppliers' | 'priceLists' | 'pricing' | 'purchaseOrders' | 'stock'>) {
  // Suppliers and what they sell us
  api.route({ method: 'get', path: '/suppliers', summary: 'Suppliers with their terms', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(SupplierSchema) }) }, async ({ actor }) => ({ data: (await suppliers.list(actor)).map(presentSupplier) }));
  api.route({ method: 'post', path: '/suppliers', summary: 'Add a supplier', tag: 'purchasing', ability: 'purchasing.manage', body: SupplierInputSchema, response: id, status: 201 }, async ({ actor, body }) => ({ data: { id: (await suppliers.save(actor, null, body)).id } }));
  api.route({ method: 'put', path: '/suppliers/:id', summary: 'Change a supplier’s terms', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: SupplierInputSchema, response: id }, async ({ actor, params, body }) => ({ data: { id: (await suppliers.save(actor, params.id, body)).id } }));
  api.route({ method: 'get', path: '/suppliers/:id/parts', summary: 'What a supplier sells us: SKU, pack, MOQ, cost, price breaks', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, response: z.object({ data: z.array(SupplierPartSchema) }) }, async ({ actor, params }) => ({ data: (await suppliers.parts(actor, params.id)).map(presentSupplierPart) }));
  api.route({ method: 'put', path: '/suppliers/:id/parts', summary: 'Add or change one supplier part (a new cost goes into its history)', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: SupplierPartInputSchema, response: z.object({ data: z.object({ sku: text() }) }) }, async ({ actor, params, body }) => ({ data: await suppliers.savePart(actor, params.id, body) }));
  api.route({ method: 'get', path: '/suppliers/:id/parts/:sku/history', summary: 'Every cost a supplier part has had, newest first', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams.extend({ sku: text().min(1).max(64) }), response: z.object({ data: z.array(PriceHistorySchema) }) }, async ({ actor, params }) => ({ data: (await suppliers.history(actor, params.id, params.sku)).map(presentPriceHistory) }));

  // Price-list imports
  api.route({ method: 'get', path: '/price-lists', summary: 'Price-list imports, newest first', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(z.unknown()) }) }, async ({ actor }) => ({ data: (await priceLists.list(actor)).map(presentPriceListSummary) }));
  api.route({ method: 'post', path: '/price-lists', summary: 'Upload a supplier price list (CSV or XLSX, decided by content); offers a column mapping', tag: 'purchasing', ability: 'purchasing.manage', upload: PriceListUploadForm, response: z.object({ data: PriceListSchema }), status: 201, middleware: [uploadOne] }, async ({ actor, req }) => {
    const parsed = UploadBody.safeParse(req.body ?? {});
    const supplierId = parsed.success ? parsed.data.supplierId : null;
    if (!supplierId) throw new AppError(400, 'validation_failed', 'Choose the supplier this price list comes from.', { fields: [{ path: 'supplierId', message: 'Choose a supplier.' }] });
    return { data: presentPriceList(await priceLists.upload(actor, supplierId, req.file)) };
  });
  api.route({ method: 'get', path: '/price-lists/:id', summary: 'One import: its status, columns, mapping, counts and progress', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, response: z.object({ data: PriceListSchema }) }, async ({ actor, params }) => ({ data: presentPriceList(await priceLists.get(actor, params.id)) }));
  api.route({ method: 'put', path: '/price-lists/:id/mapping', summary: 'Choose the columns (and sheet); every row is read and checked', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: PriceListMappingSchema, response: z.object({ data: PriceListSchema }) }, async ({ actor, params, body }) => ({ data: presentPriceList(await priceLists.setMapping(actor, params.id, body)) }));
  api.route({ method: 'get', path: '/price-lists/:id/preview', summary: 'Counts, per-row problems and the diff against current costs', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, query: PreviewQuerySchema, response: z.object({ data: PreviewSchema }) }, async ({ actor, params, query }) => ({ data: await priceLists.preview(actor, params.id, query) }));
  api.route({ method: 'get', path: '/price-lists/:id/problems.csv', summary: 'Every refused row and why, as CSV', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, produces: 'text/csv' }, async ({ actor, params, res }) => {
    sendCsv(res, (await priceLists.problemRows(actor, params.id)).map(presentProblemCsvRow), 'price-list-problems');
  });
  api.route({ method: 'post', path: '/price-lists/:id/links', summary: 'Link new rows to our parts, or mark them to become new parts', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: RowLinkSchema, response: z.object({ data: PriceListSchema }) }, async ({ actor, params, body }) => ({ data: presentPriceList(await priceLists.link(actor, params.id, body)) }));
  api.route({ method: 'post', path: '/price-lists/:id/apply', summary: 'Apply the price list in one transaction (a second apply changes nothing)', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, response: z.object({ data: ApplyResultSchema }) }, async ({ actor, params }) => ({ data: await priceLists.apply(actor, params.id) }));

  // Sell pricing
  api.route({ method: 'get', path: '/pricing/rules', summary: 'Markup or supplier list price per category', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(PricingRuleSchema) }) }, async ({ actor }) => ({ data: (await pricing.rules(actor)).map((r) => ({ category: r.category as never, basis: r.basis, markupPct: Number(r.markupPct) })) }));
  api.route({ method: 'put', path: '/pricing/rules', summary: 'Set category rules; sell prices are recomputed', tag: 'purchasing', ability: 'purchasing.manage', body: PricingRuleInputSchema, response: z.object({ data: z.object({ id: text(), moved: z.number() }) }) }, async ({ actor, body }) => ({ data: await pricing.setRules(actor, body.rules) }));
  api.route({ method: 'get', path: '/pricing/parts', summary: 'Parts with their own pricing', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(z.object({ sku: text(), name: text(), category: text(), basis: text(), markupPct: z.number().nullable(), costCents: z.number().nullable(), listPriceCents: z.number().nullable() })) }) }, async ({ actor }) => ({
    data: (await pricing.partPricing(actor)).map((p) => ({ ...p, markupPct: p.markupPct === null ? null : Number(p.markupPct) })),
  }));
  api.route({ method: 'put', path: '/pricing/parts/:sku', summary: 'A part’s own pricing (basis null: follow its category)', tag: 'purchasing', ability: 'purchasing.manage', params: z.object({ sku: text().min(1).max(64) }), body: PartPricingInputSchema, response: z.object({ data: z.object({ id: text(), moved: z.number() }) }) }, async ({ actor, params, body }) => ({ data: await pricing.setPartPricing(actor, params.sku, body) }));
  api.route({ method: 'post', path: '/pricing/recompute', summary: 'Recompute every sell price from the rules', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.object({ id: text(), moved: z.number() }) }) }, async ({ actor }) => ({ data: await pricing.recompute(actor) }));
  api.route({ method: 'get', path: '/pricing/recomputes', summary: 'What moved: the latest sell-price recomputes with each change', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(RecomputeSchema) }) }, async ({ actor }) => ({ data: (await pricing.recomputes(actor)).map(presentRecompute) }));
  api.route({ method: 'get', path: '/pricing/recomputes/:id/moves.csv', summary: 'One recompute’s price changes as CSV', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, produces: 'text/csv' }, async ({ actor, params, res }) => {
    sendCsv(res, (await pricing.moves(actor, params.id)).map(presentMoveCsvRow), 'sell-price-changes');
  });
  api.route({ method: 'get', path: '/pricing/tiers', summary: 'Customer tiers and their discounts', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(TierSchema), customers: z.array(z.object({ id: text(), name: text(), tierId: text().nullable() })) }) }, async ({ actor }) => {
    const r = await pricing.tiers(actor);
    return { data: r.tiers, customers: r.customers };
  });
  api.route({ method: 'post', path: '/pricing/tiers', summary: 'Add a customer tier', tag: 'purchasing', ability: 'purchasing.manage', body: TierInputSchema, response: id, status: 201 }, async ({ actor, body }) => ({ data: { id: (await pricing.saveTier(actor, null, body)).id } }));
  api.route({ method: 'put', path: '/pricing/tiers/:id', summary: 'Change a customer tier', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: TierInputSchema, response: id }, async ({ actor, params, body }) => ({ data: { id: (await pricing.saveTier(actor, params.id, body)).id } }));
  api.route({ method: 'put', path: '/pricing/customers/:id/tier', summary: 'Put a customer in a tier (or none)', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, body: CompanyTierInputSchema, response: z.object({ data: z.object({ id: text(), tierId: text().nullable(), discountPct: z.number() }) }) }, async ({ actor, params, body }) => ({ data: await pricing.setCompanyTier(actor, params.id, body.tierId) }));
  api.route({ method: 'get', path: '/sell-prices', summary: 'A customer’s sell prices ex GST (installers: their own; never cost)', tag: 'purchasing', ability: 'catalogue.view', query: z.object({ sku: z.union([text().trim().min(1).max(64), z.array(text().trim().min(1).max(64)).max(200)]).transform((s) => (Array.isArray(s) ? s : [s])), company: z.uuid().optional() }), response: z.object({ data: z.array(z.object({ sku: text(), name: text(), listCents: z.number().nullable(), discountPct: z.number(), sellCents: z.number().nullable() })) }) }, async ({ actor, query }) => ({
    data: (await pricing.sellPrices(actor, query.sku, query.company ?? null)).map(({ sku, name, listCents, discountPct, sellCents }) => ({ sku, name, listCents, discountPct, sellCents })),
  }));

  // Replenishment and purchase orders
  api.route({ method: 'get', path: '/reorder/suggestions', summary: 'Parts at or below their minimum, with the quantity and supplier to order from', tag: 'purchasing', ability: 'purchasing.manage', response: z.object({ data: z.array(SuggestionSchema) }) }, async ({ actor }) => ({ data: await purchaseOrders.suggestions(actor) }));
  api.route({ method: 'post', path: '/reorder/draft-orders', summary: 'Turn suggestions into draft purchase orders, one per supplier', tag: 'purchasing', ability: 'purchasing.manage', body: DraftFromSuggestionsSchema, response: z.object({ data: z.array(z.object({ id: text(), number: text() })) }), status: 201 }, async ({ actor, body }) => ({ data: await purchaseOrders.draftFromSuggestions(actor, body.lines) }));
  api.route({ method: 'get', path: '/purchase-orders', summary: 'Purchase orders, newest first', tag: 'purchasing', ability: 'purchase-orders.view', query: PoQuerySchema, response: z.object({ data: z.array(PoSummarySchema) }) }, async ({ actor, query }) => ({ data: (await purchaseOrders.list(actor, query.status)).map((r) => presentPoSummary(actor, r)) }));
  api.route({ method: 'post', path: '/purchase-orders', summary: 'Write a purchase order by hand', tag: 'purchasing', ability: 'purchasing.manage', body: PoInputSchema, response: z.object({ data: z.object({ id: text(), number: text() }) }), status: 201 }, async ({ actor, body }) => ({ data: await purchaseOrders.create(actor, body) }));
  api.route({ method: 'get', path: '/purchase-orders/:id', summary: 'One purchase order (costs only for roles that see costs)', tag: 'purchasing', ability: 'purchase-orders.view', params: IdParams, response: z.object({ data: PurchaseOrderSchema }) }, async ({ actor, params }) => ({ data: presentPurchaseOrder(actor, await purchaseOrders.detail(actor, params.id)) }));
  api.route({ method: 'get', path: '/purchase-orders/:id/pdf', summary: 'The purchase order as a PDF for the supplier', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, produces: 'application/pdf' }, async ({ actor, params, res }) => {
    const po = await purchaseOrders.detail(actor, params.id);
    const pdf = await renderPurchaseOrderPdf(presentPurchaseOrder(actor, po), { buyer: 'Stackyard', deliverTo: `${po.warehouseName} (${po.warehouse})`, date: po.sentAt ?? po.createdAt });
    res.setHeader('content-type', 'application/pdf');
    res.setHeader('content-disposition', `inline; filename="${po.number}.pdf"`);
    res.send(pdf);
  });
  api.route({ method: 'post', path: '/purchase-orders/:id/send', summary: 'Mark a draft as sent to the supplier', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, response: z.object({ data: z.object({ id: text(), number: text() }) }) }, async ({ actor, params }) => ({ data: await purchaseOrders.send(actor, params.id) }));
  api.route({ method: 'post', path: '/purchase-orders/:id/close', summary: 'Close an order (nothing more is expected)', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, response: z.object({ data: z.object({ id: text(), number: text() }) }) }, async ({ actor, params }) => ({ data: await purchaseOrders.close(actor, params.id) }));
  api.route({ method: 'delete', path: '/purchase-orders/:id', summary: 'Delete a draft purchase order', tag: 'purchasing', ability: 'purchasing.manage', params: IdParams, status: 204 }, async ({ actor, params, res }) => {
    await purchaseOrders.remove(actor, params.id);
    res.status(204).end();
  });
  api.route({ method: 'post', path: '/purchase-orders/:id/receipts', summary: 'Receive goods against the order (through the stock receipts; fills backorders)', tag: 'purchasing', ability: 'stock.receive', params: IdParams, body: PoReceiptSchema, response: z.object({ data: LedgerResultSchema }), status: 201 }, async ({ actor, params, body }) => ({
    data: await stock.receive(actor, await purchaseOrders.receiptFor(actor, params.id, body)),
  }));
}

