// The database's own checks on parts, tried by writing rows directly (as a script or an import
// might), past the API's validation.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { sql } from 'drizzle-orm';
import { createTestDb } from '../support/db.ts';
import type { Db } from '../../server/db/client.ts';
import { makers, parts } from '../../server/db/schema/index.ts';
import { isValidGtin } from '../../shared/domain/gtin.ts';

let db: Db;
let drop: () => Promise<void>;
let makerId: string;
let n = 0;

beforeAll(async () => {
  ({ db, drop } = await createTestDb());
  [{ id: makerId }] = await db.insert(makers).values({ code: 'CHK', name: 'Check Works' }).returning({ id: makers.id });
});
afterAll(() => drop());

async function insert(values: { category: string; attributes: Record<string, unknown>; gtin?: string | null }) {
  return db.insert(parts).values({ sku: `CHK-${++n}`, name: 'Checked part', makerId, packSize: 1, massKg: 1, ...values });
}

/** The name of the check that refused the row, or null when it went in. */
async function refusedBy(values: Parameters<typeof insert>[0]) {
  try {
    await insert(values);
    return null;
  } catch (e) {
    const cause = (e as { cause?: { code?: string; constraint?: string } }).cause ?? (e as { code?: string; constraint?: string });
    expect(cause.code).toBe('23514'); // PostgreSQL: check_violation
    return cause.constraint ?? null;
  }
}

describe('part checks in the database', () => {
  it('refuses a GTIN whose check digit is wrong, at every length', async () => {
    const accessory = { category: 'accessory', attributes: { category: 'accessory' } };
    // GS1 General Specifications, check digit calculation; worked examples from memory:
    // GTIN-13 4006381333931, GTIN-12 036000291452, GTIN-8 96385074.
    for (const valid of ['4006381333931', '036000291452', '96385074', '0614141000012']) {
      expect(await refusedBy({ ...accessory, gtin: valid })).toBeNull();
    }
    for (const wrong of ['4006381333932', '036000291453', '96385075']) {
      expect(await refusedBy({ ...accessory, gtin: wrong })).toBe('parts_gtin_check_digit');
    }
    // Malformed is the digits check's to refuse, not an error in the check-digit sum.
    expect(await refusedBy({ ...accessory, gtin: '06141410000x2' })).toBe('parts_gtin_digits');
  });

  it('agrees with the shared GTIN validator on every check digit', async () => {
    // The same 12 data digits with each of the ten possible check digits: exactly one is right.
    for (const data of ['400638133394', '061414100002', '950123456789']) {
      for (let d = 0; d <= 9; d++) {
        const gtin = `${data}${d}`;
        expect(await refusedBy({ category: 'accessory', attributes: { category: 'accessory' }, gtin })).toBe(isValidGtin(gtin) ? null : 'parts_gtin_check_digit');
      }
    }
  });

  it('refuses attributes missing a required key or of the wrong type, as the shared field table says', async () => {
    const cable = { category: 'cable-set', lengthM: 2.5, crossSectionMm2: 25 };
    expect(await refusedBy({ category: 'cable-set', attributes: cable })).toBeNull();
    expect(await refusedBy({ category: 'cable-set', attributes: { category: 'cable-set', lengthM: 2.5 } })).toBe('parts_attributes_shape');
    expect(await refusedBy({ category: 'cable-set', attributes: { ...cable, lengthM: '2.5' } })).toBe('parts_attributes_shape');
    expect(await refusedBy({ category: 'feet', attributes: { category: 'feet', unitsPerSet: 4.5, heightMm: 60 } })).toBe('parts_attributes_shape');
    expect(await refusedBy({ category: 'feet', attributes: { category: 'feet', unitsPerSet: 'four', heightMm: 60 } })).toBe('parts_attributes_shape');
    expect(await refusedBy({ category: 'wall-bracket', attributes: { category: 'wall-bracket', fixing: 'glue' } })).toBe('parts_attributes_shape');
    expect(await refusedBy({ category: 'wall-bracket', attributes: { category: 'wall-bracket', fixing: 'stud' } })).toBeNull();
    // The attributes must describe the row's own category.
    expect(await refusedBy({ category: 'end-cap', attributes: cable })).toBe('parts_attributes_category');
    const { rows } = await db.execute<{ count: number }>(sql`select count(*)::int as count from parts where category <> 'accessory'`);
    expect(rows[0]!.count).toBe(2); // only the two good rows went in

  });
});
