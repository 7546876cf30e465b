// Meilisearch's filter expressions, as far as the app writes them: `attr = value`, `attr != value`,
// `attr IN [a, b]`, NOT, AND, OR and parentheses, or the array form (outer AND, inner OR). Each
// filter becomes a plain predicate checked against each document.

import { MeiliError } from './errors.ts';
import { isScalar, valuesAt, type Doc } from './documents.ts';

export type Predicate = (doc: Doc) => boolean;

const TOKEN = /\s*("(?:[^"\\]|\\.)*"|'(?:[^'\\]|\\.)*'|!=|[()[\],=]|[^\s()[\],=!"']+)/y;

function tokenize(text: string): string[] {
  const tokens: string[] = [];
  let match: RegExpExecArray | null;
  let end = 0;
  for (TOKEN.lastIndex = 0; (match = TOKEN.exec(text)); end = TOKEN.lastIndex) tokens.push(match[1]!);
  const rest = text.slice(end).trim();
  if (rest !== '') throw syntax(`unexpected \`${rest}\``);
  return tokens;
}

function syntax(detail: string): MeiliError {
  return new MeiliError(400, 'invalid_search_filter', `Was expecting an operation \`=\`, \`!=\`, \`IN\` or a boolean operator: ${detail}.`);
}

const unquote = (token: string) => (/^["']/.test(token) ? token.slice(1, -1).replace(/\\(.)/g, '$1') : token);
const keyword = (token: string | undefined, word: string) => token?.toUpperCase() === word;

/** A leaf equals a filter value (given in lower case) as Meilisearch compares them: numbers as numbers, text case-insensitively. */
function equals(leaf: unknown, value: string): boolean {
  if (typeof leaf === 'number') return value.trim() !== '' && Number(value) === leaf;
  const text = String(leaf); // lower case keeps the length of the letters and digits codes are made of
  return text.length === value.length && text.toLowerCase() === value;
}

/** Recursive descent over the tokens of one filter string. */
class Parser {
  #at = 0;
  constructor(
    readonly tokens: string[],
    readonly filterable: string[],
  ) {}

  parse(): Predicate {
    const predicate = this.#or();
    if (this.#at < this.tokens.length) throw syntax(`unexpected \`${this.tokens[this.#at]}\``);
    return predicate;
  }

  #next(): string {
    const token = this.tokens[this.#at++];
    if (token === undefined) throw syntax('the filter ends too early');
    return token;
  }

  /** Operands joined by a boolean keyword: `a OR b OR c`. */
  #joined(word: string, operand: () => Predicate): Predicate[] {
    const parts = [operand()];
    while (keyword(this.tokens[this.#at], word)) {
      this.#at++;
      parts.push(operand());
    }
    return parts;
  }

  #or(): Predicate {
    const parts = this.#joined('OR', () => this.#and());
    return parts.length === 1 ? parts[0]! : (doc) => parts.some((p) => p(doc));
  }

  #and(): Predicate {
    const parts = this.#joined('AND', () => this.#not());
    return parts.length === 1 ? parts[0]! : (doc) => parts.every((p) => p(doc));
  }

  #not(): Predicate {
    if (!keyword(this.tokens[this.#at], 'NOT')) return this.#primary();
    this.#at++;
    const inner = this.#not();
    return (doc) => !inner(doc);
  }

  #primary(): Predicate {
    const token = this.#next();
    if (token === '(') {
      const inner = this.#or();
      if (this.#next() !== ')') throw syntax('a `(` is not closed');
      return inner;
    }
    const attribute = unquote(token);
    if (!this.filterable.includes(attribute)) {
      throw new MeiliError(400, 'invalid_search_filter', `Attribute \`${attribute}\` is not filterable. Available filterable attributes are: \`${this.filterable.join(', ')}\`.`);
    }
    const operator = this.#next();
    const has = (values: string[]) => {
      const wanted = values.map((v) => v.toLowerCase());
      return (doc: Doc) => {
        const value = doc[attribute];
        return isScalar(value) ? wanted.some((v) => equals(value, v)) : valuesAt(doc, attribute).some((leaf) => wanted.some((v) => equals(leaf, v)));
      };
    };
    if (operator === '=') return has([unquote(this.#next())]);
    if (operator === '!=') {
      const equal = has([unquote(this.#next())]);
      return (doc) => !equal(doc);
    }
    if (keyword(operator, 'IN') && this.#next() === '[') {
      const values: string[] = [];
      for (let t = this.#next(); t !== ']'; t = this.#next()) if (t !== ',') values.push(unquote(t));
      return has(values);
    }
    throw syntax(`\`${operator}\` after \`${attribute}\``);
  }
}

/** The filter parameter (a string, or arrays of strings: outer AND, inner OR) as one predicate; null when empty. */
export function parseFilter(filter: unknown, filterable: string[]): Predicate | null {
  if (filter === undefined || filter === null || filter === '') return null;
  if (typeof filter === 'string') return new Parser(tokenize(filter), filterable).parse();
  if (!Array.isArray(filter)) throw new MeiliError(400, 'invalid_search_filter', 'Invalid syntax for the filter parameter: expected a string or an array.');
  const all = filter.map((item) => (Array.isArray(item) ? item.map((inner) => parseFilter(inner, filterable)) : [parseFilter(item, filterable)]));
  const groups = all.map((group) => group.filter((p): p is Predicate => p !== null)).filter((group) => group.length > 0);
  return groups.length === 0 ? null : (doc) => groups.every((group) => group.some((p) => p(doc)));
}
