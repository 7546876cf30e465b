import { Meilisearch } from 'meilisearch';

/** The search engine as the app sees it: the meilisearch client, pointed at a real server or the local stand-in. */
export function createSearchClient({ host, apiKey }: { host: string; apiKey?: string }) {
  const client = new Meilisearch({ host, apiKey, timeout: 5_000 });
  return {
    client,
    async healthy() {
      try {
        await client.health();
        return true;
      } catch {
        return false;
      }
    },
  };
}

export type SearchClient = ReturnType<typeof createSearchClient>;
