/**
 * The pose solve: the one answer of a scenario. The answer is defined as the stable equilibrium
 * reached from the reference start: the vehicle lowered at ride height onto the ground under its
 * wheels (initialGuess) and, when the direct Newton iteration from there does not reach a stable
 * equilibrium, eased in: untilted on softened tyres first, then the tilt and the tyre rate applied
 * progressively. A warm start (a previous state) is only a speed-up: its landing is accepted when
 * it is a stable equilibrium with every wheel on the ground (one contact set, where a converged
 * stable root is the reference one); anything else is solved again from the reference start.
 * Every root is checked for stability (stability.ts); an unstable one is reported as 'unstable'.
 *
 * The Newton iteration is in newton.ts, the result builder in result.ts.
 */
import type { Pose, SolveOptions, SolveResult, SolveStatus, Terrain, Vehicle } from '../model/types';
import { TerrainField } from '../terrain/field';
import { GRAVITY_MPS2, type ModelOptions, STATE_SIZE, VehicleModel, rigidStaticLoads } from './model';
import { type NewtonOutcome, initialGuess, newton, residualOut } from './newton';
import { buildResult } from './result';
import { createStabilityScratch, stabilityOf } from './stability';

export { DEFAULT_MAX_ITERATIONS, DEFAULT_TOLERANCE, initialGuess } from './newton';
import { DEFAULT_MAX_ITERATIONS, DEFAULT_TOLERANCE } from './newton';

export const DEFAULT_FRICTION = 0.7;
/** Continuation for hard cold starts: steps from untilted, softened tyres to the real pose. */
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
    for (let i = 0; i < 4; i++) model.staticLoadN[i] = level.wheels[i].loadN;
  }
  model.field = field;
  return model;
}

/** How a start ended: the Newton outcome, with a converged root checked for stability. */
interface Landing extends NewtonOutcome {
  /** Smallest stiffness eigenvalue (per W·L) of a converged root, else null. */
  minEigen: number | null;
}

/** Checks a converged Newton outcome at x for stability (the model's buffers hold x's full evaluation). */
function land(model: VehicleModel, x: Float64Array, out: NewtonOutcome): Landing {
  if (out.status !== 'converged') return { ...out, minEigen: null };
  const st = stabilityOf(model, x, _stab, { fresh: false });
  if (st.exact) model.residual(x, true, residualOut);
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

/**
 * The reference start (see the module comment) into x. On return the model's buffers hold x's full
 * evaluation and residualOut its residual. The model's tilt must be set to `tilt`.
 */
function solveReference(model: VehicleModel, x: Float64Array, angleRad: number, downhillRad: number, tol: number, maxIt: number): Landing {
  initialGuess(model, x);
  const first = land(model, x, newton(model, x, tol, maxIt, true));
  if (first.status === 'converged') return first;
  // Ease in: untilted on softened tyres, then step to the real tilt and stiffness, warm-starting
  // each step; keep the first landing if that fails too (a real tip stays a tip).
  _keep.set(x);
  let kmax = 0;
  for (const t of [model.vehicle.tyreFront, model.vehicle.tyreRear]) kmax = Math.max(kmax, t.stiffnessNPerM);
  const s0 = Math.min(1, SOFT_TYRE_NPERM / kmax);
  let iterations = first.iterations;
  let ok = true;
  model.setTilt(0, downhillRad);
  initialGuess(model, x);
  for (let k = 0; k <= CONTINUATION_STEPS; k++) {
    const lambda = k / CONTINUATION_STEPS;
    model.tyreRateScale = Math.pow(s0, 1 - lambda);
    model.setTilt(lambda * angleRad, downhillRad);
    const o = newton(model, x, k === CONTINUATION_STEPS ? tol : Math.max(tol, 1e-6), maxIt);
    iterations += o.iterations;
    if (o.status !== 'converged') {
      ok = false;
      break;
    }
  }
  model.tyreRateScale = 1;
  model.setTilt(angleRad, downhillRad);
  if (ok) {
    model.residual(x, true, residualOut);
    const eased = land(model, x, { status: 'converged', reason: 'equilibrium found (eased in from the untilted pose)', iterations });
    if (eased.status === 'converged' || first.status !== 'unstable') return { ...eased, iterations };
  }
  x.set(_keep);
  model.residual(x, true, residualOut);
  return { ...first, iterations };
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
  const l = solveReference(model, x, tilt.angleRad, tilt.downhillRad, tol, maxIt);
  return buildResult(model, x, residualOut, l.status, iterations + l.iterations, l.reason, friction, l.minEigen);
}
