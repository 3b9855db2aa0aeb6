import type { UnitSystem } from './types';

/**
 * Unit conversion between scenario files and the SI core.
 *
 * Exact definitions (International Yard and Pound Agreement, 1959): 1 yd = 0.9144 m, so
 * 1 in = 0.0254 m and 1 ft = 0.3048 m; 1 lb = 0.45359237 kg. The pound-force is the weight of
 * one pound under standard gravity gn = 9.80665 m/s² (3rd CGPM, 1901):
 * 1 lbf = 0.45359237 × 9.80665 N = 4.4482216152605 N exactly.
 */
export const M_PER_IN = 0.0254;
export const M_PER_FT = 0.3048;
export const KG_PER_LB = 0.45359237;
/** Standard acceleration of gravity (m/s²), 3rd CGPM 1901. */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
export const N_PER_LBF = 4.4482216152605;
export const RAD_PER_DEG = Math.PI / 180;

/**
 * What a number in a scenario file measures.
 * - `length`: m | in
 * - `mass`: kg | lb
 * - `stiffness`: N/m | lbf/in (wheel rate, tyre stiffness)
 * - `rollStiffness`: N·m/deg | lbf·ft/deg (anti-roll bars); the core holds N·m/rad
 * - `angle`: deg in both systems; the core holds rad
 * - `ratio`: no unit (friction coefficient, counts)
 */
export type QuantityKind = 'length' | 'mass' | 'stiffness' | 'rollStiffness' | 'angle' | 'ratio';

/** Factor from the unit-system's file unit to the metric file unit (1 for metric). */
export function metricPerFileUnit(kind: QuantityKind, units: UnitSystem): number {
  if (units === 'metric') return 1;
  switch (kind) {
    case 'length':
      return M_PER_IN;
    case 'mass':
      return KG_PER_LB;
    case 'stiffness':
      return N_PER_LBF / M_PER_IN;
    case 'rollStiffness':
      return N_PER_LBF * M_PER_FT;
    default:
      return 1;
  }
}

/** Factor from the metric file unit to the core's SI unit (degrees become radians). */
export function siPerMetricFileUnit(kind: QuantityKind): number {
  if (kind === 'angle') return RAD_PER_DEG;
  // N·m per degree → N·m per radian: a moment per degree is 180/π times as much per radian.
  if (kind === 'rollStiffness') return 1 / RAD_PER_DEG;
  return 1;
}

/** A file number (in `units`) to the core's SI value. */
export function toSI(kind: QuantityKind, value: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  const s = siPerMetricFileUnit(kind);
  return k === 1 ? value * s : value * k * s;
}

/** A core SI value to the file number in `units`. */
export function fromSI(kind: QuantityKind, valueSI: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  const s = siPerMetricFileUnit(kind);
  return k === 1 ? valueSI / s : valueSI / s / k;
}

/** A metric file number (m, kg, N/m, N·m/deg, deg) to the same quantity in `units`. */
export function metricToFileUnits(kind: QuantityKind, metricValue: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  return k === 1 ? metricValue : metricValue / k;
}

const LABELS: Readonly<Record<UnitSystem, Readonly<Record<QuantityKind, string>>>> = {
  metric: { length: 'm', mass: 'kg', stiffness: 'N/m', rollStiffness: 'N·m/deg', angle: 'deg', ratio: '' },
  imperial: { length: 'in', mass: 'lb', stiffness: 'lbf/in', rollStiffness: 'lbf·ft/deg', angle: 'deg', ratio: '' },
};

/** The unit as written in messages ("m", "in", "lbf·ft/deg"); "" for a plain number. */
export function unitLabel(kind: QuantityKind, units: UnitSystem): string {
  return LABELS[units][kind];
}
