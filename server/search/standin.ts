// A local stand-in for a Meilisearch v1 server, backed by minisearch, for development and tests.
// It speaks enough of the HTTP API for the official `meilisearch` client; application code only
// ever talks to it through that client, so a real server can replace it via MEILI_HOST.
//
// Writes are applied synchronously but still answered with 202 and an enqueued task, and their
// outcome is read through the task API, so callers keep the waitTask-and-check-status discipline
// a real server requires.

import { once } from 'node:events';
import type { AddressInfo } from 'node:net';
import express, { type Request, type RequestHandler, type Response } from 'express';
import { z } from 'zod';
import { indexNotFound, MeiliError, snakeCase, type MeiliErrorBody } from './standin-errors.ts';
import { parseFilter } from './standin-filter.ts';
import { StandinIndex, type DocumentsRequest, type SearchRequest } from './standin-index.ts';
import { defaultSettings, parseSettings, settingNameFromPath, type SettingsPatch } from './standin-settings.ts';
import { isPlainObject, type Json, type TextMatches } from './standin-text.ts';

type TaskType =
  | 'indexCreation'
  | 'indexUpdate'
  | 'indexDeletion'
  | 'documentAdditionOrUpdate'
  | 'documentDeletion'
  | 'settingsUpdate';

type Task = {
  uid: number;
  batchUid: number;
  indexUid: string;
  status: 'succeeded' | 'failed';
  type: TaskType;
  canceledBy: null;
  details: Json;
  error: MeiliErrorBody | null;
  duration: string;
  enqueuedAt: string;
  startedAt: string;
  finishedAt: string;
};

const INDEX_UID = /^[A-Za-z0-9_-]{1,400}$/;

const count = z.number().int().min(0);
const stringList = z.array(z.string()).nullish();

const searchSchema = z.object({
  q: z.string().nullish(),
  offset: count.optional(),
  limit: count.optional(),
  page: count.optional(),
  hitsPerPage: count.optional(),
  filter: z.unknown().optional(),
  sort: stringList,
  facets: stringList,
  attributesToRetrieve: stringList,
  matchingStrategy: z.enum(['last', 'all', 'frequency']).optional(),
  attributesToSearchOn: stringList,
});

const pageSchema = z.object({ offset: count.optional(), limit: count.optional() });

const documentsSchema = pageSchema.extend({
  fields: stringList,
  filter: z.unknown().optional(),
  ids: z.array(z.union([z.string(), z.number()])).nullish(),
  sort: stringList,
});

/** Validates request parameters, reporting the first bad one as `<prefix>_<parameter>`. */
function validate<T>(schema: z.ZodType<T>, value: unknown, codePrefix: string, at = ''): T {
  const parsed = schema.safeParse(value ?? {});
  if (parsed.success) return parsed.data;
  const issue = parsed.error.issues[0];
  const parameter = String(issue.path[0] ?? 'request');
  const message = `Invalid value at \`${at}.${parameter}\`: ${issue.message}`;
  throw new MeiliError(400, `${codePrefix}_${snakeCase(parameter)}`, message);
}

/** GET parameters as a JSON-like object: numbers converted, comma-separated lists split. */
function queryObject(req: Request, numeric: string[], lists: string[]): Json {
  const result: Json = {};
  for (const [name, raw] of Object.entries(req.query)) {
    const value = Array.isArray(raw) ? raw[0] : raw;
    if (typeof value !== 'string') continue;
    if (numeric.includes(name)) result[name] = Number(value);
    else if (lists.includes(name)) result[name] = value.split(',').map((item) => item.trim()).filter(Boolean);
    else result[name] = value;
  }
  return result;
}

function checkIndexUid(uid: unknown): string {
  if (typeof uid !== 'string' || !INDEX_UID.test(uid)) {
    throw new MeiliError(
      400,
      'invalid_index_uid',
      `\`${String(uid)}\` is not a valid index uid. Index uid can be an integer or a string containing only alphanumeric characters, hyphens (-) and underscores (_), and can not be more than 512 bytes.`,
    );
  }
  return uid;
}

function invalidPrimaryKey(): MeiliError {
  return new MeiliError(400, 'invalid_index_primary_key', 'Invalid value at `.primaryKey`: expected a string.');
}

