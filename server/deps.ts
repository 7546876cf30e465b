import type { Logger } from 'pino';
import type { Db } from './db/client.ts';
import type { Auth } from './auth.ts';
import type { SearchClient } from './search/client.ts';
import type { FileStore } from './storage/files.ts';
import { createSessionCache } from './middleware/session.ts';
import { createUserService, type UserService } from './services/users.ts';
import { createCatalogueService, type CatalogueService } from './services/catalogue.ts';
import { createMediaService, type MediaService } from './services/media.ts';
import { createSystemService, type SystemService } from './services/system.ts';
import { createPartsIndex, type PartsIndex } from './search/parts-index.ts';
import { createPlannerService, RANGE_CACHE_MS, type LoadedRange, type PlannerService } from './services/planner.ts';
import { createTtlCache } from './lib/ttl-cache.ts';
import { createStockService, type StockService } from './services/stock.ts';
import { createJobService, type JobService } from './services/jobs.ts';
import type Stripe from 'stripe';
import { createMailService, type MailService } from './services/mail.ts';
import { createPaymentService, type PaymentService } from './services/payments.ts';
import { createInvoiceService, type InvoiceService } from './services/invoices.ts';
import { createPortalService, type PortalService } from './services/portal.ts';
import { createPickingService, type PickingService } from './services/picking.ts';
import { createLabelsService, type LabelsService } from './services/labels.ts';
import { createSupplierService, type SupplierService } from './services/suppliers.ts';
import { createPriceListService, type PriceListService } from './services/price-lists.ts';
import { createPricingService, type PricingService } from './services/pricing.ts';
import { createPurchaseOrderService, expectedArrivalsFor, onOrderFor, type PurchaseOrderService } from './services/purchase-orders.ts';

/** The side effects the app is built from (context.ts reads them from the environment; tests make their own). */
export interface AppOptions {
  db: Db;
  auth: Auth;
  search: SearchClient;
  files: FileStore;
  logger: Logger;
  trustedOrigins: string[];
  /** Express "trust proxy" setting: which hops may tell us the client's address. */
  trustProxy?: string | number | boolean;
  /** Built client to serve; omitted in API-only tests. */
  clientDir?: string;
  /** The clock for stock and jobs (tests move it to expire quote holds). */
  now?: () => Date;
  /** How many days a quote (a draft's reservation) holds its units. */
  quoteHoldDays?: number;
  /** The address people open links in e-mails at; defaults to the first trusted origin. */
  appUrl?: string;
  /** The card payment provider (the SDK, pointed at the stand-in or the real provider) and its webhook secret. */
  payment: { provider: Stripe; webhookSecret: string };
}

/** Options plus the services built from them. Routes take only the part they use (`Pick<AppDeps, …>`). */
export interface AppDeps extends AppOptions {
  sessionCache: ReturnType<typeof createSessionCache>;
  system: SystemService;
  users: UserService;
  partsIndex: PartsIndex;
  catalogue: CatalogueService;
  media: MediaService;
  planner: PlannerService;
  stock: StockService;
  jobs: JobService;
  mail: MailService;
  payments: PaymentService;
  invoices: InvoiceService;
  portal: PortalService;
  picking: PickingService;
  labels: LabelsService;
  suppliers: SupplierService;
  priceLists: PriceListService;
  pricing: PricingService;
  purchaseOrders: PurchaseOrderService;
}

/** Services built from the injected side effects; shared by the app, CLI tasks, tests and benchmarks. */
export function createServices(options: AppOptions): AppDeps {
  const partsIndex = createPartsIndex(options.search);
  const rangeCache = createTtlCache<LoadedRange>(RANGE_CACHE_MS);
  const sessionCache = createSessionCache();
  const purchaseOrders = createPurchaseOrderService({ db: options.db, now: options.now, onPurchaseOrderSent: (tx, po) => mail.purchaseOrderSent(tx, po.id).then(() => {}) });
  const planner = createPlannerService({ db: options.db, rangeCache, onRangeChanged: (tx, ids) => partsIndex.sync(tx, [...new Set(ids)]) });
  const appUrl = options.appUrl ?? options.trustedOrigins[0] ?? 'http://127.0.0.1:3000';
  const mail = createMailService({ db: options.db, appUrl, expectedArrivals: expectedArrivalsFor });
  // Cancelling a paid job refunds it: the payment service is made after the jobs service it uses.
  const late: { payments?: PaymentService } = {};
  const jobs = createJobService({ db: options.db, planner, now: options.now, quoteHoldDays: options.quoteHoldDays, mail, onCancelled: (id) => late.payments!.refundJob(id) });
  const payments = (late.payments = createPaymentService({ db: options.db, provider: options.payment.provider, webhookSecret: options.payment.webhookSecret, appUrl, jobs, mail, logger: options.logger }));
  return {
    ...options,
    partsIndex,
    sessionCache,
    system: createSystemService({ db: options.db, search: options.search }),
    users: createUserService({ ...options, appUrl, onAccessChanged: sessionCache.clear }),
    catalogue: createCatalogueService({ db: options.db, partsIndex, onPartsChanged: rangeCache.clear }),
    media: createMediaService({ db: options.db, files: options.files, partsIndex }),
    planner,
    stock: createStockService({ db: options.db, now: options.now, onPurchaseOrderReceipt: purchaseOrders.bookReceipt, onOrder: (db) => onOrderFor(db) }),
    jobs,
    mail,
    payments,
    invoices: createInvoiceService({ db: options.db, jobs }),
    portal: createPortalService({ db: options.db, planner }),
    picking: createPickingService({ db: options.db, now: options.now, mail }),
    labels: createLabelsService({ db: options.db, planner, publicUrl: options.trustedOrigins[0] ?? 'http://127.0.0.1:3000', now: options.now }),
    suppliers: createSupplierService({ db: options.db, partsIndex }),
    priceLists: createPriceListService({ db: options.db, partsIndex, onApplied: (tx, applied) => mail.priceListApplied(tx, applied) }),
    pricing: createPricingService({ db: options.db, partsIndex }),
    purchaseOrders,
  };
}
