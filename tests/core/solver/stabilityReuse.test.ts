/**
 * The stability check as the solver runs it (src/core/solver/stability.ts via equilibrium.ts: the
 * stiffness from Newton's last Jacobian where it still holds, eigenvalues by Householder + QL, near
 * zero the full equations along the softest mode) against the finite-difference tangent stiffness.
 *
 * Reference: the tangent stiffness of the seven configuration coordinates by central differences,
 * K = −∂G/∂q (stabilityOf with `fresh: true`: over the tyres' linearisation, and over the full
 * equations, `exact: true`, where that puts the smallest eigenvalue below EXACT_BELOW); its
 * smallest eigenvalue decides stability (Lagrange–Dirichlet: a strict minimum of the potential is
 * stable; Thompson & Hunt, A General Theory of Elastic Stability, 1973, ch. 2). The solver's value
 * must give the same verdict on every pose and lie within 2e-3 (per W·L) of the reference: below the
 * few thousandths of finite-difference noise the tilt sweep already allows for (tilt.ts,
 * MIN_STIFFNESS_EIGEN).
 *
 * The eigenvalue routine is checked against closed forms: the symmetric tridiagonal Toeplitz
 * matrix tridiag(−1, 2, −1) of order n has eigenvalues 2 − 2cos(kπ/(n+1)) (Golub & Van Loan,
 * Matrix Computations, 4th ed., §4.8), and a similarity transform keeps a diagonal's eigenvalues.
 * Vehicles and terrains are invented.
 */
import { describe, expect, it } from 'vitest';
import type { Pose, SolveResult, Terrain, TerrainFeature, Tilt } from '../../../src/core/model/types';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import type { VehicleModel } from '../../../src/core/solver/model';
import { reusableJacobian } from '../../../src/core/solver/newton';
import { EXACT_BELOW, createStabilityScratch, stabilityOf, symmetricEigenvalues } from '../../../src/core/solver/stability';
import { tiltSweep } from '../../../src/core/solver/tilt';
import { testVehicle } from '../../helpers/vehicles';

const DEG = Math.PI / 180;
const POSE: Pose = { xM: 0, yM: 0, headingRad: 0 };

describe('symmetric eigenvalues (Householder + QL)', () => {
  it('tridiag(−1, 2, −1) of order 7: 2 − 2cos(kπ/8), k = 1…7', () => {
    const n = 7;
    const A = new Float64Array(n * n);
    for (let i = 0; i < n; i++) {
      A[i * n + i] = 2;
      if (i > 0) A[i * n + i - 1] = A[(i - 1) * n + i] = -1;
    }
    const d = new Float64Array(n);
    expect(symmetricEigenvalues(n, A, d, new Float64Array(n))).toBe(true);
    for (let k = 1; k <= n; k++) expect(d[k - 1]).toBeCloseTo(2 - 2 * Math.cos((k * Math.PI) / (n + 1)), 12);
  });

  it('Q diag(5, −2, 0.5, 3, 40, −7, 1e-3) Qᵀ (Q a product of plane rotations) keeps those eigenvalues', () => {
    const n = 7;
    const diag = [5, -2, 0.5, 3, 40, -7, 1e-3];
    const M = new Float64Array(n * n);
    for (let i = 0; i < n; i++) M[i * n + i] = diag[i];
    // Rotate by plane rotations G(p, q, θ): M ← G M Gᵀ (orthogonal similarity).
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const th = 0.3 + 0.17 * p - 0.11 * q;
        const c = Math.cos(th);
        const s = Math.sin(th);
        for (let k = 0; k < n; k++) {
          const a = M[p * n + k];
          const b = M[q * n + k];
          M[p * n + k] = c * a - s * b;
          M[q * n + k] = s * a + c * b;
        }
        for (let k = 0; k < n; k++) {
          const a = M[k * n + p];
          const b = M[k * n + q];
          M[k * n + p] = c * a - s * b;
          M[k * n + q] = s * a + c * b;
        }
      }
    }
    const d = new Float64Array(n);
    expect(symmetricEigenvalues(n, M, d, new Float64Array(n))).toBe(true);
    const want = [...diag].sort((a, b) => a - b);
    for (let i = 0; i < n; i++) expect(Math.abs(d[i] - want[i])).toBeLessThan(1e-12 * 40);
  });
});

interface Tally {
  poses: number;
  reused: number;
  nearZero: number;
  unstable: number;
  worst: number;
}

