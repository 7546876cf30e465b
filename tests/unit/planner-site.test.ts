// The bill of materials and cautions for each kind of site, on the demo ranges. What a job
// needs is checked against the trade, not against the planner's own wording: the sources are
// named beside each check (AS/NZS 5139:2019 and AS/NZS 1170.1 recalled from memory, the
// makers' manuals as the demo catalogue describes them, common practice).
import { describe, expect, it } from 'vitest';
import { planStack, type PlanRequest, type StackPlan } from '../../shared/domain/planner.ts';
import { quoteTotals } from '../../shared/domain/quote.ts';
import { demoInverter, demoPart, demoParts, demoRange, demoRangeCodes } from '../support/demo-planner.ts';

type Req = Omit<PlanRequest, 'parts' | 'range'> & { range: string };

function plan(req: Req): StackPlan {
  const result = planStack({ ...req, range: demoRange(req.range), parts: demoParts });
  if (!result.ok) throw new Error(`${result.error.code}: ${result.error.message}`);
  return result.plan;
}

function refusal(req: Req) {
  const result = planStack({ ...req, range: demoRange(req.range), parts: demoParts });
  if (result.ok) throw new Error('expected a refusal, got a plan');
  return result.error;
}

const line = (p: StackPlan, sku: string) => p.bom.find((l) => l.sku === sku);
const skus = (p: StackPlan) => p.bom.map((l) => l.sku);
const codes = (p: StackPlan) => p.cautions.map((c) => c.code);
const caution = (p: StackPlan, code: string) => p.cautions.find((c) => c.code === code);

describe('wall construction', () => {
  it('Tor: the universal bracket comes without fixings, so the kit for the wall is added', () => {
    // Catalogue: "slotted for stud or masonry fixings (fixings not supplied)".
    expect(demoPart('HLM-TOR-WB-U').description).toMatch(/fixings not supplied/);
    const stud = plan({ range: 'HLM-TOR', modules: 3, site: { wall: 'stud' } });
    expect(line(stud, 'HLM-ACC-FIX-S')?.qtyUnits).toBe(1); // one kit per bracket, one bracket per stack
    expect(line(stud, 'HLM-ACC-FIX-S')?.reason).toMatch(/stud wall/);
    expect(skus(stud)).not.toContain('HLM-ACC-FIX-M');
    const masonry = plan({ range: 'HLM-TOR', modules: 3, stacks: 2, site: { wall: 'masonry' } });
    expect(line(masonry, 'HLM-ACC-FIX-M')?.qtyUnits).toBe(2); // 1 per stack × 2
    expect(skus(masonry)).not.toContain('HLM-ACC-FIX-S');
  });

  it('Hearth and Stackline: the bracket made for the wall (its fixings included)', () => {
    expect(skus(plan({ range: 'QRB-HEARTH', modules: 2, site: { wall: 'stud' } }))).toEqual(expect.arrayContaining(['QRB-WB-S']));
    expect(skus(plan({ range: 'QRB-HEARTH', modules: 2, site: { wall: 'masonry' } }))).toEqual(expect.arrayContaining(['QRB-WB-M']));
    const masonry = plan({ range: 'TVP-SL48', modules: 7, site: { wall: 'masonry' } });
    expect(line(masonry, 'TVP-WB-M')?.qtyUnits).toBe(3); // 1 per 3 modules: ceil(7 / 3) = 3 (domain.md §3)
    expect(skus(masonry)).not.toContain('TVP-WB-S');
  });

  it('the fixing caution names the wall and cites the maker’s manual', () => {
    const p = plan({ range: 'QRB-RIDGE', modules: 2, site: { wall: 'masonry' } });
    expect(caution(p, 'wall_fixing')?.text).toMatch(/masonry.*never into plasterboard alone/);
    expect(caution(p, 'wall_fixing')?.source).toBe("the maker's installation manual"); // issue 14: the manual, not the standard
  });
});

