import assert from 'node:assert/strict';
import { after, before, describe, it } from 'node:test';
import request from 'supertest';
import { usageSchema } from '../../shared/billing/billing-schemas';
import { projectListSchema } from '../../shared/projects/project-schemas';
import { scenarioListSchema, type SweepAnswer, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../../server/seed/demo-seed';
import { parseBody } from '../support/parse-body';
import { createTestApp, resetDb, type TestApp, newAgent } from '../support/test-app';

let t: TestApp;
before(async () => {
  t = await createTestApp();
  await resetDb(t.db);
});
after(async () => {
  await t.close();
});

describe('demo data', () => {
  it('is created once, then left alone, and every demo account signs in', async () => {
    assert.deepEqual(await seedDemo(t.db), { created: true });
    const keep = await request(t.app)
      .post('/api/v1/auth/sign-in')
      .send({ email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD })
      .expect(200);
    assert.match(keep.body.organizations[0].name, /\(demo\)/);
    assert.deepEqual(await seedDemo(t.db), { created: false });
    for (const account of DEMO_ACCOUNTS) {
      const res = await request(t.app)
        .post('/api/v1/auth/sign-in')
        .send({ email: account.email, password: DEMO_PASSWORD })
        .expect(200);
      assert.equal(res.body.organizations[0].role, account.role);
    }
  });

  it('fits its plan: the Team and billing pages read within the limits', async () => {
    const agent = newAgent(t.app);
    await agent
      .post('/api/v1/auth/sign-in')
      .send({ email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD })
      .expect(200);
    const usage = parseBody(usageSchema, await agent.get('/api/v1/billing/usage').expect(200));
    assert.equal(usage.members.used, DEMO_ACCOUNTS.length);
    assert.ok(usage.members.used <= usage.members.limit, `${usage.members.used} of ${usage.members.limit} members`);
    assert.ok(usage.projects.limit === null || usage.projects.used <= usage.projects.limit);
  });

  it('labels its climate sites as invented and gives each hourly one 30 qualifying years', async () => {
    const agent = newAgent(t.app);
    await agent
      .post('/api/v1/auth/sign-in')
      .send({ email: DEMO_ACCOUNTS[2].email, password: DEMO_PASSWORD })
      .expect(200);
    const sites = await agent.get('/api/v1/climate-sites').expect(200);
    assert.equal(sites.body.length, 4);
    for (const s of sites.body) {
      assert.equal(s.isDemo, true);
      assert.match(s.name, /invented/i);
      assert.ok(s.heatingDb99_6 <= s.heatingDb99);
      if (s.sourceKind === 'hourly') assert.equal(s.qualifyingYearCount, 30);
    }
  });

  it('gives each demo project two bid scenarios whose sweeps show a trade-off across the design temperatures', async () => {
    const agent = newAgent(t.app);
    await agent
      .post('/api/v1/auth/sign-in')
      .send({ email: DEMO_ACCOUNTS[2].email, password: DEMO_PASSWORD })
      .expect(200);
    const projects = parseBody(projectListSchema, await agent.get('/api/v1/projects').expect(200));
    assert.equal(projects.length, 2);
    const project = projects[0];
    assert.ok(project);
    const scenarios = parseBody(
      scenarioListSchema,
      await agent.get(`/api/v1/projects/${project.id}/scenarios`).expect(200),
    );
    assert.deepEqual(scenarios.map((x) => x.name).sort(), ['Gas furnace bid (demo)', 'Heat pump bid (demo)']);
    for (const sc of scenarios) {
      const sweep: SweepAnswer = parseBody(
        sweepAnswerSchema,
        await agent.post(`/api/v1/projects/${project.id}/scenarios/${sc.id}/sweep`).expect(200),
      );
      assert.equal(sweep.years.length, 30);
      const named = sweep.rows.filter((r) => !r.isGrid);
      assert.ok(
        named.every((r) => r.selectedOptionId !== null),
        `${sc.name}: a unit at every named design temperature`,
      );
      // The mildest design temperature installs a smaller unit than the coldest, and falls short more often.
      assert.notEqual(named[0]?.selectedOptionId, named.at(-1)?.selectedOptionId, `${sc.name}: one unit everywhere`);
      // A heat pump sized on its compressor falls short onto its backup heat: there the trade-off is in backup hours.
      const shortfall = (r: (typeof named)[number] | undefined) =>
        (r?.unmetHoursPerYear ?? 0) + (r?.backupHoursPerYear ?? 0);
      assert.ok(shortfall(named[0]) > shortfall(named.at(-1)), sc.name);
    }
  });
});
