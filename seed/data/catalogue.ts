// Demo catalogue: three invented makers, their parts, four ranges and a few inverters.
// Every name, product, figure and code here is invented for the demo scenario. It is plain
// data; the seed scripts decide how it reaches the database. Deterministic: nothing here
// depends on the clock or on randomness, so the same GTINs and SKUs come out every time.
import type { CategoryCode, Compliance, PartAttributes } from '../../shared/contracts/part-attributes.ts';

// ---------------------------------------------------------------------------------------
// Shapes

export type MakerCode = 'HLM' | 'QRB' | 'TVP';

export interface DemoMaker {
  code: MakerCode;
  name: string;
  /** ISO 3166-1 alpha-2. */
  country: string;
}

export type PartUnit = 'each' | 'pack' | 'set' | 'm';
export type Lifecycle = 'active' | 'superseded' | 'discontinued';

export interface DangerousGoods {
  unNumber: 'UN3480' | 'UN3481';
  class: '9';
  /** Nominal energy, V × Ah. */
  whRating: number;
}

export interface SupplierSku {
  supplier: string;
  sku: string;
}

export interface DemoPart {
  sku: string;
  name: string;
  category: CategoryCode;
  maker: MakerCode;
  description: string;
  gtin?: string;
  unit: PartUnit;
  /** Units in one sellable pack (feet: 4 in a pack). 1 for loose items and per-metre goods. */
  packSize: number;
  massKg: number;
  widthMm?: number;
  heightMm?: number;
  depthMm?: number;
  ipRating?: string;
  lifecycle: Lifecycle;
  supersededBy?: string;
  dangerousGoods?: DangerousGoods;
  /** Ex tax, in cents. */
  costCents: number;
  /** Ex tax, in cents. */
  listPriceCents: number;
  attributes: PartAttributes;
  compliance?: Compliance;
  supplierSkus?: SupplierSku[];
}

/** Same shape as the BOM rule contract in shared/domain/bom-rules.ts (kept local on purpose). */
export type BomRule = {
  sku: string;
  basis: 'per-system' | 'per-stack' | 'per-module' | 'per-cell-unit' | 'per-n-modules' | 'per-stack-link' | 'per-metre-of-run';
  qty: number;
  divisor?: number;
  when?:
    | { kind: 'always' }
    | { kind: 'dvc-b-or-c' }
    | { kind: 'multi-stack' }
    | { kind: 'height-over'; mm: number }
    | { kind: 'wall'; wall: 'stud' | 'masonry' }
    | { kind: 'location'; location: 'indoor' | 'garage' | 'outdoor' }
    | { kind: 'shares-habitable-wall' }
    | { kind: 'floor'; floor: 'slab' | 'suspended' }
    | { kind: 'country'; country: 'AU' | 'NZ' }
    | { kind: 'stacks-over-inputs' }
    | { kind: 'run-within'; overM: number; upToM: number };
};

/** Rules choosing one part by the battery-to-inverter cable run: the shortest that reaches. */
function byRun(basis: BomRule['basis'], options: [sku: string, upToM: number][]): BomRule[] {
  return options.map(([sku, upToM], i) => ({ sku, basis, qty: 1, when: { kind: 'run-within', overM: i === 0 ? 0 : options[i - 1]![1], upToM } }));
}

/** What every site adds, whatever the range: the parts a licensed installer would expect on the job. */
function siteRules(p: { bollard: string; hood: string; board: string; seismic: string }): BomRule[] {
  return [
    { sku: p.bollard, basis: 'per-stack', qty: 1, when: { kind: 'location', location: 'garage' } },
    { sku: p.hood, basis: 'per-stack', qty: 1, when: { kind: 'location', location: 'outdoor' } },
    { sku: p.board, basis: 'per-stack', qty: 1, when: { kind: 'shares-habitable-wall' } },
    { sku: p.seismic, basis: 'per-stack', qty: 1, when: { kind: 'country', country: 'NZ' } },
  ];
}

export interface DemoRange {
  code: string;
  name: string;
  maker: MakerCode;
  connection: 'series' | 'parallel';
  controllerSku: string;
  moduleSku: string;
  minModules: number;
  maxModules: number;
  maxStacks: number;
  baseHeightMm: number;
  defaultDodPct: number;
  compatibleInverterSkus: string[];
  /** Accessory lines only: the controller and modules come from controllerSku/moduleSku. */
  rules: BomRule[];
}

// ---------------------------------------------------------------------------------------
// Makers and the suppliers that carry them

export const makers: DemoMaker[] = [
  { code: 'HLM', name: 'Hollowmere Energy', country: 'AU' },
  { code: 'QRB', name: 'Quarnby Cells', country: 'NZ' },
  { code: 'TVP', name: 'Tarrow Vale Power', country: 'GB' },
];

/** Supplier codes used in `supplierSkus`; the supplier seed should create these two. */
export const catalogueSuppliers = [
  { code: 'KESTREL', name: 'Kestrel Trade Supply', carries: ['HLM', 'QRB'] as MakerCode[] },
  { code: 'MARRAM', name: 'Marram Wholesale', carries: ['QRB', 'TVP'] as MakerCode[] },
] as const;

// ---------------------------------------------------------------------------------------
// Helpers

/** GS1 mod-10 check digit: weights 3,1,3,1… from the rightmost digit. */
function gs1Check(body: string): number {
  let sum = 0;
  for (let i = 0; i < body.length; i++) {
    sum += Number(body[body.length - 1 - i]) * (i % 2 === 0 ? 3 : 1);
  }
  return (10 - (sum % 10)) % 10;
}

/** GS1's documentation company prefix, padded to GTIN-13, then a 5-digit item reference. */
const GTIN_PREFIX = '0614141';
const MAKER_GTIN_BLOCK: Record<MakerCode, number> = { HLM: 10000, QRB: 20000, TVP: 30000 };
const gtinCounters: Record<MakerCode, number> = { HLM: 0, QRB: 0, TVP: 0 };
function nextGtin(maker: MakerCode): string {
  gtinCounters[maker] += 1;
  const body = GTIN_PREFIX + String(MAKER_GTIN_BLOCK[maker] + gtinCounters[maker]).padStart(5, '0');
  return body + String(gs1Check(body));
}

/** Nominal energy in Wh, rounded to 0.1 Wh so 44.4 × 94 reads 4173.6. */
function wh(v: number, ah: number): number {
  return Math.round(v * ah * 10) / 10;
}

function lithium(v: number, ah: number): DangerousGoods {
  return { unNumber: 'UN3480', class: '9', whRating: wh(v, ah) };
}

/** List price from cost: a markup, rounded to whole dollars. */
function list(costCents: number, markup: number): number {
  return Math.round((costCents * markup) / 100) * 100;
}

const BATTERY_STANDARDS = ['IEC 62619', 'IEC 63056', 'UN 38.3'];
const CONTROLLER_STANDARDS = ['IEC 62619', 'IEC 62477-1', 'UN 38.3'];
const INVERTER_STANDARDS = ['IEC 62109-1', 'IEC 62109-2', 'AS/NZS 4777.2'];

function certified(standards: string[], sku: string, date: string, ip?: string): Compliance {
  return {
    standardsTestedTo: standards,
    certificationListing: `Demo approvals register ${sku}`,
    certificationDate: date,
    ...(ip ? { enclosureIp: ip } : {}),
    touchSafeConnectors: true,
  };
}

/** Part fields a builder provides; GTINs and supplier codes are added below. */
type Draft = Omit<DemoPart, 'gtin' | 'supplierSkus'> & { noGtin?: true };

const drafts: Draft[] = [];
function add(...parts: Draft[]): void {
  drafts.push(...parts);
}

type Common = Pick<Draft, 'sku' | 'name' | 'maker' | 'description' | 'costCents'> &
  Partial<Pick<Draft, 'lifecycle' | 'supersededBy' | 'noGtin' | 'unit' | 'packSize' | 'ipRating' | 'compliance'>> & {
    markup?: number;
    mass: number;
    dims?: [w: number, h: number, d: number];
  };

function base(c: Common, defaults: { unit: PartUnit; markup: number }): Omit<Draft, 'category' | 'attributes'> {
  const part: Omit<Draft, 'category' | 'attributes'> = {
    sku: c.sku,
    name: c.name,
    maker: c.maker,
    description: c.description,
    unit: c.unit ?? defaults.unit,
    packSize: c.packSize ?? 1,
    massKg: c.mass,
    lifecycle: c.lifecycle ?? 'active',
    costCents: c.costCents,
    listPriceCents: list(c.costCents, c.markup ?? defaults.markup),
  };
  if (c.dims) [part.widthMm, part.heightMm, part.depthMm] = c.dims;
  if (c.ipRating) part.ipRating = c.ipRating;
  if (c.supersededBy) part.supersededBy = c.supersededBy;
  if (c.compliance) part.compliance = c.compliance;
  if (c.noGtin) part.noGtin = true;
  return part;
}

type CellAttrs<C extends 'module' | 'controller'> = Extract<PartAttributes, { category: C }>;

function moduleFamily(c: Common & { attrs: Omit<CellAttrs<'module'>, 'category'> }): Draft {
  return {
    ...base(c, { unit: 'each', markup: 1.36 }),
    category: 'module',
    attributes: { category: 'module', ...c.attrs },
    dangerousGoods: lithium(c.attrs.nominalV, c.attrs.ratedAh),
  };
}

function controllerPart(c: Common & { attrs: Omit<CellAttrs<'controller'>, 'category'> }): Draft {
  const { nominalV, ratedAh } = c.attrs;
  const draft: Draft = {
    ...base(c, { unit: 'each', markup: 1.36 }),
    category: 'controller',
    attributes: { category: 'controller', ...c.attrs },
  };
  if (c.attrs.carriesCells && nominalV !== undefined && ratedAh !== undefined) {
    draft.dangerousGoods = lithium(nominalV, ratedAh);
  }
  return draft;
}

function simple<C extends Exclude<CategoryCode, 'module' | 'controller'>>(
  category: C,
  c: Common & { attrs: Omit<Extract<PartAttributes, { category: C }>, 'category'> },
  defaults: { unit: PartUnit; markup: number } = { unit: 'each', markup: 1.6 },
): Draft {
  return {
    ...base(c, defaults),
    category,
    attributes: { category, ...c.attrs } as PartAttributes,
  };
}

