// Per-attribute value maps for filterable attributes: value → internal ids of the documents
// holding it. Filters and facet counts read these instead of scanning documents on every search.
//
// Sets of documents are passed around as byte maps (DocBits) indexed by internal document id:
// AND/OR/NOT over 50,000 documents are then plain loops, far cheaper than Set operations.

import { normalizeText, valuesAt, type Json, type Leaf } from './standin-text.ts';

export type DocBits = Uint8Array;

export function bitsFromIds(ids: Iterable<number>, size: number): DocBits {
  const bits = new Uint8Array(size);
  for (const id of ids) bits[id] = 1;
  return bits;
}

export function parseNumber(token: string): number | undefined {
  const value = Number(token);
  return token.trim() !== '' && Number.isFinite(value) ? value : undefined;
}

// Meilisearch compares facet strings case- and accent-insensitively; numbers and booleans
// match their written form, so `price = 10` and `inStock = true` work.
function facetKey(leaf: Leaf): string {
  return typeof leaf === 'string' ? normalizeText(leaf) : String(leaf);
}

function addId<K>(map: Map<K, Set<number>>, key: K, id: number): boolean {
  const ids = map.get(key);
  if (ids) {
    ids.add(id);
    return false;
  }
  map.set(key, new Set([id]));
  return true;
}

function removeId<K>(map: Map<K, Set<number>>, key: K, id: number): boolean {
  const ids = map.get(key);
  if (!ids?.delete(id) || ids.size > 0) return false;
  map.delete(key);
  return true;
}

type FacetKey = { key: string; number: number | undefined };

// Facet values in alphabetical order, numbers in numeric order ahead of strings.
function compareFacetKeys(a: FacetKey, b: FacetKey): number {
  if (a.number !== undefined && b.number !== undefined) return a.number - b.number;
  if (a.number !== undefined || b.number !== undefined) return a.number !== undefined ? -1 : 1;
  return a.key < b.key ? -1 : a.key > b.key ? 1 : 0;
}

export class FacetField {
  /** Documents where the attribute exists, for EXISTS. */
  readonly present = new Set<number>();
  readonly #idsByKey = new Map<string, Set<number>>();
  /** First original spelling of each value, which facetDistribution reports. */
  readonly #labels = new Map<string, string>();
  readonly #idsByNumber = new Map<number, Set<number>>();
  /** One (value, id) pair per number held, in numeric order, for range scans and stats. */
  #numberIndex: { values: Float64Array; ids: Int32Array } | null = null;
  #sortedKeys: string[] | null = null;
  /** Each document's values as positions in #keys(), for counting over the matched documents. */
  #valuesByDoc: { start: Int32Array; keys: Int32Array; single: Int32Array | null } | null = null;

  constructor(readonly attribute: string) {}

