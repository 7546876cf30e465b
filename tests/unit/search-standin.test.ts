// The search stand-in, driven only through the real meilisearch client, the way the app uses it.

import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { Meilisearch, MeilisearchApiError, type EnqueuedTaskPromise, type Settings } from 'meilisearch';
import { startSearchStandin, type RunningSearchStandin } from '../../server/search/standin.ts';

type Part = {
  id: string;
  name: string;
  category: string;
  maker: string;
  price: number;
  inStock: boolean;
  tags: string[];
  supersededBy?: string;
};

const PARTS: Part[] = [
  { id: 'p1', name: 'USB cable', category: 'cable', maker: 'acme', price: 5, inStock: true, tags: ['usb', 'power'] },
  { id: 'p2', name: 'HDMI cable', category: 'cable', maker: 'globex', price: 12, inStock: false, tags: ['video'] },
  { id: 'p3', name: 'Power module', category: 'module', maker: 'acme', price: 30, inStock: true, tags: ['power'] },
  { id: 'p4', name: 'Relay module', category: 'module', maker: 'initech', price: 8, inStock: true, tags: [] },
  {
    id: 'p5',
    name: 'Cable ties',
    category: 'accessory',
    maker: 'globex',
    price: 2,
    inStock: true,
    tags: ['cable'],
    supersededBy: 'p1',
  },
];

const PART_SETTINGS: Settings = {
  searchableAttributes: ['name', 'category', 'tags'],
  filterableAttributes: ['category', 'maker', 'inStock', 'price', 'tags', 'supersededBy'],
  sortableAttributes: ['price', 'maker', 'name'],
};

let standin: RunningSearchStandin;
let client: Meilisearch;
let indexCounter = 0;

async function succeeded(task: EnqueuedTaskPromise) {
  const done = await task.waitTask();
  expect(done.error).toBeNull();
  expect(done.status).toBe('succeeded');
  return done;
}

async function partsIndex() {
  const uid = `parts_${++indexCounter}`;
  await succeeded(client.createIndex(uid, { primaryKey: 'id' }));
  const index = client.index<Part>(uid);
  await succeeded(index.updateSettings(PART_SETTINGS));
  await succeeded(index.addDocuments(PARTS));
  return index;
}

function ids(hits: { id: string }[]): string[] {
  return hits.map((hit) => hit.id);
}

async function apiError(promise: Promise<unknown>): Promise<MeilisearchApiError> {
  const error: unknown = await promise.then(
    () => undefined,
    (reason: unknown) => reason,
  );
  expect(error).toBeInstanceOf(MeilisearchApiError);
  return error as MeilisearchApiError;
}

beforeAll(async () => {
  standin = await startSearchStandin({ port: 0 });
  client = new Meilisearch({ host: standin.url });
});

afterAll(async () => {
  await standin.close();
});

describe('server endpoints', () => {
  it('reports health and a version', async () => {
    // Meilisearch API reference: GET /health answers {"status":"available"}.
    expect(await client.health()).toEqual({ status: 'available' });
    expect(await client.isHealthy()).toBe(true);
    expect((await client.getVersion()).pkgVersion).toMatch(/^\d+\.\d+\.\d+$/);
  });
});

