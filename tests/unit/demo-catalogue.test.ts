import { describe, expect, it } from 'vitest';
import {
  ATTRIBUTE_FIELDS,
  CATEGORY_CODES,
  CATEGORY_LABELS,
  ComplianceSchema,
  PartAttributesSchema,
} from '../../shared/contracts/part-attributes.ts';
import { BomRulesSchema } from '../../shared/domain/bom-rules.ts';
import { makers, parts, ranges, type DemoPart } from '../../seed/data/catalogue.ts';

// Independent of the catalogue's own helper on purpose.
// GS1 General Specifications §7.9.1: weights 3,1,3,1… from the digit left of the check
// digit, check = (10 − sum mod 10) mod 10.
function gtinCheckDigitOk(gtin: string): boolean {
  if (!/^\d{13}$/.test(gtin)) return false;
  const digits = gtin.split('').map(Number);
  const check = digits.pop()!;
  const sum = digits.reverse().reduce((acc, d, i) => acc + d * (i % 2 === 0 ? 3 : 1), 0);
  return (10 - (sum % 10)) % 10 === check;
}

const bySku = new Map(parts.map((p) => [p.sku, p]));
const part = (sku: string): DemoPart => {
  const p = bySku.get(sku);
  if (!p) throw new Error(`no part ${sku}`);
  return p;
};

function cellValues(p: DemoPart): { v: number; ah: number } | null {
  const a = p.attributes;
  if (a.category === 'module') return { v: a.nominalV, ah: a.ratedAh };
  if (a.category === 'controller' && a.carriesCells && a.nominalV !== undefined && a.ratedAh !== undefined) {
    return { v: a.nominalV, ah: a.ratedAh };
  }
  return null;
}

