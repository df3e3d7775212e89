/**
 * Steady-state building heat loss at an outdoor temperature and wind speed: conduction,
 * infiltration, mechanical ventilation and duct loss (docs/methods.md#heat-loss), with the internal-gain credit and
 * the safety factor reported separately so that callers can apply
 * L = max(0, (conduction + infiltration + ventilation)·(1 + duct) − gains) and D = L·(1 + safety).
 *
 * Pure: no I/O. Everything is SI (W, W/K, L/s, °C, K, m/s, cm², m³). Heat loss only: when the
 * outdoor temperature is at or above the indoor design temperature every term is 0.
 */
import type {
  AirLeakage,
  Building,
  Conduction,
  DesignWind,
  DesignWindSource,
  EnvelopeComponent,
  LblStoreys,
  ShieldingClass,
  ThermalMass,
  ThermalMassClass,
} from './building-schemas';
import { DEFAULT_DESIGN_WIND_MS } from './building-schemas';

// ---------------------------------------------------------------------------------------------
// Air: sensible heat

/**
 * Sensible heat of an airflow, W per (L/s·K): q_s = 1.23·Q·Δt. ASHRAE Handbook—Fundamentals,
 * Ch. 18 (Ch. 17 uses the same coefficient); docs/methods.md#air-heat. Derivation [C]: 0.001 m³/s × 1.2 kg/m³ ×
 * 1026 J/(kg·K) ≈ 1.23.
 */
export const SENSIBLE_HEAT_FACTOR_W_PER_LPS_K = 1.23;

/**
 * The traditional IP coefficient, Btu/h per (cfm·°F): q_s = 1.08·cfm·Δt (0.075 lb/ft³ × 60 min/h ×
 * 0.240 Btu/(lb·°F)); ASHRAE Handbook—Fundamentals Ch. 18, docs/methods.md#air-heat. For display only: the
 * engine computes in SI with 1.23.
 */
export const SENSIBLE_HEAT_FACTOR_BTUH_PER_CFM_F = 1.08;

/** Airflow of an air-change rate: Q (L/s) = ACH·V (m³) / 3.6 (docs/methods.md#air-changes). */
export function achToLps(ach: number, volumeM3: number): number {
  return (ach * volumeM3) / 3.6;
}

/** Airflow as air changes per hour: ACH = 3.6·Q (L/s) / V (m³). */
export function lpsToAch(lps: number, volumeM3: number): number {
  return (3.6 * lps) / volumeM3;
}

// ---------------------------------------------------------------------------------------------
// Conduction

/** U-value of an envelope element, W/(m²·K): the U given, or 1/R (R air to air, films included; docs/methods.md#conduction). */
export function componentUValue(component: Pick<EnvelopeComponent, 'uValue' | 'rValue'>): number {
  if (component.uValue !== undefined) return component.uValue;
  if (component.rValue !== undefined) return 1 / component.rValue;
  throw new Error('An envelope element needs a U-value or an R-value');
}

/** Conduction UA of an envelope, W/K: Σ A·U (docs/methods.md#conduction, q = U·A·ΔT). */
export function envelopeUa(components: readonly Pick<EnvelopeComponent, 'areaM2' | 'uValue' | 'rValue'>[]): number {
  let ua = 0;
  for (const c of components) ua += c.areaM2 * componentUValue(c);
  return ua;
}

/** Conduction UA of a building's conduction input, W/K. */
export function conductionUa(conduction: Conduction): number {
  return conduction.mode === 'ua' ? conduction.uaWPerK : envelopeUa(conduction.components);
}

// ---------------------------------------------------------------------------------------------
// Blower door: ACH50 → natural ACH (LBL N-factor)

/** Natural (seasonal-average) air changes from a blower-door ACH50: ACH_nat = ACH50 / N (docs/methods.md#ach50). */
export function ach50ToNatural(ach50: number, nFactor: number): number {
  if (!(nFactor > 0)) throw new RangeError('The N-factor must be greater than 0');
  return ach50 / nFactor;
}

export const nFactorZones = [1, 2, 3, 4] as const;
export type NFactorZone = (typeof nFactorZones)[number];
export const nFactorStoreys = [1, 1.5, 2, 3] as const;
export type NFactorStoreys = (typeof nFactorStoreys)[number];
export const nFactorShieldings = ['well-shielded', 'normal', 'exposed'] as const;
export type NFactorShielding = (typeof nFactorShieldings)[number];

