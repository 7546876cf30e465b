import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { planStack, type PlanRequest, type PlanResult, type StackPlan } from '../../shared/domain/planner.ts';
import type { BomRuleInput } from '../../shared/domain/bom-rules.ts';
import {
  PART_SKUS,
  TYPICAL_RULES,
  lowVoltageInverter,
  makeController,
  makeInverter,
  makeUnit,
  parallelRange,
  seriesRange,
  tidewellParts,
} from '../support/planner-fixtures.ts';

const parts = tidewellParts();

function plan(req: Omit<PlanRequest, 'parts'> & { parts?: PlanRequest['parts'] }): StackPlan {
  const result = planStack({ parts, ...req });
  if (!result.ok) throw new Error(`expected a plan, got ${result.error.code}: ${result.error.message}`);
  return result.plan;
}

function planError(result: PlanResult) {
  if (result.ok) throw new Error('expected an error, got a plan');
  return result.error;
}

const line = (p: StackPlan, sku: string) => p.bom.find((l) => l.sku === sku);

// The fixture module: LFP 16 cells, 51.2 V × 100 Ah, no maker usable figure, so 90 % DoD.
const MODULE_USABLE_KWH = 4.608; // 5.12 kWh × 90 %, domain.md §1 rule with the planner default DoD

describe('voltage and capacity', () => {
  it('adds voltage in a series stack', () => {
    const p = plan({ range: seriesRange(), modules: 4 });
    expect(p.nominalVoltage).toBe(204.8); // 4 × 51.2 V, series voltages add (domain.md §2)
    expect(p.maxVoltage).toBe(233.6); // 4 × 16 cells × 3.65 V, LFP full charge, common practice
    expect(p.minVoltage).toBe(160); // 4 × 16 cells × 2.5 V, LFP cut-off, common practice
    expect(p.capacityAh).toBe(100); // series: stack Ah = unit Ah (domain.md §2)
    expect(p.nominalKwh).toBe(20.48); // 204.8 V × 100 Ah, general electrical practice
    expect(p.usableKwh).toBe(18.43); // 4 × 4.608 kWh, 90 % DoD default
    expect(p.dvc).toBe('C'); // 233.6 V > 120 V: DVC-C, AS/NZS 5139:2019 via IEC 62109-1
  });

  it('adds capacity in a parallel stack', () => {
    const p = plan({ range: parallelRange(), modules: 4 });
    expect(p.nominalVoltage).toBe(51.2); // parallel: V = unit V (domain.md §2)
    expect(p.maxVoltage).toBe(58.4); // 16 × 3.65 V, LFP, common practice
    expect(p.capacityAh).toBe(400); // parallel: Ah = Σ unit Ah (domain.md §2)
    expect(p.nominalKwh).toBe(20.48); // 51.2 V × 400 Ah, general electrical practice
    expect(p.dvc).toBe('A'); // 58.4 V ≤ 60 V: DVC-A, AS/NZS 5139:2019 via IEC 62109-1
  });

  it('uses the maker’s voltages when given', () => {
    const range = seriesRange({ module: makeUnit({ maxChargeV: 57.6, minOperatingV: 44.8 }) });
    const p = plan({ range, modules: 2 });
    expect(p.maxVoltage).toBe(115.2); // 2 × the maker's 57.6 V (domain.md §2: "or the maker's max")
    expect(p.minVoltage).toBe(89.6); // 2 × the maker's 44.8 V
    expect(p.assumptions.join(' ')).not.toMatch(/3\.65/);
  });

  it('states the LFP assumptions it had to make', () => {
    const p = plan({ range: seriesRange(), modules: 2 });
    expect(p.assumptions.join(' ')).toMatch(/3\.65 V/);
    expect(p.assumptions.join(' ')).toMatch(/2\.5 V/);
    expect(p.assumptions.join(' ')).toMatch(/90 % depth of discharge/);
  });

  it('counts a controller that carries cells in voltage and usable energy', () => {
    const controller = makeController({ nominalV: 51.2, ratedAh: 100, cellsInSeries: 16, usableKwh: 4.6, carriesCells: true });
    const p = plan({ range: seriesRange({ controller }), modules: 3 });
    expect(p.cellUnitsPerStack).toBe(4);
    expect(p.nominalVoltage).toBe(204.8); // (1 + 3) × 51.2 V, series voltages add (domain.md §2)
    expect(p.usableKwh).toBe(18.42); // 4.6 (maker) + 3 × 4.608: Σ over cell-carrying units (domain.md §2)
  });

  it('multiplies energy, not voltage, across parallel stacks', () => {
    const p = plan({ range: seriesRange(), modules: 4, stacks: 2 });
    expect(p.nominalVoltage).toBe(204.8); // stacks in parallel share one voltage (domain.md §2)
    expect(p.usableKwh).toBe(36.86); // 2 × 18.432 kWh
    expect(p.capacityAh).toBe(200); // 2 stacks × 100 Ah in parallel
  });
});

