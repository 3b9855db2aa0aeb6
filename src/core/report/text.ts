/**
 * Text helpers for the report: HTML escaping, number formatting, and the display units of a
 * scenario's unit system. Display conversions happen here, at the point of output; the data
 * handed in is SI.
 */
import type { UnitSystem } from '../scenario/types';
import { KG_PER_LB, M_PER_FT, M_PER_IN, N_PER_LBF, RAD_PER_DEG } from '../scenario/units';

/** Escape text for HTML content and attribute values. */
export function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;').replace(/'/g, '&#39;');
}

/** Fixed decimals; "-0.00" shows as "0.00"; non-finite as "–". */
export function fixed(v: number, digits: number): string {
  if (!Number.isFinite(v)) return '–';
  const s = v.toFixed(digits);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/**
 * Degrees from radians rounded to `digits` decimals and written as JavaScript writes the number:
 * the same rule the CLI's JSON output uses (src/cli/solveScenario.ts `radToDegRounded`), so a
 * headline angle in the report reads exactly as `--json` gives it.
 */
export function degRounded(rad: number, digits = 4): string {
  return String(Number(((rad * 180) / Math.PI).toFixed(digits)));
}

/**
 * The analysis commands' JSON rules (src/cli/analysisOutput.ts `deg` and `round`): degrees as
 * rad × (180/π) at 3 decimals, lengths at 4 decimals, written as JavaScript writes the number.
 */
export function deg3(rad: number): string {
  return String(Number((rad * (180 / Math.PI)).toFixed(3)));
}
export function round4(v: number): string {
  return String(Number(v.toFixed(4)));
}

/** An angle for the headline: "31.2345°", or the text given when null. */
export function degHeadline(rad: number | null | undefined, none = 'none'): string {
  return rad === null || rad === undefined ? none : `${degRounded(rad)}°`;
}

/** Display units for one unit system. */
export interface ReportUnits {
  readonly length: string;
  readonly shortLength: string;
  readonly mass: string;
  readonly force: string;
  readonly stiffness: string;
  readonly rollStiffness: string;
  /** m → display length (m or in). */
  lengthOf(m: number): number;
  /** m → short display length (mm or in). */
  shortLengthOf(m: number): number;
  kgOf(kg: number): number;
  forceOf(n: number): number;
  stiffnessOf(nPerM: number): number;
  /** N·m/rad → N·m/deg or lbf·ft/deg. */
  rollStiffnessOf(nmPerRad: number): number;
}

export function reportUnits(u: UnitSystem): ReportUnits {
  if (u === 'imperial') {
    return {
      length: 'in',
      shortLength: 'in',
      mass: 'lb',
      force: 'lbf',
      stiffness: 'lbf/in',
      rollStiffness: 'lbf·ft/deg',
      lengthOf: (m) => m / M_PER_IN,
      shortLengthOf: (m) => m / M_PER_IN,
      kgOf: (kg) => kg / KG_PER_LB,
      forceOf: (n) => n / N_PER_LBF,
      stiffnessOf: (k) => (k * M_PER_IN) / N_PER_LBF,
      rollStiffnessOf: (k) => (k * RAD_PER_DEG) / (N_PER_LBF * M_PER_FT),
    };
  }
  return {
    length: 'm',
    shortLength: 'mm',
    mass: 'kg',
    force: 'N',
    stiffness: 'N/m',
    rollStiffness: 'N·m/deg',
    lengthOf: (m) => m,
    shortLengthOf: (m) => m * 1000,
    kgOf: (kg) => kg,
    forceOf: (n) => n,
    stiffnessOf: (k) => k,
    rollStiffnessOf: (k) => k * RAD_PER_DEG,
  };
}

/** "1.234 m" / "48.6 in": lengths at 3 decimals in m, 1 in inches. */
export function len(u: ReportUnits, m: number): string {
  return `${fixed(u.lengthOf(m), u.length === 'm' ? 3 : 1)} ${u.length}`;
}
