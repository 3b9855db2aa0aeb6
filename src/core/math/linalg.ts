/**
 * Small dense linear algebra on row-major Float64Arrays. Allocation-free: callers own every buffer.
 */

/**
 * Solves A x = b for x by Gaussian elimination with partial pivoting. A (n×n, row-major) and b are
 * overwritten. Returns false when a pivot is below `singularTol` times the largest entry of A
 * (the system is singular for practical purposes); x is then left unchanged.
 */
export function solveLinearInPlace(n: number, A: Float64Array, b: Float64Array, x: Float64Array, singularTol = 1e-14): boolean {
  let scale = 0;
  for (let i = 0; i < n * n; i++) {
    const v = Math.abs(A[i]);
    if (v > scale) scale = v;
  }
  if (!(scale > 0) || !Number.isFinite(scale)) return false;
  const tol = singularTol * scale;
  for (let c = 0; c < n; c++) {
    let piv = c;
    let best = Math.abs(A[c * n + c]);
    for (let r = c + 1; r < n; r++) {
      const v = Math.abs(A[r * n + c]);
      if (v > best) {
        best = v;
        piv = r;
      }
    }
    if (!(best > tol)) return false;
    if (piv !== c) {
      for (let k = 0; k < n; k++) {
        const t = A[c * n + k];
        A[c * n + k] = A[piv * n + k];
        A[piv * n + k] = t;
      }
      const t = b[c];
      b[c] = b[piv];
      b[piv] = t;
    }
    const d = A[c * n + c];
    for (let r = c + 1; r < n; r++) {
      const f = A[r * n + c] / d;
      if (f === 0) continue;
      for (let k = c; k < n; k++) A[r * n + k] -= f * A[c * n + k];
      b[r] -= f * b[c];
    }
  }
  for (let r = n - 1; r >= 0; r--) {
    let s = b[r];
    for (let k = r + 1; k < n; k++) s -= A[r * n + k] * x[k];
    x[r] = s / A[r * n + r];
  }
  return true;
}