/** Cable sets in several lengths: sku `${prefix}-${length × 10, 3 digits}`. */
function cableSets(
  maker: MakerCode,
  prefix: string,
  label: string,
  crossSectionMm2: number,
  connector: string,
  lengths: number[],
  costPerM: number,
  fixedCost: number,
): Draft[] {
  return lengths.map((lengthM) =>
    simple(
      'cable-set',
      {
        sku: `${prefix}-${String(Math.round(lengthM * 10)).padStart(3, '0')}`,
        name: `${label} ${crossSectionMm2} mm², ${lengthM} m`,
        maker,
        description: `Positive and negative battery cables, ${crossSectionMm2} mm² fine-strand copper, ${lengthM} m each, terminated with ${connector} at the battery end and lugs at the inverter end.`,
        costCents: Math.round(fixedCost + costPerM * lengthM),
        mass: Math.round((0.3 + lengthM * crossSectionMm2 * 0.018) * 100) / 100,
        unit: 'set',
        attrs: { lengthM, crossSectionMm2, connector },
      },
      { unit: 'set', markup: 1.55 },
    ),
  );
}

function feet(
  maker: MakerCode,
  sku: string,
  name: string,
  heightMm: number,
  adjustmentMm: number,
  loadRatingKg: number,
  costCents: number,
  extra: Partial<Common> = {},
): Draft {
  return simple(
    'feet',
    {
      sku,
      name,
      maker,
      description: `Set of 4 adjustable feet, ${heightMm} mm nominal height (±${adjustmentMm / 2} mm), rated ${loadRatingKg} kg per set. Sold in packs of 4.`,
      costCents,
      mass: 1.6,
      unit: 'pack',
      packSize: 4,
      ...extra,
      attrs: { unitsPerSet: 4, heightMm, adjustmentMm, loadRatingKg },
    },
    { unit: 'pack', markup: 1.6 },
  );
}

function accessory(
  maker: MakerCode,
  sku: string,
  name: string,
  purpose: string,
  description: string,
  costCents: number,
  mass: number,
  extra: Partial<Common> = {},
): Draft {
  return simple('accessory', { sku, name, maker, description, costCents, mass, ...extra, attrs: { purpose } });
}

// =======================================================================================
// Hollowmere Energy — the Tor HV range (series, controller carries cells)

add(
  moduleFamily({
    sku: 'HLM-TOR-M5',
    name: 'Tor HV battery module 5.1 kWh',
    maker: 'HLM',
    description: 'High-voltage LFP module, 32 cells in series, 102.4 V × 50 Ah. Plugs into the unit below; series stack of 2–8 under a Tor controller.',
    costCents: 212_000,
    mass: 49,
    dims: [600, 250, 240],
    ipRating: 'IP55',
    compliance: certified(BATTERY_STANDARDS, 'HLM-TOR-M5', '2024-03-18', 'IP55'),
    attrs: {
      nominalV: 102.4,
      ratedAh: 50,
      usableKwh: 4.8,
      chemistry: 'LFP',
      cellsInSeries: 32,
      minOperatingV: 89.6,
      maxChargeV: 116.8,
      maxChargeA: 25,
      maxDischargeA: 50,
      cycleLife: 6000,
      eolSohPct: 70,
      warrantedMwh: 16,
      roundTripEfficiencyPct: 95,
    },
  }),
  moduleFamily({
    sku: 'HLM-TOR-M46',
    name: 'Tor HV battery module 4.6 kWh (first generation)',
    maker: 'HLM',
    description: 'First-generation Tor module, 32 cells, 102.4 V × 45 Ah. Replaced by the 5.1 kWh module; do not mix generations in one stack.',
    costCents: 196_000,
    mass: 47.5,
    dims: [600, 250, 240],
    ipRating: 'IP55',
    lifecycle: 'superseded',
    supersededBy: 'HLM-TOR-M5',
    compliance: certified(BATTERY_STANDARDS, 'HLM-TOR-M46', '2021-09-06', 'IP55'),
    attrs: {
      nominalV: 102.4,
      ratedAh: 45,
      usableKwh: 4.3,
      chemistry: 'LFP',
      cellsInSeries: 32,
      minOperatingV: 89.6,
      maxChargeV: 116.8,
      maxChargeA: 22.5,
      maxDischargeA: 45,
      cycleLife: 6000,
      eolSohPct: 70,
      roundTripEfficiencyPct: 94,
    },
  }),
  controllerPart({
    sku: 'HLM-TOR-CTL',
    name: 'Tor HV controller with 2.5 kWh cells',
    maker: 'HLM',
    description: 'Top unit of a Tor stack: battery management, DC breaker, state-of-charge display and 16 LFP cells of its own (51.2 V × 50 Ah) in series with the modules.',
    costCents: 168_000,
    mass: 34,
    dims: [600, 260, 240],
    ipRating: 'IP55',
    compliance: certified(CONTROLLER_STANDARDS, 'HLM-TOR-CTL', '2024-03-18', 'IP55'),
    attrs: {
      carriesCells: true,
      nominalV: 51.2,
      ratedAh: 50,
      usableKwh: 2.4,
      chemistry: 'LFP',
      cellsInSeries: 16,
      minOperatingV: 44.8,
      maxChargeV: 58.4,
      maxChargeA: 25,
      maxDischargeA: 50,
      cycleLife: 6000,
      eolSohPct: 70,
      roundTripEfficiencyPct: 95,
      hasDcBreaker: true,
      hasDisplay: true,
      comms: ['CAN', 'RS485', 'Wi-Fi'],
      maxStackModules: 8,
    },
  }),
  controllerPart({
    sku: 'HLM-TOR-CTL1',
    name: 'Tor HV controller, first generation',
    maker: 'HLM',
    description: 'First-generation Tor controller with 16 cells (51.2 V × 45 Ah), for first-generation modules only.',
    costCents: 155_000,
    mass: 33,
    dims: [600, 260, 240],
    ipRating: 'IP55',
    lifecycle: 'superseded',
    supersededBy: 'HLM-TOR-CTL',
    compliance: certified(CONTROLLER_STANDARDS, 'HLM-TOR-CTL1', '2021-09-06', 'IP55'),
    attrs: {
      carriesCells: true,
      nominalV: 51.2,
      ratedAh: 45,
      usableKwh: 2.15,
      chemistry: 'LFP',
      cellsInSeries: 16,
      minOperatingV: 44.8,
      maxChargeV: 58.4,
      cycleLife: 6000,
      eolSohPct: 70,
      hasDcBreaker: true,
      hasDisplay: false,
      comms: ['CAN', 'RS485'],
      maxStackModules: 6,
    },
  }),
  moduleFamily({
    sku: 'HLM-DUO-M25',
    name: 'Duo 25 compact battery module 2.6 kWh',
    maker: 'HLM',
    description: 'Compact 25.6 V LFP module (8 cells × 100 Ah) for small off-grid and backup systems; stands alone, not part of a stack range.',
    costCents: 118_000,
    mass: 26,
    dims: [500, 220, 180],
    ipRating: 'IP54',
    compliance: certified(BATTERY_STANDARDS, 'HLM-DUO-M25', '2023-05-22', 'IP54'),
    attrs: {
      nominalV: 25.6,
      ratedAh: 100,
      usableKwh: 2.45,
      chemistry: 'LFP',
      cellsInSeries: 8,
      minOperatingV: 22.4,
      maxChargeV: 29.2,
      maxChargeA: 50,
      maxDischargeA: 100,
      cycleLife: 4000,
      eolSohPct: 70,
      roundTripEfficiencyPct: 94,
    },
  }),
  feet('HLM', 'HLM-TOR-FEET', 'Tor adjustable feet, pack of 4', 80, 20, 600, 3_900, { ipRating: 'IP65' }),
  feet('HLM', 'HLM-TOR-FEET-T', 'Tor tall feet for flood-prone sites, pack of 4', 150, 20, 600, 6_400),
  feet('HLM', 'HLM-TOR-FEET0', 'Tor feet (first generation), pack of 4', 75, 10, 450, 3_500, {
    lifecycle: 'superseded',
    supersededBy: 'HLM-TOR-FEET',
  }),
  simple('end-cap', {
    sku: 'HLM-TOR-EC',
    name: 'Tor bottom-connector end cap',
    maker: 'HLM',
    description: 'Covers the open connector on the underside of the bottom unit in a Tor stack.',
    costCents: 1_800,
    mass: 0.2,
    ipRating: 'IP55',
    attrs: { connectorType: 'Tor HV 4-pole' },
  }),
  simple('end-cap', {
    sku: 'HLM-TOR-EC0',
    name: 'Tor end cap (first generation)',
    maker: 'HLM',
    description: 'End cap for first-generation Tor units with the older 3-pole connector.',
    costCents: 1_500,
    mass: 0.2,
    lifecycle: 'discontinued',
    attrs: { connectorType: 'Tor HV 3-pole' },
  }),
  simple('wall-bracket', {
    sku: 'HLM-TOR-WB-U',
    name: 'Tor wall bracket, universal',
    maker: 'HLM',
    description: 'Anti-tip wall bracket for the top of a Tor stack, slotted for stud or masonry fixings (fixings not supplied).',
    costCents: 4_200,
    mass: 1.8,
    attrs: { fixing: 'universal', unitsSupported: 9 },
  }),
  simple('wall-bracket', {
    sku: 'HLM-TOR-WB-S',
    name: 'Tor wall bracket, timber stud',
    maker: 'HLM',
    description: 'Anti-tip wall bracket with 14 g timber screws for stud walls.',
    costCents: 3_900,
    mass: 1.6,
    attrs: { fixing: 'stud', unitsSupported: 9 },
  }),
  simple('wall-bracket', {
    sku: 'HLM-TOR-WB-M',
    name: 'Tor wall bracket, masonry',
    maker: 'HLM',
    description: 'Anti-tip wall bracket with M8 masonry anchors for brick and block walls.',
    costCents: 4_400,
    mass: 1.9,
    attrs: { fixing: 'masonry', unitsSupported: 9 },
  }),
  accessory('HLM', 'HLM-TOR-CLIP', 'Tor unit lock clips (pair)', 'Locks each cell-carrying unit to the one below it', 'A pair of stainless lock clips for one Tor unit; one pair for each module and for the controller.', 1_200, 0.15, { unit: 'set' }),
  accessory('HLM', 'HLM-TOR-STRAP', 'Tor tall-stack restraint strap kit', 'Mid-height restraint for stacks over 1200 mm', 'Steel strap, wall plate and fixings restraining a tall stack at mid height; for seismic-zone and tall installations.', 5_900, 1.4),
  accessory('HLM', 'HLM-LINK-2M', 'Tor stack-to-stack comms link, 2 m', 'Links controller comms between parallel stacks', 'Shielded comms lead, 2 m, linking the controller of one Tor stack to the next when stacks run in parallel.', 2_400, 0.2),
  simple('comms-terminator', {
    sku: 'HLM-CT-CAN',
    name: 'Hollowmere CAN bus terminator',
    maker: 'HLM',
    description: '120 Ω terminating plug for the last device on the battery CAN bus.',
    costCents: 900,
    mass: 0.02,
    attrs: { protocol: 'CAN' },
  }),
  simple('comms-terminator', {
    sku: 'HLM-CT-485',
    name: 'Hollowmere RS485 terminator',
    maker: 'HLM',
    description: 'Terminating plug for the last device on an RS485 link.',
    costCents: 900,
    mass: 0.02,
    attrs: { protocol: 'RS485' },
  }),
  ...cableSets('HLM', 'HLM-CBL-HV6', 'Tor HV battery cable set', 6, 'touch-safe 2-pole HV plug', [1.5, 3, 5, 10, 20], 650, 4_500),
  ...cableSets('HLM', 'HLM-CBL-HV10', 'Tor HV battery cable set', 10, 'touch-safe 2-pole HV plug', [1.5, 3, 5, 10, 20], 900, 5_200),
  {
    ...cableSets('HLM', 'HLM-CBL-HV6', 'Tor HV battery cable set (old plug)', 6, 'first-generation HV plug', [2.5], 600, 4_000)[0],
    lifecycle: 'discontinued',
  },
  simple('cable-cover', {
    sku: 'HLM-CCV-15',
    name: 'Tor clip-on cable-protection cover, 1.5 m',
    maker: 'HLM',
    description: 'Clip-on polycarbonate cover for the battery cables from the controller down the wall; continue the run in conduit.',
    costCents: 3_600,
    mass: 0.9,
    attrs: { lengthM: 1.5, material: 'UV-stable polycarbonate' },
  }),
  simple('cable-cover', {
    sku: 'HLM-CCV-30',
    name: 'Tor clip-on cable-protection cover, 3 m',
    maker: 'HLM',
    description: 'Clip-on polycarbonate cable cover, 3 m, for longer runs beside the stack.',
    costCents: 6_200,
    mass: 1.7,
    attrs: { lengthM: 3, material: 'UV-stable polycarbonate' },
  }),
  simple('cable-cover', {
    sku: 'HLM-CCV-15S',
    name: 'Tor steel cable-protection cover, 1.5 m',
    maker: 'HLM',
    description: 'Galvanised steel cable cover for garages and other places where impact is likely.',
    costCents: 5_400,
    mass: 2.3,
    attrs: { lengthM: 1.5, material: 'galvanised steel' },
  }),
  simple('earth-lead', {
    sku: 'HLM-EL-6-15',
    name: 'Earth bonding lead 6 mm², 1.5 m',
    maker: 'HLM',
    description: 'Green/yellow earth bonding lead with M6 lugs, from the stack earth stud to the installation earth.',
    costCents: 1_400,
    mass: 0.15,
    attrs: { lengthM: 1.5, crossSectionMm2: 6 },
  }),
  simple('earth-lead', {
    sku: 'HLM-EL-6-30',
    name: 'Earth bonding lead 6 mm², 3 m',
    maker: 'HLM',
    description: 'Green/yellow earth bonding lead with M6 lugs, 3 m.',
    costCents: 1_900,
    mass: 0.28,
    attrs: { lengthM: 3, crossSectionMm2: 6 },
  }),
  simple('earth-lead', {
    sku: 'HLM-EL-16-30',
    name: 'Earth bonding lead 16 mm², 3 m',
    maker: 'HLM',
    description: 'Heavy green/yellow earth bonding lead with M8 lugs, 3 m.',
    costCents: 3_400,
    mass: 0.62,
    attrs: { lengthM: 3, crossSectionMm2: 16 },
  }),
);

