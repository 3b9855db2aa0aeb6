/**
 * The second-order check of an equilibrium: is it stable?
 *
 * A converged Newton root is only a point where the forces balance. It stands if every small
 * disturbance of the configuration raises the potential energy, i.e. if the tangent stiffness
 * matrix of the configuration coordinates is positive definite (Lagrange–Dirichlet theorem; see
 * e.g. Thompson & Hunt, "A General Theory of Elastic Stability", 1973, ch. 2). A vehicle balanced on
 * two wheels with its CG beyond the plumb line of their contact line converges just as well as one
 * standing on four, and fails this check.
 *
 * What is measured:
 *  - the configuration coordinates are the seven that set the pose: reference-point height, body
 *    roll and pitch, and the four suspension coordinates (model.ts). x, y and heading are held by
 *    the pose; the ground's grip field (the remaining three unknowns) is held fixed: the tangential
 *    reactions stay what they are at the equilibrium, shared over the contacts in proportion to
 *    the normal loads, as in the equations.
 *  - K = −∂G/∂q, with G the generalised forces conjugate to those coordinates (the vertical force,
 *    the moments about the roll and pitch axes of the rotation, the suspension equations), from
 *    central differences: first over the tyres' linearisation at the state (no ray casts beyond
 *    one full evaluation); when that puts the smallest eigenvalue near zero (below EXACT_BELOW),
 *    again over the full equations (fourteen ray casts, or twenty-eight where the first verdict is
 *    unstable: see exactCheck), since the linearisation freezes the contact geometry and can
 *    misjudge the sign near a fold.
 *  - Coordinates are made dimensionless (lengths divided by the wheelbase L) and forces scaled by
 *    the weight W, so K is in units of W·L per unit of coordinate²; the grip held fixed makes K
 *    slightly non-symmetric, so its symmetric part (K + Kᵀ)/2 is taken (the part that does work
 *    on a disturbance: qᵀKq = qᵀ ((K + Kᵀ)/2) q).
 *  - minEigen is its smallest eigenvalue (Jacobi's method); stable when it is positive, up to a
 *    relative tolerance of the largest eigenvalue's magnitude (finite-difference noise), i.e.
 *    minEigen > −STABILITY_REL_TOL · max|λ|.
 *
 * The model's pose and tilt must be set as for the solve of `state` (solveEquilibrium leaves them
 * so). Allocates nothing: all buffers live in the scratch.
 */
import { Q_PITCH, Q_ROLL, Q_SUSP, R_SUSP, STATE_SIZE, type VehicleModel } from './model';

/** Number of configuration coordinates: heave, roll, pitch, four suspension coordinates. */
export const CONFIG_SIZE = 7;
/** Relative tolerance on the smallest eigenvalue (see the module comment). */
export const STABILITY_REL_TOL = 1e-7;
/** Finite-difference step on the state (m or rad), over the tyres' linearisation. */
const STIFFNESS_FD_STEP = 1e-7;
/**
 * The same over the full equations: longer, since the ray searches and terrain edges make the full
 * forces rough at the 1e-7 scale (a rigid vehicle balanced on two wheels gives the same smallest
 * eigenvalue to 0.1 % from 1e-8 to 1e-6).
 */
const EXACT_FD_STEP = 1e-6;
/** Jacobi sweeps: 7×7 converges in well under ten. */
const JACOBI_MAX_SWEEPS = 30;

export interface StabilityScratch {
  readonly q: Float64Array;
  readonly res: Float64Array;
  readonly g0: Float64Array;
  readonly g1: Float64Array;
  /** Tangent stiffness, row-major CONFIG_SIZE², symmetrised (after stabilityOf). */
  readonly K: Float64Array;
  /** Working copy for the eigen routine; on return its diagonal holds the eigenvalues. */
  readonly A: Float64Array;
  /** Eigenvectors (columns), row-major. */
  readonly V: Float64Array;
  /** Eigenvector of the smallest eigenvalue (the softest mode), config coordinates (scaled). */
  readonly mode: Float64Array;
}

export function createStabilityScratch(): StabilityScratch {
  const n = CONFIG_SIZE;
  return {
    q: new Float64Array(STATE_SIZE),
    res: new Float64Array(STATE_SIZE),
    g0: new Float64Array(n),
    g1: new Float64Array(n),
    K: new Float64Array(n * n),
    A: new Float64Array(n * n),
    V: new Float64Array(n * n),
    mode: new Float64Array(n),
  };
}

/** State index of configuration coordinate k. */
function stateIndex(k: number): number {
  return k < 3 ? k : Q_SUSP + (k - 3);
}

/**
 * Generalised forces (scaled: per W for forces on lengths divided by L, per W·L for moments)
 * conjugate to the dimensionless configuration coordinates, from the residual `res` (the model's
 * rotation must be that of the state the residual was evaluated at).
 */
