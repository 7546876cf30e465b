import type { Resolver } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { PartInputSchema, type PartDetail, type PartInput, type PartInputParsed } from '@shared/contracts/parts.ts';
import { ATTRIBUTE_FIELDS, type CategoryCode } from '@shared/contracts/part-attributes.ts';

/**
 * What the part form holds. Close to PartInput, but with room for a half-filled form: an
 * empty category, an empty dangerous-goods block, blank text. `toPartInput` turns it into
 * the contract's shape (blank → null, untouched blocks → null) before zod sees it.
 */
export type PartFormValues = Omit<PartInput, 'attributes' | 'dangerousGoods' | 'compliance' | 'supplierSkus' | 'gtin' | 'ipRating' | 'supersededBySku'> & {
  gtin: string | null;
  ipRating: string | null;
  supersededBySku: string | null;
  attributes: { category: CategoryCode | '' } & Record<string, unknown>;
  dangerousGoods: { unNumber: '' | 'UN3480' | 'UN3481'; class: '9'; whRating?: number | null };
  compliance: { standardsTestedTo: string[]; certificationListing?: string; certificationDate?: string; enclosureIp?: string; touchSafeConnectors?: boolean };
  supplierSkus: { supplier: string; sku: string }[];
};

const EMPTY_DG: PartFormValues['dangerousGoods'] = { unNumber: '', class: '9', whRating: undefined };
const EMPTY_COMPLIANCE: PartFormValues['compliance'] = { standardsTestedTo: [] };

export const emptyPartForm = (): PartFormValues => ({
  sku: '',
  name: '',
  makerCode: '',
  description: '',
  gtin: '',
  unit: 'each',
  packSize: 1,
  massKg: undefined as unknown as number,
  widthMm: null,
  heightMm: null,
  depthMm: null,
  ipRating: '',
  lifecycle: 'active',
  supersededBySku: '',
  listPriceCents: null,
  costCents: null,
  attributes: { category: '' },
  dangerousGoods: { ...EMPTY_DG },
  compliance: { ...EMPTY_COMPLIANCE },
  supplierSkus: [],
});

export function partToForm(p: PartDetail): PartFormValues {
  const c = (p.compliance ?? {}) as Partial<PartFormValues['compliance']>;
  return {
    sku: p.sku,
    name: p.name,
    makerCode: p.maker,
    description: p.description,
    gtin: p.gtin ?? '',
    unit: p.unit as PartFormValues['unit'],
    packSize: p.packSize,
    massKg: p.massKg,
    widthMm: p.widthMm,
    heightMm: p.heightMm,
    depthMm: p.depthMm,
    ipRating: p.ipRating ?? '',
    lifecycle: p.lifecycle,
    supersededBySku: p.supersededBy?.sku ?? '',
    listPriceCents: p.listPriceCents,
    costCents: p.costCents ?? null,
    attributes: { ...p.attributes, category: p.category },
    dangerousGoods: p.dangerousGoods ? { ...p.dangerousGoods } : { ...EMPTY_DG },
    compliance: { ...EMPTY_COMPLIANCE, ...c, standardsTestedTo: c.standardsTestedTo ?? [] },
    supplierSkus: (p.supplierSkus ?? []).map((s) => ({ ...s })),
  };
}

const blank = (v: unknown) => v === undefined || v === null || (typeof v === 'string' && v.trim() === '') || (typeof v === 'number' && Number.isNaN(v));
const orNull = <T,>(v: T) => (blank(v) ? null : v);
const orUndefined = <T,>(v: T) => (blank(v) ? undefined : v);
/** A money box: empty is "none", but text that is not an amount (NaN) goes on to be refused, never saved as a blank. */
const money = (v: number | null | undefined) => (v === undefined || v === null ? null : v);

