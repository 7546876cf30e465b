// Full-text matching for the search stand-in. Terms live in minisearch's radix tree
// (SearchableMap), which answers the exact, prefix and fuzzy term lookups; each term maps to the
// documents containing it. Instead of a relevance score, a search yields per-document signals for
// Meilisearch's ranking rules (matched words, typos, words together, best attribute, exact words), which the index
// then bucket-sorts like Meilisearch. Skipping BM25 scoring keeps searches over 50,000 documents fast.

import SearchableMap from 'minisearch/SearchableMap';
import type { TypoTolerance } from './standin-settings.ts';
import { scratch } from './standin-scratch.ts';

export type Json = Record<string, unknown>;
export type Leaf = string | number | boolean;

/** Ranking signals by internal document id, for the documents listed in `ids`. */
export type TextMatches = {
  ids: Int32Array;
  /** Query words the document matched (the `words` rule). */
  words: Uint8Array;
  /** Query words matched only through a typo (the `typo` rule). */
  typos: Uint8Array;
  /** Query words matched without typo or prefix (the `exactness` rule). */
  exact: Uint8Array;
  /** Position in searchableAttributes of the best matching attribute (the `attribute` rule). */
  attribute: Uint16Array;
  /**
   * 0 when the matched query words all occur in one attribute, else 1: a stand-in for the
   * `proximity` rule, which has no word positions here to measure distances with.
   */
  proximity: Uint8Array;
  /** How many searchable attributes there are: `attribute` values lie below it. */
  attributes: number;
};

export type TextSearchOptions = {
  typoTolerance: TypoTolerance;
  matchingStrategy: 'last' | 'all' | 'frequency';
  prefixSearch: boolean;
  /** The searchable attributes to match in, as a set from TextIndex.attributeSet (all by default). */
  searchOn?: number;
};

/** Every searchable attribute. */
export const ALL_ATTRIBUTES = 0xffffffff;

/**
 * The documents holding a term, each with the set of searchable attributes it appears in (bit
 * `rank` for the attribute at that position; positions past 31 share bit 31). Writes go to a map;
 * searches read a packed copy made on first read after a change, since walking typed arrays is
 * many times faster than walking a map of 50,000 entries.
 */
class Postings {
  readonly #attributes = new Map<number, number>();
  #packed: { ids: Int32Array; attributes: Uint32Array } | null = null;

  get size(): number {
    return this.#attributes.size;
  }

  set(id: number, rank: number): void {
    const held = this.#attributes.get(id) ?? 0;
    const next = (held | attributeBit(rank)) >>> 0;
    if (next === held) return;
    this.#attributes.set(id, next);
    this.#packed = null;
  }

