// Who may call each API operation: the one table tests/api/access-matrix.test.ts checks every
// operation of /api/openapi.json against, for anonymous callers, every role and an installer of
// another company. Adding a route? Add its line here (the matrix test fails naming it until you do).
import type { Role } from '../../shared/roles.ts';

/** Ids the matrix test creates before calling anything (see `fixtures` in access-matrix.test.ts). */
export type FixtureKey =
  | 'sku' // an active demo part
  | 'archiveSku' // a demo part the archive/restore and edit routes may change
  | 'media' // a photo on `sku`
  | 'mediaToDelete' // a photo the delete route may remove
  | 'plan' // a plan saved by an installer of company A (the "own" company)
  | 'range' // a demo range
  | 'user' // a user the admin routes may change
  | 'customer' // company A (the installer's own), for staff saving plans for a customer
  | 'job' // a job of company A, made by its installer
  | 'warehouse' // a demo warehouse
  | 'bin' // a bin of `warehouse`
  | 'mail' // a message in the outbox
  | 'orderedJob' // an ordered job of company A that no route cancels (it has a tax invoice)
  | 'pickJob' // a job of company A with its one line reserved (ready to pick and label)
  | 'pickSku' // the SKU on `pickJob`
  | 'label' // a label number of `pickJob`
  | 'supplier' // a demo supplier
  | 'priceList' // an uploaded (not yet mapped) price list of `supplier`
  | 'tier' // a demo customer tier
  | 'purchaseOrder' // a draft purchase order
  | 'purchaseOrderToDelete' // a draft the delete route may remove
  | 'recompute'; // a sell-price recompute
export type Fixtures = Record<FixtureKey, string>;

export interface OperationAccess {
  /** 'public': anyone; 'signed-in': any role; otherwise exactly these roles (others get 403). */
  allow: 'public' | 'signed-in' | readonly Role[];
  /**
   * The object in the path belongs to a company: an installer of another company gets 404
   * (installer of the owning company and staff are allowed as usual).
   */
  companyOwned?: boolean;
  /** Which fixture fills each path parameter. */
  params?: Record<string, FixtureKey>;
  /** A valid query / body for allowed callers; without one, writes are sent `{}` (allowed → 400). */
  query?: (f: Fixtures) => Record<string, string>;
  body?: (f: Fixtures) => unknown;
}

const everyone: readonly Role[] = ['admin', 'purchasing', 'warehouse', 'sales', 'installer'];
const staff: readonly Role[] = ['admin', 'purchasing', 'warehouse', 'sales'];
const editors: readonly Role[] = ['admin', 'purchasing'];
const planners: readonly Role[] = ['admin', 'purchasing', 'sales', 'installer'];
const admins: readonly Role[] = ['admin'];
const jobMakers: readonly Role[] = ['admin', 'sales', 'installer'];
const desk: readonly Role[] = ['admin', 'sales'];
const storemen: readonly Role[] = ['admin', 'warehouse'];
const labellers: readonly Role[] = ['admin', 'warehouse', 'sales'];

const plan = (f: Fixtures) => ({ rangeId: f.range, modules: 3 });