// Hollowmere inverters
add(
  simple(
    'inverter',
    {
      sku: 'HLM-INV-6HV1',
      name: 'Hollowmere HV hybrid inverter 6 kW, single phase',
      maker: 'HLM',
      description: 'Single-phase hybrid inverter with one high-voltage battery input, 80–450 V DC.',
      costCents: 245_000,
      mass: 24,
      dims: [480, 560, 190],
      ipRating: 'IP65',
      compliance: certified(INVERTER_STANDARDS, 'HLM-INV-6HV1', '2023-11-02', 'IP65'),
      attrs: { batteryMinV: 80, batteryMaxV: 450, maxChargeA: 25, maxDischargeA: 25, batteryInputs: 1, maxBatteryKwh: 30, ratedPowerKw: 6, phases: 1 },
    },
    { unit: 'each', markup: 1.3 },
  ),
  simple(
    'inverter',
    {
      sku: 'HLM-INV-5HV1',
      name: 'Hollowmere HV hybrid inverter 5 kW (previous model)',
      maker: 'HLM',
      description: 'Previous single-phase hybrid inverter, one battery input, 100–400 V DC. Replaced by the 6 kW model.',
      costCents: 219_000,
      mass: 23,
      dims: [480, 560, 190],
      ipRating: 'IP65',
      lifecycle: 'superseded',
      supersededBy: 'HLM-INV-6HV1',
      compliance: certified(INVERTER_STANDARDS, 'HLM-INV-5HV1', '2020-07-14', 'IP65'),
      attrs: { batteryMinV: 100, batteryMaxV: 400, maxChargeA: 20, maxDischargeA: 20, batteryInputs: 1, maxBatteryKwh: 20, ratedPowerKw: 5, phases: 1 },
    },
    { unit: 'each', markup: 1.3 },
  ),
  simple(
    'inverter',
    {
      sku: 'HLM-INV-10HV3',
      name: 'Hollowmere HV hybrid inverter 10 kW, three phase',
      maker: 'HLM',
      description: 'Three-phase hybrid inverter with two high-voltage battery inputs, 150–600 V DC.',
      costCents: 398_000,
      mass: 33,
      dims: [520, 620, 220],
      ipRating: 'IP65',
      compliance: certified(INVERTER_STANDARDS, 'HLM-INV-10HV3', '2024-01-29', 'IP65'),
      attrs: { batteryMinV: 150, batteryMaxV: 600, maxChargeA: 30, maxDischargeA: 30, batteryInputs: 2, maxBatteryKwh: 60, ratedPowerKw: 10, phases: 3 },
    },
    { unit: 'each', markup: 1.3 },
  ),
  simple(
    'inverter',
    {
      sku: 'HLM-INV-30C3',
      name: 'Hollowmere commercial hybrid inverter 30 kW, three phase',
      maker: 'HLM',
      description: 'Small-business three-phase hybrid inverter with three battery inputs, 200–1000 V DC.',
      costCents: 1_120_000,
      mass: 58,
      dims: [640, 800, 280],
      ipRating: 'IP66',
      compliance: certified(INVERTER_STANDARDS, 'HLM-INV-30C3', '2024-06-10', 'IP66'),
      attrs: { batteryMinV: 200, batteryMaxV: 1000, maxChargeA: 50, maxDischargeA: 50, batteryInputs: 3, maxBatteryKwh: 150, ratedPowerKw: 30, phases: 3 },
    },
    { unit: 'each', markup: 1.25 },
  ),
);

// Hollowmere accessories
add(
  accessory('HLM', 'HLM-ACC-WIFI', 'Hollowmere Wi-Fi monitoring dongle', 'Cloud monitoring for controller and inverter', 'Plug-in Wi-Fi dongle for the controller comms port; reports state of charge and alarms to the monitoring portal.', 6_800, 0.1),
  accessory('HLM', 'HLM-ACC-CT', 'Hollowmere CT meter kit', 'Measures grid import/export for the inverter', 'Split-core current transformer and DIN-rail meter for the switchboard.', 9_500, 0.4),
  accessory('HLM', 'HLM-ACC-HOOD', 'Tor weather hood', 'Shades the stack from sun and rain outdoors', 'Powder-coated hood that fixes above a Tor stack in outdoor locations.', 14_500, 6.5, { dims: [700, 120, 320] }),
  accessory('HLM', 'HLM-ACC-BOLL', 'Impact bollard, galvanised', 'Protects a garage-mounted battery from vehicles', 'Galvanised steel bollard with base plate and anchors, 900 mm tall.', 18_900, 11, { dims: [114, 900, 114] }),
  accessory('HLM', 'HLM-ACC-BOARD', 'Non-combustible backing board 1200 × 600', 'Non-combustible barrier behind the stack', 'Fibre-cement backing board, 1200 × 600 × 9 mm, for mounting on walls of habitable rooms.', 7_400, 14, { dims: [600, 1200, 9] }),
  accessory('HLM', 'HLM-ACC-SIGN', 'Battery system signage kit', 'Labels and signs for the installation', 'Set of durable labels for the battery, isolator and switchboard.', 2_900, 0.1, { unit: 'set' }),
  accessory('HLM', 'HLM-ACC-ISO', 'External DC isolator 1000 V, 32 A', 'Isolates the HV battery cables at the inverter', 'Lockable two-pole DC isolator rated 1000 V DC, 32 A, in an IP66 enclosure.', 11_800, 0.9, { ipRating: 'IP66' }),
  accessory('HLM', 'HLM-ACC-KEY', 'Tor torque key', 'Installer tool for connector locking screws', 'Pre-set torque key for Tor connector locking screws.', 3_200, 0.2),
  accessory('HLM', 'HLM-ACC-TCOV', 'Tor terminal covers, pack of 10', 'Spare terminal covers for transport and storage', 'Snap-on covers for exposed Tor unit terminals; keep fitted whenever a unit is off the stack.', 1_900, 0.1, { unit: 'pack', packSize: 10 }),
  accessory('HLM', 'HLM-ACC-LIFT', 'Tor lifting handles (pair)', 'Two-person lift handles for modules', 'Removable handles that clip into the sides of a Tor unit for a safe two-person lift.', 4_900, 0.8, { unit: 'set' }),
  accessory('HLM', 'HLM-ACC-SPACER', 'Wall spacers, pack of 4', 'Stands the stack off an uneven wall', 'Nylon 20 mm wall spacers for uneven masonry.', 1_100, 0.1, { unit: 'pack', packSize: 4 }),
  accessory('HLM', 'HLM-COMM-INV-2', 'Battery-to-inverter comms cable, 2 m', 'Battery management comms to the inverter', 'Shielded comms cable, RJ45 both ends, 2 m.', 1_600, 0.1),
  accessory('HLM', 'HLM-COMM-INV-5', 'Battery-to-inverter comms cable, 5 m', 'Battery management comms to the inverter', 'Shielded comms cable, RJ45 both ends, 5 m.', 2_200, 0.2),
  accessory('HLM', 'HLM-COMM-INV-10', 'Battery-to-inverter comms cable, 10 m', 'Battery management comms to the inverter', 'Shielded comms cable, RJ45 both ends, 10 m.', 3_300, 0.4),
  accessory('HLM', 'HLM-ACC-FIX-M', 'Masonry fixing kit for wall brackets', 'Anchors for universal brackets on masonry', 'Four M8 sleeve anchors with washers for one universal bracket on brick or block.', 900, 0.3, { unit: 'set' }),
  accessory('HLM', 'HLM-ACC-FIX-S', 'Timber fixing kit for wall brackets', 'Screws for universal brackets on stud walls', 'Four 14 g × 65 mm timber screws with washers for one universal bracket.', 700, 0.2, { unit: 'set' }),
  accessory('HLM', 'HLM-ACC-PLUG', 'Tor field-fit HV plug pair', 'Re-terminates a cut-to-length HV cable', 'Touch-safe positive and negative HV plugs for 6–10 mm² cable, field assembly.', 4_600, 0.15, { unit: 'set' }),
  accessory('HLM', 'HLM-ACC-CAB', 'Tor outdoor battery cabinet', 'Weatherproof housing for one Tor stack outdoors', 'Vented powder-coated steel cabinet housing one Tor stack of up to 6 modules, with lockable door.', 129_000, 68, { dims: [820, 2100, 420], ipRating: 'IP55' }),
  accessory('HLM', 'HLM-ACC-GW0', 'Hollowmere monitoring gateway (old)', 'Monitoring for first-generation controllers', 'Ethernet gateway for first-generation controllers; no longer made.', 12_000, 0.4, { lifecycle: 'discontinued' }),
);

