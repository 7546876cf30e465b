// Figures worked out by hand for every demo range, two layouts each. The arithmetic beside
// each value starts from the parts' datasheet values written here (checked against the demo
// catalogue first), never from the planner. Rules of arithmetic: domain.md §2 (series voltages
// add, parallel capacity adds; usable = Σ cell-carrying units; DVC from the maximum voltage,
// AS/NZS 5139:2019 from IEC 62109-1; floor load = mass × 9.81 / footprint / 1000; throughput
// = usable × rated cycles × (1 + SoH at end of life) / 2). Masses are per sold pack.
import { describe, expect, it } from 'vitest';
import { planStack, type PlanRequest, type StackPlan } from '../../shared/domain/planner.ts';
import { demoInverter, demoPart, demoParts, demoRange } from '../support/demo-planner.ts';

function plan(req: Omit<PlanRequest, 'parts' | 'range'> & { range: string }): StackPlan {
  const result = planStack({ ...req, range: demoRange(req.range), parts: demoParts });
  if (!result.ok) throw new Error(`${result.error.code}: ${result.error.message}`);
  return result.plan;
}

/** Datasheet values the hand arithmetic below starts from. */
const SHEET = {
  'HLM-TOR-CTL': { nominalV: 51.2, ratedAh: 50, usableKwh: 2.4, minOperatingV: 44.8, maxChargeV: 58.4, massKg: 34, heightMm: 260, widthMm: 600, depthMm: 240 },
  'HLM-TOR-M5': { nominalV: 102.4, ratedAh: 50, usableKwh: 4.8, minOperatingV: 89.6, maxChargeV: 116.8, massKg: 49, heightMm: 250, cycleLife: 6000, eolSohPct: 70, warrantedMwh: 16 },
  'QRB-HEARTH-CTL': { massKg: 9.5, heightMm: 150, widthMm: 650, depthMm: 200 },
  'QRB-HEARTH-M51': { nominalV: 51.2, ratedAh: 100, usableKwh: 4.9, minOperatingV: 44.8, maxChargeV: 58.4, massKg: 46, heightMm: 230, cycleLife: 6000, eolSohPct: 70 },
  'TVP-SL48-CTL': { massKg: 8.5, heightMm: 140, widthMm: 600, depthMm: 170 },
  'TVP-SL48-M48': { nominalV: 48, ratedAh: 100, usableKwh: 4.56, minOperatingV: 42, maxChargeV: 54, massKg: 44, heightMm: 240, cycleLife: 5000, eolSohPct: 80, warrantedMwh: 15 },
  'QRB-RIDGE-CTL': { massKg: 12, heightMm: 180, widthMm: 560, depthMm: 200 },
  'QRB-RIDGE-M25': { nominalV: 51.2, ratedAh: 50, usableKwh: 2.45, minOperatingV: 44.8, maxChargeV: 58.4, massKg: 26, heightMm: 220, cycleLife: 8000, eolSohPct: 70, warrantedMwh: 12 },
  // Accessories, mass per sold pack (kg)
  'HLM-TOR-FEET': { massKg: 1.6 }, // pack of 4, 80 mm
  'HLM-TOR-EC': { massKg: 0.2 },
  'HLM-TOR-WB-U': { massKg: 1.8 },
  'HLM-ACC-FIX-S': { massKg: 0.2 },
  'HLM-TOR-CLIP': { massKg: 0.15 },
  'HLM-CBL-HV6-030': { massKg: 0.62 },
  'HLM-CCV-15': { massKg: 0.9 },
  'HLM-CDT-25': { massKg: 0.13 }, // per metre
  'HLM-EL-6-15': { massKg: 0.15 },
  'HLM-ACC-ISO': { massKg: 0.9 },
  'HLM-COMM-INV-5': { massKg: 0.2 },
  'HLM-CT-CAN': { massKg: 0.02 },
  'HLM-LINK-2M': { massKg: 0.2 },
  'HLM-ACC-SIGN': { massKg: 0.1 },
  'HLM-TOR-STRAP': { massKg: 1.4 },
  'QRB-HEARTH-FEET': { massKg: 1.6 },
  'QRB-HEARTH-EC': { massKg: 0.25 },
  'QRB-WB-M': { massKg: 1.5 },
  'QRB-WB-S': { massKg: 1.4 },
  'QRB-CBL-LV50-030': { massKg: 3 },
  'QRB-EL-16-15': { massKg: 0.33 },
  'QRB-ACC-FUSEHOLD': { massKg: 0.5 },
  'QRB-ACC-FUSE250': { massKg: 0.2 }, // pack of 2
  'QRB-COMM-INV-5': { massKg: 0.2 },
  'QRB-CT-CAN': { massKg: 0.02 },
  'QRB-LINK-1M': { massKg: 0.1 },
  'QRB-ACC-BUSBAR': { massKg: 2.8 },
  'QRB-ACC-SIGN': { massKg: 0.1 },
  'TVP-SL48-FEET': { massKg: 1.6 },
  'TVP-SL48-EC': { massKg: 0.2 },
  'TVP-WB-S': { massKg: 1.3 },
  'TVP-SL48-SHROUD': { massKg: 0.1 },
  'TVP-CBL-LV50-030': { massKg: 3 },
  'TVP-EL-16-15': { massKg: 0.33 },
  'TVP-ACC-ISO250': { massKg: 1.1 },
  'TVP-COMM-INV-3': { massKg: 0.15 },
  'TVP-CT-CAN': { massKg: 0.02 },
  'TVP-LINK-1M': { massKg: 0.1 },
  'TVP-ACC-SIGN': { massKg: 0.1 },
  'TVP-ACC-STRAP': { massKg: 1.3 },
  'QRB-RIDGE-FEET': { massKg: 1.6 },
  'QRB-RIDGE-EC': { massKg: 0.3 },
  'QRB-RIDGE-LINK': { massKg: 0.2 },
  'QRB-CBL-HV6-030': { massKg: 0.62 },
  'QRB-CCV-15': { massKg: 0.8 },
  'QRB-CDT-25': { massKg: 0.12 }, // per metre
  'QRB-EL-6-15': { massKg: 0.15 },
  'QRB-CT-485': { massKg: 0.02 },
} as const;

