// How the catalogue search forgives what people type: typos, words joined or split, trade synonyms.
// These go through the API to the search engine (the stand-in here; the same settings on a real server).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTestApp, type TestApp } from '../support/app.ts';
import { seedCatalogue } from '../../seed/catalogue.ts';
import { parts as demoParts } from '../../seed/data/catalogue.ts';
import { PARTS_INDEX_SETTINGS } from '../../server/search/parts-index.ts';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
  await t.db.transaction((tx) => seedCatalogue(tx));
  await t.services.partsIndex.rebuild(t.db);
});
afterAll(() => t.close());

type Hit = { sku: string; category: string; name: string };

async function search(q: string, role: 'sales' | 'installer' = 'sales') {
  const agent = await t.signIn(role);
  const res = await agent.get('/api/parts').query({ q, pageSize: 100 }).expect(200);
  return res.body.data as Hit[];
}

const skusOf = (hits: Hit[], category: string) => hits.filter((h) => h.category === category).map((h) => h.sku).sort();
const demoSkus = (category: string) => demoParts.filter((p) => p.category === category).map((p) => p.sku).sort();

describe('typos', () => {
  it('finds brackets despite a swapped pair of letters or one wrong letter in a word of 5+ letters', async () => {
    // Meilisearch docs, "Typo tolerance": one typo allowed from 5 letters; a swap of two
    // neighbouring letters counts as one typo (Damerau–Levenshtein).
    for (const q of ['brakcet', 'bracjet', 'wall brakcet']) {
      const hits = await search(q);
      expect(skusOf(hits, 'wall-bracket'), q).toEqual(demoSkus('wall-bracket'));
      // Parts that name a bracket come before anything matched by other words.
      expect(hits.slice(0, demoSkus('wall-bracket').length).every((h) => /bracket/i.test(h.name)), q).toBe(true);
    }
  });

  it('allows no typo in a word of 4 letters or fewer', async () => {
    // Meilisearch docs, "Typo tolerance": minWordSizeForTypos.oneTypo defaults to 5.
    expect(skusOf(await search('fert'), 'feet')).toEqual([]);
    expect(skusOf(await search('feet'), 'feet')).toEqual(demoSkus('feet'));
  });
});

describe('words joined or split', () => {
  it('finds end caps for "endcap" as it does for "end cap"', async () => {
    const split = await search('end cap');
    const joined = await search('endcap');
    // Meilisearch docs, "Concatenated and split queries": a word is also tried as two words.
    expect(skusOf(split, 'end-cap')).toEqual(demoSkus('end-cap'));
    expect(skusOf(joined, 'end-cap')).toEqual(demoSkus('end-cap'));
    expect(joined.slice(0, demoSkus('end-cap').length).every((h) => h.category === 'end-cap')).toBe(true);
  });

  it('finds a part named with one joined word when the two words are typed apart', async () => {
    const purchasing = await t.signIn('purchasing');
    const part = { sku: 'TST-ENDPLATE', name: 'Galvanised endplate for rail', makerCode: 'HLM', packSize: 1, massKg: 0.4, attributes: { category: 'accessory' } };
    await purchasing.post('/api/parts').send(part).expect(201);
    // Meilisearch docs, "Concatenated and split queries": neighbouring query words are also tried joined.
    const hits = await search('end plate');
    expect(hits[0]?.sku).toBe('TST-ENDPLATE');
  });
});

describe('trade synonyms', () => {
  it('are in the index settings both ways, so a real server uses them too', () => {
    // Meilisearch docs, "Synonyms": a one-way entry does not imply the reverse.
    expect(PARTS_INDEX_SETTINGS.synonyms.ground).toContain('earth');
    expect(PARTS_INDEX_SETTINGS.synonyms.earth).toContain('ground');
    expect(PARTS_INDEX_SETTINGS.synonyms.guard).toContain('cover');
    expect(PARTS_INDEX_SETTINGS.synonyms.cover).toContain('guard');
  });

  it('find earth bonding leads for "ground lead" and cable-protection covers for "cable guard"', async () => {
    const ground = await search('ground lead', 'installer');
    expect(skusOf(ground, 'earth-lead')).toEqual(demoSkus('earth-lead'));
    expect(ground.slice(0, demoSkus('earth-lead').length).every((h) => h.category === 'earth-lead')).toBe(true);

    const guard = await search('cable guard', 'installer');
    expect(skusOf(guard, 'cable-cover')).toEqual(demoSkus('cable-cover'));
    expect(guard[0]?.category).toBe('cable-cover');
  });
});
