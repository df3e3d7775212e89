/**
 * What the live heat-loss panel shows, computed with the shared engine: the breakdown at the design
 * temperature, the heat loss across outdoor temperatures, and each equipment option's output with
 * its balance point.
 */
import type { Building } from '@shared/building/building-schemas';
import { heatLoss, type HeatLoss } from '@shared/building/heat-loss';
import { balancePoint, capacityAt } from '@shared/equipment/capacity';
import type { EquipmentOption } from '@shared/equipment/equipment-schemas';
import { formatQuantity, type UnitSystem } from '@shared/units/units';
import { COLD, EMBER, EQUIPMENT_COLOURS, INK } from '../../charts/chart-theme';
import { formatPower } from '../building-units';

/** The coldest temperature the chart reaches when the site gives nothing colder, °C. */
export const CHART_FLOOR_C = -30;

export interface BreakdownRow {
  key: 'conduction' | 'infiltration' | 'ventilation' | 'duct' | 'gains' | 'total' | 'design';
  label: string;
  watts: number;
  text: string;
  colour: string;
}

export interface EquipmentLine {
  label: string;
  kind: EquipmentOption['kind'];
  colour: string;
  /** [°C, W] from cold to warm: the compressor for a heat pump, the rated output otherwise. */
  points: [number, number][];
  /** Heat pumps only: where the compressor meets the load, °C (null when it never does in range). */
  balanceC: number | null;
  /** The load at the balance point, W. */
  balanceW: number | null;
  /** What it gives at the design temperature, W (compressor for heat pumps). */
  atDesignW: number;
  backupW: number;
}

export interface HeatLossModel {
  outdoorC: number;
  windMs: number;
  result: HeatLoss;
  rows: BreakdownRow[];
  designLoadText: string;
  /** [°C, W] of the load (after gains, before the safety factor) from the coldest temperature up to indoor. */
  loadCurve: [number, number][];
  /** The same with the safety factor, when there is one. */
  designCurve: [number, number][] | null;
  equipment: EquipmentLine[];
  rangeC: { min: number; max: number };
}

function percentText(value: number): string {
  return `${Number(value.toFixed(1))} %`;
}

/** The temperatures sampled for the curves: every 0.5 K from `min` up to `max`, both included. */
export function sampleTemperatures(min: number, max: number): number[] {
  const out: number[] = [];
  const start = Math.floor(min * 2) / 2;
  for (let t = start; t < max; t += 0.5) out.push(t);
  out.push(max);
  return out;
}

export function heatLossModel(
  building: Building,
  outdoorC: number,
  windMs: number,
  options: readonly EquipmentOption[],
  coldestC: number | null,
  system: UnitSystem,
): HeatLossModel {
  const r = heatLoss(building, outdoorC, windMs);
  const p = (w: number) => formatPower(w, system);
  const rows: BreakdownRow[] = [
    { key: 'conduction', label: 'Conduction', watts: r.conductionW, text: p(r.conductionW), colour: EMBER },
    { key: 'infiltration', label: 'Infiltration', watts: r.infiltrationW, text: p(r.infiltrationW), colour: EMBER },
    { key: 'ventilation', label: 'Ventilation', watts: r.ventilationW, text: p(r.ventilationW), colour: EMBER },
    {
      key: 'duct',
      label: `Duct loss (${percentText(building.ductLossPct)})`,
      watts: r.ductW,
      text: p(r.ductW),
      colour: EMBER,
    },
    { key: 'total', label: 'Total heat loss', watts: r.totalW, text: p(r.totalW), colour: INK },
  ];
  if (r.internalGainsW > 0) {
    rows.push({
      key: 'gains',
      label: 'Internal-gain credit',
      watts: -r.internalGainsW,
      text: `−${p(r.internalGainsW)}`,
      colour: COLD,
    });
  }
  rows.push({
    key: 'design',
    label: `Design load (sizing margin ${percentText(building.safetyFactorPct)})`,
    watts: r.designLoadW,
    text: p(r.designLoadW),
    colour: EMBER,
  });

  const min = Math.min(coldestC ?? CHART_FLOOR_C, outdoorC) - 2;
  const max = Math.max(building.indoorDesignC, outdoorC + 1);
  const temps = sampleTemperatures(min, max);
  const loadCurve = temps.map((t): [number, number] => [t, heatLoss(building, t, windMs).loadW]);
  const safety = 1 + building.safetyFactorPct / 100;
  const designCurve =
    building.safetyFactorPct > 0 ? loadCurve.map(([t, w]): [number, number] => [t, w * safety]) : null;

  const equipment = options.map((option, i): EquipmentLine => {
    const colour = EQUIPMENT_COLOURS[i % EQUIPMENT_COLOURS.length] ?? INK;
    const primary = (t: number) => {
      const c = capacityAt(option, t);
      return option.kind === 'heat-pump' ? c.compressorW : c.totalW;
    };
    const isHeatPump = option.kind === 'heat-pump';
    const balanceC = isHeatPump ? balancePoint(option, building, windMs, { minC: min, maxC: max }) : null;
    return {
      label: option.label,
      kind: option.kind,
      colour,
      points: isHeatPump
        ? temps.map((t): [number, number] => [t, primary(t)])
        : [
            [min, primary(min)],
            [max, primary(max)],
          ],
      balanceC,
      balanceW: balanceC === null ? null : heatLoss(building, balanceC, windMs).loadW,
      atDesignW: primary(outdoorC),
      backupW: isHeatPump ? option.backupW : 0,
    };
  });

  return {
    outdoorC,
    windMs,
    result: r,
    rows,
    designLoadText: p(r.designLoadW),
    loadCurve,
    designCurve,
    equipment,
    rangeC: { min, max },
  };
}

/** One plain line per option: its output at the design temperature and, for heat pumps, the balance point. */
export function equipmentSummary(line: EquipmentLine, model: HeatLossModel, system: UnitSystem): string {
  const at = formatPower(line.atDesignW, system);
  const design = formatQuantity('temperature', model.outdoorC, system);
  if (line.kind !== 'heat-pump') return `${at} output at any outdoor temperature.`;
  const balance =
    line.balanceC === null
      ? 'no balance point in the range shown'
      : `balance point ${formatQuantity('temperature', line.balanceC, system)}`;
  const short = model.result.loadW - line.atDesignW;
  const backup = line.backupW > 0 ? `; backup ${formatPower(line.backupW, system)}` : '';
  const gap = short > 0 ? `, ${formatPower(short, system)} short of the load` : '';
  return `${at} from the compressor at ${design}${gap}; ${balance}${backup}.`;
}