describe('physical build', () => {
  it('adds heights, masses and footprint', () => {
    const p = plan({ range: seriesRange(), modules: 4 });
    expect(p.heightMm).toBe(1310); // 100 base + 250 controller + 4 × 240 (domain.md §2)
    // 18 + 4 × 48 units, plus accessories per sold pack × packs: feet 2 × 1 pack, end cap 0.2,
    // terminator 0.05, brackets 1 × 2, cable 2, cover 1.5, earth 0.3 (the fixture's masses)
    expect(p.massKg).toBe(218.05);
    expect(p.footprintM2).toBe(0.2925); // widest 650 mm × deepest 450 mm (domain.md §2)
    expect(p.floorLoadKpa).toBe(7.31); // 218.05 kg × 9.81 / 0.2925 m² / 1000 (domain.md §2 formula)
    expect(p.units.map((u) => u.kind)).toEqual(['controller', 'module', 'module', 'module', 'module', 'feet']);
    expect(p.units.reduce((sum, u) => sum + u.heightMm, 0)).toBe(p.heightMm);
  });

  it('spreads several stacks over their combined footprint', () => {
    const one = plan({ range: seriesRange(), modules: 4 });
    const two = plan({ range: seriesRange(), modules: 4, stacks: 2 });
    expect(two.footprintM2).toBe(0.585); // 2 × 0.2925 m², one footprint per stack
    expect(two.heightMm).toBe(one.heightMm);
  });
});

describe('throughput and efficiency', () => {
  it('estimates throughput from cycle life under linear fade', () => {
    const p = plan({ range: seriesRange(), modules: 4 });
    expect(p.throughputMwh).toBe(94); // 18.432 kWh × 6000 × (1 + 0.70) / 2 = 94.0 MWh (domain.md §2 model)
    expect(p.equivalentCycles).toBe(5100); // 6000 × 0.85 mean SoH = throughput ÷ usable (domain.md §2)
    expect(p.yearsAtOneCyclePerDay).toBe(14); // 5100 ÷ 365 ≈ 14.0, one cycle a day
    expect(p.throughputAssumptions.join(' ')).toMatch(/6,000 rated cycles/);
  });

  it("shows the maker's warranted throughput beside the estimate, not mixed into it", () => {
    const p = plan({ range: seriesRange({ module: makeUnit({ warrantedMwh: 15 }) }), modules: 4 });
    expect(p.throughputMwh).toBe(94); // the estimate is unchanged: 18.432 kWh × 6000 × 0.85 (domain.md §2 model)
    expect(p.warrantedThroughputMwh).toBe(60); // 4 modules × 15 MWh, the maker's figure (issue 14: shown separately)
    expect(p.warrantedThroughputNote).toMatch(/4 × 15 MWh/);
    expect(p.throughputAssumptions.join(' ')).not.toMatch(/warranted/);
  });

  it('splits round-trip efficiency into √RTE each way', () => {
    const p = plan({ range: seriesRange(), modules: 2 });
    expect(p.roundTripEfficiencyPct).toBe(95);
    expect(p.chargeEfficiencyPct).toBe(97.47); // √0.95 = 0.974679…, energy-system simulation convention
    expect(p.dischargeEfficiencyPct).toBe(97.47); // same convention
  });

  it('leaves efficiency empty when the maker gives none', () => {
    const p = plan({ range: seriesRange({ module: makeUnit({ roundTripEfficiencyPct: null }) }), modules: 2 });
    expect(p.chargeEfficiencyPct).toBeNull();
  });
});

