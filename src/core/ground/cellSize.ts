/**
 * Cell size from the tyre and the point density. The grid must resolve the ground under one
 * contact patch: at most a quarter of the patch length (four cells per patch, common practice in
 * terrain sampling for tyre models), but not finer than the data's own spacing (a finer grid only
 * interpolates). The patch length of a tyre of radius R pressed δ into flat ground is the chord
 * 2·√(2Rδ − δ²) (circle geometry).
 */

import { boundsOf } from './localFrame';

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

/**
 * Mean spacing over the area the points actually cover (a survey strip, a scan with gaps): the
 * area is counted on a probe grid of four times the bounding-box spacing, so empty water or
 * unscanned corners do not make the data look denser than it is.
 */
export function coveredSpacingM(xyz: Float32Array, count: number): number {
  const [x0, y0, , x1, y1] = boundsOf(xyz, count);
  const area = Math.max((x1 - x0) * (y1 - y0), 1e-12);
  const probe = 4 * pointSpacingM(area, count);
  const cols = Math.floor((x1 - x0) / probe) + 1;
  const rows = Math.floor((y1 - y0) / probe) + 1;
  const hit = new Uint8Array(cols * rows);
  let occupied = 0;
  for (let i = 0; i < count; i++) {
    const k = Math.floor((xyz[3 * i + 1] - y0) / probe) * cols + Math.floor((xyz[3 * i] - x0) / probe);
    if (!hit[k]) {
      hit[k] = 1;
      occupied++;
    }
  }
  return pointSpacingM(Math.min(area, occupied * probe * probe), count);
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
  // Randomly spread points (aerial LiDAR) leave e^(−1) ≈ 37 % of cells one spacing wide empty;
  // 1.5 spacings hold 2.25 points on average and leave ~10 % empty (Poisson).
  if (spacingM !== null && 1.5 * spacingM > quarter) {
    return { cellM: Number((1.5 * spacingM).toPrecision(3)), patchLengthM, spacingM, why: 'the data is coarser than a quarter of the contact patch: cell = 1.5 × the point spacing' };
  }
  const cell = niceDown(quarter, spacingM ?? 0);
  return { cellM: cell, patchLengthM, spacingM, why: 'a quarter of the contact patch length, rounded down' };
}
