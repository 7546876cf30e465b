import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import bwipjs from 'bwip-js/node';
import { gs1CheckDigit, isValidGtin, isValidSscc, makeSscc, normalizeGtin14 } from '../../shared/domain/gtin.ts';

// bwip-js (BWIPP) validates GS1 check digits itself, so it serves as an outside referee.
function bwippAccepts(bcid: string, text: string): boolean {
  try {
    bwipjs.toSVG({ bcid, text });
    return true;
  } catch {
    return false;
  }
}

const digitString = (length: number) => fc.array(fc.integer({ min: 0, max: 9 }), { minLength: length, maxLength: length }).map((d) => d.join(''));

describe('gs1CheckDigit', () => {
  it('matches the published worked examples', () => {
    expect(gs1CheckDigit('629104150021')).toBe(3); // GS1 General Specifications §7.9.1 worked example
    expect(gs1CheckDigit('501234567890')).toBe(0); // GS1 UK check digit example
    expect(gs1CheckDigit('501234567421')).toBe(6); // GS1 UK check digit example
    expect(gs1CheckDigit('730001100001')).toBe(7); // GS1 Sweden check digit example
  });

  it('refuses anything but digits', () => {
    expect(() => gs1CheckDigit('62910415002X')).toThrow(RangeError);
    expect(() => gs1CheckDigit('')).toThrow(RangeError);
  });
});

describe('isValidGtin', () => {
  it('accepts GTIN-8, -12, -13 and -14 with correct check digits', () => {
    expect(isValidGtin('96385074')).toBe(true); // EAN-8 example, from memory; bwip-js agrees below
    expect(bwippAccepts('ean8', '96385074')).toBe(true); // bwip-js (BWIPP) check-digit validation
    expect(isValidGtin('036000291452')).toBe(true); // UPC-A example, from memory; bwip-js agrees below
    expect(bwippAccepts('upca', '036000291452')).toBe(true); // bwip-js (BWIPP) check-digit validation
    expect(isValidGtin('6291041500213')).toBe(true); // GS1 General Specifications §7.9.1 worked example + its check digit 3
    expect(isValidGtin('06291041500213')).toBe(true); // GS1: a GTIN-13 left-padded with 0 is the same GTIN-14
    expect(bwippAccepts('gs1-128', '(01)06291041500213')).toBe(true); // bwip-js (BWIPP) AI (01) validation
  });

  it('rejects wrong check digits, lengths and characters', () => {
    expect(isValidGtin('6291041500214')).toBe(false); // GS1 §7.9.1 example with the check digit off by one
    expect(bwippAccepts('gs1-128', '(01)06291041500214')).toBe(false); // bwip-js (BWIPP) refuses it too
    expect(isValidGtin('62910415002')).toBe(false); // 11 digits is no GTIN length (GS1 General Specifications)
    expect(isValidGtin('629104150021 3')).toBe(false);
    expect(isValidGtin('')).toBe(false);
  });

  it('validates any digits followed by their computed check digit (property)', () => {
    fc.assert(
      fc.property(fc.constantFrom(7, 11, 12, 13).chain(digitString), (body) => {
        expect(isValidGtin(body + gs1CheckDigit(body))).toBe(true); // GS1 §7.9.1 rule applied to random bodies
      }),
    );
  });

  it('catches every single-digit change (property)', () => {
    // Weights 1 and 3 are both coprime to 10, so mod-10 sees any one-digit error (GS1 §7.9.1).
    const arb = fc.constantFrom(7, 11, 12, 13).chain((length) =>
      fc.tuple(digitString(length), fc.nat({ max: length }), fc.integer({ min: 1, max: 9 })),
    );
    fc.assert(
      fc.property(arb, ([body, position, bump]) => {
        const code = body + gs1CheckDigit(body);
        const changed = (Number(code[position]) + bump) % 10;
        const altered = code.slice(0, position) + changed + code.slice(position + 1);
        expect(isValidGtin(altered)).toBe(false); // GS1 §7.9.1: single-digit errors are always detected
      }),
    );
  });
});