function documentsPayload(body: unknown): Json[] {
  if (body === undefined) throw new MeiliError(400, 'missing_payload', 'A json payload is missing.');
  const documents = Array.isArray(body) ? body : [body];
  if (!documents.every(isPlainObject)) {
    const message = 'The `json` payload provided is malformed: documents must be JSON objects.';
    throw new MeiliError(400, 'malformed_payload', message);
  }
  return documents;
}

function durationSince(started: number): string {
  return `PT${((performance.now() - started) / 1000).toFixed(6)}S`;
}

class TaskLog {
  readonly #tasks: Task[] = [];

  /**
   * Runs a write, records it as a task and answers 202 with the enqueued-task summary. A
   * MeiliError thrown by the work fails the task instead of the request, as asynchronous
   * failures do on a real server.
   */
  run(res: Response, indexUid: string, type: TaskType, details: Json, work: () => Json | void): void {
    const started = performance.now();
    const enqueuedAt = new Date().toISOString();
    let outcome: Pick<Task, 'status' | 'details' | 'error'>;
    try {
      outcome = { status: 'succeeded', details: { ...details, ...work() }, error: null };
    } catch (error) {
      if (!(error instanceof MeiliError)) throw error;
      outcome = { status: 'failed', details, error: error.toBody() };
    }
    const uid = this.#tasks.length;
    this.#tasks.push({
      uid,
      batchUid: uid,
      indexUid,
      type,
      canceledBy: null,
      ...outcome,
      duration: durationSince(started),
      enqueuedAt,
      startedAt: enqueuedAt,
      finishedAt: new Date().toISOString(),
    });
    res.status(202).json({ taskUid: uid, indexUid, status: 'enqueued', type, enqueuedAt });
  }

  get(uid: number): Task {
    const task = this.#tasks[uid];
    if (!task) throw new MeiliError(404, 'task_not_found', `Task \`${uid}\` not found.`);
    return task;
  }

  /** GET /tasks: newest first unless `reverse`, paged with `limit` and `from`. */
  list(query: Json): Json {
    const limit = typeof query.limit === 'number' ? query.limit : 20;
    const reverse = query.reverse === 'true';
    const matches = (name: string, value: string | number) => {
      const wanted = query[name];
      return !Array.isArray(wanted) || wanted.includes('*') || wanted.includes(String(value));
    };
    const selected = this.#tasks.filter(
      (task) =>
        matches('uids', task.uid) &&
        matches('statuses', task.status) &&
        matches('types', task.type) &&
        matches('indexUids', task.indexUid),
    );
    if (!reverse) selected.reverse();
    const from = typeof query.from === 'number' ? query.from : undefined;
    const start =
      from === undefined ? 0 : selected.findIndex((task) => (reverse ? task.uid >= from : task.uid <= from));
    const page = start < 0 ? [] : selected.slice(start, start + limit);
    const next = start < 0 ? undefined : selected[start + limit];
    return { results: page, total: selected.length, limit, from: page[0]?.uid ?? null, next: next?.uid ?? null };
  }
}

class IndexRegistry {
  readonly #indexes = new Map<string, StandinIndex>();

  get(uid: string): StandinIndex {
    const index = this.#indexes.get(uid);
    if (!index) throw indexNotFound(uid);
    return index;
  }

  /** Runs a write against an index, creating it if needed; a failed write creates nothing. */
  upsert<T>(uid: string, write: (index: StandinIndex) => T): T {
    const index = this.#indexes.get(uid) ?? new StandinIndex(uid);
    const result = write(index);
    this.#indexes.set(uid, index);
    return result;
  }

  create(uid: string, primaryKey: string | null): void {
    if (this.#indexes.has(uid)) {
      throw new MeiliError(409, 'index_already_exists', `Index \`${uid}\` already exists.`);
    }
    this.#indexes.set(uid, new StandinIndex(uid, primaryKey));
  }

  delete(uid: string): number {
    const deleted = this.get(uid).documentCount;
    this.#indexes.delete(uid);
    return deleted;
  }

