/**
 * Ground filter for point clouds: the progressive morphological filter of Zhang, Chen, Whitman,
 * Shan, Yan & Zhang (2003), "A progressive morphological filter for removing nonground
 * measurements from airborne LIDAR data", IEEE Trans. Geoscience and Remote Sensing 41(4),
 * 872–882. A minimum-height surface is opened (erosion then dilation) with windows growing
 * exponentially (w_k = 2·b^k + 1 cells, eq. 5); a point standing higher above the opened
 * surface than the elevation threshold dh_k = s·(w_k − w_{k−1})·c + dh0, capped at dh_max
 * (eq. 4), is not ground. Objects wider than the largest window (a big rock, a hillside) stay.
 */
import { fillHoles } from './fill';
import { gridPoints, type GridSpec } from './gridding';

export interface GroundFilterSettings {
  /** Cell of the filter's own surface (m). */
  readonly cellM: number;
  /** Largest window (m): wider objects are ground. @default 8 */
  readonly maxWindowM?: number;
  /** Terrain slope allowed (rise over run). @default 1 */
  readonly slope?: number;
  /** Height allowed above the surface at the smallest window (m). @default 0.15 */
  readonly dh0M?: number;
  /** Cap of the height threshold (m). @default 2.5 */
  readonly dhMaxM?: number;
}

/** Returns a keep mask (1 ground) and the number of points removed. */
export function progressiveMorphologicalFilter(xyz: Float32Array, count: number, spec: GridSpec, s: GroundFilterSettings): { keep: Uint8Array; removed: number; windows: number } {
  const keep = new Uint8Array(count).fill(1);
  const c = s.cellM;
  const maxWindowM = s.maxWindowM ?? 8;
  const slope = s.slope ?? 1;
  const dh0 = s.dh0M ?? 0.15;
  const dhMax = s.dhMaxM ?? 2.5;
  const surfaceGrid = gridPoints(xyz, count, spec, { statistic: 'min' });
  if (surfaceGrid.heightsM.every((v) => Number.isNaN(v))) return { keep, removed: 0, windows: 0 };
  fillHoles(surfaceGrid, 1e-3, 500);
  const { cols, rows } = spec;
  let surface: Float32Array = Float32Array.from(surfaceGrid.heightsM);
  const cellOf = new Int32Array(count);
  for (let i = 0; i < count; i++) {
    const cc = Math.min(cols - 1, Math.max(0, Math.round((xyz[3 * i] - spec.originM[0]) / c)));
    const rr = Math.min(rows - 1, Math.max(0, Math.round((xyz[3 * i + 1] - spec.originM[1]) / c)));
    cellOf[i] = rr * cols + cc;
  }
  let prevW = 1;
  let windows = 0;
  for (let k = 1; ; k++) {
    const w = 2 * 2 ** (k - 1) + 1;
    if ((w - 1) * c > maxWindowM) break;
    const opened = open(surface, cols, rows, (w - 1) >> 1);
    // Zhang et al. hold the first window's threshold at dh0, which assumes cells of about 1 m; with
    // coarser cells a slope rises more than dh0 across one window, so the slope term applies from
    // the first window on (w_0 = 1).
    let dh = slope * (w - prevW) * c + dh0;
    if (dh > dhMax) dh = dhMax;
    for (let i = 0; i < count; i++) if (keep[i] && xyz[3 * i + 2] - opened[cellOf[i]] > dh) keep[i] = 0;
    surface = opened;
    prevW = w;
    windows++;
  }
  let removed = 0;
  for (let i = 0; i < count; i++) if (!keep[i]) removed++;
  return { keep, removed, windows };
}

/** Morphological opening with a (2h+1)² square window: erosion (min) then dilation (max), separable. */
function open(src: Float32Array, cols: number, rows: number, half: number): Float32Array {
  const a = filter(src, cols, rows, half, true);
  return filter(a, cols, rows, half, false);
}

function filter(src: Float32Array, cols: number, rows: number, half: number, min: boolean): Float32Array {
  const tmp = new Float32Array(src.length);
  const out = new Float32Array(src.length);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      let v = min ? Infinity : -Infinity;
      const c0 = Math.max(0, c - half);
      const c1 = Math.min(cols - 1, c + half);
      for (let q = c0; q <= c1; q++) {
        const x = src[r * cols + q];
        if (min ? x < v : x > v) v = x;
      }
      tmp[r * cols + c] = v;
    }
  }
  for (let r = 0; r < rows; r++) {
    const r0 = Math.max(0, r - half);
    const r1 = Math.min(rows - 1, r + half);
    for (let c = 0; c < cols; c++) {
      let v = min ? Infinity : -Infinity;
      for (let q = r0; q <= r1; q++) {
        const x = tmp[q * cols + c];
        if (min ? x < v : x > v) v = x;
      }
      out[r * cols + c] = v;
    }
  }
  return out;
}