describe('bill of materials', () => {
  it('always lists the controller and modules with their reasons', () => {
    const p = plan({ range: seriesRange(), modules: 4, stacks: 2 });
    expect(line(p, 'TW-CTL')).toMatchObject({ qtyUnits: 2, reason: '1 per stack × 2 stacks' }); // domain.md §3 wording
    expect(line(p, 'TW-MOD-51')).toMatchObject({ qtyUnits: 8, reason: '4 modules per stack × 2 stacks' });
  });

  it('adds the cable-protection cover for DVC-B and C, not for DVC-A', () => {
    const dvcB = plan({ range: seriesRange(), modules: 2 });
    expect(dvcB.dvc).toBe('B'); // 2 × 58.4 = 116.8 V: DVC-B, AS/NZS 5139:2019 via IEC 62109-1
    expect(line(dvcB, PART_SKUS.cover)?.qtyUnits).toBe(1); // DVC-B cables need mechanical protection, AS/NZS 5139:2019
    expect(line(dvcB, PART_SKUS.cover)?.reason).toMatch(/above 60 V DC.*AS\/NZS 5139:2019/);
    expect(dvcB.cautions.map((c) => c.code)).toContain('cable_protection');

    const dvcC = plan({ range: seriesRange(), modules: 6 });
    expect(dvcC.dvc).toBe('C'); // 6 × 58.4 V > 120 V: DVC-C, AS/NZS 5139:2019 via IEC 62109-1
    expect(line(dvcC, PART_SKUS.cover)?.qtyUnits).toBe(1); // AS/NZS 5139:2019

    const dvcA = plan({ range: parallelRange(), modules: 6 });
    expect(dvcA.dvc).toBe('A'); // 58.4 V: DVC-A, AS/NZS 5139:2019 via IEC 62109-1
    expect(line(dvcA, PART_SKUS.cover)).toBeUndefined();
    expect(dvcA.cautions.map((c) => c.code)).not.toContain('cable_protection');
  });

  it('rounds feet to packs of 4: 4 per stack → 1 pack per stack', () => {
    const p = plan({ range: seriesRange(), modules: 3, stacks: 2 });
    expect(line(p, PART_SKUS.feet)).toMatchObject({ packSize: 4, packs: 2, qtyUnits: 8 }); // domain.md §3 example
  });

  it('rounds a pack-sold part up and says so', () => {
    const p = plan({
      range: seriesRange({ ruleInputs: [{ sku: PART_SKUS.feet, basis: 'per-stack', qty: 3 }] }),
      modules: 3,
      stacks: 2,
    });
    expect(line(p, PART_SKUS.feet)).toMatchObject({ qtyNeeded: 6, packs: 2, qtyUnits: 8 }); // ceil(6 / 4) packs
    expect(line(p, PART_SKUS.feet)?.reason).toMatch(/packs of 4, rounded up: 6 → 8/);
  });

  it('rounds per-N-module parts up: 7 modules, 1 per 3 → 3', () => {
    const p = plan({ range: seriesRange(), modules: 7 });
    expect(line(p, PART_SKUS.bracket)?.qtyUnits).toBe(3); // domain.md §3 example: ceil(7 / 3)
    expect(line(p, PART_SKUS.bracket)?.reason).toContain('1 per 3 modules, rounded up: 7 modules → 3'); // domain.md §3 wording
  });

  it('merges rules for the same part into one line, keeping every reason', () => {
    const rules: BomRuleInput[] = [...TYPICAL_RULES, { sku: PART_SKUS.bracket, basis: 'per-stack', qty: 2 }];
    const p = plan({ range: seriesRange({ ruleInputs: rules }), modules: 7 });
    const brackets = p.bom.filter((l) => l.sku === PART_SKUS.bracket);
    expect(brackets).toHaveLength(1);
    expect(brackets[0].qtyUnits).toBe(5); // 3 (1 per 3 modules) + 2 per stack
    expect(brackets[0].rules).toHaveLength(2);
    expect(brackets[0].reason).toContain('2 per stack');
  });

  it('adds the combiner only for several stacks, the tie strap only above its height', () => {
    const single = plan({ range: seriesRange(), modules: 4 });
    expect(line(single, PART_SKUS.combiner)).toBeUndefined();
    expect(line(single, PART_SKUS.tieStrap)).toBeUndefined(); // 1310 mm is not over 1500 mm
    const double = plan({ range: seriesRange(), modules: 6, stacks: 2 });
    expect(line(double, PART_SKUS.combiner)?.qtyUnits).toBe(1); // 1 per system when stacks > 1 (domain.md §3)
    expect(line(double, PART_SKUS.tieStrap)?.qtyUnits).toBe(2); // 1790 mm > 1500 mm, 1 per stack × 2
  });

  it('refuses a rule whose part is not in the catalogue', () => {
    const range = seriesRange({ ruleInputs: [...TYPICAL_RULES, { sku: 'TW-GHOST', basis: 'per-stack', qty: 1 }] });
    const error = planError(planStack({ range, parts, modules: 4 }));
    expect(error.code).toBe('unknown_part');
    expect(error.message).toContain('TW-GHOST');
  });
});