  sorted(): StandinIndex[] {
    return [...this.#indexes.values()].sort((a, b) => (a.uid < b.uid ? -1 : 1));
  }
}

function requireApiKey(apiKey: string): RequestHandler {
  // Meilisearch leaves /health public, answers 401 without a key and 403 with a wrong one.
  return (req, _res, next) => {
    if (req.path === '/health') return next();
    const authorization = req.get('authorization');
    if (!authorization) {
      throw new MeiliError(
        401,
        'missing_authorization_header',
        'The Authorization header is missing. It must use the bearer authorization method.',
        'auth',
      );
    }
    if (authorization !== `Bearer ${apiKey}`) {
      throw new MeiliError(403, 'invalid_api_key', 'The provided API key is invalid.', 'auth');
    }
    next();
  };
}

function toMeiliError(error: unknown): MeiliError {
  if (error instanceof MeiliError) return error;
  const parserError = error as { type?: string; message?: string };
  if (parserError.type === 'entity.too.large') {
    return new MeiliError(413, 'payload_too_large', 'The provided payload reached the size limit.');
  }
  if (parserError.type === 'entity.parse.failed') {
    return new MeiliError(400, 'malformed_payload', `The json payload provided is malformed. ${parserError.message}`);
  }
  console.error('search stand-in: unexpected error', error);
  return new MeiliError(500, 'internal', `Internal error: ${String(parserError.message ?? error)}`, 'internal');
}

function registerIndexRoutes(app: express.Express, indexes: IndexRegistry, tasks: TaskLog): void {
  app.get('/indexes', (req, res) => {
    const query = queryObject(req, ['offset', 'limit'], []);
    const { offset = 0, limit = 20 } = validate(pageSchema, query, 'invalid_index');
    const all = indexes.sorted();
    const results = all.slice(offset, offset + limit).map((index) => index.info());
    res.json({ results, offset, limit, total: all.length });
  });

  app.post('/indexes', (req, res) => {
    const body: unknown = req.body;
    if (!isPlainObject(body) || body.uid === undefined) {
      throw new MeiliError(400, 'missing_index_uid', 'Missing field `uid`');
    }
    const uid = checkIndexUid(body.uid);
    const primaryKey = body.primaryKey === undefined ? null : body.primaryKey;
    if (primaryKey !== null && typeof primaryKey !== 'string') throw invalidPrimaryKey();
    tasks.run(res, uid, 'indexCreation', { primaryKey }, () => indexes.create(uid, primaryKey));
  });

  app.get('/indexes/:uid', (req, res) => {
    res.json(indexes.get(req.params.uid).info());
  });

  app.get('/indexes/:uid/stats', (req, res) => {
    res.json(indexes.get(req.params.uid).stats());
  });

  app.patch('/indexes/:uid', (req, res) => {
    const { uid } = req.params;
    const primaryKey: unknown = isPlainObject(req.body) ? req.body.primaryKey : undefined;
    if (typeof primaryKey !== 'string') throw invalidPrimaryKey();
    tasks.run(res, uid, 'indexUpdate', { primaryKey }, () => indexes.get(uid).setPrimaryKey(primaryKey));
  });

  app.delete('/indexes/:uid', (req, res) => {
    const { uid } = req.params;
    tasks.run(res, uid, 'indexDeletion', { deletedDocuments: 0 }, () => ({ deletedDocuments: indexes.delete(uid) }));
  });
}

function registerSettingsRoutes(app: express.Express, indexes: IndexRegistry, tasks: TaskLog): void {
  const updateSettings = (res: Response, uid: string, patch: SettingsPatch) => {
    checkIndexUid(uid);
    // Meilisearch creates the index when settings are sent for one that does not exist.
    tasks.run(res, uid, 'settingsUpdate', patch, () => indexes.upsert(uid, (index) => index.updateSettings(patch)));
  };
  const settingName = (req: Request) => {
    const name = settingNameFromPath(String(req.params.name));
    if (!name) throw new MeiliError(404, 'not_found', `Unknown setting \`${String(req.params.name)}\`.`);
    return name;
  };
  const resetAll = () => Object.fromEntries(Object.keys(defaultSettings()).map((name) => [name, null]));

  app.get('/indexes/:uid/settings', (req, res) => {
    res.json(indexes.get(req.params.uid).settings);
  });
  app.patch('/indexes/:uid/settings', (req, res) => {
    updateSettings(res, req.params.uid, parseSettings(req.body));
  });
  app.delete('/indexes/:uid/settings', (req, res) => {
    updateSettings(res, req.params.uid, resetAll());
  });

  app.get('/indexes/:uid/settings/:name', (req, res) => {
    res.json(indexes.get(req.params.uid).settings[settingName(req)]);
  });
  // Meilisearch uses PUT for list settings and PATCH for object settings; both merge the same way.
  const updateOne: RequestHandler<{ uid: string; name: string }> = (req, res) => {
    updateSettings(res, req.params.uid, parseSettings({ [settingName(req)]: req.body ?? null }));
  };
  app.put('/indexes/:uid/settings/:name', updateOne);
  app.patch('/indexes/:uid/settings/:name', updateOne);
  app.delete('/indexes/:uid/settings/:name', (req, res) => {
    updateSettings(res, req.params.uid, { [settingName(req)]: null });
  });
}

function registerDocumentRoutes(app: express.Express, indexes: IndexRegistry, tasks: TaskLog): void {
  const addDocuments = (mode: 'replace' | 'update'): RequestHandler<{ uid: string }> => (req, res) => {
    const uid = checkIndexUid(req.params.uid);
    const documents = documentsPayload(req.body);
    const primaryKey = typeof req.query.primaryKey === 'string' ? req.query.primaryKey : undefined;
    const details = { receivedDocuments: documents.length, indexedDocuments: 0 };
    tasks.run(res, uid, 'documentAdditionOrUpdate', details, () => ({
      indexedDocuments: indexes.upsert(uid, (index) => index.addDocuments(documents, mode, primaryKey)),
    }));
  };
  const deletion = (res: Response, uid: string, details: Json, remove: (index: StandinIndex) => number) => {
    tasks.run(res, uid, 'documentDeletion', { ...details, deletedDocuments: 0 }, () => ({
      deletedDocuments: remove(indexes.get(uid)),
    }));
  };

  app.get('/indexes/:uid/documents', (req, res) => {
    const query = queryObject(req, ['offset', 'limit'], ['fields', 'ids', 'sort']);
    res.json(indexes.get(req.params.uid).listDocuments(validate(documentsSchema, query, 'invalid_document')));
  });
  app.post('/indexes/:uid/documents/fetch', (req, res) => {
    const request: DocumentsRequest = validate(documentsSchema, req.body, 'invalid_document');
    res.json(indexes.get(req.params.uid).listDocuments(request));
  });
  app.get('/indexes/:uid/documents/:id', (req, res) => {
    const { fields } = queryObject(req, [], ['fields']);
    res.json(indexes.get(req.params.uid).getDocument(req.params.id, fields as string[] | undefined));
  });

  app.post('/indexes/:uid/documents', addDocuments('replace'));
  app.put('/indexes/:uid/documents', addDocuments('update'));

  app.delete('/indexes/:uid/documents', (req, res) => {
    deletion(res, req.params.uid, { providedIds: 0, originalFilter: null }, (index) => index.clear());
  });
  app.delete('/indexes/:uid/documents/:id', (req, res) => {
    deletion(res, req.params.uid, { providedIds: 1 }, (index) => index.deleteDocuments([req.params.id]));
  });
  app.post('/indexes/:uid/documents/delete-batch', (req, res) => {
    const ids: unknown = req.body;
    if (!Array.isArray(ids) || !ids.every((id) => typeof id === 'string' || typeof id === 'number')) {
      throw new MeiliError(400, 'bad_request', 'The payload must be an array of document ids.');
    }
    deletion(res, req.params.uid, { providedIds: ids.length }, (index) => index.deleteDocuments(ids));
  });
  app.post('/indexes/:uid/documents/delete', (req, res) => {
    const filter: unknown = isPlainObject(req.body) ? req.body.filter : undefined;
    if (filter === undefined) throw new MeiliError(400, 'missing_document_filter', 'Missing field `filter`');
    // Syntax errors are rejected up front; a non-filterable attribute fails the task, as in Meilisearch.
    const node = parseFilter(filter, 'invalid_document_filter');
    if (!node) throw new MeiliError(400, 'invalid_document_filter', 'The filter must not be empty.');
    const details = { providedIds: 0, originalFilter: JSON.stringify(filter) };
    deletion(res, req.params.uid, details, (index) => index.deleteWhere(node));
  });
}

function registerSearchRoutes(app: express.Express, indexes: IndexRegistry): void {
  const search = (uid: string, params: unknown): Json => {
    const index = indexes.get(uid);
    const request: SearchRequest = validate(searchSchema, params, 'invalid_search');
    return index.search(request);
  };
  // Meilisearch API reference: POST /multi-search runs several searches in one request and
  // answers their results in order. The whole body is checked first, naming the bad field by its
  // path; an error while running a query fails the request, prefixed with the query's position.
  app.post('/multi-search', (req, res) => {
    const body: unknown = req.body;
    if (!isPlainObject(body) || !Array.isArray(body.queries)) {
      throw new MeiliError(400, 'bad_request', 'Missing field `queries`');
    }
    if (body.federation !== undefined && body.federation !== null) {
      throw new MeiliError(400, 'invalid_multi_search_federation', 'The search stand-in does not support federated multi-search.');
    }
    const searches = body.queries.map((query: unknown, i: number) => {
      if (!isPlainObject(query) || query.indexUid === undefined) {
        throw new MeiliError(400, 'bad_request', `Missing field \`indexUid\` inside \`.queries[${i}]\``);
      }
      const { indexUid, ...params } = query;
      if (typeof indexUid !== 'string' || !INDEX_UID.test(indexUid)) {
        throw new MeiliError(400, 'invalid_index_uid', `Invalid value at \`.queries[${i}].indexUid\`: \`${String(indexUid)}\` is not a valid index uid.`);
      }
      return { indexUid, request: validate(searchSchema, params, 'invalid_search', `.queries[${i}]`) };
    });
    const memo = new Map<string, TextMatches | null>();
    const results = searches.map(({ indexUid, request }: { indexUid: string; request: SearchRequest }, i: number) => {
      try {
        return { indexUid, ...indexes.get(indexUid).search(request, memo) };
      } catch (error) {
        if (error instanceof MeiliError) throw error.inQuery(i);
        throw error;
      }
    });
    res.json({ results });
  });
  app.post('/indexes/:uid/search', (req, res) => {
    res.json(search(req.params.uid, req.body));
  });
  app.get('/indexes/:uid/search', (req, res) => {
    const numeric = ['offset', 'limit', 'page', 'hitsPerPage'];
    res.json(search(req.params.uid, queryObject(req, numeric, ['sort', 'facets', 'attributesToRetrieve', 'attributesToSearchOn'])));
  });
}

function registerTaskRoutes(app: express.Express, tasks: TaskLog): void {
  app.get('/tasks', (req, res) => {
    res.json(tasks.list(queryObject(req, ['limit', 'from'], ['uids', 'statuses', 'types', 'indexUids'])));
  });
  app.get('/tasks/:uid', (req, res) => {
    res.json(tasks.get(Number(req.params.uid)));
  });
}

export function createSearchStandin(options: { apiKey?: string } = {}): express.Express {
  const app = express();
  const indexes = new IndexRegistry();
  const tasks = new TaskLog();

  app.disable('x-powered-by');
  // Meilisearch sends no ETag; hashing every search answer would only cost time.
  app.disable('etag');
  if (options.apiKey) app.use(requireApiKey(options.apiKey));
  // Meilisearch's default payload limit; non-strict because single-setting routes take bare JSON
  // values such as `"sku"` or `null`.
  app.use(express.json({ limit: '100mb', strict: false }));

  app.get('/health', (_req, res) => {
    res.json({ status: 'available' });
  });
  app.get('/version', (_req, res) => {
    res.json({ commitSha: 'search-standin', commitDate: '1970-01-01T00:00:00Z', pkgVersion: '1.16.0' });
  });
  registerIndexRoutes(app, indexes, tasks);
  registerSettingsRoutes(app, indexes, tasks);
  registerDocumentRoutes(app, indexes, tasks);
  registerSearchRoutes(app, indexes);
  registerTaskRoutes(app, tasks);

  app.use((req) => {
    throw new MeiliError(404, 'not_found', `The search stand-in has no route ${req.method} ${req.path}.`);
  });
  app.use((error: unknown, _req: Request, res: Response, _next: express.NextFunction) => {
    const meiliError = toMeiliError(error);
    res.status(meiliError.status).json(meiliError.toBody());
  });
  return app;
}

export type SearchStandinOptions = { port: number; host?: string; apiKey?: string };
export type RunningSearchStandin = { url: string; close(): Promise<void> };

/** Starts the stand-in on `port` (0 picks a free port). */
export async function startSearchStandin({
  port,
  host = '127.0.0.1',
  apiKey,
}: SearchStandinOptions): Promise<RunningSearchStandin> {
  const server = createSearchStandin({ apiKey }).listen(port, host);
  await once(server, 'listening');
  const { port: boundPort } = server.address() as AddressInfo;
  return {
    url: `http://${host}:${boundPort}`,
    close: () =>
      new Promise<void>((resolve, reject) => {
        server.close((error) => (error ? reject(error) : resolve()));
        // The client keeps connections alive; without this close() waits for them to time out.
        server.closeAllConnections();
      }),
  };
}
