import type { Session } from '@shared/auth/auth-schemas';
import type { Role } from '@shared/auth/roles';

export const ORG_ID = '3f0c2f5e-1b2a-4c3d-8e4f-5a6b7c8d9e01';
export const OTHER_ORG_ID = '3f0c2f5e-1b2a-4c3d-8e4f-5a6b7c8d9e02';
export const USER_ID = '7d1e2f3a-4b5c-4d6e-8f70-81a2b3c4d5e6';

/** A session for a signed-in user with `role` in the current organisation. */
export function signedInSession(role: Role = 'owner'): Session {
  return {
    user: { id: USER_ID, email: 'dana@example.com', name: 'Dana Frost', unitSystem: 'SI' },
    organizations: [
      { id: ORG_ID, name: 'Frost Heating', role },
      { id: OTHER_ORG_ID, name: 'North Ridge Mechanical', role: 'viewer' },
    ],
    currentOrganizationId: ORG_ID,
    devOutbox: true,
  };
}

export function signedOutSession(): Session {
  return { user: null, organizations: [], currentOrganizationId: null, devOutbox: false };
}

/**
 * Lets pending promises (HTTP answers, lazily loaded schema modules) settle. The schema module
 * that AuthStore loads on demand is awaited first: its first load is a network fetch in the test
 * browser, which a fixed number of ticks does not always cover.
 */
export async function settle(rounds = 3): Promise<void> {
  await import('@shared/auth/auth-schemas');
  for (let i = 0; i < rounds; i++) await new Promise((resolve) => setTimeout(resolve, 0));
}