describe('the datasheet values the hand arithmetic uses', () => {
  it('are the demo catalogue’s own', () => {
    for (const [sku, sheet] of Object.entries(SHEET)) {
      const p = demoPart(sku);
      const a = p.attributes as unknown as Record<string, unknown>;
      for (const [key, value] of Object.entries(sheet)) {
        const actual = key in p ? (p as unknown as Record<string, unknown>)[key] : a[key];
        expect(actual, `${sku} ${key}`).toBe(value);
      }
    }
  });
});

describe('Hollowmere Tor HV (series; the controller carries 16 cells)', () => {
  it('2 modules, 1 stack, default site', () => {
    const p = plan({ range: 'HLM-TOR', modules: 2 });
    expect(p.nominalVoltage).toBe(256); // 51.2 + 2 × 102.4 = 256.0 V
    expect(p.maxVoltage).toBe(292); // 58.4 + 2 × 116.8 = 292.0 V
    expect(p.minVoltage).toBe(224); // 44.8 + 2 × 89.6 = 224.0 V
    expect(p.dvc).toBe('C'); // 292 V > 120 V
    expect(p.nominalKwh).toBe(12.8); // 256 V × 50 Ah = 12,800 Wh
    expect(p.usableKwh).toBe(12); // 2.4 + 2 × 4.8 = 12.0 kWh
    expect(p.heightMm).toBe(840); // 80 feet + 260 + 2 × 250
    // units 34 + 2 × 49 = 132; feet 1.6 + end cap 0.2 + bracket 1.8 + stud fixings 0.2 + clips 3 × 0.15
    // + cable 0.62 + cover 0.9 + conduit 3 m × 0.13 + earth 0.15 + isolator 0.9 + comms 0.2 + terminator 0.02
    // + signs 0.1 = 7.53; 132 + 7.53 = 139.53 kg. (The audit's 137.74 kg by hand was for the old rules,
    // before the isolator, fixings, conduit, comms cable and signs; the 4.8 kg of "feet as units" is gone.)
    expect(p.massKg).toBe(139.53);
    expect(p.footprintM2).toBe(0.144); // 0.600 × 0.240 m
    expect(p.floorLoadKpa).toBe(9.51); // 139.53 × 9.81 / 0.144 / 1000 = 9.5055
    expect(p.footLoadKn).toBe(0.342); // 139.53 × 9.81 / 1000 / 4 feet = 0.3422
    expect(p.throughputMwh).toBe(61.2); // 12.0 × 6000 × (1 + 0.70) / 2 = 61,200 kWh (issue 14's figure)
    expect(p.equivalentCycles).toBe(5100); // 61,200 / 12.0
    expect(p.warrantedThroughputMwh).toBe(32); // 2 modules × 16 MWh; the controller's cells state none
    expect(p.warrantedThroughputNote).toMatch(/states none for the cells in Tor HV controller/);
  });

  it('4 modules × 2 stacks on the 10 kW three-phase inverter (two battery inputs)', () => {
    const p = plan({ range: 'HLM-TOR', modules: 4, stacks: 2, inverter: demoInverter('HLM-INV-10HV3') });
    expect(p.maxVoltage).toBe(525.6); // 58.4 + 4 × 116.8 = 525.6 V ≤ 600 V window
    expect(p.minVoltage).toBe(403.2); // 44.8 + 4 × 89.6 = 403.2 V ≥ 150 V window
    expect(p.inverterFit).toEqual({ fits: true });
    expect(p.usableKwh).toBe(43.2); // 2 × (2.4 + 4 × 4.8) = 43.2 kWh ≤ 60 kWh
    expect(p.heightMm).toBe(1340); // 80 + 260 + 4 × 250; over 1200 mm, so a strap per stack
    // units 2 × (34 + 4 × 49) = 460; feet 2 × 1.6 + caps 2 × 0.2 + brackets 2 × 1.8 + fixings 2 × 0.2
    // + clips 10 × 0.15 + cables 2 × 0.62 + covers 2 × 0.9 + conduit 3 × 0.13 + earths 2 × 0.15 + isolator 0.9
    // + comms 0.2 + terminator 0.02 + 1 link 0.2 + signs 0.1 + straps 2 × 1.4 = 17.05 (no junction box: 2 inputs)
    expect(p.massKg).toBe(477.05);
    expect(p.floorLoadKpa).toBe(16.25); // 477.05 × 9.81 / (2 × 0.144) / 1000 = 16.2495
    expect(p.footLoadKn).toBe(0.585); // 477.05 × 9.81 / 1000 / 8 feet = 0.58498
    expect(p.throughputMwh).toBe(220.32); // 43.2 × 6000 × 0.85
    expect(p.warrantedThroughputMwh).toBe(128); // 8 modules × 16 MWh
  });
});