describe('cautions', () => {
  it('always shows the licensed-work, location, clearance, wall-fixing and signage cautions', () => {
    const p = plan({ range: parallelRange(), modules: 2 });
    const codes = p.cautions.map((c) => c.code);
    expect(codes).toEqual(expect.arrayContaining(['licensed_work', 'location', 'clearance', 'wall_fixing', 'signage']));
    expect(p.cautions.find((c) => c.code === 'licensed_work')?.source).toMatch(/AS\/NZS 5139.*AS\/NZS 3000/);
    expect(p.cautions.find((c) => c.code === 'signage')?.text).toMatch(/UN 3480/);
    expect(p.cautions.every((c) => c.source.length > 0)).toBe(true);
  });

  it('warns about floor load on a suspended floor only, and heavy units above 25 kg', () => {
    const heavy = plan({ range: seriesRange(), modules: 4, site: { floor: 'suspended' } });
    expect(heavy.floorLoadKpa).toBeGreaterThan(1.5); // AS/NZS 1170.1 residential 1.5 kPa, from memory
    expect(heavy.cautions.find((c) => c.code === 'floor_load')?.source).toMatch(/AS\/NZS 1170\.1/);
    expect(heavy.cautions.map((c) => c.code)).toContain('heavy_lift'); // 48 kg module > 25 kg: two-person lift, common practice
    const onSlab = plan({ range: seriesRange(), modules: 4, site: { floor: 'slab' } });
    expect(onSlab.cautions.map((c) => c.code)).not.toContain('floor_load'); // a slab on ground carries it (issue 14)
  });

  it('leaves them out for a light unit on a wide footprint', () => {
    const light = makeUnit({ massKg: 10, widthMm: 1000, depthMm: 1000 });
    const p = plan({ range: parallelRange({ module: light, controller: makeController({ massKg: 12 }) }), modules: 2 });
    expect(p.floorLoadKpa).toBeLessThan(1.5); // ≈ 0.4 kPa, below AS/NZS 1170.1's 1.5 kPa (from memory)
    expect(p.cautions.map((c) => c.code)).not.toContain('floor_load');
    expect(p.cautions.map((c) => c.code)).not.toContain('heavy_lift'); // 10 and 12 kg ≤ 25 kg, common practice
  });
});

