// The part form's conversions: what it sends must be exactly what the shared contract accepts,
// and the server's field errors must land on the fields the form shows.
import { describe, expect, it } from 'vitest';
import { PartInputSchema } from '../../shared/contracts/parts.ts';
import { get } from 'react-hook-form';
import { emptyPartForm, formPaths, partFormResolver, toPartInput, type PartFormValues } from '../../src/features/catalogue/components/part-form-values.ts';
import { dollarsToCents } from '../../shared/domain/money.ts';
import { applyServerErrors } from '../../src/lib/form-errors.ts';
import { ApiError } from '../../src/lib/api-client.ts';

function cableSetForm(): PartFormValues {
  return {
    ...emptyPartForm(),
    sku: 'TST-CBL-25',
    name: 'Test cable set',
    makerCode: 'HLM',
    massKg: 1.2,
    gtin: ' ',
    ipRating: ' ip65 ',
    costCents: 1234,
    attributes: { category: 'cable-set', lengthM: 2.5, crossSectionMm2: 25, connector: '', nominalV: 51.2 },
    supplierSkus: [
      { supplier: ' kestrel ', sku: ' KT-1 ' },
      { supplier: '', sku: '' },
    ],
  };
}

describe('part form → contract', () => {
  it('sends what the shared schema accepts: blanks as null, other categories’ fields dropped, codes tidied', () => {
    const input = toPartInput(cableSetForm(), true);
    const parsed = PartInputSchema.safeParse(input);
    expect(parsed.success).toBe(true);
    expect(input.gtin).toBeNull();
    expect(input.ipRating).toBe('IP65');
    // Common practice: a blank optional field is "none", and a field of another category is not sent.
    expect(input.attributes).toEqual({ category: 'cable-set', lengthM: 2.5, crossSectionMm2: 25 });
    expect(input.supplierSkus).toEqual([{ supplier: 'KESTREL', sku: 'KT-1' }]);
    expect(input.compliance).toBeNull();
    expect(input.dangerousGoods).toBeNull();
    expect(input.costCents).toBe(1234);
  });

  it('never sends cost for someone who may not see it', () => {
    expect(toPartInput(cableSetForm(), false)).not.toHaveProperty('costCents');
  });

  it('offers every field the form shows as a place for the server’s errors', () => {
    const paths = formPaths(cableSetForm());
    expect(paths).toEqual(expect.arrayContaining(['sku', 'gtin', 'attributes.lengthM', 'attributes.crossSectionMm2', 'supplierSkus.1.sku', 'compliance.enclosureIp']));
    expect(paths).not.toContain('attributes.nominalV');
  });
});

describe('server errors on the form', () => {
  it('puts field errors on their fields and returns the message for anything it cannot place', () => {
    const placed: [string, string][] = [];
    const setError = ((path: string, e: { message?: string }) => placed.push([path, e.message ?? ''])) as never;
    const known = formPaths(cableSetForm());
    const conflict = new ApiError(409, 'conflict', 'A part with that SKU exists.', { fields: [{ path: 'sku', message: 'This SKU is taken.' }] });
    expect(applyServerErrors(conflict, setError, known)).toBeNull();
    expect(placed).toEqual([['sku', 'This SKU is taken.']]);

    const elsewhere = new ApiError(400, 'invalid', 'Check the part.', { fields: [{ path: 'attributes.nominalV', message: 'Not for cable sets.' }] });
    expect(applyServerErrors(elsewhere, setError, known)).toBe('Check the part.');
    expect(applyServerErrors(new Error('network down'), setError, known)).toBe('Something went wrong. Try again.');
  });
});

describe('money fields', () => {
  it('refuses text that is not an amount ("sixty") beside the field, never sending a blank price', async () => {
    const values = { ...cableSetForm(), listPriceCents: dollarsToCents('sixty') };
    // The form sends NaN on, which the contract refuses, rather than null (which would clear the price).
    expect(Number.isNaN(toPartInput(values, true).listPriceCents)).toBe(true);
    const result = await partFormResolver(true)(values, undefined, { fields: {}, shouldUseNativeValidation: false } as never);
    expect((get(result.errors, 'listPriceCents') as { message?: string } | undefined)?.message).toBe('Enter an amount in dollars, e.g. 60 or 59.95.');
    expect(toPartInput({ ...cableSetForm(), listPriceCents: dollarsToCents('59.95') }, true).listPriceCents).toBe(5995);
  });
});
