// fast-check arbitraries for the hostile-input properties: plausible values built from an
// operation's JSON schema (OpenAPI 3.1), and the mutations an attacker or a careless client makes.
import fc from 'fast-check';
import type { JsonSchema } from './api-fixtures.ts';

/** Text that has broken servers: NUL, lone surrogates, direction overrides, emoji, SQL, HTML, paths, templates. */
export const HOSTILE_STRINGS = [
  '',
  ' ',
  'a\u0000b',
  '\u0000',
  '\ud800',
  'x\udfffy',
  '\udc00\ud800',
  '\u202eevil\u202c',
  'مرحبا بالعالم',
  '🔋⚡👩‍🔧🏳️‍🌈',
  '\u200b\u200d\ufeff',
  "' OR '1'='1",
  "'; drop table parts; --",
  '1; select pg_sleep(5)',
  '<script>alert(1)</script>',
  '"><img src=x onerror=alert(1)>',
  '../../../etc/passwd',
  '%00',
  '%',
  '${7*7}{{7*7}}',
  '=HYPERLINK("http://x.test")',
  '__proto__',
  'constructor',
  'NaN',
  '-1',
  '1e308',
  'null',
  'true',
  '\n\r\t',
];

const HOSTILE_NUMBERS = [-1, 0, -0, 0.5, 1.5, 1e308, -1e308, 5e-324, Number.MAX_SAFE_INTEGER + 2, -(2 ** 31), 2 ** 31, 2 ** 63];

/** Any hostile JSON value: odd text, extreme numbers, wrong types, deep or huge structures. */
export const hostileValue: fc.Arbitrary<unknown> = fc.oneof(
  { weight: 4, arbitrary: fc.constantFrom(...HOSTILE_STRINGS) },
  { weight: 3, arbitrary: fc.constantFrom<unknown>(...HOSTILE_NUMBERS, null, true, false, [], {}, [null], { '': null }) },
  { weight: 1, arbitrary: fc.integer({ min: 1_000, max: 200_000 }).map((n) => 'x'.repeat(n)) },
  { weight: 1, arbitrary: fc.string({ unit: 'binary', maxLength: 40 }) },
  { weight: 1, arbitrary: fc.jsonValue({ maxDepth: 3 }) },
  { weight: 1, arbitrary: fc.constant(JSON.parse('{"__proto__": {"role": "admin", "isAdmin": true}}')) },
  { weight: 1, arbitrary: fc.array(fc.constantFrom(...HOSTILE_STRINGS), { maxLength: 5 }) },
);

/** Bodies that are not the JSON a client should send at all. */
export const RAW_BODIES = [
  '{"a": NaN}',
  '{"a": Infinity}',
  '{"a": 1e999}',
  '{"a": -1e999}',
  '{"__proto__": {"polluted": true}, "constructor": {"prototype": {"polluted": true}}}',
  '[' .repeat(3000) + ']'.repeat(3000),
  '{"a":'.repeat(2000) + '1' + '}'.repeat(2000),
  '{"a": "\\u0000"}',
  '{"a": "\\ud800"}',
  '"just a string"',
  'null',
  '123',
  '',
  '{',
  '\u0000',
  '{"a": 1, "a": 2}',
];

/** Fills well-known fields with ids and codes that exist, so mutations also reach the code behind validation. */
export type KnownValues = Record<string, unknown>;

function stringFor(schema: JsonSchema): fc.Arbitrary<string> {
  if (Array.isArray(schema.enum)) return fc.constantFrom(...(schema.enum as string[]));
  const min = (schema.minLength as number | undefined) ?? 0;
  const max = Math.min((schema.maxLength as number | undefined) ?? 40, 60);
  return fc.constantFrom('Stack A', 'Loft 2', 'Bay-7', 'north shed', 'x').map((s) => (s.length < min ? s.padEnd(min, 'x') : s.slice(0, Math.max(max, min))));
}

function numberFor(schema: JsonSchema, integer: boolean): fc.Arbitrary<number> {
  const lo = (schema.minimum as number | undefined) ?? ((schema.exclusiveMinimum as number | undefined) !== undefined ? (schema.exclusiveMinimum as number) + (integer ? 1 : 0.5) : 0);
  const hi = (schema.maximum as number | undefined) ?? lo + 100;
  return integer ? fc.integer({ min: Math.ceil(lo), max: Math.floor(Math.min(hi, lo + 1000)) }) : fc.double({ min: lo, max: Math.min(hi, lo + 1000), noNaN: true, noDefaultInfinity: true });
}

/** A value shaped like the schema (often valid, sometimes not: the server decides). */
export function plausible(schema: JsonSchema | undefined, known: KnownValues, name = '', depth = 0): fc.Arbitrary<unknown> {
  if (!schema || depth > 6) return fc.constant(null);
  if (name in known) return fc.constant(known[name]);
  if (Array.isArray(schema.oneOf) || Array.isArray(schema.anyOf)) {
    const options = ((schema.oneOf ?? schema.anyOf) as JsonSchema[]).map((s) => plausible(s, known, name, depth + 1));
    return fc.oneof(...options);
  }
  const types = Array.isArray(schema.type) ? (schema.type as string[]) : [schema.type as string];
  const nonNull = types.filter((t) => t !== 'null');
  const nullable = types.includes('null');
  const one = (type: string | undefined): fc.Arbitrary<unknown> => {
    switch (type) {
      case 'string':
        return stringFor(schema);
      case 'integer':
        return numberFor(schema, true);
      case 'number':
        return numberFor(schema, false);
      case 'boolean':
        return fc.boolean();
      case 'array':
        return fc.array(plausible(schema.items as JsonSchema, known, '', depth + 1), { maxLength: Math.min((schema.maxItems as number | undefined) ?? 3, 3) });
      case 'object': {
        const props = (schema.properties ?? {}) as Record<string, JsonSchema>;
        const required = new Set((schema.required ?? []) as string[]);
        const entries = Object.entries(props).map(([key, s]) => [key, required.has(key) ? plausible(s, known, key, depth + 1) : fc.option(plausible(s, known, key, depth + 1), { nil: undefined })] as const);
        return fc.record(Object.fromEntries(entries)).map((o) => Object.fromEntries(Object.entries(o).filter(([, v]) => v !== undefined)));
      }
      default:
        return fc.jsonValue({ maxDepth: 1 });
    }
  };
  const base = nonNull.length > 1 ? fc.oneof(...nonNull.map(one)) : one(nonNull[0]);
  return nullable ? fc.oneof(base, fc.constant(null)) : base;
}

