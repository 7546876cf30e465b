// Hostile input on every route: fast-check builds bodies, query strings and path parameters from
// each operation's OpenAPI schema and mutates them. Whatever arrives: never a 500, never a stack
// trace, always the error envelope on a 4xx, and a 4xx changes nothing in the database.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import fc from 'fast-check';
import supertest from 'supertest';
import { sql } from 'drizzle-orm';
import { createTestApp, TEST_ORIGIN, type TestApp } from '../support/app.ts';
import { ACCESS_TABLE, type Fixtures } from '../support/access-table.ts';
import { arrangeFixtures, fillPath, openApiOperations, type Agents, type JsonSchema, type OpenApiOperation } from '../support/api-fixtures.ts';
import { applyMutations, hostileUrlText, hostileValue, mutation, percentEncode, plausible, RAW_BODIES, type KnownValues } from '../support/hostile.ts';

/** Inputs per operation; raise it for a longer hunt (HOSTILE_RUNS=500 npm test -- tests/api/hostile-input.test.ts). */
const RUNS = Number(process.env.HOSTILE_RUNS ?? 30);

let t: TestApp;
let fixtures: Fixtures;
let agents: Agents;
let operations: OpenApiOperation[];
let known: KnownValues;
let checksumSql: ReturnType<typeof sql.raw>;
const tally = { inputs: 0, byStatus: new Map<number, number>(), dbChecks: 0 };

beforeAll(async () => {
  t = await createTestApp();
  ({ fixtures, agents } = await arrangeFixtures(t));
  operations = await openApiOperations(t);
  const { rows: makerRows } = await t.db.execute<{ code: string }>(sql`select code from makers order by code limit 1`);
  let n = 0;
  known = {
    rangeId: fixtures.range,
    companyId: fixtures.customer,
    sku: fixtures.sku,
    supersededBySku: null,
    controllerSku: fixtures.sku,
    moduleSku: fixtures.sku,
    makerCode: makerRows[0]!.code,
    gtin: null,
    ipRating: 'IP55',
    sitePostcode: '3071',
    password: 'long-enough-password',
    get email() {
      return `hostile-${n++}@example.test`;
    },
  };
  // One row per table: its row count and an order-independent sum of row hashes.
  const { rows: tables } = await t.db.execute<{ tablename: string }>(sql`select tablename from pg_tables where schemaname = 'public' order by tablename`);
  checksumSql = sql.raw(tables.map((r) => `select '${r.tablename}' as t, count(*)::text as n, coalesce(sum(hashtext(x::text)::bigint), 0)::text as h from "${r.tablename}" x`).join(' union all '));
}, 120_000);
afterAll(async () => {
  const statuses = [...tally.byStatus.entries()].sort((a, b) => a[0] - b[0]).map(([s, n]) => `${s}×${n}`).join(' ');
  console.log(`hostile input: ${tally.inputs} inputs tried on ${operations?.length ?? 0} operations (as admin, and as an installer where installers may call) and the sign-in routes; answers ${statuses}; database compared after ${tally.dbChecks} refusals; 500s seen: ${tally.byStatus.get(500) ?? 0}`);
  await t?.close();
});

async function snapshot(ignore: readonly string[] = []): Promise<string> {
  const { rows } = await t.db.execute<{ t: string; n: string; h: string }>(checksumSql);
  return rows.map((r) => (ignore.includes(r.t) ? `${r.t}:-` : `${r.t}:${r.n}:${r.h}`)).join(' ');
}

const STACK_TRACE = /\n\s+at .+:\d+:\d+|node_modules|\/work\/|\.ts:\d+|Error: .*\n/;

/** The checks every answer must pass; returns a description of what failed, or null. */
function problemWith(res: supertest.Response): string | null {
  const text = res.text ?? '';
  if (res.status >= 500) return `server error ${res.status}`;
  if (STACK_TRACE.test(text)) return 'a stack trace or source path in the answer';
  if (res.status >= 400) {
    if (!/json/.test(String(res.headers['content-type']))) return `a ${res.status} that is not JSON`;
    const b = res.body as { error?: { code?: unknown; message?: unknown }; requestId?: unknown };
    if (typeof b?.error?.code !== 'string' || typeof b.error.message !== 'string' || typeof b.requestId !== 'string') return `a ${res.status} outside the error envelope`;
  }
  return null;
}

let baseline = '';
/** Sends one input and checks the answer and, after a refusal, that nothing changed. */
async function attempt(label: string, send: () => supertest.Test, ignore: readonly string[] = []) {
  tally.inputs++;
  const res = await send();
  tally.byStatus.set(res.status, (tally.byStatus.get(res.status) ?? 0) + 1);
  const problem = problemWith(res);
  if (problem) throw new Error(`${label}: ${problem}: ${res.status} ${(res.text ?? '').slice(0, 300)}`);
  const after = await snapshot(ignore);
  if (res.status >= 400) {
    tally.dbChecks++;
    if (after !== baseline) throw new Error(`${label}: refused with ${res.status} but the database changed`);
  }
  baseline = after;
}

interface Input {
  params: Record<string, string>;
  query: string;
  body: { raw: string } | { json: unknown } | null;
}