// =======================================================================================
// Quarnby Cells — Hearth 51 (parallel 48 V class) and Ridge (series mid-voltage)

add(
  moduleFamily({
    sku: 'QRB-HEARTH-M51',
    name: 'Hearth 51 battery module 5.1 kWh',
    maker: 'QRB',
    description: '48 V-class LFP module, 16 cells, 51.2 V × 100 Ah. Modules connect in parallel under a Hearth controller; 1–6 per stack.',
    costCents: 189_000,
    mass: 46,
    dims: [650, 230, 200],
    ipRating: 'IP55',
    compliance: certified(BATTERY_STANDARDS, 'QRB-HEARTH-M51', '2023-08-14', 'IP55'),
    attrs: {
      nominalV: 51.2,
      ratedAh: 100,
      usableKwh: 4.9,
      chemistry: 'LFP',
      cellsInSeries: 16,
      minOperatingV: 44.8,
      maxChargeV: 58.4,
      maxChargeA: 50,
      maxDischargeA: 100,
      cycleLife: 6000,
      eolSohPct: 70,
      roundTripEfficiencyPct: 95,
    },
  }),
  moduleFamily({
    sku: 'QRB-HEARTH-M50',
    name: 'Hearth 50 battery module 5.1 kWh (previous model)',
    maker: 'QRB',
    description: 'Previous Hearth module, 16 cells, 51.2 V × 100 Ah, with a lower usable figure. Replaced by Hearth 51.',
    costCents: 176_000,
    mass: 52,
    dims: [650, 240, 210],
    ipRating: 'IP54',
    lifecycle: 'superseded',
    supersededBy: 'QRB-HEARTH-M51',
    compliance: certified(BATTERY_STANDARDS, 'QRB-HEARTH-M50', '2020-11-30', 'IP54'),
    attrs: {
      nominalV: 51.2,
      ratedAh: 100,
      usableKwh: 4.6,
      chemistry: 'LFP',
      cellsInSeries: 16,
      minOperatingV: 46.4,
      maxChargeV: 57.6,
      maxChargeA: 50,
      maxDischargeA: 80,
      cycleLife: 4500,
      eolSohPct: 70,
    },
  }),
  controllerPart({
    sku: 'QRB-HEARTH-CTL',
    name: 'Hearth 51 controller',
    maker: 'QRB',
    description: 'Top unit of a Hearth stack: battery management, DC breaker, display and inverter comms. Carries no cells.',
    costCents: 78_000,
    mass: 9.5,
    dims: [650, 150, 200],
    ipRating: 'IP55',
    compliance: certified(['IEC 62477-1', 'IEC 61000-6-3'], 'QRB-HEARTH-CTL', '2023-08-14', 'IP55'),
    attrs: { carriesCells: false, hasDcBreaker: true, hasDisplay: true, comms: ['CAN', 'RS485', 'Ethernet'], maxStackModules: 6 },
  }),
  controllerPart({
    sku: 'QRB-HEARTH-CTL0',
    name: 'Hearth controller (previous model)',
    maker: 'QRB',
    description: 'Previous Hearth controller without a display; replaced by the Hearth 51 controller.',
    costCents: 69_000,
    mass: 9,
    dims: [650, 150, 210],
    ipRating: 'IP54',
    lifecycle: 'superseded',
    supersededBy: 'QRB-HEARTH-CTL',
    attrs: { carriesCells: false, hasDcBreaker: true, hasDisplay: false, comms: ['CAN', 'RS485'], maxStackModules: 4 },
  }),
  moduleFamily({
    sku: 'QRB-RIDGE-M25',
    name: 'Ridge series battery module 2.6 kWh',
    maker: 'QRB',
    description: 'LFP module, 16 cells, 51.2 V × 50 Ah, for series stacks of 2–5 under a Ridge HV controller.',
    costCents: 104_000,
    mass: 26,
    dims: [560, 220, 200],
    ipRating: 'IP65',
    compliance: certified(BATTERY_STANDARDS, 'QRB-RIDGE-M25', '2024-02-05', 'IP65'),
    attrs: {
      nominalV: 51.2,
      ratedAh: 50,
      usableKwh: 2.45,
      chemistry: 'LFP',
      cellsInSeries: 16,
      minOperatingV: 44.8,
      maxChargeV: 58.4,
      maxChargeA: 25,
      maxDischargeA: 50,
      cycleLife: 8000,
      eolSohPct: 70,
      warrantedMwh: 12,
      roundTripEfficiencyPct: 96,
    },
  }),
  controllerPart({
    sku: 'QRB-RIDGE-CTL',
    name: 'Ridge HV controller',
    maker: 'QRB',
    description: 'High-voltage box for a Ridge series stack: battery management, DC breaker and comms. Carries no cells.',
    costCents: 96_000,
    mass: 12,
    dims: [560, 180, 200],
    ipRating: 'IP65',
    compliance: certified(['IEC 62477-1', 'IEC 61000-6-3'], 'QRB-RIDGE-CTL', '2024-02-05', 'IP65'),
    attrs: { carriesCells: false, hasDcBreaker: true, hasDisplay: false, comms: ['CAN', 'RS485'], maxStackModules: 5 },
  }),
  moduleFamily({
    sku: 'QRB-NOOK-M25',
    name: 'Nook 25 wall battery 2.6 kWh',
    maker: 'QRB',
    description: '25.6 V LFP wall battery (8 cells × 100 Ah). No longer made; spares only from stock.',
    costCents: 99_000,
    mass: 25,
    dims: [520, 380, 160],
    ipRating: 'IP21',
    lifecycle: 'discontinued',
    attrs: {
      nominalV: 25.6,
      ratedAh: 100,
      usableKwh: 2.3,
      chemistry: 'LFP',
      cellsInSeries: 8,
      minOperatingV: 22.4,
      maxChargeV: 29.2,
      maxChargeA: 50,
      maxDischargeA: 100,
      cycleLife: 3500,
    },
  }),
  feet('QRB', 'QRB-HEARTH-FEET', 'Hearth adjustable feet, pack of 4', 90, 20, 500, 3_600, { ipRating: 'IP65' }),
  feet('QRB', 'QRB-RIDGE-FEET', 'Ridge adjustable feet, pack of 4', 80, 16, 300, 3_200, { ipRating: 'IP65' }),
  feet('QRB', 'QRB-FEET-HD', 'Quarnby heavy-duty levelling feet, pack of 4', 110, 40, 800, 5_800),
  simple('end-cap', {
    sku: 'QRB-HEARTH-EC',
    name: 'Hearth bottom end cap',
    maker: 'QRB',
    description: 'Covers the parallel bus connector under the bottom Hearth module.',
    costCents: 1_600,
    mass: 0.25,
    ipRating: 'IP55',
    attrs: { connectorType: 'Hearth parallel bus' },
  }),
  simple('end-cap', {
    sku: 'QRB-RIDGE-EC',
    name: 'Ridge bottom end cap',
    maker: 'QRB',
    description: 'Closes the series loop on the underside of the bottom Ridge module.',
    costCents: 2_400,
    mass: 0.3,
    ipRating: 'IP65',
    attrs: { connectorType: 'Ridge series loop-back' },
  }),
  simple('wall-bracket', {
    sku: 'QRB-WB-M',
    name: 'Quarnby wall bracket, masonry',
    maker: 'QRB',
    description: 'Anti-tip wall bracket with masonry anchors, fits Hearth and Ridge stacks.',
    costCents: 3_800,
    mass: 1.5,
    attrs: { fixing: 'masonry', unitsSupported: 7 },
  }),
  simple('wall-bracket', {
    sku: 'QRB-WB-S',
    name: 'Quarnby wall bracket, timber stud',
    maker: 'QRB',
    description: 'Anti-tip wall bracket with timber screws, fits Hearth and Ridge stacks.',
    costCents: 3_500,
    mass: 1.4,
    attrs: { fixing: 'stud', unitsSupported: 7 },
  }),
  simple('wall-bracket', {
    sku: 'QRB-WB-U',
    name: 'Quarnby wall bracket, universal',
    maker: 'QRB',
    description: 'Anti-tip wall bracket slotted for stud or masonry fixings (fixings not supplied).',
    costCents: 3_300,
    mass: 1.4,
    attrs: { fixing: 'universal', unitsSupported: 7 },
  }),
  simple('wall-bracket', {
    sku: 'QRB-WB-S0',
    name: 'Quarnby stud bracket (old pattern)',
    maker: 'QRB',
    description: 'Earlier stud bracket for Nook wall batteries.',
    costCents: 2_900,
    mass: 1.2,
    lifecycle: 'discontinued',
    attrs: { fixing: 'stud', unitsSupported: 1 },
  }),
  simple('comms-terminator', {
    sku: 'QRB-CT-CAN',
    name: 'Quarnby CAN terminator',
    maker: 'QRB',
    description: '120 Ω CAN terminating plug for the last controller on the bus.',
    costCents: 800,
    mass: 0.02,
    attrs: { protocol: 'CAN' },
  }),
  simple('comms-terminator', {
    sku: 'QRB-CT-485',
    name: 'Quarnby RS485 terminator',
    maker: 'QRB',
    description: 'RS485 terminating plug for the last controller on the link.',
    costCents: 800,
    mass: 0.02,
    attrs: { protocol: 'RS485' },
  }),
  ...cableSets('QRB', 'QRB-CBL-LV35', 'Hearth battery cable set', 35, 'Hearth bus plug', [1.5, 3, 5, 10], 1_100, 6_900),
  ...cableSets('QRB', 'QRB-CBL-LV50', 'Hearth battery cable set', 50, 'Hearth bus plug', [1.5, 2, 3, 5], 1_500, 7_900),
  ...cableSets('QRB', 'QRB-CBL-HV6', 'Ridge HV battery cable set', 6, 'Ridge touch-safe HV plug', [1.5, 3, 5, 10], 620, 4_200),
  simple('cable-cover', {
    sku: 'QRB-CCV-15',
    name: 'Quarnby clip-on cable-protection cover, 1.5 m',
    maker: 'QRB',
    description: 'Clip-on cover over the battery cables beside the stack; continue in conduit to the inverter.',
    costCents: 3_300,
    mass: 0.8,
    attrs: { lengthM: 1.5, material: 'UV-stable polycarbonate' },
  }),
  simple('cable-cover', {
    sku: 'QRB-CCV-30',
    name: 'Quarnby clip-on cable-protection cover, 3 m',
    maker: 'QRB',
    description: 'Clip-on cable cover, 3 m.',
    costCents: 5_900,
    mass: 1.6,
    attrs: { lengthM: 3, material: 'UV-stable polycarbonate' },
  }),
  simple('cable-cover', {
    sku: 'QRB-CCV-10A',
    name: 'Quarnby aluminium cable cover, 1 m',
    maker: 'QRB',
    description: 'Extruded aluminium cable cover for exposed outdoor runs.',
    costCents: 4_100,
    mass: 0.9,
    attrs: { lengthM: 1, material: 'anodised aluminium' },
  }),
  simple('earth-lead', {
    sku: 'QRB-EL-6-15',
    name: 'Quarnby earth bonding lead 6 mm², 1.5 m',
    maker: 'QRB',
    description: 'Green/yellow bonding lead with lugs, stack earth stud to installation earth.',
    costCents: 1_300,
    mass: 0.15,
    attrs: { lengthM: 1.5, crossSectionMm2: 6 },
  }),
  simple('earth-lead', {
    sku: 'QRB-EL-16-15',
    name: 'Quarnby earth bonding lead 16 mm², 1.5 m',
    maker: 'QRB',
    description: 'Heavy bonding lead with M8 lugs for 48 V-class stacks with large battery cables.',
    costCents: 2_600,
    mass: 0.33,
    attrs: { lengthM: 1.5, crossSectionMm2: 16 },
  }),
  simple('earth-lead', {
    sku: 'QRB-EL-6-30',
    name: 'Quarnby earth bonding lead 6 mm², 3 m',
    maker: 'QRB',
    description: 'Green/yellow bonding lead with lugs, 3 m.',
    costCents: 1_800,
    mass: 0.28,
    attrs: { lengthM: 3, crossSectionMm2: 6 },
  }),
  accessory('QRB', 'QRB-ACC-STRAP', 'Quarnby tall-stack strap kit', 'Mid-height restraint for stacks over 1200 mm', 'Strap and wall plate restraining a tall Hearth or Ridge stack at mid height.', 5_200, 1.2),
  accessory('QRB', 'QRB-RIDGE-LINK', 'Ridge module link plate', 'Ties each Ridge module to its neighbour', 'Stainless link plate and screws tying a Ridge module to the one above; one for each module.', 1_400, 0.2),
  accessory('QRB', 'QRB-LINK-1M', 'Quarnby stack-to-stack comms link, 1 m', 'Links controller comms between parallel stacks', 'Shielded comms lead, 1 m, between controllers of parallel stacks.', 1_900, 0.1),
  accessory('QRB', 'QRB-ACC-BUSBAR', 'Hearth external bus-bar kit', 'Joins Hearth stacks outside the controller', 'Insulated copper bus bars and covers for joining two Hearth stacks side by side.', 16_500, 2.8, { unit: 'set' }),
  accessory('QRB', 'QRB-ACC-GW', 'Quarnby monitoring gateway', 'Remote monitoring over Ethernet', 'DIN-rail gateway that reads the controller over RS485 and reports to the monitoring portal.', 14_900, 0.3),
  accessory('QRB', 'QRB-ACC-HOOD', 'Quarnby weather hood', 'Shades an outdoor stack', 'Powder-coated hood for outdoor Hearth and Ridge stacks.', 12_900, 5.8, { dims: [720, 110, 280] }),
  accessory('QRB', 'QRB-ACC-SIGN', 'Quarnby signage kit', 'Labels and signs for the installation', 'Durable labels for battery, isolator and switchboard.', 2_600, 0.1, { unit: 'set' }),
  accessory('QRB', 'QRB-ACC-FUSE125', 'DC fuse 125 A, pack of 2', 'Spare battery fuses', 'Spare 125 A DC fuses for the Hearth controller breaker compartment.', 3_400, 0.1, { unit: 'pack', packSize: 2 }),
  accessory('QRB', 'QRB-ACC-FUSEHOLD', 'DC fuse holder 250 A', 'Fuses a 48 V battery run at the inverter', 'Insulated DC fuse holder with cover for 48 V-class battery cables.', 4_800, 0.5),
  accessory('QRB', 'QRB-ACC-GLAND', 'Cable glands M25, pack of 10', 'Seals cable entries', 'Nylon M25 cable glands with lock nuts.', 1_700, 0.2, { unit: 'pack', packSize: 10 }),
  accessory('QRB', 'QRB-COMM-INV-2', 'Quarnby inverter comms cable, 2 m', 'Battery management comms to the inverter', 'Shielded comms cable, 2 m, with an adaptor for common inverter pin-outs.', 1_700, 0.1),
  accessory('QRB', 'QRB-COMM-INV-5', 'Quarnby inverter comms cable, 5 m', 'Battery management comms to the inverter', 'Shielded comms cable, 5 m.', 2_300, 0.2),
  accessory('QRB', 'QRB-CDT-25', 'Heavy-duty corrugated conduit 25 mm', 'Mechanical protection for battery cables', 'Heavy-duty corrugated conduit, 25 mm, sold by the metre; continues a cable-protection cover to the inverter.', 290, 0.12, { unit: 'm', noGtin: true }),
  accessory('QRB', 'QRB-CDT-32', 'Heavy-duty corrugated conduit 32 mm', 'Mechanical protection for large battery cables', 'Heavy-duty corrugated conduit, 32 mm, sold by the metre.', 390, 0.16, { unit: 'm', noGtin: true }),
  accessory('QRB', 'QRB-CDT-25F', 'Conduit fittings 25 mm, pack of 5', 'Joins and terminates 25 mm conduit', 'Adaptors and saddles for 25 mm corrugated conduit.', 1_500, 0.2, { unit: 'pack', packSize: 5 }),
  accessory('QRB', 'QRB-ACC-FIX-M', 'Quarnby masonry fixing kit', 'Anchors for one wall bracket on masonry', 'Four M8 sleeve anchors for one Quarnby bracket.', 850, 0.3, { unit: 'set' }),
  accessory('QRB', 'QRB-ACC-TCOV', 'Quarnby terminal covers, pack of 10', 'Spare terminal covers for transport and storage', 'Snap-on covers for exposed module terminals; keep fitted whenever a unit is off the stack.', 1_800, 0.1, { unit: 'pack', packSize: 10 }),
  accessory('QRB', 'QRB-ACC-LIFT', 'Quarnby module lifting straps (pair)', 'Two-person lift for modules', 'Webbing lifting straps that hook under a Hearth or Ridge module for a two-person lift.', 3_900, 0.6, { unit: 'set' }),
  accessory('QRB', 'QRB-ACC-LUG50', 'Cable lugs 50 mm² M8, pack of 10', 'Terminates cut-to-length battery cables', 'Tinned copper lugs for 50 mm² cable, M8 hole.', 2_100, 0.2, { unit: 'pack', packSize: 10 }),
);