describe('sizing from a target', () => {
  it('picks the smallest module count that reaches the target', () => {
    const p = plan({ range: seriesRange(), targetUsableKwh: 13 });
    expect(p.modulesPerStack).toBe(3); // 2 × 4.608 = 9.2 < 13 ≤ 3 × 4.608 = 13.8 (domain.md §2 sizing rule)
    expect(p.stacks).toBe(1);
  });

  it('counts a target met exactly as reached', () => {
    expect(plan({ range: seriesRange(), targetUsableKwh: 3 * MODULE_USABLE_KWH }).modulesPerStack).toBe(3); // "usable ≥ target", domain.md §2
  });

  it("adds modules until the stack's voltage fits the inverter's window", () => {
    const inverter = makeInverter({ batteryMinV: 150 });
    const p = plan({ range: seriesRange(), targetUsableKwh: 5, inverter });
    // n = 2 and 3 reach 5 kWh but bottom out at 80 and 120 V; n = 4 bottoms at 160 V (16 × 2.5 V per module)
    expect(p.modulesPerStack).toBe(4); // domain.md §2: min operating V ≥ window min
    expect(p.inverterFit).toEqual({ fits: true });
  });

  it('uses the fewest parallel stacks when one stack cannot reach', () => {
    const p = plan({ range: seriesRange(), targetUsableKwh: 50, inverter: makeInverter({ batteryInputs: 2 }) });
    expect(p.stacks).toBe(2); // one stack tops out at 8 × 4.608 = 36.9 kWh (domain.md §2 sizing rule)
    expect(p.modulesPerStack).toBe(6); // 2 × 5 × 4.608 = 46.1 < 50 ≤ 2 × 6 × 4.608 = 55.3
    expect(line(p, PART_SKUS.combiner)?.qtyUnits).toBe(1);
  });

  it('keeps a fixed stack count when asked', () => {
    const p = plan({ range: seriesRange(), targetUsableKwh: 13, stacks: 2 });
    expect(p.stacks).toBe(2);
    expect(p.modulesPerStack).toBe(2); // 2 stacks × 2 × 4.608 = 18.4 ≥ 13
  });
});

describe('no fit', () => {
  it('reports a battery below the inverter window as too low', () => {
    const error = planError(planStack({ range: parallelRange(), parts, targetUsableKwh: 10, inverter: makeInverter() }));
    expect(error.code).toBe('no_fit');
    expect(error.details?.reason).toBe('too_low'); // 40 V (16 × 2.5 V) < 80 V window minimum
    expect(error.message).toContain('80 V');
  });

  it('reports a battery above the inverter window as too high', () => {
    const error = planError(planStack({ range: seriesRange(), parts, targetUsableKwh: 5, inverter: lowVoltageInverter() }));
    expect(error.code).toBe('no_fit');
    expect(error.details?.reason).toBe('too_high'); // 2 × 58.4 = 116.8 V > 60 V window maximum
    expect(error.message).toContain('60 V');
  });

  it('reports more energy than the inverter accepts, naming the ceiling it leaves', () => {
    const inverter = lowVoltageInverter({ maxBatteryKwh: 10 });
    const error = planError(planStack({ range: parallelRange(), parts, targetUsableKwh: 15, inverter }));
    expect(error.code).toBe('target_unreachable');
    expect(error.details?.reason).toBe('too_much_energy'); // 15 kWh asked, 10 kWh accepted
    expect(error.details?.maxUsableKwh).toBe(9.22); // 2 × 4.608 kWh is the most under 10 kWh (3 × 4.608 = 13.8 is over)
    expect(error.message).toContain('10 kWh');
  });

  it('reports more stacks than the inverter has battery inputs', () => {
    const inverter = lowVoltageInverter({ batteryInputs: 1 });
    const error = planError(planStack({ range: parallelRange(), parts, targetUsableKwh: 40, inverter }));
    expect(error.details?.reason).toBe('too_many_stacks'); // one stack tops out at 6 × 4.608 = 27.6 kWh
    expect(error.details?.maxUsableKwh).toBe(27.65); // 6 × 4.608 kWh, the one stack this inverter takes
    expect(error.message).toContain('1 battery input');
  });

  it('takes as many stacks as the maker states it parallels, beyond its battery inputs', () => {
    // Common practice: low-voltage inverters often parallel several stacks on one DC input through a
    // busbar or combiner, up to the count in the maker's manual.
    const inverter = lowVoltageInverter({ batteryInputs: 1, parallelStacks: 2 });
    const p = plan({ range: parallelRange(), targetUsableKwh: 40, inverter });
    expect(p.stacks).toBe(2); // one stack tops out at 6 × 4.608 = 27.6 kWh, so 40 kWh needs two
    expect(p.inverterFit).toEqual({ fits: true });
    // And the other way: two inputs, but the maker allows only one stack.
    const error = planError(planStack({ range: parallelRange(), parts, targetUsableKwh: 40, inverter: lowVoltageInverter({ batteryInputs: 2, parallelStacks: 1 }) }));
    expect(error.details?.reason).toBe('too_many_stacks');
    expect(error.message).toContain('supports 1 stack in parallel');
  });

  it('returns an explicit count with the inverter misfit rather than an error', () => {
    const p = plan({ range: seriesRange(), modules: 4, inverter: lowVoltageInverter() });
    expect(p.inverterFit).toMatchObject({ fits: false, code: 'too_high' }); // 233.6 V > 60 V
    expect(p.inverterFit?.reason).toContain('60 V');
  });

  it('flags an explicit stack count beyond the inverter inputs', () => {
    const p = plan({ range: seriesRange(), modules: 4, stacks: 2, inverter: makeInverter({ batteryInputs: 1 }) });
    expect(p.inverterFit).toMatchObject({ fits: false, code: 'too_many_stacks' });
  });
});

