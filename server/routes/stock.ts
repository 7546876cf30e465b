import { z } from 'zod';
import { text } from '@shared/contracts/text.ts';
import { AdjustmentSchema, BinInputSchema, CountSchema, DefaultBinSchema, LedgerResultSchema, LowStockSchema, MovementQuerySchema, MovementSchema, PartStockSettingsSchema, ReceiptSchema, ReturnSchema, StockLevelSchema, StockLimitSchema, StockQuerySchema, TransferSchema, WarehouseInputSchema, WarehouseSchema } from '@shared/contracts/stock.ts';
import type { Api } from '../http/route.ts';
import type { AppDeps } from '../deps.ts';
import { presentMovement } from '../presenters/stock.ts';

const Ledger = z.object({ data: LedgerResultSchema });
const IdParams = z.object({ id: z.uuid() });

export function stockRoutes(api: Api, { stock }: Pick<AppDeps, 'stock'>) {
  api.route({ method: 'get', path: '/stock', summary: 'Stock levels per part × warehouse × bin (staff only)', tag: 'stock', ability: 'stock.view', query: StockQuerySchema, response: z.object({ data: z.array(StockLevelSchema), total: z.number() }) }, async ({ actor, query }) => {
    const { rows, total } = await stock.levels(actor, query);
    return { data: rows, total };
  });

  api.route({ method: 'get', path: '/stock/movements', summary: 'The stock ledger, newest first, filtered by part, warehouse, kind and date', tag: 'stock', ability: 'stock.view', query: MovementQuerySchema, response: z.object({ data: z.array(MovementSchema), total: z.number() }) }, async ({ actor, query }) => {
    const { rows, total } = await stock.movements(actor, query);
    return { data: rows.map(presentMovement), total };
  });

  api.route({ method: 'get', path: '/stock/low', summary: 'Parts at or below their minimum (available less backorders)', tag: 'stock', ability: 'stock.view', response: z.object({ data: z.array(LowStockSchema) }) }, async ({ actor }) => ({
    data: await stock.lowStock(actor),
  }));

  api.route({ method: 'post', path: '/stock/adjustments', summary: 'Adjust a bin’s stock, with a reason', tag: 'stock', ability: 'stock.adjust', body: AdjustmentSchema, response: Ledger, status: 201 }, async ({ actor, body }) => ({ data: await stock.adjust(actor, body) }));
  api.route({ method: 'post', path: '/stock/counts', summary: 'Record a bin count; the difference becomes a count correction', tag: 'stock', ability: 'stock.adjust', body: CountSchema, response: Ledger, status: 201 }, async ({ actor, body }) => ({ data: await stock.count(actor, body) }));
  api.route({ method: 'post', path: '/stock/transfers', summary: 'Move free units between bins or warehouses', tag: 'stock', ability: 'stock.transfer', body: TransferSchema, response: Ledger, status: 201 }, async ({ actor, body }) => ({ data: await stock.transfer(actor, body) }));
  api.route({ method: 'post', path: '/stock/receipts', summary: 'Receive goods; waiting backorders are filled oldest first (filledJobs)', tag: 'stock', ability: 'stock.receive', body: ReceiptSchema, response: Ledger, status: 201 }, async ({ actor, body }) => ({ data: await stock.receive(actor, body) }));
  api.route({ method: 'post', path: '/stock/returns', summary: 'Book returned units back into a bin', tag: 'stock', ability: 'stock.receive', body: ReturnSchema, response: Ledger, status: 201 }, async ({ actor, body }) => ({ data: await stock.returnStock(actor, body) }));

  api.route({ method: 'get', path: '/stock/settings/:sku', summary: 'A part’s minimum and maximum stock and its default bin per warehouse', tag: 'stock', ability: 'stock.view', params: z.object({ sku: text().min(1).max(64) }), response: z.object({ data: PartStockSettingsSchema }) }, async ({ actor, params }) => ({
    data: await stock.partSettings(actor, params.sku),
  }));
  api.route({ method: 'put', path: '/stock/limits/:sku', summary: 'A part’s minimum and maximum stock', tag: 'stock', ability: 'stock.limits', params: z.object({ sku: text().min(1).max(64) }), body: StockLimitSchema, response: z.object({ data: z.object({ sku: text(), min: z.number(), max: z.number() }) }) }, async ({ actor, params, body }) => ({
    data: await stock.setLimits(actor, params.sku, body),
  }));

  api.route({ method: 'get', path: '/warehouses', summary: 'Warehouses with their bins in pick order', tag: 'stock', ability: 'stock.view', response: z.object({ data: z.array(WarehouseSchema) }) }, async ({ actor }) => ({ data: await stock.warehouses(actor) }));
  api.route({ method: 'post', path: '/warehouses', summary: 'Add a warehouse', tag: 'stock', ability: 'warehouses.manage', body: WarehouseInputSchema, response: z.object({ data: z.object({ id: text() }) }), status: 201 }, async ({ actor, body }) => ({ data: { id: (await stock.saveWarehouse(actor, null, body)).id } }));
  api.route({ method: 'put', path: '/warehouses/:id', summary: 'Change a warehouse', tag: 'stock', ability: 'warehouses.manage', params: IdParams, body: WarehouseInputSchema, response: z.object({ data: z.object({ id: text() }) }) }, async ({ actor, params, body }) => ({ data: { id: (await stock.saveWarehouse(actor, params.id, body)).id } }));
  api.route({ method: 'post', path: '/warehouses/:id/bins', summary: 'Add a bin to a warehouse', tag: 'stock', ability: 'warehouses.manage', params: IdParams, body: BinInputSchema, response: z.object({ data: z.object({ id: text() }) }), status: 201 }, async ({ actor, params, body }) => ({ data: { id: (await stock.saveBin(actor, params.id, null, body)).id } }));
  api.route({ method: 'put', path: '/warehouses/:id/bins/:binId', summary: 'Change a bin’s code or pick order', tag: 'stock', ability: 'warehouses.manage', params: z.object({ id: z.uuid(), binId: z.uuid() }), body: BinInputSchema, response: z.object({ data: z.object({ id: text() }) }) }, async ({ actor, params, body }) => ({ data: { id: (await stock.saveBin(actor, params.id, params.binId, body)).id } }));
  api.route({ method: 'put', path: '/stock/default-bins', summary: 'Set a part’s default bin in a warehouse', tag: 'stock', ability: 'warehouses.manage', body: DefaultBinSchema, response: z.object({ data: z.object({ sku: text(), warehouse: text(), bin: text() }) }) }, async ({ actor, body }) => ({ data: await stock.setDefaultBin(actor, body) }));
}
