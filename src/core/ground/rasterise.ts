/**
 * The top surface of a triangle mesh seen from above: each triangle is rasterised onto the grid
 * nodes with edge functions (Pineda 1988, "A parallel algorithm for polygon rasterization",
 * SIGGRAPH '88), its height interpolated barycentrically, and each node keeps the highest z
 * (a z-buffer looking down: overhangs take the top). A vertical face covers no node; the nodes
 * either side of it take the top and the foot, so it becomes a one-cell step. Triangles smaller
 * than a cell may cover no node, so each vertex also marks its nearest node.
 */
import type { HeightGrid } from './types';
import type { GridSpec } from './gridding';

export function rasteriseTop(positions: Float32Array, indices: Uint32Array, triangleCount: number, spec: GridSpec): HeightGrid {
  const { cols, rows, cellM } = spec;
  const [ox, oy] = spec.originM;
  const n = cols * rows;
  const h = new Float32Array(n).fill(-Infinity);
  const inv = 1 / cellM;
  for (let t = 0; t < triangleCount; t++) {
    const ia = indices[3 * t] * 3;
    const ib = indices[3 * t + 1] * 3;
    const ic = indices[3 * t + 2] * 3;
    // Node coordinates (fractional column / row).
    const ax = (positions[ia] - ox) * inv;
    const ay = (positions[ia + 1] - oy) * inv;
    const az = positions[ia + 2];
    const bx = (positions[ib] - ox) * inv;
    const by = (positions[ib + 1] - oy) * inv;
    const bz = positions[ib + 2];
    const cx = (positions[ic] - ox) * inv;
    const cy = (positions[ic + 1] - oy) * inv;
    const cz = positions[ic + 2];
    for (const [vx, vy, vz] of [
      [ax, ay, az],
      [bx, by, bz],
      [cx, cy, cz],
    ] as const) {
      const c = Math.round(vx);
      const r = Math.round(vy);
      if (c >= 0 && c < cols && r >= 0 && r < rows && vz > h[r * cols + c]) h[r * cols + c] = vz;
    }
    const area = (bx - ax) * (cy - ay) - (by - ay) * (cx - ax);
    if (Math.abs(area) < 1e-12) continue;
    const c0 = Math.max(0, Math.ceil(Math.min(ax, bx, cx)));
    const c1 = Math.min(cols - 1, Math.floor(Math.max(ax, bx, cx)));
    const r0 = Math.max(0, Math.ceil(Math.min(ay, by, cy)));
    const r1 = Math.min(rows - 1, Math.floor(Math.max(ay, by, cy)));
    const ia2 = 1 / area;
    for (let r = r0; r <= r1; r++) {
      for (let c = c0; c <= c1; c++) {
        // Edge functions, normalised to barycentric weights; a node on an edge counts as inside.
        const w0 = ((bx - c) * (cy - r) - (by - r) * (cx - c)) * ia2;
        const w1 = ((cx - c) * (ay - r) - (cy - r) * (ax - c)) * ia2;
        const w2 = 1 - w0 - w1;
        if (w0 < -1e-9 || w1 < -1e-9 || w2 < -1e-9) continue;
        const z = w0 * az + w1 * bz + w2 * cz;
        const k = r * cols + c;
        if (z > h[k]) h[k] = z;
      }
    }
  }
  for (let k = 0; k < n; k++) if (h[k] === -Infinity) h[k] = NaN;
  return { kind: 'grid', originM: [ox, oy], cellM, cols, rows, heightsM: h, filled: new Uint8Array(n) };
}