/** The solver's reported smallest eigenvalue and verdict against the finite-difference reference at the same state. */
function checkAgainstReference(model: VehicleModel, pose: Pose, tilt: Tilt, r: SolveResult, tally: Tally): void {
  if (r.status !== 'converged' && r.status !== 'unstable') return;
  const reused = reusableJacobian() !== null;
  model.setPose(pose.xM, pose.yM, pose.headingRad);
  model.setTilt(tilt.angleRad, tilt.downhillRad);
  const sc = createStabilityScratch();
  let ref = stabilityOf(model, r.state, sc, { exact: false });
  if (ref.minEigen < EXACT_BELOW) {
    ref = stabilityOf(model, r.state, sc, { exact: true });
    tally.nearZero++;
  }
  tally.poses++;
  if (reused) tally.reused++;
  if (!ref.stable) tally.unstable++;
  expect(r.status === 'converged', `verdict at ${JSON.stringify(pose)}, tilt ${(tilt.angleRad / DEG).toFixed(2)}° toward ${(tilt.downhillRad / DEG).toFixed(0)}°`).toBe(ref.stable);
  const d = Math.abs((r.stiffnessMinEigen ?? NaN) - ref.minEigen);
  tally.worst = Math.max(tally.worst, d);
  expect(d, `smallest eigenvalue ${r.stiffnessMinEigen} vs reference ${ref.minEigen}`).toBeLessThan(2e-3);
}

/** Invented rocky ground: domes under both wheel tracks every metre or so. */
function rocks(): Terrain {
  const features: TerrainFeature[] = [];
  for (let k = 0; k < 14; k++) {
    const x = -2 + 1.1 * k + 0.3 * Math.sin(k);
    features.push({ type: 'rock', xM: x, yM: (k % 3 === 0 ? -0.8 : 0.8) + 0.1 * Math.cos(3 * k), heightM: 0.1 + 0.03 * (k % 5), radiusM: 0.4 + 0.05 * (k % 4) });
  }
  return { features };
}

describe('the solver’s stability check matches the finite-difference tangent stiffness', { timeout: 240_000 }, () => {
  it('rocky ground: 60 poses solved fresh and warm from 2 cm back (Newton’s Jacobian reused on most)', () => {
    const model = buildModel(testVehicle(), rocks());
    const level: Tilt = { angleRad: 0, downhillRad: 0 };
    const tally: Tally = { poses: 0, reused: 0, nearZero: 0, unstable: 0, worst: 0 };
    for (let k = 0; k < 60; k++) {
      const pose: Pose = { xM: -1 + 0.22 * k, yM: 0.05 * Math.sin(k), headingRad: 0.04 * Math.cos(k) };
      const back = solveEquilibrium(model, { ...pose, xM: pose.xM - 0.02 });
      checkAgainstReference(model, { ...pose, xM: pose.xM - 0.02 }, level, back, tally);
      const warm = solveEquilibrium(model, pose, { warmStart: back.state });
      checkAgainstReference(model, pose, level, warm, tally);
    }
    expect(tally.poses).toBeGreaterThan(100);
    expect(tally.reused).toBeGreaterThan(tally.poses / 2);
  });

  it('tilt table: states along the branch up to and past the tip in six directions (near-zero and unstable ones included)', () => {
    const model = buildModel(testVehicle(), { features: [] });
    const tally: Tally = { poses: 0, reused: 0, nearZero: 0, unstable: 0, worst: 0 };
    for (const dirDeg of [10, 30, 90, 170, 250, 330]) {
      const downhillRad = dirDeg * DEG;
      const sweep = tiltSweep(model, POSE, { downhillRad, findSlide: false });
      expect(sweep.tip).not.toBeNull();
      const tipDeg = sweep.tip!.angleRad / DEG;
      let prev: SolveResult | null = null;
      const tilts: number[] = [];
      for (let a = Math.max(0, tipDeg - 12); a < tipDeg - 1.5; a += 2) tilts.push(a);
      for (let a = tipDeg - 1.5; a < tipDeg + 0.6; a += 0.05) tilts.push(a);
      for (const a of tilts) {
        const tilt: Tilt = { angleRad: a * DEG, downhillRad };
        const r = solveEquilibrium(model, POSE, { tilt, warmStart: prev?.state ?? null, followBranch: prev !== null });
        checkAgainstReference(model, POSE, tilt, r, tally);
        if (r.status === 'converged' || r.status === 'unstable') prev = r;
      }
    }
    expect(tally.nearZero, JSON.stringify(tally)).toBeGreaterThan(20);
    expect(tally.unstable).toBeGreaterThan(0);
    expect(tally.reused).toBeGreaterThan(tally.poses / 2);
  });
});