/**
 * LBL N-factor table by climate zone (1 = windiest/coldest map zone … 4), shielding and storeys
 * (1 / 1.5 / 2 / 3). Method: Sherman (1987), "Estimation of infiltration from leakage and climate
 * indicators", Energy and Buildings 10:81–86 [S: formula and dependencies]; the values are
 * docs/methods.md#ach50's table [M: N_zone = 15.5/18.5/21.5/24.5 × storey factor 1.0/0.9/0.8/0.7 × shielding
 * factor 1.2/1.0/0.9, rounded to 0.1 — verify against the publication before relying on them].
 * Keyed by zone, then shielding; each row lists 1 / 1.5 / 2 / 3 storeys.
 */
export const N_FACTOR_TABLE: Readonly<
  Record<NFactorZone, Readonly<Record<NFactorShielding, readonly [number, number, number, number]>>>
> = {
  1: { 'well-shielded': [18.6, 16.7, 14.9, 13.0], normal: [15.5, 14.0, 12.4, 10.9], exposed: [14.0, 12.6, 11.2, 9.8] },
  2: { 'well-shielded': [22.2, 20.0, 17.8, 15.5], normal: [18.5, 16.7, 14.8, 13.0], exposed: [16.7, 15.0, 13.3, 11.7] },
  3: { 'well-shielded': [25.8, 23.2, 20.6, 18.1], normal: [21.5, 19.4, 17.2, 15.1], exposed: [19.4, 17.4, 15.5, 13.5] },
  4: { 'well-shielded': [29.4, 26.5, 23.5, 20.6], normal: [24.5, 22.1, 19.6, 17.2], exposed: [22.1, 19.9, 17.6, 15.4] },
};

/** The N-factor for a climate zone, number of storeys and shielding (`N_FACTOR_TABLE`, [M]). */
export function nFactorFor(zone: NFactorZone, storeys: NFactorStoreys, shielding: NFactorShielding): number {
  const row = N_FACTOR_TABLE[zone][shielding];
  const n = row[nFactorStoreys.indexOf(storeys)];
  if (n === undefined) throw new RangeError(`No N-factor for ${storeys} storeys`);
  return n;
}

/** Rule-of-thumb N-factor when nothing else is known (docs/methods.md#ach50 [S, secondary]). */
export const N_FACTOR_RULE_OF_THUMB = 20;

// ---------------------------------------------------------------------------------------------
// Effective leakage area (ASHRAE Handbook—Fundamentals Ch. 16; docs/methods.md#ela)

export interface ElaOptions {
  /** Flow exponent n of Q = C·Δp^n; 0.65 typical (docs/methods.md#ela [M]). */
  exponent?: number;
  /** Air density, kg/m³; 1.2 as in docs/methods.md#ela's check. */
  airDensityKgM3?: number;
}

/** LBL reference pressure for the effective leakage area, Pa (docs/methods.md#ela, LBL convention [M]). */
export const ELA_REFERENCE_PA = 4;
/** Discharge coefficient of the LBL effective leakage area (docs/methods.md#ela [M]). */
export const ELA_DISCHARGE_COEFFICIENT = 1;
/** Blower-door test pressure of ACH50, Pa. */
export const BLOWER_DOOR_PA = 50;

/**
 * Effective leakage area at 4 Pa (C_D = 1), cm², from a blower-door ACH50 (docs/methods.md#ela):
 * Q50 = ACH50·V/3600; Q4 = Q50·(4/50)^n; A_L = 10 000·Q4·√(ρ/(2·4 Pa))/C_D.
 * Not the Canadian 10 Pa, C_D = 0.611 equivalent leakage area.
 */
export function elaFromAch50(ach50: number, volumeM3: number, options: ElaOptions = {}): number {
  const n = options.exponent ?? 0.65;
  const rho = options.airDensityKgM3 ?? 1.2;
  const q50 = (ach50 * volumeM3) / 3600; // m³/s
  const q4 = q50 * (ELA_REFERENCE_PA / BLOWER_DOOR_PA) ** n;
  return (10_000 * q4 * Math.sqrt(rho / (2 * ELA_REFERENCE_PA))) / ELA_DISCHARGE_COEFFICIENT;
}

// ---------------------------------------------------------------------------------------------
// LBL (Sherman–Grimsrud) basic infiltration model (ASHRAE Handbook—Fundamentals Ch. 16; docs/methods.md#lbl-infiltration)

/**
 * Stack coefficient C_s, (L/s)²/(cm⁴·K), by storeys. Sherman & Grimsrud (1980) basic model,
 * coefficient tables of ASHRAE Handbook—Fundamentals (1989 and later), Ch. 16 [M in docs/methods.md#lbl-infiltration].
 */
