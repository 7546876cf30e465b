import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  BomRuleSchema,
  BomRulesSchema,
  applyBomRule,
  basisQuantity,
  conditionHolds,
  mergeAndPack,
  unknownRuleSkus,
  type BomContext,
  type BomPart,
} from '../../shared/domain/bom-rules.ts';

const ctx = (overrides: Partial<BomContext> = {}): BomContext => ({
  stacks: 1,
  modulesPerStack: 7,
  cellUnitsPerStack: 7,
  dvc: 'C',
  heightMm: 1800,
  ...overrides,
});

const rule = (input: unknown) => BomRuleSchema.parse(input);

const part = (sku: string, packSize = 1, category = 'accessory'): BomPart => ({ sku, name: sku, category, packSize });

describe('BomRuleSchema', () => {
  it("defaults the condition to 'always'", () => {
    expect(rule({ sku: 'FEET', basis: 'per-stack', qty: 4 }).when).toEqual({ kind: 'always' });
  });

  it('needs a divisor for per-n-modules', () => {
    const result = BomRuleSchema.safeParse({ sku: 'BRKT', basis: 'per-n-modules', qty: 1 });
    expect(result.success).toBe(false);
    expect(result.error?.issues[0]?.path).toEqual(['divisor']);
    expect(BomRuleSchema.safeParse({ sku: 'BRKT', basis: 'per-n-modules', qty: 1, divisor: 3 }).success).toBe(true);
  });

  it('refuses free-form or out-of-range values', () => {
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-moon', qty: 1 }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 0 }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1.5 }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1001 }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: '', basis: 'per-stack', qty: 1 }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: -5 } }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1, when: { kind: 'if', expr: 'n>3' } }).success).toBe(false);
  });

  it('caps a range at 100 rules', () => {
    const many = Array.from({ length: 101 }, () => ({ sku: 'X', basis: 'per-stack', qty: 1 }));
    expect(BomRulesSchema.safeParse(many).success).toBe(false);
    expect(BomRulesSchema.safeParse(many.slice(1)).success).toBe(true);
  });
});

describe('basis quantities', () => {
  it('rounds per-N-modules up: 7 modules, 1 per 3 → 3', () => {
    const q = basisQuantity(rule({ sku: 'BRKT', basis: 'per-n-modules', qty: 1, divisor: 3 }), ctx());
    expect(q.qty).toBe(3); // domain.md §3 example: ceil(7 / 3) = 3
    expect(q.reason).toBe('1 per 3 modules, rounded up: 7 modules → 3'); // domain.md §3 wording of the example
  });

  it('applies per-N-modules to each stack', () => {
    const q = basisQuantity(rule({ sku: 'BRKT', basis: 'per-n-modules', qty: 2, divisor: 3 }), ctx({ stacks: 2, modulesPerStack: 6 }));
    expect(q.qty).toBe(8); // 2 × ceil(6 / 3) per stack × 2 stacks, arithmetic
    expect(q.reason).not.toMatch(/rounded up/); // 6 divides by 3 exactly
  });

  it('multiplies per stack, per module, per cell-carrying unit and per system', () => {
    const two = ctx({ stacks: 2, modulesPerStack: 4, cellUnitsPerStack: 5 });
    expect(basisQuantity(rule({ sku: 'A', basis: 'per-stack', qty: 1 }), two)).toEqual({ qty: 2, reason: '1 per stack × 2 stacks' }); // domain.md §3 example sentence
    expect(basisQuantity(rule({ sku: 'A', basis: 'per-module', qty: 2 }), two).qty).toBe(16); // 2 × 4 × 2, arithmetic
    expect(basisQuantity(rule({ sku: 'A', basis: 'per-cell-unit', qty: 1 }), two).qty).toBe(10); // 5 cell units × 2 stacks
    expect(basisQuantity(rule({ sku: 'A', basis: 'per-system', qty: 1 }), two).qty).toBe(1); // once per system
  });
});

