// Meilisearch filter expressions for the search stand-in: a parser for the string syntax
// (grammar of meilisearch's crates/filter-parser) and the array form, and an evaluator that
// answers each condition from the per-attribute value maps.

import { MeiliError } from './standin-errors.ts';
import { parseNumber, type DocBits, type FacetField } from './standin-facets.ts';

type Comparison = '=' | '>' | '>=' | '<' | '<=';

export type FilterNode =
  | { kind: 'and' | 'or'; children: FilterNode[] }
  | { kind: 'not'; child: FilterNode }
  | { kind: 'compare'; attribute: string; op: Comparison; value: string }
  | { kind: 'range'; attribute: string; from: string; to: string }
  | { kind: 'in'; attribute: string; values: string[] }
  | { kind: 'exists'; attribute: string };

type Token = { kind: 'word' | 'quoted' | 'symbol'; text: string; at: number };

// Keywords are case-sensitive in Meilisearch, and reserved: they cannot be unquoted values.
const KEYWORDS = new Set([
  'AND', 'OR', 'IN', 'NOT', 'TO', 'EXISTS', 'IS', 'NULL', 'EMPTY', 'CONTAINS', 'STARTS', 'WITH',
  '_geoRadius', '_geoBoundingBox', '_geoPoint',
]);
const UNSUPPORTED = new Set(['IS', 'CONTAINS', 'STARTS', '_geoRadius', '_geoBoundingBox', '_geoPoint']);
const SYMBOLS = ['!=', '>=', '<=', '=', '>', '<', '(', ')', '[', ']', ','];
const COMPARISONS = new Set(['=', '!=', '>', '>=', '<', '<=']);
const WORD = /[\p{L}\p{N}_.-]+/uy;

function syntaxError(code: string, message: string, input: string, at: number): MeiliError {
  return new MeiliError(400, code, `${message} at position ${at + 1} in \`${input}\`.`);
}

function readQuoted(input: string, start: number, code: string): { text: string; end: number } {
  const quote = input[start];
  let text = '';
  for (let i = start + 1; i < input.length; i++) {
    const char = input[i];
    if (char === quote) return { text, end: i + 1 };
    if (char === '\\' && i + 1 < input.length) i++;
    text += input[i];
  }
  throw syntaxError(code, `Expression is missing the closing \`${quote}\``, input, start);
}

function wordAt(input: string, at: number): string | undefined {
  WORD.lastIndex = at;
  return WORD.exec(input)?.[0];
}

function tokenize(input: string, code: string): Token[] {
  const tokens: Token[] = [];
  let i = 0;
  while (i < input.length) {
    const char = input[i];
    if (/\s/.test(char)) {
      i++;
    } else if (char === '"' || char === "'") {
      const { text, end } = readQuoted(input, i, code);
      tokens.push({ kind: 'quoted', text, at: i });
      i = end;
    } else {
      const symbol = SYMBOLS.find((s) => input.startsWith(s, i));
      const text = symbol ?? wordAt(input, i);
      if (!text) throw syntaxError(code, `Unexpected character \`${char}\``, input, i);
      tokens.push({ kind: symbol ? 'symbol' : 'word', text, at: i });
      i += text.length;
    }
  }
  return tokens;
}

class Parser {
  #pos = 0;

  constructor(
    readonly input: string,
    readonly tokens: Token[],
    readonly code: string,
  ) {}

  parse(): FilterNode {
    const node = this.#or();
    const rest = this.#peek();
    if (rest) throw this.#error(`Found unexpected \`${rest.text}\``, rest);
    return node;
  }

