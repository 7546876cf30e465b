// A small fake of a Meilisearch v1 server for `npm start` and the tests: only the routes and
// parameters the app sends through the official client, with Meilisearch's answer and error shapes,
// so MEILI_HOST can point at a real server instead without the app noticing. Anything else is
// refused with an error rather than ignored. Writes apply at once but are answered, as on a real
// server, with an enqueued task whose outcome the client reads from GET /tasks/:uid.

import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import express, { type NextFunction, type Request, type Response } from 'express';
import type { z } from 'zod';
import { indexNotFound, MeiliError, type MeiliErrorBody } from './errors.ts';
import { isObject, type Doc } from './documents.ts';
import { searchSchema, settingsSchema, StandinIndex } from './engine.ts';
import type { TextMatch } from './text.ts';

type Task = { uid: number; indexUid: string; status: 'succeeded' | 'failed'; type: string; details: Doc; error: MeiliErrorBody | null; enqueuedAt: string };

const INDEX_UID = /^[A-Za-z0-9_-]{1,400}$/;

/** Request parameters checked against the schema; the first problem named as Meilisearch names it. */
function parse<T>(schema: z.ZodType<T>, value: unknown, code: string, at = ''): T {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0]!;
  if (issue.code === 'unrecognized_keys') {
    throw new MeiliError(400, 'bad_request', `Unknown field \`${issue.keys[0]}\` inside \`${at || '.'}\`: the search stand-in supports only what the app sends.`);
  }
  const field = String(issue.path[0] ?? '');
  throw new MeiliError(400, `${code}_${field.replace(/[A-Z]/g, (c) => `_${c.toLowerCase()}`)}`, `Invalid value at \`${at}.${field}\`: ${issue.message}`);
}

function checkUid(uid: unknown): string {
  if (typeof uid !== 'string' || !INDEX_UID.test(uid)) throw new MeiliError(400, 'invalid_index_uid', `\`${String(uid)}\` is not a valid index uid.`);
  return uid;
}

