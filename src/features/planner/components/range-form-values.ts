// The range editor's form shape and how it maps to and from the API's RangeInput.
import type { z } from 'zod';
import type { RangeDetail, RangeInput } from '@shared/contracts/stack-plans.ts';
import type { BomBasis, BomCondition, BomRule } from '@shared/domain/bom-rules.ts';
import type { Country, Floor, SiteLocation, Wall } from '@shared/domain/site.ts';

export type ConditionKind = BomCondition['kind'];

export interface RuleRow {
  sku: string;
  basis: BomBasis;
  qty: number;
  /** Only for per-n-modules; a disabled box leaves it undefined. */
  divisor?: number;
  /** The condition and whichever parameter its kind takes; the schema checks the pair. */
  when: { kind: ConditionKind; mm?: number; wall?: Wall; location?: SiteLocation; floor?: Floor; country?: Country; overM?: number; upToM?: number };
}

export type RangeFormValues = Omit<RangeInput, 'rules'> & { rules: RuleRow[] };

export const BASIS_LABELS: Record<BomBasis, string> = {
  'per-system': 'per system',
  'per-stack': 'per stack',
  'per-module': 'per module',
  'per-cell-unit': 'per cell-carrying unit',
  'per-n-modules': 'per N modules (rounded up)',
  'per-stack-link': 'per link between stacks (stacks − 1)',
  'per-metre-of-run': 'per metre of cable run',
};

export const CONDITION_LABELS: Record<ConditionKind, string> = {
  always: 'always',
  'dvc-b-or-c': 'DC class B or C (above 60 V)',
  'multi-stack': 'more than one stack',
  'height-over': 'stack taller than …',
  wall: 'wall is …',
  location: 'location is …',
  'shares-habitable-wall': 'wall shared with a habitable room',
  floor: 'floor is …',
  country: 'country is …',
  'stacks-over-inputs': "more stacks than the inverter's inputs",
  'run-within': 'cable run between … and … m',
};

/** A fresh condition of a kind, with a sensible parameter so the row is valid at once. */
export function conditionOfKind(kind: ConditionKind): RuleRow['when'] {
  switch (kind) {
    case 'height-over':
      return { kind, mm: 1200 };
    case 'wall':
      return { kind, wall: 'stud' };
    case 'location':
      return { kind, location: 'garage' };
    case 'floor':
      return { kind, floor: 'suspended' };
    case 'country':
      return { kind, country: 'NZ' };
    case 'run-within':
      return { kind, overM: 0, upToM: 3 };
    default:
      return { kind };
  }
}

export const EMPTY_RULE: RuleRow = { sku: '', basis: 'per-stack', qty: 1, when: { kind: 'always' } };

export function formValuesOf(d: RangeDetail): RangeFormValues {
  return {
    name: d.name,
    connection: d.connection,
    controllerSku: d.controllerSku,
    moduleSku: d.moduleSku,
    minModules: d.minModules,
    maxModules: d.maxModules,
    maxStacks: d.maxStacks,
    baseHeightMm: d.baseHeightMm,
    defaultDodPct: d.defaultDodPct,
    inverterSkus: d.inverterSkus,
    rules: d.rules.map((r: BomRule) => ({
      sku: r.sku,
      basis: r.basis,
      qty: r.qty,
      divisor: r.divisor,
      when: { ...r.when },
    })),
  };
}

/** Field paths the form can show an error beside; anything else goes in the summary. */
export function knownPaths(rules: number): string[] {
  const top = ['name', 'connection', 'controllerSku', 'moduleSku', 'minModules', 'maxModules', 'maxStacks', 'baseHeightMm', 'defaultDodPct'];
  const perRule = ['sku', 'basis', 'qty', 'divisor', 'when', 'when.mm', 'when.upToM', 'when.overM'];
  return [...top, ...Array.from({ length: rules }, (_, i) => perRule.map((f) => `rules.${i}.${f}`)).flat()];
}

/** Plain words for zod's stock messages; the schema's own messages still win. */
export const plainErrors: z.core.$ZodErrorMap = (iss) => {
  if (iss.code === 'invalid_type' && iss.expected === 'number') return 'Enter a number.';
  if (iss.code === 'invalid_type' && iss.expected === 'int') return 'Enter a whole number.';
  if (iss.code === 'too_small' && iss.origin === 'number') return `At least ${String(iss.minimum)}.`;
  if (iss.code === 'too_big' && iss.origin === 'number') return `At most ${String(iss.maximum)}.`;
  if (iss.code === 'too_small' && iss.origin === 'string') return 'Fill this in.';
  if (iss.code === 'too_big' && iss.origin === 'string') return `At most ${String(iss.maximum)} characters.`;
  return undefined;
};