describe('input errors', () => {
  it('names the module limits', () => {
    const error = planError(planStack({ range: seriesRange(), parts, modules: 9 }));
    expect(error.code).toBe('modules_out_of_range');
    expect(error.message).toBe('This range takes 2 to 8 modules per stack; you asked for 9.');
    expect(planError(planStack({ range: seriesRange(), parts, modules: 2.5 })).code).toBe('modules_out_of_range');
  });

  it('names the stack limits', () => {
    const error = planError(planStack({ range: seriesRange(), parts, modules: 4, stacks: 4 }));
    expect(error.code).toBe('stacks_out_of_range');
    expect(error.message).toBe('This range allows 1 to 3 stacks in parallel; you asked for 4.');
  });

  it('refuses a target that is not a positive number', () => {
    expect(planError(planStack({ range: seriesRange(), parts, targetUsableKwh: -3 })).code).toBe('target_invalid');
    expect(planError(planStack({ range: seriesRange(), parts, targetUsableKwh: Number.NaN })).code).toBe('target_invalid');
  });

  it('names the most a range can reach', () => {
    const error = planError(planStack({ range: seriesRange(), parts, targetUsableKwh: 200 }));
    expect(error.code).toBe('target_unreachable');
    expect(error.message).toContain('110.59 kWh'); // 3 stacks × 8 modules × 4.608 kWh
    expect(error.message).toContain('8 modules per stack × 3 stacks');
  });

  it('asks for a module count or a target', () => {
    expect(planError(planStack({ range: seriesRange(), parts })).code).toBe('missing_input');
  });
});

