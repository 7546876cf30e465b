// Index settings for the search stand-in: Meilisearch v1 defaults, payload validation and the
// merge rules of PATCH /settings (absent = keep, null = reset to default, object settings merge).

import { z } from 'zod';
import { MeiliError, snakeCase } from './standin-errors.ts';
import { isPlainObject, type Json } from './standin-text.ts';

export type TypoTolerance = {
  enabled: boolean;
  minWordSizeForTypos: { oneTypo: number; twoTypos: number };
  disableOnWords: string[];
  disableOnAttributes: string[];
  disableOnNumbers: boolean;
};

export type FilterableAttribute = string | { attributePatterns: string[]; features?: unknown };

export type IndexSettings = {
  displayedAttributes: string[];
  searchableAttributes: string[];
  filterableAttributes: FilterableAttribute[];
  sortableAttributes: string[];
  rankingRules: string[];
  stopWords: string[];
  nonSeparatorTokens: string[];
  separatorTokens: string[];
  dictionary: string[];
  synonyms: Record<string, string[]>;
  distinctAttribute: string | null;
  proximityPrecision: 'byWord' | 'byAttribute';
  typoTolerance: TypoTolerance;
  faceting: { maxValuesPerFacet: number; sortFacetValuesBy: Record<string, 'alpha' | 'count'> };
  pagination: { maxTotalHits: number };
  embedders: Record<string, unknown>;
  searchCutoffMs: number | null;
  localizedAttributes: unknown[] | null;
  facetSearch: boolean;
  prefixSearch: 'indexingTime' | 'disabled';
};

export type SettingName = keyof IndexSettings;
export type SettingsPatch = Partial<Record<SettingName, unknown>>;

// Meilisearch docs, "Settings" reference: default value of every setting.
const DEFAULT_SETTINGS: IndexSettings = {
  displayedAttributes: ['*'],
  searchableAttributes: ['*'],
  filterableAttributes: [],
  sortableAttributes: [],
  rankingRules: ['words', 'typo', 'proximity', 'attribute', 'sort', 'exactness'],
  stopWords: [],
  nonSeparatorTokens: [],
  separatorTokens: [],
  dictionary: [],
  synonyms: {},
  distinctAttribute: null,
  proximityPrecision: 'byWord',
  typoTolerance: {
    enabled: true,
    minWordSizeForTypos: { oneTypo: 5, twoTypos: 9 },
    disableOnWords: [],
    disableOnAttributes: [],
    disableOnNumbers: false,
  },
  faceting: { maxValuesPerFacet: 100, sortFacetValuesBy: { '*': 'alpha' } },
  pagination: { maxTotalHits: 1000 },
  embedders: {},
  searchCutoffMs: null,
  localizedAttributes: null,
  facetSearch: true,
  prefixSearch: 'indexingTime',
};

const RANKING_RULE =
  /^(words|typo|proximity|attribute|attributeRank|wordPosition|sort|exactness|.+:(asc|desc))$/;

const stringList = z.array(z.string()).nullable();
const count = z.number().int().min(0);

const SETTING_SCHEMAS: Record<SettingName, z.ZodType> = {
  displayedAttributes: stringList,
  searchableAttributes: stringList,
  filterableAttributes: z
    .array(
      z.union([
        z.string(),
        z.object({ attributePatterns: z.array(z.string()), features: z.unknown().optional() }),
      ]),
    )
    .nullable(),
  sortableAttributes: stringList,
  rankingRules: z.array(z.string().regex(RANKING_RULE)).nullable(),
  stopWords: stringList,
  nonSeparatorTokens: stringList,
  separatorTokens: stringList,
  dictionary: stringList,
  synonyms: z.record(z.string(), z.array(z.string())).nullable(),
  distinctAttribute: z.string().nullable(),
  proximityPrecision: z.enum(['byWord', 'byAttribute']).nullable(),
  typoTolerance: z
    .strictObject({
      enabled: z.boolean().nullish(),
      minWordSizeForTypos: z
        .strictObject({ oneTypo: count.nullish(), twoTypos: count.nullish() })
        .nullish(),
      disableOnWords: stringList.optional(),
      disableOnAttributes: stringList.optional(),
      disableOnNumbers: z.boolean().nullish(),
    })
    .nullable(),
  faceting: z
    .strictObject({
      maxValuesPerFacet: count.nullish(),
      sortFacetValuesBy: z.record(z.string(), z.enum(['alpha', 'count'])).nullish(),
    })
    .nullable(),
  pagination: z.strictObject({ maxTotalHits: z.number().int().min(1).nullish() }).nullable(),
  embedders: z.record(z.string(), z.unknown()).nullable(),
  searchCutoffMs: count.nullable(),
  localizedAttributes: z.array(z.unknown()).nullable(),
  facetSearch: z.boolean().nullable(),
  prefixSearch: z.enum(['indexingTime', 'disabled']).nullable(),
};

