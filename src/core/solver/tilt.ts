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
import { RAD_PER_DEG as DEG } from '../scenario/units';

/** Warm-started sweep steps converge in a few iterations where an equilibrium exists; more means none is near. */
const SWEEP_MAX_ITERATIONS = 8;
/** Brackets narrower than this are searched with the quick iteration only (rad, 0.25°). */
const QUICK_BRACKET_RAD = 0.25 * DEG;

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

/** The lightest load among the wheels still down (N): falls to zero as the first wheel lifts. */
function lightestLoad(r: SolveResult): number {
  let m = Infinity;
  for (const w of r.wheels) if (!w.lifted && w.loadN < m) m = w.loadN;
  return m;
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
  const step = opts.stepRad ?? 2 * DEG;
  const findSlide = opts.findSlide ?? true;
  const resolution = opts.resolutionRad ?? 0.01 * DEG;
  const friction = opts.friction ?? DEFAULT_FRICTION;
  const downhillRad = opts.downhillRad;
  let evaluations = 0;
  const solveAt = (angleRad: number, warm: Float64Array | null, quick = false): SolveResult => {
    const r = solveEquilibrium(model, pose, {
      tilt: { angleRad, downhillRad },
      friction,
      warmStart: warm,
      maxIterations: warm ? SWEEP_MAX_ITERATIONS : undefined,
      quick,
    });
    evaluations += r.evaluations;
    return r;
  };
  /**
   * Narrows [lo, hi] (pred false at lo, true at hi) to the resolution. With an indicator that is
   * positive on the standing side and falls to zero at the event (the lightest wheel's load, the
   * grip left, the force-angle margin), the next angle is the secant estimate through the last two
   * points below the event, aimed a quarter of the resolution either side of it, so that a good
   * estimate closes the bracket in two solves; a step that does not halve the bracket falls back
   * to bisection (safeguarded regula falsi).
   */
  const bisect = (
    lo: number,
    loRes: SolveResult,
    hi: number,
    hiRes: SolveResult,
    pred: (r: SolveResult) => boolean,
    indicator: ((r: SolveResult) => number) | null = null,
    prevLo = NaN,
    prevLoRes: SolveResult | null = null,
    twoSided = false,
  ) => {
    let aimAbove = false;
    let guided = indicator !== null;
    /** Consecutive guided steps that landed on the same side of the event (a biased estimate). */
    let sameSide = 0;
    let lastSideHigh: boolean | null = null;
    while (hi - lo > resolution) {
      let next = 0.5 * (lo + hi);
      if (guided && indicator) {
        let est = NaN;
        const g2 = indicator(loRes);
        if (twoSided) {
          // Regula falsi between the two ends (the indicator is valid on both sides).
          const gh = indicator(hiRes);
          if (g2 > 0 && gh < 0) est = lo + (g2 * (hi - lo)) / (g2 - gh);
        } else if (prevLoRes && prevLo < lo) {
          // Secant through the last two points below the event.
          const g1 = indicator(prevLoRes);
          if (g1 > g2 && g2 > 0) est = lo + (g2 * (lo - prevLo)) / (g1 - g2);
        }
        const aim = est + (aimAbove ? 0.25 : -0.25) * resolution;
        if (aim > lo && aim < hi) next = aim;
      }
      const wasGuided = next !== 0.5 * (lo + hi);
      // Inside a narrow bracket the warm start is close: a failure there is taken as it is, and
      // once the bracket is narrow the quick iteration alone decides (a miss costs little there).
      const r = solveAt(next, loRes.state, hi - lo < QUICK_BRACKET_RAD);
      const high = pred(r);
      if (high) {
        hi = next;
        hiRes = r;
        aimAbove = false;
      } else {
        prevLo = lo;
        prevLoRes = loRes;
        lo = next;
        loRes = r;
        aimAbove = true;
      }
      // Safeguard: guided steps should land either side of the event in turn. Two in a row past
      // it (the costly side: no equilibrium there) or three short of it mean a biased estimate,
      // so bisect once before guiding again.
      if (wasGuided) {
        sameSide = lastSideHigh === high ? sameSide + 1 : 1;
        lastSideHigh = high;
        guided = sameSide < (high ? 2 : 3);
      } else {
        sameSide = 0;
        lastSideHigh = null;
        guided = indicator !== null;
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
  let prev2Angle = NaN;
  let prev2: SolveResult | null = null;
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
    let a = Math.min(prevAngle + step, maxAngle);
    let cur = solveAt(a, prev.state);
    if (!standing(cur) && cur.status === 'not-converged' && cur.margins.forceAngleRad > 0) {
      // A step that merely fails to converge with the plumb line well inside the support may be
      // a numerical miss rather than the tip: try half the step. If that stands, it becomes the
      // next sample; if not, the tip lies below it.
      const half = 0.5 * (prevAngle + a);
      const mid = solveAt(half, prev.state);
      if (standing(mid) || a - prevAngle > 4 * resolution) {
        a = half;
        cur = mid;
      }
    }
    if (standing(cur)) {
      if (!firstLift && anyLifted(cur)) {
        const b = bisect(prevAngle, prev, a, cur, anyLifted, lightestLoad, prev2Angle, prev2);
        firstLift = { wheel: liftedWheel(b.loRes, b.hiRes), angleRad: b.angleRad };
      }
      if (findSlide && !slide && maxDemand(cur) > friction) {
        const b = bisect(prevAngle, prev, a, cur, (r) => standing(r) && maxDemand(r) > friction, (r) => friction - maxDemand(r), prev2Angle, prev2, true);
        slide = { angleRad: b.angleRad };
      }
      samples.push(toSample(a, cur));
      prev2Angle = prevAngle;
      prev2 = prev;
      prevAngle = a;
      prev = cur;
      continue;
    }
    // No equilibrium at a: bisect for the tip.
    const b = bisect(prevAngle, prev, a, cur, (r) => !standing(r), (r) => r.margins.forceAngleRad, prev2Angle, prev2);
    tip = { angleRad: b.angleRad, edge: b.loRes.margins.weakestEdgeWheels };
    if (!firstLift) {
      // Every lift came with the tip (a stiff vehicle): the wheels lift as it goes over.
      if (anyLifted(b.loRes)) {
        const lifted = bisect(prevAngle, prev, b.lo, b.loRes, anyLifted, lightestLoad, prev2Angle, prev2);
        firstLift = { wheel: liftedWheel(lifted.loRes, lifted.hiRes), angleRad: lifted.angleRad };
      } else {
        firstLift = { wheel: liftedWheel(b.loRes, b.loRes), angleRad: b.angleRad };
      }
    }
    if (findSlide && !slide && maxDemand(b.loRes) > friction) {
      const s = bisect(prevAngle, prev, b.lo, b.loRes, (r) => maxDemand(r) > friction, (r) => friction - maxDemand(r), prev2Angle, prev2, true);
      slide = { angleRad: s.angleRad };
    }
    samples.push(toSample(b.lo, b.loRes));
    break;
  }
  return { downhillRad, firstLift, tip, slide, samples, evaluations };
}
