import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { signUp, useTestApp } from '../support/test-app';

const t = useTestApp();

/** Bodies a careless or hostile client might send; none may cause a 500. */
const BODIES: unknown[] = [
  [],
  'text',
  42,
  null,
  {},
  { version: 'one' },
  { name: { $ne: 1 } },
  { options: 'all' },
  { csv: 7 },
];

describe('malformed input on every write route', () => {
  it('answers 4xx in the error shape, never 500, and stores nothing', async () => {
    const { agent } = await signUp(t);
    const site = await agent.post('/api/v1/climate-sites').send({ name: 'S', sourceKind: 'hourly' }).expect(201);
    const project = await agent.post('/api/v1/projects').send({ name: 'P' }).expect(201);
    const list = await agent.post('/api/v1/equipment-lists').send({ name: 'L' }).expect(201);
    const before = await Promise.all(
      ['projects', 'climate_sites', 'equipment_lists', 'equipment_options', 'energy_prices', 'invitations'].map(
        (table) =>
          t
            .db(table)
            .count<{ n: number }[]>('* as n')
            .then((r) => r[0]?.n),
      ),
    );
    const routes: [string, string][] = [
      ['post', '/api/v1/projects'],
      ['patch', `/api/v1/projects/${project.body.id}`],
      ['put', `/api/v1/projects/${project.body.id}/building`],
      ['post', '/api/v1/climate-sites'],
      ['patch', `/api/v1/climate-sites/${site.body.id}`],
      ['post', '/api/v1/equipment-lists'],
      ['patch', `/api/v1/equipment-lists/${list.body.id}`],
      ['put', `/api/v1/equipment-lists/${list.body.id}/options`],
      ['post', `/api/v1/equipment-lists/${list.body.id}/csv-preview`],
      ['put', '/api/v1/energy-prices'],
      ['post', '/api/v1/invitations'],
      ['patch', '/api/v1/me'],
      ['put', '/api/v1/session/organization'],
      ['post', '/api/v1/organizations'],
      ['patch', '/api/v1/projects/not-a-uuid'],
      ['put', '/api/v1/equipment-lists/not-a-uuid/options'],
    ];
    for (const [method, url] of routes) {
      for (const body of BODIES) {
        const req = (agent as unknown as Record<string, (u: string) => import('supertest').Test>)[method]?.(url);
        assert.ok(req);
        const res = await req.set('content-type', 'application/json').send(JSON.stringify(body));
        const label = `${method.toUpperCase()} ${url} ${JSON.stringify(body)} → ${res.status}`;
        // An empty object is a valid "change nothing" for the two PATCH routes without a version.
        const emptyPatch =
          body !== null &&
          typeof body === 'object' &&
          !Array.isArray(body) &&
          Object.keys(body).length === 0 &&
          method === 'patch' &&
          !url.includes('/projects/') &&
          !url.includes('/equipment-lists/');
        if (emptyPatch && res.status === 200) continue;
        assert.ok(res.status >= 400 && res.status < 500, label);
        assert.equal(typeof res.body.error?.message, 'string', `${label}: error shape`);
      }
    }
    const after = await Promise.all(
      ['projects', 'climate_sites', 'equipment_lists', 'equipment_options', 'energy_prices', 'invitations'].map(
        (table) =>
          t
            .db(table)
            .count<{ n: number }[]>('* as n')
            .then((r) => r[0]?.n),
      ),
    );
    assert.deepEqual(after, before);
  });
});