describe('location', () => {
  it('garage: impact protection per stack and the vehicle caution; indoors neither', () => {
    const garage = plan({ range: 'HLM-TOR', modules: 3, stacks: 2, site: { location: 'garage' } });
    expect(line(garage, 'HLM-ACC-BOLL')?.qtyUnits).toBe(2); // one bollard in front of each stack (common practice)
    expect(codes(garage)).toContain('vehicle_impact');
    const stackline = plan({ range: 'TVP-SL48', modules: 3, site: { location: 'garage' } });
    expect(line(stackline, 'TVP-ACC-BOLL')?.qtyUnits).toBe(1);
    const indoor = plan({ range: 'HLM-TOR', modules: 3, site: { location: 'indoor' } });
    expect(skus(indoor)).not.toContain('HLM-ACC-BOLL');
    expect(codes(indoor)).not.toContain('vehicle_impact');
  });

  it('outdoors under cover: a weather hood per stack for units rated for it', () => {
    const p = plan({ range: 'QRB-RIDGE', modules: 3, site: { location: 'outdoor' } });
    expect(demoPart('QRB-RIDGE-M25').ipRating).toBe('IP65'); // at least IP54 (common practice for outdoor batteries)
    expect(line(p, 'QRB-ACC-HOOD')?.qtyUnits).toBe(1);
    expect(codes(p)).toContain('outdoor');
  });

  it('refuses outdoors for an IP21 battery, saying why', () => {
    expect(demoPart('TVP-SL48-M48').ipRating).toBe('IP21'); // IP2X: indoor enclosures only (IEC 60529)
    const error = refusal({ range: 'TVP-SL48', modules: 3, site: { location: 'outdoor' } });
    expect(error.code).toBe('site_unsuitable');
    expect(error.message).toMatch(/IP21/);
    expect(error.message).toMatch(/IP54/);
  });

  it('a wall shared with a habitable room gets a non-combustible board and its caution', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 2, site: { sharesHabitableWall: true } });
    expect(line(p, 'HLM-ACC-BOARD')?.qtyUnits).toBe(1); // fibre-cement board behind the stack (AS/NZS 5139:2019, from memory)
    expect(codes(p)).toContain('habitable_wall');
    expect(codes(plan({ range: 'QRB-HEARTH', modules: 2, site: { sharesHabitableWall: false } }))).not.toContain('habitable_wall');
  });
});

describe('cable run', () => {
  it('8 m on a DVC-C range: a 10 m cable set, 8 m of conduit, the covers, a 10 m comms cable', () => {
    const p = plan({ range: 'QRB-RIDGE', modules: 5, site: { cableRunM: 8 } });
    expect(p.dvc).toBe('C'); // 5 × 58.4 = 292 V > 120 V
    expect(line(p, 'QRB-CBL-HV6-100')).toMatchObject({ qtyUnits: 1, lengthM: 10 }); // shortest set that reaches 8 m
    expect(skus(p)).not.toContain('QRB-CBL-HV6-030');
    // AS/NZS 5139:2019 (trade summaries): DVC-B/C cables protected over the whole run → 8 m of conduit
    expect(line(p, 'QRB-CDT-25')).toMatchObject({ qtyUnits: 8, lengthM: 8 });
    expect(line(p, 'QRB-CDT-25')?.reason).toMatch(/8 m cable run/);
    expect(line(p, 'QRB-CCV-15')).toMatchObject({ qtyUnits: 1, lengthM: 1.5 });
    expect(line(p, 'QRB-COMM-INV-10')?.qtyUnits).toBe(1);
    expect(codes(p)).toContain('cable_protection');
  });

  it('rounds conduit up to whole metres: 2.4 m → 3', () => {
    const p = plan({ range: 'HLM-TOR', modules: 2, site: { cableRunM: 2.4 } });
    expect(line(p, 'HLM-CDT-25')).toMatchObject({ qtyUnits: 3, lengthM: 3 }); // sold by the metre: ceil(2.4)
    expect(line(p, 'HLM-CBL-HV6-030')?.lengthM).toBe(3);
  });

  it('no conduit and no cover for a DVC-A battery', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 2, site: { cableRunM: 4 } });
    expect(p.dvc).toBe('A'); // 58.4 V ≤ 60 V
    expect(p.bom.filter((l) => l.category === 'cable-cover' || l.sku.includes('-CDT-'))).toEqual([]);
    expect(line(p, 'QRB-CBL-LV50-050')?.lengthM).toBe(5);
  });

  it('refuses a run longer than the range’s cables reach', () => {
    const error = refusal({ range: 'QRB-HEARTH', modules: 2, site: { cableRunM: 8 } });
    expect(error.code).toBe('site_unsuitable');
    expect(error.message).toMatch(/8 m run/);
    expect(error.message).toMatch(/longest is 5 m/);
  });
});

