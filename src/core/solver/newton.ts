/**
 * Newton's method on the vehicle's equilibrium equations (see model.ts), with a Jacobian by
 * finite differences over the tyres' linearisation (one ray cast per iteration, not one per
 * unknown), a step limit, a backtracking line search, and a damped least-squares step where the
 * Newton system is singular. The solve (equilibrium.ts) decides where to start from and whether the
 * root it reaches is the answer; the result builder (result.ts) turns a state into a plain result.
 */
import type { SolveStatus } from '../model/types';
import { solveLinearInPlace } from '../math/linalg';
import { Q_PITCH, Q_ROLL, Q_SUSP, Q_VX, Q_VY, Q_Z, STATE_SIZE, type VehicleModel } from './model';

export const DEFAULT_TOLERANCE = 1e-7;
export const DEFAULT_MAX_ITERATIONS = 60;
/** Largest change per Newton step: heave (m), rotations (rad), travel (m), grip field (–). */
const MAX_STEP = [0.08, 0.08, 0.08, 0.05, 0.05, 0.05, 0.05, 0.5, 0.5, 0.5];
/** Finite-difference steps for the Jacobian, per unknown. */
const FD_STEP = 1e-7;
/** Finite-difference step of the full-equation Jacobian (the ray searches resolve to 1e-10 m). */
const FULL_FD_STEP = 1e-7;
/** Body attitude beyond which the vehicle is taken to have gone over (rad, about 75°). */
const RUNAWAY_ANGLE_RAD = 1.3;
const LINE_SEARCH_HALVINGS = 4;
const FULL_LINE_SEARCH_HALVINGS = 12;
/** With the full Jacobian: iterations without a fourfold fall, and steps taken without any fall, before giving up. */
const FULL_PROGRESS_WINDOW = 12;
const FULL_STALLS = 3;
/** How far past touching a lifted tyre may be driven by one Newton step (m). */
const CONTACT_OVERSHOOT_M = 0.002;
/** The contact step limit never shortens a step below this fraction. */
const MIN_CONTACT_STEP = 0.02;
/** Give up when the residual has not halved over this many iterations (no equilibrium nearby). */
const PROGRESS_WINDOW = 6;
/**
 * The last cheap Jacobian stands for the one at the root when it was formed where the scaled
 * residual was below this (the step from there to the root is then of the order of the residual
 * over the stiffness: the tyres' stiffness changes by a few parts in 10⁵ over it).
 */
const REUSE_MAX_RESIDUAL = 1e-3;

const N = STATE_SIZE;
const _x = new Float64Array(N);
const _xt = new Float64Array(N);
/** The residual at the state newton() leaves (read by the solve and the result builder). */
export const residualOut = new Float64Array(N);
const _r = residualOut;
const _rt = new Float64Array(N);
const _r0 = new Float64Array(N);
const _rk = new Float64Array(N);
const _J = new Float64Array(N * N);
const _A = new Float64Array(N * N);
const _rhs = new Float64Array(N);
const _dx = new Float64Array(N);

const _groundGuess = new Float64Array(4);

/** Where the last cheap Jacobian was formed: its scaled residual, and which tyre slices carried load there. */
let _jacOk = false;
let _jacResidual = Infinity;
let _jacLoaded = new Uint8Array(12);
let _reusable = false;

function recordContacts(model: VehicleModel): void {
  const m = model.sliceLoad.length;
  if (_jacLoaded.length < m) _jacLoaded = new Uint8Array(m);
  for (let k = 0; k < m; k++) _jacLoaded[k] = model.sliceLoad[k] > 0 ? 1 : 0;
}

function sameContacts(model: VehicleModel): boolean {
  const m = model.sliceLoad.length;
  for (let k = 0; k < m; k++) if (_jacLoaded[k] !== (model.sliceLoad[k] > 0 ? 1 : 0)) return false;
  return true;
}

/**
 * The Jacobian (∂res/∂state over the tyres' linearisation, row-major STATE_SIZE²) of the last
 * newton() call's last step, when it may stand for the one at the root that call converged to:
 * formed over the linearisation (not the full equations), where the residual was already below
 * REUSE_MAX_RESIDUAL, with the same tyre slices in contact as at the root. Else null. Valid until
 * the next newton() call (stability.ts reads its configuration columns).
 */