  delete(id: number): boolean {
    if (!this.#attributes.delete(id)) return false;
    this.#packed = null;
    return true;
  }

  packed(): { ids: Int32Array; attributes: Uint32Array } {
    if (!this.#packed) {
      const ids = new Int32Array(this.#attributes.size);
      const attributes = new Uint32Array(this.#attributes.size);
      let i = 0;
      for (const [id, held] of this.#attributes) {
        ids[i] = id;
        attributes[i++] = held;
      }
      this.#packed = { ids, attributes };
    }
    return this.#packed;
  }
}

/** An attribute's bit in a set, by its position among the searchable attributes. */
function attributeBit(rank: number): number {
  return 1 << Math.min(rank, 31);
}

/** Position of the lowest set bit: the best attribute in a set. */
function lowestBit(set: number): number {
  return 31 - Math.clz32(set & -set);
}

// How a document matched a query word; a better match wins when several do.
const Quality = { None: 0, Typo: 1, Prefix: 2, Exact: 3 } as const;
type Quality = (typeof Quality)[keyof typeof Quality];

const SEPARATORS = /[^\p{L}\p{N}]+/u;
export const MAX_QUERY_WORDS = 10;

// eslint-disable-next-line no-control-regex -- the ASCII range starts at NUL
const NON_ASCII = /[^\u0000-\u007f]/;

/** Case- and accent-insensitive form used for terms and facet values, as Meilisearch normalizes. */
export function normalizeText(text: string): string {
  const lower = text.toLowerCase();
  // Decomposing is only needed to strip accents, and ASCII has none; this is the hot path.
  return NON_ASCII.test(lower) ? lower.normalize('NFKD').replace(/\p{M}/gu, '') : lower;
}

export function isPlainObject(value: unknown): value is Json {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function collectLeaves(value: unknown, out: Leaf[]): void {
  if (typeof value === 'string' || typeof value === 'number' || typeof value === 'boolean') {
    out.push(value);
  } else if (Array.isArray(value)) {
    for (const item of value) collectLeaves(item, out);
  } else if (isPlainObject(value)) {
    for (const item of Object.values(value)) collectLeaves(item, out);
  }
}

function collectAt(value: unknown, segments: string[], depth: number, out: Leaf[]): boolean {
  if (depth === segments.length) {
    collectLeaves(value, out);
    return true;
  }
  if (Array.isArray(value)) {
    let found = false;
    for (const item of value) found = collectAt(item, segments, depth, out) || found;
    return found;
  }
  if (!isPlainObject(value) || !Object.hasOwn(value, segments[depth])) return false;
  return collectAt(value[segments[depth]], segments, depth + 1, out);
}

/**
 * Scalar values at a dotted attribute path, flattening arrays and nested objects the way
 * Meilisearch flattens documents. `present` is true when the attribute exists, even if null.
 */
export function valuesAt(doc: Json, path: string): { present: boolean; leaves: Leaf[] } {
  const leaves: Leaf[] = [];
  const present = collectAt(doc, path.split('.'), 0, leaves);
  return { present, leaves };
}

function typoBudget(term: string, typo: TypoTolerance): number {
  if (!typo.enabled || typo.disableOnWords.some((word) => normalizeText(word) === term)) return 0;
  if (typo.disableOnNumbers && /^\d+$/.test(term)) return 0;
  if (term.length >= typo.minWordSizeForTypos.twoTypos) return 2;
  return term.length >= typo.minWordSizeForTypos.oneTypo ? 1 : 0;
}

// Meilisearch counts swapping two adjacent letters as one typo (Damerau-Levenshtein);
// minisearch's fuzzy lookup is plain Levenshtein, where a swap costs two.
function adjacentSwaps(term: string): string[] {
  const swaps = new Set<string>();
  for (let i = 0; i < term.length - 1; i++) {
    if (term[i] === term[i + 1]) continue;
    swaps.add(term.slice(0, i) + term[i + 1] + term[i] + term.slice(i + 2));
  }
  return [...swaps];
}

/** Per-document match quality of one query word, and the best attribute it matched in. */
class WordMatch {
  readonly quality: Uint8Array;
  /** The attributes the word matched in, per document (valid where quality is set). */
  readonly attributes: Uint32Array;

  /** `position` is the word's place in the query: each word has its own work arrays. */
  constructor(size: number, position: number) {
    this.quality = scratch.zeroedUint8(`word-quality-${position}`, size);
    this.attributes = scratch.uint32(`word-attributes-${position}`, size);
  }

  /** Marks the term's documents, counting only its occurrences in the `searchOn` attributes. */
  mark(postings: Postings | undefined, quality: Quality, searchOn: number): void {
    if (!postings) return;
    const { ids, attributes } = postings.packed();
    for (let i = 0; i < ids.length; i++) {
      const held = attributes[i] & searchOn;
      if (held === 0) continue;
      const id = ids[i];
      this.attributes[id] = this.quality[id] === Quality.None ? held : this.attributes[id] | held;
      if (quality > this.quality[id]) this.quality[id] = quality;
    }
  }
}

export class TextIndex {
  readonly #terms = new SearchableMap<Postings>();
  readonly #fields: string[];
  readonly #stopWords: Set<string>;

  constructor(fields: string[], stopWords: string[]) {
    this.#fields = fields;
    this.#stopWords = new Set(stopWords.map(normalizeText));
  }

  /** The set of the named attributes' positions, for `searchOn` (names must be among the fields). */
  attributeSet(names: string[]): number {
    let set = 0;
    this.#fields.forEach((field, rank) => {
      if (names.includes(field)) set |= attributeBit(rank);
    });
    return set >>> 0;
  }

  add(id: number, doc: Json): void {
    this.#fields.forEach((field, rank) => {
      for (const term of this.#termsOf(searchableText(doc, field))) {
        this.#terms.fetch(term, () => new Postings()).set(id, rank);
      }
    });
  }

  remove(id: number, doc: Json): void {
    for (const field of this.#fields) {
      for (const term of this.#termsOf(searchableText(doc, field))) {
        const postings = this.#terms.get(term);
        if (postings?.delete(id) && postings.size === 0) this.#terms.delete(term);
      }
    }
  }

