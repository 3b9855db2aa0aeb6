/**
 * Tilt-table sweep (as in the tilt-table procedures of SAE J2180 and ISO 16333: raise the table
 * slowly, note the angle at which the uphill wheels lift): from a start tilt, increase the tilt
 * about a fixed downhill direction, warm-starting each solve from the last, and bracket then
 * bisect each event: the first wheel to lift, the friction demand passing the ground's friction
 * (it slides), and the tip (no equilibrium remains).
 */
import type { Pose, SolveResult, TiltSample, TiltSweepOptions, TiltSweepResult, WheelName } from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { DEFAULT_FRICTION, solveEquilibrium } from './equilibrium';
import type { VehicleModel } from './model';

const DEG = Math.PI / 180;
/** Warm-started sweep steps converge in a few iterations where an equilibrium exists; more means none is near. */
const SWEEP_MAX_ITERATIONS = 10;

function maxDemand(r: SolveResult): number {
  let d = 0;
  for (const w of r.wheels) if (!w.lifted && w.frictionDemand > d) d = w.frictionDemand;
  return d;
}

function standing(r: SolveResult): boolean {
  return r.status === 'converged' && r.margins.forceAngleRad >= 0;
}

function anyLifted(r: SolveResult): boolean {
  return r.wheels.some((w) => w.lifted);
}

export function toSample(angleRad: number, r: SolveResult): TiltSample {
  const w = r.wheels;
  return {
    angleRad,
    status: r.status,
    loadsN: [w[0].loadN, w[1].loadN, w[2].loadN, w[3].loadN],
    lifted: [w[0].lifted, w[1].lifted, w[2].lifted, w[3].lifted],
    forceAngleRad: r.margins.forceAngleRad,
    energyM: r.margins.energyM,
    frictionDemand: maxDemand(r),
  };
}

export function tiltSweep(model: VehicleModel, pose: Pose, opts: TiltSweepOptions): TiltSweepResult {
  const start = opts.startAngleRad ?? 0;
  const maxAngle = opts.maxAngleRad ?? 89 * DEG;
  const step = opts.stepRad ?? 1 * DEG;
  const resolution = opts.resolutionRad ?? 0.01 * DEG;
  const friction = opts.friction ?? DEFAULT_FRICTION;
  const downhillRad = opts.downhillRad;
  let evaluations = 0;
  const solveAt = (angleRad: number, warm: Float64Array | null): SolveResult => {
    const r = solveEquilibrium(model, pose, { tilt: { angleRad, downhillRad }, friction, warmStart: warm, maxIterations: warm ? SWEEP_MAX_ITERATIONS : undefined });
    evaluations += r.evaluations;
    return r;
  };
  /**
   * Solves at angleRad from a standing state at fromRad. A step that merely fails to converge
   * while the plumb line is still well inside the support is a numerical miss, not a tip: it is
   * retried in halves from the standing state (up to three levels).
   */
  const stepTo = (angleRad: number, fromRad: number, from: SolveResult, depth = 0): SolveResult => {
    const r = solveAt(angleRad, from.state);
    if (standing(r) || r.status !== 'not-converged' || r.margins.forceAngleRad <= 0 || depth >= 3) return r;
    const midRad = 0.5 * (fromRad + angleRad);
    const mid = stepTo(midRad, fromRad, from, depth + 1);
    return standing(mid) ? stepTo(angleRad, midRad, mid, depth + 1) : mid;
  };
  /** Narrows [lo, hi] (pred false at lo, true at hi) to the resolution. */
  const bisect = (lo: number, loRes: SolveResult, hi: number, hiRes: SolveResult, pred: (r: SolveResult) => boolean) => {
    while (hi - lo > resolution) {
      const mid = 0.5 * (lo + hi);
      // Inside a narrow bracket the warm start is close: a failure there is taken as it is.
      const r = solveAt(mid, loRes.state);
      if (pred(r)) {
        hi = mid;
        hiRes = r;
      } else {
        lo = mid;
        loRes = r;
      }
    }
    return { angleRad: 0.5 * (lo + hi), lo, loRes, hi, hiRes };
  };
  /** The wheel that lifted between lo and hi: lifted at hi and not at lo, the lightest at lo first. */
  const liftedWheel = (loRes: SolveResult, hiRes: SolveResult): WheelName => {
    let best = -1;
    for (let i = 0; i < 4; i++) {
      if (!hiRes.wheels[i].lifted || loRes.wheels[i].lifted) continue;
      if (best < 0 || loRes.wheels[i].loadN < loRes.wheels[best].loadN) best = i;
    }
    if (best < 0) {
      for (let i = 0; i < 4; i++) if (hiRes.wheels[i].lifted) return WHEEL_NAMES[i];
      // Nothing lifted at hi (the tip came first): the wheel with least load at lo goes first.
      best = 0;
      for (let i = 1; i < 4; i++) if (loRes.wheels[i].loadN < loRes.wheels[best].loadN) best = i;
    }
    return WHEEL_NAMES[best];
  };

  const samples: TiltSample[] = [];
  let firstLift: TiltSweepResult['firstLift'] = null;
  let tip: TiltSweepResult['tip'] = null;
  let slide: TiltSweepResult['slide'] = null;

  let prevAngle = start;
  let prev = solveAt(start, null);
  samples.push(toSample(start, prev));
  if (!standing(prev)) {
    return { downhillRad, firstLift, tip: { angleRad: start, edge: prev.margins.weakestEdgeWheels }, slide, samples, evaluations };
  }
  if (anyLifted(prev)) {
    const i = prev.wheels.findIndex((w) => w.lifted);
    firstLift = { wheel: WHEEL_NAMES[i], angleRad: start };
  }
  if (maxDemand(prev) > friction) slide = { angleRad: start };

  while (prevAngle < maxAngle - 1e-12) {
    const a = Math.min(prevAngle + step, maxAngle);
    const cur = stepTo(a, prevAngle, prev);
    if (standing(cur)) {
      if (!firstLift && anyLifted(cur)) {
        const b = bisect(prevAngle, prev, a, cur, anyLifted);
        firstLift = { wheel: liftedWheel(b.loRes, b.hiRes), angleRad: b.angleRad };
      }
      if (!slide && maxDemand(cur) > friction) {
        const b = bisect(prevAngle, prev, a, cur, (r) => standing(r) && maxDemand(r) > friction);
        slide = { angleRad: b.angleRad };
      }
      samples.push(toSample(a, cur));
      prevAngle = a;
      prev = cur;
      continue;
    }
    // No equilibrium at a: bisect for the tip.
    const b = bisect(prevAngle, prev, a, cur, (r) => !standing(r));
    tip = { angleRad: b.angleRad, edge: b.loRes.margins.weakestEdgeWheels };
    if (!firstLift) {
      // Every lift came with the tip (a stiff vehicle): the wheels lift as it goes over.
      if (anyLifted(b.loRes)) {
        const lifted = bisect(prevAngle, prev, b.lo, b.loRes, anyLifted);
        firstLift = { wheel: liftedWheel(lifted.loRes, lifted.hiRes), angleRad: lifted.angleRad };
      } else {
        firstLift = { wheel: liftedWheel(b.loRes, b.loRes), angleRad: b.angleRad };
      }
    }
    if (!slide && maxDemand(b.loRes) > friction) {
      const s = bisect(prevAngle, prev, b.lo, b.loRes, (r) => maxDemand(r) > friction);
      slide = { angleRad: s.angleRad };
    }
    samples.push(toSample(b.lo, b.loRes));
    break;
  }
  return { downhillRad, firstLift, tip, slide, samples, evaluations };
}