/** One change to a value: replace a part, add a key (prototype keys included), drop a key, or replace everything. */
export type Mutation =
  | { kind: 'replace'; at: number; value: unknown }
  | { kind: 'add'; at: number; key: string; value: unknown }
  | { kind: 'drop'; at: number }
  | { kind: 'whole'; value: unknown };

export const mutation: fc.Arbitrary<Mutation> = fc.oneof(
  { weight: 5, arbitrary: fc.record({ kind: fc.constant('replace' as const), at: fc.nat(), value: hostileValue }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('add' as const), at: fc.nat(), key: fc.constantFrom('__proto__', 'constructor', 'prototype', 'extra', 'a\u0000b', '\ud800', 'role', 'companyId', 'id'), value: hostileValue }) },
  { weight: 2, arbitrary: fc.record({ kind: fc.constant('drop' as const), at: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ kind: fc.constant('whole' as const), value: hostileValue }) },
);

/** Every place in a value a mutation can act on: [container, key] pairs, containers first. */
function places(value: unknown, out: [Record<string, unknown> | unknown[], string | number][] = []) {
  const entries: [string | number, unknown][] = Array.isArray(value) ? value.map((v, i) => [i, v]) : value && typeof value === 'object' ? Object.entries(value) : [];
  for (const [key, v] of entries) {
    out.push([value as Record<string, unknown>, key]);
    places(v, out);
  }
  return out;
}

/** A private copy (JSON keeps an own "__proto__" key own): generated constants are shared between runs. */
const fresh = (v: unknown): unknown => (v === undefined ? v : JSON.parse(JSON.stringify(v)));

export function applyMutations(value: unknown, original: Mutation[]): unknown {
  let current: unknown = fresh(value);
  const mutations = original.map((m) => ('value' in m ? { ...m, value: fresh(m.value) } : m));
  for (const m of mutations) {
    if (m.kind === 'whole') {
      current = m.value;
      continue;
    }
    const spots = places(current);
    if (m.kind === 'add') {
      const containers = [current, ...spots.map(([c, k]) => (c as Record<string, unknown>)[k as string])].filter((c) => c && typeof c === 'object' && !Array.isArray(c)) as Record<string, unknown>[];
      const target = containers[m.at % Math.max(containers.length, 1)];
      // defineProperty, so "__proto__" becomes an own key exactly as JSON.parse would make it.
      if (target) Object.defineProperty(target, m.key, { value: m.value, enumerable: true, configurable: true, writable: true });
      else current = { [m.key]: m.value };
      continue;
    }
    if (!spots.length) {
      if (m.kind === 'replace') current = m.value;
      continue;
    }
    const [container, key] = spots[m.at % spots.length]!;
    if (m.kind === 'replace') (container as Record<string | number, unknown>)[key] = m.value;
    else if (Array.isArray(container)) container.splice(key as number, 1);
    else delete container[key as string];
  }
  return current;
}

/**
 * Percent-encodes any JS string for a URL. Unlike encodeURIComponent it does not throw on a
 * lone surrogate: it sends the bytes such a string would have in WTF-8 (not valid UTF-8).
 */
export function percentEncode(s: string): string {
  let out = '';
  for (let i = 0; i < s.length; i++) {
    const c = s.charCodeAt(i);
    const pair = c >= 0xd800 && c <= 0xdbff && i + 1 < s.length && s.charCodeAt(i + 1) >= 0xdc00 && s.charCodeAt(i + 1) <= 0xdfff;
    if (pair) {
      out += encodeURIComponent(s.slice(i, i + 2));
      i++;
    } else if (c >= 0xd800 && c <= 0xdfff) {
      out += `%${(0xe0 | (c >> 12)).toString(16).toUpperCase()}%${(0x80 | ((c >> 6) & 0x3f)).toString(16).toUpperCase()}%${(0x80 | (c & 0x3f)).toString(16).toUpperCase()}`;
    } else out += encodeURIComponent(s[i]!);
  }
  return out;
}

/** Hostile text for a path segment or query value, as it goes on the wire (some of it deliberately malformed). */
export const hostileUrlText: fc.Arbitrary<string> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...HOSTILE_STRINGS).map(percentEncode) },
  { weight: 1, arbitrary: fc.constantFrom('%', '%E0%A4%A', '%ZZ', '%C0%AF', '%ED%A0%80', '..', '%2e%2e', '%2F', '%5C', '%FF%FE') },
  { weight: 1, arbitrary: fc.integer({ min: 70, max: 4_000 }).map((n) => 'y'.repeat(n)) },
  { weight: 1, arbitrary: fc.string({ unit: 'grapheme', maxLength: 20 }).map(percentEncode) },
);