  /**
   * Ranking signals of the documents matching the query, or null when the query has no
   * searchable words (then every document matches, as for a placeholder search). `size` is the
   * number of internal id slots. With the `last` strategy, documents matching only the first
   * words are included too, as Meilisearch drops query words from the end. The signal arrays
   * are work arrays of `slot`: they stay valid until the next search in the same slot (`null`:
   * arrays of its own).
   */
  search(query: string, size: number, options: TextSearchOptions, slot: number | null = 0): TextMatches | null {
    // Meilisearch only considers the first ten words of a query.
    const words = this.#termsOf(query).slice(0, MAX_QUERY_WORDS);
    if (words.length === 0) return null;
    const matches = words.map((word, i) => {
      const prefix = options.prefixSearch && i === words.length - 1;
      return this.#matchWord(word, i, size, prefix, typoBudget(word, options.typoTolerance), options.searchOn ?? ALL_ATTRIBUTES);
    });
    const fewestWords = options.matchingStrategy === 'all' ? words.length : 1;
    const ids = scratch.int32('text-ids', size);
    const result: TextMatches = {
      ids,
      // Signals are written for every matched id and only read for those: no zeroing needed.
      words: slot === null ? new Uint8Array(size) : scratch.uint8(`text-words-${slot}`, size),
      typos: slot === null ? new Uint8Array(size) : scratch.uint8(`text-typos-${slot}`, size),
      exact: slot === null ? new Uint8Array(size) : scratch.uint8(`text-exact-${slot}`, size),
      attribute: slot === null ? new Uint16Array(size) : scratch.uint16(`text-attribute-${slot}`, size),
      proximity: slot === null ? new Uint8Array(size) : scratch.uint8(`text-proximity-${slot}`, size),
      attributes: this.#fields.length,
    };
    const qualities = matches.map((match) => match.quality);
    const sets = matches.map((match) => match.attributes);
    const { words: wordsOf, typos: typosOf, exact: exactOf, attribute: attributeOf, proximity: proximityOf } = result;
    const first = qualities[0];
    let count = 0;
    if (qualities.length === 1) {
      // One word (most keystrokes): its match quality is the whole story.
      const firstSets = sets[0];
      for (let id = 0; id < size; id++) {
        const quality = first[id];
        if (quality === Quality.None) continue;
        ids[count++] = id;
        wordsOf[id] = 1;
        typosOf[id] = quality === Quality.Typo ? 1 : 0;
        exactOf[id] = quality === Quality.Exact ? 1 : 0;
        attributeOf[id] = lowestBit(firstSets[id]);
        proximityOf[id] = 0;
      }
    } else {
      for (let id = 0; id < size; id++) {
        if (first[id] === Quality.None) continue;
        let matched = 0;
        let typos = 0;
        let exact = 0;
        let anywhere = 0;
        let together = ALL_ATTRIBUTES;
        for (let w = 0; w < qualities.length; w++) {
          const quality = qualities[w][id];
          if (quality === Quality.None) break;
          matched++;
          if (quality === Quality.Typo) typos++;
          else if (quality === Quality.Exact) exact++;
          anywhere |= sets[w][id];
          together &= sets[w][id];
        }
        if (matched < fewestWords) continue;
        ids[count++] = id;
        wordsOf[id] = matched;
        typosOf[id] = typos;
        exactOf[id] = exact;
        attributeOf[id] = lowestBit(anywhere);
        proximityOf[id] = together === 0 ? 1 : 0;
      }
    }
    result.ids = ids.slice(0, count);
    return result;
  }

  // Only the query's final word is matched as a prefix, as in Meilisearch.
  #matchWord(word: string, position: number, size: number, prefix: boolean, budget: number, searchOn: number): WordMatch {
    const match = new WordMatch(size, position);
    match.mark(this.#terms.get(word), Quality.Exact, searchOn);
    if (prefix) {
      for (const [term, postings] of this.#terms.atPrefix(word)) {
        if (term !== word) match.mark(postings, Quality.Prefix, searchOn);
      }
    }
    if (budget === 0) return match;
    // Meilisearch counts a typo on the first letter as two.
    const typos = (term: string, edits: number) => edits + (term[0] === word[0] ? 0 : 1);
    for (const [term, [postings, edits]] of this.#terms.fuzzyGet(word, budget)) {
      if (edits > 0 && typos(term, edits) <= budget) match.mark(postings, Quality.Typo, searchOn);
    }
    for (const swapped of adjacentSwaps(word)) {
      for (const [term, [postings, edits]] of this.#terms.fuzzyGet(swapped, budget - 1)) {
        if (typos(term, edits + 1) <= budget) match.mark(postings, Quality.Typo, searchOn);
      }
    }
    return match;
  }

  #termsOf(text: string | undefined): string[] {
    if (!text) return [];
    return normalizeText(text)
      .split(SEPARATORS)
      .filter((term) => term !== '' && !this.#stopWords.has(term));
  }
}

function searchableText(doc: Json, field: string): string | undefined {
  const { leaves } = valuesAt(doc, field);
  return leaves.length ? leaves.join(' ') : undefined;
}
