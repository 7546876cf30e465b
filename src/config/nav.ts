import type { Ability } from '@shared/roles.ts';
import { paths } from './paths.ts';

export interface NavItem {
  label: string;
  href: string;
  /** Shown only to actors with this ability (from /api/me). */
  needs?: Ability;
  /** One line for the home page card. */
  blurb?: string;
}

export const NAV: NavItem[] = [
  { label: 'Home', href: paths.home.href() },
  { label: 'Catalogue', href: paths.catalogue.href(), needs: 'catalogue.view', blurb: 'Find any part by name or code, or scan its barcode.' },
  { label: 'Stack planner', href: paths.planner.href(), needs: 'plans.create', blurb: 'Turn a range and a stack size, or a target usable kWh, into a complete bill of materials.' },
  { label: 'Saved plans', href: paths.plans.href(), needs: 'plans.create', blurb: 'Draft plans for your sites, ready to reopen, print or export.' },
  { label: 'Jobs', href: paths.jobs.href(), needs: 'jobs.view', blurb: 'Orders for each site: reserved, backordered and where every unit is held.' },
  { label: 'Picking', href: paths.pickQueue.href(), needs: 'jobs.pick', blurb: 'Reserved jobs to pick, oldest first: scan each part and serial, print labels and the handover sheet.' },
  { label: 'Stock', href: paths.stock.href(), needs: 'stock.view', blurb: 'Levels per warehouse and bin, the movement ledger, receipts, adjustments and transfers.' },
  { label: 'Purchasing', href: paths.priceLists.href(), needs: 'purchasing.manage', blurb: 'Supplier price lists, costs and sell prices, reorder suggestions.' },
  { label: 'Purchase orders', href: paths.purchaseOrders.href(), needs: 'purchase-orders.view', blurb: 'Orders to suppliers, from draft to received.' },
  { label: 'Warehouses', href: paths.warehouses.href(), needs: 'warehouses.manage', blurb: 'Warehouses by rank and their bins in pick order.' },
  { label: 'Users', href: paths.users.href(), needs: 'users.manage', blurb: 'Create sign-ins, set roles and companies, reset passwords, deactivate.' },
  { label: 'Outbox', href: paths.outbox.href(), needs: 'outbox.view', blurb: 'Every e-mail Stackyard has written: to whom, about what, and whether it went.' },
];
