/**
 * The sweep's inputs and outputs: the building, the equipment options, prices, economics, the design
 * values the ladder is built from and (optionally) an hourly record; and one row per design
 * temperature with the unit that would be installed and its figures (docs/methods.md#hourly,
 * #life-cycle-cost, #warnings). Types and defaults only; the steps are in the other `sweep-*` files.
 */
import type { Building } from '../building/building-schemas';
import type { HourlySeries } from '../climate/hourly-series';
import type { PreparedSeries } from '../climate/prepared-series';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import type { EnergyPrices } from '../money/energy-prices';
import type { SweepRecordIndex } from './sweep-bins';

/** An equipment option with an identifier the sweep reports back. */
export type SweepOption = EquipmentOption & { id: string };

/**
 * How a heat pump is counted against the design load (docs/methods.md#heat-pump-sizing):
 * `compressor` (default) — the compressor alone at the design temperature must cover it, backup heat
 * serves colder hours and emergencies; `with-backup` — compressor and backup together cover it.
 */
export const heatPumpSizings = ['compressor', 'with-backup'] as const;
export type HeatPumpSizing = (typeof heatPumpSizings)[number];
export const DEFAULT_HEAT_PUMP_SIZING: HeatPumpSizing = 'compressor';

/** Equipment families: a scenario holds one by default (docs/methods.md#selection). */
export const equipmentFamilies = ['fuel-fired', 'heat-pump', 'electric'] as const;
export type EquipmentFamily = (typeof equipmentFamilies)[number];

/** How the installed unit is chosen among those that cover the design load (docs/methods.md#selection). */
export type SelectionRule = 'smallest-capacity' | 'lowest-life-cycle-cost' | 'lowest-installed-price';

/** Life-cycle cost settings (NIST Handbook 135; docs/methods.md#life-cycle-cost). */
export interface SweepEconomics {
  /** Real discount rate, % per year. */
  discountRatePct: number;
  /** One study period for every option, years (default 20). */
  studyPeriodYears?: number;
  /** Real escalation of energy prices, % per year (default 0). */
  energyEscalationPctPerYear?: number;
}
export const DEFAULT_STUDY_PERIOD_YEARS = 20;

/** The design values the ladder is built from: computed design conditions or a published subset. */
export interface SweepDesignValues {
  heating: { db99: number; db99_6: number };
  extremeMin?: {
    mean?: number | null;
    /** Sample standard deviation of the yearly minima, K (for the odds of a colder night). */
    sd?: number | null;
    returnPeriod?: { '5'?: number | null; '10'?: number | null; '20'?: number | null; '50'?: number | null };
  };
}

/**
 * An hourly record: a raw series or a prepared one, and the years to use. Without `qualifyingYears`
 * the years that meet the completeness rule of `prepareSeries` are used.
 */
export type SweepRecord =
  | { series: HourlySeries; qualifyingYears?: readonly number[] }
  | { prepared: PreparedSeries; qualifyingYears?: readonly number[] };

export interface SweepInput {
  building: Building;
  options: readonly SweepOption[];
  prices: EnergyPrices;
  economics: SweepEconomics;
  designConditions: SweepDesignValues;
  /** Design wind speed, m/s (used for the design load, and for every hour without a wind value). */
  designWindMs: number;
  /** An hourly record, or one indexed once with `indexSweepRecord` (faster when it is reused). */
  record?: SweepRecord | SweepRecordIndex | null;
  /** Extra design temperatures, °C. */
  extraDesignC?: readonly number[];
  /** Default `compressor`. */
  heatPumpSizing?: HeatPumpSizing;
}

/**
 * What a ladder row stands for: the 99 % and 99.6 % heating values, the extreme-annual mean minimum,
 * the 5-, 10-, 20- and 50-year return-period minima, an extra temperature the user asked for, or a
 * point of the 0.5 °C grid. Code finds rows by kind; `label` is for display only.
 */
export const rowKinds = ['p99', 'p996', 'annualMin', 'rp5', 'rp10', 'rp20', 'rp50', 'extra', 'grid'] as const;
export type RowKind = (typeof rowKinds)[number];
/** The kinds of the return-period rows. */
export const RETURN_PERIOD_KINDS: ReadonlySet<RowKind> = new Set<RowKind>(['rp5', 'rp10', 'rp20', 'rp50']);

