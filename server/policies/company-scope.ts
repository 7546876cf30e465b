import { companyKindOf, type Role } from '@shared/roles.ts';
import type { Actor } from './actor.ts';
import { NotFoundError, ValidationError } from '../errors.ts';

/**
 * Object-level rules, in one place: installers act for their own company only; wholesaler
 * staff act for any customer account. Services ask these instead of testing roles.
 * Another company's object is "not found" (404), never "forbidden": its existence is not ours to tell.
 */

/** True when the actor is limited to their own company's objects. */
export function isCompanyBound(actor: Actor): boolean {
  return companyKindOf(actor.role) === 'installer';
}

/**
 * A user's company must fit their role: staff belong to the wholesaler, installers to exactly one
 * customer company. Throws a field error on `companyId` otherwise (the database refuses it too).
 */
export function assertCompanyFitsRole(role: Role, company: { kind: string } | null): void {
  const wanted = companyKindOf(role);
  if (!company && wanted === 'installer') throw new ValidationError('An installer must belong to a customer company.', { fields: [{ path: 'companyId', message: 'Choose a company.' }] });
  if (company && company.kind !== wanted) {
    const message = wanted === 'installer' ? 'Installers belong to a customer company.' : 'Staff belong to the wholesaler, not a customer company.';
    throw new ValidationError(message, { fields: [{ path: 'companyId', message }] });
  }
}

/** The company an actor's queries must be limited to, or null when they may see every company. */
export function companyScopeOf(actor: Actor): string | null {
  // A company-bound actor without a company sees nothing: a company id that cannot exist.
  return isCompanyBound(actor) ? (actor.companyId ?? NO_COMPANY) : null;
}

/** May the actor see an object owned by this company? */
export function canSeeCompany(actor: Actor, ownerCompanyId: string | null): boolean {
  const scope = companyScopeOf(actor);
  return scope === null || scope === ownerCompanyId;
}

/** Throws "not found" when the object belongs to a company the actor may not see. */
export function assertCanSeeCompany(actor: Actor, ownerCompanyId: string | null, what: string): void {
  if (!canSeeCompany(actor, ownerCompanyId)) throw new NotFoundError(what);
}

/**
 * The company a new object is for: a company-bound actor's own company whatever they asked;
 * staff name one (null when they did not, for the service to refuse in its own words).
 */
export function companyForNew(actor: Actor, requested: string | null | undefined): string | null {
  return isCompanyBound(actor) ? (actor.companyId ?? null) : (requested ?? null);
}

const NO_COMPANY = '00000000-0000-0000-0000-000000000000';
