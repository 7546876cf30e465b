// Text matching for the stand-in: minisearch finds the documents for each query word (its own
// exact, prefix and fuzzy lookups); this file adds what Meilisearch does around them — a swapped
// pair of letters as one typo, synonyms from the settings, a word split in two ("endcap" → "end cap")
// or two words joined ("end plate" → "endplate") — and reports, per document, the signals
// Meilisearch's default ranking rules sort by (words, typo, proximity, attribute, exactness).

import MiniSearch, { type Query } from 'minisearch';
import { valuesAt, words, type Doc } from './documents.ts';

/** How well a document matched one query word: as typed, derived (prefix, synonym, split/join), or with a typo. */
const EXACT = 3;
const DERIVED = 2;
const TYPO = 1;

/** Per matched document: the signals of Meilisearch's ranking rules (lower attribute/proximity/typos rank first). */
export type TextMatch = { words: number; typos: number; exact: number; attribute: number; proximity: number };
type WordHit = { quality: number; fields: string[] };

// Meilisearch reads only the first ten words of a query.
const MAX_QUERY_WORDS = 10;

/** A minisearch index over the searchable attributes, each attribute's values joined into one text. */
export function createTextIndex(fields: string[], primaryKey: string): MiniSearch<Doc> {
  return new MiniSearch<Doc>({
    idField: primaryKey,
    fields,
    extractField: (doc, field) => (field === primaryKey ? doc[field] : valuesAt(doc, field).join(' ')),
    tokenize: words,
    processTerm: (term) => term,
  });
}

// Meilisearch's default typo tolerance: one typo from 5 letters, two from 9.
const typoBudget = (word: string) => (word.length >= 9 ? 2 : word.length >= 5 ? 1 : 0);

/** The word with one pair of neighbouring letters swapped: one typo for Meilisearch, two edits for minisearch. */
function swaps(word: string): string[] {
  const out = new Set<string>();
  for (let i = 0; i + 1 < word.length; i++) if (word[i] !== word[i + 1]) out.add(word.slice(0, i) + word[i + 1] + word[i] + word.slice(i + 2));
  return [...out];
}

/** The documents matching query word `i`, with how well and in which attributes. */
function matchWord(text: MiniSearch<Doc>, query: string[], i: number, options: TextOptions): Map<string, WordHit> {
  const word = query[i]!;
  const last = i === query.length - 1; // only the last word is a prefix, as in Meilisearch
  const budget = typoBudget(word);
  const swapped = budget > 0 ? swaps(word) : [];
  // Two query words joined, as Meilisearch tries them; the join with the last word may be a prefix.
  const joins = [i > 0 ? { term: query[i - 1] + word, prefix: last } : null, !last ? { term: word + query[i + 1], prefix: i + 2 === query.length } : null].filter((j) => j !== null);
  const splits = word.length >= 4 ? Array.from({ length: word.length - 3 }, (_, k) => [word.slice(0, k + 2), word.slice(k + 2)]) : [];
  const synonyms = (options.synonyms[word] ?? []).map(words).filter((s) => s.length > 0);
  const phrases = [...synonyms, ...splits];

  const tree: Query = {
    combineWith: 'OR',
    queries: [
      { queries: [word], prefix: last, fuzzy: budget },
      ...[...swapped.map((term) => ({ term, prefix: last })), ...joins].map(({ term, prefix }) => ({ queries: [term], prefix, fuzzy: 0 })),
      ...phrases.map((phrase) => ({ queries: [phrase.join(' ')], combineWith: 'AND', prefix: false, fuzzy: 0 })),
    ],
  };
  const derived = new Set([...phrases.flat(), ...joins.map((j) => j.term)]);
  const prefixes = [...(last ? [word] : []), ...joins.filter((j) => j.prefix).map((j) => j.term)];
  const quality = (term: string) => {
    if (term === word) return EXACT;
    if (derived.has(term) || prefixes.some((p) => term.startsWith(p))) return DERIVED;
    if (swapped.some((s) => term === s || (last && term.startsWith(s)))) return TYPO;
    // Otherwise a fuzzy match: Meilisearch counts a wrong first letter as two typos.
    return term[0] === word[0] || budget > 1 ? TYPO : 0;
  };

  const qualities = new Map<string, number>(); // the same terms recur across documents
  const hits = new Map<string, WordHit>();
  for (const result of text.search(tree, { fields: options.searchOn })) {
    const hit: WordHit = { quality: 0, fields: [] };
    for (const term in result.match) {
      const q = qualities.get(term) ?? qualities.set(term, quality(term)).get(term)!;
      if (q === 0) continue;
      hit.quality = Math.max(hit.quality, q);
      for (const field of result.match[term]!) if (!hit.fields.includes(field)) hit.fields.push(field);
    }
    if (hit.quality > 0) hits.set(String(result.id), hit);
  }
  return hits;
}

export type TextOptions = {
  /** The searchable attributes, in ranking order. */
  searchable: string[];
  /** The attributes to match in (attributesToSearchOn), all searchable ones by default. */
  searchOn: string[];
  synonyms: Record<string, string[]>;
};

/**
 * The documents matching a query, by id, with their ranking signals; null for a query without
 * words (every document matches). As Meilisearch's default `last` matching strategy, a document
 * must match the first word and matches as many words as it holds from the start of the query.
 */
export function matchText(text: MiniSearch<Doc>, q: string, options: TextOptions): Map<string, TextMatch> | null {
  const query = words(q).slice(0, MAX_QUERY_WORDS);
  if (query.length === 0) return null;
  const perWord = query.map((_, i) => matchWord(text, query, i, options));
  const rank = (field: string) => options.searchable.indexOf(field);
  const matches = new Map<string, TextMatch>();
  for (const id of perWord[0]!.keys()) {
    const match: TextMatch = { words: 0, typos: 0, exact: 0, attribute: Infinity, proximity: 0 };
    let together: string[] | null = null;
    for (const hits of perWord) {
      const hit = hits.get(id);
      if (!hit) break;
      match.words++;
      if (hit.quality === TYPO) match.typos++;
      if (hit.quality === EXACT) match.exact++;
      for (const field of hit.fields) match.attribute = Math.min(match.attribute, rank(field));
      together = together ? together.filter((f) => hit.fields.includes(f)) : hit.fields;
    }
    // No word positions here: "close together" is approximated as "all in one attribute".
    match.proximity = together!.length > 0 ? 0 : 1;
    matches.set(id, match);
  }
  return matches;
}
