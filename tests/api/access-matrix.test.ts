// Generated from /api/openapi.json: every operation, called as anonymous, as each role and as an
// installer of another company, checked against the one declared table in tests/support/access-table.ts.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type supertest from 'supertest';
import { createTestApp, type TestApp } from '../support/app.ts';
import { ACCESS_TABLE, CALLERS, expectedFor, type Fixtures } from '../support/access-table.ts';
import { arrangeFixtures, fillPath, openApiOperations, type Agents, type OpenApiOperation } from '../support/api-fixtures.ts';

let t: TestApp;
let fixtures: Fixtures;
let agents: Agents;
let operations: OpenApiOperation[];

beforeAll(async () => {
  t = await createTestApp();
  ({ fixtures, agents } = await arrangeFixtures(t));
  operations = await openApiOperations(t);
}, 120_000);
afterAll(() => t?.close());

function call(agent: supertest.Agent, op: OpenApiOperation): supertest.Test {
  const entry = ACCESS_TABLE[op.key]!;
  const params = Object.fromEntries(Object.entries(entry.params ?? {}).map(([name, key]) => [name, encodeURIComponent(fixtures[key])]));
  const url = fillPath(op.path, params);
  const req = agent[op.method.toLowerCase() as 'get'](url);
  if (entry.query) req.query(entry.query(fixtures));
  if (op.method !== 'GET' && op.method !== 'DELETE') req.send((entry.body?.(fixtures) ?? {}) as object);
  return req;
}

describe('every API operation for every caller', () => {
  it('has exactly one line in the access table per operation of the OpenAPI document', () => {
    const documented = operations.map((o) => o.key);
    const missing = documented.filter((k) => !(k in ACCESS_TABLE));
    const stale = Object.keys(ACCESS_TABLE).filter((k) => !documented.includes(k));
    expect(missing, `operations missing from tests/support/access-table.ts: ${missing.join(', ')} — add a line saying who may call each`).toEqual([]);
    expect(stale, `lines in tests/support/access-table.ts for operations the API no longer has: ${stale.join(', ')}`).toEqual([]);
    for (const op of operations) {
      const params = (op.operation.parameters ?? []).filter((p) => p.in === 'path').map((p) => p.name);
      const filled = Object.keys(ACCESS_TABLE[op.key]?.params ?? {});
      expect(filled.sort(), `${op.key}: name a fixture for each path parameter in the access table`).toEqual(params.sort());
    }
  });

  it('answers each caller as the table says: 401 anonymous, 403 other roles, 404 across companies, never 500', async () => {
    const failures: string[] = [];
    let checks = 0;
    for (const op of operations) {
      const entry = ACCESS_TABLE[op.key];
      if (!entry) continue; // reported by the test above
      for (const caller of CALLERS) {
        const expected = expectedFor(entry, caller, op.method);
        const res = await call(agents[caller], op);
        checks++;
        const where = `${op.key} as ${caller}: got ${res.status} ${(res.text ?? "").slice(0, 160)}`;
        if (res.status >= 500) failures.push(`${where} (a server error)`);
        else if ('status' in expected) {
          if (res.status !== expected.status) failures.push(`${where}, expected ${expected.status}`);
          else if (res.body?.error?.code === undefined || typeof res.body.requestId !== 'string') failures.push(`${where}, expected the error envelope`);
        } else if (res.status === 401 || res.status === 403) failures.push(`${where}, expected to be let through`);
        else if (expected.success && (res.status < 200 || res.status > 299)) failures.push(`${where}, expected success`);
      }
    }
    console.log(`access matrix: ${operations.length} operations × ${CALLERS.length} callers = ${checks} checks, ${failures.length} failures`);
    expect(failures).toEqual([]);
    expect(checks).toBe(operations.length * CALLERS.length);
  }, 240_000);
});