describe('part attribute contract', () => {
  it('has a label and a field table for every category, matching the schema keys', () => {
    for (const code of CATEGORY_CODES) {
      expect(CATEGORY_LABELS[code]).toBeTruthy();
      const schema = PartAttributesSchema.options.find((o) => o.shape.category.value === code);
      expect(schema, code).toBeDefined();
      const schemaKeys = Object.keys(schema!.shape).filter((k) => k !== 'category').sort();
      const fieldKeys = ATTRIBUTE_FIELDS[code].map((f) => f.key).sort();
      expect(fieldKeys, code).toEqual(schemaKeys);
    }
  });

  it('refuses absurd or inconsistent attributes with the offending path', () => {
    const bad = (input: unknown) => PartAttributesSchema.safeParse(input).error?.issues.map((i) => i.path.join('.'));
    // 51.2 V × 100 Ah = 5.12 kWh nominal, so 6 kWh usable is impossible.
    expect(bad({ category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP', usableKwh: 6 })).toEqual(['usableKwh']);
    expect(bad({ category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP', minOperatingV: 58, maxChargeV: 50 })).toContain('maxChargeV');
    expect(bad({ category: 'module', nominalV: 15_000, ratedAh: 100, chemistry: 'LFP' })).toEqual(['nominalV']);
    // LFP voltages follow from the cell count (3.65 V full, 2.5 V cut-off, common practice); NMC's do not
    expect([...(bad({ category: 'module', nominalV: 44.4, ratedAh: 100, chemistry: 'NMC' }) ?? [])].sort()).toEqual(['maxChargeV', 'minOperatingV']);
    expect(bad({ category: 'module', nominalV: 51.2, ratedAh: 100, chemistry: 'LFP', eolSohPct: 30 })).toEqual(['eolSohPct']);
    expect(bad({ category: 'controller', carriesCells: true })).toEqual(['nominalV', 'ratedAh']);
    expect(bad({ category: 'controller', carriesCells: false, usableKwh: 2 })).toEqual(['usableKwh']);
    expect(bad({ category: 'controller', carriesCells: false, maxStackModules: 40 })).toEqual(['maxStackModules']);
    expect(bad({ category: 'inverter', batteryMinV: 450, batteryMaxV: 80, batteryInputs: 1 })).toEqual(['batteryMaxV']);
    expect(bad({ category: 'inverter', batteryMinV: 80, batteryMaxV: 450, batteryInputs: 9 })).toEqual(['batteryInputs']);
    expect(bad({ category: 'feet', unitsPerSet: 4, heightMm: 80, colour: 'red' })).toEqual(['']);
    expect(bad({ category: 'gizmo' })).toEqual(['category']);
    expect(ComplianceSchema.safeParse({ standardsTestedTo: [], enclosureIp: 'IP5' }).success).toBe(false);
    expect(ComplianceSchema.safeParse({ standardsTestedTo: [], enclosureIp: 'IPX4', certificationDate: '2024-02-29' }).success).toBe(true);
    expect(ComplianceSchema.safeParse({ standardsTestedTo: [], certificationDate: '2023-02-29' }).success).toBe(false);
  });
});

describe('demo catalogue', () => {
  it('has at least 150 parts and several of every category', () => {
    expect(parts.length).toBeGreaterThanOrEqual(150);
    for (const code of CATEGORY_CODES) {
      expect(parts.filter((p) => p.category === code).length, code).toBeGreaterThanOrEqual(3);
    }
  });

  it('has three makers and every part and range names one of them', () => {
    expect(makers).toHaveLength(3);
    const codes = new Set(makers.map((m) => m.code));
    expect(codes.size).toBe(3);
    for (const p of parts) expect(codes.has(p.maker), p.sku).toBe(true);
    for (const r of ranges) expect(codes.has(r.maker), r.code).toBe(true);
  });

  it('parses every part’s attributes and compliance', () => {
    for (const p of parts) {
      const parsed = PartAttributesSchema.safeParse(p.attributes);
      expect(parsed.error?.issues ?? [], p.sku).toEqual([]);
      expect(p.attributes.category, p.sku).toBe(p.category);
      if (p.compliance) expect(ComplianceSchema.safeParse(p.compliance).error?.issues ?? [], p.sku).toEqual([]);
    }
  });

  it('uses unique SKUs', () => {
    expect(new Set(parts.map((p) => p.sku)).size).toBe(parts.length);
  });

  it('gives GTINs with correct GS1 check digits, all distinct', () => {
    // The checker itself, against GS1's worked example: 629104150021 → check digit 3.
    expect(gtinCheckDigitOk('6291041500213')).toBe(true);
    expect(gtinCheckDigitOk('6291041500214')).toBe(false);
    const gtins = parts.flatMap((p) => (p.gtin ? [p.gtin] : []));
    expect(gtins.length).toBeGreaterThan(140);
    for (const g of gtins) expect(gtinCheckDigitOk(g), g).toBe(true);
    expect(new Set(gtins).size).toBe(gtins.length);
  });

  it('has sane units, packs, masses and prices', () => {
    for (const p of parts) {
      expect(Number.isInteger(p.packSize) && p.packSize >= 1, p.sku).toBe(true);
      expect(p.massKg > 0 && p.massKg <= 500, p.sku).toBe(true);
      expect(Number.isInteger(p.costCents) && p.costCents > 0, p.sku).toBe(true);
      expect(Number.isInteger(p.listPriceCents) && p.listPriceCents > p.costCents, p.sku).toBe(true);
      if (p.ipRating) expect(p.ipRating, p.sku).toMatch(/^IP[0-6X][0-9X]$/);
      if (p.unit === 'pack') expect(p.packSize, p.sku).toBeGreaterThan(1);
    }
    for (const p of parts.filter((x) => x.category === 'feet')) {
      expect(p.packSize, p.sku).toBe(4);
    }
  });

  it('points every supersededBy at an existing active part of the same category', () => {
    const superseded = parts.filter((p) => p.lifecycle === 'superseded');
    expect(superseded.length).toBeGreaterThanOrEqual(3);
    expect(parts.filter((p) => p.lifecycle === 'discontinued').length).toBeGreaterThanOrEqual(3);
    for (const p of parts) {
      if (p.lifecycle === 'superseded') {
        expect(p.supersededBy, p.sku).toBeDefined();
        const next = part(p.supersededBy!);
        expect(next.lifecycle, p.sku).toBe('active');
        expect(next.category, p.sku).toBe(p.category);
      } else {
        expect(p.supersededBy, p.sku).toBeUndefined();
      }
    }
  });

  it('marks cell-carrying units as UN 3480 class 9 with Wh = V × Ah', () => {
    for (const p of parts) {
      const cells = cellValues(p);
      if (cells) {
        expect(p.dangerousGoods?.unNumber, p.sku).toBe('UN3480');
        expect(p.dangerousGoods?.class, p.sku).toBe('9');
        // Nominal energy (Wh) = nominal voltage (V) × rated capacity (Ah), general electrical practice.
        expect(p.dangerousGoods!.whRating, p.sku).toBeCloseTo(cells.v * cells.ah, 6);
      } else {
        expect(p.dangerousGoods, p.sku).toBeUndefined();
      }
    }
    // Spot checks from the domain notes: 16-cell 51.2 V × 100 Ah = 5120 Wh; 44.8 V × 100 Ah = 4480 Wh.
    expect(part('QRB-HEARTH-M51').dangerousGoods?.whRating).toBe(5120);
    expect(part('TVP-SL48-M45').dangerousGoods?.whRating).toBe(4480);
  });
});

describe('demo ranges', () => {
  it('has four ranges with rules in the BOM rule contract', () => {
    expect(ranges).toHaveLength(4);
    expect(new Set(ranges.map((r) => r.code)).size).toBe(4);
    for (const r of ranges) {
      expect(BomRulesSchema.safeParse(r.rules).error?.issues ?? [], r.code).toEqual([]);
    }
  });

  it('refers only to existing, active parts of the right category', () => {
    for (const r of ranges) {
      const ctl = part(r.controllerSku);
      const mod = part(r.moduleSku);
      expect(ctl.category, r.code).toBe('controller');
      expect(mod.category, r.code).toBe('module');
      expect([ctl.lifecycle, mod.lifecycle], r.code).toEqual(['active', 'active']);
      for (const rule of r.rules) {
        expect(bySku.has(rule.sku), `${r.code} rule ${rule.sku}`).toBe(true);
        expect(part(rule.sku).lifecycle, `${r.code} rule ${rule.sku}`).toBe('active');
        expect(['module', 'controller', 'inverter'], `${r.code} rule ${rule.sku}`).not.toContain(part(rule.sku).category);
      }
      expect(r.compatibleInverterSkus.length, r.code).toBeGreaterThan(0);
      for (const sku of r.compatibleInverterSkus) expect(part(sku).category, `${r.code} ${sku}`).toBe('inverter');
    }
  });

  it('keeps module counts, base height and rules consistent with the parts', () => {
    for (const r of ranges) {
      expect(r.minModules >= 1 && r.minModules <= r.maxModules, r.code).toBe(true);
      expect(r.maxStacks, r.code).toBeGreaterThanOrEqual(1);
      const ctl = part(r.controllerSku).attributes;
      if (ctl.category === 'controller' && ctl.maxStackModules !== undefined) {
        expect(r.maxModules, r.code).toBeLessThanOrEqual(ctl.maxStackModules);
      }
      const feetRules = r.rules.filter((rule) => part(rule.sku).category === 'feet');
      expect(feetRules, r.code).toHaveLength(1);
      const feet = part(feetRules[0]!.sku);
      if (feet.attributes.category === 'feet') expect(r.baseHeightMm, r.code).toBe(feet.attributes.heightMm);
      expect(feetRules[0]!.qty % feet.packSize, r.code).toBe(0);
      for (const cat of ['end-cap', 'cable-set', 'cable-cover', 'earth-lead', 'comms-terminator', 'wall-bracket']) {
        expect(r.rules.some((rule) => part(rule.sku).category === cat), `${r.code} ${cat}`).toBe(true);
      }
      for (const rule of r.rules) {
        if (part(rule.sku).category === 'cable-cover') expect(rule.when, `${r.code} ${rule.sku}`).toEqual({ kind: 'dvc-b-or-c' });
      }
    }
  });

  it('covers the required variety', () => {
    const voltsOf = (r: (typeof ranges)[number], n: number) => {
      const mod = part(r.moduleSku).attributes;
      const ctl = part(r.controllerSku).attributes;
      if (mod.category !== 'module' || ctl.category !== 'controller') throw new Error(r.code);
      const ctlMax = ctl.carriesCells ? (ctl.maxChargeV ?? 0) : 0;
      const ctlMin = ctl.carriesCells ? (ctl.minOperatingV ?? 0) : 0;
      return r.connection === 'series'
        ? { min: n * mod.minOperatingV! + ctlMin, max: n * mod.maxChargeV! + ctlMax }
        : { min: mod.minOperatingV!, max: mod.maxChargeV! };
    };
    // (a) series, controller carries cells, DVC-C (> 120 V) at every size, cover when B or C.
    const a = ranges.find((r) => r.connection === 'series' && (part(r.controllerSku).attributes as { carriesCells: boolean }).carriesCells)!;
    expect(a).toBeDefined();
    expect([a.minModules, a.maxModules]).toEqual([2, 8]);
    expect(voltsOf(a, a.minModules).max).toBeGreaterThan(120);
    // (b)/(c) parallel 48 V class stay within DVC-A (≤ 60 V), AS/NZS 5139 classes from IEC 62109-1.
    const parallel = ranges.filter((r) => r.connection === 'parallel');
    expect(parallel.length).toBeGreaterThanOrEqual(2);
    for (const r of parallel) expect(voltsOf(r, r.maxModules).max, r.code).toBeLessThanOrEqual(60);
    expect(parallel.some((r) => r.maxModules === 6 && r.maxStacks === 3)).toBe(true);
    // (c) brackets per 3 modules and a combiner when there are more stacks than inverter inputs.
    expect(ranges.some((r) => r.rules.some((x) => x.basis === 'per-n-modules' && x.divisor === 3))).toBe(true);
    expect(ranges.some((r) => r.rules.some((x) => x.when?.kind === 'stacks-over-inputs' && /combiner/i.test(part(x.sku).name)))).toBe(true);
    // (d) a series range spanning DVC-B (60–120 V) and DVC-C.
    const d = ranges.find((r) => r.connection === 'series' && r !== a)!;
    const dMax = [d.minModules, d.maxModules].map((n) => voltsOf(d, n).max);
    expect(dMax[0]).toBeGreaterThan(60);
    expect(dMax[0]).toBeLessThanOrEqual(120);
    expect(dMax[1]).toBeGreaterThan(120);

    // Some listed inverter windows fit some stack sizes and not others.
    let fits = 0;
    let misses = 0;
    for (const r of ranges) {
      for (const sku of r.compatibleInverterSkus) {
        const inv = part(sku).attributes;
        if (inv.category !== 'inverter') continue;
        for (let n = r.minModules; n <= r.maxModules; n++) {
          const { min, max } = voltsOf(r, n);
          if (min >= inv.batteryMinV && max <= inv.batteryMaxV) fits++;
          else misses++;
        }
      }
    }
    expect(fits).toBeGreaterThan(0);
    expect(misses).toBeGreaterThan(0);
    // A 40–60 V inverter cannot take either series range at any size.
    const lv = parts.find((p) => p.attributes.category === 'inverter' && p.attributes.batteryMaxV === 60)!;
    expect(lv).toBeDefined();
    for (const r of ranges.filter((x) => x.connection === 'series')) {
      expect(voltsOf(r, r.minModules).max).toBeGreaterThan(60);
    }
  });
});
