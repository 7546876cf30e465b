import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import {
  dvcClass,
  equivalentFullCycles,
  floorLoadKpa,
  lfpMaxChargeVoltage,
  lfpMinVoltage,
  lfpNominalVoltage,
  lifetimeThroughput,
  nominalKwh,
  nominalWh,
  roundTo,
  splitRoundTripEfficiency,
  usableKwh,
  yearsAtOneCyclePerDay,
} from '../../shared/domain/energy.ts';

describe('nominal energy', () => {
  it('is volts × amp-hours', () => {
    expect(nominalWh(12, 50)).toBe(600); // 12 V × 50 Ah = 600 Wh, general electrical practice
    expect(nominalKwh(51.2, 100)).toBe(5.12); // LFP 16-cell module, 3.2 V/cell, common practice
    expect(nominalKwh(48, 100)).toBe(4.8); // LFP 15-cell module, common practice
    expect(nominalKwh(44.8, 100)).toBe(4.48); // LFP 14-cell module, common practice
  });

  it('builds module voltages from LFP cells', () => {
    expect(lfpNominalVoltage(16)).toBe(51.2); // 16 × 3.2 V LFP nominal, common practice
    expect(lfpNominalVoltage(15)).toBe(48); // 15 × 3.2 V, common practice
    expect(lfpNominalVoltage(14)).toBe(44.8); // 14 × 3.2 V, common practice
    expect(lfpMaxChargeVoltage(16)).toBe(58.4); // 16 × 3.65 V LFP full charge, common practice
    expect(lfpMinVoltage(16)).toBe(40); // 16 × 2.5 V, bottom of the LFP cut-off band, common practice
  });
});

describe('usable energy', () => {
  it("uses nominal × depth of discharge unless the maker gives a figure", () => {
    expect(usableKwh({ nominalKwh: 5, dodPct: 80 })).toBe(4); // 5 kWh at 80 % DoD = 4 kWh, common practice
    expect(usableKwh({ nominalKwh: 5.12, makerUsableKwh: 4.6, dodPct: 80 })).toBe(4.6); // domain.md §1: maker's figure wins
    expect(usableKwh({ nominalKwh: 10 })).toBe(9); // planner default 90 % DoD (our default, stated as an assumption)
  });
});

describe('DC voltage class', () => {
  it('classes a 16-cell module as DVC-A and a 17-cell string as DVC-B', () => {
    expect(dvcClass(lfpMaxChargeVoltage(16))).toBe('A'); // 58.4 V ≤ 60 V: DVC-A, AS/NZS 5139:2019 via IEC 62109-1
    expect(lfpMaxChargeVoltage(17)).toBe(62.05); // 17 × 3.65 V, common practice
    expect(dvcClass(62.05)).toBe('B'); // above 60 V, up to 120 V: DVC-B, AS/NZS 5139:2019 via IEC 62109-1
    expect(dvcClass(2 * 58.4)).not.toBe('A'); // two 48 V-class modules in series are DVC-B or C (domain.md §2)
  });

  it('puts the boundaries at 60 and 120 V', () => {
    expect(dvcClass(60)).toBe('A'); // "up to 60 V DC", AS/NZS 5139:2019 via IEC 62109-1
    expect(dvcClass(60.01)).toBe('B'); // "above 60", AS/NZS 5139:2019 via IEC 62109-1
    expect(dvcClass(120)).toBe('B'); // "up to 120 V DC", AS/NZS 5139:2019 via IEC 62109-1
    expect(dvcClass(120.01)).toBe('C'); // "above 120 V DC", AS/NZS 5139:2019 via IEC 62109-1
  });
});

describe('floor load', () => {
  it('is about 10.1 kPa for 300 kg on 0.65 × 0.45 m', () => {
    expect(roundTo(floorLoadKpa(300, 0.65 * 0.45), 1)).toBe(10.1); // domain.md §2 example; 1.5 kPa threshold AS/NZS 1170.1 from memory
  });

  it('refuses a zero footprint', () => {
    expect(() => floorLoadKpa(300, 0)).toThrow(RangeError);
  });
});

describe('lifetime throughput', () => {
  it("takes the maker's warranted figure over the estimate", () => {
    const t = lifetimeThroughput({ usableKwh: 10, cycleLife: 6000, eolSohPct: 70, warrantedMwh: 30 });
    expect(t.mwh).toBe(30); // domain.md §2: a warranted MWh figure wins
    expect(t.basis).toBe('warranted');
  });

  it('estimates usable × cycles × mean state of health under linear fade', () => {
    const t = lifetimeThroughput({ usableKwh: 10, cycleLife: 6000, eolSohPct: 70 });
    expect(t.mwh).toBe(51); // 10 kWh × 6000 × (1 + 0.70) / 2, linear-fade model of domain.md §2
    expect(t.assumptions.length).toBeGreaterThan(0);
  });

  it('states the end-of-life assumption when the datasheet omits it', () => {
    const t = lifetimeThroughput({ usableKwh: 10, cycleLife: 6000 });
    expect(t.mwh).toBe(54); // 10 × 6000 × (1 + 0.80) / 2: 80 % EoL is the usual cycle-life rating point, common practice
    expect(t.assumptions.join(' ')).toMatch(/80 %/);
  });

  it('gives no figure without cycle life or warranty', () => {
    expect(lifetimeThroughput({ usableKwh: 10 }).mwh).toBeNull();
  });

  it('counts 30 MWh on 10 kWh as 3,000 cycles, about 8.2 years at one a day', () => {
    const cycles = equivalentFullCycles(30, 10);
    expect(cycles).toBe(3000); // domain.md §2 check: 30 MWh ÷ 10 kWh
    expect(roundTo(yearsAtOneCyclePerDay(cycles), 1)).toBe(8.2); // domain.md §2 check: 3,000 ÷ 365
  });
});

describe('round-trip efficiency', () => {
  it('splits into √RTE each way', () => {
    const split = splitRoundTripEfficiency(90);
    expect(roundTo(split.chargePct)).toBe(94.87); // √0.90 = 0.948683…, energy-system simulation convention
    expect(split.dischargePct).toBe(split.chargePct); // equal legs by the √RTE convention
    expect(roundTo((split.chargePct * split.dischargePct) / 100, 6)).toBe(90); // legs multiply back to the RTE
  });

  it('refuses impossible efficiencies', () => {
    expect(() => splitRoundTripEfficiency(0)).toThrow(RangeError);
    expect(() => splitRoundTripEfficiency(101)).toThrow(RangeError);
  });
});

describe('roundTo', () => {
  it('rounds the decimal a reader sees, not the binary approximation', () => {
    expect(Math.round(1.005 * 100) / 100).toBe(1); // IEEE 754: 1.005 is stored as 1.00499…, the trap
    expect(roundTo(1.005, 2)).toBe(1.01); // decimal half-up rounding (decimal.js ROUND_HALF_UP)
  });

  it('never moves a value by more than half a unit in the last place (property)', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), (x) => {
        expect(Math.abs(roundTo(x, 2) - x)).toBeLessThanOrEqual(0.005 + 1e-9); // definition of rounding to 2 dp
      }),
    );
  });
});