describe('conditions', () => {
  it('tests DVC, stack count and height', () => {
    expect(conditionHolds({ kind: 'dvc-b-or-c' }, ctx({ dvc: 'A' }))).toBe(false); // DVC-A needs no cable protection (AS/NZS 5139:2019)
    expect(conditionHolds({ kind: 'dvc-b-or-c' }, ctx({ dvc: 'B' }))).toBe(true); // DVC-B does (AS/NZS 5139:2019)
    expect(conditionHolds({ kind: 'multi-stack' }, ctx({ stacks: 1 }))).toBe(false);
    expect(conditionHolds({ kind: 'multi-stack' }, ctx({ stacks: 2 }))).toBe(true);
    expect(conditionHolds({ kind: 'height-over', mm: 1800 }, ctx({ heightMm: 1800 }))).toBe(false); // "over" is strict
    expect(conditionHolds({ kind: 'height-over', mm: 1799 }, ctx({ heightMm: 1800 }))).toBe(true);
  });

  it('explains cable protection with its standard', () => {
    const demand = applyBomRule(
      rule({ sku: 'COVER', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } }),
      ctx({ dvc: 'B' }),
      part('COVER', 1, 'cable-cover'),
    );
    expect(demand?.reason).toMatch(/above 60 V DC/); // DVC-A limit 60 V, AS/NZS 5139:2019 via IEC 62109-1
    expect(demand?.reason).toMatch(/AS\/NZS 5139:2019/);
    expect(applyBomRule(rule({ sku: 'COVER', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } }), ctx({ dvc: 'A' }))).toBeNull();
  });
});

describe('mergeAndPack', () => {
  it('rounds feet up to packs of 4: 4 per stack → 1 pack per stack', () => {
    const parts = { FEET: part('FEET', 4) };
    const [line] = mergeAndPack([{ sku: 'FEET', qty: 8, reason: '4 per stack × 2 stacks' }], (sku) => parts[sku as 'FEET']);
    expect(line.packs).toBe(2); // domain.md §3: feet in packs of 4, 4 per stack → 1 pack per stack
    expect(line.qtyUnits).toBe(8);
  });

  it('rounds up and says so', () => {
    const parts = { FEET: part('FEET', 4) };
    const [line] = mergeAndPack([{ sku: 'FEET', qty: 6, reason: '3 per stack × 2 stacks' }], (sku) => parts[sku as 'FEET']);
    expect(line.packs).toBe(2); // ceil(6 / 4), arithmetic
    expect(line.qtyUnits).toBe(8); // 2 packs × 4
    expect(line.reason).toMatch(/rounded up: 6 → 8/);
  });

  it('merges lines of the same part before rounding', () => {
    const parts: Record<string, BomPart> = { BRKT: part('BRKT', 2), CAP: part('CAP') };
    const lines = mergeAndPack(
      [
        { sku: 'BRKT', qty: 1, reason: '1 per stack' },
        { sku: 'CAP', qty: 1, reason: '1 per stack' },
        { sku: 'BRKT', qty: 1, reason: '1 per 3 modules: 3 modules → 1' },
      ],
      (sku) => parts[sku],
    );
    expect(lines.map((l) => l.sku)).toEqual(['BRKT', 'CAP']);
    expect(lines[0].qtyUnits).toBe(2); // 1 + 1 fills one pack of 2; rounding each first would order 4
    expect(lines[0].rules).toEqual(['1 per stack', '1 per 3 modules: 3 modules → 1']);
    expect(lines[0].reason).toContain('2 in all');
  });

  it('never gives negative or fractional packs, nor fewer units than needed (property)', () => {
    const demand = fc.record({ sku: fc.constantFrom('A', 'B', 'C'), qty: fc.integer({ min: 0, max: 5000 }), reason: fc.constant('r') });
    fc.assert(
      fc.property(fc.array(demand, { maxLength: 20 }), fc.integer({ min: 1, max: 50 }), (demands, packSize) => {
        for (const line of mergeAndPack(demands, (sku) => part(sku, packSize))) {
          expect(Number.isInteger(line.packs) && line.packs >= 0).toBe(true); // whole packs only
          expect(line.qtyUnits).toBe(line.packs * line.packSize);
          expect(line.qtyUnits).toBeGreaterThanOrEqual(line.qtyNeeded); // rounding is always up
          expect(line.qtyUnits - line.qtyNeeded).toBeLessThan(line.packSize); // by less than one pack
        }
      }),
    );
  });
});