// Quarnby inverters
add(
  simple(
    'inverter',
    {
      sku: 'QRB-INV-5LV',
      name: 'Quarnby 48 V hybrid inverter 5 kW',
      maker: 'QRB',
      description: 'Single-phase hybrid inverter for 48 V-class batteries, 40–60 V DC, one battery input.',
      costCents: 168_000,
      mass: 21,
      dims: [450, 540, 180],
      ipRating: 'IP65',
      compliance: certified(INVERTER_STANDARDS, 'QRB-INV-5LV', '2023-04-17', 'IP65'),
      attrs: { batteryMinV: 40, batteryMaxV: 60, maxChargeA: 100, maxDischargeA: 120, batteryInputs: 1, parallelStacks: 2, maxBatteryKwh: 40, ratedPowerKw: 5, phases: 1 },
    },
    { unit: 'each', markup: 1.3 },
  ),
  simple(
    'inverter',
    {
      sku: 'QRB-INV-3LV',
      name: 'Quarnby 48 V inverter 3 kW',
      maker: 'QRB',
      description: 'Older single-phase 48 V inverter, 42–58 V DC. No longer made.',
      costCents: 119_000,
      mass: 17,
      dims: [420, 500, 170],
      ipRating: 'IP54',
      lifecycle: 'discontinued',
      attrs: { batteryMinV: 42, batteryMaxV: 58, maxChargeA: 60, maxDischargeA: 70, batteryInputs: 1, maxBatteryKwh: 20, ratedPowerKw: 3, phases: 1 },
    },
    { unit: 'each', markup: 1.3 },
  ),
);

// =======================================================================================
// Tarrow Vale Power — Stackline 48 (parallel, brackets per 3 modules, combiner)

