// One index of the search stand-in: stored documents (kept as the original JSON objects and
// returned as hits), primary-key rules, and search with filters, facets, sorting and ranking.
//
// Documents get dense internal ids so filters and facets work on byte maps. The full-text index
// is brought up to date by every write, as Meilisearch indexes at write time, so searches never
// pay for it; value maps and sort ranks are built on first use and dropped when invalidated.

import { MeiliError, notFilterable } from './standin-errors.ts';
import { scratch } from './standin-scratch.ts';
import { bitsFromIds, FacetField, type DocBits } from './standin-facets.ts';
import { evaluateFilter, idsOfEqualities, parseFilter, type FilterNode, type FilterSource } from './standin-filter.ts';
import {
  applySettings,
  defaultSettings,
  filterablePatterns,
  matchesAttributeList,
  type IndexSettings,
  type SettingsPatch,
} from './standin-settings.ts';
import {
  ALL_ATTRIBUTES,
  isPlainObject,
  MAX_QUERY_WORDS,
  normalizeText,
  TextIndex,
  valuesAt,
  type Json,
  type Leaf,
  type TextMatches,
  type TextSearchOptions,
} from './standin-text.ts';

export type SearchRequest = {
  q?: string | null;
  offset?: number;
  limit?: number;
  page?: number;
  hitsPerPage?: number;
  filter?: unknown;
  sort?: string[] | null;
  facets?: string[] | null;
  attributesToRetrieve?: string[] | null;
  matchingStrategy?: 'last' | 'all' | 'frequency';
  attributesToSearchOn?: string[] | null;
};

export type DocumentsRequest = {
  offset?: number;
  limit?: number;
  fields?: string[] | null;
  filter?: unknown;
  ids?: (string | number)[] | null;
  sort?: string[] | null;
};

type SortCriterion = { attribute: string; descending: boolean };
type Compare<T> = (a: T, b: T) => number;
/**
 * One ranking rule as a number per document: `values[id]` lies in [0, top], better first (or
 * last when `descending`); a negative value means the document lacks it and ranks after all.
 */
type RankKey = { values: Uint8Array | Uint16Array | Int32Array; top: number; descending: boolean };
type SortRanks = { ranks: Int32Array; distinct: number };

const DOCUMENT_ID = /^[A-Za-z0-9_-]{1,511}$/;
const DEFAULT_LIMIT = 20;
const FILTER_RESULTS_KEPT = 64;
const TEXT_SLOTS = 4;

function now(): string {
  return new Date().toISOString();
}

function inferPrimaryKey(doc: Json): string {
  // Meilisearch docs, "Primary key": inference looks for exactly one attribute ending in `id`.
  const candidates = Object.keys(doc).filter((key) => key.toLowerCase().endsWith('id'));
  if (candidates.length === 1) return candidates[0];
  const hint = 'Please specify the primary key manually using the `primaryKey` query parameter.';
  if (candidates.length === 0) {
    throw new MeiliError(
      400,
      'index_primary_key_no_candidate_found',
      `The primary key inference failed as the engine did not find any field ending with \`id\` in its name. ${hint}`,
    );
  }
  throw new MeiliError(
    400,
    'index_primary_key_multiple_candidates_found',
    `The primary key inference failed as the engine found ${candidates.length} fields ending with \`id\` in their names: '${candidates[0]}' and '${candidates[1]}'. ${hint}`,
  );
}

function documentKey(doc: Json, primaryKey: string): string {
  const value = doc[primaryKey];
  if (value === undefined || value === null) {
    throw new MeiliError(
      400,
      'missing_document_id',
      `Document doesn't have a \`${primaryKey}\` attribute: \`${JSON.stringify(doc).slice(0, 200)}\`.`,
    );
  }
  const key = Number.isSafeInteger(value) ? String(value) : value;
  if (typeof key !== 'string' || !DOCUMENT_ID.test(key)) {
    throw new MeiliError(
      400,
      'invalid_document_id',
      `Document identifier \`${JSON.stringify(value)}\` is invalid. A document identifier can be of type integer or string, only composed of alphanumeric characters (a-z A-Z 0-9), hyphens (-) and underscores (_), and can not be more than 511 bytes.`,
    );
  }
  return key;
}

// Numbers sort before strings; strings compare in their normalized form.
function compareSortValues(a: number | string, b: number | string): number {
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  if (typeof a !== typeof b) return typeof a === 'number' ? -1 : 1;
  return a < b ? -1 : a > b ? 1 : 0;
}

