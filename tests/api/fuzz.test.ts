/**
 * Hostile input, property-based (fast-check): arbitrary JSON bodies to every JSON write route of the
 * route table, as an owner with real ids. The server never answers 500, and a refused request
 * stores nothing (row counts of every table stay put).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { scenarioSchema } from '../../shared/scenarios/scenario-schemas';
import { fixture } from '../support/scenario-fixture';
import { linkToken, newAgent, setPlan, signUp, uniqueEmail, useTestApp } from '../support/test-app';

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
  'sign_up_requests',
  'password_resets',
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
    const scenario = scenarioSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios`).send({ name: 'Fuzz' }).expect(201)).body,
    );
    const ids: Record<string, string> = {
      projectId: f.projectId,
      scenarioId: scenario.id,
      listId: f.listId,
      siteId: f.siteId,
    };
    const routes = t
      .routes()
      .filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method) && r.guard !== null && !SKIP.test(r.path));
    assert.ok(routes.length > 20, `${routes.length} routes`);
    const body = fc.oneof(
      fc.anything({ maxDepth: 3 }),
      fc.dictionary(
        fc.constantFrom(
          'name',
          'version',
          'settings',
          'building',
          'options',
          'prices',
          'email',
          'role',
          'points',
          'title',
          'plan',
          'csv',
          'scenarioId',
        ),
        fc.anything({ maxDepth: 2 }),
      ),
      fc.record(
        { version: fc.oneof(fc.integer(), fc.string()), name: fc.string({ maxLength: 300 }) },
        { requiredKeys: [] },
      ),
    );
    const failures: string[] = [];
    for (const r of routes) {
      const url = r.path.replace(/:(\w+)/g, (_m, name: string) => ids[name] ?? '00000000-0000-4000-8000-000000000000');
      await fc.assert(
        fc.asyncProperty(body, async (payload) => {
          const before = await rowCounts();
          const m = r.method.toLowerCase() as 'post' | 'put' | 'patch';
          const res = await f.agent[m](url)
            .set('content-type', 'application/json')
            .send(JSON.stringify(payload) ?? 'null');
          if (res.status >= 500)
            failures.push(`${r.method} ${r.path} → ${res.status} for ${JSON.stringify(payload).slice(0, 200)}`);
          if (res.status >= 400 && (await rowCounts()) !== before)
            failures.push(`${r.method} ${r.path} refused (${res.status}) but stored rows`);
          return true;
        }),
        { numRuns: 12 },
      );
    }
    assert.deepEqual(failures, []);
  });

  it('never get a 500 from the public write routes (sign-up, its link, sign-in, resets, invitation accounts), and a refused one stores nothing', async () => {
    const owner = await signUp(t);
    const invitee = uniqueEmail('fuzz.invitee');
    const inviteMail = t.sink.waitFor((m) => m.to.includes(invitee));
    await owner.agent.post('/api/v1/invitations').send({ email: invitee, role: 'viewer' }).expect(201);
    const signUpMail = t.sink.waitFor((m) => m.text.includes('/finish-sign-up/'));
    await newAgent(t.app)
      .post('/api/v1/auth/sign-up')
      .send({ email: uniqueEmail('fuzz.new'), name: 'Fuzz' })
      .expect(202);
    const tokens: Record<string, string> = {
      '/api/v1/auth/sign-ups/:token': linkToken((await signUpMail).text, '/finish-sign-up/'),
      '/api/v1/invitation-links/:token/account': linkToken((await inviteMail).text, '/invitations/'),
    };
    const routes = t
      .routes()
      .filter((r) => ['POST', 'PUT', 'PATCH'].includes(r.method) && r.guard === null && !SKIP.test(r.path));
    assert.ok(routes.length >= 6, `${routes.length} routes`);
    const body = fc.oneof(
      fc.anything({ maxDepth: 3 }),
      fc.dictionary(
        fc.constantFrom('email', 'name', 'password', 'organizationName', 'returnUrl', 'invitationToken'),
        fc.anything({ maxDepth: 2 }),
      ),
      fc.record(
        {
          email: fc.oneof(fc.emailAddress(), fc.string()),
          name: fc.string({ maxLength: 200 }),
          password: fc.string({ maxLength: 20 }),
        },
        { requiredKeys: [] },
      ),
    );
    const failures: string[] = [];
    for (const r of routes) {
      const url = r.path.replace(':token', tokens[r.path] ?? 'A'.repeat(43));
      await fc.assert(
        fc.asyncProperty(body, async (payload) => {
          const before = await rowCounts();
          const m = r.method.toLowerCase() as 'post' | 'put' | 'patch';
          const res = await newAgent(t.app)
            [m](url)
            .set('content-type', 'application/json')
            .send(JSON.stringify(payload) ?? 'null');
          if (res.status >= 500)
            failures.push(`${r.method} ${r.path} → ${res.status} for ${JSON.stringify(payload).slice(0, 200)}`);
          if (res.status >= 400 && (await rowCounts()) !== before)
            failures.push(`${r.method} ${r.path} refused (${res.status}) but stored rows`);
          return true;
        }),
        { numRuns: 15 },
      );
    }
    assert.deepEqual(failures, []);
  });
});