describe('indexes and tasks', () => {
  it('creates, lists, updates and deletes an index through enqueued tasks', async () => {
    const enqueued = await client.createIndex('catalog', { primaryKey: 'sku' });
    // Meilisearch API reference: writes answer with a summarized task in status "enqueued".
    expect(enqueued).toMatchObject({ indexUid: 'catalog', status: 'enqueued', type: 'indexCreation' });
    const task = await client.tasks.waitForTask(enqueued.taskUid);
    // Meilisearch API reference: GET /tasks/{uid} reports the outcome once processed.
    expect(task).toMatchObject({ uid: enqueued.taskUid, status: 'succeeded', error: null });

    expect((await client.getIndex('catalog')).primaryKey).toBe('sku');
    // Meilisearch API reference: GET /indexes is paginated, 20 indexes by default.
    const listed = await client.getRawIndexes();
    expect(listed.results.map((index) => index.uid)).toContain('catalog');
    expect(listed).toMatchObject({ offset: 0, limit: 20 });

    // Meilisearch API reference: PATCH /indexes/{uid} changes the primary key of an empty index.
    await succeeded(client.updateIndex('catalog', { primaryKey: 'code' }));
    expect((await client.getRawIndex('catalog')).primaryKey).toBe('code');

    await succeeded(client.deleteIndex('catalog'));
    // Meilisearch errors reference: index_not_found for an index that does not exist.
    const missing = await apiError(client.getIndex('catalog'));
    expect(missing.cause?.code).toBe('index_not_found');
  });

  it('reports a duplicate index as a failed task, not a request error', async () => {
    await succeeded(client.createIndex('twice'));
    const task = await client.createIndex('twice').waitTask();
    // Meilisearch errors reference: index_already_exists is an asynchronous (task) error.
    expect(task.status).toBe('failed');
    expect(task.error?.code).toBe('index_already_exists');
  });

  it('lists tasks newest first and filters them', async () => {
    const uid = `tasks_${++indexCounter}`;
    const created = await client.createIndex(uid).waitTask();
    const failed = await client.createIndex(uid).waitTask();
    // Meilisearch API reference: GET /tasks returns the most recent tasks first.
    const recent = await client.tasks.getTasks({ indexUids: [uid] });
    expect(recent.results.map((task) => task.uid)).toEqual([failed.uid, created.uid]);
    // Meilisearch API reference: GET /tasks filters by statuses and indexUids.
    const onlyFailed = await client.tasks.getTasks({ indexUids: [uid], statuses: ['failed'] });
    expect(onlyFailed.results.map((task) => task.uid)).toEqual([failed.uid]);
  });

  it('stores settings and returns them, including single-setting routes', async () => {
    const index = await partsIndex();
    const settings = await index.getSettings();
    // Meilisearch API reference: GET /settings returns the stored settings.
    expect(settings.filterableAttributes).toEqual(PART_SETTINGS.filterableAttributes);
    expect(settings.searchableAttributes).toEqual(['name', 'category', 'tags']);
    // Meilisearch docs, "Settings": ranking rules and typo tolerance defaults.
    expect(settings.rankingRules).toEqual(['words', 'typo', 'proximity', 'attribute', 'sort', 'exactness']);
    expect(settings.typoTolerance?.minWordSizeForTypos).toEqual({ oneTypo: 5, twoTypos: 9 });

    // Meilisearch API reference: each setting has its own route taking the bare value.
    await succeeded(index.updateDistinctAttribute('maker'));
    expect(await index.getDistinctAttribute()).toBe('maker');
    await succeeded(index.updateSynonyms({ wire: ['cable'] }));
    await succeeded(index.updateTypoTolerance({ minWordSizeForTypos: { oneTypo: 4 } }));
    await succeeded(index.updatePagination({ maxTotalHits: 500 }));
    expect(await index.getSynonyms()).toEqual({ wire: ['cable'] });
    // Meilisearch docs, "Settings": object settings are partially updated.
    expect((await index.getTypoTolerance())?.minWordSizeForTypos).toEqual({ oneTypo: 4, twoTypos: 9 });
    expect(await index.getPagination()).toEqual({ maxTotalHits: 500 });

    // Meilisearch API reference: DELETE on a setting route resets it to its default.
    await succeeded(index.resetSynonyms());
    expect(await index.getSynonyms()).toEqual({});
  });

  it('rejects malformed settings synchronously', async () => {
    const index = await partsIndex();
    // Meilisearch errors reference: invalid_settings_* errors are synchronous.
    const error = await apiError(index.updateSettings({ rankingRules: ['popularity'] }));
    expect(error.cause?.code).toBe('invalid_settings_ranking_rules');
  });
});