describe('stacks and the inverter’s battery inputs', () => {
  it('two stacks on a one-input inverter: a bus bar, and one link between the stacks', () => {
    const inverter = demoInverter('QRB-INV-5LV');
    expect(inverter.batteryInputs).toBe(1);
    const p = plan({ range: 'QRB-HEARTH', modules: 3, stacks: 2, inverter });
    expect(line(p, 'QRB-ACC-BUSBAR')?.qtyUnits).toBe(1);
    expect(line(p, 'QRB-ACC-BUSBAR')?.reason).toMatch(/1 battery input/);
    expect(line(p, 'QRB-LINK-1M')?.qtyUnits).toBe(1); // a daisy chain: stacks − 1
  });

  it('three stacks chain with two links; two stacks on two inputs need no combiner', () => {
    const three = plan({ range: 'TVP-SL48', modules: 2, stacks: 3 });
    expect(line(three, 'TVP-LINK-1M')?.qtyUnits).toBe(2); // 3 stacks − 1
    expect(line(three, 'TVP-CMB-4')?.reason).toMatch(/no inverter chosen, so 1 battery input assumed/);
    const two = plan({ range: 'TVP-SL48', modules: 2, stacks: 2, inverter: demoInverter('TVP-INV-8LV') });
    expect(skus(two)).not.toContain('TVP-CMB-4');
    expect(skus(plan({ range: 'TVP-SL48', modules: 2 }))).not.toContain('TVP-LINK-1M');
  });
});

describe('every demo range on every kind of site', () => {
  const sites = [
    { location: 'indoor', wall: 'stud' },
    { location: 'garage', wall: 'masonry', sharesHabitableWall: true },
    { location: 'garage', country: 'NZ', floor: 'suspended' },
  ] as const;
  for (const code of demoRangeCodes) {
    for (const site of sites) {
      it(`${code} ${JSON.stringify(site)}: isolation, comms, signs, fixings and site parts, every line explained`, () => {
        const p = plan({ range: code, modules: demoRange(code).minModules, site });
        const categories = p.bom.map((l) => l.category);
        // What any battery job needs (AS/NZS 5139:2019, from memory; common practice).
        expect(p.bom.some((l) => /isolator|fuse holder/i.test(l.name)), 'isolation').toBe(true);
        expect(p.bom.some((l) => /comms cable/i.test(l.name)), 'battery-inverter comms').toBe(true);
        expect(p.bom.some((l) => /signage/i.test(l.name)), 'signs').toBe(true);
        expect(categories).toContain('wall-bracket');
        expect(categories).toContain('cable-set');
        expect(p.bom.some((l) => /bollard|barrier/i.test(l.name))).toBe(site.location === 'garage');
        expect(p.bom.some((l) => /backing board/i.test(l.name))).toBe('sharesHabitableWall' in site);
        expect(p.bom.some((l) => /seismic/i.test(l.name))).toBe('country' in site);
        for (const l of p.bom) {
          expect(l.reason.length, l.sku).toBeGreaterThan(5);
          if (l.category !== 'module' && l.category !== 'controller') expect(l.ruleNumbers.length, l.sku).toBeGreaterThan(0);
        }
      });
    }
  }
});

