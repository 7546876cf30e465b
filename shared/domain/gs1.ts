// GS1 element strings for the application identifiers our labels carry (GS1 General
// Specifications §3; the Barcode Syntax Dictionary gives each AI's format):
//   (00) SSCC, 18 digits · (01) GTIN, 14 digits · (10) batch, up to 20 · (21) serial, up to 20 ·
//   (400) the customer's order reference, up to 30.
// Fixed-length AIs run straight into the next; a variable-length field is ended by FNC1, which a
// scanner transmits as the group separator character (ASCII 29), unless it is the last field.
import { gs1CheckDigit } from './gtin.ts';

export const GS = '\u001d';

export type Gs1Ai = '00' | '01' | '10' | '21' | '400';
export interface Gs1Field {
  ai: Gs1Ai;
  value: string;
}

interface AiRule {
  fixed?: number;
  max: number;
  digits: boolean;
  title: string;
}
const AI_RULES: Record<Gs1Ai, AiRule> = {
  '00': { fixed: 18, max: 18, digits: true, title: 'SSCC' },
  '01': { fixed: 14, max: 14, digits: true, title: 'GTIN' },
  '10': { max: 20, digits: false, title: 'batch' },
  '21': { max: 20, digits: false, title: 'serial' },
  '400': { max: 30, digits: false, title: 'order reference' },
};
const AIS = Object.keys(AI_RULES).sort((a, b) => b.length - a.length) as Gs1Ai[];

/** GS1 AI encodable character set 82 (General Specifications figure 7.11-1). */
const CSET82 = /^[!"%&'()*+,\-./0-9:;<=>?A-Z_a-z]+$/;

/** Why a value cannot go into this AI, or null when it can. */
export function gs1FieldProblem({ ai, value }: Gs1Field): string | null {
  const rule = AI_RULES[ai];
  if (!value) return `(${ai}) ${rule.title} is empty.`;
  if (rule.fixed && value.length !== rule.fixed) return `(${ai}) ${rule.title} is ${rule.fixed} digits; got ${value.length}.`;
  if (value.length > rule.max) return `(${ai}) ${rule.title} is at most ${rule.max} characters; got ${value.length}.`;
  if (rule.digits ? !/^\d+$/.test(value) : !CSET82.test(value)) return `(${ai}) ${rule.title} has characters GS1 does not allow: "${value}".`;
  if (rule.digits && gs1CheckDigit(value.slice(0, -1)) !== Number(value.at(-1))) return `(${ai}) ${rule.title} ${value} has a wrong check digit.`;
  return null;
}

/** True for a value GS1 can carry as a serial or batch (AI 21 / 10). */
export function isGs1Text(value: string, ai: '10' | '21' = '21') {
  return gs1FieldProblem({ ai, value }) === null;
}

function checked(fields: Gs1Field[]) {
  if (fields.length === 0) throw new RangeError('A GS1 element string needs at least one field.');
  for (const f of fields) {
    const problem = gs1FieldProblem(f);
    if (problem) throw new RangeError(problem);
  }
  return fields;
}

/** The data as a scanner sends it: AIs and values, FNC1 as GS after each variable-length field but the last. */
export function gs1ElementString(fields: Gs1Field[]): string {
  return checked(fields)
    .map((f, i) => f.ai + f.value + (AI_RULES[f.ai].fixed || i === fields.length - 1 ? '' : GS))
    .join('');
}

/** The human-readable line under the bars: AIs in brackets (brackets are never encoded). */
export function gs1HumanReadable(fields: Gs1Field[]): string {
  return checked(fields)
    .map((f) => `(${f.ai})${f.value}`)
    .join('');
}

/** Symbology identifiers a scanner may put in front: GS1-128, GS1 QR, GS1 DataMatrix, GS1 DataBar. */
const SYMBOLOGY_PREFIX = /^\](C1|Q3|d2|e0)/;

/**
 * Reads a scanned GS1 element string (with or without a symbology identifier, with GS
 * separators) or its bracketed human-readable form. Null when the text is not GS1 data made of
 * the AIs we know, so a plain SKU or serial falls through to other readings.
 */
export function parseGs1(scanned: string): Gs1Field[] | null {
  const text = scanned.trim();
  if (text.startsWith('(')) return parseBracketed(text);
  const hadPrefix = SYMBOLOGY_PREFIX.test(text);
  let rest = text.replace(SYMBOLOGY_PREFIX, '');
  // Without a symbology identifier, only take text that opens with (00) or (01) as GS1: a plain
  // SKU or serial could begin "10" or "21" by chance.
  if (!hadPrefix && !/^0[01]\d/.test(rest)) return null;
  const fields: Gs1Field[] = [];
  while (rest.length) {
    const ai = AIS.find((a) => rest.startsWith(a));
    if (!ai) return null;
    const rule = AI_RULES[ai];
    rest = rest.slice(ai.length);
    let value: string;
    if (rule.fixed) {
      value = rest.slice(0, rule.fixed);
      rest = rest.slice(rule.fixed);
      if (rest.startsWith(GS)) rest = rest.slice(1);
    } else {
      const end = rest.indexOf(GS);
      value = end === -1 ? rest : rest.slice(0, end);
      rest = end === -1 ? '' : rest.slice(end + 1);
    }
    const field = { ai, value };
    if (gs1FieldProblem(field)) return null;
    fields.push(field);
  }
  return fields.length ? fields : null;
}

function parseBracketed(text: string): Gs1Field[] | null {
  const re = /\((\d{2,4})\)([^(]*)/gy;
  const fields: Gs1Field[] = [];
  let m: RegExpExecArray | null;
  let consumed = 0;
  while ((m = re.exec(text))) {
    const ai = m[1] as Gs1Ai;
    if (!(ai in AI_RULES)) return null;
    const field = { ai, value: m[2]!.trim() };
    if (gs1FieldProblem(field)) return null;
    fields.push(field);
    consumed = re.lastIndex;
  }
  return fields.length && consumed === text.length ? fields : null;
}

/** The first value for an AI, if present. */
export function gs1Value(fields: Gs1Field[], ai: Gs1Ai): string | undefined {
  return fields.find((f) => f.ai === ai)?.value;
}
