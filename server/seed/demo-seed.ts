import type { Knex } from 'knex';
import { DEMO_SITES, generateDemoSeries } from '@shared/climate/demo-weather';
import { hashPassword } from '../modules/auth/passwords';
import { insertSite } from '../modules/climate/climate-repo';
import { storeRecord } from '../modules/climate/climate-service';
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
    for (const name of DEMO_PROJECTS) {
      await trx('projects').insert({ organization_id: org.id, name, created_by: ownerId });
    }
    // Three invented sites with 30-year hourly records from the seeded generator.
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
      await storeRecord(trx, siteId, series, site.elevationM, { fileName: `${site.id} (generated)`, rowCount: series.time.length });
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
        wind: { coldestMonth: 1, coldestMonth1: 10.8, coincident99_6: 3.9, annual1: 10.2, annual2_5: 9.1, annual5: 8.2 },
        hdd18: 3890,
      },
    });
    return { created: true };
  });
}
