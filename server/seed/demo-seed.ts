import type { Knex } from 'knex';
import { DEMO_SITES, generateDemoSeries } from '@shared/climate/demo-weather';
import { buildingSchema } from '@shared/building/building-schemas';
import { equipmentOptionSchema, type EquipmentOptionInput } from '@shared/equipment/equipment-schemas';
import { hashPassword } from '../modules/auth/passwords';
import { insertSite } from '../modules/climate/climate-repo';
import { storeRecord } from '../modules/climate/climate-service';
import { scenarioSettingsSchema } from '@shared/scenarios/scenario-schemas';
import { atStoragePrecision } from '../modules/climate/series-codec';

/**
 * Demo data: an invented firm in an invented town, for trying Tailroom out.
 * Nothing here describes a real company, person or place.
 */
export const DEMO_ORGANIZATION = 'Brackenford Comfort Heating (demo)';
export const DEMO_ACCOUNTS = [
  { email: 'owner@demo.tailroom.test', name: 'Rowan Hale (demo owner)', role: 'owner' },
  { email: 'designer@demo.tailroom.test', name: 'Ines Okafor (demo designer)', role: 'designer' },
  { email: 'viewer@demo.tailroom.test', name: 'Theo Marsh (demo viewer)', role: 'viewer' },
] as const;
export const DEMO_PASSWORD = 'warm-house-demo-2026';
const DEMO_PROJECTS = ['Demo: Fernbrook Lane bungalow (invented)', 'Demo: Old Mill duplex retrofit (invented)'];

/** Invented catalogue entries and prices, for the demo only (not any manufacturer's data). */
const DEMO_EQUIPMENT: EquipmentOptionInput[] = [
  {
    kind: 'furnace',
    label: 'Demo gas furnace 30k (invented)',
    fuel: 'gas',
    efficiency: 0.96,
    outputW: 8_800,
    installedPrice: '4290.00',
    lifeYears: 20,
  },
  {
    kind: 'furnace',
    label: 'Demo gas furnace 40k (invented)',
    fuel: 'gas',
    efficiency: 0.96,
    outputW: 11_700,
    installedPrice: '4650.00',
    lifeYears: 20,
  },
  {
    kind: 'furnace',
    label: 'Demo gas furnace 60k (invented)',
    fuel: 'gas',
    efficiency: 0.96,
    outputW: 17_600,
    installedPrice: '5180.00',
    lifeYears: 20,
  },
  {
    kind: 'furnace',
    label: 'Demo gas furnace 80k (invented)',
    fuel: 'gas',
    efficiency: 0.95,
    outputW: 23_400,
    installedPrice: '5720.00',
    lifeYears: 20,
  },
  {
    kind: 'heat-pump',
    label: 'Demo cold-climate heat pump 2 t (invented)',
    capacity8_3W: 7_300,
    cop8_3: 3.9,
    capacityM8_3W: 5_600,
    copM8_3: 2.5,
    capacityM15W: 4_700,
    copM15: 2.0,
    backupW: 5_000,
    installedPrice: '11200.00',
    lifeYears: 15,
  },
  {
    kind: 'heat-pump',
    label: 'Demo cold-climate heat pump 3 t (invented)',
    capacity8_3W: 10_500,
    cop8_3: 3.7,
    capacityM8_3W: 8_200,
    copM8_3: 2.4,
    capacityM15W: 6_900,
    copM15: 1.9,
    backupW: 10_000,
    installedPrice: '13900.00',
    lifeYears: 15,
  },
  {
    kind: 'heat-pump',
    label: 'Demo cold-climate heat pump 4 t (invented)',
    capacity8_3W: 14_000,
    cop8_3: 3.6,
    capacityM8_3W: 11_600,
    copM8_3: 2.4,
    capacityM15W: 10_200,
    copM15: 1.9,
    backupW: 10_000,
    installedPrice: '16400.00',
    lifeYears: 15,
  },
  {
    kind: 'heat-pump',
    label: 'Demo cold-climate heat pump 5 t (invented)',
    capacity8_3W: 17_500,
    cop8_3: 3.5,
    capacityM8_3W: 14_600,
    copM8_3: 2.3,
    capacityM15W: 12_900,
    copM15: 1.8,
    backupW: 15_000,
    installedPrice: '19100.00',
    lifeYears: 15,
  },
  {
    kind: 'boiler',
    label: 'Demo oil boiler 90k (invented)',
    fuel: 'oil',
    efficiency: 0.86,
    outputW: 26_400,
    installedPrice: '9300.00',
    lifeYears: 25,
  },
];

