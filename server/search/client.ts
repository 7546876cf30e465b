import { Meilisearch } from 'meilisearch';
import { createSearchTransport } from './transport.ts';

/** The search engine as the app sees it: the meilisearch client, pointed at a real server or the local stand-in. */
export function createSearchClient({ host, apiKey }: { host: string; apiKey?: string }) {
  // Requests that get no answer within 5 s fail as "search unavailable" (the transport enforces it).
  const transport = createSearchTransport(host, { timeoutMs: 5_000 });
  const client = new Meilisearch({ host, apiKey, httpClient: transport.httpClient });
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
    close: transport.close,
  };
}

export type SearchClient = ReturnType<typeof createSearchClient>;
