// What the planner knows about the place the battery goes, and the installation facts that
// depend on it. The standards stay the authority: each fact carries its source, and facts
// recalled from memory say so here (in code), so whoever maintains them knows to check the
// current edition before relying on the wording.
import { z } from 'zod';

export const WALLS = ['stud', 'masonry'] as const;
export const LOCATIONS = ['indoor', 'garage', 'outdoor'] as const;
export const FLOORS = ['slab', 'suspended'] as const;
export const COUNTRIES = ['AU', 'NZ'] as const;
export type Wall = (typeof WALLS)[number];
export type SiteLocation = (typeof LOCATIONS)[number];
export type Floor = (typeof FLOORS)[number];
export type Country = (typeof COUNTRIES)[number];

/** A longer battery-to-inverter run than this is not a home battery job the planner can price. */
export const MAX_CABLE_RUN_M = 50;

export const SiteInputSchema = z.strictObject({
  cableRunM: z
    .number({ error: 'The cable run is a number of metres.' })
    .positive('The cable run from battery to inverter must be above 0 m.')
    .max(MAX_CABLE_RUN_M, `A cable run over ${MAX_CABLE_RUN_M} m is not a battery-beside-the-inverter job: plan the cabling separately.`)
    .optional(),
  wall: z.enum(WALLS, { error: "The wall is 'stud' (timber or steel stud) or 'masonry'." }).optional(),
  location: z.enum(LOCATIONS, { error: "The location is 'indoor', 'garage' or 'outdoor' (under cover)." }).optional(),
  sharesHabitableWall: z.boolean({ error: 'Say true or false: does the wall back onto a habitable room?' }).optional(),
  floor: z.enum(FLOORS, { error: "The floor is 'slab' (on ground) or 'suspended'." }).optional(),
  country: z.enum(COUNTRIES, { error: "The country is 'AU' or 'NZ'." }).optional(),
});
export type SiteInput = z.infer<typeof SiteInputSchema>;
export type Site = Required<SiteInput>;

/** What the planner assumes for anything the user left out; the answer lists what it assumed. */
export const DEFAULT_SITE: Site = {
  cableRunM: 3,
  wall: 'stud',
  location: 'indoor',
  sharesHabitableWall: false,
  floor: 'slab',
  country: 'AU',
};

export const WALL_LABELS: Record<Wall, string> = { stud: 'timber or steel stud wall', masonry: 'masonry wall' };
export const LOCATION_LABELS: Record<SiteLocation, string> = {
  indoor: 'indoors (not a habitable room)',
  garage: 'garage or carport',
  outdoor: 'outdoors under cover',
};
export const FLOOR_LABELS: Record<Floor, string> = { slab: 'slab on ground', suspended: 'suspended floor' };
export const COUNTRY_LABELS: Record<Country, string> = { AU: 'Australia', NZ: 'New Zealand' };

const metres = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 2 });

function describeField<K extends keyof Site>(key: K, value: Site[K]): string {
  switch (key) {
    case 'cableRunM':
      return `${metres.format(value as number)} m cable run`;
    case 'wall':
      return WALL_LABELS[value as Wall];
    case 'location':
      return LOCATION_LABELS[value as SiteLocation];
    case 'sharesHabitableWall':
      return value ? 'wall shared with a habitable room' : 'wall not shared with a habitable room';
    case 'floor':
      return FLOOR_LABELS[value as Floor];
    default:
      return COUNTRY_LABELS[value as Country];
  }
}

/** The site with defaults filled in, and a sentence for each default the planner had to assume. */
export function resolveSite(input: SiteInput | undefined): { site: Site; assumed: string[] } {
  const site: Site = { ...DEFAULT_SITE };
  const assumed: string[] = [];
  for (const key of Object.keys(DEFAULT_SITE) as (keyof Site)[]) {
    const given = input?.[key];
    if (given === undefined) assumed.push(describeField(key, DEFAULT_SITE[key]));
    else (site as Record<keyof Site, unknown>)[key] = given;
  }
  return { site, assumed };
}

// ---------------------------------------------------------------------------------------
// Enclosure ratings per location

/** "IP55" → [5, 5]; an X (not tested) counts as 0; null when it is not an IP code. */
export function ipDigits(rating: string | null | undefined): [number, number] | null {
  const m = /^IP([0-6X])([0-9X])/i.exec(rating?.trim() ?? '');
  if (!m) return null;
  const digit = (c: string) => (c.toUpperCase() === 'X' ? 0 : Number(c));
  return [digit(m[1]!), digit(m[2]!)];
}