add(
  moduleFamily({
    sku: 'TVP-SL48-M48',
    name: 'Stackline 48 battery module 4.8 kWh',
    maker: 'TVP',
    description: '48 V LFP module, 15 cells, 48 V × 100 Ah. Parallel stack of 1–8 under a Stackline controller.',
    costCents: 172_000,
    mass: 44,
    dims: [600, 240, 170],
    ipRating: 'IP21',
    compliance: certified(BATTERY_STANDARDS, 'TVP-SL48-M48', '2023-10-09', 'IP21'),
    attrs: {
      nominalV: 48,
      ratedAh: 100,
      usableKwh: 4.56,
      chemistry: 'LFP',
      cellsInSeries: 15,
      minOperatingV: 42,
      maxChargeV: 54,
      maxChargeA: 50,
      maxDischargeA: 100,
      cycleLife: 5000,
      eolSohPct: 80,
      warrantedMwh: 15,
      roundTripEfficiencyPct: 94,
    },
  }),
  moduleFamily({
    sku: 'TVP-SL48-M45',
    name: 'Stackline 45 battery module 4.5 kWh',
    maker: 'TVP',
    description: 'Earlier 14-cell module, 44.8 V × 100 Ah. Discontinued; cannot share a stack with 15-cell modules.',
    costCents: 158_000,
    mass: 42,
    dims: [600, 240, 170],
    ipRating: 'IP21',
    lifecycle: 'discontinued',
    compliance: certified(BATTERY_STANDARDS, 'TVP-SL48-M45', '2019-06-24', 'IP21'),
    attrs: {
      nominalV: 44.8,
      ratedAh: 100,
      usableKwh: 4.03,
      chemistry: 'LFP',
      cellsInSeries: 14,
      minOperatingV: 39.2,
      maxChargeV: 50.4,
      maxChargeA: 50,
      maxDischargeA: 90,
      cycleLife: 4000,
      eolSohPct: 80,
    },
  }),
  moduleFamily({
    sku: 'TVP-MRL-M44',
    name: 'Marl NMC battery module 4.2 kWh',
    maker: 'TVP',
    description: 'Older NMC module, 12 cells, 44.4 V × 94 Ah. Discontinued; listed for warranty and spares look-ups.',
    costCents: 149_000,
    mass: 31,
    dims: [560, 200, 160],
    ipRating: 'IP20',
    lifecycle: 'discontinued',
    attrs: {
      nominalV: 44.4,
      ratedAh: 94,
      usableKwh: 3.76,
      chemistry: 'NMC',
      cellsInSeries: 12,
      minOperatingV: 36,
      maxChargeV: 50.4,
      maxChargeA: 47,
      maxDischargeA: 94,
      cycleLife: 3000,
      eolSohPct: 70,
    },
  }),
  moduleFamily({
    sku: 'TVP-SLF-M20',
    name: 'Slowfade LTO battery module 2.0 kWh',
    maker: 'TVP',
    description: 'Long-life lithium titanate module, 22 cells, 50.6 V × 40 Ah, for high-cycle backup duty.',
    costCents: 236_000,
    mass: 38,
    dims: [560, 260, 220],
    ipRating: 'IP54',
    compliance: certified(BATTERY_STANDARDS, 'TVP-SLF-M20', '2024-04-22', 'IP54'),
    attrs: {
      nominalV: 50.6,
      ratedAh: 40,
      usableKwh: 1.9,
      chemistry: 'LTO',
      cellsInSeries: 22,
      minOperatingV: 39.6,
      maxChargeV: 59.4,
      maxChargeA: 80,
      maxDischargeA: 80,
      cycleLife: 20000,
      eolSohPct: 80,
      roundTripEfficiencyPct: 96,
    },
  }),
  controllerPart({
    sku: 'TVP-SL48-CTL',
    name: 'Stackline 48 controller',
    maker: 'TVP',
    description: 'Top unit of a Stackline stack: battery management, DC breaker, display and inverter comms. Carries no cells.',
    costCents: 74_000,
    mass: 8.5,
    dims: [600, 140, 170],
    ipRating: 'IP21',
    compliance: certified(['IEC 62477-1', 'IEC 61000-6-3'], 'TVP-SL48-CTL', '2023-10-09', 'IP21'),
    attrs: { carriesCells: false, hasDcBreaker: true, hasDisplay: true, comms: ['CAN', 'RS485', 'Ethernet', 'Wi-Fi'], maxStackModules: 8 },
  }),
  controllerPart({
    sku: 'TVP-SL48-CTL0',
    name: 'Stackline controller (14-cell generation)',
    maker: 'TVP',
    description: 'Controller for the discontinued 14-cell Stackline modules.',
    costCents: 66_000,
    mass: 8,
    dims: [600, 140, 170],
    ipRating: 'IP21',
    lifecycle: 'discontinued',
    attrs: { carriesCells: false, hasDcBreaker: true, hasDisplay: false, comms: ['CAN', 'RS485'], maxStackModules: 6 },
  }),
  feet('TVP', 'TVP-SL48-FEET', 'Stackline adjustable feet, pack of 4', 100, 30, 500, 4_200),
  feet('TVP', 'TVP-SL48-FEET-L', 'Stackline low-profile feet, pack of 4', 50, 10, 500, 3_100),
  simple('end-cap', {
    sku: 'TVP-SL48-EC',
    name: 'Stackline bottom end cap',
    maker: 'TVP',
    description: 'Covers the parallel connector under the bottom Stackline module.',
    costCents: 1_500,
    mass: 0.2,
    attrs: { connectorType: 'Stackline parallel 2-pole' },
  }),
  simple('end-cap', {
    sku: 'TVP-SL48-EC0',
    name: 'Stackline end cap (14-cell generation)',
    maker: 'TVP',
    description: 'End cap for the discontinued 14-cell modules.',
    costCents: 1_300,
    mass: 0.2,
    lifecycle: 'discontinued',
    attrs: { connectorType: 'Stackline parallel 2-pole (early)' },
  }),
  simple('wall-bracket', {
    sku: 'TVP-WB-S',
    name: 'Stackline wall bracket, timber stud',
    maker: 'TVP',
    description: 'Wall bracket restraining up to three Stackline modules; timber screws included.',
    costCents: 3_400,
    mass: 1.3,
    attrs: { fixing: 'stud', unitsSupported: 3 },
  }),
  simple('wall-bracket', {
    sku: 'TVP-WB-M',
    name: 'Stackline wall bracket, masonry',
    maker: 'TVP',
    description: 'Wall bracket restraining up to three Stackline modules; masonry anchors included.',
    costCents: 3_700,
    mass: 1.4,
    attrs: { fixing: 'masonry', unitsSupported: 3 },
  }),
  simple('wall-bracket', {
    sku: 'TVP-WB-U',
    name: 'Stackline wall bracket, universal',
    maker: 'TVP',
    description: 'Wall bracket restraining up to three Stackline modules, slotted for any fixing (fixings not supplied).',
    costCents: 3_000,
    mass: 1.3,
    attrs: { fixing: 'universal', unitsSupported: 3 },
  }),
  simple('comms-terminator', {
    sku: 'TVP-CT-CAN',
    name: 'Stackline CAN terminator',
    maker: 'TVP',
    description: '120 Ω CAN terminating plug for the last controller on the bus.',
    costCents: 850,
    mass: 0.02,
    attrs: { protocol: 'CAN' },
  }),
  simple('comms-terminator', {
    sku: 'TVP-CT-485',
    name: 'Stackline RS485 terminator',
    maker: 'TVP',
    description: 'RS485 terminating plug for the last controller on the link.',
    costCents: 850,
    mass: 0.02,
    attrs: { protocol: 'RS485' },
  }),
  ...cableSets('TVP', 'TVP-CBL-LV50', 'Stackline battery cable set', 50, 'Stackline parallel plug', [1.5, 3, 5, 10], 1_450, 7_600),
  ...cableSets('TVP', 'TVP-CBL-LV70', 'Stackline battery cable set', 70, 'M10 lugs', [1.5, 3, 5, 10], 1_950, 8_400),
  simple('cable-cover', {
    sku: 'TVP-CCV-10',
    name: 'Stackline cable-protection cover, 1 m',
    maker: 'TVP',
    description: 'Clip-on PVC cable cover, 1 m.',
    costCents: 2_200,
    mass: 0.5,
    attrs: { lengthM: 1, material: 'PVC-U' },
  }),
  simple('cable-cover', {
    sku: 'TVP-CCV-20',
    name: 'Stackline cable-protection cover, 2 m',
    maker: 'TVP',
    description: 'Clip-on PVC cable cover, 2 m.',
    costCents: 3_900,
    mass: 1,
    attrs: { lengthM: 2, material: 'PVC-U' },
  }),
  simple('earth-lead', {
    sku: 'TVP-EL-16-15',
    name: 'Stackline earth bonding lead 16 mm², 1.5 m',
    maker: 'TVP',
    description: 'Green/yellow bonding lead with M8 lugs.',
    costCents: 2_500,
    mass: 0.33,
    attrs: { lengthM: 1.5, crossSectionMm2: 16 },
  }),
  simple('earth-lead', {
    sku: 'TVP-EL-16-30',
    name: 'Stackline earth bonding lead 16 mm², 3 m',
    maker: 'TVP',
    description: 'Green/yellow bonding lead with M8 lugs, 3 m.',
    costCents: 3_300,
    mass: 0.62,
    attrs: { lengthM: 3, crossSectionMm2: 16 },
  }),
  simple('earth-lead', {
    sku: 'TVP-EL-6-15',
    name: 'Stackline earth bonding lead 6 mm², 1.5 m',
    maker: 'TVP',
    description: 'Green/yellow bonding lead with M6 lugs for single-stack installations.',
    costCents: 1_350,
    mass: 0.15,
    attrs: { lengthM: 1.5, crossSectionMm2: 6 },
  }),
  simple('cable-cover', {
    sku: 'TVP-CCV-10S',
    name: 'Stackline steel cable cover, 1 m',
    maker: 'TVP',
    description: 'Galvanised steel cable cover for places where impact is likely.',
    costCents: 3_600,
    mass: 1.5,
    attrs: { lengthM: 1, material: 'galvanised steel' },
  }),
  accessory('TVP', 'TVP-CMB-4', 'Stackline 4-way parallel combiner', 'Combines up to four parallel stacks onto one battery cable pair', 'Enclosed bus-bar combiner with per-stack fuses; takes up to four Stackline stacks to one inverter input.', 38_000, 7.5, { dims: [400, 500, 160], ipRating: 'IP54' }),
  accessory('TVP', 'TVP-CMB-2', 'Stackline 2-way parallel combiner', 'Combines two parallel stacks', 'Earlier two-way combiner; replaced by the 4-way unit.', 24_000, 5, { lifecycle: 'superseded', supersededBy: 'TVP-CMB-4' }),
  accessory('TVP', 'TVP-SL48-SHROUD', 'Stackline module terminal shroud', 'Covers each module’s side terminals', 'Snap-on shroud over the side terminals of one Stackline module; one for each module.', 900, 0.1),
  accessory('TVP', 'TVP-ACC-STRAP', 'Stackline tall-stack strap kit', 'Mid-height restraint for stacks over 1200 mm', 'Strap and wall plate restraining a tall Stackline stack at mid height.', 5_500, 1.3),
  accessory('TVP', 'TVP-ACC-METER', 'Tarrow export meter', 'Measures grid import/export', 'DIN-rail energy meter with split-core CTs for the inverter’s export control.', 10_500, 0.5),
  accessory('TVP', 'TVP-ACC-HOOD', 'Stackline weather hood', 'Shades an outdoor stack', 'Hood for Stackline stacks in sheltered outdoor locations.', 11_900, 5.5),
  accessory('TVP', 'TVP-ACC-BOARD', 'Fire-resistant backing board 1200 × 700', 'Non-combustible barrier behind the stack', 'Calcium-silicate board, 1200 × 700 × 12 mm.', 8_900, 16, { dims: [700, 1200, 12] }),
  accessory('TVP', 'TVP-ACC-SIGN', 'Tarrow signage kit', 'Labels and signs for the installation', 'Durable labels for battery, isolator and switchboard.', 2_500, 0.1, { unit: 'set' }),
  accessory('TVP', 'TVP-ACC-ISO250', 'DC isolator 250 A, 48 V', 'Isolates a 48 V battery run at the inverter', 'Lockable two-pole 250 A DC isolator for 48 V-class batteries.', 13_900, 1.1),
  accessory('TVP', 'TVP-ACC-BOLL', 'Impact barrier rail', 'Protects a garage-mounted stack from vehicles', 'Floor-fixed steel barrier rail, 1000 mm wide.', 21_500, 14, { dims: [1000, 600, 80] }),
  accessory('TVP', 'TVP-ACC-PLINTH', 'Stackline levelling plinth', 'Level base for uneven floors', 'Powder-coated steel plinth with levelling screws; feet stand on it.', 16_000, 9, { dims: [640, 60, 220] }),
  accessory('TVP', 'TVP-COMM-INV-3', 'Stackline inverter comms cable, 3 m', 'Battery management comms to the inverter', 'Shielded comms cable, 3 m.', 1_800, 0.15),
  accessory('TVP', 'TVP-COMM-INV-10', 'Stackline inverter comms cable, 10 m', 'Battery management comms to the inverter', 'Shielded comms cable, 10 m.', 3_100, 0.4),
  accessory('TVP', 'TVP-ACC-LUG70', 'Cable lugs 70 mm² M10, pack of 10', 'Terminates cut-to-length battery cables', 'Tinned copper lugs for 70 mm² cable, M10 hole.', 2_600, 0.3, { unit: 'pack', packSize: 10 }),
  accessory('TVP', 'TVP-CDT-32', 'Rigid conduit 32 mm, 4 m length', 'Mechanical protection for battery cables', 'Heavy-duty rigid conduit, 32 mm, in 4 m lengths.', 1_900, 1.1, { noGtin: true }),
  accessory('TVP', 'TVP-ACC-TCOV', 'Stackline terminal covers, pack of 10', 'Spare terminal covers for transport and storage', 'Snap-on covers for exposed Stackline module terminals.', 1_700, 0.1, { unit: 'pack', packSize: 10 }),
  accessory('TVP', 'TVP-ACC-FUSE200', 'DC fuse 200 A, pack of 2', 'Spare combiner fuses', 'Spare 200 A DC fuses for the Stackline combiner.', 3_900, 0.1, { unit: 'pack', packSize: 2 }),
  accessory('TVP', 'TVP-ACC-GW', 'Tarrow monitoring gateway', 'Remote monitoring over Ethernet or Wi-Fi', 'Gateway that reads the Stackline controller and reports to the monitoring portal.', 13_500, 0.3),
  accessory('TVP', 'TVP-ACC-WIFI0', 'Tarrow Wi-Fi stick (old)', 'Monitoring for 14-cell controllers', 'Wi-Fi stick for the 14-cell generation controller; no longer made.', 5_900, 0.05, { lifecycle: 'discontinued' }),
);