/** Creates the demo organisation once; a second run changes nothing, so data made since is kept. */
export async function seedDemo(db: Knex): Promise<{ created: boolean }> {
  return db.transaction(async (trx) => {
    const exists: unknown = await trx('users').where({ email: DEMO_ACCOUNTS[0].email }).first('id');
    if (exists) return { created: false };
    const passwordHash = await hashPassword(DEMO_PASSWORD);
    const [org] = await trx('organizations').insert({ name: DEMO_ORGANIZATION }).returning<{ id: string }[]>('id');
    if (!org) throw new Error('demo organisation not created');
    let ownerId = '';
    for (const account of DEMO_ACCOUNTS) {
      const [user] = await trx('users')
        .insert({ email: account.email, name: account.name, password_hash: passwordHash })
        .returning<{ id: string }[]>('id');
      if (!user) throw new Error('demo user not created');
      if (account.role === 'owner') ownerId = user.id;
      await trx('memberships').insert({ organization_id: org.id, user_id: user.id, role: account.role });
    }
    const [list] = await trx('equipment_lists')
      .insert({ organization_id: org.id, name: 'Demo standard line (invented prices)', updated_by: ownerId })
      .returning<{ id: string }[]>('id');
    if (!list) throw new Error('demo list not created');
    await trx('equipment_options').insert(
      DEMO_EQUIPMENT.map((input, position) => {
        const option = equipmentOptionSchema.parse(input);
        return {
          equipment_list_id: list.id,
          position,
          kind: option.kind,
          label: option.label,
          installed_price: option.installedPrice,
          option: JSON.stringify(option),
        };
      }),
    );
    await trx('energy_prices').insert({
      organization_id: org.id,
      prices: JSON.stringify({
        currency: 'USD',
        electricityPerKwh: '0.1600',
        gas: { unit: 'therm', price: '1.2500' },
        oilPerLitre: '1.0500',
      }),
      updated_by: ownerId,
    });
    const building = buildingSchema.parse({
      conduction: { mode: 'ua', uaWPerK: 165 },
      airLeakage: { mode: 'ach50', ach50: 4.5, volumeM3: 420, nFactor: 18.5 },
      designWind: { source: 'default' },
      ductLossPct: 5,
      safetyFactorPct: 10,
      thermalMass: { mode: 'class', class: 'medium', floorAreaM2: 160 },
    });
    for (const name of DEMO_PROJECTS) {
      await trx('projects').insert({
        organization_id: org.id,
        name,
        created_by: ownerId,
        updated_by: ownerId,
        equipment_list_id: list.id,
        building: JSON.stringify(building),
      });
    }
    // Three invented sites with 30-year hourly records from the seeded generator.
    // The demo projects use the site with the widest useful span of design temperatures for their house (Tallowmere Vale).
    let projectSiteId: string | undefined;
    for (const site of DEMO_SITES) {
      const siteId = await insertSite(trx, org.id, ownerId, {
        name: site.name,
        latitude: site.latitude,
        longitude: site.longitude,
        elevationM: site.elevationM,
        utcOffsetHours: site.utcOffsetHours,
        notes: `${site.description} Invented demo data made by a seeded generator, not observations of a real place.`,
        sourceKind: 'hourly',
        isDemo: true,
      });
      const series = atStoragePrecision(generateDemoSeries(site, { years: 30 }));
      await storeRecord(trx, siteId, series, site.elevationM, {
        fileName: `${site.id} (generated)`,
        rowCount: series.time.length,
      });
      if (site.id === 'tallowmere-vale' || projectSiteId === undefined) projectSiteId = siteId;
    }
    await trx('projects').where({ organization_id: org.id }).update({ climate_site_id: projectSiteId });
    // Two bid scenarios on each demo project: gas furnaces only, and heat pumps with their backup.
    const projects = await trx('projects').where({ organization_id: org.id }).select<{ id: string }[]>('id');
    const labelsOf = (kinds: string[]) => DEMO_EQUIPMENT.filter((o) => kinds.includes(o.kind)).map((o) => o.label);
    for (const p of projects) {
      for (const [name, kinds] of [
        ['Gas furnace bid (demo)', ['furnace']],
        ['Heat pump bid (demo)', ['heat-pump']],
      ] as const) {
        await trx('scenarios').insert({
          organization_id: org.id,
          project_id: p.id,
          name,
          climate_site_id: projectSiteId,
          equipment_list_id: list.id,
          settings: JSON.stringify(
            scenarioSettingsSchema.parse({
              optionLabels: labelsOf([...kinds]),
              equipmentFamily: kinds[0] === 'furnace' ? 'fuel-fired' : 'heat-pump',
              extraDesignC: [],
              discountRatePct: 3,
            }),
          ),
          created_by: ownerId,
          updated_by: ownerId,
        });
      }
    }
    // And one typed in by hand, as from a published table (invented values).
    await insertSite(trx, org.id, ownerId, {
      name: 'Ashcombe Ridge (invented, typed-in values)',
      elevationM: 240,
      utcOffsetHours: -5,
      notes: 'Invented demo values entered by hand, to show a site without an hourly record.',
      sourceKind: 'published',
      isDemo: true,
      publishedValues: {
        source: 'Invented demo values (no real table)',
        elevation: 240,
        period: { firstYear: 1995, lastYear: 2024 },
        heating: { db99_6: -19.4, db99: -16.2 },
        cooling: { db0_4: 31.6, db1: 30.1, db2: 28.7 },
        extremeMin: { mean: -23.8, sd: 3.4, returnPeriod: { '5': -26.2, '10': -28.2, '20': -30.1, '50': -32.6 } },
        wind: {
          coldestMonth: 1,
          coldestMonth1: 10.8,
          coincident99_6: 3.9,
          annual1: 10.2,
          annual2_5: 9.1,
          annual5: 8.2,
        },
        hdd18: 3890,
      },
    });
    return { created: true };
  });
}
