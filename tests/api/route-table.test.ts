/**
 * Every API route, from the server's own route table, checked for every role and for a member of
 * another organisation: a route with no guard must be on the list of public routes below, so a new
 * route without an authorisation check fails this suite.
 */
import assert from 'node:assert/strict';
import { randomUUID } from 'node:crypto';
import { describe, it } from 'node:test';
import request from 'supertest';
import { can, roles, type Role } from '../../shared/auth/roles';
import { invitationSchema } from '../../shared/orgs/org-schemas';
import { linkCreatedSchema, reportSchema } from '../../shared/reports/report-schemas';
import { scenarioSchema } from '../../shared/scenarios/scenario-schemas';
import { parseBody, parseError } from '../support/parse-body';
import { fixture } from '../support/scenario-fixture';
import { inviteMember, setPlan, signUp, uniqueEmail, useTestApp } from '../support/test-app';

const t = useTestApp();

/** Routes anyone may call: signing in and up, password resets, invitation and report links, the provider's webhook, the dev outbox (development only). */
const PUBLIC = new Set([
  'POST /api/v1/auth/sign-up',
  'GET /api/v1/auth/sign-ups/:token',
  'POST /api/v1/auth/sign-ups/:token',
  'POST /api/v1/invitation-links/:token/account',
  'POST /api/v1/auth/sign-in',
  'POST /api/v1/auth/sign-out',
  'POST /api/v1/auth/password-resets',
  'POST /api/v1/auth/password-resets/:token',
  'GET /api/v1/session',
  'GET /api/v1/invitation-links/:token',
  'GET /api/v1/public/reports/:token',
  'GET /api/v1/public/reports/:token/pdf',
  'GET /api/v1/public/reports/:token/logo',
  'GET /api/v1/dev/outbox',
]);

const key = (r: { method: string; path: string }) => `${r.method} ${r.path}`;

describe('the route table', () => {
  it('has a guard on every route that is not deliberately public', () => {
    const routes = t.routes();
    assert.ok(routes.length > 60, `only ${routes.length} routes found`);
    const unguarded = routes.filter((r) => r.guard === null).map(key);
    const unexpected = unguarded.filter((k) => !PUBLIC.has(k));
    assert.deepEqual(unexpected, [], 'routes with no authorisation check');
  });

  it('answers every guarded route by role, and another organisation’s ids with no data', async () => {
    // Organisation A with real objects of every kind, and a member of each role.
    const f = await fixture(t);
    await setPlan(t.db, f.organizationId);
    const scenario = scenarioSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios`).send({ name: 'S' }).expect(201)).body,
    );
    await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).expect(200);
    const rung =
      (await t.db('sweep_results').first<{ result: { rows: { designC: number }[] } }>('result')).result.rows[0]
        ?.designC ?? -10;
    const report = reportSchema.parse(
      (
        await f.agent
          .post(`/api/v1/projects/${f.projectId}/reports`)
          .send({ scenarioId: scenario.id, title: 'R', points: [rung] })
          .expect(201)
      ).body,
    );
    const link = parseBody(
      linkCreatedSchema,
      await f.agent.post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`).send({}).expect(201),
    );
    const invitation = parseBody(
      invitationSchema,
      await f.agent
        .post('/api/v1/invitations')
        .send({ email: uniqueEmail('pending'), role: 'viewer' })
        .expect(201),
    );
    const members: Record<Role, { agent: request.Agent; userId: string }> = {
      owner: { agent: f.agent, userId: '' },
      designer: await inviteMember(t, { agent: f.agent }, 'designer'),
      viewer: await inviteMember(t, { agent: f.agent }, 'viewer'),
    };
    const ids: Record<string, string> = {
      projectId: f.projectId,
      scenarioId: scenario.id,
      reportId: report.id,
      linkId: link.link.id,
      sendId: randomUUID(),
      listId: f.listId,
      siteId: f.siteId,
      uploadId: randomUUID(),
      userId: members.viewer.userId,
      invitationId: invitation.id,
      id: randomUUID(),
      token: 'not-a-token',
    };
    const fill = (path: string, values: Record<string, string>) =>
      path.replace(/:(\w+)/g, (_m, name: string) => values[name] ?? randomUUID());
    const outsider = await signUp(t);
    const guarded = t.routes().filter((r) => r.guard !== null);
    const call = (agent: request.Agent | ReturnType<typeof request>, method: string, url: string) => {
      const m = method.toLowerCase() as 'get' | 'post' | 'put' | 'patch' | 'delete';
      const req = agent[m](url);
      return method === 'GET' || method === 'DELETE' ? req : req.send({});
    };
    const problems: string[] = [];
    for (const r of guarded) {
      // Deleting or revoking A's real objects would change what later rows see: those get fresh ids.
      const values =
        r.method === 'DELETE'
          ? {
              ...ids,
              projectId: f.projectId,
              scenarioId: randomUUID(),
              reportId: randomUUID(),
              linkId: randomUUID(),
              listId: randomUUID(),
              siteId: randomUUID(),
              userId: randomUUID(),
              invitationId: randomUUID(),
            }
          : ids;
      if (r.path.endsWith('/sign-out-everywhere') || r.path.endsWith('/billing/cancel') || r.path.endsWith('/freeze'))
        continue;
      const url = fill(r.path, values);
      const anon = await call(request(t.app), r.method, url);
      if (anon.status !== 401) problems.push(`${key(r)} without a session: ${anon.status}`);
      for (const role of roles) {
        const res = await call(members[role].agent, r.method, url);
        const allowed = r.guard?.kind === 'user' || (r.guard?.kind === 'action' && can(role, r.guard.action));
        if (res.status >= 500) problems.push(`${key(r)} as ${role}: ${res.status}`);
        if (!allowed && res.status !== 403) problems.push(`${key(r)} as ${role}: ${res.status}, expected 403`);
        if (allowed && res.status === 403 && parseError(res).code === 'forbidden')
          problems.push(`${key(r)} as ${role}: forbidden`);
      }
      // Another organisation's owner, with A's ids: never A's data.
      if (/:(projectId|scenarioId|reportId|listId|siteId|userId|invitationId|linkId)/.test(r.path)) {
        const res = await call(outsider.agent, r.method, fill(r.path, ids));
        if (res.status < 300 || res.status >= 500) problems.push(`${key(r)} from another organisation: ${res.status}`);
      }
    }
    assert.deepEqual(problems, []);
  });
});