export const STACK_COEFFICIENT_SI: Readonly<Record<LblStoreys, number>> = { 1: 0.000145, 2: 0.00029, 3: 0.000435 };

/**
 * Wind coefficient C_w, (L/s)²/(cm⁴·(m/s)²), by shielding class (1 = no obstructions … 5 = very
 * heavy, downtown) and storeys. ASHRAE Handbook—Fundamentals 1989 table, as reproduced in a CRC
 * Press textbook companion [S in docs/methods.md#lbl-infiltration].
 */
export const WIND_COEFFICIENT_SI: Readonly<Record<ShieldingClass, Readonly<Record<LblStoreys, number>>>> = {
  1: { 1: 0.000319, 2: 0.00042, 3: 0.000494 },
  2: { 1: 0.000246, 2: 0.000325, 3: 0.000382 },
  3: { 1: 0.000174, 2: 0.000231, 3: 0.000271 },
  4: { 1: 0.000104, 2: 0.000137, 3: 0.000161 },
  5: { 1: 0.000032, 2: 0.000042, 3: 0.000049 },
};

/**
 * Infiltration airflow, L/s, of the LBL basic model: Q = A_L·√(C_s·|Δt| + C_w·U²), with A_L the
 * effective leakage area (cm²), Δt the indoor–outdoor difference (K) and U the weather-station wind
 * speed (m/s). docs/methods.md#lbl-infiltration
 */
export function lblInfiltrationLps(
  elaCm2: number,
  storeys: LblStoreys,
  shieldingClass: ShieldingClass,
  deltaT: number,
  windMs: number,
): number {
  const cs = STACK_COEFFICIENT_SI[storeys];
  const cw = WIND_COEFFICIENT_SI[shieldingClass][storeys];
  return elaCm2 * Math.sqrt(cs * Math.abs(deltaT) + cw * windMs * windMs);
}

/**
 * Infiltration airflow, L/s, of a building's air-leakage input. ACH and ACH50 modes give a fixed
 * rate (wind and Δt do not change it); the ELA mode follows the LBL model.
 */
export function infiltrationLps(airLeakage: AirLeakage, deltaT: number, windMs: number): number {
  switch (airLeakage.mode) {
    case 'ach':
      return achToLps(airLeakage.ach, airLeakage.volumeM3);
    case 'ach50':
      return achToLps(ach50ToNatural(airLeakage.ach50, airLeakage.nFactor), airLeakage.volumeM3);
    case 'ela':
      return lblInfiltrationLps(airLeakage.elaCm2, airLeakage.storeys, airLeakage.shieldingClass, deltaT, windMs);
  }
}

// ---------------------------------------------------------------------------------------------
// Heat loss

export interface HeatLoss {
  /** Indoor design minus outdoor temperature, K, floored at 0. */
  deltaTK: number;
  infiltrationLps: number;
  /** Mechanical ventilation airflow, L/s (before heat recovery). */
  ventilationLps: number;
  conductionW: number;
  infiltrationW: number;
  /** Ventilation loss after heat recovery, W. */
  ventilationW: number;
  /** Duct loss: ductLossFraction × (conduction + infiltration + ventilation), W. */
  ductW: number;
  /** conduction + infiltration + ventilation + duct, W (before gains and safety factor). */
  totalW: number;
  /** W/K at these conditions; `total` is conduction + infiltration + ventilation (no duct loss). */
  conductanceWPerK: { conduction: number; infiltration: number; ventilation: number; total: number };
  /** The building's internal-gain credit, W (not subtracted from totalW). */
  internalGainsW: number;
  ductLossFraction: number;
  safetyFactorFraction: number;
  /** L = max(0, totalW − internalGainsW), W. */
  loadW: number;
  /**
   * D = (totalW, or L when the building credits its gains at design) × (1 + safety factor), W.
   * Gains are not credited at design unless `creditGainsAtDesign` says so (docs/methods.md#design-load).
   */
  designLoadW: number;
}

