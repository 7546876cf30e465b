// Battery energy arithmetic. Products go through Decimal so a datasheet figure such as
// 44.8 V × 100 Ah gives 4480 Wh, not 4480.000000000001.
import Decimal from 'decimal.js';

/** LFP (lithium iron phosphate) cell voltages, common practice. */
export const LFP_CELL_NOMINAL_V = 3.2;
export const LFP_CELL_FULL_V = 3.65;
/** Lower end of the usual 2.5–3.0 V cut-off band: the widest window the pack can present. */
export const LFP_CELL_CUTOFF_V = 2.5;

/** Used when a range gives no depth of discharge and the unit no usable figure. */
export const DEFAULT_DOD_PCT = 90;
/** Cycle-life ratings are usually stated to 80 % of first capacity (common practice). */
export const DEFAULT_EOL_SOH_PCT = 80;

/** Floor load above which residential floors need a second look (AS/NZS 1170.1, from memory). */
export const RESIDENTIAL_FLOOR_KPA = 1.5;
export const STANDARD_GRAVITY = 9.81;

export type Dvc = 'A' | 'B' | 'C';
/** DVC boundaries in V DC, as used by AS/NZS 5139:2019 from IEC 62109-1. */
export const DVC_A_MAX_V = 60;
export const DVC_B_MAX_V = 120;

/** Round half away from zero on the decimal value a reader would type, not the binary one. */
export function roundTo(value: number, places = 2): number {
  return new Decimal(value).toDecimalPlaces(places, Decimal.ROUND_HALF_UP).toNumber();
}

export function nominalWh(volts: number, ampHours: number): number {
  return new Decimal(volts).times(ampHours).toNumber();
}

export function nominalKwh(volts: number, ampHours: number): number {
  return new Decimal(volts).times(ampHours).dividedBy(1000).toNumber();
}

export function energyFromDod(nominalKwhValue: number, dodPct: number): number {
  return new Decimal(nominalKwhValue).times(dodPct).dividedBy(100).toNumber();
}

/** The maker's usable figure when there is one, else nominal × depth of discharge. */
export function usableKwh(args: { nominalKwh: number; makerUsableKwh?: number | null; dodPct?: number | null }): number {
  if (args.makerUsableKwh != null) return args.makerUsableKwh;
  return energyFromDod(args.nominalKwh, args.dodPct ?? DEFAULT_DOD_PCT);
}

export function lfpNominalVoltage(cellsInSeries: number): number {
  return new Decimal(cellsInSeries).times(LFP_CELL_NOMINAL_V).toNumber();
}

export function lfpMaxChargeVoltage(cellsInSeries: number): number {
  return new Decimal(cellsInSeries).times(LFP_CELL_FULL_V).toNumber();
}

export function lfpMinVoltage(cellsInSeries: number): number {
  return new Decimal(cellsInSeries).times(LFP_CELL_CUTOFF_V).toNumber();
}

/** Cells in series implied by a nominal voltage, for units whose datasheet omits the count. */
export function lfpCellsFromNominal(nominalV: number): number {
  return Math.round(nominalV / LFP_CELL_NOMINAL_V);
}

/** DC voltage class from the system's highest voltage. */
export function dvcClass(maxVoltage: number): Dvc {
  if (maxVoltage <= DVC_A_MAX_V) return 'A';
  if (maxVoltage <= DVC_B_MAX_V) return 'B';
  return 'C';
}

/** Distributed floor load in kPa: weight (N) over area (m²), in thousands. */
export function floorLoadKpa(massKg: number, footprintM2: number): number {
  if (!(footprintM2 > 0)) throw new RangeError(`The footprint must be above 0 m²; got ${footprintM2}.`);
  return (massKg * STANDARD_GRAVITY) / footprintM2 / 1000;
}

export interface ThroughputInput {
  usableKwh: number;
  cycleLife?: number | null;
  eolSohPct?: number | null;
  warrantedMwh?: number | null;
}

export interface ThroughputEstimate {
  /** Lifetime energy out in MWh; null when neither a warranty figure nor a cycle life is known. */
  mwh: number | null;
  basis: 'warranted' | 'estimated' | 'unknown';
  assumptions: string[];
}

/**
 * Lifetime energy throughput. A warranted figure is a promise and wins; otherwise assume a
 * linear fade from 100 % to the end-of-life state of health, so the average cycle delivers
 * usable × (1 + SoH_eol) / 2.
 */
export function lifetimeThroughput(input: ThroughputInput): ThroughputEstimate {
  if (input.warrantedMwh != null) {
    return {
      mwh: input.warrantedMwh,
      basis: 'warranted',
      assumptions: [`maker's warranted throughput of ${input.warrantedMwh} MWh`],
    };
  }
  if (input.cycleLife == null) {
    return { mwh: null, basis: 'unknown', assumptions: ['no warranted throughput or cycle life given'] };
  }
  const assumptions = [
    `${input.cycleLife.toLocaleString('en-AU')} rated cycles at ${roundTo(input.usableKwh)} kWh usable`,
    'capacity fades linearly over life, so the average cycle delivers the mean state of health',
  ];
  if (input.eolSohPct == null) {
    assumptions.push(`end-of-life state of health not given: ${DEFAULT_EOL_SOH_PCT} % assumed (common practice)`);
  }
  const eol = new Decimal(input.eolSohPct ?? DEFAULT_EOL_SOH_PCT).dividedBy(100);
  const meanSoh = eol.plus(1).dividedBy(2);
  const mwh = new Decimal(input.usableKwh).times(input.cycleLife).times(meanSoh).dividedBy(1000).toNumber();
  return { mwh, basis: 'estimated', assumptions };
}

/** Equivalent full cycles: lifetime throughput over one full usable discharge. */
export function equivalentFullCycles(throughputMwh: number, usableKwhValue: number): number {
  if (!(usableKwhValue > 0)) throw new RangeError(`Usable energy must be above 0 kWh; got ${usableKwhValue}.`);
  return new Decimal(throughputMwh).times(1000).dividedBy(usableKwhValue).toNumber();
}

export function yearsAtOneCyclePerDay(cycles: number): number {
  return cycles / 365;
}

export interface EfficiencySplit {
  chargePct: number;
  dischargePct: number;
}

/**
 * Split a round-trip efficiency into equal charge and discharge legs (each √RTE), the
 * convention energy-system simulations use when only the round trip is published.
 */
export function splitRoundTripEfficiency(roundTripPct: number): EfficiencySplit {
  if (!(roundTripPct > 0 && roundTripPct <= 100)) {
    throw new RangeError(`Round-trip efficiency is a percentage above 0 and up to 100; got ${roundTripPct}.`);
  }
  const leg = new Decimal(roundTripPct).dividedBy(100).sqrt().times(100).toNumber();
  return { chargePct: leg, dischargePct: leg };
}