describe('normalizeGtin14', () => {
  it('pads to 14 digits and ignores printed spaces', () => {
    expect(normalizeGtin14('6291041500213')).toBe('06291041500213'); // GS1: GTIN-13 in a 14-digit field gets a leading 0
    expect(normalizeGtin14('6 291041 500213')).toBe('06291041500213'); // same GTIN as printed under an EAN-13
    expect(normalizeGtin14('96385074')).toBe('00000096385074'); // EAN-8 example, from memory
  });

  it('returns null for a code that is not a GTIN', () => {
    expect(normalizeGtin14('6291041500214')).toBeNull();
    expect(normalizeGtin14('abc')).toBeNull();
  });
});

describe('SSCC', () => {
  it('builds an 18-digit SSCC that an outside encoder accepts', () => {
    // 0614141 is the company prefix GS1 uses in its own documentation (from memory).
    const sscc = makeSscc({ extension: 1, companyPrefix: '0614141', serialReference: 123456789 });
    expect(sscc).toBe('106141411234567897'); // check digit by GS1 §7.9.1; bwip-js agrees below
    expect(bwippAccepts('gs1-128', `(00)${sscc}`)).toBe(true); // bwip-js (BWIPP) AI (00) validation
    expect(isValidSscc(sscc)).toBe(true);
  });

  it('pads the serial reference to fill 17 data digits', () => {
    const sscc = makeSscc({ extension: '0', companyPrefix: '629104', serialReference: '42' });
    expect(sscc).toHaveLength(18); // GS1: SSCC is 18 digits
    expect(sscc.slice(0, 17)).toBe('06291040000000042'); // extension + prefix + zero-padded serial (GS1 SSCC layout)
    expect(bwippAccepts('gs1-128', `(00)${sscc}`)).toBe(true); // bwip-js (BWIPP) AI (00) validation
  });

  it('refuses parts that cannot form an SSCC', () => {
    expect(() => makeSscc({ extension: 10, companyPrefix: '0614141', serialReference: 1 })).toThrow(RangeError);
    expect(() => makeSscc({ extension: 1, companyPrefix: '061', serialReference: 1 })).toThrow(RangeError);
    expect(() => makeSscc({ extension: 1, companyPrefix: '0614141', serialReference: '1234567890' })).toThrow(RangeError);
    expect(() => makeSscc({ extension: 1, companyPrefix: '0614141', serialReference: -1 })).toThrow(RangeError);
  });

  it('rejects a wrong check digit or length', () => {
    expect(isValidSscc('106141411234567898')).toBe(false); // GS1 §7.9.1: check digit should be 7
    expect(bwippAccepts('gs1-128', '(00)106141411234567898')).toBe(false); // bwip-js (BWIPP) refuses it too
    expect(isValidSscc('10614141123456789')).toBe(false);
  });

  it('always validates what it builds, and catches any one-digit change (property)', () => {
    const arb = fc.tuple(
      fc.integer({ min: 0, max: 9 }),
      fc.integer({ min: 6, max: 12 }).chain(digitString),
      fc.nat({ max: 17 }),
      fc.integer({ min: 1, max: 9 }),
    );
    fc.assert(
      fc.property(arb, ([extension, companyPrefix, position, bump]) => {
        const serialReference = '7'.repeat(16 - companyPrefix.length);
        const sscc = makeSscc({ extension, companyPrefix, serialReference });
        expect(isValidSscc(sscc)).toBe(true); // GS1 §7.9.1 applied to SSCC-18
        const changed = (Number(sscc[position]) + bump) % 10;
        expect(isValidSscc(sscc.slice(0, position) + changed + sscc.slice(position + 1))).toBe(false); // GS1 §7.9.1
      }),
    );
  });
});
