/**
 * Cell size from the tyre and the point density. The grid must resolve the ground under one
 * contact patch: at most a quarter of the patch length (four cells per patch, common practice in
 * terrain sampling for tyre models), but not finer than the data's own spacing (a finer grid only
 * interpolates). The patch length of a tyre of radius R pressed δ into flat ground is the chord
 * 2·√(2Rδ − δ²) (circle geometry).
 */

export interface CellChoice {
  readonly cellM: number;
  readonly patchLengthM: number;
  /** Mean spacing of the data (m), or null when unknown. */
  readonly spacingM: number | null;
  readonly why: string;
}

export function contactPatchLengthM(radiusM: number, deflectionM: number): number {
  const d = Math.min(Math.max(deflectionM, 0), radiusM);
  return 2 * Math.sqrt(2 * radiusM * d - d * d);
}

/** Mean spacing of `count` points spread over `areaM2` (m). */
export function pointSpacingM(areaM2: number, count: number): number {
  return count > 0 ? Math.sqrt(areaM2 / count) : Infinity;
}

/** Rounds down to 1, 2 or 5 × 10^k (a number a person reads easily), never below `floor`. */
function niceDown(v: number, floor: number): number {
  const e = Math.floor(Math.log10(v));
  const base = 10 ** e;
  const m = v / base;
  const nice = (m >= 5 ? 5 : m >= 2 ? 2 : 1) * base;
  return nice >= floor ? nice : floor;
}

export function chooseCell(patchLengthM: number, spacingM: number | null): CellChoice {
  const quarter = patchLengthM / 4;
  if (spacingM !== null && spacingM > quarter) {
    return { cellM: spacingM, patchLengthM, spacingM, why: 'the data is coarser than a quarter of the contact patch: cell = the point spacing' };
  }
  const cell = niceDown(quarter, spacingM ?? 0);
  return { cellM: cell, patchLengthM, spacingM, why: 'a quarter of the contact patch length, rounded down' };
}