  #or(): FilterNode {
    const children = [this.#and()];
    while (this.#acceptKeyword('OR')) children.push(this.#and());
    return children.length === 1 ? children[0] : { kind: 'or', children };
  }

  #and(): FilterNode {
    const children = [this.#not()];
    while (this.#acceptKeyword('AND')) children.push(this.#not());
    return children.length === 1 ? children[0] : { kind: 'and', children };
  }

  #not(): FilterNode {
    if (this.#acceptKeyword('NOT')) return { kind: 'not', child: this.#not() };
    if (this.#acceptSymbol('(')) {
      const node = this.#or();
      this.#expectSymbol(')');
      return node;
    }
    return this.#condition();
  }

  #condition(): FilterNode {
    this.#rejectUnsupported();
    const attribute = this.#value('an attribute');
    const next = this.#peek();
    if (next?.kind === 'symbol' && COMPARISONS.has(next.text)) {
      this.#pos++;
      const value = this.#value('a value');
      if (next.text === '!=') return { kind: 'not', child: { kind: 'compare', attribute, op: '=', value } };
      return { kind: 'compare', attribute, op: next.text as Comparison, value };
    }
    if (this.#acceptKeyword('IN')) return { kind: 'in', attribute, values: this.#list() };
    if (this.#acceptKeyword('EXISTS')) return { kind: 'exists', attribute };
    if (this.#acceptKeyword('NOT')) {
      if (this.#acceptKeyword('IN')) return { kind: 'not', child: { kind: 'in', attribute, values: this.#list() } };
      if (this.#acceptKeyword('EXISTS')) return { kind: 'not', child: { kind: 'exists', attribute } };
      this.#rejectUnsupported();
      throw this.#error('Was expecting `IN` or `EXISTS` after `NOT`', this.#peek());
    }
    this.#rejectUnsupported();
    if (next && (next.kind === 'quoted' || (next.kind === 'word' && !KEYWORDS.has(next.text)))) {
      const from = this.#value('a value');
      if (!this.#acceptKeyword('TO')) throw this.#error('Was expecting `TO`', this.#peek());
      return { kind: 'range', attribute, from, to: this.#value('a value') };
    }
    throw this.#error(
      'Was expecting an operation `=`, `!=`, `>=`, `>`, `<=`, `<`, `IN`, `NOT IN`, `TO`, `EXISTS` or `NOT EXISTS`',
      next,
    );
  }

  #list(): string[] {
    this.#expectSymbol('[');
    const values: string[] = [];
    while (!this.#acceptSymbol(']')) {
      values.push(this.#value('a value'));
      if (!this.#acceptSymbol(',')) {
        this.#expectSymbol(']');
        break;
      }
    }
    return values;
  }

  #value(expected: string): string {
    const token = this.#peek();
    if (!token || token.kind === 'symbol' || (token.kind === 'word' && KEYWORDS.has(token.text))) {
      throw this.#error(`Was expecting ${expected}`, token);
    }
    this.#pos++;
    return token.text;
  }

  #rejectUnsupported(): void {
    const token = this.#peek();
    if (token?.kind === 'word' && UNSUPPORTED.has(token.text)) {
      throw this.#error(`\`${token.text}\` filters are not supported by the search stand-in`, token);
    }
  }

  #peek(): Token | undefined {
    return this.tokens[this.#pos];
  }

  #acceptKeyword(keyword: string): boolean {
    const token = this.#peek();
    if (token?.kind !== 'word' || token.text !== keyword) return false;
    this.#pos++;
    return true;
  }

  #acceptSymbol(symbol: string): boolean {
    const token = this.#peek();
    if (token?.kind !== 'symbol' || token.text !== symbol) return false;
    this.#pos++;
    return true;
  }

  #expectSymbol(symbol: string): void {
    if (!this.#acceptSymbol(symbol)) throw this.#error(`Was expecting \`${symbol}\``, this.#peek());
  }

  #error(message: string, token: Token | undefined): MeiliError {
    return syntaxError(this.code, message, this.input, token?.at ?? this.input.length);
  }
}

function parseFilterString(input: string, code: string): FilterNode | null {
  if (input.trim() === '') return null;
  return new Parser(input, tokenize(input, code), code).parse();
}

function invalidFilterType(code: string): MeiliError {
  return new MeiliError(
    400,
    code,
    'Invalid syntax for the filter parameter: `expected String, Array of Strings, or Array of Arrays of Strings`.',
  );
}

/**
 * Parses a filter in either Meilisearch form: a string expression, or an array whose elements
 * are ANDed together and whose inner arrays are ORed. Returns null for an empty filter.
 */
export function parseFilter(filter: unknown, code: string): FilterNode | null {
  if (filter === null || filter === undefined) return null;
  if (typeof filter === 'string') return parseFilterString(filter, code);
  if (!Array.isArray(filter)) throw invalidFilterType(code);
  const children = filter.flatMap((item: unknown): FilterNode[] => {
    if (typeof item === 'string') return nonNull(parseFilterString(item, code));
    if (!Array.isArray(item)) throw invalidFilterType(code);
    const alternatives = item.flatMap((inner: unknown) => {
      if (typeof inner !== 'string') throw invalidFilterType(code);
      return nonNull(parseFilterString(inner, code));
    });
    if (alternatives.length === 0) return [];
    return [alternatives.length === 1 ? alternatives[0] : { kind: 'or', children: alternatives }];
  });
  if (children.length === 0) return null;
  return children.length === 1 ? children[0] : { kind: 'and', children };
}

function nonNull(node: FilterNode | null): FilterNode[] {
  return node ? [node] : [];
}

export type FilterSource = {
  /** 1 at the internal id of every live document. */
  live: DocBits;
  /** Value map of a filterable attribute; throws when the attribute is not filterable. */
  field(attribute: string): FacetField;
};

function bitsOfSets(sets: Iterable<number>[], size: number): DocBits {
  const bits = new Uint8Array(size);
  for (const ids of sets) for (const id of ids) bits[id] = 1;
  return bits;
}

function comparisonSets(field: FacetField, op: Comparison, value: string): Iterable<number>[] {
  if (op === '=') return field.equalTo(value);
  const number = parseNumber(value);
  if (number === undefined) return [];
  if (op === '>') return [field.between(number, Infinity, false, true)];
  if (op === '>=') return [field.between(number, Infinity, true, true)];
  if (op === '<') return [field.between(-Infinity, number, true, false)];
  return [field.between(-Infinity, number, true, true)];
}

function rangeSets(field: FacetField, from: string, to: string): Iterable<number>[] {
  const min = parseNumber(from);
  const max = parseNumber(to);
  return min === undefined || max === undefined ? [] : [field.between(min, max, true, true)];
}

const FEW_DOCUMENTS = 1024;

/**
 * The documents of a filter made only of equalities joined by OR (`sku = X OR gtin = Y`), in id
 * order, straight from the value maps; null for any other filter, or when the values hold more
 * than a few documents. Building document-wide bitmaps for a few documents costs more than the answer.
 */
export function idsOfEqualities(node: FilterNode, source: FilterSource): Int32Array | null {
  const sets: Set<number>[] = [];
  const collect = (n: FilterNode): boolean => {
    if (n.kind === 'or') return n.children.every(collect);
    if (n.kind !== 'compare' || n.op !== '=') return false;
    sets.push(...source.field(n.attribute).equalTo(n.value));
    return true;
  };
  // A value most documents share (`archived = false`) is cheaper through the bitmaps.
  if (!collect(node) || sets.reduce((total, set) => total + set.size, 0) > FEW_DOCUMENTS) return null;
  const ids = new Set<number>();
  for (const set of sets) for (const id of set) if (source.live[id]) ids.add(id);
  return Int32Array.from(ids).sort();
}

export function evaluateFilter(node: FilterNode, source: FilterSource): DocBits {
  const size = source.live.length;
  switch (node.kind) {
    case 'and':
    case 'or': {
      const [result, ...rest] = node.children.map((child) => evaluateFilter(child, source));
      for (const bits of rest) {
        if (node.kind === 'and') for (let i = 0; i < size; i++) result[i] &= bits[i];
        else for (let i = 0; i < size; i++) result[i] |= bits[i];
      }
      return result;
    }
    case 'not': {
      const bits = evaluateFilter(node.child, source);
      for (let i = 0; i < size; i++) bits[i] = source.live[i] & (bits[i] ^ 1);
      return bits;
    }
    case 'compare':
      return bitsOfSets(comparisonSets(source.field(node.attribute), node.op, node.value), size);
    case 'range':
      return bitsOfSets(rangeSets(source.field(node.attribute), node.from, node.to), size);
    case 'in': {
      const field = source.field(node.attribute);
      return bitsOfSets(node.values.flatMap((value) => field.equalTo(value)), size);
    }
    case 'exists':
      return bitsOfSets([source.field(node.attribute).present], size);
  }
}