describe('cautions that apply to the site, and no others', () => {
  it('stay quiet where they do not apply', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 2, site: { location: 'indoor', floor: 'slab', country: 'AU', sharesHabitableWall: false } });
    for (const code of ['floor_load', 'vehicle_impact', 'outdoor', 'habitable_wall', 'seismic', 'cable_protection', 'inverter_choice']) {
      expect(codes(p), code).not.toContain(code);
    }
  });

  it('suspended floor: compares the distributed and the concentrated load, and asks for the engineer', () => {
    const p = plan({ range: 'HLM-TOR', modules: 2, site: { floor: 'suspended' } });
    const floor = caution(p, 'floor_load');
    // AS/NZS 1170.1:2002 Table 3.1, residential: 1.5 kPa distributed, 1.8 kN concentrated (recalled from memory).
    expect(floor?.text).toMatch(/9\.5 kPa/); // 139.53 kg × 9.81 / 0.144 m² / 1000 = 9.51 kPa (hand-worked above)
    expect(floor?.text).toMatch(/0\.34 kN on each of its 4 feet/); // 139.53 × 9.81 / 1000 / 4 = 0.342 kN
    expect(floor?.text).toMatch(/1\.5 kPa spread and 1\.8 kN concentrated/);
    expect(floor?.text).toMatch(/building’s engineer/);
    expect(floor?.text).not.toMatch(/memory/); // the user's screen states the figures, not how we recall them
    expect(floor?.source).toMatch(/AS\/NZS 1170\.1:2002 Table 3\.1/);
  });

  it('names every place a battery may not go, and the clearances, citing AS/NZS 5139', () => {
    const p = plan({ range: 'HLM-TOR', modules: 2 });
    const location = caution(p, 'location')!;
    // The places listed in issue 14 (AS/NZS 5139:2019, as a licensed installer summarised it).
    for (const place of [/habitable room/, /ceiling space/, /roof space/, /wall cavity/, /on a roof/, /under stairs/, /access walkway/, /escape\) route/, /exit/]) {
      expect(location.text).toMatch(place);
    }
    expect(location.source).toBe('AS/NZS 5139:2019');
    expect(caution(p, 'clearance')?.text).toMatch(/600 mm.*appliance/);
  });

  it('lists the signs the system needs', () => {
    const text = caution(plan({ range: 'QRB-RIDGE', modules: 2 }), 'signage')!.text;
    // Issue 14: the battery-system sign, the shutdown procedure, isolator labels, the ES sign at the switchboard.
    expect(text).toMatch(/battery-system sign/);
    expect(text).toMatch(/shutdown procedure/);
    expect(text).toMatch(/isolator/);
    expect(text).toMatch(/ES sign at the main switchboard.*UN 3480/);
  });

  it('isolation and DC overcurrent protection: the fault current of a 48 V battery, the voltage of an HV one', () => {
    expect(caution(plan({ range: 'TVP-SL48', modules: 2 }), 'isolation')?.text).toMatch(/fault current/); // common practice: 48 V LFP short-circuit currents run to kA
    expect(caution(plan({ range: 'HLM-TOR', modules: 2 }), 'isolation')?.text).toMatch(/292 V DC/); // 58.4 + 2 × 116.8
  });

  it('New Zealand: seismic restraint under NZS 4219, and the restraint kit', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 2, site: { country: 'NZ' } });
    expect(caution(p, 'seismic')?.source).toMatch(/NZS 4219/); // from memory
    expect(line(p, 'QRB-ACC-SEISMIC')?.qtyUnits).toBe(1);
  });

  it('defers to the standards and licensed practice', () => {
    expect(caution(plan({ range: 'QRB-HEARTH', modules: 1 }), 'licensed_work')?.text).toMatch(/defers to the standards and licensed practice/);
  });
});

