/**
 * Hole filling by Laplace (harmonic) interpolation: the missing heights solve ∇²h = 0 with the
 * measured heights held fixed (Dirichlet) and zero slope across the grid's outer edge (Neumann),
 * the minimum-curvature-free "membrane" fill (e.g. Press et al., Numerical Recipes 3rd ed.
 * §3.8 "Laplace interpolation"). Solved by successive over-relaxation (Young 1954) started from
 * a coarse-to-fine pyramid, so large holes converge in few sweeps. Every filled node is marked in
 * the grid's `filled` mask.
 */
import { GroundError, type HeightGrid } from './types';

/** Fills NaN heights in place; returns how many nodes were filled. */
export function fillHoles(g: HeightGrid, tolM = 1e-5, maxSweeps = 4000): number {
  const { cols, rows } = g;
  const h = g.heightsM;
  const n = cols * rows;
  const unknown: number[] = [];
  for (let k = 0; k < n; k++) if (Number.isNaN(h[k])) unknown.push(k);
  if (unknown.length === 0) return 0;
  if (unknown.length === n) throw new GroundError('no height in the grid to fill from');
  const init = pyramidGuess(h, cols, rows);
  const work = new Float64Array(n);
  for (let k = 0; k < n; k++) work[k] = Number.isNaN(h[k]) ? init[k] : h[k];
  sor(work, cols, rows, Int32Array.from(unknown), tolM, maxSweeps);
  for (const k of unknown) {
    h[k] = work[k];
    g.filled[k] = 1;
  }
  return unknown.length;
}

/** Gauss–Seidel with over-relaxation on the listed nodes; Neumann at the grid edge. */
function sor(h: Float64Array, cols: number, rows: number, nodes: Int32Array, tolM: number, maxSweeps: number): void {
  const omega = 1.85;
  for (let sweep = 0; sweep < maxSweeps; sweep++) {
    let change = 0;
    for (let q = 0; q < nodes.length; q++) {
      const k = nodes[q];
      const r = (k / cols) | 0;
      const c = k - r * cols;
      let s = 0;
      let m = 0;
      if (c > 0) {
        s += h[k - 1];
        m++;
      }
      if (c < cols - 1) {
        s += h[k + 1];
        m++;
      }
      if (r > 0) {
        s += h[k - cols];
        m++;
      }
      if (r < rows - 1) {
        s += h[k + cols];
        m++;
      }
      const v = h[k] + omega * (s / m - h[k]);
      const d = Math.abs(v - h[k]);
      if (d > change) change = d;
      h[k] = v;
    }
    if (change < tolM) return;
  }
}

/** A first guess everywhere: means of the known heights over 2×2 blocks, coarser until all is known, then back up. */
function pyramidGuess(h: Float32Array, cols: number, rows: number): Float64Array {
  const val = new Float64Array(cols * rows);
  let anyMissing = false;
  for (let k = 0; k < val.length; k++) {
    val[k] = h[k];
    if (Number.isNaN(h[k])) anyMissing = true;
  }
  if (!anyMissing) return val;
  if (cols <= 1 && rows <= 1) return val;
  const cc = Math.max(1, Math.ceil(cols / 2));
  const cr = Math.max(1, Math.ceil(rows / 2));
  const coarse = new Float32Array(cc * cr);
  for (let r = 0; r < cr; r++) {
    for (let c = 0; c < cc; c++) {
      let s = 0;
      let m = 0;
      for (let dr = 0; dr < 2; dr++) {
        for (let dc = 0; dc < 2; dc++) {
          const rr = 2 * r + dr;
          const c2 = 2 * c + dc;
          if (rr >= rows || c2 >= cols) continue;
          const v = h[rr * cols + c2];
          if (!Number.isNaN(v)) {
            s += v;
            m++;
          }
        }
      }
      coarse[r * cc + c] = m > 0 ? s / m : NaN;
    }
  }
  const cg = pyramidGuess(coarse, cc, cr);
  // Coarse levels smooth their own holes a little before handing down.
  const holes: number[] = [];
  for (let k = 0; k < coarse.length; k++) if (Number.isNaN(coarse[k])) holes.push(k);
  if (holes.length > 0 && cc * cr > 1) sor(cg, cc, cr, Int32Array.from(holes), 1e-4, 50);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const k = r * cols + c;
      if (Number.isNaN(val[k])) val[k] = cg[Math.min(cr - 1, r >> 1) * cc + Math.min(cc - 1, c >> 1)];
    }
  }
  return val;
}
