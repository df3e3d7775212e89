import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { equipmentListSchema } from '../../shared/equipment/equipment-schemas';
import { parseBody } from '../support/parse-body';
import { signUp, useTestApp, inviteMember } from '../support/test-app';

const t = useTestApp();

const CSV = [
  'kind,label,output_w,input_w,efficiency,fuel,cap_8_3_w,cop_8_3,cap_m8_3_w,cop_m8_3,cap_m15_w,cop_m15,backup_w,installed_price,life_years',
  'furnace,Condensing furnace 60k,,17584,0.96,gas,,,,,,,,4850.00,20',
  'heat-pump,Cold-climate 3 ton,,,,electricity,10500,3.6,7900,2.4,6800,1.9,5000,12400.50,15',
].join('\n');

const furnace = {
  kind: 'furnace',
  label: 'Furnace 80k',
  fuel: 'gas',
  efficiency: 0.95,
  outputW: 22271,
  installedPrice: '5120.00',
  lifeYears: 20,
};

async function member(owner: Awaited<ReturnType<typeof signUp>>, role: 'designer' | 'viewer') {
  return (await inviteMember(t, owner, role)).agent;
}

describe('equipment lists', () => {
  it('creates a list, imports a CSV through a preview, saves, exports the same options', async () => {
    const { agent } = await signUp(t);
    const list = await agent.post('/api/v1/equipment-lists').send({ name: 'Standard line' }).expect(201);
    assert.equal(list.body.version, 1);
    const preview = await agent
      .post(`/api/v1/equipment-lists/${list.body.id}/csv-preview`)
      .send({ csv: CSV })
      .expect(200);
    assert.equal(preview.body.options.length, 2);
    assert.equal(
      await t
        .db('equipment_options')
        .count<{ n: number }[]>('* as n')
        .then((r) => r[0]?.n),
      0,
      'a preview stores nothing',
    );

    const saved = await agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [...preview.body.options, furnace] })
      .expect(200);
    assert.equal(saved.body.version, 2);
    assert.deepEqual(
      parseBody(equipmentListSchema, saved).options.map((o) => o.label),
      ['Condensing furnace 60k', 'Cold-climate 3 ton', 'Furnace 80k'],
    );
    // Money is stored as an exact decimal.
    const prices = await t.db('equipment_options').orderBy('position').pluck('installed_price');
    assert.deepEqual(prices, ['4850.00', '12400.50', '5120.00']);

    const csv = await agent.get(`/api/v1/equipment-lists/${list.body.id}/csv`).expect(200);
    assert.match(String(csv.headers['content-type']), /text\/csv/);
    assert.match(String(csv.headers['content-disposition']), /Standard-line\.csv/);
    const again = await agent
      .post(`/api/v1/equipment-lists/${list.body.id}/csv-preview`)
      .send({ csv: csv.text })
      .expect(200);
    assert.deepEqual(again.body.options, saved.body.options, 'export and import round-trip');
  });

  it('refuses a CSV with one bad line whole, naming the line', async () => {
    const { agent } = await signUp(t);
    const list = await agent.post('/api/v1/equipment-lists').send({ name: 'L' }).expect(201);
    const bad = CSV + '\nheat-pump,Broken,,,,electricity,ten,3.6,7900,2.4,,,,100,15';
    const res = await agent.post(`/api/v1/equipment-lists/${list.body.id}/csv-preview`).send({ csv: bad }).expect(400);
    assert.equal(res.body.error.code, 'invalid_file');
    assert.equal(res.body.error.details[0].path, 'line 4');
  });

  it('validates options field by field and refuses stale saves without losing the other change', async () => {
    const { agent } = await signUp(t);
    const list = await agent.post('/api/v1/equipment-lists').send({ name: 'L' }).expect(201);
    const invalid = await agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [{ ...furnace, efficiency: 95 }] })
      .expect(400);
    assert.equal(invalid.body.error.details[0].path, 'options.0.efficiency');
    const money = await agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [{ ...furnace, installedPrice: 5120.1 }] })
      .expect(400);
    assert.equal(money.body.error.details[0].path, 'options.0.installedPrice');

    await agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [furnace] })
      .expect(200);
    const stale = await agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [] })
      .expect(409);
    assert.equal(stale.body.error.code, 'stale_update');
    const now = await agent.get(`/api/v1/equipment-lists/${list.body.id}`).expect(200);
    assert.equal(now.body.options.length, 1);
    await agent.patch(`/api/v1/equipment-lists/${list.body.id}`).send({ version: 1, name: 'Old' }).expect(409);
    await agent.patch(`/api/v1/equipment-lists/${list.body.id}`).send({ version: 2, name: 'Renamed' }).expect(200);
  });

  it('lets viewers read, not write; other organisations get 404', async () => {
    const owner = await signUp(t);
    const list = await owner.agent.post('/api/v1/equipment-lists').send({ name: 'L' }).expect(201);
    const project = await owner.agent.post('/api/v1/projects').send({ name: 'Viewer test' }).expect(201);
    const viewer = await member(owner, 'viewer');
    await viewer.get(`/api/v1/equipment-lists/${list.body.id}`).expect(200);
    await viewer.get(`/api/v1/projects/${project.body.id}/building`).expect(200);
    await viewer.get(`/api/v1/equipment-lists/${list.body.id}/csv`).expect(200);
    for (const res of [
      await viewer.post('/api/v1/equipment-lists').send({ name: 'No' }),
      await viewer.put(`/api/v1/equipment-lists/${list.body.id}/options`).send({ version: 1, options: [] }),
      await viewer.post(`/api/v1/equipment-lists/${list.body.id}/csv-preview`).send({ csv: CSV }),
      await viewer.delete(`/api/v1/equipment-lists/${list.body.id}`),
      await viewer
        .put('/api/v1/energy-prices')
        .send({ version: 0, prices: { currency: 'USD', electricityPerKwh: '0.15' } }),
      await viewer.put(`/api/v1/projects/${project.body.id}/building`).send({ version: 1, building: {} }),
    ]) {
      assert.equal(res.status, 403);
    }
    const other = await signUp(t);
    await other.agent.get(`/api/v1/equipment-lists/${list.body.id}`).expect(404);
    await other.agent
      .put(`/api/v1/equipment-lists/${list.body.id}/options`)
      .send({ version: 1, options: [] })
      .expect(404);
    await other.agent.delete(`/api/v1/equipment-lists/${list.body.id}`).expect(404);
    const theirs = await other.agent.post('/api/v1/projects').send({ name: 'P' }).expect(201);
    await other.agent.get(`/api/v1/projects/${project.body.id}/building`).expect(404);
    const res = await other.agent
      .patch(`/api/v1/projects/${theirs.body.id}`)
      .send({ version: 1, equipmentListId: list.body.id })
      .expect(404);
    assert.equal(res.body.error.details[0].path, 'equipmentListId');
  });
});

