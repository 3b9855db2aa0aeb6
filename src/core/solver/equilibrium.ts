/**
 * The pose solve: the one answer of a scenario. The answer is defined as the stable equilibrium
 * reached from the reference start: the vehicle set down at ride height on a plane fitted to the
 * ground under its wheels, with gravity along that plane's normal, then gravity turned step by step
 * to the real one (the ground's slope and the tilt applied progressively, as a tilt table is raised);
 * when that does not land on a stable equilibrium, the same with the tyres eased in from soft, and
 * where Newton stalls, the set-down pose nudged up and down by a few centimetres (solveReference). A warm start (a previous state) is only a speed-up: its landing is accepted when
 * it is a stable equilibrium with every wheel on the ground (one contact set, where a converged
 * stable root is the reference one); anything else is solved again from the reference start.
 * Every root is checked for stability (stability.ts); an unstable one is reported as 'unstable'.
 *
 * The Newton iteration is in newton.ts, the result builder in result.ts.
 */
import type { Pose, SolveOptions, SolveResult, Terrain, Vehicle } from '../model/types';
import { TerrainField } from '../terrain/field';
import { GRAVITY_MPS2, type ModelOptions, Q_VX, Q_VY, Q_Z, STATE_SIZE, VehicleModel, rigidStaticLoads } from './model';
import { type NewtonOutcome, gripOnPlane, guessNormal, initialGuess, newton, residualOut, reusableJacobian } from './newton';
import { buildResult } from './result';
import { createStabilityScratch, stabilityOf } from './stability';
import { DEFAULT_MAX_ITERATIONS, DEFAULT_TOLERANCE } from './newton';

export { DEFAULT_MAX_ITERATIONS, DEFAULT_TOLERANCE, initialGuess } from './newton';

export const DEFAULT_FRICTION = 0.7;
/** Least number of steps of the reference start's continuation (gravity turned, tyres eased in). */
const CONTINUATION_STEPS = 4;
/** Tyre rate the continuation starts from (N/m): soft enough that contact changes are gentle. */
const SOFT_TYRE_NPERM = 2e5;

const N = STATE_SIZE;
const _x = new Float64Array(N);
const _keep = new Float64Array(N);
const _stab = createStabilityScratch();
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
    for (let i = 0; i < 4; i++) model.staticLoadN[i] = level.wheels[i].loadN ?? model.staticLoadN[i];
  }
  model.field = field;
  return model;
}

/** How a start ended: the Newton outcome, with a converged root checked for stability. */
interface Landing extends NewtonOutcome {
  /** Smallest stiffness eigenvalue (per W·L) of a converged root, else null. */
  minEigen: number | null;
}

/**
 * Checks a converged Newton outcome at x for stability (the model's buffers hold x's full
 * evaluation; the Newton Jacobian of its last step, where it still holds, gives the cheap stiffness).
 */
function land(model: VehicleModel, x: Float64Array, out: NewtonOutcome): Landing {
  if (out.status !== 'converged') return { ...out, minEigen: null };
  // On return the buffers hold x's evaluation again (stabilityOf's differences write their own
  // residuals into its scratch, never into residualOut).
  const st = stabilityOf(model, x, _stab, { fresh: false, jacobian: reusableJacobian() });
  if (st.stable) return { ...out, minEigen: st.minEigen };
  return {
    status: 'unstable',
    reason: 'the forces balance here, but the balance is unstable (the stiffness of the pose is not positive definite): it goes over',
    iterations: out.iterations,
    minEigen: st.minEigen,
  };
}

function allWheelsLoaded(model: VehicleModel): boolean {
  for (let i = 0; i < 4; i++) if (model.contacts[i].loadedSlices === 0) return false;
  return true;
}

/** Below this angle between gravity and the fitted ground's normal (rad) the continuation without softening is skipped. */
const DIRECT_MAX_RAD = (2 * Math.PI) / 180;
/** Largest gravity turn per continuation step (rad). */
const CONTINUATION_STEP_RAD = (5 * Math.PI) / 180;
/** Height offsets of the set-down pose tried, in order, when every path from it stalls (m). */
const NUDGES_M = [-0.02, 0.02];
const _gTrue = new Float64Array(3);
const _gripNow = new Float64Array(2);
const _gripLast = new Float64Array(2);
const _n0 = new Float64Array(3);

/**
 * The continuation of the reference start: from the ride-height guess with gravity along the fitted
 * ground's normal (the vehicle set down square on its ground) to the real gravity, turned in
 * `steps` equal steps (spherical interpolation), each warm-started from the last; `soften` also
 * eases the tyres in from soft. x starts at initialGuess. Leaves the model's gravity at the real one.
 */