describe('Quarnby Hearth 51 (parallel 48 V class; controller without cells)', () => {
  it('3 modules on a masonry wall with the 5 kW 48 V inverter', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 3, inverter: demoInverter('QRB-INV-5LV'), site: { wall: 'masonry' } });
    expect(p.nominalVoltage).toBe(51.2); // parallel: one module's voltage
    expect(p.maxVoltage).toBe(58.4); // ≤ 60 V
    expect(p.dvc).toBe('A');
    expect(p.capacityAh).toBe(300); // 3 × 100 Ah
    expect(p.nominalKwh).toBe(15.36); // 51.2 V × 300 Ah
    expect(p.usableKwh).toBe(14.7); // 3 × 4.9 kWh
    expect(p.heightMm).toBe(930); // 90 + 150 + 3 × 230
    // units 9.5 + 3 × 46 = 147.5; feet 1.6 + cap 0.25 + masonry bracket 1.5 + 3 m cable 3 + earth 0.33
    // + fuse holder 0.5 + fuses (1 pack of 2) 0.2 + comms 0.2 + terminator 0.02 + signs 0.1 = 7.7
    expect(p.massKg).toBe(155.2);
    expect(p.footprintM2).toBe(0.13); // 0.650 × 0.200 m
    expect(p.floorLoadKpa).toBe(11.71); // 155.2 × 9.81 / 0.13 / 1000 = 11.7116
    expect(p.throughputMwh).toBe(74.97); // 14.7 × 6000 × 0.85
    expect(p.equivalentCycles).toBe(5100);
    expect(p.warrantedThroughputMwh).toBeNull(); // the datasheet states no warranted figure
  });

  it('4 modules × 2 stacks on the one-input inverter that parallels two stacks', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 4, stacks: 2, inverter: demoInverter('QRB-INV-5LV') });
    expect(p.usableKwh).toBe(39.2); // 2 × 4 × 4.9 = 39.2 kWh ≤ the inverter's 40 kWh
    expect(p.inverterFit).toEqual({ fits: true });
    // units 2 × (9.5 + 4 × 46) = 387; feet 3.2 + caps 0.5 + stud brackets 2.8 + cables 6 + earths 0.66
    // + fuse holder 0.5 + fuses 0.2 + comms 0.2 + terminator 0.02 + 1 link 0.1 + bus bar 2.8 + signs 0.1 = 17.08
    expect(p.massKg).toBe(404.08);
    expect(p.floorLoadKpa).toBe(15.25); // 404.08 × 9.81 / 0.26 / 1000 = 15.2462
    expect(p.footLoadKn).toBe(0.496); // 404.08 × 9.81 / 1000 / 8 = 0.49550
    expect(p.throughputMwh).toBe(199.92); // 39.2 × 6000 × 0.85
  });
});

