/**
 * Quasi-static pose solver: Newton's method on the vehicle's equilibrium equations (see model.ts),
 * with a Jacobian by finite differences over the tyres' linearisation (one ray cast per
 * iteration, not one per unknown), a step limit, a backtracking line search, and a damped
 * least-squares step where the Newton system is singular.
 */
import type {
  Pose,
  SolveOptions,
  SolveResult,
  SolveStatus,
  StabilityMargins,
  Terrain,
  Vehicle,
  WheelName,
  WheelResult,
} from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { solveLinearInPlace } from '../math/linalg';
import { TerrainField } from '../terrain/field';
import { stabilityMargins } from './margins';
import {
  GRAVITY_MPS2,
  type ModelOptions,
  Q_PITCH,
  Q_ROLL,
  Q_SUSP,
  Q_VX,
  Q_VY,
  Q_Z,
  R_SUSP,
  STATE_SIZE,
  VehicleModel,
  rigidStaticLoads,
} from './model';

export const DEFAULT_TOLERANCE = 1e-7;
export const DEFAULT_MAX_ITERATIONS = 60;
export const DEFAULT_FRICTION = 0.7;
/** Largest change per Newton step: heave (m), rotations (rad), travel (m), grip field (–). */
const MAX_STEP = [0.08, 0.08, 0.08, 0.05, 0.05, 0.05, 0.05, 0.5, 0.5, 0.5];
/** Finite-difference steps for the Jacobian, per unknown. */
const FD_STEP = 1e-7;
/** Finite-difference step of the full-equation Jacobian (the ray searches resolve to 1e-10 m). */
const FULL_FD_STEP = 1e-7;
/** Body attitude beyond which the vehicle is taken to have gone over (rad, about 75°). */
const RUNAWAY_ANGLE_RAD = 1.3;
/** Travel below this counts as none when expressing travel as a fraction of what is available (m). */
const MIN_TRAVEL_M = 1e-9;
const LINE_SEARCH_HALVINGS = 4;
const FULL_LINE_SEARCH_HALVINGS = 12;
/** With the full Jacobian: iterations without a fourfold fall, and steps taken without any fall, before giving up. */
const FULL_PROGRESS_WINDOW = 12;
const FULL_STALLS = 3;
/** How far past touching a lifted tyre may be driven by one Newton step (m). */
const CONTACT_OVERSHOOT_M = 0.002;
/** The contact step limit never shortens a step below this fraction. */
const MIN_CONTACT_STEP = 0.02;
/** Continuation for hard cold starts: steps from untilted, softened tyres to the real pose. */
const CONTINUATION_STEPS = 4;
/** Tyre rate the continuation starts from (N/m): soft enough that contact changes are gentle. */
const SOFT_TYRE_NPERM = 2e5;
/** Give up when the residual has not halved over this many iterations (no equilibrium nearby). */
const PROGRESS_WINDOW = 6;

const N = STATE_SIZE;
const _x = new Float64Array(N);
const _xt = new Float64Array(N);
const _r = new Float64Array(N);
const _rt = new Float64Array(N);
const _r0 = new Float64Array(N);
const _rk = new Float64Array(N);
const _J = new Float64Array(N * N);
const _A = new Float64Array(N * N);
const _rhs = new Float64Array(N);
const _dx = new Float64Array(N);
const _keep = new Float64Array(N);

/** Assembles a vehicle on a terrain, ready to solve; computes its level-ground static loads. */
export function buildModel(vehicle: Vehicle, terrain: Terrain, options: Partial<ModelOptions> = {}): VehicleModel {
  const model = new VehicleModel(vehicle, terrain, options);
  // Level-ground loads with the payload: a solve on flat ground. Before it, the statics estimate.
  rigidStaticLoads(
    model.weightN,
    model.wheelbaseM,
    model.wheelbaseM / 2 - model.cgTotalBody[0],
    model.cgTotalBody[1],
    vehicle.trackFrontM,
    vehicle.trackRearM,
    model.staticLoadN,
  );
  const field = model.field;
  model.field = new TerrainField({ features: [] });
  const level = solveEquilibrium(model, { xM: 0, yM: 0, headingRad: 0 });
  if (level.status === 'converged') {
    for (let i = 0; i < 4; i++) model.staticLoadN[i] = level.wheels[i].loadN;
  }
  model.field = field;
  return model;
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

const _ground = new Float64Array(4);

/** Ground height under each wheel's ride-height position at the model's pose (m), into out. */
function groundUnderWheels(model: VehicleModel, out: Float64Array): Float64Array {
  const c = Math.cos(model.headingRad);
  const s = Math.sin(model.headingRad);
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    const yb = (i & 1) === 0 ? ax.trackM / 2 : -ax.trackM / 2;
    out[i] = model.field.height(model.poseX + c * ax.xM - s * yb, model.poseY + s * ax.xM + c * yb);
  }
  return out;
}