// Object settings whose PATCH updates only the given sub-fields, as Meilisearch does.
const MERGED_OBJECTS = new Set(['typoTolerance', 'minWordSizeForTypos', 'faceting', 'pagination']);

const SETTING_NAMES = Object.keys(DEFAULT_SETTINGS) as SettingName[];

export function defaultSettings(): IndexSettings {
  return structuredClone(DEFAULT_SETTINGS);
}

function isSettingName(name: string): name is SettingName {
  return Object.hasOwn(DEFAULT_SETTINGS, name);
}

/** Maps a settings sub-route such as `filterable-attributes` to its setting name. */
export function settingNameFromPath(path: string): SettingName | undefined {
  const name = path.replace(/-([a-z])/g, (_, letter: string) => letter.toUpperCase());
  return isSettingName(name) ? name : undefined;
}

/** Validates a settings payload; malformed settings are rejected synchronously, like Meilisearch. */
export function parseSettings(body: unknown): SettingsPatch {
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    throw new MeiliError(400, 'bad_request', 'The settings payload must be a JSON object.');
  }
  const patch: SettingsPatch = {};
  for (const [name, value] of Object.entries(body)) {
    if (!isSettingName(name)) {
      throw new MeiliError(
        400,
        'bad_request',
        `Unknown field \`${name}\`: expected one of ${SETTING_NAMES.map((n) => `\`${n}\``).join(', ')}`,
      );
    }
    const parsed = SETTING_SCHEMAS[name].safeParse(value);
    if (!parsed.success) {
      throw new MeiliError(
        400,
        `invalid_settings_${snakeCase(name)}`,
        `Invalid value at \`.${name}\`: ${parsed.error.issues[0]?.message ?? 'invalid value'}`,
      );
    }
    patch[name] = value;
  }
  return patch;
}

function mergeSettingsObject(current: Json, patch: Json, defaults: Json): Json {
  const merged = { ...current };
  for (const [key, value] of Object.entries(patch)) {
    if (value === undefined) continue;
    if (value === null) {
      merged[key] = structuredClone(defaults[key]);
    } else if (MERGED_OBJECTS.has(key) && isPlainObject(value)) {
      merged[key] = mergeSettingsObject(current[key] as Json, value, defaults[key] as Json);
    } else {
      merged[key] = value;
    }
  }
  return merged;
}

export function applySettings(current: IndexSettings, patch: SettingsPatch): IndexSettings {
  return mergeSettingsObject(current, patch, DEFAULT_SETTINGS) as IndexSettings;
}

/** Names listed in filterableAttributes, whether given as plain strings or granular patterns. */
export function filterablePatterns(settings: IndexSettings): string[] {
  return settings.filterableAttributes.flatMap((rule) =>
    typeof rule === 'string' ? [rule] : rule.attributePatterns,
  );
}

/**
 * Whether an attribute is covered by a settings list entry: the entry itself, a nested field of
 * it (`author` covers `author.name`), or a `*` wildcard pattern.
 */
export function matchesAttributeList(patterns: string[], attribute: string): boolean {
  return patterns.some((pattern) => {
    if (pattern === attribute || attribute.startsWith(`${pattern}.`)) return true;
    if (!pattern.includes('*')) return false;
    const regex = pattern.split('*').map(escapeRegExp).join('.*');
    return new RegExp(`^${regex}$`).test(attribute);
  });
}

function escapeRegExp(text: string): string {
  return text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
