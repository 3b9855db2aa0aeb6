/**
 * The second-order check (src/core/solver/stability.ts): the smallest eigenvalue of the tangent
 * stiffness of the configuration coordinates, against known answers.
 */
import { describe, expect, it, vi } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { createStabilityScratch, jacobiEigen, stabilityOf } from '../../../src/core/solver/stability';
import { Q_ROLL, Q_Z } from '../../../src/core/solver/model';
import { rigidVehicle, testVehicle } from '../../helpers/vehicles';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));

const POSE = { xM: 0, yM: 0, headingRad: 0 };
const FLAT = { features: [] };

describe('Jacobi eigen routine', () => {
  it('the 3×3 second-difference matrix tridiag(−1, 2, −1): eigenvalues 2 − 2cos(kπ/4), k = 1..3', () => {
    // Closed form for a symmetric tridiagonal Toeplitz matrix (e.g. Golub & Van Loan, Matrix
    // Computations, 4th ed., §4.8): λ_k = a + 2b cos(kπ/(n+1)) with a = 2, b = −1, n = 3:
    // 2 − √2, 2, 2 + √2; the eigenvector of the smallest is (1, √2, 1)/2.
    const A = Float64Array.from([2, -1, 0, -1, 2, -1, 0, -1, 2]);
    const V = new Float64Array(9);
    const imin = jacobiEigen(3, A, V);
    const eig = [A[0], A[4], A[8]].sort((a, b) => a - b);
    expect(eig[0]).toBeCloseTo(2 - Math.SQRT2, 12);
    expect(eig[1]).toBeCloseTo(2, 12);
    expect(eig[2]).toBeCloseTo(2 + Math.SQRT2, 12);
    expect(A[imin * 4]).toBeCloseTo(2 - Math.SQRT2, 12);
    const v = [V[imin], V[3 + imin], V[6 + imin]];
    const sgn = Math.sign(v[1]);
    expect(sgn * v[0]).toBeCloseTo(0.5, 10);
    expect(sgn * v[1]).toBeCloseTo(Math.SQRT2 / 2, 10);
    expect(sgn * v[2]).toBeCloseTo(0.5, 10);
  });

  it('an indefinite matrix: diag(3, −1, 2) turned by a rotation keeps its eigenvalues', () => {
    // Similarity transforms keep eigenvalues: A = Q diag(3, −1, 2) Qᵀ with Q a rotation by 0.7 rad about z.
    const c = Math.cos(0.7), s = Math.sin(0.7);
    const Q = [c, -s, 0, s, c, 0, 0, 0, 1];
    const d = [3, -1, 2];
    const A = new Float64Array(9);
    for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) {
      let x = 0;
      for (let k = 0; k < 3; k++) x += Q[i * 3 + k] * d[k] * Q[j * 3 + k];
      A[i * 3 + j] = x;
    }
    const imin = jacobiEigen(3, A, new Float64Array(9));
    expect(A[imin * 4]).toBeCloseTo(-1, 12);
  });
});

describe('stability of equilibria', () => {
  it('a rigid vehicle standing on level ground is stable (positive definite)', () => {
    const m = buildModel(rigidVehicle(), FLAT);
    const r = solveEquilibrium(m, POSE);
    expect(r.status).toBe('converged');
    const st = stabilityOf(m, r.state, createStabilityScratch());
    expect(st.stable).toBe(true);
    expect(st.minEigen).toBeGreaterThan(0);
  });

  it('a compliant vehicle on a 20° cross-slope table is stable', () => {
    const m = buildModel(testVehicle(), FLAT);
    const r = solveEquilibrium(m, POSE, { tilt: { angleRad: (20 * Math.PI) / 180, downhillRad: Math.PI / 2 } });
    expect(r.status).toBe('converged');
    expect(stabilityOf(m, r.state, createStabilityScratch()).stable).toBe(true);
  });

  for (const [name, make] of [['rigid', rigidVehicle], ['compliant', testVehicle]] as const) {
    it(`a ${name} vehicle balanced on its left wheels with the CG above their contact line is unstable`, () => {
      const m = buildModel(make(), FLAT);
      const level = solveEquilibrium(m, POSE);
      // Start near the balance: rolled left side down until the CG is over the left contact line
      // (roll = −atan((T/2)/h)), the left tyres on the ground.
      const w = Float64Array.from(level.state);
      w[Q_ROLL] = -Math.atan(0.8 / 0.75);
      w[Q_Z] = 0.8 * Math.sin(-w[Q_ROLL]);
      const r = solveEquilibrium(m, POSE, { warmStart: w, maxIterations: 200, followBranch: true });
      expect(['converged', 'unstable']).toContain(r.status);
      expect(r.wheels[1].lifted && r.wheels[3].lifted).toBe(true);
      const st = stabilityOf(m, r.state, createStabilityScratch());
      expect(st.stable).toBe(false);
      // Known answer (rigid): an inverted pendulum, V = W·d·cos δ with d the CG's distance from
      // the contact line (Thompson & Hunt, A General Theory of Elastic Stability, 1973, ch. 2):
      // d²V/dδ² = −W·d. In the solver's coordinates (heave/L, roll; per W·L) the tipping mode is a
      // roll δ with a heave of p·δ (p: horizontal distance from the reference point to the contact
      // line, (T/2)·cos φ), so the Rayleigh quotient is −(d/L)/(1 + (p/L)²); the stiff other
      // coordinates barely change it (1 % allowed for the tyres' and springs' compliance).
      if (name === 'rigid') {
        const L = 2.8;
        const d = Math.hypot(0.8, 0.75);
        const p = 0.8 * Math.cos(r.body.rollRad);
        const expected = -(d / L) / (1 + (p / L) ** 2);
        expect(Math.abs(st.minEigen / expected - 1)).toBeLessThan(0.01);
        expect(st.exact).toBe(true);
      }
    });
  }
});