describe('unknownRuleSkus', () => {
  it('lists rule parts missing from the catalogue once each', () => {
    const rules = BomRulesSchema.parse([
      { sku: 'A', basis: 'per-stack', qty: 1 },
      { sku: 'B', basis: 'per-stack', qty: 1 },
      { sku: 'B', basis: 'per-system', qty: 1 },
    ]);
    expect(unknownRuleSkus(rules, { A: part('A') })).toEqual(['B']);
  });
});

describe('rules that see the site and the inverter', () => {
  const site = (over: Partial<NonNullable<BomContext['site']>> = {}) => ({ cableRunM: 3, wall: 'stud' as const, location: 'indoor' as const, sharesHabitableWall: false, floor: 'slab' as const, country: 'AU' as const, ...over });

  it('links a daisy chain of stacks: stacks − 1', () => {
    const link = rule({ sku: 'LINK', basis: 'per-stack-link', qty: 1 });
    expect(basisQuantity(link, ctx({ stacks: 1 })).qty).toBe(0); // one stack links to nothing
    expect(basisQuantity(link, ctx({ stacks: 3 })).qty).toBe(2); // A–B, B–C
  });

  it('rounds a run up to what is sold: by the metre, or in lengths', () => {
    const conduit = rule({ sku: 'CDT', basis: 'per-metre-of-run', qty: 1 });
    expect(basisQuantity(conduit, ctx({ site: site({ cableRunM: 8 }) }), { ...part('CDT'), lengthM: 1 }).qty).toBe(8);
    expect(basisQuantity(conduit, ctx({ site: site({ cableRunM: 7.2 }) }), { ...part('CDT'), lengthM: 1 }).qty).toBe(8); // ceil(7.2)
    expect(basisQuantity(conduit, ctx({ site: site({ cableRunM: 9 }) }), { ...part('CDT'), lengthM: 4 }).qty).toBe(3); // ceil(9 / 4) lengths of 4 m
    expect(basisQuantity(conduit, ctx({ site: site({ cableRunM: 8 }) }), { ...part('CDT'), lengthM: 4 }).qty).toBe(2); // exactly 2 × 4 m
  });

  it('chooses by the run: over the lower length, up to and including the upper', () => {
    const threeToFive = { kind: 'run-within' as const, overM: 3, upToM: 5 };
    expect(conditionHolds(threeToFive, ctx({ site: site({ cableRunM: 3 }) }))).toBe(false); // 3 m belongs to the 3 m set
    expect(conditionHolds(threeToFive, ctx({ site: site({ cableRunM: 3.01 }) }))).toBe(true);
    expect(conditionHolds(threeToFive, ctx({ site: site({ cableRunM: 5 }) }))).toBe(true);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1, when: { kind: 'run-within', overM: 5, upToM: 3 } }).success).toBe(false);
    expect(BomRuleSchema.safeParse({ sku: 'X', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'plasterboard' } }).success).toBe(false);
  });

  it('sees the wall, location, country and the inverter’s inputs', () => {
    expect(conditionHolds({ kind: 'wall', wall: 'masonry' }, ctx({ site: site({ wall: 'masonry' }) }))).toBe(true);
    expect(conditionHolds({ kind: 'wall', wall: 'masonry' }, ctx({ site: site() }))).toBe(false);
    expect(conditionHolds({ kind: 'location', location: 'garage' }, ctx({ site: site({ location: 'garage' }) }))).toBe(true);
    expect(conditionHolds({ kind: 'country', country: 'NZ' }, ctx())).toBe(false); // defaults: AU
    expect(conditionHolds({ kind: 'stacks-over-inputs' }, ctx({ stacks: 2, inverter: { name: 'Two-input', batteryInputs: 2 } }))).toBe(false);
    expect(conditionHolds({ kind: 'stacks-over-inputs' }, ctx({ stacks: 2, inverter: { name: 'One-input', batteryInputs: 1 } }))).toBe(true);
    expect(conditionHolds({ kind: 'stacks-over-inputs' }, ctx({ stacks: 2 }))).toBe(true); // no inverter: one input assumed
  });
});