function sortValue(leaf: Leaf): number | string {
  return typeof leaf === 'number' ? leaf : normalizeText(String(leaf));
}

/** Orders by a precomputed rank; documents without the attribute come last in both directions. */
function byRank({ ranks, distinct }: SortRanks, descending: boolean): RankKey {
  return { values: ranks, top: distinct - 1, descending };
}

/** A rank key's value for one document, in [0, top + 1]. */
function rankOf(key: RankKey, id: number): number {
  const value = key.values[id];
  if (value < 0) return key.top + 1;
  return key.descending ? key.top - value : value;
}

/**
 * Appends one rank key to each document's packed score. One loop per array type: a loop that
 * reads byte, 16-bit and 32-bit arrays in turn runs several times slower than three that each
 * read one kind.
 */
function addToScores(score: Float64Array, ids: Int32Array, key: RankKey): void {
  const span = key.top + 2;
  const { values, top, descending } = key;
  if (values instanceof Int32Array) {
    for (let i = 0; i < ids.length; i++) {
      const value = values[ids[i]];
      score[i] = score[i] * span + (value < 0 ? top + 1 : descending ? top - value : value);
    }
  } else if (values instanceof Uint16Array) {
    for (let i = 0; i < ids.length; i++) score[i] = score[i] * span + (descending ? top - values[ids[i]] : values[ids[i]]);
  } else {
    for (let i = 0; i < ids.length; i++) score[i] = score[i] * span + (descending ? top - values[ids[i]] : values[ids[i]]);
  }
}

function parseSortCriterion(expression: string, code: string): SortCriterion {
  const match = /^(.+):(asc|desc)$/.exec(expression);
  if (!match || match[1].startsWith('_geo')) {
    throw new MeiliError(
      400,
      code,
      `Invalid syntax for the sort parameter: expected expression ending by \`:asc\` or \`:desc\`, found \`${expression}\`.`,
    );
  }
  return { attribute: match[1], descending: match[2] === 'desc' };
}

/** The documents a filter selects, as a byte map and as ids, each made on first use. */
class Selection {
  #bits: DocBits | null = null;
  #ids: Int32Array | null = null;

  constructor(
    private readonly makeBits: () => DocBits,
    private readonly makeIds: () => Int32Array,
  ) {}