describe('Tarrow Stackline 48 (parallel 48 V; brackets per 3 modules)', () => {
  it('2 modules, 1 stack, default site', () => {
    const p = plan({ range: 'TVP-SL48', modules: 2 });
    expect(p.nominalVoltage).toBe(48);
    expect(p.maxVoltage).toBe(54);
    expect(p.dvc).toBe('A'); // 54 V ≤ 60 V
    expect(p.usableKwh).toBe(9.12); // 2 × 4.56
    expect(p.heightMm).toBe(720); // 100 + 140 + 2 × 240
    // units 8.5 + 2 × 44 = 96.5; feet 1.6 + cap 0.2 + 1 bracket 1.3 + shrouds 2 × 0.1 + cable 3 + earth 0.33
    // + isolator 1.1 + comms 0.15 + terminator 0.02 + signs 0.1 = 8.0
    expect(p.massKg).toBe(104.5);
    expect(p.floorLoadKpa).toBe(10.05); // 104.5 × 9.81 / 0.102 / 1000 = 10.0504
    expect(p.throughputMwh).toBe(41.04); // 9.12 × 5000 × (1 + 0.80) / 2
    expect(p.equivalentCycles).toBe(4500);
    expect(p.warrantedThroughputMwh).toBe(30); // 2 × 15 MWh
  });

  it('7 modules × 2 stacks on the two-input 8 kW inverter', () => {
    const p = plan({ range: 'TVP-SL48', modules: 7, stacks: 2, inverter: demoInverter('TVP-INV-8LV') });
    expect(p.usableKwh).toBe(63.84); // 2 × 7 × 4.56
    expect(p.heightMm).toBe(1920); // 100 + 140 + 7 × 240
    // units 2 × (8.5 + 7 × 44) = 633; feet 3.2 + caps 0.4 + brackets 2 × ceil(7/3) = 6 × 1.3 = 7.8
    // + shrouds 14 × 0.1 + cables 6 + earths 0.66 + isolator 1.1 + comms 0.15 + terminator 0.02
    // + 1 link 0.1 + signs 0.1 + straps 2 × 1.3 = 23.53; no combiner: 2 stacks, 2 inputs
    expect(p.massKg).toBe(656.53);
    expect(p.floorLoadKpa).toBe(31.57); // 656.53 × 9.81 / 0.204 / 1000 = 31.5714
    expect(p.footLoadKn).toBe(0.805); // 656.53 × 9.81 / 1000 / 8 = 0.80507
    expect(p.throughputMwh).toBe(287.28); // 63.84 × 5000 × 0.9
    expect(p.equivalentCycles).toBe(4500);
    expect(p.warrantedThroughputMwh).toBe(210); // 14 × 15 MWh
  });
});

describe('Quarnby Ridge HV (series; controller without cells)', () => {
  it('2 modules, 1 stack, default site', () => {
    const p = plan({ range: 'QRB-RIDGE', modules: 2 });
    expect(p.nominalVoltage).toBe(102.4); // 2 × 51.2
    expect(p.maxVoltage).toBe(116.8); // 2 × 58.4
    expect(p.minVoltage).toBe(89.6); // 2 × 44.8
    expect(p.dvc).toBe('B'); // 60 V < 116.8 V ≤ 120 V
    expect(p.usableKwh).toBe(4.9); // 2 × 2.45
    expect(p.heightMm).toBe(700); // 80 + 180 + 2 × 220
    // units 12 + 2 × 26 = 64; feet 1.6 + cap 0.3 + stud bracket 1.4 + links 2 × 0.2 + cable 0.62 + cover 0.8
    // + conduit 3 × 0.12 + earth 0.15 + isolator 0.9 + comms 0.2 + terminator 0.02 + signs 0.1 = 6.85
    expect(p.massKg).toBe(70.85);
    expect(p.floorLoadKpa).toBe(6.21); // 70.85 × 9.81 / 0.112 / 1000 = 6.2057
    expect(p.footLoadKn).toBe(0.174); // 70.85 × 9.81 / 1000 / 4 = 0.17376
    expect(p.throughputMwh).toBe(33.32); // 4.9 × 8000 × 0.85
    expect(p.equivalentCycles).toBe(6800);
    expect(p.warrantedThroughputMwh).toBe(24); // 2 × 12 MWh
  });

  it('5 modules, 1 stack', () => {
    const p = plan({ range: 'QRB-RIDGE', modules: 5 });
    expect(p.nominalVoltage).toBe(256); // 5 × 51.2
    expect(p.maxVoltage).toBe(292); // 5 × 58.4
    expect(p.dvc).toBe('C'); // > 120 V
    expect(p.usableKwh).toBe(12.25); // 5 × 2.45
    expect(p.heightMm).toBe(1360); // 80 + 180 + 5 × 220; a strap above 1200 mm (1.2 kg)
    expect(p.throughputMwh).toBe(83.3); // 12.25 × 8000 × 0.85
    expect(p.warrantedThroughputMwh).toBe(60); // 5 × 12 MWh
  });
});