describe('documents', () => {
  it('adds, replaces, partially updates, fetches and deletes documents', async () => {
    const index = await partsIndex();
    const page = await index.getDocuments({ offset: 1, limit: 2 });
    // Meilisearch API reference: GET /documents pages with offset and limit and reports the total.
    expect(page).toMatchObject({ offset: 1, limit: 2, total: 5 });
    expect(ids(page.results)).toEqual(['p2', 'p3']);
    // Documents come back exactly as they were sent.
    expect(await index.getDocument('p5')).toEqual(PARTS[4]);
    // Meilisearch API reference: GET /indexes/{uid}/stats counts documents and their fields.
    expect(await index.getStats()).toMatchObject({ numberOfDocuments: 5, isIndexing: false });
    expect((await index.getStats()).fieldDistribution).toMatchObject({ id: 5, supersededBy: 1 });

    // Meilisearch API reference: PUT /documents merges fields into the existing document.
    await succeeded(index.updateDocuments([{ id: 'p1', price: 6 }]));
    expect(await index.getDocument('p1')).toEqual({ ...PARTS[0], price: 6 });
    // Meilisearch API reference: POST /documents replaces the whole document.
    await succeeded(index.addDocuments([{ id: 'p1', name: 'USB-C cable' } as Part]));
    expect(await index.getDocument('p1')).toEqual({ id: 'p1', name: 'USB-C cable' });

    // Meilisearch API reference: POST /documents/fetch filters and projects documents.
    const modules = await index.getDocuments({ filter: 'category = module', fields: ['id'] });
    expect(modules.results).toEqual([{ id: 'p3' }, { id: 'p4' }]);

    // Meilisearch API reference: delete one document, a batch of ids, or by filter.
    await succeeded(index.deleteDocument('p1'));
    await succeeded(index.deleteDocuments(['p2', 'missing']));
    const byFilter = await index.deleteDocuments({ filter: 'maker = acme' }).waitTask();
    expect(byFilter.details?.deletedDocuments).toBe(1);
    expect(ids((await index.getDocuments()).results)).toEqual(['p4', 'p5']);
    // Meilisearch errors reference: document_not_found.
    const notFound = await apiError(index.getDocument('p1'));
    expect(notFound.cause?.code).toBe('document_not_found');

    // Meilisearch API reference: DELETE /documents removes every document.
    await succeeded(index.deleteAllDocuments());
    expect((await index.getDocuments()).total).toBe(0);
  });

  it('creates the index and infers an `id` primary key on first addition', async () => {
    // Meilisearch docs, "Primary key": adding documents to a missing index creates it and infers the key.
    const index = client.index('auto_created');
    await succeeded(index.addDocuments([{ id: 1, title: 'Fuse' }]));
    expect((await client.getRawIndex('auto_created')).primaryKey).toBe('id');
    expect(await index.getDocument(1)).toEqual({ id: 1, title: 'Fuse' });
  });

  it('fails the task when the primary key cannot be resolved', async () => {
    // Meilisearch docs, "Primary key": inference needs exactly one attribute ending in `id`.
    const none = await client.index('no_key').addDocuments([{ title: 'Fuse' }]).waitTask();
    expect(none.status).toBe('failed');
    expect(none.error?.code).toBe('index_primary_key_no_candidate_found');

    const several = await client.index('two_keys').addDocuments([{ id: 1, partId: 2 }]).waitTask();
    expect(several.status).toBe('failed');
    expect(several.error).toMatchObject({ code: 'index_primary_key_multiple_candidates_found', type: 'invalid_request' });
  });

  it('fails the whole addition when a document lacks its primary key or has an invalid one', async () => {
    const index = await partsIndex();
    const missing = await index.addDocuments([{ ...PARTS[0], id: 'p9' }, { name: 'Diode' } as Part]).waitTask();
    // Meilisearch errors reference: missing_document_id and invalid_document_id are task errors.
    expect(missing.status).toBe('failed');
    expect(missing.error?.code).toBe('missing_document_id');
    const invalid = await index.addDocuments([{ id: 'has space' } as Part]).waitTask();
    expect(invalid.error?.code).toBe('invalid_document_id');
    // Meilisearch docs, "Tasks": a failed document addition indexes nothing.
    expect((await index.getDocuments()).total).toBe(PARTS.length);
  });

  it('fails a delete-by-filter task on a non-filterable attribute', async () => {
    const index = await partsIndex();
    const task = await index.deleteDocuments({ filter: 'name = "USB cable"' }).waitTask();
    // Meilisearch API reference, "Delete documents by filter": the attribute must be filterable.
    expect(task.status).toBe('failed');
    expect(task.error?.code).toBe('invalid_document_filter');
    expect((await index.getDocuments()).total).toBe(PARTS.length);
  });
});