// Tarrow inverters
add(
  simple(
    'inverter',
    {
      sku: 'TVP-INV-8LV',
      name: 'Tarrow 48 V hybrid inverter 8 kW',
      maker: 'TVP',
      description: 'Single-phase hybrid inverter for 48 V-class batteries, 40–60 V DC, two battery inputs.',
      costCents: 262_000,
      mass: 29,
      dims: [500, 620, 210],
      ipRating: 'IP65',
      compliance: certified(INVERTER_STANDARDS, 'TVP-INV-8LV', '2023-12-04', 'IP65'),
      attrs: { batteryMinV: 40, batteryMaxV: 60, maxChargeA: 160, maxDischargeA: 180, batteryInputs: 2, maxBatteryKwh: 80, ratedPowerKw: 8, phases: 1 },
    },
    { unit: 'each', markup: 1.3 },
  ),
  simple(
    'inverter',
    {
      sku: 'TVP-INV-15HV3',
      name: 'Tarrow HV hybrid inverter 15 kW, three phase',
      maker: 'TVP',
      description: 'Three-phase hybrid inverter with two high-voltage battery inputs, 350–800 V DC.',
      costCents: 512_000,
      mass: 41,
      dims: [560, 700, 240],
      ipRating: 'IP65',
      compliance: certified(INVERTER_STANDARDS, 'TVP-INV-15HV3', '2024-05-13', 'IP65'),
      attrs: { batteryMinV: 350, batteryMaxV: 800, maxChargeA: 30, maxDischargeA: 30, batteryInputs: 2, maxBatteryKwh: 90, ratedPowerKw: 15, phases: 3 },
    },
    { unit: 'each', markup: 1.28 },
  ),
);

// =======================================================================================
// Parts a whole job needs (added after the first catalogue, so earlier GTINs stay as they were)

add(
  accessory('HLM', 'HLM-COMM-INV-20', 'Battery-to-inverter comms cable, 20 m', 'Battery management comms to the inverter', 'Shielded comms cable, RJ45 both ends, 20 m.', 5_400, 0.8),
  accessory('HLM', 'HLM-CDT-25', 'Hollowmere HV conduit 25 mm, orange', 'Mechanical protection for HV battery cables', 'Heavy-duty orange corrugated conduit for DC battery cables above 60 V, 25 mm, sold by the metre.', 340, 0.13, { unit: 'm', noGtin: true }),
  accessory('HLM', 'HLM-ACC-HVJB', 'Tor HV parallel junction box', 'Joins up to three Tor stacks onto one inverter battery input', 'Enclosed HV junction box with per-stack fuses and touch-safe connectors, for inverters with fewer battery inputs than stacks.', 29_500, 4.2, { dims: [360, 420, 150], ipRating: 'IP65' }),
  accessory('QRB', 'QRB-COMM-INV-10', 'Quarnby inverter comms cable, 10 m', 'Battery management comms to the inverter', 'Shielded comms cable, 10 m.', 3_200, 0.4),
  accessory('QRB', 'QRB-ACC-FUSE250', 'DC fuse 250 A, pack of 2', 'Fuses for the 250 A DC fuse holder', 'Class T style 250 A DC fuses with high interrupting rating, for the Quarnby fuse holder; one fitted, one spare.', 5_200, 0.2, { unit: 'pack', packSize: 2 }),
  accessory('QRB', 'QRB-ACC-HVJB', 'Ridge HV parallel junction box', 'Joins two Ridge stacks onto one inverter battery input', 'Enclosed HV junction box with per-stack fuses for two Ridge stacks.', 24_500, 3.6, { dims: [320, 380, 140], ipRating: 'IP65' }),
  accessory('QRB', 'QRB-ACC-SEISMIC', 'Seismic restraint kit for battery stacks', 'Top and mid-height restraint for earthquake zones', 'Steel restraint brackets, cross-strap and structural fixings restraining one battery stack to the building frame in earthquake zones.', 8_900, 2.4, { unit: 'set' }),
  accessory('TVP', 'TVP-LINK-1M', 'Stackline stack-to-stack comms link, 1 m', 'Links controller comms between parallel stacks', 'Shielded comms lead, 1 m, linking one Stackline controller to the next.', 1_700, 0.1),
);

// =======================================================================================
// Finish the parts: GTINs in definition order per maker, then supplier codes.

const KESTREL_BASE: Record<MakerCode, number> = { HLM: 410_000, QRB: 520_000, TVP: 0 };
let kestrelSeq = 0;

export const parts: DemoPart[] = drafts.map((draft) => {
  const { noGtin, ...part } = draft;
  const out: DemoPart = { ...part };
  if (!noGtin) out.gtin = nextGtin(part.maker);
  const supplierSkus: SupplierSku[] = [];
  if (part.maker === 'HLM' || part.maker === 'QRB') {
    kestrelSeq += 1;
    supplierSkus.push({ supplier: 'KESTREL', sku: `KT-${KESTREL_BASE[part.maker] + kestrelSeq}` });
  }
  if (part.maker === 'QRB' || part.maker === 'TVP') {
    supplierSkus.push({ supplier: 'MARRAM', sku: `MW/${part.maker}/${part.sku.slice(4)}` });
  }
  out.supplierSkus = supplierSkus;
  return out;
});

// =======================================================================================
// Ranges