function generalisedForces(model: VehicleModel, res: Float64Array, out: Float64Array): void {
  const L = model.wheelbaseM;
  // Heave (coordinate z / L): the vertical force over W.
  out[0] = res[2];
  // Roll φ: R = Rz(ψ) Ry(θ) Rx(φ), so ∂R/∂φ turns about Rz Ry e_x = R's first column.
  const r = model.rot;
  out[1] = r[0] * res[3] + r[3] * res[4] + r[6] * res[5];
  // Pitch θ: turns about Rz(ψ) e_y = (−sin ψ, cos ψ, 0).
  const c = Math.cos(model.headingRad);
  const s = Math.sin(model.headingRad);
  out[2] = -s * res[3] + c * res[4];
  for (let a = 0; a < 2; a++) {
    const ax = model.axles[a];
    if (ax.solid) {
      out[3 + 2 * a] = res[R_SUSP + 2 * a];
      // Axle roll: the residual is over W·track; over W·L here.
      out[4 + 2 * a] = (res[R_SUSP + 2 * a + 1] * ax.trackM) / L;
    } else {
      out[3 + 2 * a] = res[R_SUSP + 2 * a];
      out[4 + 2 * a] = res[R_SUSP + 2 * a + 1];
    }
  }
}

/** Scale from state units to the dimensionless coordinate: 1/L for lengths, 1 for angles. */
function coordinateLength(model: VehicleModel, k: number): number {
  if (k === 0) return model.wheelbaseM;
  if (k === Q_ROLL || k === Q_PITCH) return 1;
  const a = (k - 3) >> 1;
  const ax = model.axles[a];
  // Solid axle: heave (length) then roll (angle); independent: two travels (lengths).
  if (ax.solid && ((k - 3) & 1) === 1) return 1;
  return model.wheelbaseM;
}

/**
 * Smallest eigenvalue of the symmetric n×n matrix in A (row-major; destroyed: its diagonal ends
 * as the eigenvalues), by the cyclic Jacobi method (Golub & Van Loan, Matrix Computations, §8.5).
 * V receives the eigenvectors as columns. Returns the index of the smallest eigenvalue.
 */
export function jacobiEigen(n: number, A: Float64Array, V: Float64Array): number {
  V.fill(0, 0, n * n);
  for (let i = 0; i < n; i++) V[i * n + i] = 1;
  let norm = 0;
  for (let i = 0; i < n * n; i++) norm += A[i] * A[i];
  const tiny = 1e-30 * norm;
  for (let sweep = 0; sweep < JACOBI_MAX_SWEEPS; sweep++) {
    let off = 0;
    for (let p = 0; p < n; p++) for (let q = p + 1; q < n; q++) off += A[p * n + q] * A[p * n + q];
    if (!(off > tiny)) break;
    for (let p = 0; p < n - 1; p++) {
      for (let q = p + 1; q < n; q++) {
        const apq = A[p * n + q];
        if (apq === 0) continue;
        const app = A[p * n + p];
        const aqq = A[q * n + q];
        // Rotation that zeroes A[p][q]: t = tan of the angle, the smaller root.
        const theta = (aqq - app) / (2 * apq);
        const t = Math.sign(theta || 1) / (Math.abs(theta) + Math.sqrt(theta * theta + 1));
        const c = 1 / Math.sqrt(t * t + 1);
        const s = t * c;
        for (let k = 0; k < n; k++) {
          const akp = A[k * n + p];
          const akq = A[k * n + q];
          A[k * n + p] = c * akp - s * akq;
          A[k * n + q] = s * akp + c * akq;
        }
        for (let k = 0; k < n; k++) {
          const apk = A[p * n + k];
          const aqk = A[q * n + k];
          A[p * n + k] = c * apk - s * aqk;
          A[q * n + k] = s * apk + c * aqk;
        }
        for (let k = 0; k < n; k++) {
          const vkp = V[k * n + p];
          const vkq = V[k * n + q];
          V[k * n + p] = c * vkp - s * vkq;
          V[k * n + q] = s * vkp + c * vkq;
        }
      }
    }
  }
  let imin = 0;
  for (let i = 1; i < n; i++) if (A[i * n + i] < A[imin * n + imin]) imin = i;
  return imin;
}

export interface StabilityOptions {
  /** Evaluate the full equations at the state first. Pass false only right after a solve of that state. @default true */
  readonly fresh?: boolean;
  /**
   * Differences over the full equations (fourteen more ray casts) instead of over the tyres'
   * linearisation. 'auto' (the default): the cheap differences first, the full ones when the cheap
   * smallest eigenvalue is below EXACT_BELOW (near a fold the linearisation, which freezes the
   * contact geometry, is not accurate enough to decide the sign).
   */
  readonly exact?: boolean | 'auto';
  /** Finite-difference step on the state (m or rad). @default 1e-7 */
  readonly step?: number;
}

