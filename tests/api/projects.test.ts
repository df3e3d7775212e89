import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { climateSiteSchema } from '../../shared/climate/climate-schemas';
import { projectListSchema, projectSchema } from '../../shared/projects/project-schemas';
import { parseBody, parseError } from '../support/parse-body';
import { signUp, useTestApp, inviteMember, setPlan } from '../support/test-app';

const t = useTestApp();

async function member(owner: Awaited<ReturnType<typeof signUp>>, role: 'designer' | 'viewer') {
  return (await inviteMember(t, owner, role)).agent;
}

describe('projects', () => {
  it('creates with details, renames, duplicates, archives and deletes', async () => {
    const { agent } = await signUp(t, { name: 'Pat Owner' });
    const site = parseBody(
      climateSiteSchema,
      await agent
        .post('/api/v1/climate-sites')
        .send({
          name: 'Site',
          sourceKind: 'published',
          publishedValues: { source: 'test', heating: { db99_6: -20, db99: -17 } },
        })
        .expect(201),
    );
    const created = parseBody(
      projectSchema,
      await agent
        .post('/api/v1/projects')
        .send({
          name: 'Hollow Lane house',
          clientName: 'R. Client',
          siteAddress: '4 Hollow Lane',
          climateSiteId: site.id,
          notes: 'n',
        })
        .expect(201),
    );
    assert.equal(created.climateSiteName, 'Site');
    assert.equal(created.version, 1);
    assert.equal(created.createdByName, 'Pat Owner');

    const renamed = parseBody(
      projectSchema,
      await agent.patch(`/api/v1/projects/${created.id}`).send({ version: 1, name: 'Hollow Lane cottage' }).expect(200),
    );
    assert.equal(renamed.name, 'Hollow Lane cottage');
    assert.equal(renamed.version, 2);
    assert.equal(renamed.clientName, 'R. Client', 'fields not sent stay as they were');

    const copy = parseBody(projectSchema, await agent.post(`/api/v1/projects/${created.id}/duplicate`).expect(201));
    assert.equal(copy.name, 'Hollow Lane cottage (copy)');
    assert.equal(copy.siteAddress, '4 Hollow Lane');
    assert.notEqual(copy.id, created.id);

    await agent.patch(`/api/v1/projects/${copy.id}`).send({ version: 1, archived: true }).expect(200);
    const active = await agent.get('/api/v1/projects').expect(200);
    assert.deepEqual(
      parseBody(projectListSchema, active).map((p) => p.name),
      ['Hollow Lane cottage'],
    );
    const archived = await agent.get('/api/v1/projects?archived=true').expect(200);
    assert.deepEqual(
      parseBody(projectListSchema, archived).map((p) => p.id),
      [copy.id],
    );
    await agent.get('/api/v1/projects?archived=maybe').expect(400);

    await agent.delete(`/api/v1/projects/${copy.id}`).expect(204);
    await agent.get(`/api/v1/projects/${copy.id}`).expect(404);
  });

  it('refuses a stale update with 409 and keeps the other change', async () => {
    const { agent } = await signUp(t);
    const p = parseBody(projectSchema, await agent.post('/api/v1/projects').send({ name: 'Shared' }).expect(201));
    await agent.patch(`/api/v1/projects/${p.id}`).send({ version: 1, notes: 'first change' }).expect(200);
    const stale = await agent
      .patch(`/api/v1/projects/${p.id}`)
      .send({ version: 1, notes: 'second change' })
      .expect(409);
    assert.equal(parseError(stale).code, 'stale_update');
    const now = parseBody(projectSchema, await agent.get(`/api/v1/projects/${p.id}`).expect(200));
    assert.equal(now.notes, 'first change');
    assert.equal(now.version, 2);
    const missingVersion = await agent.patch(`/api/v1/projects/${p.id}`).send({ notes: 'x' }).expect(400);
    assert.equal(parseError(missingVersion).details?.[0]?.path, 'version');
  });

  it("refuses another organisation's climate site as if it did not exist", async () => {
    const a = await signUp(t);
    const b = await signUp(t);
    const theirs = parseBody(
      climateSiteSchema,
      await b.agent
        .post('/api/v1/climate-sites')
        .send({
          name: 'Theirs',
          sourceKind: 'published',
          publishedValues: { source: 'x', heating: { db99_6: -5, db99: -3 } },
        })
        .expect(201),
    );
    const res = await a.agent.post('/api/v1/projects').send({ name: 'Mine', climateSiteId: theirs.id }).expect(404);
    assert.equal(parseError(res).details?.[0]?.path, 'climateSiteId');
    assert.equal(parseBody(projectListSchema, await a.agent.get('/api/v1/projects').expect(200)).length, 0);
    const mine = parseBody(projectSchema, await a.agent.post('/api/v1/projects').send({ name: 'Mine' }).expect(201));
    await b.agent.get(`/api/v1/projects/${mine.id}`).expect(404);
    await b.agent.patch(`/api/v1/projects/${mine.id}`).send({ version: 1, name: 'Taken' }).expect(404);
    await b.agent.post(`/api/v1/projects/${mine.id}/duplicate`).expect(404);
    await b.agent.delete(`/api/v1/projects/${mine.id}`).expect(404);
  });

  it('lets designers write and viewers only read', async () => {
    const owner = await signUp(t);
    await setPlan(t.db, owner.organizationId);
    const p = parseBody(projectSchema, await owner.agent.post('/api/v1/projects').send({ name: 'Roles' }).expect(201));
    const designer = await member(owner, 'designer');
    const viewer = await member(owner, 'viewer');
    await designer.patch(`/api/v1/projects/${p.id}`).send({ version: 1, name: 'By designer' }).expect(200);
    await designer.post(`/api/v1/projects/${p.id}/duplicate`).expect(201);
    await viewer.get(`/api/v1/projects/${p.id}`).expect(200);
    for (const res of [
      await viewer.post('/api/v1/projects').send({ name: 'No' }),
      await viewer.patch(`/api/v1/projects/${p.id}`).send({ version: 2, name: 'No' }),
      await viewer.post(`/api/v1/projects/${p.id}/duplicate`),
      await viewer.delete(`/api/v1/projects/${p.id}`),
    ]) {
      assert.equal(res.status, 403);
    }
    assert.equal(parseBody(projectListSchema, await owner.agent.get('/api/v1/projects').expect(200)).length, 2);
  });
});