function follow(model: VehicleModel, x: Float64Array, beta: number, steps: number, soften: boolean, tol: number, maxIt: number): NewtonOutcome {
  initialGuess(model, x);
  let kmax = 0;
  for (const t of [model.vehicle.tyreFront, model.vehicle.tyreRear]) kmax = Math.max(kmax, t.stiffnessNPerM);
  const s0 = soften ? Math.min(1, SOFT_TYRE_NPERM / kmax) : 1;
  const G = GRAVITY_MPS2;
  const g = model.gravity;
  const sb = Math.sin(beta);
  let iterations = 0;
  let out: NewtonOutcome = { status: 'converged', reason: '', iterations: 0 };
  for (let k = 0; k <= steps; k++) {
    const lambda = k / steps;
    model.tyreRateScale = Math.pow(s0, 1 - lambda);
    if (sb > 1e-12) {
      const a = Math.sin((1 - lambda) * beta) / sb;
      const b = Math.sin(lambda * beta) / sb;
      for (let i = 0; i < 3; i++) g[i] = G * (a * -_n0[i] + b * _gTrue[i]);
    }
    // Predictor for the grip field: its change on the fitted plane from the last gravity to this one.
    gripOnPlane(g, _n0, _gripNow);
    if (k === 0) {
      x[Q_VX] = _gripNow[0];
      x[Q_VY] = _gripNow[1];
    } else {
      x[Q_VX] += _gripNow[0] - _gripLast[0];
      x[Q_VY] += _gripNow[1] - _gripLast[1];
    }
    _gripLast.set(_gripNow);
    out = newton(model, x, k === steps ? tol : Math.max(tol, 1e-6), maxIt);
    iterations += out.iterations;
    if (out.status !== 'converged') break;
  }
  model.tyreRateScale = 1;
  for (let i = 0; i < 3; i++) g[i] = G * _gTrue[i];
  if (out.status === 'converged') model.residual(x, true, residualOut);
  return { ...out, iterations };
}

/**
 * The reference start (see the module comment) into x: the vehicle set down at ride height on a
 * plane fitted to the ground under its wheels, with gravity along that plane's normal, and gravity
 * then turned to the real one (the slope of the ground and the tilt applied progressively, as a
 * tilt table is raised), after one Newton solve straight from the set-down pose under the real gravity.
 * A stable landing ends it; else the same path with the tyres eased in from soft. On
 * return the model's buffers hold x's full evaluation and residualOut its residual.
 */
function solveReference(model: VehicleModel, x: Float64Array, tol: number, maxIt: number): Landing {
  initialGuess(model, x);
  const g = model.gravity;
  const G = Math.hypot(g[0], g[1], g[2]);
  for (let i = 0; i < 3; i++) {
    _gTrue[i] = g[i] / G;
    _n0[i] = guessNormal[i];
  }
  const cosBeta = -(_gTrue[0] * _n0[0] + _gTrue[1] * _n0[1] + _gTrue[2] * _n0[2]);
  const beta = Math.acos(Math.max(-1, Math.min(1, cosBeta)));
  const steps = Math.max(CONTINUATION_STEPS, Math.ceil(beta / CONTINUATION_STEP_RAD));
  let iterations = 0;
  let first: Landing | null = null;
  for (let attempt = 0; attempt < 3; attempt++) {
    let out: NewtonOutcome;
    if (attempt === 0) {
      // Straight from the set-down pose under the real gravity: where it lands on a stable
      // equilibrium (nearly always) that is the one the continuation reaches too.
      out = newton(model, x, tol, maxIt, true);
    } else if (attempt === 1 && beta < DIRECT_MAX_RAD) {
      // Turning gravity by under DIRECT_MAX_RAD without softening is the direct solve again.
      continue;
    } else {
      out = follow(model, x, beta, steps, attempt === 2, tol, maxIt);
    }
    const l = land(model, x, out);
    iterations += l.iterations;
    if (l.status === 'converged') {
      return { ...l, iterations, reason: attempt === 0 ? l.reason : 'equilibrium found (the slope and tilt applied progressively from the vehicle set down square)' };
    }
    if (first === null) {
      first = l;
      _keep.set(x);
    }
  }
  // Newton stalled (a tyre on an edge can leave the start just outside its reach): the same start
  // nudged up and down a little, in a fixed order.
  if (first !== null && first.status === 'not-converged') {
    for (const dz of NUDGES_M) {
      initialGuess(model, x);
      x[Q_Z] += dz;
      const l = land(model, x, newton(model, x, tol, maxIt, true));
      iterations += l.iterations;
      if (l.status === 'converged') return { ...l, iterations, reason: 'equilibrium found (from the set-down pose nudged by a few centimetres)' };
    }
  }
  // No stable landing: report the first attempt's end (a real tip stays a tip).
  x.set(_keep);
  model.residual(x, true, residualOut);
  return { ...(first as Landing), iterations };
}

/**
 * Finds the static equilibrium of the vehicle standing at `pose` on the model's terrain (tilted
 * as options.tilt says): the scenario's one answer (see the module comment). Failure is a result,
 * never an exception: see SolveResult.status; a balance that is not stable is 'unstable', never
 * standing. A warm start (`warmStart`, a nearby pose's `state`) only speeds it up, unless
 * `followBranch` or `quick` says the caller follows a path of its own.
 * Tuning: raise maxIterations if status is 'not-converged' on a hard pose (vertical faces,
 * a wheel balanced on an edge).
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
    model.residual(x, true, residualOut);
    return buildResult(model, x, residualOut, 'no-contact', 0, 'gravity does not press the vehicle onto the ground: tilted to 90° or beyond', friction, null);
  }

  const quick = options.quick === true;
  let iterations = 0;
  if (warm) {
    const l = land(model, x, newton(model, x, tol, maxIt, !quick));
    if (quick || options.followBranch === true || (l.status === 'converged' && allWheelsLoaded(model))) {
      return buildResult(model, x, residualOut, l.status, l.iterations, l.reason, friction, l.minEigen);
    }
    iterations = l.iterations;
  }
  const l = solveReference(model, x, tol, maxIt);
  return buildResult(model, x, residualOut, l.status, iterations + l.iterations, l.reason, friction, l.minEigen);
}
