// Database checks derived from the shared part contracts, so the database refuses what the API
// refuses even when a row arrives some other way (a script, an import, a hand-written fix).
import { sql, type SQL } from 'drizzle-orm';
import type { AnyPgColumn } from 'drizzle-orm/pg-core';
import { ATTRIBUTE_FIELDS, type AttributeField, type CategoryCode } from '../../../shared/contracts/part-attributes.ts';

const JSON_TYPES = { number: 'number', integer: 'number', text: 'string', enum: 'string', boolean: 'boolean', list: 'array' } as const;

/** A string as an SQL literal; keys and options come from our own field table. */
const literal = (text: string) => sql.raw(`'${text.replace(/'/g, "''")}'`);

function fieldCheck(attributes: AnyPgColumn, field: AttributeField): SQL {
  const key = literal(field.key);
  const isType = sql`jsonb_typeof(${attributes}->${key}) = ${literal(JSON_TYPES[field.kind])}`;
  // SQL does not promise to evaluate `and` left to right: the cast only runs on a number.
  let typed = isType;
  if (field.kind === 'integer') typed = sql`case when ${isType} then (${attributes}->>${key})::numeric % 1 = 0 else false end`;
  if (field.kind === 'enum' && field.options) typed = sql`${isType} and ${attributes}->>${key} in (${sql.join(field.options.map(literal), sql`, `)})`;
  return field.required ? sql`(${attributes} ? ${key} and ${typed})` : sql`(not ${attributes} ? ${key} or (${typed}))`;
}

/**
 * Each category's typed attributes as the shared field table describes them: required keys
 * present, and every known key of the right JSON type (whole numbers for integers, enum values
 * from their list).
 */
export function attributeShapeCheck(category: AnyPgColumn, attributes: AnyPgColumn): SQL {
  const perCategory = (Object.entries(ATTRIBUTE_FIELDS) as [CategoryCode, AttributeField[]][])
    .filter(([, fields]) => fields.length > 0)
    .map(([code, fields]) => sql`(${category} <> ${literal(code)} or (${sql.join(fields.map((f) => fieldCheck(attributes, f)), sql` and `)}))`);
  return sql.join(perCategory, sql` and `);
}

/**
 * GS1 check digit (GS1 General Specifications, check digit calculation): padded to 14 digits,
 * the 13 data digits weighted 3, 1, 3, … from the left; the check digit brings the sum to a
 * multiple of 10.
 */
export function gtinCheckDigit(gtin: AnyPgColumn): SQL {
  const padded = sql`lpad(${gtin}, 14, '0')`;
  const terms = Array.from({ length: 13 }, (_, i) => sql`substr(${padded}, ${sql.raw(String(i + 1))}, 1)::int * ${sql.raw(i % 2 === 0 ? '3' : '1')}`);
  // Malformed values are the digits check's to refuse; the casts only run on digits.
  return sql`case when ${gtin} ~ '^[0-9]{8,14}$' then (10 - (${sql.join(terms, sql` + `)}) % 10) % 10 = substr(${padded}, 14, 1)::int else true end`;
}
