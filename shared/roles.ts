export const ROLES = ['admin', 'purchasing', 'warehouse', 'sales', 'installer'] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: 'Administrator',
  purchasing: 'Purchasing',
  warehouse: 'Warehouse',
  sales: 'Trade desk',
  installer: 'Installer',
};

/** The wholesaler's own people; every other role (installers) works for a customer company. */
export const STAFF_ROLES = ['admin', 'purchasing', 'warehouse', 'sales'] as const satisfies readonly Role[];
const staff: Role[] = [...STAFF_ROLES];

export type CompanyKind = 'wholesaler' | 'installer';

/**
 * The kind of company a role belongs to: staff to the wholesaler itself, installers to a customer
 * company. The database enforces the same rule (server/db/schema/auth.ts, user_company_kind).
 */
export function companyKindOf(role: Role): CompanyKind {
  return (STAFF_ROLES as readonly Role[]).includes(role) ? 'wholesaler' : 'installer';
}
const everyone: Role[] = [...ROLES];

/**
 * Who may do what. The server checks these in services; the client only uses them
 * (through `abilities` on /api/me) to hide what the actor cannot do.
 */
export const ABILITIES = {
  'users.manage': ['admin'],
  'settings.manage': ['admin'],
  'catalogue.view': everyone,
  'catalogue.edit': ['admin', 'purchasing'],
  'costs.view': ['admin', 'purchasing', 'sales'],
  'ranges.edit': ['admin', 'purchasing'],
  'plans.create': ['admin', 'purchasing', 'sales', 'installer'],
  'stock.view': staff,
  'suppliers.view': ['admin', 'purchasing', 'warehouse', 'sales'],
  'customers.view': staff,
  'jobs.view': everyone,
  'jobs.create': ['admin', 'sales', 'installer'],
  'jobs.reserve': ['admin', 'sales'],
  'jobs.cancel': ['admin', 'sales'],
  'jobs.handover': ['admin', 'sales', 'warehouse'],
  'stock.adjust': ['admin', 'warehouse'],
  'stock.transfer': ['admin', 'warehouse'],
  'stock.receive': ['admin', 'warehouse'],
  'stock.limits': ['admin', 'purchasing', 'warehouse'],
  'warehouses.manage': ['admin'],
  'outbox.view': ['admin'],
  'payments.create': ['admin', 'sales', 'installer'],
  'invoices.view': ['admin', 'purchasing', 'sales', 'installer'],
  'jobs.pick': ['admin', 'warehouse'],
  'labels.print': ['admin', 'warehouse', 'sales'],
  'purchasing.manage': ['admin', 'purchasing'],
  'purchase-orders.view': ['admin', 'purchasing', 'warehouse'],
} as const satisfies Record<string, readonly Role[]>;

export type Ability = keyof typeof ABILITIES;

export function can(role: Role, ability: Ability): boolean {
  return (ABILITIES[ability] as readonly Role[]).includes(role);
}

export function abilitiesOf(role: Role): Ability[] {
  return (Object.keys(ABILITIES) as Ability[]).filter((a) => can(role, a));
}