/** Keys are "METHOD /api/path/{param}" exactly as in the OpenAPI document. */
export const ACCESS_TABLE: Record<string, OperationAccess> = {
  // system
  'GET /api/health': { allow: 'public' },
  'GET /api/me': { allow: 'signed-in' },

  // users (admin only)
  'GET /api/admin/users': { allow: admins },
  'POST /api/admin/users': { allow: admins },
  'PATCH /api/admin/users/{id}': { allow: admins, params: { id: 'user' } },
  'POST /api/admin/users/{id}/password': { allow: admins, params: { id: 'user' } },
  'GET /api/admin/companies': { allow: admins },

  // catalogue
  'GET /api/parts': { allow: everyone },
  'GET /api/parts/export.csv': { allow: everyone },
  'GET /api/parts/lookup': { allow: everyone, query: (f) => ({ code: f.sku }) },
  'GET /api/parts/{sku}': { allow: everyone, params: { sku: 'sku' } },
  'POST /api/parts': { allow: editors },
  'PATCH /api/parts/{sku}': { allow: editors, params: { sku: 'archiveSku' } },
  'POST /api/parts/{sku}/archive': { allow: editors, params: { sku: 'archiveSku' } },
  'POST /api/parts/{sku}/restore': { allow: editors, params: { sku: 'archiveSku' } },
  'POST /api/parts/{sku}/media': { allow: editors, params: { sku: 'sku' } },
  'DELETE /api/parts/{sku}/media/{id}': { allow: editors, params: { sku: 'sku', id: 'mediaToDelete' } },
  'GET /api/media/{id}': { allow: everyone, params: { id: 'media' } },
  'GET /api/media/{id}/thumbnail': { allow: everyone, params: { id: 'media' } },
  'GET /api/makers': { allow: everyone },
  'GET /api/ranges': { allow: everyone },

  // planner
  'POST /api/stack-plans': { allow: planners, body: plan },
  'POST /api/stack-plans/bom.csv': { allow: planners, body: plan },
  'POST /api/stack-plans/plan.pdf': { allow: planners, body: plan },
  'POST /api/stack-plans/saved': { allow: planners, body: (f) => ({ name: 'Matrix check', companyId: f.customer, request: plan(f) }) },
  'GET /api/stack-plans/saved': { allow: planners },
  'GET /api/stack-plans/saved/{id}': { allow: planners, companyOwned: true, params: { id: 'plan' } },
  'GET /api/stack-plans/saved/{id}/bom.csv': { allow: planners, companyOwned: true, params: { id: 'plan' } },
  'GET /api/stack-plans/saved/{id}/plan.pdf': { allow: planners, companyOwned: true, params: { id: 'plan' } },
  'GET /api/ranges/{id}': { allow: everyone, params: { id: 'range' } },
  'PUT /api/ranges/{id}': { allow: editors, params: { id: 'range' } },
  'GET /api/customers': { allow: staff },
  'GET /api/inverters': { allow: everyone },

  // jobs (installers: their own company's only)
  'POST /api/jobs': { allow: jobMakers, body: (f) => ({ reference: `Matrix ${Math.random().toString(36).slice(2, 10)}`, companyId: f.customer, lines: [{ sku: f.sku, qty: 1 }] }) },
  'GET /api/jobs': { allow: everyone },
  'GET /api/jobs.csv': { allow: everyone },
  'GET /api/jobs/{id}': { allow: everyone, companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/order': { allow: jobMakers, companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/reserve': { allow: desk, companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/release': { allow: desk, companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/dispatch': { allow: ['admin', 'sales', 'warehouse'], companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/collect': { allow: ['admin', 'sales', 'warehouse'], companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/close': { allow: ['admin', 'sales', 'warehouse'], companyOwned: true, params: { id: 'job' } },
  'POST /api/jobs/{id}/gather': { allow: storemen, params: { id: 'job' } },
  'POST /api/jobs/{id}/cancel': { allow: desk, companyOwned: true, params: { id: 'job' } },

  // stock (staff only)
  'GET /api/stock': { allow: staff },
  'GET /api/stock/movements': { allow: staff },
  'GET /api/stock/low': { allow: staff },
  'POST /api/stock/adjustments': { allow: storemen },
  'POST /api/stock/counts': { allow: storemen },
  'POST /api/stock/transfers': { allow: storemen },
  'POST /api/stock/receipts': { allow: storemen },
  'POST /api/stock/returns': { allow: storemen },
  'GET /api/stock/settings/{sku}': { allow: staff, params: { sku: 'sku' } },
  'PUT /api/stock/limits/{sku}': { allow: ['admin', 'purchasing', 'warehouse'], params: { sku: 'sku' } },
  'PUT /api/stock/default-bins': { allow: admins },
  'GET /api/warehouses': { allow: staff },
  'POST /api/warehouses': { allow: admins },
  'PUT /api/warehouses/{id}': { allow: admins, params: { id: 'warehouse' } },
  'POST /api/warehouses/{id}/bins': { allow: admins, params: { id: 'warehouse' } },
  'PUT /api/warehouses/{id}/bins/{binId}': { allow: admins, params: { id: 'warehouse', binId: 'bin' } },

  // mail, payments and invoices (issue 13)
  'GET /api/admin/outbox': { allow: admins },
  'GET /api/admin/outbox/{id}': { allow: admins, params: { id: 'mail' } },
  'POST /api/jobs/{id}/payments': { allow: jobMakers, companyOwned: true, params: { id: 'job' } },
  'POST /api/payments/webhook': { allow: 'public' },
  'GET /api/portal/summary': { allow: everyone },
  'POST /api/stack-plans/alternatives': { allow: planners, body: plan },
  'POST /api/jobs/{id}/reorder': { allow: jobMakers, companyOwned: true, params: { id: 'orderedJob' } },
  'GET /api/jobs/{id}/invoice.pdf': { allow: ['admin', 'purchasing', 'sales', 'installer'], companyOwned: true, params: { id: 'orderedJob' } },
  // warehouse: picking (staff see pick lists; admin and warehouse pick), labels, handover sheet
  'GET /api/pick-queue': { allow: staff },
  'GET /api/jobs/{id}/pick': { allow: staff, companyOwned: true, params: { id: 'pickJob' } },
  'POST /api/jobs/{id}/pick/scans': { allow: storemen, companyOwned: true, params: { id: 'pickJob' }, body: (f) => ({ code: f.pickSku, scanId: `matrix-${Math.random().toString(36).slice(2, 12)}` }) },
  'POST /api/jobs/{id}/pick/pause': { allow: storemen, companyOwned: true, params: { id: 'pickJob' } },
  'POST /api/jobs/{id}/pick/resume': { allow: storemen, companyOwned: true, params: { id: 'pickJob' } },
  'POST /api/jobs/{id}/pick/complete': { allow: storemen, companyOwned: true, params: { id: 'pickJob' } },
  'GET /api/jobs/{id}/labels': { allow: labellers, companyOwned: true, params: { id: 'pickJob' } },
  'GET /api/jobs/{id}/labels/{n}.png': { allow: labellers, companyOwned: true, params: { id: 'pickJob', n: 'label' } },
  'GET /api/jobs/{id}/labels.pdf': { allow: labellers, companyOwned: true, params: { id: 'pickJob' } },
  'GET /api/jobs/{id}/handover': { allow: everyone, companyOwned: true, params: { id: 'pickJob' } },
  'GET /api/jobs/{id}/handover.pdf': { allow: everyone, companyOwned: true, params: { id: 'pickJob' } },
  // purchasing (suppliers, imports, pricing, orders: admin and purchasing; the warehouse sees orders to receive them)
  'GET /api/suppliers': { allow: editors },
  'POST /api/suppliers': { allow: editors },
  'PUT /api/suppliers/{id}': { allow: editors, params: { id: 'supplier' } },
  'GET /api/suppliers/{id}/parts': { allow: editors, params: { id: 'supplier' } },
  'PUT /api/suppliers/{id}/parts': { allow: editors, params: { id: 'supplier' } },
  'GET /api/suppliers/{id}/parts/{sku}/history': { allow: editors, params: { id: 'supplier', sku: 'sku' } },
  'GET /api/price-lists': { allow: editors },
  'POST /api/price-lists': { allow: editors },
  'GET /api/price-lists/{id}': { allow: editors, params: { id: 'priceList' } },
  'PUT /api/price-lists/{id}/mapping': { allow: editors, params: { id: 'priceList' } },
  'GET /api/price-lists/{id}/preview': { allow: editors, params: { id: 'priceList' } },
  'GET /api/price-lists/{id}/problems.csv': { allow: editors, params: { id: 'priceList' } },
  'POST /api/price-lists/{id}/links': { allow: editors, params: { id: 'priceList' } },
  'POST /api/price-lists/{id}/apply': { allow: editors, params: { id: 'priceList' } },
  'GET /api/pricing/rules': { allow: editors },
  'PUT /api/pricing/rules': { allow: editors },
  'GET /api/pricing/parts': { allow: editors },
  'PUT /api/pricing/parts/{sku}': { allow: editors, params: { sku: 'sku' } },
  'POST /api/pricing/recompute': { allow: editors },
  'GET /api/pricing/recomputes': { allow: editors },
  'GET /api/pricing/recomputes/{id}/moves.csv': { allow: editors, params: { id: 'recompute' } },
  'GET /api/pricing/tiers': { allow: editors },
  'POST /api/pricing/tiers': { allow: editors },
  'PUT /api/pricing/tiers/{id}': { allow: editors, params: { id: 'tier' } },
  'PUT /api/pricing/customers/{id}/tier': { allow: editors, params: { id: 'customer' } },
  'GET /api/sell-prices': { allow: everyone, query: (f) => ({ sku: f.sku }) },
  'GET /api/reorder/suggestions': { allow: editors },
  'POST /api/reorder/draft-orders': { allow: editors },
  'GET /api/purchase-orders': { allow: ['admin', 'purchasing', 'warehouse'] },
  'POST /api/purchase-orders': { allow: editors },
  'GET /api/purchase-orders/{id}': { allow: ['admin', 'purchasing', 'warehouse'], params: { id: 'purchaseOrder' } },
  'DELETE /api/purchase-orders/{id}': { allow: editors, params: { id: 'purchaseOrderToDelete' } },
  'GET /api/purchase-orders/{id}/pdf': { allow: editors, params: { id: 'purchaseOrder' } },
  'POST /api/purchase-orders/{id}/send': { allow: editors, params: { id: 'purchaseOrder' } },
  'POST /api/purchase-orders/{id}/close': { allow: editors, params: { id: 'purchaseOrder' } },
  'POST /api/purchase-orders/{id}/receipts': { allow: storemen, params: { id: 'purchaseOrder' } },
};

export type Caller = 'anonymous' | Role | 'other-installer';
export const CALLERS: readonly Caller[] = ['anonymous', ...everyone, 'other-installer'];

/** What a caller must get: a status, or "allowed" (past the gate: not 401/403/404-by-company, below 500). */
export type Expected = { status: 401 | 403 | 404 } | { allowed: true; success: boolean };

export function expectedFor(entry: OperationAccess, caller: Caller, method: string): Expected {
  const success = method === 'GET' || entry.body !== undefined;
  if (entry.allow === 'public') return { allowed: true, success };
  if (caller === 'anonymous') return { status: 401 };
  const role: Role = caller === 'other-installer' ? 'installer' : caller;
  if (entry.allow !== 'signed-in' && !entry.allow.includes(role)) return { status: 403 };
  if (caller === 'other-installer' && entry.companyOwned) return { status: 404 };
  return { allowed: true, success };
}