export function reusableJacobian(): Float64Array | null {
  return _reusable ? _J : null;
}

function maxAbs(r: Float64Array): number {
  let m = 0;
  for (let i = 0; i < r.length; i++) {
    const v = Math.abs(r[i]);
    if (!(v <= m)) m = v; // NaN propagates as "large"
  }
  return Number.isNaN(m) ? Infinity : m;
}

function norm2(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += r[i] * r[i];
  return Number.isFinite(s) ? s : Infinity;
}

/** Ground height under each wheel's ride-height position at the model's pose (m), into out. */
export function groundUnderWheels(model: VehicleModel, out: Float64Array): Float64Array {
  const c = Math.cos(model.headingRad);
  const s = Math.sin(model.headingRad);
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    const yb = (i & 1) === 0 ? ax.trackM / 2 : -ax.trackM / 2;
    out[i] = model.field.height(model.poseX + c * ax.xM - s * yb, model.poseY + s * ax.xM + c * yb);
  }
  return out;
}

const _grip = new Float64Array(2);

/**
 * The grip field that holds a vehicle on a plane of unit normal n under gravity g: the tangential
 * part of gravity over its normal part, taken back to the terrain x-y plane along the normal
 * (T = N·P v, P the projection on the plane), into out (vx, vy). On level ground −(gx, gy)/|gz|.
 */
export function gripOnPlane(g: Float64Array, n: Float64Array, out: Float64Array): Float64Array {
  const nx = n[0], ny = n[1], nz = n[2];
  const gn = g[0] * nx + g[1] * ny + g[2] * nz;
  const gd = Math.abs(gn) > 1e-9 ? Math.abs(gn) : 1e-9;
  const tx = -(g[0] - gn * nx) / gd;
  const ty = -(g[1] - gn * ny) / gd;
  const tz = -(g[2] - gn * nz) / gd;
  out[0] = tx - (tz * nx) / nz;
  out[1] = ty - (tz * ny) / nz;
  return out;
}

/** Unit normal of the plane the last initialGuess fitted to the ground under the wheels (terrain frame). */
export const guessNormal = new Float64Array([0, 0, 1]);

/** Ride-height guess: the body laid on a plane fitted to the ground under the four wheels (its normal into guessNormal). */
export function initialGuess(model: VehicleModel, x: Float64Array): void {
  x.fill(0);
  const h = groundUnderWheels(model, _groundGuess);
  const L = model.wheelbaseM;
  const T = 0.5 * (model.axles[0].trackM + model.axles[1].trackM);
  const mean = 0.25 * (h[0] + h[1] + h[2] + h[3]);
  const slopeX = (h[0] + h[1] - h[2] - h[3]) / (2 * L);
  const slopeY = (h[0] - h[1] + h[2] - h[3]) / (2 * T);
  x[Q_Z] = mean;
  // The body's z axis along the fitted plane's normal (−slopeX, −slopeY, 1) in the heading frame:
  // R = Rz Ry(θ) Rx(φ) takes z to (sin θ cos φ, −sin φ, cos θ cos φ).
  x[Q_PITCH] = -Math.atan(slopeX);
  x[Q_ROLL] = Math.asin(slopeY / Math.sqrt(1 + slopeX * slopeX + slopeY * slopeY));
  for (let a = 0; a < 2; a++) {
    const ax = model.axles[a];
    const sign = a === 0 ? 1 : -1;
    const tL = h[2 * a] - (mean + sign * slopeX * (L / 2) + slopeY * (ax.trackM / 2));
    const tR = h[2 * a + 1] - (mean + sign * slopeX * (L / 2) - slopeY * (ax.trackM / 2));
    const clampT = (t: number): number => Math.max(-ax.droopM, Math.min(ax.bumpM, t));
    if (ax.solid) {
      x[Q_SUSP + 2 * a] = clampT(0.5 * (tL + tR));
      x[Q_SUSP + 2 * a + 1] = Math.atan((clampT(tL) - clampT(tR)) / ax.trackM);
    } else {
      x[Q_SUSP + 2 * a] = clampT(tL);
      x[Q_SUSP + 2 * a + 1] = clampT(tR);
    }
  }
  const c = Math.cos(model.headingRad);
  const s = Math.sin(model.headingRad);
  // Plane slope in the terrain frame: ∂h/∂x, ∂h/∂y from the body-frame slopes.
  const hx = c * slopeX - s * slopeY;
  const hy = s * slopeX + c * slopeY;
  const nl = Math.sqrt(hx * hx + hy * hy + 1);
  const nx = -hx / nl, ny = -hy / nl, nz = 1 / nl;
  guessNormal[0] = nx;
  guessNormal[1] = ny;
  guessNormal[2] = nz;
  gripOnPlane(model.gravity, guessNormal, _grip);
  x[Q_VX] = _grip[0];
  x[Q_VY] = _grip[1];
}