describe('energy prices', () => {
  it('saves money as strings with optimistic concurrency', async () => {
    const { agent } = await signUp(t);
    assert.deepEqual((await agent.get('/api/v1/energy-prices').expect(200)).body, { version: 0, prices: null });
    const prices = {
      currency: 'CAD',
      electricityPerKwh: '0.1420',
      gas: { unit: 'm3', price: '0.4310' },
      oilPerLitre: '1.6500',
    };
    const saved = await agent.put('/api/v1/energy-prices').send({ version: 0, prices }).expect(200);
    assert.equal(saved.body.version, 1);
    assert.deepEqual((await agent.get('/api/v1/energy-prices').expect(200)).body.prices, prices);
    await agent.put('/api/v1/energy-prices').send({ version: 0, prices }).expect(409);
    const bad = await agent
      .put('/api/v1/energy-prices')
      .send({ version: 1, prices: { ...prices, electricityPerKwh: 0.142 } })
      .expect(400);
    assert.equal(bad.body.error.details[0].path, 'prices.electricityPerKwh');
  });
});

describe('a project’s building', () => {
  const building = {
    indoorDesignC: 21,
    conduction: { mode: 'ua', uaWPerK: 180 },
    airLeakage: { mode: 'ach50', ach50: 5, volumeM3: 400, nFactor: 18.5 },
    designWind: { source: 'default' },
    thermalMass: { mode: 'hours', timeConstantH: 40 },
  };

  it('stores the building in SI with the project version, and refuses stale or invalid saves', async () => {
    const { agent } = await signUp(t);
    const p = await agent.post('/api/v1/projects').send({ name: 'B' }).expect(201);
    assert.deepEqual((await agent.get(`/api/v1/projects/${p.body.id}/building`).expect(200)).body, {
      version: 1,
      building: null,
    });
    const saved = await agent.put(`/api/v1/projects/${p.body.id}/building`).send({ version: 1, building }).expect(200);
    assert.equal(saved.body.version, 2);
    assert.equal(saved.body.building.conduction.uaWPerK, 180);
    assert.equal(saved.body.building.indoorDesignC, 21);
    const loaded = await agent.get(`/api/v1/projects/${p.body.id}/building`).expect(200);
    assert.deepEqual(loaded.body, saved.body);

    await agent.put(`/api/v1/projects/${p.body.id}/building`).send({ version: 1, building }).expect(409);
    const invalid = await agent
      .put(`/api/v1/projects/${p.body.id}/building`)
      .send({
        version: 2,
        building: { ...building, airLeakage: { mode: 'ach50', ach50: -1, volumeM3: 400, nFactor: 18.5 } },
      })
      .expect(400);
    assert.equal(invalid.body.error.details[0].path, 'building.airLeakage.ach50');
    const copy = await agent.post(`/api/v1/projects/${p.body.id}/duplicate`).expect(201);
    assert.deepEqual(
      (await agent.get(`/api/v1/projects/${copy.body.id}/building`).expect(200)).body.building,
      saved.body.building,
    );
  });
});