describe('search', () => {
  it('returns every document for an empty or missing query', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "Search": an empty q is a placeholder search returning all documents.
    const empty = await index.search('');
    expect(ids(empty.hits)).toEqual(['p1', 'p2', 'p3', 'p4', 'p5']);
    expect(empty).toMatchObject({ query: '', limit: 20, offset: 0, estimatedTotalHits: 5 });
    expect(typeof empty.processingTimeMs).toBe('number');
    expect((await index.search()).hits).toHaveLength(5);
    // Documents come back as stored, not as search-engine results.
    expect(empty.hits[4]).toEqual(PARTS[4]);
  });

  it('matches the last query word as a prefix', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "Prefix search": the last query word matches as a prefix.
    const result = await index.search('cab');
    expect(ids(result.hits).sort()).toEqual(['p1', 'p2', 'p5']);
  });

  it('tolerates one typo in words of five letters or more, none in shorter words', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "Typo tolerance settings": one typo allowed from 5 letters.
    expect(ids((await index.search('modle')).hits).sort()).toEqual(['p3', 'p4']);
    // Meilisearch docs, "Typo tolerance vs fuzzy search": swapped adjacent letters count as one typo.
    expect(ids((await index.search('cabel')).hits).sort()).toEqual(['p1', 'p2', 'p5']);
    // Meilisearch docs, "Typo tolerance vs fuzzy search": a typo on the first letter counts as two.
    expect((await index.search('xable')).hits).toEqual([]);
    // Meilisearch docs, "Typo tolerance settings": no typo allowed below 5 letters.
    expect((await index.search('usv')).hits).toEqual([]);
  });

  it('ranks documents matching more words, then fewer typos, first', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "matchingStrategy": `last` ranks documents with all words first, then drops words from the end.
    expect(ids((await index.search('cable hdmi')).hits)).toEqual(['p2', 'p1', 'p5']);
    // Meilisearch docs, "matchingStrategy": `all` only returns documents containing every word.
    expect(ids((await index.search('cable hdmi', { matchingStrategy: 'all' })).hits)).toEqual(['p2']);

    // p1 is stored before p4, so only the typo rule can put p4 first.
    await succeeded(index.addDocuments([{ ...PARTS[0], name: 'Relax spring' }]));
    // Meilisearch docs, "Ranking rules": `typo` ranks exact matches above matches with typos.
    expect(ids((await index.search('relay')).hits)).toEqual(['p4', 'p1']);
  });

  it('ranks documents holding the query words together in one attribute first (proximity)', async () => {
    const index = client.index<{ id: string; code: string; name: string }>(`proximity_${++indexCounter}`);
    await succeeded(index.updateSettings({ searchableAttributes: ['code', 'name'] }));
    await succeeded(
      index.addDocuments(
        [
          // Stored first, so without the rule it would win the final tie-break on document order.
          { id: 'a', code: 'TOR-CBL-6', name: 'Cable for the wall kit' },
          { id: 'b', code: 'TOR-WALL-M', name: 'Bracket' },
        ],
        { primaryKey: 'id' },
      ),
    );
    // Meilisearch docs, "Ranking rules": proximity ranks documents whose query words are close
    // together above those where they are far apart (here: split across attributes).
    expect(ids((await index.search('tor wall')).hits)).toEqual(['b', 'a']);
    // Removing the rule leaves document order.
    await succeeded(index.updateRankingRules(['words', 'typo', 'attribute', 'sort', 'exactness']));
    expect(ids((await index.search('tor wall')).hits)).toEqual(['a', 'b']);
  });

  it('filters with the string syntax', async () => {
    const index = await partsIndex();
    const search = async (filter: string) => ids((await index.search('', { filter })).hits);
    // Meilisearch docs, "Filter expression reference": operators, IN, NOT, OR, parentheses, TO, EXISTS.
    expect(await search('category = "module" AND maker IN ["acme","initech"] AND inStock = true')).toEqual(['p3', 'p4']);
    expect(await search('(category = cable OR category = accessory) AND NOT maker = globex')).toEqual(['p1']);
    expect(await search('price >= 8 AND price < 30')).toEqual(['p2', 'p4']);
    expect(await search('price 5 TO 12')).toEqual(['p1', 'p2', 'p4']);
    expect(await search('maker != acme')).toEqual(['p2', 'p4', 'p5']);
    expect(await search('maker NOT IN [acme, globex]')).toEqual(['p4']);
    expect(await search('supersededBy EXISTS')).toEqual(['p5']);
    expect(await search('supersededBy NOT EXISTS')).toEqual(['p1', 'p2', 'p3', 'p4']);
    expect(await search('tags = power')).toEqual(['p1', 'p3']);
    expect(await search("maker = 'nobody' OR inStock = false")).toEqual(['p2']);
  });

  it('filters with nested arrays: outer AND, inner OR', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "Filter expression reference": array elements are ANDed, inner arrays ORed.
    const result = await index.search('', { filter: [['category = cable', 'category = accessory'], 'inStock = true'] });
    expect(ids(result.hits)).toEqual(['p1', 'p5']);
  });

  it('rejects invalid filters with invalid_search_filter', async () => {
    const index = await partsIndex();
    // Meilisearch errors reference: invalid_search_filter for bad syntax or non-filterable attributes.
    const syntax = await apiError(index.search('', { filter: 'category = ' }));
    expect(syntax.cause?.code).toBe('invalid_search_filter');
    expect(syntax.response.status).toBe(400);
    const lowercaseKeyword = await apiError(index.search('', { filter: 'category = cable and price > 3' }));
    expect(lowercaseKeyword.cause?.code).toBe('invalid_search_filter');
    const notFilterable = await apiError(index.search('', { filter: 'name = cable' }));
    expect(notFilterable.cause?.code).toBe('invalid_search_filter');
  });

  it('counts facets over all matching documents, not only the returned page', async () => {
    const index = await partsIndex();
    const result = await index.search('', { facets: ['category', 'tags', 'price'], limit: 1 });
    expect(result.hits).toHaveLength(1);
    // Meilisearch docs, "Faceted search": facetDistribution counts every matching document.
    expect(result.facetDistribution?.category).toEqual({ accessory: 1, cable: 2, module: 2 });
    // Meilisearch docs, "Faceted search": each value of an array attribute is counted.
    expect(result.facetDistribution?.tags).toEqual({ cable: 1, power: 2, usb: 1, video: 1 });
    // Meilisearch docs, "Faceted search": facetStats gives min and max of numeric facets.
    expect(result.facetStats?.price).toEqual({ min: 2, max: 30 });

    // Meilisearch docs, "Faceted search": counts follow the query and the filter.
    const filtered = await index.search('cable', { facets: ['maker'], filter: 'inStock = true' });
    expect(filtered.facetDistribution).toEqual({ maker: { acme: 1, globex: 1 } });
  });

  it('sorts by one or more attributes', async () => {
    const index = await partsIndex();
    // Meilisearch docs, "Sort search results": criteria apply in order.
    expect(ids((await index.search('', { sort: ['price:asc'] })).hits)).toEqual(['p5', 'p1', 'p4', 'p2', 'p3']);
    expect(ids((await index.search('', { sort: ['maker:asc', 'price:desc'] })).hits)).toEqual([
      'p3',
      'p1',
      'p2',
      'p5',
      'p4',
    ]);
    // Meilisearch docs, "Sort search results": sort also orders text matches.
    expect(ids((await index.search('cable', { sort: ['price:desc'] })).hits)).toEqual(['p2', 'p1', 'p5']);
    // Meilisearch errors reference: sorting on a non-sortable attribute is invalid_search_sort.
    const error = await apiError(index.search('', { sort: ['category:asc'] }));
    expect(error.cause?.code).toBe('invalid_search_sort');
  });

  it('paginates with offset/limit and with page/hitsPerPage', async () => {
    const index = await partsIndex();
    const sort = ['price:asc'];
    const window = await index.search('', { sort, offset: 2, limit: 2 });
    // Meilisearch docs, "Pagination": offset/limit answers with estimatedTotalHits.
    expect(ids(window.hits)).toEqual(['p4', 'p2']);
    expect(window).toMatchObject({ offset: 2, limit: 2, estimatedTotalHits: 5 });

    const page = await index.search('', { sort, page: 2, hitsPerPage: 2 });
    // Meilisearch docs, "Pagination": page/hitsPerPage answers with exhaustive totals.
    expect(ids(page.hits)).toEqual(['p4', 'p2']);
    expect(page).toMatchObject({ page: 2, hitsPerPage: 2, totalHits: 5, totalPages: 3 });
    expect(page).not.toHaveProperty('estimatedTotalHits');
  });

  it('returns only the attributes asked for and displayed', async () => {
    const index = await partsIndex();
    // Meilisearch API reference, "attributesToRetrieve": only the listed attributes are returned.
    const result = await index.search('relay', { attributesToRetrieve: ['id', 'name'] });
    expect(result.hits).toEqual([{ id: 'p4', name: 'Relay module' }]);
    await succeeded(index.updateDisplayedAttributes(['id', 'price']));
    // Meilisearch docs, "Displayed attributes": hidden attributes are never returned.
    expect((await index.search('relay', { attributesToRetrieve: ['id', 'name'] })).hits).toEqual([{ id: 'p4' }]);
    expect((await index.search('relay')).hits).toEqual([{ id: 'p4', price: 8 }]);
  });

  it('supports the GET search variant', async () => {
    const index = await partsIndex();
    // Meilisearch API reference: GET /search takes the same parameters as query strings.
    const result = await index.searchGet('cab', { filter: 'inStock = true', facets: ['maker'], sort: ['price:asc'] });
    expect(ids(result.hits)).toEqual(['p5', 'p1']);
    expect(result.facetDistribution).toEqual({ maker: { acme: 1, globex: 1 } });
  });

  it('sorts documents lacking the sort attribute last, ascending and descending', async () => {
    const index = await partsIndex();
    await succeeded(index.addDocuments([{ id: 'p6', name: 'Loose cable', category: 'cable', maker: 'acme', inStock: true, tags: [] } as unknown as Part]));
    // Meilisearch docs, "Sort search results": documents without the sorted field come last in both directions.
    expect(ids((await index.search('', { sort: ['price:asc'] })).hits)).toEqual(['p5', 'p1', 'p4', 'p2', 'p3', 'p6']);
    expect(ids((await index.search('', { sort: ['price:desc'] })).hits)).toEqual(['p3', 'p2', 'p4', 'p1', 'p5', 'p6']);
  });

  it('keeps filters and facet counts current after every write', async () => {
    const index = await partsIndex();
    const inStock = async () => (await index.search('', { filter: 'inStock = true', facets: ['maker'] })).facetDistribution?.maker;
    // Meilisearch docs, "Faceted search": counts follow the documents; a repeated search must see each write.
    expect(await inStock()).toEqual({ acme: 2, globex: 1, initech: 1 });
    await succeeded(index.updateDocuments([{ id: 'p2', inStock: true }]));
    expect(await inStock()).toEqual({ acme: 2, globex: 2, initech: 1 });
    await succeeded(index.deleteDocument('p1'));
    expect(await inStock()).toEqual({ acme: 1, globex: 2, initech: 1 });
    await succeeded(index.addDocuments([{ ...PARTS[3], id: 'p7', maker: 'hooli' }]));
    expect(await inStock()).toEqual({ acme: 1, globex: 2, hooli: 1, initech: 1 });
  });

  it('answers a search the same after searches of a larger index (work arrays are reused)', async () => {
    const index = await partsIndex();
    const ask = () => index.search('cable modle', { filter: 'inStock = true', facets: ['maker', 'tags'], sort: ['price:desc'] });
    const before = await ask();
    const big = client.index(`big_${++indexCounter}`);
    const many = Array.from({ length: 3000 }, (_, i) => ({ id: `b${i}`, name: `cable module relay ${i}`, category: 'cable', maker: 'acme', price: i, inStock: i % 2 === 0, tags: ['power'] }));
    await succeeded(big.updateSettings(PART_SETTINGS));
    await succeeded(big.addDocuments(many, { primaryKey: 'id' }));
    // 1,500 match; Meilisearch docs, "Pagination": estimatedTotalHits stops at maxTotalHits (1,000 by default).
    expect((await big.search('cable modle', { filter: 'inStock = true', limit: 3 })).estimatedTotalHits).toBe(1000);
    // Same question, same index, same documents: the answer must not depend on what ran before.
    expect({ ...(await ask()), processingTimeMs: 0 }).toEqual({ ...before, processingTimeMs: 0 });
  });

  it('runs a multi-search: several queries in one request, results in order', async () => {
    const index = await partsIndex();
    const other = await partsIndex();
    await succeeded(other.deleteDocuments(['p1', 'p2']));
    const queries = [
      { indexUid: index.uid, q: 'cable', filter: 'inStock = true', facets: ['maker'] },
      { indexUid: other.uid, q: 'cable' },
      { indexUid: index.uid, q: 'cable', facets: ['inStock'] },
    ];
    const { results } = await client.multiSearch({ queries });
    // Meilisearch API reference, "Multi-search": one result per query, in order, each naming its index.
    expect(results.map((r) => r.indexUid)).toEqual([index.uid, other.uid, index.uid]);
    // Each result is what the same search alone answers.
    for (const [i, { indexUid, ...params }] of queries.entries()) {
      const alone = await client.index(indexUid).search(params.q, params);
      expect({ ...results[i], processingTimeMs: 0 }).toEqual({ ...alone, indexUid, processingTimeMs: 0 });
    }
    expect(ids(results[0]!.hits as Part[])).toEqual(['p1', 'p5']);
    expect(ids(results[1]!.hits as Part[])).toEqual(['p5']);
    expect(results[2]!.facetDistribution).toEqual({ inStock: { false: 1, true: 2 } });
  });

  it('answers a multi-search of many different queries as the same searches one by one', async () => {
    const index = await partsIndex();
    const words = ['cable', 'module', 'power', 'relay', 'usb', 'hdmi', 'ties', 'cabel'];
    const { results } = await client.multiSearch({ queries: words.map((q) => ({ indexUid: index.uid, q, sort: ['price:asc'] })) });
    for (const [i, q] of words.entries()) {
      // Each result is what the same search alone answers, however many queries share the request.
      expect(ids(results[i]!.hits as Part[])).toEqual(ids((await index.search(q, { sort: ['price:asc'] })).hits));
    }
    expect(ids(results[7]!.hits as Part[])).toEqual(ids(results[0]!.hits as Part[]));
  });

  it('fails a multi-search whose query is invalid, naming the query', async () => {
    const index = await partsIndex();
    const error = await apiError(client.multiSearch({ queries: [{ indexUid: index.uid, q: 'cable' }, { indexUid: index.uid, filter: 'name = cable' }] }));
    // Meilisearch API reference, "Multi-search": an error while running a query is that query's, prefixed with its position.
    expect(error.response.status).toBe(400);
    expect(error.cause?.code).toBe('invalid_search_filter');
    expect(error.cause?.message).toMatch(/^Inside `\.queries\[1\]`: /);
    const missing = await apiError(client.multiSearch({ queries: [{ indexUid: 'nowhere', q: 'x' }] }));
    expect(missing.cause?.code).toBe('index_not_found');

    // Meilisearch's own tests (multi-search snapshots): the body is checked before any query runs,
    // and a bad field is named by its path inside the body.
    const post = (body: unknown) => fetch(`${standin.url}/multi-search`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }).then(async (r) => ({ status: r.status, ...(await r.json()) }));
    expect(await post({})).toMatchObject({ status: 400, code: 'bad_request', message: 'Missing field `queries`' });
    expect(await post({ queries: [{ indexUid: index.uid }, { q: 'x' }] })).toMatchObject({ status: 400, code: 'bad_request', message: 'Missing field `indexUid` inside `.queries[1]`' });
    expect(await post({ queries: [{ indexUid: 'bad uid!' }] })).toMatchObject({ status: 400, code: 'invalid_index_uid', message: expect.stringMatching(/^Invalid value at `\.queries\[0\]\.indexUid`/) });
    expect(await post({ queries: [{ indexUid: 'nowhere' }, { indexUid: index.uid, limit: 'x' }] })).toMatchObject({ status: 400, code: 'invalid_search_limit', message: expect.stringMatching(/^Invalid value at `\.queries\[1\]\.limit`/) });
  });

  it('matches only in the attributes named by attributesToSearchOn', async () => {
    const index = await partsIndex();
    // "usb" is in p1's name and tags, "video" only in p2's tags, "cable" in p5's name and tags.
    expect(ids((await index.search('usb')).hits)).toEqual(['p1']);
    // Meilisearch API reference, "attributesToSearchOn": the query is matched in those attributes only.
    expect(ids((await index.search('usb', { attributesToSearchOn: ['name'] })).hits)).toEqual(['p1']);
    expect(ids((await index.search('usb', { attributesToSearchOn: ['category'] })).hits)).toEqual([]);
    expect(ids((await index.search('video', { attributesToSearchOn: ['name', 'category'] })).hits)).toEqual([]);
    expect(ids((await index.search('video', { attributesToSearchOn: ['tags'] })).hits)).toEqual(['p2']);
    // The best attribute is chosen among those searched: "cable" ranks p5 by tags only when name is left out.
    expect(ids((await index.search('cable', { attributesToSearchOn: ['tags'] })).hits)).toEqual(['p5']);
    // Meilisearch errors reference: invalid_search_attributes_to_search_on for an attribute that is not searchable.
    const error = await apiError(index.search('usb', { attributesToSearchOn: ['maker'] }));
    expect(error.cause?.code).toBe('invalid_search_attributes_to_search_on');
  });

  it('answers an unknown index with index_not_found', async () => {
    // Meilisearch errors reference: index_not_found, HTTP 404, type invalid_request.
    const error = await apiError(client.index('nowhere').search('cable'));
    expect(error.response.status).toBe(404);
    expect(error.cause).toMatchObject({ code: 'index_not_found', type: 'invalid_request' });
    expect(error.cause?.link).toContain('index_not_found');
  });
});

describe('api key', () => {
  let secured: RunningSearchStandin;

  beforeAll(async () => {
    secured = await startSearchStandin({ port: 0, apiKey: 'master-key' });
  });

  afterAll(async () => {
    await secured.close();
  });

  it('requires the bearer key on every route but /health', async () => {
    const anonymous = new Meilisearch({ host: secured.url });
    // Meilisearch docs, "Security": /health needs no key; missing key 401, wrong key 403.
    expect(await anonymous.health()).toEqual({ status: 'available' });
    const missing = await apiError(anonymous.getIndexes());
    expect(missing.response.status).toBe(401);
    expect(missing.cause?.code).toBe('missing_authorization_header');

    const wrong = await apiError(new Meilisearch({ host: secured.url, apiKey: 'guess' }).getIndexes());
    expect(wrong.response.status).toBe(403);
    expect(wrong.cause?.code).toBe('invalid_api_key');

    // Meilisearch docs, "Security": requests with the master key are authorized.
    const authorized = new Meilisearch({ host: secured.url, apiKey: 'master-key' });
    await succeeded(authorized.createIndex('secured'));
    expect((await authorized.getIndexes()).total).toBe(1);
  });
});
