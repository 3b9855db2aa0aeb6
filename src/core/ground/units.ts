import { M_PER_FT, M_PER_IN } from '../scenario/fields';
/** Length units a ground file may be in, metres per unit. */
/** Metres per source length unit (the US survey foot is 1200/3937 m: NIST Handbook 44, appendix C). */
export const LENGTH_UNITS_M = { m: 1, cm: 0.01, mm: 0.001, ft: M_PER_FT, in: M_PER_IN, usft: 1200 / 3937 } as const;
export type GroundUnit = keyof typeof LENGTH_UNITS_M;

/**
 * A sense check of a size: an obstacle scan wider than 500 units in metres is more likely in mm
 * or cm (a phone scan covers a few metres; common practice). Returns a warning or null.
 */
export function sizeWarning(extentUnits: number, unitM: number, georeferenced: boolean): string | null {
  const m = extentUnits * unitM;
  if (!georeferenced && m > 500) {
    return `the ground is ${m.toFixed(0)} m across in the chosen unit; a scan that wide is unusual: is it in mm or cm?`;
  }
  if (m > 0 && m < 0.05) return `the ground is only ${(m * 1000).toFixed(1)} mm across in the chosen unit: is it in m while the file is in mm?`;
  return null;
}
