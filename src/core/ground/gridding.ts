/**
 * Point gridding: each grid node takes a statistic of the points near it. "cell": the points
 * nearest that node (the square cell centred on it); "circle": every point within a radius, as
 * GDAL's gdal_grid min / max / average with a circular search ellipse (GDAL grid tutorial,
 * https://gdal.org/programs/gdal_grid.html). For ground from aerial LiDAR a low percentile per
 * cell rejects what the ground filter left of low vegetation (common practice; cf. the
 * "lowest point per cell" DTM of Axelsson 2000 and PDAL's writers.gdal `min`).
 */
import type { HeightGrid } from './types';

export interface GridSpec {
  readonly originM: readonly [number, number];
  readonly cellM: number;
  readonly cols: number;
  readonly rows: number;
}

export type GridStatistic = 'min' | 'max' | 'mean' | { readonly percentile: number };

export interface GriddingSettings {
  readonly statistic: GridStatistic;
  /** Search radius for the "circle" neighbourhood (m); absent: the node's own cell. */
  readonly radiusM?: number;
}

/** Grid nodes covering the bounds [x0, y0, x1, y1] at the cell size (origin at the low corner). */
export function gridOver(bounds: readonly [number, number, number, number], cellM: number): GridSpec {
  // A thousandth of a cell of slack: float32 coordinates put an extent of exactly n cells a hair short of it.
  const cols = Math.max(2, Math.floor((bounds[2] - bounds[0]) / cellM + 1e-3) + 1);
  const rows = Math.max(2, Math.floor((bounds[3] - bounds[1]) / cellM + 1e-3) + 1);
  return { originM: [bounds[0], bounds[1]], cellM, cols, rows };
}

/** Grids the points; nodes with no point are NaN. */
export function gridPoints(xyz: Float32Array, count: number, spec: GridSpec, settings: GriddingSettings): HeightGrid {
  const { cols, rows, cellM } = spec;
  const [ox, oy] = spec.originM;
  const n = cols * rows;
  const counts = new Uint32Array(n + 1);
  const radius = settings.radiusM;
  const r2 = radius !== undefined ? radius * radius : 0;
  const reach = radius !== undefined ? Math.ceil(radius / cellM) : 0;
  // Visit (point, node) pairs twice: count, then scatter heights.
  const visit = (fn: (node: number, i: number) => void): void => {
    for (let i = 0; i < count; i++) {
      const x = xyz[3 * i];
      const y = xyz[3 * i + 1];
      const fc = (x - ox) / cellM;
      const fr = (y - oy) / cellM;
      if (radius === undefined) {
        const c = Math.round(fc);
        const r = Math.round(fr);
        if (c >= 0 && c < cols && r >= 0 && r < rows) fn(r * cols + c, i);
        continue;
      }
      const cc = Math.round(fc);
      const rc = Math.round(fr);
      for (let r = rc - reach; r <= rc + reach; r++) {
        if (r < 0 || r >= rows) continue;
        const dy = y - (oy + r * cellM);
        for (let c = cc - reach; c <= cc + reach; c++) {
          if (c < 0 || c >= cols) continue;
          const dx = x - (ox + c * cellM);
          if (dx * dx + dy * dy <= r2) fn(r * cols + c, i);
        }
      }
    }
  };
  visit((node) => {
    counts[node + 1]++;
  });
  for (let k = 0; k < n; k++) counts[k + 1] += counts[k];
  const total = counts[n];
  const zs = new Float64Array(total);
  const fill = counts.slice(0, n);
  visit((node, i) => {
    zs[fill[node]++] = xyz[3 * i + 2];
  });
  const heights = new Float32Array(n);
  const st = settings.statistic;
  for (let k = 0; k < n; k++) {
    const a = counts[k];
    const b = counts[k + 1];
    if (b === a) {
      heights[k] = NaN;
      continue;
    }
    if (st === 'min' || st === 'max') {
      let v = zs[a];
      for (let q = a + 1; q < b; q++) v = st === 'min' ? Math.min(v, zs[q]) : Math.max(v, zs[q]);
      heights[k] = v;
    } else if (st === 'mean') {
      let s = 0;
      for (let q = a; q < b; q++) s += zs[q];
      heights[k] = s / (b - a);
    } else {
      const sub = zs.subarray(a, b);
      sub.sort();
      // Nearest-rank percentile.
      const rank = Math.min(sub.length - 1, Math.max(0, Math.ceil((st.percentile / 100) * sub.length) - 1));
      heights[k] = sub[rank];
    }
  }
  return { kind: 'grid', originM: [ox, oy], cellM, cols, rows, heightsM: heights, filled: new Uint8Array(n) };
}

/** Share of nodes with no data (NaN). */
export function emptyShare(g: HeightGrid): number {
  let e = 0;
  for (let k = 0; k < g.heightsM.length; k++) if (Number.isNaN(g.heightsM[k])) e++;
  return e / g.heightsM.length;
}
