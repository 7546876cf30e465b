// One index of the stand-in: its settings, its documents (in the order they first came) and a
// minisearch index over the searchable attributes. A search is plain code over the documents:
// text matches from text.ts, filters as per-document predicates, facet counts in a loop, and
// Array.prototype.sort with Meilisearch's default ranking rules as the comparator.

import type MiniSearch from 'minisearch';
import { z } from 'zod';
import { MeiliError } from './errors.ts';
import { parseFilter } from './filter.ts';
import { isScalar, normalize, valuesAt, words, type Doc } from './documents.ts';
import { createTextIndex, matchText, type TextMatch } from './text.ts';

/** The settings the app sends; anything else is refused, so the fake never silently ignores one. */
export const settingsSchema = z
  .object({
    searchableAttributes: z.array(z.string()).nullable(),
    filterableAttributes: z.array(z.string()).nullable(),
    sortableAttributes: z.array(z.string()).nullable(),
    synonyms: z.record(z.string(), z.array(z.string())).nullable(),
    pagination: z.object({ maxTotalHits: z.number().int().min(1).nullable() }).strict().nullable(),
  })
  .partial()
  .strict();
export type SettingsPatch = z.infer<typeof settingsSchema>;

/** The search parameters the app sends (Meilisearch API reference, "Search"). */
export const searchSchema = z
  .object({
    q: z.string().nullable(),
    filter: z.unknown(),
    facets: z.array(z.string()).nullable(),
    sort: z.array(z.string()).nullable(),
    limit: z.number().int().min(0),
    offset: z.number().int().min(0),
    attributesToRetrieve: z.array(z.string()).nullable(),
    attributesToSearchOn: z.array(z.string()).nullable(),
  })
  .partial()
  .strict();
export type SearchRequest = z.infer<typeof searchSchema>;

const DEFAULTS = { searchableAttributes: ['*'], filterableAttributes: [] as string[], sortableAttributes: [] as string[], synonyms: {} as Record<string, string[]>, pagination: { maxTotalHits: 1000 } };
type Settings = typeof DEFAULTS;

/** Sort values compare as Meilisearch orders them: numbers before text, text without case or accents. */
function compareValues(a: string | number | boolean, b: string | number | boolean): number {
  if (typeof a === 'number' && typeof b === 'number') return a - b;
  if (typeof a === 'number' || typeof b === 'number') return typeof a === 'number' ? -1 : 1;
  const [x, y] = [normalize(String(a)), normalize(String(b))];
  return x < y ? -1 : x > y ? 1 : 0;
}

type Entry = { id: string; doc: Doc; order: number };
type SortValue = string | number | boolean | undefined;
/** A candidate hit with what the ranking reads: its text match and its sort values, taken once. */
type Ranked = { entry: Entry; text: TextMatch | undefined; keys: SortValue[] };

export class StandinIndex {
  #settings: Settings = structuredClone(DEFAULTS);
  #docs = new Map<string, Entry>();
  #added = 0;
  #fields: string[] = [];
  #text: MiniSearch<Doc> = createTextIndex([], 'id');

  constructor(
    readonly uid: string,
    public primaryKey: string | null = null,
  ) {}

  get size(): number {
    return this.#docs.size;
  }

  /** The searchable attributes in ranking order: as set, or every attribute seen, in order of appearance. */
  #searchable(): string[] {
    const set = this.#settings.searchableAttributes;
    if (!set.includes('*')) return set;
    const seen = new Set<string>();
    for (const { doc } of this.#docs.values()) for (const key of Object.keys(doc)) seen.add(key);
    return [...seen];
  }