  bits(): DocBits {
    return (this.#bits ??= this.makeBits());
  }

  ids(): Int32Array {
    return (this.#ids ??= this.makeIds());
  }
}

/** The ids whose bit is set, in their order. */
function keepSelected(ids: Int32Array, bits: DocBits): Int32Array {
  const kept = scratch.int32('kept-ids', ids.length);
  let count = 0;
  for (let i = 0; i < ids.length; i++) if (bits[ids[i]]) kept[count++] = ids[i];
  return kept.slice(0, count);
}

function copyPath(source: Json, target: Json, [head, ...rest]: string[]): void {
  if (!Object.hasOwn(source, head)) return;
  const value = source[head];
  if (rest.length === 0) {
    target[head] = value;
  } else if (isPlainObject(value)) {
    if (!isPlainObject(target[head])) target[head] = {};
    copyPath(value, target[head] as Json, rest);
  }
}

function pickAttributes(doc: Json, attributes: string[]): Json {
  const picked: Json = {};
  for (const attribute of attributes) copyPath(doc, picked, attribute.split('.'));
  return picked;
}

/**
 * The first `count` ids ordered by the rank keys in turn, then by internal id (document order,
 * Meilisearch's final tie-break). The keys are packed into one number per document when their
 * spans allow, as a bucket sort would order them; a bounded max-heap then keeps this
 * O(n log count): a page needs only a few of possibly 50,000 matches.
 */
function firstInOrder(ids: Int32Array, count: number, keys: RankKey[]): Int32Array {
  // Ids are gathered in internal id order, which is already the answer without keys.
  if (keys.length === 0) return ids.slice(0, count);
  if (count <= 0) return new Int32Array(0);
  let compare: Compare<number>;
  if (keys.reduce((product, key) => product * (key.top + 2), 1) <= Number.MAX_SAFE_INTEGER) {
    const score = scratch.float64('rank-scores', ids.length).fill(0, 0, ids.length);
    for (const key of keys) addToScores(score, ids, key);
    compare = (a, b) => score[a] - score[b] || ids[a] - ids[b];
  } else {
    compare = (a, b) => {
      for (const key of keys) {
        const order = rankOf(key, ids[a]) - rankOf(key, ids[b]);
        if (order !== 0) return order;
      }
      return ids[a] - ids[b];
    };
  }
  const heap: number[] = []; // positions in ids; heap[0] is the worst kept so far
  const worse = (i: number, j: number) => compare(heap[i], heap[j]) > 0;
  const swap = (i: number, j: number) => ([heap[i], heap[j]] = [heap[j], heap[i]]);
  const siftUp = (i: number) => {
    while (i > 0) {
      const parent = (i - 1) >> 1;
      if (!worse(i, parent)) return;
      swap(i, parent);
      i = parent;
    }
  };
  const siftDown = (i: number) => {
    for (;;) {
      const left = 2 * i + 1;
      let worst = i;
      if (left < heap.length && worse(left, worst)) worst = left;
      if (left + 1 < heap.length && worse(left + 1, worst)) worst = left + 1;
      if (worst === i) return;
      swap(i, worst);
      i = worst;
    }
  };
  for (let position = 0; position < ids.length; position++) {
    if (heap.length < count) {
      heap.push(position);
      siftUp(heap.length - 1);
    } else if (compare(position, heap[0]) < 0) {
      heap[0] = position;
      siftDown(0);
    }
  }
  return Int32Array.from(heap.sort(compare), (position) => ids[position]);
}

export class StandinIndex {
  readonly createdAt = now();
  updatedAt = this.createdAt;
  #settings: IndexSettings = defaultSettings();
  /** Stored documents by internal id; deleted slots hold undefined. */
  #docs: (Json | undefined)[] = [];
  /** 1 at the internal id of each stored document; grows by doubling, used up to #docs.length. */
  #live = new Uint8Array(1024);
  #idsByKey = new Map<string, number>();
  /** Top-level attributes in order of first appearance: the searchable order under `*`. */
  #fieldOrder: string[] = [];
  #text: TextIndex | null = null;
  #facets = new Map<string, FacetField>();
  #sortRanks = new Map<string, SortRanks>();
  /** Evaluated search filters by their JSON, until the next write: most searches repeat a few. */
  #filterResults = new Map<string, Selection | null>();

  constructor(
    readonly uid: string,
    public primaryKey: string | null = null,
  ) {}

  get settings(): IndexSettings {
    return this.#settings;
  }

  get documentCount(): number {
    return this.#idsByKey.size;
  }

  info(): { uid: string; primaryKey: string | null; createdAt: string; updatedAt: string } {
    return { uid: this.uid, primaryKey: this.primaryKey, createdAt: this.createdAt, updatedAt: this.updatedAt };
  }

  /** The parts of Meilisearch's index stats that describe documents; sizes are not modelled. */
  stats(): Json {
    const fieldDistribution: Record<string, number> = {};
    for (const doc of this.#docs) {
      if (!doc) continue;
      for (const field of Object.keys(doc)) fieldDistribution[field] = (fieldDistribution[field] ?? 0) + 1;
    }
    return { numberOfDocuments: this.documentCount, isIndexing: false, fieldDistribution };
  }

  setPrimaryKey(primaryKey: string): void {
    // Meilisearch only lets the primary key change while the index holds no documents.
    if (this.documentCount > 0 && primaryKey !== this.primaryKey) throw this.#primaryKeyExists();
    this.primaryKey = primaryKey;
    this.updatedAt = now();
  }

  /** Adds documents, replacing (`replace`) or merging into (`update`) existing ones. All or nothing. */
  addDocuments(documents: Json[], mode: 'replace' | 'update', requestedKey?: string): number {
    const primaryKey = this.#resolvePrimaryKey(documents, requestedKey);
    if (primaryKey === null) return 0;
    const keyed = documents.map((doc) => [documentKey(doc, primaryKey), doc] as const);
    this.primaryKey = primaryKey;
    for (const [key, doc] of keyed) this.#upsert(key, doc, mode);
    this.#afterWrite();
    return keyed.length;
  }

  deleteDocuments(externalIds: (string | number)[]): number {
    let deleted = 0;
    for (const externalId of externalIds) {
      const id = this.#idsByKey.get(String(externalId));
      if (id === undefined) continue;
      this.#remove(id);
      deleted++;
    }
    this.#afterWrite();
    return deleted;
  }

  deleteWhere(filter: FilterNode): number {
    const ids = this.#selectedIds(evaluateFilter(filter, this.#filterSource('invalid_document_filter')));
    for (const id of ids) this.#remove(id);
    this.#afterWrite();
    return ids.length;
  }

  clear(): number {
    const deleted = this.documentCount;
    this.#docs = [];
    this.#live.fill(0);
    this.#idsByKey.clear();
    this.#text = null;
    this.#facets.clear();
    this.#afterWrite();
    return deleted;
  }

  updateSettings(patch: SettingsPatch): void {
    const previous = this.#settings;
    const next = applySettings(previous, patch);
    const changed = (name: keyof IndexSettings) => JSON.stringify(previous[name]) !== JSON.stringify(next[name]);
    this.#settings = next;
    if (changed('searchableAttributes') || changed('stopWords')) this.#text = null;
    if (changed('filterableAttributes')) this.#facets.clear();
    this.#filterResults.clear();
    this.#ensureTextIndex();
    this.updatedAt = now();
  }

  getDocument(externalId: string, fields?: string[]): Json {
    const id = this.#idsByKey.get(externalId);
    if (id === undefined) {
      throw new MeiliError(404, 'document_not_found', `Document \`${externalId}\` not found.`);
    }
    return this.#projector(fields)(this.#docs[id]!);
  }

  listDocuments(request: DocumentsRequest): { results: Json[]; offset: number; limit: number; total: number } {
    const filter = parseFilter(request.filter, 'invalid_document_filter');
    let bits = filter ? evaluateFilter(filter, this.#filterSource('invalid_document_filter')) : this.#liveBits();
    if (request.ids) {
      const wanted = bitsFromIds(request.ids.flatMap((id) => this.#idsByKey.get(String(id)) ?? []), bits.length);
      for (let i = 0; i < bits.length; i++) wanted[i] &= bits[i];
      bits = wanted;
    }
    const offset = request.offset ?? 0;
    const limit = request.limit ?? DEFAULT_LIMIT;
    const matched = this.#selectedIds(bits);
    const sort = this.#parseSort(request.sort, 'invalid_document_sort');
    const keys = sort.map((criterion) => this.#byAttribute(criterion));
    const page = firstInOrder(matched, offset + limit, keys).slice(offset);
    const project = this.#projector(request.fields);
    return { results: Array.from(page, (id) => project(this.#docs[id]!)), offset, limit, total: matched.length };
  }

  /**
   * One search. Searches of one multi-search request share `textMemo`, so the full-text matching
   * for a query is done once however many filter and facet variants of it are asked for.
   */
  search(request: SearchRequest, textMemo = new Map<string, TextMatches | null>()): Json {
    const started = performance.now();
    const sort = this.#parseSort(request.sort, 'invalid_search_sort');
    if (sort.length > 0 && !this.#settings.rankingRules.includes('sort')) {
      throw new MeiliError(
        400,
        'invalid_search_sort',
        'You must specify where `sort` is listed in the rankingRules setting to use the sort parameter at search time.',
      );
    }
    const facets = this.#facetFields(request.facets ?? []);
    const size = this.#docs.length;
    const text = request.q ? this.#textMatches(request.q, request, textMemo) : null;
    const selection = this.#searchFilter(request.filter);
    let matched: Int32Array;
    let matchedBits: DocBits | null = null;
    if (text) {
      matched = selection ? keepSelected(text.ids, selection.bits()) : text.ids;
    } else if (selection) {
      matched = selection.ids();
    } else {
      matchedBits = this.#liveBits();
      matched = this.#selectedIds(matchedBits);
    }

    const response: Json = { hits: [], query: request.q ?? '', processingTimeMs: 0 };
    const window = this.#paginate(request, matched.length, response);
    const project = this.#projector(request.attributesToRetrieve);
    const ranked = firstInOrder(matched, window.end, this.#rankingRules(text, sort));
    response.hits = Array.from(ranked.subarray(window.start, window.end), (id) => project(this.#docs[id]!));
    const bits = () => (matchedBits ??= bitsFromIds(matched, size));
    if (request.facets) Object.assign(response, this.#facetSummary(facets, matched, bits));
    response.processingTimeMs = Math.round(performance.now() - started);
    return response;
  }

  /**
   * The documents a search filter selects, or null when it keeps every document (no filter, or
   * one such as `archived = false` that nothing fails): then there is nothing to filter out.
   * Kept until the next write. A filter that only names a few values (`sku = X OR …`) is read
   * from the value maps, without document-wide bitmaps. Callers must not write to the result.
   */
  #searchFilter(input: unknown): Selection | null {
    const key = JSON.stringify(input ?? null);
    const cached = this.#filterResults.get(key);
    if (cached !== undefined) return cached;
    const filter = parseFilter(input, 'invalid_search_filter');
    let selection: Selection | null = null;
    if (filter) {
      const source = this.#filterSource('invalid_search_filter');
      const few = idsOfEqualities(filter, source);
      if (few) {
        selection = new Selection(() => bitsFromIds(few, this.#docs.length), () => few);
      } else {
        const bits = evaluateFilter(filter, source);
        let selected = 0;
        for (let id = 0; id < bits.length; id++) selected += bits[id];
        if (selected < this.documentCount) selection = new Selection(() => bits, () => this.#selectedIds(bits));
      }
    }
    if (this.#filterResults.size >= FILTER_RESULTS_KEPT) this.#filterResults.delete(this.#filterResults.keys().next().value!);
    this.#filterResults.set(key, selection);
    return selection;
  }

  #resolvePrimaryKey(documents: Json[], requestedKey: string | undefined): string | null {
    if (this.primaryKey !== null) {
      if (requestedKey !== undefined && requestedKey !== this.primaryKey) throw this.#primaryKeyExists();
      return this.primaryKey;
    }
    if (requestedKey !== undefined) return requestedKey;
    return documents.length > 0 ? inferPrimaryKey(documents[0]) : null;
  }

  #primaryKeyExists(): MeiliError {
    return new MeiliError(
      400,
      'index_primary_key_already_exists',
      `Index \`${this.uid}\` already has a primary key: \`${this.primaryKey}\`.`,
    );
  }

  #upsert(key: string, doc: Json, mode: 'replace' | 'update'): void {
    let id = this.#idsByKey.get(key);
    const previous = id === undefined ? undefined : this.#docs[id];
    // Meilisearch's update mode merges top-level attributes only.
    const stored = previous && mode === 'update' ? { ...previous, ...doc } : doc;
    if (id === undefined) {
      id = this.#docs.push(stored) - 1;
      this.#idsByKey.set(key, id);
      this.#markLive(id);
    } else {
      this.#docs[id] = stored;
    }
    this.#learnFields(stored);
    for (const field of this.#facets.values()) {
      if (previous) field.remove(id, previous);
      field.add(id, stored);
    }
    if (previous) this.#text?.remove(id, previous);
    this.#text?.add(id, stored);
  }

  #remove(id: number): void {
    const doc = this.#docs[id]!;
    for (const field of this.#facets.values()) field.remove(id, doc);
    this.#text?.remove(id, doc);
    this.#idsByKey.delete(String(doc[this.primaryKey!]));
    this.#docs[id] = undefined;
    this.#live[id] = 0;
  }

  #markLive(id: number): void {
    if (id >= this.#live.length) {
      const grown = new Uint8Array(this.#live.length * 2);
      grown.set(this.#live);
      this.#live = grown;
    }
    this.#live[id] = 1;
  }

  #afterWrite(): void {
    // Internal ids are never reused while documents remain; start afresh once the index is empty.
    if (this.documentCount === 0 && this.#docs.length > 0) this.clear();
    this.#sortRanks.clear();
    this.#filterResults.clear();
    this.#ensureTextIndex();
    this.updatedAt = now();
  }

  #learnFields(doc: Json): void {
    for (const field of Object.keys(doc)) {
      if (this.#fieldOrder.includes(field)) continue;
      this.#fieldOrder.push(field);
      // The full-text index is built with a fixed field list; a new field under `*` needs a rebuild.
      if (this.#settings.searchableAttributes.includes('*')) this.#text = null;
    }
  }

  /** The full-text index, rebuilt when settings or a newly seen attribute invalidated it. */
  #ensureTextIndex(): TextIndex {
    if (!this.#text) {
      const searchable = this.#settings.searchableAttributes;
      const fields = searchable.includes('*') ? [...this.#fieldOrder] : searchable;
      this.#text = new TextIndex(fields, this.#settings.stopWords);
      for (const [id, doc] of this.#docs.entries()) if (doc) this.#text.add(id, doc);
    }
    return this.#text;
  }

  #textMatches(q: string, request: SearchRequest, memo: Map<string, TextMatches | null>): TextMatches | null {
    const options = this.#textOptions(request);
    const key = `${this.uid}\u0000${options.matchingStrategy}\u0000${options.searchOn}\u0000${q}`;
    // Each distinct query of a multi-search gets its own work arrays (slot), as all stay in use;
    // past a few, its own arrays, so a long multi-search does not keep memory for good.
    const slot = memo.size < TEXT_SLOTS ? memo.size : null;
    if (!memo.has(key)) memo.set(key, this.#ensureTextIndex().search(q, this.#docs.length, options, slot));
    return memo.get(key)!;
  }

  #textOptions(request: SearchRequest): TextSearchOptions {
    return {
      typoTolerance: this.#settings.typoTolerance,
      matchingStrategy: request.matchingStrategy ?? 'last',
      prefixSearch: this.#settings.prefixSearch !== 'disabled',
      searchOn: this.#searchOn(request.attributesToSearchOn),
    };
  }

  /** Meilisearch's `attributesToSearchOn`: a subset of the searchable attributes to match in. */
  #searchOn(attributes: string[] | null | undefined): number {
    if (!attributes || attributes.includes('*')) return ALL_ATTRIBUTES;
    const searchable = this.#settings.searchableAttributes;
    if (!searchable.includes('*')) {
      const unknown = attributes.find((attribute) => !searchable.includes(attribute));
      if (unknown !== undefined) {
        throw new MeiliError(
          400,
          'invalid_search_attributes_to_search_on',
          `Attribute \`${unknown}\` is not searchable. Available searchable attributes are: \`${searchable.join(', ')}\`.`,
        );
      }
    }
    return this.#ensureTextIndex().attributeSet(attributes);
  }

  /** A view, not a copy: callers must not write to it. */
  #liveBits(): DocBits {
    return this.#live.subarray(0, this.#docs.length);
  }

  #selectedIds(bits: DocBits): Int32Array {
    const ids = scratch.int32('selected-ids', bits.length);
    let count = 0;
    for (let id = 0; id < bits.length; id++) if (bits[id]) ids[count++] = id;
    return ids.slice(0, count);
  }

  #filterSource(code: string): FilterSource {
    return { live: this.#liveBits(), field: (attribute) => this.#facetField(attribute, code) };
  }

  #facetField(attribute: string, code: string): FacetField {
    const filterable = filterablePatterns(this.#settings);
    if (!matchesAttributeList(filterable, attribute)) throw notFilterable(attribute, filterable, code);
    let field = this.#facets.get(attribute);
    if (!field) {
      field = new FacetField(attribute);
      for (const [id, doc] of this.#docs.entries()) if (doc) field.add(id, doc);
      this.#facets.set(attribute, field);
    }
    return field;
  }

  #facetFields(names: string[]): FacetField[] {
    // `facets: ["*"]` asks for every filterable attribute.
    const expanded = names.includes('*')
      ? filterablePatterns(this.#settings).filter((name) => !name.includes('*'))
      : names;
    return expanded.map((name) => this.#facetField(name, 'invalid_search_facets'));
  }

  #facetSummary(fields: FacetField[], matched: Int32Array, matchedBits: () => DocBits): Json {
    const { maxValuesPerFacet, sortFacetValuesBy } = this.#settings.faceting;
    const facetDistribution: Json = {};
    const facetStats: Json = {};
    for (const field of fields) {
      const order = sortFacetValuesBy[field.attribute] ?? sortFacetValuesBy['*'] ?? 'alpha';
      facetDistribution[field.attribute] = field.distribution(matched, maxValuesPerFacet, order);
      const stats = field.stats(matchedBits);
      if (stats) facetStats[field.attribute] = stats;
    }
    return { facetDistribution, facetStats };
  }

  #parseSort(expressions: string[] | null | undefined, code: string): SortCriterion[] {
    const sortable = this.#settings.sortableAttributes;
    return (expressions ?? []).map((expression) => {
      const criterion = parseSortCriterion(expression, code);
      if (!matchesAttributeList(sortable, criterion.attribute)) {
        throw new MeiliError(
          400,
          code,
          `Attribute \`${criterion.attribute}\` is not sortable. Available sortable attributes are: \`${sortable.join(', ')}\`.`,
        );
      }
      return criterion;
    });
  }

  /**
   * Rank keys for the ranking rules in order, like Meilisearch's bucket sort. `proximity` is
   * approximated (are the matched words in one attribute?); rules without a signal here
   * (wordPosition) are skipped, and text rules do not apply to a
   * placeholder search.
   */
  #rankingRules(text: TextMatches | null, sort: SortCriterion[]): RankKey[] {
    const keys: RankKey[] = [];
    for (const rule of this.#settings.rankingRules) {
      if (text && rule === 'words') keys.push({ values: text.words, top: MAX_QUERY_WORDS, descending: true });
      else if (text && rule === 'proximity') keys.push({ values: text.proximity, top: 1, descending: false });
      else if (text && rule === 'typo') keys.push({ values: text.typos, top: MAX_QUERY_WORDS, descending: false });
      else if (text && (rule === 'attribute' || rule === 'attributeRank')) {
        keys.push({ values: text.attribute, top: text.attributes - 1, descending: false });
      } else if (text && rule === 'exactness') keys.push({ values: text.exact, top: MAX_QUERY_WORDS, descending: true });
      else if (rule === 'sort') keys.push(...sort.map((criterion) => this.#byAttribute(criterion)));
      else if (/:(asc|desc)$/.test(rule)) {
        keys.push(this.#byAttribute(parseSortCriterion(rule, 'invalid_settings_ranking_rules')));
      }
    }
    return keys;
  }

  #byAttribute({ attribute, descending }: SortCriterion): RankKey {
    return byRank(this.#ranks(attribute), descending);
  }

  /** Rank of every document's value for an attribute (-1 when absent), cached until the next write. */
  #ranks(attribute: string): SortRanks {
    const cached = this.#sortRanks.get(attribute);
    if (cached) return cached;
    const entries: [id: number, value: number | string][] = [];
    for (const [id, doc] of this.#docs.entries()) {
      const leaf = doc ? valuesAt(doc, attribute).leaves[0] : undefined;
      if (leaf !== undefined) entries.push([id, sortValue(leaf)]);
    }
    entries.sort((a, b) => compareSortValues(a[1], b[1]));
    const ranks = new Int32Array(this.#docs.length).fill(-1);
    let rank = 0;
    entries.forEach(([id, value], i) => {
      if (i > 0 && compareSortValues(entries[i - 1][1], value) !== 0) rank++;
      ranks[id] = rank;
    });
    const sorted = { ranks, distinct: entries.length === 0 ? 0 : rank + 1 };
    this.#sortRanks.set(attribute, sorted);
    return sorted;
  }

  /** Meilisearch pagination: offset/limit by default, page/hitsPerPage when either is given. */
  #paginate(request: SearchRequest, matched: number, response: Json): { start: number; end: number } {
    const reachable = Math.min(matched, this.#settings.pagination.maxTotalHits);
    if (request.page === undefined && request.hitsPerPage === undefined) {
      const offset = request.offset ?? 0;
      const limit = request.limit ?? DEFAULT_LIMIT;
      Object.assign(response, { limit, offset, estimatedTotalHits: reachable });
      return { start: offset, end: Math.min(offset + limit, reachable) };
    }
    const page = request.page ?? 1;
    const hitsPerPage = request.hitsPerPage ?? DEFAULT_LIMIT;
    const totalPages = hitsPerPage > 0 ? Math.ceil(reachable / hitsPerPage) : 0;
    Object.assign(response, { hitsPerPage, page, totalPages, totalHits: reachable });
    if (page === 0) return { start: 0, end: 0 };
    const start = (page - 1) * hitsPerPage;
    return { start, end: Math.min(start + hitsPerPage, reachable) };
  }

  #projector(requested: string[] | null | undefined): (doc: Json) => Json {
    const displayed = this.#settings.displayedAttributes;
    const wanted = requested ?? ['*'];
    const displaysAll = displayed.includes('*');
    if (displaysAll && wanted.includes('*')) return (doc) => doc;
    const attributes = wanted.includes('*')
      ? displayed
      : wanted.filter((attribute) => displaysAll || matchesAttributeList(displayed, attribute));
    // Top-level names (the usual case) are copied directly; dotted paths walk nested objects.
    if (attributes.every((attribute) => !attribute.includes('.'))) {
      return (doc) => {
        const picked: Json = {};
        for (const attribute of attributes) if (Object.hasOwn(doc, attribute)) picked[attribute] = doc[attribute];
        return picked;
      };
    }
    return (doc) => pickAttributes(doc, attributes);
  }
}
