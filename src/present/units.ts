/**
 * Display units: the one table of exact factors between the core's SI values and what a reader
 * sees, for the app, the command line and the report alike. Pure: no React, three or DOM.
 *
 * Exact definitions (International Yard and Pound Agreement, 1959): 1 in = 0.0254 m,
 * 1 ft = 0.3048 m, 1 lb = 0.45359237 kg. The pound-force is the weight of one pound under
 * standard gravity gn = 9.80665 m/s² (3rd CGPM, 1901): 1 lbf = 0.45359237 × 9.80665 N
 * = 4.4482216152605 N exactly. One degree is π/180 rad.
 *
 * The trade's customary sub-units: travel, clearance, tyre width and energy margins in mm or in;
 * body dimensions in m or in; distance along a path in m or ft; forces in kN or lbf (one force
 * unit per system, everywhere); spring rates in N/mm or lbf/in; anti-roll bars in N·m/deg or
 * lbf·ft/deg; masses and scale readings in kg or lb.
 *
 * Rounding (what the method can tell): angles to 0.1°, loads (forces and scale readings) to
 * 3 significant figures. JSON output keeps full precision and never passes through here.
 */
import type { UnitSystem } from '../core/scenario/types';

export type { UnitSystem };

export const M_PER_IN = 0.0254;
export const M_PER_FT = 0.3048;
export const KG_PER_LB = 0.45359237;
/** Standard acceleration of gravity (m/s²), 3rd CGPM 1901: a scale reading is force / gn. */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
export const N_PER_LBF = KG_PER_LB * STANDARD_GRAVITY_M_PER_S2;
export const RAD_PER_DEG = Math.PI / 180;
export const DEG_PER_RAD = 180 / Math.PI;

/** Degrees to radians and back (for inputs typed in degrees and for JSON output). */
export const degToRad = (deg: number): number => deg * RAD_PER_DEG;
export const radToDeg = (rad: number): number => rad * DEG_PER_RAD;

/**
 * What a displayed number measures.
 * - `length`: body and vehicle dimensions, positions (m | in)
 * - `short`: suspension travel, clearance, tyre width, energy margin (mm | in)
 * - `distance`: distance along a path (m | ft)
 * - `mass`: kg | lb
 * - `force`: a load as a force (kN | lbf)
 * - `scale`: a load as a corner scale reads it, force / gn (kg | lb)
 * - `stiffness`: wheel rate, tyre stiffness (N/mm | lbf/in)
 * - `rollStiffness`: anti-roll bar (N·m/deg | lbf·ft/deg); SI is N·m/rad
 * - `angle`: degrees in both; SI is rad
 * - `ratio`: no unit (SSF, friction)
 */
export type DisplayKind = 'length' | 'short' | 'distance' | 'mass' | 'force' | 'scale' | 'stiffness' | 'rollStiffness' | 'angle' | 'ratio';

/** How a displayed number is rounded: fixed decimals or significant figures. */
export type Rounding = { readonly decimals: number } | { readonly significant: number };

export interface DisplayUnit {
  /** "kN", "in", "°" … ('' for a plain ratio). */
  readonly symbol: string;
  /** Display value = SI value × perSI. */
  readonly perSI: number;
  readonly rounding: Rounding;
}

/** Loads: 3 significant figures (RULES: precision matches what the method can tell). */
const LOAD: Rounding = { significant: 3 };
/** Angles: 0.1°. */
const ANGLE: Rounding = { decimals: 1 };