describe('the inverter', () => {
  it('names the ceiling the inverter imposes, not the range’s (issue 14: Tor + 6 kW, 150 kWh)', () => {
    const error = refusal({ range: 'HLM-TOR', targetUsableKwh: 150, inverter: demoInverter('HLM-INV-6HV1') });
    expect(error.code).toBe('target_unreachable');
    // 80–450 V window: 58.4 + n × 116.8 ≤ 450 → n ≤ 3; 2.4 + 3 × 4.8 = 16.8 kWh (issue 14's hand figure)
    expect(error.message).toMatch(/16\.8 kWh/);
    expect(error.details?.maxUsableKwh).toBe(16.8);
  });

  it('warns about an inverter outside the range’s list, superseded or discontinued', () => {
    const unlisted = plan({ range: 'HLM-TOR', modules: 2, inverter: demoInverter('HLM-INV-5HV1') });
    expect(unlisted.inverterFit?.fits).toBe(true); // 100–400 V takes 224–292 V
    expect(unlisted.inverterFit?.warnings?.join(' ')).toMatch(/not on Hollowmere Tor HV's list/);
    expect(unlisted.inverterFit?.warnings?.join(' ')).toMatch(/superseded by HLM-INV-6HV1/);
    expect(codes(unlisted)).toContain('inverter_choice');
    const discontinued = plan({ range: 'QRB-HEARTH', modules: 2, inverter: demoInverter('QRB-INV-3LV') });
    expect(discontinued.inverterFit?.warnings?.join(' ')).toMatch(/discontinued/);
    const listed = plan({ range: 'HLM-TOR', modules: 2, inverter: demoInverter('HLM-INV-6HV1') });
    expect(listed.inverterFit).toEqual({ fits: true });
  });

  it('refuses a module count and a target together rather than dropping one', () => {
    const error = refusal({ range: 'HLM-TOR', modules: 3, targetUsableKwh: 10 });
    expect(error.code).toBe('conflicting_input');
  });

  it('puts the inverter on the BOM when asked, priced, and leaves it out of the stack mass', () => {
    const inverter = demoInverter('HLM-INV-6HV1');
    const without = plan({ range: 'HLM-TOR', modules: 2, inverter });
    const withIt = plan({ range: 'HLM-TOR', modules: 2, inverter, includeInverter: true });
    expect(line(withIt, 'HLM-INV-6HV1')).toMatchObject({ qtyUnits: 1, category: 'inverter', unitPriceCents: demoPart('HLM-INV-6HV1').listPriceCents, ruleNumbers: [] });
    expect(skus(without)).not.toContain('HLM-INV-6HV1');
    expect(withIt.massKg).toBe(without.massKg); // it hangs on its own wall
    expect(withIt.totals.subtotalCents - without.totals.subtotalCents).toBe(demoPart('HLM-INV-6HV1').listPriceCents);
  });
});

describe('site defaults', () => {
  it('says what it assumed when the site is not given', () => {
    const p = plan({ range: 'HLM-TOR', modules: 2 });
    expect(p.site).toEqual({ cableRunM: 3, wall: 'stud', location: 'indoor', sharesHabitableWall: false, floor: 'slab', country: 'AU' });
    expect(p.siteAssumed).toHaveLength(6);
    expect(plan({ range: 'HLM-TOR', modules: 2, site: { cableRunM: 5, wall: 'masonry' } }).siteAssumed).toHaveLength(4);
  });
});

describe('prices', () => {
  it('GST on the quote total: domain.md §5 worked example, three lines of $0.35', () => {
    const lines = [1, 2, 3].map(() => ({ packs: 1, unitPriceCents: 35 }));
    expect(quoteTotals(lines)).toMatchObject({ subtotalCents: 105, gstCents: 11, totalCents: 116 }); // $0.11 by the total-invoice rule (GST Act s 9-90)
    expect(quoteTotals(lines, 'per-line').gstCents).toBe(12); // $0.12 rounding each line
  });

  it('prices each line at the list price per sold pack, and totals them', () => {
    const p = plan({ range: 'QRB-HEARTH', modules: 3 });
    const fuses = line(p, 'QRB-ACC-FUSE250')!;
    expect(fuses).toMatchObject({ packs: 1, unitPriceCents: demoPart('QRB-ACC-FUSE250').listPriceCents }); // one pack of 2, priced per pack
    const modules = line(p, 'QRB-HEARTH-M51')!;
    expect(modules.lineTotalCents).toBe(3 * demoPart('QRB-HEARTH-M51').listPriceCents); // 3 × list price
    const subtotal = p.bom.reduce((s, l) => s + (l.lineTotalCents ?? 0), 0);
    expect(p.totals.subtotalCents).toBe(subtotal);
    expect(p.totals.gstCents).toBe(Math.round(subtotal / 10)); // 10 % of whole-dollar list prices is whole cents
    expect(p.totals.totalCents).toBe(subtotal + p.totals.gstCents);
  });
});
