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
 *    the moments about the roll and pitch axes of the rotation, the suspension equations), first
 *    over the tyres' linearisation: from the Jacobian Newton formed on its last step when the
 *    solver passes one that still holds at the root (same contacts, a step of the order of the
 *    tolerance: newton.ts, reusableJacobian; G is a fixed combination of the residual rows at the
 *    root, so K = −C·J on the seven configuration columns), else by central differences at the state
 *    (no ray casts beyond one full evaluation). When that puts the smallest eigenvalue near zero
 *    (below EXACT_BELOW) the full equations decide, since the linearisation freezes the contact
 *    geometry and can misjudge the sign near a fold: first along the softest mode only (central
 *    differences of the full equations along it: two ray casts, four where the first verdict is
 *    unstable, refineAlongMode), kept when the Rayleigh quotient there is provably within
 *    REFINE_TOL of the full matrix's smallest eigenvalue (Kato–Temple bound) and its sign is
 *    decided; else the whole matrix over the full equations (fourteen ray casts, or twenty-eight:
 *    see exactCheck).
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
  /** Tangent stiffness before symmetrising (row-major CONFIG_SIZE²). */
  readonly Kraw: Float64Array;
  /** Full-equation stiffness times the softest mode (refineAlongMode). */
  readonly w: Float64Array;
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
  /** Eigenvalues, ascending (after stabilityOf), and working space. */
  readonly eig: Float64Array;
  readonly work: Float64Array;
}