/** The display labels of the named design values, by kind (extra and grid rows show their temperature). */
export const NAMED_ROW_LABELS = {
  p99: '99 %',
  p996: '99.6 %',
  annualMin: 'Extreme mean',
  rp5: '5-year',
  rp10: '10-year',
  rp20: '20-year',
  rp50: '50-year',
} as const satisfies Partial<Record<RowKind, string>>;

/**
 * The kind of a row kept from before rows carried one (stored reports and cached results): its
 * label among the named ones, else an extra temperature, or a grid point.
 */
export function rowKindOfLabel(label: string, isGrid: boolean): RowKind {
  if (isGrid) return 'grid';
  for (const [kind, named] of Object.entries(NAMED_ROW_LABELS)) if (named === label) return kind as RowKind;
  return 'extra';
}

export interface SweepRow {
  kind: RowKind;
  /** '99 %', '99.6 %', 'Extreme mean', '5-year' … '50-year', or the temperature ('-23.5 °C'): display only. */
  label: string;
  designC: number;
  /** D = L(design T, design wind) × (1 + safety), W (docs/methods.md#design-load). */
  designLoadW: number;
  selectedOptionId: string | null;
  /** Why no option was selected (null when one was). */
  selectionReason: string | null;
  /** Total capacity of the selected option at the design temperature (backup included), W. */
  capacityAtDesignW: number | null;
  /** Heat pumps: the compressor's capacity at the design temperature, W (null for other kinds). */
  compressorAtDesignW: number | null;
  installedPrice: string | null;
  /** Purchased energy per average qualifying year, with cycling losses, kWh. */
  annualEnergyKWh: number | null;
  /** annualEnergy × price per kWh of the fuel, per average year, rounded to cents. */
  annualCost: string | null;
  /** Equivalent full-load hours per average year: Σ min(1, L/Q) with Q the compressor for a heat pump. */
  runHoursPerYear: number | null;
  /** Heat pumps: hours per average year in which the compressor alone falls short and backup runs. */
  backupHoursPerYear: number | null;
  /** Heat pumps: heat (= electricity) from backup per average year, kWh. */
  backupEnergyKWh: number | null;
  /** Hours per average year in which the whole unit (backup included) falls short. */
  unmetHoursPerYear: number | null;
  unmetHoursWorstYear: number | null;
  /** Σ max(0, L − capacity) × 1 h per average year, kWh. */
  unmetEnergyKWhPerYear: number | null;
  /**
   * Σ max(0, L − capacity)/UA per average year, K·h, with UA the hour's load conductance including
   * duct loss (docs/methods.md#degree-hours).
   */
  unmetDegreeHoursPerYear: number | null;
  /** The lowest indoor temperature over the record, °C (docs/methods.md#indoor-temperature). */
  lowestIndoorC: number | null;
  /** Set-point minus `lowestIndoorC`, K. */
  worstDropK: number | null;
  /** Deprecated (see the README): the same as `worstDropK`, kept for one release. */
  worstSagC: number | null;
  /**
   * Installed price + replacements − residual value + annual cost × UPV*(d, e, N) over the study
   * period, rounded to cents (docs/methods.md#life-cycle-cost).
   */
  lifeCycleCost: string | null;
  isGrid: boolean;
  /** Why the hour-based figures are null (no record, no option selected). */
  unavailableReason: string | null;
  /** Why the cost figures are null (no price for the fuel). */
  costUnavailableReason: string | null;
  /** Set on return-period rows from a short record: how far to trust the design temperature. */
  reliabilityNote: string | null;
}

/** Something the user should know about a sweep's figures. */
export interface SweepWarning {
  code:
    'short-record' | 'return-periods-unreliable' | 'fifty-year-short-record' | 'no-return-periods' | 'mixed-families';
  message: string;
}

export interface SweepResult {
  rows: SweepRow[];
  /** Qualifying years simulated (empty without a record). */
  years: number[];
  /** Thermal time constant used by the indoor-temperature model, h. */
  timeConstantH: number;
  heatPumpSizing: HeatPumpSizing;
  selectionRule: SelectionRule;
  studyPeriodYears: number;
  energyEscalationPctPerYear: number;
  warnings: SweepWarning[];
}