/**
 * The least enclosure rating for each location. Outdoors under cover still gets wind-blown
 * dust and rain: IP54 is the usual floor in makers' outdoor ratings (common practice; the
 * maker's manual decides for each product). Indoors and in a garage any rating will do.
 */
export const MIN_IP_BY_LOCATION: Record<SiteLocation, [number, number] | null> = {
  indoor: null,
  garage: null,
  outdoor: [5, 4],
};

/** Null when the rating suits the location, else why not. */
export function ipUnsuited(rating: string | null | undefined, location: SiteLocation): string | null {
  const least = MIN_IP_BY_LOCATION[location];
  if (!least) return null;
  const digits = ipDigits(rating);
  if (!digits) return `no IP rating is given, and ${LOCATION_LABELS[location]} needs at least IP${least.join('')}`;
  if (digits[0] >= least[0] && digits[1] >= least[1]) return null;
  return `it is rated ${rating}, and ${LOCATION_LABELS[location]} needs at least IP${least.join('')}`;
}

// ---------------------------------------------------------------------------------------
// Where a battery may not go, and the clearances around it

export interface InstallFact {
  text: string;
  source: string;
  /**
   * True when the wording was recalled from memory rather than read from the standard
   * at hand: check the current edition before relying on it.
   */
  fromMemory: boolean;
}

const AS5139 = 'AS/NZS 5139:2019';

/** Places a pre-assembled battery system may not be installed (AS/NZS 5139:2019, clause 6.2, recalled from memory). */
export const PROHIBITED_PLACES: InstallFact[] = [
  { text: 'in a habitable room (bedroom, living area, kitchen and the like)', source: AS5139, fromMemory: true },
  { text: 'in a ceiling space or roof space', source: AS5139, fromMemory: true },
  { text: 'in a wall cavity, or recessed into a wall', source: AS5139, fromMemory: true },
  { text: 'on a roof', source: AS5139, fromMemory: true },
  { text: 'under stairs or under an access walkway', source: AS5139, fromMemory: true },
  { text: 'in an evacuation (escape) route or within 600 mm of an exit', source: AS5139, fromMemory: true },
];

/** Clearances around a pre-assembled battery system (AS/NZS 5139:2019, recalled from memory). */
export const CLEARANCES: InstallFact[] = [
  { text: '600 mm to the side of a door, window or vent that opens into a habitable room', source: AS5139, fromMemory: true },
  { text: '600 mm to the side of a hot-water unit, air-conditioner, gas meter or other appliance', source: AS5139, fromMemory: true },
  { text: '900 mm clear above the battery (no openings, appliances or switchboards in that zone)', source: AS5139, fromMemory: true },
  { text: 'a clear working space in front, as the maker’s manual sets out', source: `${AS5139}; maker's installation manual`, fromMemory: true },
];

/** Signs a battery system needs (AS/NZS 5139:2019 and AS/NZS 4777.1, recalled from memory). */
export const REQUIRED_SIGNS: InstallFact[] = [
  { text: 'a battery-system sign at the battery, naming the chemistry, voltage and energy', source: AS5139, fromMemory: true },
  { text: 'the emergency shutdown procedure, beside the battery and at the switchboard', source: AS5139, fromMemory: true },
  { text: 'labels on every battery isolator and DC isolation point', source: AS5139, fromMemory: true },
  { text: 'the ES sign at the main switchboard, showing the UN number (UN 3480 for lithium-ion batteries)', source: `${AS5139}; AS/NZS 4777.1`, fromMemory: true },
];

/**
 * Residential floor design actions, AS/NZS 1170.1:2002 Table 3.1 (self-contained dwellings):
 * 1.5 kPa distributed (RESIDENTIAL_FLOOR_KPA in energy.ts) and 1.8 kN concentrated. Both values recalled from memory: check the
 * table before relying on them. The planner tells the user to confirm with the building's
 * engineer whatever the figures say.
 */
export const RESIDENTIAL_FLOOR_POINT_KN = 1.8;
export const FLOOR_STANDARD = 'AS/NZS 1170.1:2002 Table 3.1';

/** New Zealand seismic restraint of battery systems: NZS 4219 (seismic performance of engineering systems), recalled from memory. */
export const SEISMIC_STANDARD = 'NZS 4219:2009';