/**
 * Jacobian of the scaled residual by forward differences at x: over the tyres' linearisation
 * (full = false: cheap, no ray casts) or over the full equations (full = true: ten ray casts).
 * `r` holds the full residual at x (the model's buffers hold that evaluation) and is left as it is;
 * so are the buffers.
 */
function jacobian(model: VehicleModel, x: Float64Array, r: Float64Array, full: boolean, J: Float64Array): void {
  const step = full ? FULL_FD_STEP : FD_STEP;
  // The base: the full residual itself, or the linearised one at x (equal to it up to rounding).
  if (full) _r0.set(r);
  else model.residual(x, false, _r0);
  for (let k = 0; k < N; k++) {
    const keep = x[k];
    x[k] = keep + step;
    model.residual(x, full, _rk);
    x[k] = keep;
    for (let i = 0; i < N; i++) J[i * N + k] = (_rk[i] - _r0[i]) / step;
  }
  // The full differences re-cast the tyres at the perturbed states: cast them at x again.
  if (full) model.residual(x, true, _rk);
}

/** Height of tyre i's lowest point above the ground straight below its centre (m); negative when pressed in. */
function tyreGap(model: VehicleModel, i: number): number {
  const w = model.wheelCentre;
  return w[3 * i + 2] - model.axles[i >> 1].radiusM - model.field.height(w[3 * i], w[3 * i + 1]);
}

/** The largest fraction (≤ scale) of the step dx that keeps every unknown within its cap. */
function stepCap(dx: Float64Array, scale: number): number {
  let s = scale;
  for (let k = 0; k < N; k++) {
    const a = Math.abs(dx[k]);
    if (a * s > MAX_STEP[k]) s = MAX_STEP[k] / a;
  }
  return s;
}

const _gap = new Float64Array(4);
const _travel = new Float64Array(4);

/**
 * Newton's linear model knows nothing of a contact or a stop that is not engaged yet: a step can
 * drive a lifted tyre deep into the ground or a corner far past its droop or bump limit. Shorten
 * the step so that nothing goes more than a little past where it engages; the next iteration
 * then sees it. Leaves the model's kinematics at x.
 */
function contactStepLimit(model: VehicleModel, x: Float64Array, scale: number): number {
  for (let i = 0; i < 4; i++) {
    _travel[i] = model.travel[i];
    _gap[i] = model.contacts[i].loadedSlices > 0 ? NaN : tyreGap(model, i);
  }
  for (let k = 0; k < N; k++) _xt[k] = x[k] + scale * _dx[k];
  model.kinematics(_xt);
  let s = scale;
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    if (!Number.isNaN(_gap[i])) s = limitAtEdge(_gap[i], tyreGap(model, i), 0, scale, s);
    s = limitAtEdge(_travel[i], model.travel[i], -ax.droopM, scale, s);
    s = limitAtEdge(-_travel[i], -model.travel[i], -ax.bumpM, scale, s);
  }
  model.kinematics(x);
  return s;
}

/**
 * One quantity going from `before` (on the free side of `edge`) to `after` under the step of
 * length `scale`: if that takes it more than CONTACT_OVERSHOOT_M past the edge, the step fraction
 * that stops it there (never below MIN_CONTACT_STEP of the step); else `s` unchanged.
 */