export function createSearchStandin({ apiKey }: { apiKey?: string } = {}): express.Express {
  const app = express();
  const indexes = new Map<string, StandinIndex>();
  const tasks: Task[] = [];
  const get = (uid: string) => indexes.get(uid) ?? throwError(indexNotFound(uid));
  /** Meilisearch creates an index on the first write that needs one. */
  const getOrCreate = (uid: string) => indexes.get(uid) ?? indexes.set(uid, new StandinIndex(uid)).get(uid)!;

  /** Runs a write as a task: a MeiliError fails the task (as an asynchronous failure would), not the request. */
  function task(res: Response, indexUid: string, type: string, details: Doc, work: () => Doc | void) {
    const entry: Task = { uid: tasks.length, indexUid, status: 'succeeded', type, details, error: null, enqueuedAt: new Date().toISOString() };
    try {
      entry.details = { ...details, ...work() };
    } catch (error) {
      if (!(error instanceof MeiliError)) throw error;
      Object.assign(entry, { status: 'failed', error: error.toBody() });
    }
    tasks.push(entry);
    res.status(202).json({ taskUid: entry.uid, indexUid, status: 'enqueued', type, enqueuedAt: entry.enqueuedAt });
  }

  app.disable('x-powered-by');
  app.disable('etag');
  // Meilisearch leaves /health public, answers 401 without a key and 403 with a wrong one.
  app.use((req, _res, next) => {
    if (!apiKey || req.path === '/health') return next();
    const authorization = req.get('authorization');
    if (!authorization) throw new MeiliError(401, 'missing_authorization_header', 'The Authorization header is missing. It must use the bearer authorization method.', 'auth');
    if (authorization !== `Bearer ${apiKey}`) throw new MeiliError(403, 'invalid_api_key', 'The provided API key is invalid.', 'auth');
    next();
  });
  app.use(express.json({ limit: '100mb' }));

  app.get('/health', (_req, res) => {
    res.json({ status: 'available' });
  });

  app.post('/indexes', (req, res) => {
    const uid = checkUid(isObject(req.body) ? req.body.uid : undefined);
    const primaryKey = isObject(req.body) && typeof req.body.primaryKey === 'string' ? req.body.primaryKey : null;
    task(res, uid, 'indexCreation', { primaryKey }, () => {
      if (indexes.has(uid)) throw new MeiliError(409, 'index_already_exists', `Index \`${uid}\` already exists.`);
      indexes.set(uid, new StandinIndex(uid, primaryKey));
    });
  });
  app.delete('/indexes/:uid', (req, res) => {
    const { uid } = req.params;
    task(res, uid, 'indexDeletion', {}, () => {
      const deletedDocuments = get(uid).size;
      indexes.delete(uid);
      return { deletedDocuments };
    });
  });
  app.get('/indexes/:uid/stats', (req, res) => {
    res.json(get(req.params.uid).stats());
  });

  app.patch('/indexes/:uid/settings', (req, res) => {
    const uid = checkUid(req.params.uid);
    const patch = parse(settingsSchema, req.body, 'invalid_settings');
    task(res, uid, 'settingsUpdate', patch, () => getOrCreate(uid).updateSettings(patch));
  });

  app.post('/indexes/:uid/documents', (req, res) => {
    const uid = checkUid(req.params.uid);
    const documents: unknown = req.body;
    if (!Array.isArray(documents) || !documents.every(isObject)) throw new MeiliError(400, 'malformed_payload', 'The `json` payload must be an array of documents (JSON objects).');
    const primaryKey = typeof req.query.primaryKey === 'string' ? req.query.primaryKey : undefined;
    task(res, uid, 'documentAdditionOrUpdate', { receivedDocuments: documents.length }, () => ({
      indexedDocuments: getOrCreate(uid).addDocuments(documents, primaryKey),
    }));
  });
  app.delete('/indexes/:uid/documents', (req, res) => {
    const { uid } = req.params;
    task(res, uid, 'documentDeletion', {}, () => ({ deletedDocuments: get(uid).clear() }));
  });

  app.post('/indexes/:uid/search', (req, res) => {
    res.json(get(req.params.uid).search(parse(searchSchema, req.body, 'invalid_search')));
  });
  // Meilisearch API reference, "Multi-search": the results of several searches, in order. The
  // text of a query is matched once however many of them share it (the catalogue sends up to 7).
  app.post('/multi-search', (req, res) => {
    const queries: unknown = isObject(req.body) ? req.body.queries : undefined;
    if (!Array.isArray(queries)) throw new MeiliError(400, 'bad_request', 'Missing field `queries`');
    const parsed = queries.map((query: unknown, i) => {
      const { indexUid, ...params } = isObject(query) ? query : {};
      return { indexUid: checkUid(indexUid), request: parse(searchSchema, params, 'invalid_search', `.queries[${i}]`) };
    });
    const matched = new Map<string, Map<string, TextMatch> | null>();
    const results = parsed.map(({ indexUid, request }, i) => {
      const matchOnce = (key: string, run: () => Map<string, TextMatch> | null) => {
        if (!matched.has(`${indexUid} ${key}`)) matched.set(`${indexUid} ${key}`, run());
        return matched.get(`${indexUid} ${key}`)!;
      };
      try {
        return { indexUid, ...get(indexUid).search(request, matchOnce) };
      } catch (error) {
        if (error instanceof MeiliError) throw new MeiliError(error.status, error.code, `Inside \`.queries[${i}]\`: ${error.message}`);
        throw error;
      }
    });
    res.json({ results });
  });

  app.get('/tasks/:uid', (req, res) => {
    const found = tasks[Number(req.params.uid)];
    if (!found) throw new MeiliError(404, 'task_not_found', `Task \`${req.params.uid}\` not found.`);
    const { enqueuedAt } = found;
    res.json({ ...found, batchUid: found.uid, canceledBy: null, duration: 'PT0S', startedAt: enqueuedAt, finishedAt: enqueuedAt });
  });

  app.use((req) => {
    throw new MeiliError(404, 'not_found', `The search stand-in does not serve ${req.method} ${req.path}: the app does not send it.`);
  });
  app.use((error: unknown, _req: Request, res: Response, _next: NextFunction) => {
    const bodyError = (error as { type?: string }).type;
    const meili =
      error instanceof MeiliError
        ? error
        : bodyError === 'entity.parse.failed'
          ? new MeiliError(400, 'malformed_payload', 'The json payload provided is malformed.')
          : bodyError === 'entity.too.large'
            ? new MeiliError(413, 'payload_too_large', 'The provided payload reached the size limit.')
            : (console.error('search stand-in:', error), new MeiliError(500, 'internal', 'Internal error.', 'internal'));
    res.status(meili.status).json(meili.toBody());
  });
  return app;
}

function throwError(error: Error): never {
  throw error;
}

export type RunningSearchStandin = { url: string; close(): Promise<void> };

/** Starts the stand-in on `port` (0: any free port) of 127.0.0.1. */
export async function startSearchStandin({ port, host = '127.0.0.1', apiKey }: { port: number; host?: string; apiKey?: string }): Promise<RunningSearchStandin> {
  const server = createSearchStandin({ apiKey }).listen(port, host);
  await once(server, 'listening');
  return {
    url: `http://${host}:${(server.address() as AddressInfo).port}`,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        // The client keeps connections alive; without this close() would wait for them to time out.
        server.closeAllConnections();
      }),
  };
}
