// Documents as Meilisearch reads them: any JSON object, its attributes reached by dotted paths
// through nested objects and arrays, its words split at anything that is not a letter or digit.

export type Doc = Record<string, unknown>;

export const isObject = (value: unknown): value is Doc => typeof value === 'object' && value !== null && !Array.isArray(value);

export const isScalar = (value: unknown): value is string | number | boolean => typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean';

/** The scalar values at a dotted attribute path, arrays and nested objects flattened. */
export function valuesAt(value: unknown, path: string): (string | number | boolean)[] {
  // Most attributes are top-level scalars: answered without splitting the path.
  const top = isObject(value) && !path.includes('.') ? value[path] : undefined;
  if (isScalar(top)) return [top];
  if (Array.isArray(top) && top.every((item) => typeof item === 'string')) return top;
  const [head, ...rest] = path === '' ? [] : path.split('.');
  if (Array.isArray(value)) return value.flatMap((item) => valuesAt(item, path));
  if (head !== undefined) return isObject(value) && Object.hasOwn(value, head) ? valuesAt(value[head], rest.join('.')) : [];
  if (isObject(value)) return Object.values(value).flatMap((item) => valuesAt(item, ''));
  return isScalar(value) ? [value] : [];
}

/** Lower case without accents: how words and sort values compare. */
export function normalize(text: string): string {
  const lower = text.toLowerCase();
  // eslint-disable-next-line no-control-regex -- plain ASCII has no accents to strip
  return /^[\u0000-\u007f]*$/.test(lower) ? lower : lower.normalize('NFKD').replace(/\p{M}/gu, '');
}

/** A text's words, normalized. */
export const words = (text: string): string[] => normalize(text).split(/[^\p{L}\p{N}]+/u).filter(Boolean);