export function createStabilityScratch(): StabilityScratch {
  const n = CONFIG_SIZE;
  return {
    q: new Float64Array(STATE_SIZE),
    Kraw: new Float64Array(n * n),
    w: new Float64Array(n),
    res: new Float64Array(STATE_SIZE),
    g0: new Float64Array(n),
    g1: new Float64Array(n),
    K: new Float64Array(n * n),
    A: new Float64Array(n * n),
    V: new Float64Array(n * n),
    mode: new Float64Array(n),
    eig: new Float64Array(n),
    work: new Float64Array(n),
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
 * V receives the eigenvectors as columns (pass null when only the eigenvalues are wanted: a third
 * less work). Returns the index of the smallest eigenvalue.
 */
export function jacobiEigen(n: number, A: Float64Array, V: Float64Array | null): number {
  if (V) {
    V.fill(0, 0, n * n);
    for (let i = 0; i < n; i++) V[i * n + i] = 1;
  }
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
        if (V) for (let k = 0; k < n; k++) {
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

/**
 * Eigenvalues of the symmetric n×n matrix in A (row-major; destroyed), ascending into d (length n;
 * e, length n, is working space): Householder reduction to tridiagonal form, then the implicit QL
 * iteration with Wilkinson-type shifts (Golub & Van Loan, Matrix Computations, §8.3; the EISPACK
 * routines tred1/tql1). Eigenvalues only: about a tenth of the work of jacobiEigen with vectors.
 * Returns false if the iteration did not settle (then d holds no answer).
 */
export function symmetricEigenvalues(n: number, A: Float64Array, d: Float64Array, e: Float64Array): boolean {
  // Householder: for each column k, reflect rows/columns k+1…n−1 so that A[k+2…][k] vanish.
  for (let k = 0; k < n - 2; k++) {
    let alpha = 0;
    for (let i = k + 1; i < n; i++) alpha += A[i * n + k] * A[i * n + k];
    const x0 = A[(k + 1) * n + k];
    let norm = Math.sqrt(alpha);
    if (norm === 0) {
      e[k] = 0;
      continue;
    }
    if (x0 > 0) norm = -norm;
    // v = x − norm·e₁ (stored over the column), H = I − v vᵀ / h with h = norm² − x0·norm.
    const h = alpha - x0 * norm;
    A[(k + 1) * n + k] = x0 - norm;
    e[k] = norm;
    // p = A'v / h; K = vᵀp / (2h); q = p − K v; A' −= v qᵀ + q vᵀ (trailing block, lower triangle used symmetrically).
    let vp = 0;
    for (let i = k + 1; i < n; i++) {
      let sum = 0;
      for (let j = k + 1; j < n; j++) sum += A[i * n + j] * A[j * n + k];
      const pi = sum / h;
      d[i] = pi;
      vp += A[i * n + k] * pi;
    }
    const K = vp / (2 * h);
    for (let i = k + 1; i < n; i++) d[i] -= K * A[i * n + k];
    for (let i = k + 1; i < n; i++) {
      for (let j = k + 1; j < n; j++) A[i * n + j] -= A[i * n + k] * d[j] + d[i] * A[j * n + k];
    }
  }
  for (let i = 0; i < n; i++) d[i] = A[i * n + i];
  if (n >= 2) e[n - 2] = A[(n - 1) * n + (n - 2)];
  e[n - 1] = 0;
  // Implicit QL on the tridiagonal (d, e): e[i] couples i and i+1.
  for (let l = 0; l < n; l++) {
    let iter = 0;
    let m: number;
    do {
      for (m = l; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= 1e-15 * dd) break;
      }
      if (m !== l) {
        if (iter++ === 60) return false;
        let g = (d[l + 1] - d[l]) / (2 * e[l]);
        let r = Math.sqrt(g * g + 1);
        g = d[m] - d[l] + e[l] / (g + (g >= 0 ? r : -r));
        let sn = 1;
        let cs = 1;
        let p = 0;
        let i: number;
        let underflow = false;
        for (i = m - 1; i >= l; i--) {
          const f = sn * e[i];
          const b = cs * e[i];
          r = Math.sqrt(f * f + g * g);
          e[i + 1] = r;
          if (r === 0) {
            d[i + 1] -= p;
            e[m] = 0;
            underflow = true;
            break;
          }
          sn = f / r;
          cs = g / r;
          g = d[i + 1] - p;
          r = (d[i] - g) * sn + 2 * cs * b;
          p = sn * r;
          d[i + 1] = g + p;
          g = cs * r - b;
        }
        if (underflow) continue;
        d[l] -= p;
        e[l] = g;
        e[m] = 0;
      }
    } while (m !== l);
  }
  d.subarray(0, n).sort();
  return true;
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
  /**
   * The Jacobian of the scaled residual over the tyres' linearisation (row-major STATE_SIZE²) that
   * Newton formed on its last step, when it still holds at `state` (newton.ts: reusableJacobian);
   * the cheap stiffness is then read from it instead of fourteen linearised evaluations. Ignored
   * where a suspension stop engages within a few steps of the state (a kink: central differences
   * see both sides, the Jacobian's forward ones only one).
   */
  readonly jacobian?: Float64Array | null;
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
  const fresh = options.fresh ?? true;
  if (fresh) model.residual(state, true, scratch.res);
  if (mode === true) return exactCheck(model, state, scratch, options.step);
  const J = !fresh && options.step === undefined ? (options.jacobian ?? null) : null;
  const cheap = J && !nearStop(model) ? fromJacobian(model, J, scratch) : check(model, state, scratch, false, options.step ?? STIFFNESS_FD_STEP);
  if (mode === false || !(cheap.minEigen < EXACT_BELOW)) return cheap;
  if (options.step === undefined) {
    const refined = refineAlongMode(model, state, scratch, cheap);
    if (refined) return refined;
  }
  return exactCheck(model, state, scratch, options.step);
}

/** A wheel's travel this close to a bump stop or the droop limit counts as at it (m): ten finite-difference steps. */
const STOP_BAND_M = 10 * STIFFNESS_FD_STEP;

/** Whether a suspension stop engages within STOP_BAND_M of the travels in the model's buffers. */
function nearStop(model: VehicleModel): boolean {
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    const t = model.travel[i];
    if (Math.abs(t - ax.bumpM) < STOP_BAND_M || Math.abs(t + ax.droopM) < STOP_BAND_M) return true;
  }
  return false;
}

/**
 * The generalised forces as a fixed combination of the residual rows at the state (the rotation in
 * the model's buffers): G = C·res (generalisedForces is linear in res). Row i of C into row.
 */
function forceRow(model: VehicleModel, i: number, row: Float64Array): void {
  row.fill(0);
  if (i === 0) row[2] = 1;
  else if (i === 1) {
    const r = model.rot;
    row[3] = r[0];
    row[4] = r[3];
    row[5] = r[6];
  } else if (i === 2) {
    row[3] = -Math.sin(model.headingRad);
    row[4] = Math.cos(model.headingRad);
  } else {
    const a = (i - 3) >> 1;
    const ax = model.axles[a];
    const second = ((i - 3) & 1) === 1;
    row[R_SUSP + (i - 3)] = ax.solid && second ? ax.trackM / model.wheelbaseM : 1;
  }
}

/**
 * The cheap stiffness from Newton's Jacobian J (∂res/∂state): K = −C·J·diag(ℓ) on the configuration
 * columns (the state's first seven unknowns). The term (∂C/∂q)·res is left out: at a root res is
 * within the solver's tolerance of zero.
 */
function fromJacobian(model: VehicleModel, J: Float64Array, scratch: StabilityScratch): Stability {
  const n = CONFIG_SIZE;
  const K = scratch.Kraw;
  const row = scratch.res;
  for (let i = 0; i < n; i++) {
    forceRow(model, i, row);
    for (let j = 0; j < n; j++) {
      const k = stateIndex(j);
      let sum = 0;
      for (let r = 0; r < STATE_SIZE; r++) if (row[r] !== 0) sum += row[r] * J[r * STATE_SIZE + k];
      K[i * n + j] = -sum * coordinateLength(model, k);
    }
  }
  // scratch.res was used as a row buffer: it no longer holds a residual (nothing reads it after a non-fresh check).
  return eigenOf(scratch, false);
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
  const K = scratch.Kraw;
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
  return eigenOf(scratch, full);
}

/**
 * Symmetrises scratch.Kraw into scratch.K and takes its eigenvalues; the softest mode into
 * scratch.mode. Eigenvectors are formed only when the smallest eigenvalue is below EXACT_BELOW
 * (refineAlongMode needs the mode there; elsewhere nothing reads it).
 */
function eigenOf(scratch: StabilityScratch, full: boolean): Stability {
  const n = CONFIG_SIZE;
  const K = scratch.K;
  const Kraw = scratch.Kraw;
  let finite = true;
  for (let i = 0; i < n; i++) {
    for (let j = i; j < n; j++) {
      const s = 0.5 * (Kraw[i * n + j] + Kraw[j * n + i]);
      if (!Number.isFinite(s)) finite = false;
      K[i * n + j] = s;
      K[j * n + i] = s;
    }
  }
  if (!finite) return { minEigen: NaN, maxEigen: NaN, stable: false, exact: full };
  const eig = scratch.eig;
  scratch.A.set(K);
  const settled = symmetricEigenvalues(n, scratch.A, eig, scratch.work);
  if (!settled || eig[0] < EXACT_BELOW) {
    // The softest mode is wanted (refineAlongMode), or QL did not settle: Jacobi with vectors.
    scratch.A.set(K);
    const imin = jacobiEigen(n, scratch.A, scratch.V);
    for (let i = 0; i < n; i++) {
      scratch.mode[i] = scratch.V[i * n + imin];
      eig[i] = scratch.A[i * n + i];
    }
    eig.sort();
  }
  const maxAbs = Math.max(Math.abs(eig[0]), Math.abs(eig[n - 1]));
  const minEigen = eig[0];
  return { minEigen, maxEigen: maxAbs, stable: minEigen > -STABILITY_REL_TOL * maxAbs, exact: full };
}

/**
 * Largest distance (per W·L) between the Rayleigh quotient along the cheap softest mode and the
 * smallest eigenvalue of the full-equation stiffness that refineAlongMode accepts; beyond it the
 * whole matrix is differenced.
 */
export const REFINE_TOL = 1e-3;

/**
 * The full equations along the cheap softest mode v only (after eigenOf put it in scratch.mode and
 * the eigenvalues, ascending, in scratch.eig): w = K_full·v by central differences of the full
 * equations (two ray casts), ρ = vᵀw (the Rayleigh quotient: never below the full matrix's smallest
 * eigenvalue) and the residual s = w − ρv − (antisymmetric part of the cheap K)·v, i.e. that of the
 * symmetric part. By the Kato–Temple inequality (Parlett, The Symmetric Eigenvalue Problem, §10.3)
 * the smallest eigenvalue λ₁ of the full matrix satisfies ρ − |s|²/(β − ρ) ≤ λ₁ ≤ ρ for any β ≤ λ₂
 * above ρ; β is the cheap second-smallest eigenvalue less half its gap to ρ (the linearisation
 * misses a few hundredths: module comment). As in exactCheck, an unstable first verdict is tried
 * again with a step ten times longer and the larger quotient kept. ρ is returned when that bound is
 * within REFINE_TOL and decides the sign; else null (the whole matrix is differenced). One more ray
 * cast at the state leaves the buffers there.
 */
function refineAlongMode(model: VehicleModel, state: Float64Array, scratch: StabilityScratch, cheap: Stability): Stability | null {
  const tol = STABILITY_REL_TOL * cheap.maxEigen;
  let rho = alongMode(model, state, scratch, cheap, EXACT_FD_STEP);
  let bound = _bound;
  if (!(rho - bound > -tol)) {
    const longer = alongMode(model, state, scratch, cheap, 10 * EXACT_FD_STEP);
    if (longer > rho) {
      rho = longer;
      bound = _bound;
    }
  }
  model.residual(state, true, scratch.res);
  if (!(bound <= REFINE_TOL) || !Number.isFinite(rho)) return null;
  // The sign must be decided by the bound: a quotient within it of zero goes to the whole matrix.
  if (!(rho - bound > -tol) && !(rho < -tol)) return null;
  return { minEigen: rho, maxEigen: cheap.maxEigen, stable: rho - bound > -tol, exact: true };
}

/** The Kato–Temple bound of the last alongMode call (per W·L; Infinity when it does not apply). */
let _bound = Infinity;

/** Rayleigh quotient of the full-equation stiffness along scratch.mode with state step h; its bound into _bound. */
function alongMode(model: VehicleModel, state: Float64Array, scratch: StabilityScratch, cheap: Stability, h: number): number {
  const n = CONFIG_SIZE;
  const v = scratch.mode;
  const second = scratch.eig[1];
  _bound = Infinity;
  // The physical step along v: the longest state change h (as exactCheck takes per coordinate).
  let reach = 0;
  for (let j = 0; j < n; j++) reach = Math.max(reach, Math.abs(v[j]) * coordinateLength(model, stateIndex(j)));
  if (!(reach > 0) || !Number.isFinite(second)) return NaN;
  const eps = h / reach;
  const q = scratch.q;
  q.set(state);
  for (let j = 0; j < n; j++) q[stateIndex(j)] = state[stateIndex(j)] + eps * v[j] * coordinateLength(model, stateIndex(j));
  model.residual(q, true, scratch.res);
  generalisedForces(model, scratch.res, scratch.g1);
  for (let j = 0; j < n; j++) q[stateIndex(j)] = state[stateIndex(j)] - eps * v[j] * coordinateLength(model, stateIndex(j));
  model.residual(q, true, scratch.res);
  generalisedForces(model, scratch.res, scratch.g0);
  q.set(state);
  const w = scratch.w;
  let rho = 0;
  for (let i = 0; i < n; i++) {
    w[i] = -(scratch.g1[i] - scratch.g0[i]) / (2 * eps);
    rho += v[i] * w[i];
  }
  // Residual of the symmetric part: w − ρv − ((Kraw − Krawᵀ)/2)·v.
  const Kraw = scratch.Kraw;
  let s2 = 0;
  for (let i = 0; i < n; i++) {
    let skew = 0;
    for (let j = 0; j < n; j++) skew += 0.5 * (Kraw[i * n + j] - Kraw[j * n + i]) * v[j];
    const si = w[i] - rho * v[i] - skew;
    s2 += si * si;
  }
  const beta = second - 0.5 * (second - cheap.minEigen);
  if (beta > rho) _bound = s2 / (beta - rho);
  return rho;
}
