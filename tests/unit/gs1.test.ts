import { describe, expect, it } from 'vitest';
import bwipjs from 'bwip-js/node';
import { GS, gs1ElementString, gs1FieldProblem, gs1HumanReadable, parseGs1 } from '../../shared/domain/gs1.ts';
import { gs1CheckDigit, isValidSscc, makeSscc } from '../../shared/domain/gtin.ts';
import { readScan } from '../../shared/domain/warehouse.ts';
import { parcelCount, orderReferenceOf } from '../../server/services/labels.ts';
import { decodePng } from '../support/barcodes.ts';

describe('SSCC check digits', () => {
  it('match the GS1 worked examples (domain.md §6) and the mod-10 rule for SSCC-18', () => {
    expect(gs1CheckDigit('629104150021')).toBe(3); // GS1 General Specifications §7.9.1 worked example
    expect(gs1CheckDigit('730001100001')).toBe(7); // GS1 Sweden worked example
    // GS1 General Specifications' SSCC example "(00) 1 0614141 123456789 7" — from memory; bwip-js (BWIPP) checks it below
    expect(makeSscc({ extension: 1, companyPrefix: '0614141', serialReference: 123456789 })).toBe('106141411234567897');
    expect(() => bwipjs.toSVG({ bcid: 'gs1-128', text: '(00)106141411234567897' })).not.toThrow(); // BWIPP's own AI (00) check-digit lint
    expect(() => bwipjs.toSVG({ bcid: 'gs1-128', text: '(00)106141411234567890' })).toThrow(); // BWIPP refuses a wrong check digit
    expect(isValidSscc('106141411234567897')).toBe(true);
  });
});

describe('GS1 element strings', () => {
  it('puts FNC1 (as GS) after variable-length fields but not after fixed ones or the last', () => {
    // GS1 General Specifications §7.8.5.2: pre-defined length AIs (00, 01) need no separator; others do unless last.
    const fields = [
      { ai: '01', value: '09501101530003' },
      { ai: '21', value: 'SN-0042' },
      { ai: '400', value: 'BG-2041' },
    ] as const;
    expect(gs1ElementString([...fields])).toBe(`0109501101530003` + `21SN-0042${GS}` + `400BG-2041`);
    expect(gs1HumanReadable([...fields])).toBe('(01)09501101530003(21)SN-0042(400)BG-2041');
    expect(gs1ElementString([{ ai: '00', value: '106141411234567897' }])).toBe('00106141411234567897');
  });

  it('refuses what the Barcode Syntax Dictionary refuses: wrong lengths, check digits, characters', () => {
    // GS1 Barcode Syntax Dictionary: 01 N14 csum; 21 X..20 cset82; 400 X..30 cset82
    expect(gs1FieldProblem({ ai: '01', value: '09501101530004' })).toMatch(/check digit/);
    expect(gs1FieldProblem({ ai: '01', value: '9501101530003' })).toMatch(/14 digits/);
    expect(gs1FieldProblem({ ai: '21', value: 'X'.repeat(21) })).toMatch(/at most 20/);
    expect(gs1FieldProblem({ ai: '21', value: 'SN 1' })).toMatch(/characters/);
    expect(gs1FieldProblem({ ai: '400', value: 'P'.repeat(30) })).toBeNull();
    expect(() => gs1ElementString([])).toThrow(RangeError);
  });

  it('reads back what it writes, from a scanner (with ]C1 and GS) or typed with brackets', () => {
    const fields = [
      { ai: '01', value: '09501101530003' },
      { ai: '10', value: 'LOT7' },
      { ai: '21', value: 'A1' },
    ] as const;
    const element = gs1ElementString([...fields]);
    expect(parseGs1(`]C1${element}`)).toEqual(fields);
    expect(parseGs1(element)).toEqual(fields);
    expect(parseGs1('(01)09501101530003(10)LOT7(21)A1')).toEqual(fields);
    expect(parseGs1('QRB-HEARTH-M51')).toBeNull();
    expect(parseGs1('2100123')).toBeNull(); // a plain serial that merely starts with "21" is not GS1 data
  });

  it('encodes exactly that string: bwip-js draws it and ZXing reads it back with FNC1 as GS', async () => {
    // Outside check: ZXing (@zxing/library) with ASSUME_GS1 reports FNC1 as GS and prefixes the symbology identifier ]C1.
    const fields = [
      { ai: '01', value: '09501101530003' },
      { ai: '21', value: 'SN-0042' },
      { ai: '400', value: 'BG-2041' },
    ] as const;
    const png = await bwipjs.toBuffer({ bcid: 'gs1-128', text: gs1HumanReadable([...fields]), scale: 3, height: 10 });
    expect(decodePng(png, { gs1: true }).text).toBe(`]C1${gs1ElementString([...fields])}`);
  });
});

describe('reading a scan', () => {
  it('tells GS1 data, a bare GTIN and plain text apart', () => {
    expect(readScan('(01)09501101530003(21)SN1')).toEqual({ kind: 'gs1', gtin14: '09501101530003', serial: 'SN1', batch: null, sscc: null });
    expect(readScan('9501101530003')).toEqual({ kind: 'gtin', gtin14: '09501101530003' }); // GTIN-13 padded to 14 (GS1 General Specifications §3.4.2)
    expect(readScan(' qrb-m1 ')).toEqual({ kind: 'text', text: 'qrb-m1' });
  });
});

describe('kit rules', () => {
  it('gives each unit with cells its own parcel and the rest one between them', () => {
    // Common practice: a battery module (tens of kg, Class 9) travels alone; accessories share a carton.
    expect(parcelCount([{ qty: 3, lithium: 'UN 3480' }, { qty: 10, lithium: null }])).toBe(4);
    expect(parcelCount([{ qty: 2, lithium: null }])).toBe(1);
  });

  it('takes the installer’s order number from the front of the job reference for AI (400)', () => {
    expect(orderReferenceOf('BG-2041 Fern St')).toBe('BG-2041');
    expect(orderReferenceOf('Quote, Hill St')).toBeNull(); // a word, not an order number
    expect(orderReferenceOf('BG-2044 Quote, Hill St')).toBe('BG-2044');
    // GS1 General Specifications: AI (400) carries up to 30 characters (AI 21 only 20).
    expect(orderReferenceOf('PO-2026-000000000000000000001 site')).toBe('PO-2026-000000000000000000001');
    expect(orderReferenceOf(`PO-${'1'.repeat(28)} site`)).toBeNull(); // 31 characters
  });
});