/** The building's heat loss at an outdoor temperature (°C) and wind speed (m/s; used by the ELA mode only). */
export function heatLoss(building: Building, outdoorC: number, windMs: number): HeatLoss {
  const deltaTK = Math.max(0, building.indoorDesignC - outdoorC);
  const infLps = infiltrationLps(building.airLeakage, deltaTK, windMs);
  const conductance = {
    conduction: conductionUa(building.conduction),
    infiltration: SENSIBLE_HEAT_FACTOR_W_PER_LPS_K * infLps,
    ventilation:
      SENSIBLE_HEAT_FACTOR_W_PER_LPS_K *
      building.ventilation.flowLps *
      (1 - building.ventilation.heatRecoveryEffectiveness),
    total: 0,
  };
  conductance.total = conductance.conduction + conductance.infiltration + conductance.ventilation;
  const conductionW = conductance.conduction * deltaTK;
  const infiltrationW = conductance.infiltration * deltaTK;
  const ventilationW = conductance.ventilation * deltaTK;
  const ductLossFraction = building.ductLossPct / 100;
  const ductW = (conductionW + infiltrationW + ventilationW) * ductLossFraction;
  const totalW = conductionW + infiltrationW + ventilationW + ductW;
  const safetyFactorFraction = building.safetyFactorPct / 100;
  const loadW = Math.max(0, totalW - building.internalGainsW);
  return {
    deltaTK,
    infiltrationLps: infLps,
    ventilationLps: building.ventilation.flowLps,
    conductionW,
    infiltrationW,
    ventilationW,
    ductW,
    totalW,
    conductanceWPerK: conductance,
    internalGainsW: building.internalGainsW,
    ductLossFraction,
    safetyFactorFraction,
    loadW,
    designLoadW: (building.creditGainsAtDesign ? loadW : totalW) * (1 + safetyFactorFraction),
  };
}

/**
 * The load conductance of a heat loss including the duct-loss factor, UA·(1 + duct), W/K: the slope
 * of the load line, so that L = UA_eff·ΔT − G (docs/methods.md#degree-hours).
 */
export function effectiveConductanceWPerK(loss: Pick<HeatLoss, 'conductanceWPerK' | 'ductLossFraction'>): number {
  return loss.conductanceWPerK.total * (1 + loss.ductLossFraction);
}

// ---------------------------------------------------------------------------------------------
// Design wind

/** The wind values of a set of design conditions that a design-wind choice can use, m/s. */
export interface DesignWindValues {
  coincident99_6?: number | null;
  coldestMonth1?: number | null;
}

export interface ResolvedDesignWind {
  windMs: number;
  /** The source actually used: `default` when the chosen climate value is missing. */
  source: DesignWindSource;
  fellBack: boolean;
}

/**
 * The design wind speed of a building's choice. A climate value that the site lacks falls back to
 * the 6.7 m/s default (`fellBack: true`, for the user to see).
 */
export function resolveDesignWind(choice: DesignWind, wind: DesignWindValues | null | undefined): ResolvedDesignWind {
  switch (choice.source) {
    case 'default':
      return { windMs: DEFAULT_DESIGN_WIND_MS, source: 'default', fellBack: false };
    case 'custom':
      return choice.customMs === undefined
        ? { windMs: DEFAULT_DESIGN_WIND_MS, source: 'default', fellBack: true }
        : { windMs: choice.customMs, source: 'custom', fellBack: false };
    case 'coincident99_6':
    case 'coldestMonth1': {
      const v = wind?.[choice.source];
      return typeof v === 'number' && Number.isFinite(v)
        ? { windMs: v, source: choice.source, fellBack: false }
        : { windMs: DEFAULT_DESIGN_WIND_MS, source: 'default', fellBack: true };
    }
  }
}

// ---------------------------------------------------------------------------------------------
// Thermal mass

/**
 * Effective thermal capacitance per m² of floor, J/(m²·K), by construction class: ISO 13790 classes
 * as listed in docs/methods.md#indoor-temperature [M — verify against ISO 13790 / ISO 52016-1 before relying on them].
 */
export const THERMAL_CAPACITANCE_J_PER_M2K: Readonly<Record<ThermalMassClass, number>> = {
  light: 110_000,
  medium: 165_000,
  heavy: 260_000,
};

/**
 * The building's thermal time constant, hours: τ = C/H (docs/methods.md#indoor-temperature, first-order single node),
 * with C = class capacitance × floor area for the class mode and H the heat-loss conductance (W/K,
 * normally `heatLoss(...).conductanceWPerK.total` at design conditions). The hours mode returns the
 * time constant given.
 */
export function timeConstantHours(thermalMass: ThermalMass, conductanceWPerK: number): number {
  if (thermalMass.mode === 'hours') return thermalMass.timeConstantH;
  if (!(conductanceWPerK > 0)) throw new RangeError('The conductance must be greater than 0 W/K');
  const capacitanceJPerK = THERMAL_CAPACITANCE_J_PER_M2K[thermalMass.class] * thermalMass.floorAreaM2;
  return capacitanceJPerK / conductanceWPerK / 3600;
}
