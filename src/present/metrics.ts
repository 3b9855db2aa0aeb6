/**
 * The build-metric table, written once: each quantity a build comparison shows, its label, what
 * kind of quantity it is (how it is shown) and which way is better. Used by the app's compare
 * panel, the `compare` command and the report. Pure: no React, three or DOM.
 */
import type { BuildMetrics, MetricName } from '../core/analysis/builds';
import { DEG_PER_RAD, NO_VALUE, changeText, fixed, quantityText, unitSymbol, valueText, type DisplayKind, type UnitSystem } from './units';

/** How a metric is shown: a display kind of units.ts, or a direction (degrees counter-clockwise from the nose). */
export type MetricKind = DisplayKind | 'direction';

export interface MetricRow {
  readonly key: MetricName;
  readonly label: string;
  readonly kind: MetricKind;
  /** Which way is better for stability: a larger value, a smaller one, or neither (a place or a direction). */
  readonly better: 'higher' | 'lower' | 'none';
}

/** Every quantity of a comparison, in the order shown. Angles are on a level tilt table, from level. */
export const BUILD_METRICS: readonly MetricRow[] = [
  { key: 'ssf', label: 'SSF (T/2h)', kind: 'ratio', better: 'higher' },
  { key: 'cgHeightM', label: 'CG height with payload', kind: 'length', better: 'lower' },
  { key: 'trackMeanM', label: 'mean track', kind: 'length', better: 'higher' },
  { key: 'noseDownLiftRad', label: 'nose down: first lift (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'noseDownTipRad', label: 'nose down: tip (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'tailDownLiftRad', label: 'tail down: first lift (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'tailDownTipRad', label: 'tail down: tip (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'leftDownLiftRad', label: 'left down: first lift (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'leftDownTipRad', label: 'left down: tip (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'rightDownLiftRad', label: 'right down: first lift (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'rightDownTipRad', label: 'right down: tip (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'weakestDownhillRad', label: 'weakest direction (downhill, from the nose)', kind: 'direction', better: 'none' },
  { key: 'weakestTipRad', label: 'weakest direction: tip (tilt from level)', kind: 'angle', better: 'higher' },
  { key: 'passFirstUnloadM', label: 'pass: first wheel light at', kind: 'distance', better: 'higher' },
  { key: 'passFirstLiftM', label: 'pass: first lift at', kind: 'distance', better: 'higher' },
  { key: 'passTipM', label: 'pass: tips at', kind: 'distance', better: 'higher' },
  { key: 'passMinForceAngleRad', label: 'pass: smallest force-angle margin', kind: 'angle', better: 'higher' },
  { key: 'passMinEnergyM', label: 'pass: energy margin there (CG rise to tip)', kind: 'short', better: 'higher' },
  { key: 'passMinClearanceM', label: 'pass: least underbody gap', kind: 'short', better: 'higher' },
];

/**
 * The comparison's words row (not a number, so not in BUILD_METRICS): how each build's pass ends,
 * hang-up (where, on what), slip or tip (passEndWords in words.ts gives the cell).
 */
export const PASS_END_LABEL = 'pass: hangs up, slips or tips? (where, on what)';

/** The unit shown beside a metric's label ('' for a ratio). */
export function metricUnit(kind: MetricKind, units: UnitSystem): string {
  return kind === 'direction' ? '°' : unitSymbol(kind, units);
}

/** A direction change, the short way round (−180° to 180°). */
const wrapRad = (a: number): number => Math.atan2(Math.sin(a), Math.cos(a));

/**
 * A metric's value as text, rounded for its kind, without its unit (the label carries it);
 * NO_VALUE where it does not apply. `signed`: a change, with + or − (none when it rounds to zero).
 */
export function metricValue(kind: MetricKind, si: number | null | undefined, units: UnitSystem, signed = false): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return NO_VALUE;
  if (kind === 'direction') {
    const d = signed ? wrapRad(si) * DEG_PER_RAD : ((((si * DEG_PER_RAD) % 360) + 360) % 360);
    const t = fixed(d, 0);
    if (!signed) return t === '360' ? '0' : t;
    return /^-?0$/.test(t) ? '0' : d > 0 ? `+${t}` : t;
  }
  return signed ? changeText(kind, si, units, false) : valueText(kind, si, units);
}

/** A metric's value with its unit ("31.2°", "0.812 m"); NO_VALUE where it does not apply. */
export function metricText(kind: MetricKind, si: number | null | undefined, units: UnitSystem): string {
  if (kind === 'direction') {
    const v = metricValue(kind, si, units);
    return v === NO_VALUE ? v : `${v}°`;
  }
  return quantityText(kind, si, units);
}

/** Whether a change is for the better (+1), the worse (−1), or neither (0), by the metric's direction. */
export function changeSense(row: MetricRow, change: number | null | undefined): -1 | 0 | 1 {
  if (change === null || change === undefined || !Number.isFinite(change) || change === 0 || row.better === 'none') return 0;
  return (change > 0) === (row.better === 'higher') ? 1 : -1;
}

/** The JSON key of a metric: degrees for angles ("…Deg"), metres kept ("…M"). */
export function metricJsonKey(name: MetricName): string {
  return name.endsWith('Rad') ? `${name.slice(0, -3)}Deg` : name;
}

export type { BuildMetrics, MetricName };

/** The note under every comparison table. */
export const METRICS_NOTE =
  'Tilt angles on a level tilt table, from level; the weakest direction is the downhill direction, counter-clockwise from the nose (90° left side down); the pass on the scenario path (— where no wheel lifts or nothing tips).';
