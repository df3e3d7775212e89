/** Made-up buildings, sites and equipment lists for the client specs (values in SI). */
import type { Building } from '@shared/building/building-schemas';
import type { ClimateSite } from '@shared/climate/climate-schemas';
import type { EquipmentList, EquipmentOption } from '@shared/equipment/equipment-schemas';
import { anHourlySite } from '../../climate/testing/climate-fixtures';

export const LIST_ID = '9c8b7a6f-5e4d-4c3b-8a29-180f0e0d0c0b';
export const OTHER_LIST_ID = '9c8b7a6f-5e4d-4c3b-8a29-180f0e0d0c0c';

/** A building with round numbers: UA 200 W/K, no infiltration or ventilation, so the loss is UA·ΔT. */
export function aBuilding(fields: Partial<Building> = {}): Building {
  return {
    indoorDesignC: 21,
    conduction: { mode: 'ua', uaWPerK: 200 },
    airLeakage: { mode: 'ach', ach: 0, volumeM3: 300 },
    designWind: { source: 'default' },
    ventilation: { flowLps: 0, heatRecoveryEffectiveness: 0 },
    ductLossPct: 0,
    safetyFactorPct: 0,
    internalGainsW: 0,
    creditGainsAtDesign: false,
    thermalMass: { mode: 'class', class: 'medium', floorAreaM2: 150 },
    ...fields,
  };
}

/** An hourly site with the 99 % heating dry-bulb at −17.5 °C and the 99.6 % one at −20 °C. */
export function aSite(id: string): ClimateSite {
  return anHourlySite({ id });
}

export function aHeatPump(fields: Partial<EquipmentOption> = {}): EquipmentOption {
  return {
    kind: 'heat-pump',
    label: 'Cold-climate heat pump 3 t',
    installedPrice: '14500.00',
    lifeYears: 18,
    fuel: 'electricity',
    capacity8_3W: 10_500,
    cop8_3: 3.8,
    capacityM8_3W: 8_000,
    copM8_3: 2.4,
    backupW: 5_000,
    extrapolate: false,
    defrostBand: false,
    ...fields,
  } as EquipmentOption;
}

export function aFurnace(): EquipmentOption {
  return {
    kind: 'furnace',
    label: 'Gas furnace 60k',
    installedPrice: '6200.00',
    lifeYears: 20,
    fuel: 'gas',
    efficiency: 0.96,
    outputW: 16_900,
  };
}

export function anEquipmentList(options: EquipmentOption[] = [aHeatPump(), aFurnace()]): EquipmentList {
  return {
    id: LIST_ID,
    name: 'Spring price list',
    optionCount: options.length,
    version: 2,
    updatedAt: '2026-11-20T10:00:00.000Z',
    options,
  };
}

export function someEquipmentListSummaries() {
  return [
    { id: LIST_ID, name: 'Spring price list', optionCount: 2, version: 2, updatedAt: '2026-11-20T10:00:00.000Z' },
    { id: OTHER_LIST_ID, name: 'Oil replacements', optionCount: 1, version: 1, updatedAt: '2026-11-21T10:00:00.000Z' },
  ];
}
