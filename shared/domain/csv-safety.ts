/**
 * Text that a spreadsheet would run as a formula gets a leading apostrophe
 * (OWASP "CSV Injection"; ASVS v5 1.2.10). Numbers are left alone.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

export function neutraliseCell(value: unknown): string | number | boolean | null {
  if (value === null || value === undefined) return null;
  if (typeof value === 'number' || typeof value === 'boolean') return value;
  const text = String(value);
  return FORMULA_START.test(text) ? `'${text}` : text;
}

export function neutraliseRow<T extends Record<string, unknown>>(row: T): Record<keyof T, string | number | boolean | null> {
  const out = {} as Record<keyof T, string | number | boolean | null>;
  for (const key of Object.keys(row) as (keyof T)[]) out[key] = neutraliseCell(row[key]);
  return out;
}