/** The one table: per unit system and kind, the symbol, the exact factor from SI, the rounding. */
export const DISPLAY_UNITS: Readonly<Record<UnitSystem, Readonly<Record<DisplayKind, DisplayUnit>>>> = {
  metric: {
    length: { symbol: 'm', perSI: 1, rounding: { decimals: 3 } },
    short: { symbol: 'mm', perSI: 1000, rounding: { decimals: 0 } },
    distance: { symbol: 'm', perSI: 1, rounding: { decimals: 2 } },
    mass: { symbol: 'kg', perSI: 1, rounding: { decimals: 0 } },
    force: { symbol: 'kN', perSI: 1 / 1000, rounding: LOAD },
    scale: { symbol: 'kg', perSI: 1 / STANDARD_GRAVITY_M_PER_S2, rounding: LOAD },
    stiffness: { symbol: 'N/mm', perSI: 1 / 1000, rounding: { significant: 4 } },
    rollStiffness: { symbol: 'N·m/deg', perSI: RAD_PER_DEG, rounding: { significant: 4 } },
    angle: { symbol: '°', perSI: DEG_PER_RAD, rounding: ANGLE },
    ratio: { symbol: '', perSI: 1, rounding: { decimals: 3 } },
  },
  imperial: {
    length: { symbol: 'in', perSI: 1 / M_PER_IN, rounding: { decimals: 1 } },
    short: { symbol: 'in', perSI: 1 / M_PER_IN, rounding: { decimals: 1 } },
    distance: { symbol: 'ft', perSI: 1 / M_PER_FT, rounding: { decimals: 2 } },
    mass: { symbol: 'lb', perSI: 1 / KG_PER_LB, rounding: { decimals: 0 } },
    force: { symbol: 'lbf', perSI: 1 / N_PER_LBF, rounding: LOAD },
    scale: { symbol: 'lb', perSI: 1 / (STANDARD_GRAVITY_M_PER_S2 * KG_PER_LB), rounding: LOAD },
    stiffness: { symbol: 'lbf/in', perSI: M_PER_IN / N_PER_LBF, rounding: { significant: 4 } },
    rollStiffness: { symbol: 'lbf·ft/deg', perSI: RAD_PER_DEG / (N_PER_LBF * M_PER_FT), rounding: { significant: 4 } },
    angle: { symbol: '°', perSI: DEG_PER_RAD, rounding: ANGLE },
    ratio: { symbol: '', perSI: 1, rounding: { decimals: 3 } },
  },
};

/** Shown for a value that does not exist (a lifted wheel's load in a pose that does not stand, no event). */
export const NO_VALUE = '—';

export function unitOf(kind: DisplayKind, units: UnitSystem): DisplayUnit {
  return DISPLAY_UNITS[units][kind];
}

/** The unit's symbol: "kN", "in", "°". */
export function unitSymbol(kind: DisplayKind, units: UnitSystem): string {
  return DISPLAY_UNITS[units][kind].symbol;
}

/** SI → display number (unrounded, for charts). */
export function toDisplay(kind: DisplayKind, si: number, units: UnitSystem): number {
  return si * DISPLAY_UNITS[units][kind].perSI;
}

/** Display number → SI (for values typed in the display unit). */
export function fromDisplay(kind: DisplayKind, shown: number, units: UnitSystem): number {
  return shown / DISPLAY_UNITS[units][kind].perSI;
}

/** A number with fixed decimals; "-0.0" shows as "0.0"; non-finite as NO_VALUE. */
export function fixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return NO_VALUE;
  const s = v.toFixed(decimals);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/**
 * A number to `n` significant figures, trailing zeros kept where they are significant
 * ("12.0", "0.0450", "2760"); non-finite as NO_VALUE.
 */
export function significant(v: number, n = 3): string {
  if (!Number.isFinite(v)) return NO_VALUE;
  if (v === 0) return '0';
  const r = Number(v.toPrecision(n));
  if (r === 0) return '0';
  const mag = Math.floor(Math.log10(Math.abs(r)));
  const decimals = Math.max(0, n - 1 - mag);
  return fixed(r, decimals);
}

/** A number rounded by a rule. */
export function rounded(v: number, rule: Rounding): string {
  return 'decimals' in rule ? fixed(v, rule.decimals) : significant(v, rule.significant);
}