function limitAtEdge(before: number, after: number, edge: number, scale: number, s: number): number {
  if (!(before > edge && after < edge - CONTACT_OVERSHOOT_M)) return s;
  const f = (before - edge + CONTACT_OVERSHOOT_M) / (before - after);
  return f * scale < s ? Math.max(f * scale, MIN_CONTACT_STEP * scale) : s;
}

/** Damped least squares step: (JᵀJ + λ diag(JᵀJ) + λ·ε I) dx = −Jᵀ r. */
function dampedStep(J: Float64Array, r: Float64Array, lambda: number, dx: Float64Array): boolean {
  let trace = 0;
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      let s = 0;
      for (let k = 0; k < N; k++) s += J[k * N + i] * J[k * N + j];
      _A[i * N + j] = s;
    }
    trace += _A[i * N + i];
    let g = 0;
    for (let k = 0; k < N; k++) g += J[k * N + i] * r[k];
    _rhs[i] = -g;
  }
  const floor = 1e-12 * (trace / N + 1e-30);
  for (let i = 0; i < N; i++) _A[i * N + i] += lambda * _A[i * N + i] + lambda * floor + floor;
  return solveLinearInPlace(N, _A, _rhs, dx, 0);
}

function totalLoadedSlices(model: VehicleModel): number {
  let n = 0;
  for (let i = 0; i < 4; i++) n += model.contacts[i].loadedSlices;
  return n;
}

/**
 * Gap between the lowest tyre and the ground beneath it (m); negative when some tyre is pressed in.
 * Used only to drop a vehicle that has no contact at all onto the ground.
 */
function lowestGap(model: VehicleModel): number {
  let gap = Infinity;
  for (let i = 0; i < 4; i++) gap = Math.min(gap, tyreGap(model, i));
  return gap;
}

export interface NewtonOutcome {
  status: SolveStatus;
  reason: string;
  iterations: number;
}

