// The app's transport for the meilisearch client. The client wraps whatever a custom transport
// throws in MeilisearchRequestError (meilisearch-js, HttpRequests: errors of `httpClient` become the
// cause); the error handler answers 503 for that, and the cause keeps the engine's status and code.
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { once } from 'node:events';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { Meilisearch, MeilisearchApiError, MeilisearchRequestError, MeilisearchRequestTimeOutError } from 'meilisearch';
import { startSearchStandin, type RunningSearchStandin } from '../../server/search/standin/server.ts';
import { createSearchTransport } from '../../server/search/transport.ts';

let standin: RunningSearchStandin;
let silent: Server;
let silentUrl: string;
let trickle: Server;
let trickleUrl: string;

beforeAll(async () => {
  standin = await startSearchStandin({ port: 0, apiKey: 'transport-key' });
  // Accepts connections and never answers.
  silent = createServer(() => {}).listen(0, '127.0.0.1');
  await once(silent, 'listening');
  silentUrl = `http://127.0.0.1:${(silent.address() as AddressInfo).port}`;
  // Answers at once, then sends its body a byte every 100 ms for 3 s.
  trickle = createServer((_req, res) => {
    res.writeHead(200, { 'content-type': 'application/json' });
    const body = '{"status":"available"}'.padEnd(30, ' ');
    let sent = 0;
    const tick = setInterval(() => {
      if (res.destroyed) return clearInterval(tick);
      res.write(body[sent++] ?? '');
      if (sent >= body.length) {
        clearInterval(tick);
        res.end();
      }
    }, 100);
  }).listen(0, '127.0.0.1');
  await once(trickle, 'listening');
  trickleUrl = `http://127.0.0.1:${(trickle.address() as AddressInfo).port}`;
});

afterAll(async () => {
  await standin.close();
  for (const server of [silent, trickle]) {
    server.closeAllConnections();
    server.close();
  }
});

function clientFor(host: string, options: { apiKey?: string; timeoutMs?: number; connections?: number } = {}) {
  const transport = createSearchTransport(host, { timeoutMs: options.timeoutMs ?? 2_000, connections: options.connections });
  return { client: new Meilisearch({ host, apiKey: options.apiKey, httpClient: transport.httpClient }), close: transport.close };
}

async function failure(promise: Promise<unknown>) {
  return promise.then(
    () => {
      throw new Error('expected the request to fail');
    },
    (reason: unknown) => reason,
  );
}

describe('search transport', () => {
  it('sends writes and searches with the key and gives back the parsed answers', async () => {
    const { client, close } = clientFor(standin.url, { apiKey: 'transport-key' });
    await client.createIndex('transported', { primaryKey: 'id' }).waitTask();
    const added = await client.index('transported').addDocuments([{ id: 'a', name: 'Flat cable cover' }]).waitTask();
    // Meilisearch API reference: a processed task reports status "succeeded".
    expect(added.status).toBe('succeeded');
    const found = await client.index('transported').search('cover');
    expect(found.hits).toEqual([{ id: 'a', name: 'Flat cable cover' }]);
    // Meilisearch API reference, "Multi-search": one result per query.
    const many = await client.multiSearch({ queries: [{ indexUid: 'transported', q: 'cable' }, { indexUid: 'transported', q: 'nothing' }] });
    expect(many.results.map((r) => r.hits.length)).toEqual([1, 0]);
    await close();
  });

  it('turns an error answer into MeilisearchApiError with status and code, inside the request error', async () => {
    const { client, close } = clientFor(standin.url, { apiKey: 'wrong' });
    const error = (await failure(client.getIndexes())) as MeilisearchRequestError;
    expect(error).toBeInstanceOf(MeilisearchRequestError);
    const cause = error.cause as MeilisearchApiError;
    // Meilisearch docs, "Security": a wrong key is refused with 403 invalid_api_key.
    expect(cause).toBeInstanceOf(MeilisearchApiError);
    expect(cause.response.status).toBe(403);
    expect(cause.cause?.code).toBe('invalid_api_key');
    await close();
  });

  it('fails with MeilisearchRequestError when nothing listens', async () => {
    const { client, close } = clientFor('http://127.0.0.1:9');
    const error = (await failure(client.health())) as MeilisearchRequestError;
    expect(error).toBeInstanceOf(MeilisearchRequestError);
    expect((error.cause as MeilisearchRequestError).cause).toMatchObject({ code: 'ECONNREFUSED' });
    await close();
  });

  it('gives up with a time-out when the server does not answer in time', async () => {
    const { client, close } = clientFor(silentUrl, { timeoutMs: 200 });
    const error = (await failure(client.health())) as MeilisearchRequestError;
    expect(error).toBeInstanceOf(MeilisearchRequestError);
    expect(error.cause).toBeInstanceOf(MeilisearchRequestTimeOutError);
    await close();
  });

  it('counts the whole request against the time-out: a slow body, and waiting for a connection', async () => {
    const slow = clientFor(trickleUrl, { timeoutMs: 300 });
    const started = Date.now();
    expect((await failure(slow.client.health())) as MeilisearchRequestError).toHaveProperty('cause', expect.any(MeilisearchRequestTimeOutError));
    // The body would take 3 s; the deadline is 300 ms (common practice: a deadline bounds the whole call).
    expect(Date.now() - started).toBeLessThan(1_500);
    await slow.close();

    // One connection, three requests to a server that never answers: each gives up on its own
    // deadline instead of waiting for the ones before it to give up first.
    const queued = clientFor(silentUrl, { timeoutMs: 300, connections: 1 });
    const queuedStart = Date.now();
    const outcomes = await Promise.all([1, 2, 3].map(() => failure(queued.client.health()).then((e) => ({ e, ms: Date.now() - queuedStart }))));
    for (const { e, ms } of outcomes) {
      expect((e as MeilisearchRequestError).cause).toBeInstanceOf(MeilisearchRequestTimeOutError);
      expect(ms).toBeLessThan(1_500);
    }
    await queued.close();
  });
});
