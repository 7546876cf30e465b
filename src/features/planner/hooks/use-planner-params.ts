import { useCallback, useEffect, useRef, useState } from 'react';
import { useSearchParams } from 'react-router';
import { COUNTRIES, FLOORS, LOCATIONS, WALLS, type SiteInput } from '@shared/domain/site.ts';

export type PlanMode = 'modules' | 'target';

/** What the planner is asked, kept in the URL so a plan can be bookmarked, shared and reopened. */
export interface PlannerParams {
  range: string | null;
  mode: PlanMode;
  /** As typed, so a half-typed number stays in the box. */
  modules: string;
  stacks: string;
  kwh: string;
  inverter: string | null;
  /** Put the chosen inverter on the BOM. */
  includeInverter: boolean;
  /** Site, as typed or chosen; empty means "not said" (the planner assumes and says so). */
  run: string;
  wall: string;
  location: string;
  /** 'yes' | 'no' | '' */
  sharedWall: string;
  floor: string;
  country: string;
}

const KEYS = ['range', 'mode', 'modules', 'stacks', 'kwh', 'inverter', 'includeInverter', 'run', 'wall', 'location', 'sharedWall', 'floor', 'country'] as const;

function parse(search: URLSearchParams): PlannerParams {
  return {
    range: search.get('range'),
    mode: search.get('mode') === 'target' ? 'target' : 'modules',
    modules: search.get('modules') ?? '',
    stacks: search.get('stacks') ?? '1',
    kwh: search.get('kwh') ?? '',
    inverter: search.get('inverter'),
    includeInverter: search.get('includeInverter') === 'yes',
    run: search.get('run') ?? '',
    wall: search.get('wall') ?? '',
    location: search.get('location') ?? '',
    sharedWall: search.get('sharedWall') ?? '',
    floor: search.get('floor') ?? '',
    country: search.get('country') ?? '',
  };
}

function write(base: URLSearchParams, params: PlannerParams): URLSearchParams {
  const next = new URLSearchParams(base);
  for (const k of KEYS) {
    const v = params[k];
    if (v === null || v === '' || v === false || (k === 'stacks' && v === '1' && !base.has('stacks'))) next.delete(k);
    else next.set(k, v === true ? 'yes' : String(v));
  }
  return next;
}

/**
 * The planner's inputs. Boxes read and write React state, which updates on every keystroke
 * at once; the URL follows behind. (Bound to the URL directly, a keystroke arriving before
 * the router's navigation had settled was overwritten by the old value: "20.5" typed fast
 * became "2.5".) A URL changed from outside — back, forward, a shared link — is adopted.
 */
export function usePlannerParams() {
  const [search, setSearch] = useSearchParams();
  const [params, setParams] = useState<PlannerParams>(() => parse(search));
  const written = useRef(search.toString());

  useEffect(() => {
    const now = search.toString();
    if (now === written.current) return;
    written.current = now;
    setParams(parse(search));
  }, [search]);

  useEffect(() => {
    const next = write(search, params);
    if (next.toString() === written.current) return;
    written.current = next.toString();
    setSearch(next, { replace: true });
    // Only our own state changes are written; `search` is read for the keys we do not own.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [params]);

  const update = useCallback((patch: Partial<PlannerParams>) => setParams((prev) => ({ ...prev, ...patch })), []);
  return { params, update };
}

/** The number typed in a box (modules, stacks or kWh), or null while it is empty or not a number. */
export function numberOrNull(text: string): number | null {
  if (text.trim() === '') return null;
  const n = Number(text);
  return Number.isFinite(n) ? n : null;
}

const oneOf = <T extends string>(values: readonly T[], v: string): T | undefined => (values as readonly string[]).includes(v) ? (v as T) : undefined;

/** The site as the API takes it: only what the user said; a half-typed run is left out. */
export function siteFrom(p: PlannerParams): SiteInput | undefined {
  const site: SiteInput = {};
  const run = numberOrNull(p.run);
  if (run !== null) site.cableRunM = run;
  const wall = oneOf(WALLS, p.wall);
  if (wall) site.wall = wall;
  const location = oneOf(LOCATIONS, p.location);
  if (location) site.location = location;
  if (p.sharedWall === 'yes' || p.sharedWall === 'no') site.sharesHabitableWall = p.sharedWall === 'yes';
  const floor = oneOf(FLOORS, p.floor);
  if (floor) site.floor = floor;
  const country = oneOf(COUNTRIES, p.country);
  if (country) site.country = country;
  return Object.keys(site).length > 0 ? site : undefined;
}

/** Planner params for a saved request's site, so "open in planner" brings the site along. */
export function siteParams(site: SiteInput | undefined): Partial<PlannerParams> {
  if (!site) return {};
  return {
    run: site.cableRunM !== undefined ? String(site.cableRunM) : '',
    wall: site.wall ?? '',
    location: site.location ?? '',
    sharedWall: site.sharesHabitableWall === undefined ? '' : site.sharesHabitableWall ? 'yes' : 'no',
    floor: site.floor ?? '',
    country: site.country ?? '',
  };
}