/** Newton iterations from x (updated in place); on return the model's buffers hold x's full evaluation and _r its residual. */
export function newton(model: VehicleModel, x: Float64Array, tol: number, maxIt: number, allowFull = true): NewtonOutcome {
  _jacOk = false;
  _reusable = false;
  model.residual(x, true, _r);
  let n2 = norm2(_r);
  let status: SolveStatus = 'not-converged';
  let reason = '';
  let it = 0;
  let drops = 0;
  let stalls = 0;
  let checkpoint = n2;
  let checkpointIt = 0;
  // The tyres' linearisation makes a cheap Jacobian; where it is not good enough (large camber,
  // three-wheel stances, a wheel on an edge) progress stalls, and the solver switches to a
  // Jacobian by finite differences of the full equations (ten more ray casts per iteration).
  let fullJacobian = false;
  for (; it <= maxIt; it++) {
    if (maxAbs(_r) < tol) {
      status = 'converged';
      reason = 'equilibrium found';
      _reusable = _jacOk && _jacResidual <= REUSE_MAX_RESIDUAL && sameContacts(model);
      break;
    }
    if (it === maxIt) {
      reason = `no equilibrium within ${maxIt} iterations (scaled residual ${maxAbs(_r).toExponential(2)}); raise maxIterations or check the pose`;
      break;
    }
    if (totalLoadedSlices(model) === 0) {
      // Nothing touches: drop the vehicle onto the ground and try again.
      const gap = lowestGap(model);
      if (drops++ > 8 || !Number.isFinite(gap)) {
        status = 'no-contact';
        reason = 'no tyre reaches the ground';
        break;
      }
      x[Q_Z] -= gap + 0.005;
      model.residual(x, true, _r);
      n2 = norm2(_r);
      continue;
    }
    if (!fullJacobian) {
      _jacResidual = maxAbs(_r);
      recordContacts(model);
    }
    _jacOk = !fullJacobian;
    jacobian(model, x, _r, fullJacobian, _J);
    _A.set(_J);
    for (let i = 0; i < N; i++) _rhs[i] = -_r[i];
    let ok = solveLinearInPlace(N, _A, _rhs, _dx);
    if (!ok || !_dx.every(Number.isFinite)) ok = dampedStep(_J, _r, 1e-3, _dx);
    if (!ok) {
      reason = 'the equilibrium equations are singular at this pose';
      break;
    }
    // Step limit: scale the whole step so no unknown moves more than its cap.
    const scale = contactStepLimit(model, x, stepCap(_dx, 1));
    let alpha = scale;
    let accepted = false;
    const m0 = maxAbs(_r);
    const halvings = fullJacobian ? FULL_LINE_SEARCH_HALVINGS : LINE_SEARCH_HALVINGS;
    // With the full Jacobian the Newton step is trusted: try it whole first (it can jump over a
    // contact change that a shortened step lands on), then the capped and halved steps.
    const tryWhole = fullJacobian && scale < 1;
    for (let ls = tryWhole ? -1 : 0; ls < halvings; ls++) {
      const a = ls < 0 ? 1 : alpha;
      for (let k = 0; k < N; k++) _xt[k] = x[k] + a * _dx[k];
      model.residual(_xt, true, _rt);
      const nt = norm2(_rt);
      // Accept a decrease of either the sum of squares or the largest equation: with contacts
      // coming and going the two need not fall together.
      if (nt <= (1 - 1e-4 * a) * n2 || maxAbs(_rt) < m0) {
        accepted = true;
        n2 = nt;
        break;
      }
      if (ls >= 0) alpha *= 0.5;
    }
    if (!accepted && fullJacobian && stalls < FULL_STALLS) {
      // With the full Jacobian, take the shortest step tried even without a decrease: with
      // contacts coming and going the residual need not fall monotonically on the way.
      stalls++;
      n2 = norm2(_rt);
      x.set(_xt);
      _r.set(_rt);
      continue;
    }
    if (!accepted && !allowFull) {
      reason = `no equilibrium nearby: the Newton step found no decrease (scaled ${maxAbs(_r).toExponential(2)})`;
      model.residual(x, true, _r);
      break;
    }
    if (!accepted) {
      // No decrease along the Newton direction: take a damped least-squares step instead.
      let lambda = 1e-2;
      for (let tries = 0; tries < 3 && !accepted; tries++, lambda *= 30) {
        if (!dampedStep(_J, _r, lambda, _dx)) continue;
        const s = stepCap(_dx, 1);
        for (let k = 0; k < N; k++) _xt[k] = x[k] + s * _dx[k];
        model.residual(_xt, true, _rt);
        const nt = norm2(_rt);
        if (nt < n2) {
          accepted = true;
          n2 = nt;
        }
      }
    }
    if (!accepted) {
      stalls++;
      // Keep the model's buffers on x itself.
      model.residual(x, true, _r);
      if (!fullJacobian && allowFull) {
        fullJacobian = true;
        stalls = 0;
        checkpoint = n2;
        checkpointIt = it;
        continue;
      }
      if (stalls >= 2) {
        reason = `the solver stalled at scaled residual ${maxAbs(_r).toExponential(2)}`;
        break;
      }
      continue;
    }
    stalls = 0;
    x.set(_xt);
    _r.set(_rt);
    if (n2 < 0.25 * checkpoint) {
      checkpoint = n2;
      checkpointIt = it;
    } else if (it - checkpointIt >= PROGRESS_WINDOW && !fullJacobian && allowFull) {
      fullJacobian = true;
      checkpoint = n2;
      checkpointIt = it;
    } else if (it - checkpointIt >= (fullJacobian ? FULL_PROGRESS_WINDOW : PROGRESS_WINDOW)) {
      reason = `no equilibrium nearby: the residual stopped falling (scaled ${maxAbs(_r).toExponential(2)})`;
      break;
    }
    if (Math.abs(x[Q_ROLL]) > RUNAWAY_ANGLE_RAD || Math.abs(x[Q_PITCH]) > RUNAWAY_ANGLE_RAD) {
      status = 'tipped';
      reason = 'the body rolled or pitched past 75° looking for support: it goes over';
      break;
    }
  }
  return { status, reason, iterations: it };
}