  #rebuildText(): void {
    this.#fields = this.#searchable();
    this.#text = createTextIndex(this.#fields, this.primaryKey ?? 'id');
    this.#text.addAll([...this.#docs.values()].map((e) => e.doc));
  }

  updateSettings(patch: SettingsPatch): void {
    const merged = { ...this.#settings };
    for (const [name, value] of Object.entries(patch)) Object.assign(merged, { [name]: value ?? structuredClone(DEFAULTS[name as keyof Settings]) });
    merged.pagination = { maxTotalHits: patch.pagination?.maxTotalHits ?? merged.pagination.maxTotalHits ?? DEFAULTS.pagination.maxTotalHits };
    // Meilisearch matches synonyms on normalized words.
    merged.synonyms = Object.fromEntries(Object.entries(merged.synonyms).map(([word, list]) => [words(word).join(' '), list]));
    this.#settings = merged;
    this.#rebuildText();
  }

  /** Adds or replaces whole documents (POST /documents). Fails the task, changing nothing, if one lacks its id. */
  addDocuments(sent: Doc[], primaryKey?: string): number {
    // Meilisearch docs, "Primary key": without one, it is the one attribute whose name ends in "id".
    const inferred = this.primaryKey === null;
    this.primaryKey ??= primaryKey ?? Object.keys(sent[0] ?? {}).find((key) => /id$/i.test(key)) ?? null;
    const key = this.primaryKey;
    if (!key) throw new MeiliError(400, 'index_primary_key_no_candidate_found', 'The primary key inference failed as the engine did not find any field ending with `id` in its name.');
    // The same id twice in one payload: the last one wins, as in Meilisearch.
    const documents = [...new Map(sent.map((doc) => [String(doc[key]), doc])).values()];
    const bad = documents.find((doc) => !(typeof doc[key] === 'string' || Number.isInteger(doc[key])) || !/^[A-Za-z0-9_-]{1,511}$/.test(String(doc[key])));
    if (bad) throw new MeiliError(400, 'missing_document_id', `Document doesn't have a valid \`${key}\` attribute: \`${JSON.stringify(bad).slice(0, 200)}\`.`);
    const known = new Set(this.#fields);
    for (const doc of documents) {
      const id = String(doc[key]);
      if (this.#text.has(doc[key])) this.#text.discard(doc[key]);
      this.#docs.set(id, { id, doc, order: this.#docs.get(id)?.order ?? this.#added++ });
    }
    // A new primary key, or a new attribute while every attribute is searchable: the text index is rebuilt.
    if (inferred || this.#searchable().some((field) => !known.has(field))) this.#rebuildText();
    else this.#text.addAll(documents);
    return sent.length;
  }

  clear(): number {
    const deleted = this.#docs.size;
    this.#docs.clear();
    this.#text.removeAll();
    return deleted;
  }

  search(request: SearchRequest, matchOnce: (key: string, run: () => Map<string, TextMatch> | null) => Map<string, TextMatch> | null = (_k, run) => run()): Doc {
    const started = performance.now();
    const { filterableAttributes: filterable, sortableAttributes: sortable, pagination, synonyms } = this.#settings;
    const searchOn = request.attributesToSearchOn ?? this.#fields;
    const unknown = searchOn.find((a) => !this.#fields.includes(a));
    if (unknown) throw new MeiliError(400, 'invalid_search_attributes_to_search_on', `Attribute \`${unknown}\` is not searchable. Available searchable attributes are: \`${this.#fields.join(', ')}\`.`);
    const sort = (request.sort ?? []).map((criterion) => {
      const [, attribute, direction] = /^(.+):(asc|desc)$/.exec(criterion) ?? [];
      if (!attribute || !sortable.includes(attribute)) throw new MeiliError(400, 'invalid_search_sort', `Attribute \`${attribute ?? criterion}\` is not sortable. Available sortable attributes are: \`${sortable.join(', ')}\`.`);
      return { attribute, sign: direction === 'asc' ? 1 : -1 };
    });
    const facets = request.facets ?? [];
    const notFacet = facets.find((f) => !filterable.includes(f));
    if (notFacet) throw new MeiliError(400, 'invalid_search_facets', `Attribute \`${notFacet}\` is not filterable. Available filterable attributes are: \`${filterable.join(', ')}\`.`);
    const predicate = parseFilter(request.filter, filterable);

    // Text matching depends only on the words and the attributes, so a multi-search does it once.
    const q = request.q ?? '';
    const text = matchOnce(`${q}\u0000${searchOn.join(',')}`, () => matchText(this.#text, q, { searchable: this.#fields, searchOn, synonyms }));
    const candidates: Ranked[] = [];
    const consider = (entry: Entry | undefined, match?: TextMatch) => {
      if (entry && (!predicate || predicate(entry.doc))) candidates.push({ entry, text: match, keys: sort.length ? sort.map((s) => valuesAt(entry.doc, s.attribute)[0]) : [] });
    };
    if (text) for (const [id, match] of text) consider(this.#docs.get(id), match);
    else for (const entry of this.#docs.values()) consider(entry);

    const facetDistribution: Record<string, Record<string, number>> = {};
    for (const facet of facets) {
      const counts: Record<string, number> = {};
      for (const { entry } of candidates) {
        const value = entry.doc[facet];
        if (isScalar(value)) counts[String(value)] = (counts[String(value)] ?? 0) + 1;
        else for (const each of new Set(valuesAt(entry.doc, facet).map(String))) counts[each] = (counts[each] ?? 0) + 1;
      }
      // Meilisearch's defaults: values in alphabetical order, at most 100 per facet.
      facetDistribution[facet] = Object.fromEntries(Object.entries(counts).sort(([a], [b]) => (a < b ? -1 : 1)).slice(0, 100));
    }

    const bySort = (a: Ranked, b: Ranked) => {
      for (const [i, { sign }] of sort.entries()) {
        const [x, y] = [a.keys[i], b.keys[i]];
        if (x === undefined || y === undefined) {
          if (x !== y) return x === undefined ? 1 : -1; // missing values last, either way
        } else if (compareValues(x, y) !== 0) return sign * compareValues(x, y);
      }
      return 0;
    };
    // Meilisearch's default ranking rules: words, typo, proximity, attribute, sort, exactness.
    const byRules = (a: Ranked, b: Ranked) => {
      const [x, y] = [a.text, b.text];
      if (x && y) return y.words - x.words || x.typos - y.typos || x.proximity - y.proximity || x.attribute - y.attribute || bySort(a, b) || y.exact - x.exact;
      return bySort(a, b);
    };
    candidates.sort((a, b) => byRules(a, b) || a.entry.order - b.entry.order);

    const total = Math.min(candidates.length, pagination.maxTotalHits);
    const offset = request.offset ?? 0;
    const limit = request.limit ?? 20;
    const retrieve = request.attributesToRetrieve?.includes('*') ? null : request.attributesToRetrieve;
    const pick = (doc: Doc) => (retrieve ? Object.fromEntries(retrieve.filter((a) => Object.hasOwn(doc, a)).map((a) => [a, doc[a]])) : doc);
    return {
      hits: candidates.slice(offset, Math.max(offset, Math.min(offset + limit, total))).map(({ entry }) => pick(entry.doc)),
      query: q,
      processingTimeMs: Math.round(performance.now() - started),
      limit,
      offset,
      estimatedTotalHits: total,
      ...(request.facets ? { facetDistribution, facetStats: {} } : {}),
    };
  }

  stats(): Doc {
    const fieldDistribution: Record<string, number> = {};
    for (const { doc } of this.#docs.values()) for (const key of Object.keys(doc)) fieldDistribution[key] = (fieldDistribution[key] ?? 0) + 1;
    return { numberOfDocuments: this.#docs.size, isIndexing: false, fieldDistribution };
  }
}