describe('properties', () => {
  const ruleArb: fc.Arbitrary<BomRuleInput> = fc.record({
    sku: fc.constantFrom(...Object.values(PART_SKUS)),
    basis: fc.constantFrom('per-system', 'per-stack', 'per-module', 'per-cell-unit', 'per-n-modules'),
    qty: fc.integer({ min: 1, max: 10 }),
    divisor: fc.integer({ min: 1, max: 5 }),
    when: fc.oneof(
      fc.constant({ kind: 'always' as const }),
      fc.constant({ kind: 'dvc-b-or-c' as const }),
      fc.constant({ kind: 'multi-stack' as const }),
      fc.integer({ min: 500, max: 2500 }).map((mm) => ({ kind: 'height-over' as const, mm })),
    ),
  });
  const packParts = fc
    .array(fc.integer({ min: 1, max: 6 }), { minLength: 9, maxLength: 9 })
    .map((sizes) => tidewellParts(Object.fromEntries(Object.values(PART_SKUS).map((sku, i) => [sku, { packSize: sizes[i] }]))));

  it('never orders less of anything as modules are added', () => {
    fc.assert(
      fc.property(
        fc.constantFrom('series' as const, 'parallel' as const),
        fc.array(ruleArb, { maxLength: 12 }),
        packParts,
        fc.integer({ min: 1, max: 3 }),
        fc.integer({ min: 2, max: 7 }),
        (connection, ruleInputs, catalogue, stacks, n) => {
          const range = seriesRange({ connection, ruleInputs, maxModules: 8, maxStacks: 3 });
          const smaller = plan({ range, parts: catalogue, modules: n, stacks });
          const larger = plan({ range, parts: catalogue, modules: n + 1, stacks });
          for (const l of smaller.bom) {
            // More modules mean more height, voltage and units, so no basis or condition asks for less.
            expect(line(larger, l.sku)?.qtyUnits ?? 0).toBeGreaterThanOrEqual(l.qtyUnits);
          }
        },
      ),
    );
  });

  it('gives whole, non-negative pack counts that cover the need', () => {
    fc.assert(
      fc.property(fc.array(ruleArb, { maxLength: 12 }), packParts, fc.integer({ min: 2, max: 8 }), (ruleInputs, catalogue, n) => {
        const p = plan({ range: seriesRange({ ruleInputs }), parts: catalogue, modules: n });
        for (const l of p.bom) {
          expect(Number.isInteger(l.packs) && l.packs >= 0).toBe(true);
          expect(Number.isInteger(l.qtyUnits) && l.qtyUnits >= l.qtyNeeded).toBe(true);
          expect(l.qtyUnits).toBe(l.packs * l.packSize);
        }
      }),
    );
  });

  it('adds one module’s usable energy per module and scales with stacks (not a re-derivation of the sum)', () => {
    // Outside facts, not the planner's formula: a stack of n + 1 modules holds one module more than
    // a stack of n (domain.md §2), and k identical stacks in parallel hold k times one stack.
    // The module's figure comes from its datasheet (the maker's usable kWh) or, without one,
    // from nominal 51.2 V × 100 Ah = 5.12 kWh × the range's depth of discharge (domain.md §1).
    fc.assert(
      fc.property(
        fc.constantFrom('series' as const, 'parallel' as const),
        fc.boolean(),
        fc.option(fc.integer({ min: 100, max: 20_000 }).map((wh) => wh / 1000), { nil: null }),
        fc.option(fc.integer({ min: 50, max: 100 }), { nil: null }),
        fc.integer({ min: 2, max: 7 }),
        fc.integer({ min: 2, max: 3 }),
        (connection, controllerCells, moduleUsable, dod, n, stacks) => {
          const module = makeUnit({ usableKwh: moduleUsable });
          const controller = makeController({ carriesCells: controllerCells, nominalV: 25.6, ratedAh: 50, cellsInSeries: 8, usableKwh: 1.1 });
          const range = seriesRange({ connection, module, controller, defaultDodPct: dod });
          const datasheetModuleKwh = moduleUsable ?? (5.12 * (dod ?? 90)) / 100;
          const one = plan({ range, modules: n });
          const more = plan({ range, modules: n + 1 });
          const many = plan({ range, modules: n, stacks });
          // Figures are shown to 2 dp, so each comparison allows the two roundings.
          expect(Math.abs(more.usableKwh - one.usableKwh - datasheetModuleKwh)).toBeLessThanOrEqual(0.01 + 1e-9);
          expect(Math.abs(many.usableKwh - stacks * one.usableKwh)).toBeLessThanOrEqual(0.005 * (stacks + 1) + 1e-9);
          // A controller with cells adds its maker's 1.1 kWh; one without adds nothing.
          const bare = plan({ range: { ...range, controller: { ...controller, carriesCells: false } }, modules: n });
          expect(Math.abs(one.usableKwh - bare.usableKwh - (controllerCells ? 1.1 : 0))).toBeLessThanOrEqual(0.01 + 1e-9);
        },
      ),
    );
  });
});
