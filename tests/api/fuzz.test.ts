/**
 * Hostile input, property-based (fast-check): arbitrary JSON bodies to every JSON write route of the
 * route table, as an owner with real ids. The server never answers 500, and a refused request
 * stores nothing (row counts of every table stay put).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import type { Scenario } from '../../shared/scenarios/scenario-schemas';
import { fixture } from '../support/scenario-fixture';
import { setPlan, useTestApp } from '../support/test-app';

const t = useTestApp();

const TABLES = [
  'projects',
  'scenarios',
  'reports',
  'report_links',
  'report_sends',
  'equipment_lists',
  'equipment_options',
  'energy_prices',
  'climate_sites',
  'climate_uploads',
  'invitations',
  'memberships',
  'organizations',
  'users',
  'billing_accounts',
  'organization_logos',
];

async function rowCounts(): Promise<string> {
  const parts = TABLES.map((name) => `(SELECT count(*) FROM ${name}) AS ${name}`).join(', ');
  const result = await t.db.raw<{ rows: Record<string, number>[] }>(`SELECT ${parts}`);
  return JSON.stringify(result.rows[0]);
}

/** Routes whose success ends the session or calls the payment provider: left to their own tests. */
const SKIP = /sign-out|billing\/(cancel|checkout|portal)|\/freeze$|\/send$|\/retry$/;

describe('hostile JSON bodies', () => {
  it('never get a 500 from any write route, and a refused one stores nothing', async () => {
    const f = await fixture(t);
    await setPlan(t.db, f.organizationId);
    const scenario = (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios`).send({ name: 'Fuzz' }).expect(201)).body as Scenario;
    const ids: Record<string, string> = {
      projectId: f.projectId,
      scenarioId: scenario.id,
      listId: f.listId,
      siteId: f.siteId,
    };
    const routes = t.routes().filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method) && r.guard !== null && !SKIP.test(r.path));
    assert.ok(routes.length > 20, `${routes.length} routes`);
    const body = fc.oneof(
      fc.anything({ maxDepth: 3 }),
      fc.dictionary(fc.constantFrom('name', 'version', 'settings', 'building', 'options', 'prices', 'email', 'role', 'points', 'title', 'plan', 'csv', 'scenarioId'), fc.anything({ maxDepth: 2 })),
      fc.record({ version: fc.oneof(fc.integer(), fc.string()), name: fc.string({ maxLength: 300 }) }, { requiredKeys: [] }),
    );
    const failures: string[] = [];
    for (const r of routes) {
      const url = r.path.replace(/:(\w+)/g, (_m, name: string) => ids[name] ?? '00000000-0000-4000-8000-000000000000');
      await fc.assert(
        fc.asyncProperty(body, async (payload) => {
          const before = await rowCounts();
          const m = r.method.toLowerCase() as 'post' | 'put' | 'patch';
          const res = await f.agent[m](url).set('content-type', 'application/json').send(JSON.stringify(payload) ?? 'null');
          if (res.status >= 500) failures.push(`${r.method} ${r.path} → ${res.status} for ${JSON.stringify(payload).slice(0, 200)}`);
          if (res.status >= 400 && (await rowCounts()) !== before) failures.push(`${r.method} ${r.path} refused (${res.status}) but stored rows`);
          return true;
        }),
        { numRuns: 12 },
      );
    }
    assert.deepEqual(failures, []);
  });
});