/** The display number of an SI value as text, rounded for its kind, without the unit; NO_VALUE for null. */
export function valueText(kind: DisplayKind, si: number | null | undefined, units: UnitSystem): string {
  if (si === null || si === undefined || !Number.isFinite(si)) return NO_VALUE;
  const u = DISPLAY_UNITS[units][kind];
  return rounded(si * u.perSI, u.rounding);
}

/** The value and its unit: "12.3 kN", "4.5 in", "31.2°"; NO_VALUE for null. */
export function quantityText(kind: DisplayKind, si: number | null | undefined, units: UnitSystem): string {
  const v = valueText(kind, si, units);
  if (v === NO_VALUE) return v;
  const s = DISPLAY_UNITS[units][kind].symbol;
  if (s === '') return v;
  return s === '°' ? `${v}°` : `${v} ${s}`;
}

/** A signed change: "+1.2°", "−35 mm"; no sign on a change that rounds to zero. */
export function changeText(kind: DisplayKind, si: number | null | undefined, units: UnitSystem, withUnit = true): string {
  const t = withUnit ? quantityText(kind, si, units) : valueText(kind, si, units);
  if (t === NO_VALUE) return t;
  if (/^-?0(?:\.0+)?(?![.\d])/.test(t)) return t.replace(/^-/, '');
  return t.startsWith('-') ? t : `+${t}`;
}

// Short names for the common kinds (all take SI and may take null).
export const forceText = (n: number | null | undefined, u: UnitSystem): string => quantityText('force', n, u);
export const scaleText = (n: number | null | undefined, u: UnitSystem): string => quantityText('scale', n, u);
export const lengthText = (m: number | null | undefined, u: UnitSystem): string => quantityText('length', m, u);
export const shortText = (m: number | null | undefined, u: UnitSystem): string => quantityText('short', m, u);
export const distanceText = (m: number | null | undefined, u: UnitSystem): string => quantityText('distance', m, u);
export const massText = (kg: number | null | undefined, u: UnitSystem): string => quantityText('mass', kg, u);
/** An angle at 0.1°: "12.3°" (say its datum beside it). */
export const angleText = (rad: number | null | undefined): string => quantityText('angle', rad, 'metric');

/** A share as a whole percentage: "132 %"; NO_VALUE for null. */
export function percentText(share: number | null | undefined): string {
  return share === null || share === undefined || !Number.isFinite(share) ? NO_VALUE : `${fixed(100 * share, 0)} %`;
}

/** A direction (rad) as degrees in [0, 360) at 1°. */
export function directionText(rad: number): string {
  const d = ((((rad * DEG_PER_RAD) % 360) + 360) % 360);
  return `${fixed(d, 0) === '360' ? '0' : fixed(d, 0)}°`;
}

/** The units in one line, for a table's note: "metric (m, mm, kg, kN, N/mm, N·m/deg)". */
export function unitsLine(units: UnitSystem): string {
  const t = DISPLAY_UNITS[units];
  const list = [...new Set([t.length.symbol, t.short.symbol, t.distance.symbol, t.mass.symbol, t.force.symbol, t.stiffness.symbol, t.rollStiffness.symbol])];
  return `${units} (${list.join(', ')})`;
}

/**
 * "% of static": the one basis used by the app, the command line and the report: the tyre's
 * normal load (across the contact) as a share of the same tyre's normal load standing on level
 * ground (WheelResult.loadShare). Said under every table that shows it.
 */
export const OF_STATIC_NOTE =
  '% of static: the tyre\'s normal load (across the contact) as a share of its load standing on level ground.';

/** The "% of static" of one wheel, on the one basis; null when the wheel has no load to show. */
export function ofStatic(w: { readonly loadShare: number | null }): number | null {
  return w.loadShare;
}

/** The parsed form of `--units` / the app's choice. */
export function parseUnits(v: string | undefined): UnitSystem | null {
  return v === 'metric' || v === 'imperial' ? v : null;
}