function inputFor(op: OpenApiOperation): fc.Arbitrary<Input> {
  const entry = ACCESS_TABLE[op.key];
  const parameters = op.operation.parameters ?? [];
  const pathParams = parameters.filter((p) => p.in === 'path');
  const queryParams = parameters.filter((p) => p.in === 'query');
  const params = fc.record(
    Object.fromEntries(
      pathParams.map((p) => {
        const real = entry?.params?.[p.name] ? encodeURIComponent(fixtures[entry.params[p.name]!]) : 'x';
        return [p.name, fc.oneof({ weight: 1, arbitrary: fc.constant(real) }, { weight: 2, arbitrary: hostileUrlText })];
      }),
    ),
  );
  const queryValue = (schema: JsonSchema | undefined, name: string) =>
    fc.oneof(plausible(schema, known, name).map((v) => percentEncode(String(v))), hostileUrlText);
  const query = fc
    .tuple(
      fc.record(Object.fromEntries(queryParams.map((p) => [p.name, fc.option(queryValue(p.schema, p.name), { nil: undefined })]))),
      fc.array(
        fc.oneof(
          fc.constantFrom('__proto__=1', '__proto__[role]=admin', 'constructor[prototype][x]=1', 'q[]=a&q[]=b', 'page=1&page=2', 'page[$gt]=0', 'x'.repeat(3000) + '=1'),
          fc.tuple(fc.constantFrom(...queryParams.map((p) => p.name), 'extra'), hostileUrlText).map(([k, v]) => `${k}=${v}`),
        ),
        { maxLength: 2 },
      ),
    )
    .map(([values, extras]) => [...Object.entries(values).filter(([, v]) => v !== undefined).map(([k, v]) => `${k}=${v}`), ...extras].join('&'));
  const schema = op.operation.requestBody?.content['application/json']?.schema;
  const hasBody = op.method !== 'GET' && op.method !== 'DELETE';
  const body: fc.Arbitrary<Input['body']> = !hasBody
    ? fc.constant(null)
    : fc.oneof(
        { weight: 8, arbitrary: fc.tuple(plausible(schema, known), fc.array(mutation, { maxLength: 3 })).map(([v, ms]) => ({ json: applyMutations(v, ms) })) },
        { weight: 1, arbitrary: fc.constantFrom(...RAW_BODIES).map((raw) => ({ raw })) },
        { weight: 1, arbitrary: hostileValue.map((json) => ({ json })) },
      );
  return fc.record({ params, query, body });
}

function send(agent: supertest.Agent, op: OpenApiOperation, input: Input): supertest.Test {
  const url = fillPath(op.path, input.params) + (input.query ? `?${input.query}` : '');
  const req = agent[op.method.toLowerCase() as 'get'](url).set('origin', TEST_ORIGIN);
  if (!input.body) return req;
  req.set('content-type', 'application/json');
  return req.send('raw' in input.body ? input.body.raw : JSON.stringify(input.body.json));
}

describe('hostile input on every route', () => {
  it('never answers 500 or a stack trace, always the envelope on refusal, and a refusal changes nothing', async () => {
    baseline = await snapshot();
    const seed = Number(process.env.HOSTILE_SEED ?? 20261203);
    for (const op of operations) {
      // Signed in as an administrator, every gate is open: the input itself is what is tested.
      await fc.assert(
        fc.asyncProperty(inputFor(op), (input) => attempt(`admin: ${op.key} ${JSON.stringify(input).slice(0, 400)}`, () => send(agents.admin, op, input))),
        { numRuns: RUNS, seed },
      );
      // Installers take their own paths through the services (their company only): again as one.
      const allow = ACCESS_TABLE[op.key]?.allow;
      if (allow === 'signed-in' || (Array.isArray(allow) && allow.includes('installer'))) {
        await fc.assert(
          fc.asyncProperty(inputFor(op), (input) => attempt(`installer: ${op.key} ${JSON.stringify(input).slice(0, 400)}`, () => send(agents.installer, op, input))),
          { numRuns: Math.ceil(RUNS / 2), seed: seed + 1 },
        );
      }
    }
    expect(tally.byStatus.get(500) ?? 0).toBe(0);
    expect(tally.inputs).toBeGreaterThanOrEqual(operations.length * RUNS);
  }, 600_000);

  it('answers hostile sign-in attempts in the envelope, never with a 500', async () => {
    baseline = await snapshot(['rate_limit']);
    const signInBody = fc.oneof(
      { weight: 6, arbitrary: fc.tuple(fc.record({ email: fc.constantFrom('admin@stackyard.test', 'nobody@example.test'), password: fc.constantFrom('wrong-password', 'stackyard-demo') }), fc.array(mutation, { maxLength: 3 })).map(([v, ms]) => ({ json: applyMutations(v, ms) })) },
      { weight: 1, arbitrary: fc.constantFrom(...RAW_BODIES).map((raw) => ({ raw })) },
      { weight: 1, arbitrary: hostileValue.map((json) => ({ json })) },
    );
    await fc.assert(
      fc.asyncProperty(signInBody, fc.constantFrom('/api/auth/sign-in/email', '/api/auth/sign-in/username', '/api/auth/no-such-route'), (body, path) =>
        attempt(`POST ${path} ${JSON.stringify(body).slice(0, 300)}`, () =>
          supertest(t.app)
            .post(path)
            .set('origin', TEST_ORIGIN)
            .set('content-type', 'application/json')
            .send('raw' in body ? body.raw : JSON.stringify(body.json)),
          // Every sign-in attempt counts against its rate limit: the one change a refusal may make.
          ['rate_limit'],
        ),
      ),
      { numRuns: RUNS * 2, seed: Number(process.env.HOSTILE_SEED ?? 20261203) },
    );
    expect(tally.byStatus.get(500) ?? 0).toBe(0);
  }, 300_000);
});