/**
 * Below this smallest eigenvalue (per W·L) from the cheap differences, 'auto' repeats the check
 * with the full equations. The linearised contact geometry misses up to about 0.1 of it on a
 * vehicle balanced on two wheels (tests/core/solver/stability.test.ts compares both).
 */
export const EXACT_BELOW = 0.5;

export interface Stability {
  /** Smallest eigenvalue of the symmetrised tangent stiffness (dimensionless: per W·L). */
  readonly minEigen: number;
  /** Largest eigenvalue magnitude, the scale of the tolerance. */
  readonly maxEigen: number;
  /** minEigen > −STABILITY_REL_TOL · maxEigen. */
  readonly stable: boolean;
  /** Whether the full equations were differenced. */
  readonly exact: boolean;
}

/**
 * The second-order check at `state` (see the module comment). On return the model's buffers hold
 * the state's full evaluation (or, after only the cheap differences, its linearised evaluation,
 * equal to the full one up to rounding), with its kinematics.
 */
export function stabilityOf(model: VehicleModel, state: Float64Array, scratch: StabilityScratch, options: StabilityOptions = {}): Stability {
  const mode = options.exact ?? 'auto';
  if (options.fresh ?? true) model.residual(state, true, scratch.res);
  if (mode === true) return exactCheck(model, state, scratch, options.step);
  const cheap = check(model, state, scratch, false, options.step ?? STIFFNESS_FD_STEP);
  if (mode === false || !(cheap.minEigen < EXACT_BELOW)) return cheap;
  return exactCheck(model, state, scratch, options.step);
}

/**
 * Differences over the full equations. Where a tyre sits on a sharp terrain edge the contact force
 * has a kink there, and a difference across it reads as a stiffness of the order of the force jump
 * over the step: an artefact that shrinks as the step grows, where a real negative stiffness does
 * not. So a first verdict of unstable is tried again with a step ten times longer, and the larger
 * smallest eigenvalue is kept. (A given step is used as it is.)
 */
function exactCheck(model: VehicleModel, state: Float64Array, scratch: StabilityScratch, step: number | undefined): Stability {
  if (step !== undefined) return check(model, state, scratch, true, step);
  const a = check(model, state, scratch, true, EXACT_FD_STEP);
  if (a.stable) return a;
  const b = check(model, state, scratch, true, 10 * EXACT_FD_STEP);
  if (!(b.minEigen > a.minEigen)) {
    model.residual(state, true, scratch.res);
    return a;
  }
  return b;
}

function check(model: VehicleModel, state: Float64Array, scratch: StabilityScratch, full: boolean, h: number): Stability {
  const n = CONFIG_SIZE;
  const q = scratch.q;
  q.set(state);
  const res = scratch.res;
  const K = scratch.K;
  for (let j = 0; j < n; j++) {
    const k = stateIndex(j);
    const keep = q[k];
    // Central differences: where a stop or a contact engages exactly at the state (a corner with no
    // droop travel at ride height) the stiffness has a kink, and a one-sided difference would see
    // the stop for one coordinate and not for another, which no potential gives.
    q[k] = keep + h;
    model.residual(q, full, res);
    generalisedForces(model, res, scratch.g1);
    q[k] = keep - h;
    model.residual(q, full, res);
    generalisedForces(model, res, scratch.g0);
    q[k] = keep;
    const scale = coordinateLength(model, k) / (2 * h);
    for (let i = 0; i < n; i++) K[i * n + j] = -(scratch.g1[i] - scratch.g0[i]) * scale;
  }
  // Leave the buffers at the state itself (the full differences re-cast the tyres elsewhere).
  model.residual(q, full, res);
  let finite = true;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const s = 0.5 * (K[i * n + j] + K[j * n + i]);
      if (!Number.isFinite(s)) finite = false;
      K[i * n + j] = s;
      K[j * n + i] = s;
    }
  }
  if (!finite) return { minEigen: NaN, maxEigen: NaN, stable: false, exact: full };
  scratch.A.set(K);
  const imin = jacobiEigen(n, scratch.A, scratch.V);
  let maxAbs = 0;
  for (let i = 0; i < n; i++) maxAbs = Math.max(maxAbs, Math.abs(scratch.A[i * n + i]));
  for (let i = 0; i < n; i++) scratch.mode[i] = scratch.V[i * n + imin];
  const minEigen = scratch.A[imin * n + imin];
  return { minEigen, maxEigen: maxAbs, stable: minEigen > -STABILITY_REL_TOL * maxAbs, exact: full };
}
