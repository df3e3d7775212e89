import type { Scenario, SweepAnswer, SweepRowAnswer } from '@shared/scenarios/scenario-schemas';
import { rowKindOfLabel } from '@shared/sweep/sweep';
import { PROJECT_ID, SITE_ID } from '../../projects/testing/project-fixtures';

export const SCENARIO_A = '5a1f7c3e-0b6d-4c1a-9f2e-3d4c5b6a7a01';
export const SCENARIO_B = '5a1f7c3e-0b6d-4c1a-9f2e-3d4c5b6a7a02';
export const SCENARIO_LIST_ID = '5a1f7c3e-0b6d-4c1a-9f2e-3d4c5b6a7aff';

export function aScenario(fields: Partial<Scenario> = {}): Scenario {
  return {
    id: SCENARIO_A,
    projectId: PROJECT_ID,
    name: 'Gas bid',
    climateSiteId: SITE_ID,
    climateSiteName: 'Lakeview station',
    equipmentListId: SCENARIO_LIST_ID,
    equipmentListName: 'Standard line',
    settings: {
      extraDesignC: [],
      discountRatePct: 3,
      studyPeriodYears: 20,
      energyEscalationPctPerYear: 0,
      heatPumpSizing: 'compressor',
      equipmentFamily: null,
      safetyFactorPct: null,
      prices: null,
      optionLabels: null,
      climateBasisYears: null,
      tolerances: { uaPct: 10, airLeakagePct: 25, pricesPct: 15 },
      uncertainty: { draws: 300, seed: 1 },
      rule: null,
    },
    frozenAt: null,
    frozenFromId: null,
    chosenDesignC: null,
    chosenPoint: null,
    version: 1,
    updatedByName: 'Sam Reed',
    createdAt: '2026-11-30T09:00:00.000Z',
    updatedAt: '2026-11-30T09:00:00.000Z',
    ...fields,
  };
}

function row(fields: Partial<SweepRowAnswer> & Pick<SweepRowAnswer, 'label' | 'designC'>): SweepRowAnswer {
  return {
    kind: rowKindOfLabel(fields.label, fields.isGrid ?? false),
    designLoadW: 8000,
    selectedOptionId: '1',
    selectionReason: null,
    capacityAtDesignW: 8800,
    compressorAtDesignW: null,
    installedPrice: '4000.00',
    annualEnergyKWh: 15000,
    annualCost: '700.00',
    runHoursPerYear: 2500,
    backupHoursPerYear: 0,
    backupEnergyKWh: 0,
    unmetHoursPerYear: 0,
    unmetHoursWorstYear: 0,
    unmetEnergyKWhPerYear: 0,
    unmetDegreeHoursPerYear: 0,
    lowestIndoorC: 21,
    worstDropK: 0,
    worstSagC: 0,
    lifeCycleCost: '14000.00',
    isGrid: false,
    unavailableReason: null,
    costUnavailableReason: null,
    reliabilityNote: null,
    annualExceedanceProbability: null,
    recordExceedanceShare: null,
    lifetimeExceedanceProbability: null,
    lifetimeYears: null,
    costPerAvoidedUnmetHour: null,
    costPerAvoidedWorstYearHour: null,
    unmetHoursPerYearP10: null,
    unmetHoursPerYearP90: null,
    unmetHoursWorstYearP10: null,
    unmetHoursWorstYearP90: null,
    lifeCycleCostP10: null,
    lifeCycleCostP90: null,
    selectionChangeShare: null,
    ...fields,
  };
}

/**
 * An invented sweep of three named design values for the screens (not engine output): a 9 kW furnace at −17 °C that
 * falls behind 12 h in an average year, a 12 kW one at −24 °C, and the 12 kW one at the 50-year −32 °C.
 */
export function aSweepAnswer(fields: Partial<SweepAnswer> = {}): SweepAnswer {
  return {
    scenarioId: SCENARIO_A,
    inputHash: 'f'.repeat(64),
    cached: false,
    frozen: false,
    computedAt: '2026-11-30T09:05:00.000Z',
    climateSiteName: 'Lakeview station',
    equipmentListName: 'Standard line',
    currency: 'USD',
    hasRecord: true,
    years: [2001, 2002, 2003, 2004],
    timeConstantH: 40,
    designWindMs: 6.7,
    indoorDesignC: 21,
    discountRatePct: 3,
    studyPeriodYears: 20,
    energyEscalationPctPerYear: 0,
    heatPumpSizing: 'compressor',
    selectionRule: 'smallest-capacity',
    warnings: [],
    options: [
      {
        id: '1',
        label: 'Furnace 9 kW',
        kind: 'furnace',
        fuel: 'gas',
        lifeYears: 20,
        installedPrice: '4000.00',
        capacityCurve: [
          { outdoorC: 20, capacityW: 9000 },
          { outdoorC: -45, capacityW: 9000 },
        ],
      },
      {
        id: '2',
        label: 'Furnace 12 kW',
        kind: 'furnace',
        fuel: 'gas',
        lifeYears: 20,
        installedPrice: '4600.00',
        capacityCurve: [
          { outdoorC: 20, capacityW: 12000 },
          { outdoorC: -45, capacityW: 12000 },
        ],
      },
    ],
    rows: [
      row({
        label: '99 %',
        designC: -17,
        designLoadW: 8800,
        selectedOptionId: '1',
        capacityAtDesignW: 9000,
        installedPrice: '4000.00',
        lifeCycleCost: '14400.00',
        unmetHoursPerYear: 12,
        unmetHoursWorstYear: 40,
        unmetDegreeHoursPerYear: 30,
        lowestIndoorC: 19.2,
        worstDropK: 1.8,
        worstSagC: 1.8,
      }),
      row({
        label: '-20.5 °C',
        designC: -20.5,
        isGrid: true,
        designLoadW: 9600,
        selectedOptionId: '2',
        capacityAtDesignW: 12000,
        installedPrice: '4600.00',
        lifeCycleCost: '15000.00',
      }),
      row({
        label: 'Extreme mean',
        designC: -24,
        designLoadW: 10300,
        selectedOptionId: '2',
        capacityAtDesignW: 12000,
        installedPrice: '4600.00',
        lifeCycleCost: '15000.00',
      }),
      row({
        label: '50-year',
        designC: -32,
        designLoadW: 12000,
        selectedOptionId: '2',
        capacityAtDesignW: 12000,
        installedPrice: '4600.00',
        lifeCycleCost: '15000.00',
      }),
    ],
    loadDuration: {
      points: [
        { hoursPerYear: 1, loadW: 11500, outdoorC: -30 },
        { hoursPerYear: 20, loadW: 9200, outdoorC: -19 },
        { hoursPerYear: 2000, loadW: 4000, outdoorC: 0 },
        { hoursPerYear: 5000, loadW: 500, outdoorC: 15 },
      ],
    },
    notes: [],
    odds: null,
    uncertainty: null,
    ...fields,
  };
}
