/** An organisation with a 4-year hourly site, a typed-in site, an equipment list, prices and a project with a building (all invented). */
import type request from 'supertest';
import { buildingSchema } from '../../shared/building/building-schemas';
import { DEMO_SITES, generateDemoSeries } from '../../shared/climate/demo-weather';
import type { EquipmentOptionInput } from '../../shared/equipment/equipment-schemas';
import { insertSite } from '../../server/modules/climate/climate-repo';
import { storeRecord } from '../../server/modules/climate/climate-service';
import { atStoragePrecision } from '../../server/modules/climate/series-codec';
import { signUp, type TestApp } from './test-app';

export const OPTIONS: EquipmentOptionInput[] = [
  {
    kind: 'furnace',
    label: 'F 6 kW',
    fuel: 'gas',
    efficiency: 0.95,
    outputW: 6000,
    installedPrice: '3000.00',
    lifeYears: 20,
  },
  {
    kind: 'furnace',
    label: 'F 9 kW',
    fuel: 'gas',
    efficiency: 0.95,
    outputW: 9000,
    installedPrice: '3400.00',
    lifeYears: 20,
  },
  {
    kind: 'furnace',
    label: 'F 14 kW',
    fuel: 'gas',
    efficiency: 0.95,
    outputW: 14000,
    installedPrice: '3900.00',
    lifeYears: 20,
  },
  {
    kind: 'heat-pump',
    label: 'HP 2 t',
    capacity8_3W: 7300,
    cop8_3: 3.9,
    capacityM8_3W: 5600,
    copM8_3: 2.5,
    capacityM15W: 4700,
    copM15: 2.0,
    backupW: 5000,
    installedPrice: '11200.00',
    lifeYears: 15,
  },
];
export const PRICES = { currency: 'USD', electricityPerKwh: '0.1600', gas: { unit: 'kWh', price: '0.0450' } };
export const BUILDING = buildingSchema.parse({
  conduction: { mode: 'ua', uaWPerK: 150 },
  airLeakage: { mode: 'ach', ach: 0.35, volumeM3: 420 },
  designWind: { source: 'default' },
  ductLossPct: 5,
  safetyFactorPct: 10,
  thermalMass: { mode: 'hours', timeConstantH: 40 },
});

export interface Fixture {
  agent: request.Agent;
  /** The owner's address (the password is `PASSWORD`). */
  email: string;
  organizationId: string;
  projectId: string;
  siteId: string;
  publishedSiteId: string;
  listId: string;
}

export async function fixture(app: TestApp, withBuilding = true): Promise<Fixture> {
  const owner = await signUp(app);
  const demo = DEMO_SITES[1];
  if (!demo) throw new Error('no demo site');
  const series = atStoragePrecision(generateDemoSeries(demo, { years: 4 }));
  const siteId = await insertSite(app.db, owner.organizationId, owner.userId, {
    name: 'Test hourly site (invented)',
    sourceKind: 'hourly',
    elevationM: demo.elevationM,
  });
  await app.db.transaction((trx) =>
    storeRecord(trx, siteId, series, demo.elevationM, { fileName: 'gen', rowCount: series.time.length }),
  );
  const publishedSiteId = await insertSite(app.db, owner.organizationId, owner.userId, {
    name: 'Typed-in site (invented)',
    sourceKind: 'published',
    publishedValues: {
      source: 'Invented',
      heating: { db99_6: -18, db99: -15 },
      extremeMin: { mean: -22, returnPeriod: { '50': -30 } },
    },
  });
  const list = await owner.agent.post('/api/v1/equipment-lists').send({ name: 'Test list' }).expect(201);
  const listId = (list.body as { id: string }).id;
  await owner.agent.put(`/api/v1/equipment-lists/${listId}/options`).send({ version: 1, options: OPTIONS }).expect(200);
  await owner.agent.put('/api/v1/energy-prices').send({ version: 0, prices: PRICES }).expect(200);
  const project = await owner.agent
    .post('/api/v1/projects')
    .send({ name: 'House', climateSiteId: siteId, equipmentListId: listId })
    .expect(201);
  const projectId = (project.body as { id: string }).id;
  if (withBuilding)
    await owner.agent
      .put(`/api/v1/projects/${projectId}/building`)
      .send({ version: 1, building: BUILDING })
      .expect(200);
  return {
    agent: owner.agent,
    email: owner.email,
    organizationId: owner.organizationId,
    projectId,
    siteId,
    publishedSiteId,
    listId,
  };
}