/** The form's values in the contract's shape. Cost is left out for actors who may not see it. */
export function toPartInput(v: PartFormValues, withCost: boolean): PartInput {
  const attributes: Record<string, unknown> = { category: v.attributes.category || undefined };
  const known = v.attributes.category ? ATTRIBUTE_FIELDS[v.attributes.category] : [];
  for (const f of known) {
    const value = v.attributes[f.key];
    if (Array.isArray(value) ? value.length > 0 || f.kind === 'list' : !blank(value)) attributes[f.key] = value;
  }

  const dg = v.dangerousGoods;
  const dangerousGoods = !dg || (blank(dg.unNumber) && blank(dg.whRating)) ? null : { unNumber: orUndefined(dg.unNumber), class: '9' as const, whRating: orUndefined(dg.whRating) };

  const c = v.compliance;
  const compliance = {
    standardsTestedTo: c?.standardsTestedTo ?? [],
    certificationListing: orUndefined(c?.certificationListing?.trim()),
    certificationDate: orUndefined(c?.certificationDate),
    enclosureIp: orUndefined(c?.enclosureIp?.trim().toUpperCase()),
    touchSafeConnectors: c?.touchSafeConnectors,
  };
  const complianceEmpty = compliance.standardsTestedTo.length === 0 && Object.entries(compliance).every(([k, x]) => k === 'standardsTestedTo' || x === undefined);

  const input: Record<string, unknown> = {
    sku: v.sku,
    name: v.name,
    makerCode: v.makerCode,
    description: v.description ?? '',
    gtin: orNull(v.gtin?.trim()),
    unit: v.unit,
    packSize: v.packSize,
    massKg: v.massKg,
    widthMm: orNull(v.widthMm),
    heightMm: orNull(v.heightMm),
    depthMm: orNull(v.depthMm),
    ipRating: orNull(v.ipRating?.trim().toUpperCase()),
    lifecycle: v.lifecycle,
    supersededBySku: v.lifecycle === 'superseded' ? orNull(v.supersededBySku?.trim()) : null,
    listPriceCents: money(v.listPriceCents),
    attributes,
    dangerousGoods,
    compliance: complianceEmpty ? null : compliance,
    supplierSkus: (v.supplierSkus ?? []).filter((s) => !blank(s.supplier) || !blank(s.sku)).map((s) => ({ supplier: s.supplier.trim().toUpperCase(), sku: s.sku.trim() })),
  };
  if (withCost) input.costCents = money(v.costCents);
  return input as PartInput;
}

type Issue = { code: string; path?: PropertyKey[]; expected?: string; input?: unknown; values?: unknown[] };

/** Plain messages for the few checks whose schema does not carry its own. */
function friendlyMessage(raw: unknown): string | undefined {
  const iss = raw as Issue;
  const path = (iss.path ?? []).map(String).join('.');
  if (path === 'dangerousGoods.unNumber') return 'Choose the UN number: UN3480 for cells on their own, UN3481 for cells packed with equipment.';
  if (path === 'dangerousGoods.whRating') return 'Enter the Wh rating (nominal V × Ah).';
  if (path === 'attributes.category' || (path === 'attributes' && iss.code === 'invalid_union')) return 'Choose a category.';
  if (path === 'massKg' && iss.input === undefined) return 'Enter the mass in kg.';
  if ((path === 'listPriceCents' || path === 'costCents') && iss.code === 'invalid_type') return 'Enter an amount in dollars, e.g. 60 or 59.95.';
  if (path === 'packSize' && iss.input === undefined) return 'Enter the pack size (1 for a single item).';
  if (/^supplierSkus\.\d+\.supplier$/.test(path)) return 'Enter the supplier’s code, e.g. KESTREL.';
  if (/^supplierSkus\.\d+\.sku$/.test(path)) return 'Enter the supplier’s SKU for this part.';
  if (iss.code === 'invalid_type' && iss.expected === 'number') return iss.input === undefined ? 'Enter a number here.' : 'Enter a number, using digits only.';
  if (iss.code === 'invalid_value' && Array.isArray(iss.values)) return `Choose one of: ${iss.values.join(', ')}.`;
  if (iss.code === 'unrecognized_keys') return 'This field does not belong to the chosen category. Choose the category again.';
  return undefined;
}

const schemaResolver = zodResolver(PartInputSchema, { error: friendlyMessage });

/** zod checks the contract's shape of the form, so the form shows the server's own rules. */
export function partFormResolver(withCost: boolean): Resolver<PartFormValues, unknown, PartInputParsed> {
  return (values, context, options) =>
    schemaResolver(toPartInput(values, withCost), context, options as never) as unknown as ReturnType<Resolver<PartFormValues, unknown, PartInputParsed>>;
}

/** Every path the form can show an error at, for the server's field errors. */
export function formPaths(v: PartFormValues): string[] {
  const top = ['sku', 'name', 'makerCode', 'description', 'gtin', 'unit', 'packSize', 'massKg', 'widthMm', 'heightMm', 'depthMm', 'ipRating', 'lifecycle', 'supersededBySku', 'costCents', 'listPriceCents', 'attributes.category'];
  const attrs = v.attributes.category ? ATTRIBUTE_FIELDS[v.attributes.category].map((f) => `attributes.${f.key}`) : [];
  const compliance = ['standardsTestedTo', 'certificationListing', 'certificationDate', 'enclosureIp', 'touchSafeConnectors'].map((k) => `compliance.${k}`);
  const dg = ['dangerousGoods', 'dangerousGoods.unNumber', 'dangerousGoods.whRating'];
  const suppliers = v.supplierSkus.flatMap((_, i) => [`supplierSkus.${i}.supplier`, `supplierSkus.${i}.sku`]);
  return [...top, ...attrs, ...compliance, ...dg, ...suppliers];
}
