import type { Knex } from 'knex';
import { hashPassword } from '../modules/auth/passwords';

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
    return { created: true };
  });
}
