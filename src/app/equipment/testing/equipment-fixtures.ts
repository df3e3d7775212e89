/** Made-up equipment lists for the client specs (values in SI, prices as decimal text). */
import type { UnitSystem } from '@shared/units/units';
import type { Role } from '@shared/auth/roles';
import type { EquipmentList, EquipmentListSummary, EquipmentOption } from '@shared/equipment/equipment-schemas';
import { signedInSession } from '../../testing/test-sessions';

export const LIST_ID = '9c1d2e3f-4a5b-4c6d-8e7f-0a1b2c3d4e00';

/** The id of the n-th test list (n below 256). */
export function listId(n: number): string {
  return `9c1d2e3f-4a5b-4c6d-8e7f-0a1b2c3d4e${n.toString(16).padStart(2, '0')}`;
}

export function aSummary(name: string, fields: Partial<EquipmentListSummary> = {}): EquipmentListSummary {
  return { id: LIST_ID, name, optionCount: 0, version: 1, updatedAt: '2026-02-03T10:00:00.000Z', ...fields };
}

export function aFurnace(fields: Partial<Extract<EquipmentOption, { kind: 'furnace' }>> = {}): EquipmentOption {
  return {
    kind: 'furnace',
    label: 'Condensing gas furnace 80k',
    fuel: 'gas',
    efficiency: 0.96,
    outputW: 23447,
    installedPrice: '8450.00',
    lifeYears: 20,
    ...fields,
  };
}

export function aHeatPump(fields: Partial<Extract<EquipmentOption, { kind: 'heat-pump' }>> = {}): EquipmentOption {
  return {
    kind: 'heat-pump',
    label: 'Cold-climate heat pump 3 ton',
    fuel: 'electricity',
    capacity8_3W: 10550,
    cop8_3: 3.6,
    capacityM8_3W: 7030,
    copM8_3: 2.4,
    backupW: 5000,
    extrapolate: false,
    defrostBand: true,
    cutoutC: -25,
    installedPrice: '14200.00',
    lifeYears: 15,
    ...fields,
  };
}

export function aList(options: EquipmentOption[], fields: Partial<EquipmentList> = {}): EquipmentList {
  return {
    id: LIST_ID,
    name: 'Offers for 2026',
    optionCount: options.length,
    version: 3,
    updatedAt: '2026-02-03T10:00:00.000Z',
    options,
    ...fields,
  };
}

/** A session for `role` whose user works in `unitSystem`. */
export function sessionIn(role: Role, unitSystem: UnitSystem) {
  const session = signedInSession(role);
  return { ...session, user: session.user && { ...session.user, unitSystem } };
}