export const ranges: DemoRange[] = [
  {
    // (a) Series high voltage; the controller carries 16 cells, so a stack of n modules is
    // 102.4 n + 51.2 V nominal (256–870 V): DVC-C at every size.
    code: 'HLM-TOR',
    name: 'Hollowmere Tor HV',
    maker: 'HLM',
    connection: 'series',
    controllerSku: 'HLM-TOR-CTL',
    moduleSku: 'HLM-TOR-M5',
    minModules: 2,
    maxModules: 8,
    maxStacks: 3,
    baseHeightMm: 80,
    defaultDodPct: 95,
    compatibleInverterSkus: ['HLM-INV-6HV1', 'HLM-INV-10HV3', 'HLM-INV-30C3', 'TVP-INV-15HV3'],
    rules: [
      { sku: 'HLM-TOR-FEET', basis: 'per-stack', qty: 4, when: { kind: 'always' } },
      { sku: 'HLM-TOR-EC', basis: 'per-stack', qty: 1 },
      // The universal bracket comes without fixings: the kit that suits the wall.
      { sku: 'HLM-TOR-WB-U', basis: 'per-stack', qty: 1 },
      { sku: 'HLM-ACC-FIX-S', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'stud' } },
      { sku: 'HLM-ACC-FIX-M', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'masonry' } },
      { sku: 'HLM-TOR-CLIP', basis: 'per-cell-unit', qty: 1 },
      ...byRun('per-stack', [
        ['HLM-CBL-HV6-015', 1.5],
        ['HLM-CBL-HV6-030', 3],
        ['HLM-CBL-HV6-050', 5],
        ['HLM-CBL-HV6-100', 10],
        ['HLM-CBL-HV6-200', 20],
      ]),
      { sku: 'HLM-CCV-15', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'HLM-CDT-25', basis: 'per-metre-of-run', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'HLM-EL-6-15', basis: 'per-stack', qty: 1 },
      { sku: 'HLM-ACC-ISO', basis: 'per-system', qty: 1 },
      ...byRun('per-system', [
        ['HLM-COMM-INV-2', 2],
        ['HLM-COMM-INV-5', 5],
        ['HLM-COMM-INV-10', 10],
        ['HLM-COMM-INV-20', 20],
      ]),
      { sku: 'HLM-CT-CAN', basis: 'per-system', qty: 1 },
      { sku: 'HLM-LINK-2M', basis: 'per-stack-link', qty: 1 },
      { sku: 'HLM-ACC-HVJB', basis: 'per-system', qty: 1, when: { kind: 'stacks-over-inputs' } },
      { sku: 'HLM-ACC-SIGN', basis: 'per-system', qty: 1 },
      ...siteRules({ bollard: 'HLM-ACC-BOLL', hood: 'HLM-ACC-HOOD', board: 'HLM-ACC-BOARD', seismic: 'QRB-ACC-SEISMIC' }),
      { sku: 'HLM-TOR-STRAP', basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: 1200 } },
    ],
  },
  {
    // (b) Parallel 48 V class: stack stays at 51.2 V (58.4 V max charge), DVC-A, so the
    // cable-cover rule is present but never fires.
    code: 'QRB-HEARTH',
    name: 'Quarnby Hearth 51',
    maker: 'QRB',
    connection: 'parallel',
    controllerSku: 'QRB-HEARTH-CTL',
    moduleSku: 'QRB-HEARTH-M51',
    minModules: 1,
    maxModules: 6,
    maxStacks: 3,
    baseHeightMm: 90,
    defaultDodPct: 95,
    compatibleInverterSkus: ['QRB-INV-5LV', 'TVP-INV-8LV'],
    rules: [
      { sku: 'QRB-HEARTH-FEET', basis: 'per-stack', qty: 4 },
      { sku: 'QRB-HEARTH-EC', basis: 'per-stack', qty: 1 },
      // Quarnby brackets come with fixings for one kind of wall: the bracket that suits it.
      { sku: 'QRB-WB-S', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'stud' } },
      { sku: 'QRB-WB-M', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'masonry' } },
      // 48 V cables carry high current: the 50 mm² sets stop at 5 m, longer runs need sizing.
      ...byRun('per-stack', [
        ['QRB-CBL-LV50-015', 1.5],
        ['QRB-CBL-LV50-020', 2],
        ['QRB-CBL-LV50-030', 3],
        ['QRB-CBL-LV50-050', 5],
      ]),
      { sku: 'QRB-CCV-15', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'QRB-EL-16-15', basis: 'per-stack', qty: 1 },
      // The range calls for a fused battery run: holder and fuse rather than an isolator alone.
      { sku: 'QRB-ACC-FUSEHOLD', basis: 'per-system', qty: 1 },
      { sku: 'QRB-ACC-FUSE250', basis: 'per-system', qty: 1 },
      ...byRun('per-system', [
        ['QRB-COMM-INV-2', 2],
        ['QRB-COMM-INV-5', 5],
      ]),
      { sku: 'QRB-CT-CAN', basis: 'per-system', qty: 1 },
      { sku: 'QRB-LINK-1M', basis: 'per-stack-link', qty: 1 },
      { sku: 'QRB-ACC-BUSBAR', basis: 'per-system', qty: 1, when: { kind: 'stacks-over-inputs' } },
      { sku: 'QRB-ACC-SIGN', basis: 'per-system', qty: 1 },
      ...siteRules({ bollard: 'HLM-ACC-BOLL', hood: 'QRB-ACC-HOOD', board: 'HLM-ACC-BOARD', seismic: 'QRB-ACC-SEISMIC' }),
      { sku: 'QRB-ACC-STRAP', basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: 1200 } },
    ],
  },
  {
    // (c) Parallel 48 V: wall brackets 1 per 3 modules, a combiner when stacks > 1, a
    // terminal shroud on every module.
    code: 'TVP-SL48',
    name: 'Tarrow Stackline 48',
    maker: 'TVP',
    connection: 'parallel',
    controllerSku: 'TVP-SL48-CTL',
    moduleSku: 'TVP-SL48-M48',
    minModules: 1,
    maxModules: 8,
    maxStacks: 4,
    baseHeightMm: 100,
    defaultDodPct: 95,
    compatibleInverterSkus: ['TVP-INV-8LV', 'QRB-INV-5LV'],
    rules: [
      { sku: 'TVP-SL48-FEET', basis: 'per-stack', qty: 4 },
      { sku: 'TVP-SL48-EC', basis: 'per-stack', qty: 1 },
      // Stackline brackets include their fixings: the one that suits the wall.
      { sku: 'TVP-WB-S', basis: 'per-n-modules', qty: 1, divisor: 3, when: { kind: 'wall', wall: 'stud' } },
      { sku: 'TVP-WB-M', basis: 'per-n-modules', qty: 1, divisor: 3, when: { kind: 'wall', wall: 'masonry' } },
      { sku: 'TVP-SL48-SHROUD', basis: 'per-module', qty: 1 },
      ...byRun('per-stack', [
        ['TVP-CBL-LV50-015', 1.5],
        ['TVP-CBL-LV50-030', 3],
        ['TVP-CBL-LV50-050', 5],
        ['TVP-CBL-LV50-100', 10],
      ]),
      { sku: 'TVP-CCV-10', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'TVP-EL-16-15', basis: 'per-stack', qty: 1 },
      { sku: 'TVP-ACC-ISO250', basis: 'per-system', qty: 1 },
      ...byRun('per-system', [
        ['TVP-COMM-INV-3', 3],
        ['TVP-COMM-INV-10', 10],
      ]),
      { sku: 'TVP-CT-CAN', basis: 'per-system', qty: 1 },
      { sku: 'TVP-LINK-1M', basis: 'per-stack-link', qty: 1 },
      { sku: 'TVP-CMB-4', basis: 'per-system', qty: 1, when: { kind: 'stacks-over-inputs' } },
      { sku: 'TVP-ACC-SIGN', basis: 'per-system', qty: 1 },
      ...siteRules({ bollard: 'TVP-ACC-BOLL', hood: 'TVP-ACC-HOOD', board: 'TVP-ACC-BOARD', seismic: 'QRB-ACC-SEISMIC' }),
      { sku: 'TVP-ACC-STRAP', basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: 1200 } },
    ],
  },
  {
    // (d) Series mid voltage, controller without cells: 2 modules = 102.4 V nominal,
    // 116.8 V max (DVC-B); 3–5 modules = 153.6–256 V (DVC-C).
    code: 'QRB-RIDGE',
    name: 'Quarnby Ridge HV',
    maker: 'QRB',
    connection: 'series',
    controllerSku: 'QRB-RIDGE-CTL',
    moduleSku: 'QRB-RIDGE-M25',
    minModules: 2,
    maxModules: 5,
    maxStacks: 2,
    baseHeightMm: 80,
    defaultDodPct: 95,
    compatibleInverterSkus: ['HLM-INV-6HV1', 'HLM-INV-10HV3'],
    rules: [
      { sku: 'QRB-RIDGE-FEET', basis: 'per-stack', qty: 4 },
      { sku: 'QRB-RIDGE-EC', basis: 'per-stack', qty: 1 },
      { sku: 'QRB-WB-S', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'stud' } },
      { sku: 'QRB-WB-M', basis: 'per-stack', qty: 1, when: { kind: 'wall', wall: 'masonry' } },
      { sku: 'QRB-RIDGE-LINK', basis: 'per-module', qty: 1 },
      ...byRun('per-stack', [
        ['QRB-CBL-HV6-015', 1.5],
        ['QRB-CBL-HV6-030', 3],
        ['QRB-CBL-HV6-050', 5],
        ['QRB-CBL-HV6-100', 10],
      ]),
      { sku: 'QRB-CCV-15', basis: 'per-stack', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'QRB-CDT-25', basis: 'per-metre-of-run', qty: 1, when: { kind: 'dvc-b-or-c' } },
      { sku: 'QRB-EL-6-15', basis: 'per-stack', qty: 1 },
      { sku: 'HLM-ACC-ISO', basis: 'per-system', qty: 1 },
      ...byRun('per-system', [
        ['QRB-COMM-INV-2', 2],
        ['QRB-COMM-INV-5', 5],
        ['QRB-COMM-INV-10', 10],
      ]),
      { sku: 'QRB-CT-485', basis: 'per-system', qty: 1 },
      { sku: 'QRB-LINK-1M', basis: 'per-stack-link', qty: 1 },
      { sku: 'QRB-ACC-HVJB', basis: 'per-system', qty: 1, when: { kind: 'stacks-over-inputs' } },
      { sku: 'QRB-ACC-SIGN', basis: 'per-system', qty: 1 },
      ...siteRules({ bollard: 'HLM-ACC-BOLL', hood: 'QRB-ACC-HOOD', board: 'HLM-ACC-BOARD', seismic: 'QRB-ACC-SEISMIC' }),
      { sku: 'QRB-ACC-STRAP', basis: 'per-stack', qty: 1, when: { kind: 'height-over', mm: 1200 } },
    ],
  },
];