  add(id: number, doc: Json): void {
    const { present, leaves } = valuesAt(doc, this.attribute);
    if (!present) return;
    this.present.add(id);
    this.#valuesByDoc = null;
    for (const leaf of leaves) {
      const key = facetKey(leaf);
      if (addId(this.#idsByKey, key, id)) {
        this.#labels.set(key, String(leaf));
        this.#sortedKeys = null;
      }
      if (typeof leaf === 'number') {
        addId(this.#idsByNumber, leaf, id);
        this.#numberIndex = null;
      }
    }
  }

  remove(id: number, doc: Json): void {
    if (!this.present.delete(id)) return;
    this.#valuesByDoc = null;
    for (const leaf of valuesAt(doc, this.attribute).leaves) {
      const key = facetKey(leaf);
      if (removeId(this.#idsByKey, key, id)) {
        this.#labels.delete(key);
        this.#sortedKeys = null;
      }
      if (typeof leaf === 'number') {
        removeId(this.#idsByNumber, leaf, id);
        this.#numberIndex = null;
      }
    }
  }

  equalTo(token: string): Set<number>[] {
    const keys = new Set([normalizeText(token)]);
    const number = parseNumber(token);
    if (number !== undefined) keys.add(String(number));
    return [...keys].flatMap((key) => this.#idsByKey.get(key) ?? []);
  }

  /** Documents holding a number within the bounds; comparisons only apply to numbers. */
  between(min: number, max: number, includeMin: boolean, includeMax: boolean): Iterable<number> {
    const { values, ids } = this.#numbers();
    const start = includeMin ? firstAtLeast(values, min) : firstAbove(values, min);
    const end = includeMax ? firstAbove(values, max) : firstAtLeast(values, max);
    return ids.subarray(start, Math.max(start, end));
  }

  /**
   * Value counts over the matched documents, as Meilisearch's facetDistribution. Counting walks
   * the matched ids (often a few hundred), not every document holding each value.
   */
  distribution(matched: ArrayLike<number>, maxValues: number, order: 'alpha' | 'count'): Record<string, number> {
    const keys = this.#keys();
    const { start, keys: valueKeys, single } = this.#documentValues();
    // One slot past the values counts the documents without one.
    const counts = new Int32Array(keys.length + 1);
    if (single) {
      for (let i = 0; i < matched.length; i++) if (matched[i] < single.length) counts[single[matched[i]]]++;
    } else {
      for (let i = 0; i < matched.length; i++) {
        const id = matched[i];
        if (id + 1 >= start.length) continue;
        for (let j = start[id]; j < start[id + 1]; j++) counts[valueKeys[j]]++;
      }
    }
    const counted: [key: string, count: number][] = [];
    for (let k = 0; k < keys.length; k++) {
      if (counts[k] === 0) continue;
      counted.push([keys[k], counts[k]]);
      // In alphabetical order the first maxValues values found are the answer.
      if (order === 'alpha' && counted.length === maxValues) break;
    }
    // The sort is stable, so values with equal counts stay alphabetical.
    if (order === 'count') counted.sort((a, b) => b[1] - a[1]);
    return Object.fromEntries(counted.slice(0, maxValues).map(([key, count]) => [this.#labels.get(key), count]));
  }

  /** Lowest and highest number among the selected documents, for facetStats. */
  stats(selected: () => DocBits): { min: number; max: number } | undefined {
    if (this.#idsByNumber.size === 0) return undefined;
    const { values, ids } = this.#numbers();
    const bits = selected();
    let low = 0;
    while (low < ids.length && !bits[ids[low]]) low++;
    if (low === ids.length) return undefined;
    let high = ids.length - 1;
    while (!bits[ids[high]]) high--;
    return { min: values[low], max: values[high] };
  }

  #keys(): string[] {
    this.#sortedKeys ??= [...this.#idsByKey.keys()]
      .map((key) => ({ key, number: parseNumber(key) }))
      .sort(compareFacetKeys)
      .map(({ key }) => key);
    return this.#sortedKeys;
  }

  /**
   * Compressed rows: document id → its value positions, rebuilt after a change. When no document
   * holds more than one value (most attributes), `single` gives each document's one position
   * directly (keys.length for none), which counts in a single step.
   */
  #documentValues(): { start: Int32Array; keys: Int32Array; single: Int32Array | null } {
    if (!this.#valuesByDoc) {
      const keys = this.#keys();
      let size = 0;
      let total = 0;
      for (const ids of this.#idsByKey.values()) {
        total += ids.size;
        for (const id of ids) if (id >= size) size = id + 1;
      }
      const start = new Int32Array(size + 1);
      for (const ids of this.#idsByKey.values()) for (const id of ids) start[id + 1]++;
      for (let id = 0; id < size; id++) start[id + 1] += start[id];
      const fill = start.slice(0, size);
      const valueKeys = new Int32Array(total);
      keys.forEach((key, position) => {
        for (const id of this.#idsByKey.get(key)!) valueKeys[fill[id]++] = position;
      });
      let single: Int32Array | null = null;
      let most = 0;
      for (let id = 0; id < size; id++) most = Math.max(most, start[id + 1] - start[id]);
      if (most <= 1) {
        single = new Int32Array(size).fill(keys.length);
        for (let id = 0; id < size; id++) if (start[id + 1] > start[id]) single[id] = valueKeys[start[id]];
      }
      this.#valuesByDoc = { start, keys: valueKeys, single };
    }
    return this.#valuesByDoc;
  }

  #numbers(): { values: Float64Array; ids: Int32Array } {
    if (!this.#numberIndex) {
      const entries = [...this.#idsByNumber].sort((a, b) => a[0] - b[0]);
      const total = entries.reduce((sum, [, ids]) => sum + ids.size, 0);
      const values = new Float64Array(total);
      const ids = new Int32Array(total);
      let i = 0;
      for (const [value, holders] of entries) {
        for (const id of holders) {
          values[i] = value;
          ids[i++] = id;
        }
      }
      this.#numberIndex = { values, ids };
    }
    return this.#numberIndex;
  }
}

/** Index of the first value >= target in ascending `values`. */
function firstAtLeast(values: Float64Array, target: number): number {
  let low = 0;
  let high = values.length;
  while (low < high) {
    const mid = (low + high) >> 1;
    if (values[mid] < target) low = mid + 1;
    else high = mid;
  }
  return low;
}

/** Index of the first value > target in ascending `values`. */
function firstAbove(values: Float64Array, target: number): number {
  let low = 0;
  let high = values.length;
  while (low < high) {
    const mid = (low + high) >> 1;
    if (values[mid] <= target) low = mid + 1;
    else high = mid;
  }
  return low;
}
