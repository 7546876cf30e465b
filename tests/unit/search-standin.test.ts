// The search stand-in's contract, driven through the real meilisearch client: the answers and
// errors the app relies on have Meilisearch's shapes, and what the fake does not implement is
// refused rather than ignored. The product's search behaviour is tested through the API
// (tests/api/catalogue*.test.ts).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Meilisearch, MeilisearchApiError } from 'meilisearch';
import { startSearchStandin, type RunningSearchStandin } from '../../server/search/standin/server.ts';

const DOCS = [
  { id: 'a', name: 'Flat cable cover', kind: 'cover', price: 20, tags: ['cable', 'outdoor'], stocked: true },
  { id: 'b', name: 'Round cable cover', kind: 'cover', price: 9, tags: ['cable'], stocked: false },
  { id: 'c', name: 'Wall bracket', kind: 'bracket', price: 100, tags: [], stocked: true },
  { id: 'd', name: 'Bracket screws', kind: 'fixing', tags: ['bracket'], stocked: true },
];

let standin: RunningSearchStandin;
let client: Meilisearch;
beforeAll(async () => {
  standin = await startSearchStandin({ port: 0 });
  client = new Meilisearch({ host: standin.url });
  await client.createIndex('things', { primaryKey: 'id' }).waitTask();
  const settings = await client.index('things').updateSettings({ searchableAttributes: ['name', 'tags'], filterableAttributes: ['kind', 'tags', 'stocked', 'price'], sortableAttributes: ['price', 'name'], pagination: { maxTotalHits: 3 } }).waitTask();
  expect(settings.status).toBe('succeeded');
  expect((await client.index('things').addDocuments(DOCS).waitTask()).status).toBe('succeeded');
});
afterAll(() => standin.close());

async function apiError(promise: Promise<unknown>) {
  const error = await promise.then(
    () => null,
    (e: unknown) => e,
  );
  // The client wraps the server's error answer in MeilisearchRequestError, or raises it as MeilisearchApiError.
  const api = error instanceof MeilisearchApiError ? error : (error as { cause?: unknown })?.cause;
  expect(api).toBeInstanceOf(MeilisearchApiError);
  return api as MeilisearchApiError;
}

const ids = (hits: Record<string, unknown>[]) => hits.map((h) => h.id);

describe('search stand-in', () => {
  it('filters with =, !=, IN, NOT, parentheses and the array form', async () => {
    const things = client.index('things');
    // Meilisearch API reference, "Filter expressions": text compares case-insensitively; arrays match any element.
    expect(ids((await things.search('', { filter: 'kind = "COVER"' })).hits)).toEqual(['a', 'b']);
    expect(ids((await things.search('', { filter: 'tags = bracket OR price = 100' })).hits)).toEqual(['c', 'd']);
    expect(ids((await things.search('', { filter: 'NOT (kind IN [cover, fixing]) AND stocked = true' })).hits)).toEqual(['c']);
    expect(ids((await things.search('', { filter: 'kind != cover' })).hits)).toEqual(['c', 'd']);
    // Outer array: AND; inner array: OR.
    expect(ids((await things.search('', { filter: [['kind = bracket', 'kind = fixing'], 'stocked = true'] })).hits)).toEqual(['c', 'd']);
  });

  it('counts facet values over every match, in alphabetical order', async () => {
    const found = await client.index('things').search('cable', { facets: ['kind', 'stocked'] });
    // Meilisearch API reference, "facetDistribution": values as strings, counted over all matches.
    expect(found.facetDistribution).toEqual({ kind: { cover: 2 }, stocked: { false: 1, true: 1 } });
  });

  it('sorts numbers numerically with missing values last both ways, and caps totals at maxTotalHits', async () => {
    const things = client.index('things');
    // Meilisearch docs, "Sorting": documents without the attribute come last, whatever the direction.
    expect(ids((await things.search('', { sort: ['price:asc'], limit: 10 })).hits)).toEqual(['b', 'a', 'c']);
    expect(ids((await things.search('', { sort: ['price:desc'], offset: 2 })).hits)).toEqual(['b']);
    expect((await things.search('')).estimatedTotalHits).toBe(3);
  });

  it('ranks more matched words first, then fewer typos', async () => {
    // Meilisearch docs, "Ranking rules": words, then typo, then proximity, attribute, sort, exactness.
    expect(ids((await client.index('things').search('cable round')).hits)).toEqual(['b', 'a']);
    expect(ids((await client.index('things').search('brakcet')).hits)).toEqual(['c', 'd']);
  });

  it('answers errors with Meilisearch codes, and fails the task of a write it cannot do', async () => {
    const things = client.index('things');
    expect((await apiError(things.search('', { filter: 'name = x' }))).cause?.code).toBe('invalid_search_filter');
    expect((await apiError(things.search('', { filter: 'kind = ' }))).cause?.code).toBe('invalid_search_filter');
    expect((await apiError(things.search('', { sort: ['kind:asc'] }))).cause?.code).toBe('invalid_search_sort');
    expect((await apiError(client.index('nothing').search(''))).response.status).toBe(404);
    // Meilisearch API reference, "Tasks": a write is accepted, and fails in its task.
    const again = await client.createIndex('things').waitTask();
    expect(again).toMatchObject({ status: 'failed', error: { code: 'index_already_exists' } });
    const noId = await things.addDocuments([{ name: 'no id' }]).waitTask();
    expect(noId).toMatchObject({ status: 'failed', error: { code: 'missing_document_id' } });
  });

  it('refuses parameters and settings the app does not send, instead of ignoring them', async () => {
    const things = client.index('things');
    const unknownParameter = await apiError(things.search('cable', { highlightPreTag: '<b>' }));
    expect(unknownParameter.response.status).toBe(400);
    expect(unknownParameter.cause?.code).toBe('bad_request');
    expect((await apiError(things.updateSettings({ rankingRules: ['words'] }).waitTask())).response.status).toBe(400);
  });
});