/** Ride-height guess: the body laid on a plane fitted to the ground under the four wheels. */
export function initialGuess(model: VehicleModel, x: Float64Array): void {
  x.fill(0);
  const h = groundUnderWheels(model, _ground);
  const L = model.wheelbaseM;
  const T = 0.5 * (model.axles[0].trackM + model.axles[1].trackM);
  const mean = 0.25 * (h[0] + h[1] + h[2] + h[3]);
  const slopeX = (h[0] + h[1] - h[2] - h[3]) / (2 * L);
  const slopeY = (h[0] - h[1] + h[2] - h[3]) / (2 * T);
  x[Q_Z] = mean;
  x[Q_PITCH] = -Math.atan(slopeX);
  x[Q_ROLL] = Math.atan(slopeY);
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
  const g = model.gravity;
  const gn = Math.abs(g[2]) > 1e-9 ? Math.abs(g[2]) : 1e-9;
  x[Q_VX] = -g[0] / gn;
  x[Q_VY] = -g[1] / gn;
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

/**
 * Finds the static equilibrium of the vehicle standing at `pose` on the model's terrain (tilted
 * as options.tilt says). Failure is a result, never an exception: see SolveResult.status.
 * Tuning: raise maxIterations if status is 'not-converged' on a hard pose (vertical faces,
 * a wheel balanced on an edge); a warm start from a nearby pose's `state` converges in 1–3 steps.
 */
export function solveEquilibrium(model: VehicleModel, pose: Pose, options: SolveOptions = {}): SolveResult {
  const tilt = options.tilt ?? { angleRad: 0, downhillRad: 0 };
  const tol = options.tolerance ?? DEFAULT_TOLERANCE;
  const maxIt = options.maxIterations ?? DEFAULT_MAX_ITERATIONS;
  const friction = options.friction ?? DEFAULT_FRICTION;
  model.setPose(pose.xM, pose.yM, pose.headingRad);
  model.setTilt(tilt.angleRad, tilt.downhillRad);
  model.fullEvaluations = 0;
  const x = _x;
  const warm = !!options.warmStart && options.warmStart.length === N && options.warmStart.every(Number.isFinite);
  if (warm) x.set(options.warmStart as Float64Array);
  else initialGuess(model, x);

  if (!(model.gravity[2] < -1e-6 * GRAVITY_MPS2)) {
    model.residual(x, true, _r);
    return collect(model, x, _r, 'no-contact', 0, 'gravity does not press the vehicle onto the ground: tilted to 90° or beyond', friction);
  }

  const quick = options.quick === true;
  let out = newton(model, x, tol, maxIt, !quick);
  if (out.status !== 'converged' && !warm && !quick) {
    // A hard cold start (stiff tyres, a big tilt): ease into it. Start untilted on softened tyres
    // and step to the real tilt and stiffness, warm-starting each step; keep the first answer if
    // that fails too (a real tip stays a tip).
    _keep.set(x);
    const first = out;
    let kmax = 0;
    for (const t of [model.vehicle.tyreFront, model.vehicle.tyreRear]) kmax = Math.max(kmax, t.stiffnessNPerM);
    const s0 = Math.min(1, SOFT_TYRE_NPERM / kmax);
    let iterations = first.iterations;
    let ok = true;
    model.setTilt(0, tilt.downhillRad);
    initialGuess(model, x);
    for (let k = 0; k <= CONTINUATION_STEPS; k++) {
      const lambda = k / CONTINUATION_STEPS;
      model.tyreRateScale = Math.pow(s0, 1 - lambda);
      model.setTilt(lambda * tilt.angleRad, tilt.downhillRad);
      const o = newton(model, x, k === CONTINUATION_STEPS ? tol : Math.max(tol, 1e-6), maxIt);
      iterations += o.iterations;
      if (o.status !== 'converged') {
        ok = false;
        break;
      }
    }
    model.tyreRateScale = 1;
    model.setTilt(tilt.angleRad, tilt.downhillRad);
    if (ok) {
      model.residual(x, true, _r);
      out = { status: 'converged', reason: 'equilibrium found (eased in from the untilted pose)', iterations };
    } else {
      x.set(_keep);
      model.residual(x, true, _r);
      out = { ...first, iterations };
    }
  }
  return collect(model, x, _r, out.status, out.iterations, out.reason, friction);
}

interface NewtonOutcome {
  status: SolveStatus;
  reason: string;
  iterations: number;
}

/** Newton iterations from x (updated in place); on return the model's buffers hold x's full evaluation and _r its residual. */
function newton(model: VehicleModel, x: Float64Array, tol: number, maxIt: number, allowFull = true): NewtonOutcome {
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


const _pts: number[] = [];
const _ptWheel: number[] = [];

/** Builds the plain result object from state x (model buffers must hold x's full evaluation). */
function collect(
  model: VehicleModel,
  x: Float64Array,
  r: Float64Array,
  statusIn: SolveStatus,
  iterations: number,
  reasonIn: string,
  friction: number,
): SolveResult {
  let status = statusIn;
  let reason = reasonIn;
  const ns = model.layout.slices;
  const g = model.gravity;
  const G = Math.hypot(g[0], g[1], g[2]);
  const up: [number, number, number] = [-g[0] / G, -g[1] / G, -g[2] / G];
  const W = model.weightN;
  _pts.length = 0;
  _ptWheel.length = 0;
  const wheels: WheelResult[] = [];
  let totalLoad = 0;
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    // Per wheel: normal load (sum over slices), the ground force (springs + correction), its
    // normal direction, the centre of pressure and the mean deflection.
    let load = 0, fx = 0, fy = 0, fz = 0, nx = 0, ny = 0, nz = 0, px = 0, py = 0, pz = 0, dsum = 0;
    for (let j = 0; j < ns; j++) {
      const k3 = (i * ns + j) * 3;
      const Nj = model.sliceLoad[i * ns + j];
      fx += model.sliceForce[k3] + model.sliceGrip[k3];
      fy += model.sliceForce[k3 + 1] + model.sliceGrip[k3 + 1];
      fz += model.sliceForce[k3 + 2] + model.sliceGrip[k3 + 2];
      if (Nj > 0) {
        load += Nj;
        nx += Nj * model.sliceNormal[k3]; ny += Nj * model.sliceNormal[k3 + 1]; nz += Nj * model.sliceNormal[k3 + 2];
        px += Nj * model.slicePoint[k3]; py += Nj * model.slicePoint[k3 + 1]; pz += Nj * model.slicePoint[k3 + 2];
        dsum += Nj * model.contacts[i].deflection[j];
        _pts.push(model.slicePoint[k3], model.slicePoint[k3 + 1], model.slicePoint[k3 + 2]);
        _ptWheel.push(i);
      }
    }
    const nl = Math.hypot(nx, ny, nz) || 1;
    nx /= nl; ny /= nl; nz /= nl;
    const fn = fx * nx + fy * ny + fz * nz;
    const tx = fx - fn * nx, ty = fy - fn * ny, tz = fz - fn * nz;
    totalLoad += load;
    const lifted = model.contacts[i].loadedSlices === 0 || !(load > 0);
    const c = model.wheelCentre;
    const centre: [number, number, number] = [c[3 * i], c[3 * i + 1], c[3 * i + 2]];
    const axis: [number, number, number] = [model.wheelAxis[3 * i], model.wheelAxis[3 * i + 1], model.wheelAxis[3 * i + 2]];
    const tangential = Math.hypot(tx, ty, tz);
    const t = model.travel[i];
    const avail = t >= 0 ? ax.bumpM : ax.droopM;
    wheels.push({
      name: WHEEL_NAMES[i],
      loadN: lifted ? 0 : load,
      verticalLoadN: lifted ? 0 : fx * up[0] + fy * up[1] + fz * up[2],
      loadShare: lifted ? 0 : load / model.staticLoadN[i],
      staticLoadN: model.staticLoadN[i],
      lifted,
      contactPointWorld: lifted ? [centre[0], centre[1], centre[2] - ax.radiusM] : [px / load, py / load, pz / load],
      contactNormalWorld: lifted ? [0, 0, 1] : [nx, ny, nz],
      centreWorld: centre,
      axisWorld: axis,
      travelM: t,
      // No travel that way (a corner with zero droop, or a value too small to divide by): ±1 once it moves.
      travelFraction: avail > MIN_TRAVEL_M ? t / avail : Math.abs(t) <= MIN_TRAVEL_M ? 0 : Math.sign(t),
      tyreDeflectionM: lifted ? 0 : dsum / load,
      tangentialN: lifted ? 0 : tangential,
      frictionDemand: lifted ? 0 : tangential / load,
    });
  }

  // Total CG in the terrain frame.
  const R = model.rot;
  const cs = model.cgSprungBody;
  let cgx = model.sprungMassKg * (model.poseX + R[0] * cs[0] + R[1] * cs[1] + R[2] * cs[2]);
  let cgy = model.sprungMassKg * (model.poseY + R[3] * cs[0] + R[4] * cs[1] + R[5] * cs[2]);
  let cgz = model.sprungMassKg * (x[Q_Z] + R[6] * cs[0] + R[7] * cs[1] + R[8] * cs[2]);
  for (let i = 0; i < 4; i++) {
    const mu = model.axles[i >> 1].unsprungPerWheelKg;
    cgx += mu * model.wheelCentre[3 * i];
    cgy += mu * model.wheelCentre[3 * i + 1];
    cgz += mu * model.wheelCentre[3 * i + 2];
  }
  const M = model.totalMassKg;
  const cg: [number, number, number] = [cgx / M, cgy / M, cgz / M];

  const npts = _ptWheel.length;
  const force = [g[0] * M, g[1] * M, g[2] * M];
  const mg = stabilityMargins(_pts, npts, cg, force);
  const edgeWheels: WheelName[] = [];
  if (mg.weakestEdge >= 0 && mg.hull.length >= 2) {
    const a = _ptWheel[mg.hull[mg.weakestEdge]];
    const b = _ptWheel[mg.hull[(mg.weakestEdge + 1) % mg.hull.length]];
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    edgeWheels.push(WHEEL_NAMES[lo]);
    if (hi !== lo) edgeWheels.push(WHEEL_NAMES[hi]);
  }
  const finite = (v: number): number => (Number.isFinite(v) ? v : 0);
  const margins: StabilityMargins = {
    forceAngleRad: finite(mg.forceAngleRad),
    forceAngleMeasure: finite(mg.forceAngleMeasure),
    forceAngleMeasurePerWeightM: finite(mg.forceAngleMeasure / W),
    energyM: finite(mg.energyM),
    staticM: finite(mg.staticM),
    weakestEdge: mg.weakestEdge,
    weakestEdgeWheels: edgeWheels,
  };

  if (status !== 'converged') {
    if (status === 'not-converged' && totalLoad === 0) {
      status = 'no-contact';
      reason = reason || 'no tyre reaches the ground';
    } else if (status === 'not-converged' && (npts === 0 || margins.forceAngleRad < 0)) {
      status = 'tipped';
      reason = `${reason}; the plumb line from the CG falls outside the support of the loaded tyres`;
    }
  }

  // Attitude relative to the terrain frame (the state) and to true level.
  const yUp = R[1] * up[0] + R[4] * up[1] + R[7] * up[2];
  const zUp = R[2] * up[0] + R[5] * up[1] + R[8] * up[2];
  const xUp = R[0] * up[0] + R[3] * up[1] + R[6] * up[2];
  const gw = groundUnderWheels(model, _ground);
  const groundMean = 0.25 * (gw[0] + gw[1] + gw[2] + gw[3]);

  let resF = 0;
  let resM = 0;
  for (let k = 0; k < 3; k++) resF = Math.max(resF, Math.abs(r[k]) * W);
  for (let k = 3; k < 6; k++) resM = Math.max(resM, Math.abs(r[k]) * W * model.wheelbaseM);
  for (let a = 0; a < 2; a++) {
    const ax = model.axles[a];
    if (ax.solid) {
      resF = Math.max(resF, Math.abs(r[R_SUSP + 2 * a]) * W);
      resM = Math.max(resM, Math.abs(r[R_SUSP + 2 * a + 1]) * W * ax.trackM);
    } else {
      resF = Math.max(resF, Math.abs(r[R_SUSP + 2 * a]) * W, Math.abs(r[R_SUSP + 2 * a + 1]) * W);
    }
  }

  const poly: [number, number, number][] = mg.hull.map((h) => [_pts[3 * h], _pts[3 * h + 1], _pts[3 * h + 2]]);
  return {
    status,
    reason,
    iterations,
    evaluations: model.fullEvaluations,
    residualN: finite(resF),
    residualNm: finite(resM),
    wheels: wheels as unknown as SolveResult['wheels'],
    body: {
      heaveM: finite(x[Q_Z] - groundMean),
      rollRad: finite(x[Q_ROLL]),
      pitchRad: finite(x[Q_PITCH]),
      rollToLevelRad: finite(Math.atan2(yUp, zUp)),
      pitchToLevelRad: finite(-Math.asin(Math.max(-1, Math.min(1, xUp)))),
      cgWorld: cg,
      plumbPointWorld: mg.plumb,
    },
    margins,
    supportPolygonWorld: poly,
    gravityDirWorld: [-up[0], -up[1], -up[2]],
    weightN: W,
    state: Float64Array.from(x),
  };
}
