/**
 * Tilt-table sweep (as in the tilt-table procedures of SAE J2180 and ISO 16333: raise the table
 * slowly, note the angle at which the uphill wheels lift and where it goes over), from a start
 * tilt about a fixed downhill direction.
 *
 * The tip is the end of the stable equilibrium branch as the tilt grows (REFERENCES, "Stability
 * of an equilibrium and the tip as a fold"): the sweep follows the branch by continuation (a
 * secant predictor from the last two accepted states, Newton as the corrector, two steps at once
 * where the branch is stiff and nothing is due for several (quietStretch), the step halved where
 * the corrector fails or leaves the branch; a trial past where the last two states put the end, or
 * inside a bracket narrower than QUICK_BRACKET_RAD, is solved with the quick iteration only:
 * predictEnd), and accepts a state only if it converged, is
 * stable (the smallest eigenvalue of the tangent stiffness with the grip held is positive:
 * stability.ts) and has its plumb line inside the support (force-angle ≥ 0). The tip is located
 * where that stops being true, bracketed to the resolution (0.01°) from the last stable state:
 * - 'fold': the smallest eigenvalue reaches zero (a compliant vehicle can fold before its plumb
 *   line reaches the support edge; past a fold no equilibrium is near), or falls below
 *   MIN_STIFFNESS_EIGEN, which is no stiffness within what the method can tell;
 * - 'plumb-line-at-edge': the plumb line from the CG reaches the edge of the support;
 * whichever comes first. A Newton failure is never taken as the tip on its own: a failure from a
 * stable state more than the resolution away is retried with a smaller step, and one within the
 * resolution of a state that is far from both criteria is stepped over with full solves.
 * The first lift and the slide (friction demand above the ground's) are bracketed on the same
 * stable branch, between accepted states.
 *
 * Datums: every angle comes as the table tilt (angleRad, the sweep's parameter), as the slope of
 * the ground under the vehicle from level (fromLevelRad) and as the extra tilt beyond the ground
 * as it lies at the start (beyondGroundRad = angle − start tilt: "more than the ground here").
 * On a level table from a level start the three are equal.
 */
import type { Pose, SolveResult, TiltSample, TiltSweepOptions, TiltSweepResult, WheelName } from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { DEFAULT_FRICTION, solveEquilibrium } from './equilibrium';
import { Q_PITCH, Q_ROLL, STATE_SIZE, type VehicleModel } from './model';

import { RAD_PER_DEG as DEG } from '../scenario/fields';
/** Largest Newton iterations of a continuation step (a warm start on the branch needs 2–5). */
const STEP_MAX_ITERATIONS = 15;
/** Brackets narrower than this are searched with the quick iteration only (rad, 0.25°). */
const QUICK_BRACKET_RAD = 0.25 * DEG;
/**
 * A continuation step may turn the body by at most this much more than the tilt step itself
 * (rad): more means Newton jumped to another branch (e.g. a balance on two wheels), not followed this one.
 */
const BRANCH_TURN_RAD = 2 * DEG;
/**
 * Smallest stiffness eigenvalue (per W·L, see stability.ts) taken as none: below it the softest
 * mode is within what the method can tell of neutral (the grip field held fixed makes the tangent
 * stiffness an approximation; finite differences put a few thousandths of noise on it). Near a
 * true fold the eigenvalue falls like the square root of the distance to it, so the floor moves
 * such a tip by well under the 0.01° resolution.
 */
export const MIN_STIFFNESS_EIGEN = 0.01;
/**
 * Below this smallest eigenvalue the stance is nearly neutral: three-wheel stances of vehicles with
 * a solid axle hover at 0.00–0.02 over several degrees of tilt (the body rolling against one axle
 * with a wheel hanging), and where in that stretch it reaches the floor is ill-conditioned (it can
 * move by several degrees between neighbouring directions). The tip reports where such a stretch
 * began (softFrom), which moves smoothly.
 */
export const NEAR_NEUTRAL_EIGEN = 0.03;
/** A last stable state this close to either criterion ends the branch when the next step fails (per W·L; rad). */
const NEAR_FOLD_EIGEN = 0.03;
const NEAR_EDGE_RAD = 0.2 * DEG;
/**
 * A nearly neutral stretch shorter than this before the tip is not reported (rad): near a sharp
 * fold the eigenvalue passes NEAR_NEUTRAL_EIGEN only a few hundredths of a degree before it.
 */
const SOFT_STRETCH_RAD = 1 * DEG;
/** The quiet stretch (tiltSweep's quietStretch): smallest eigenvalue at least this (per W·L), nothing due within QUIET_AHEAD steps; QUIET_STEPS steps taken at once. */
const QUIET_EIGEN = 0.3;
const QUIET_AHEAD = 5;
const QUIET_STEPS = 2;
/** Where a failed step lies within the resolution of a state far from both criteria, these tilts beyond it are tried with full solves. */
const STEP_OVER_RAD = [0.03 * DEG, 0.1 * DEG, 0.5 * DEG];

/** Why the stable branch ends. */
export type TipReason =
  /** The smallest eigenvalue of the tangent stiffness reaches zero (a fold): no stable equilibrium beyond. */
  | 'fold'
  /** The plumb line from the CG reaches the edge of the support. */
  | 'plumb-line-at-edge'
  /** No stable equilibrium at the start tilt itself. */
  | 'does-not-stand-at-start';

/** A tilt with its datums (all rad). */
export interface TiltAngle {
  /** Table tilt about the downhill direction: the sweep's parameter. */
  readonly angleRad: number;
  /** Slope of the ground under the vehicle from level at this tilt. */
  readonly fromLevelRad: number;
  /** Tilt beyond the ground as it lies at the start of the sweep: "more than the ground here". */
  readonly beyondGroundRad: number;
}

export interface TiltLift extends TiltAngle {
  readonly wheel: WheelName;
  /** No wheel lifted on the stable branch before the tip: the wheels lift as it goes over. */
  readonly atTip: boolean;
}

export interface TiltTip extends TiltAngle {
  /** The tyres about whose contacts it goes over (the weakest edge at the last stable state). */
  readonly edge: readonly WheelName[];
  readonly reason: TipReason;
  /** At the last stable state: smallest eigenvalue of the tangent stiffness (per W·L) and force-angle (rad). */
  readonly lastMinEigen: number;
  readonly lastForceAngleRad: number;
  /**
   * Where the stance first became nearly neutral (smallest eigenvalue below NEAR_NEUTRAL_EIGEN) for
   * more than 1° of tilt before the tip (a fold reached by the stiffness fading, or a stance that
   * stayed nearly neutral for a stretch before it stiffened again or reached the edge). The tip then lies somewhere on that soft stretch and is not
   * sharply defined (it can move by several degrees between neighbouring directions); treat this
   * angle as the limit. Null otherwise.
   */
  readonly softFrom: TiltAngle | null;
}

/** The sweep's result: TiltSweepResult with the datums, the tip's reason and the start. */
export interface TiltSweepDetail extends TiltSweepResult {
  readonly firstLift: TiltLift | null;
  readonly tip: TiltTip | null;
  readonly slide: TiltAngle | null;
  readonly startAngleRad: number;
  /** Slope of the ground under the vehicle from level at the start tilt (rad). */
  readonly startFromLevelRad: number;
  readonly maxAngleRad: number;
  /** Which limit the rising table reaches first: it tips, it slides, or neither up to maxAngleRad. */
  readonly firstLimit: 'tip' | 'slide' | null;
}

function maxDemand(r: SolveResult): number {
  let d = 0;
  for (const w of r.wheels) if (!w.lifted && (w.frictionDemand ?? 0) > d) d = (w.frictionDemand ?? 0);
  return d;
}

function anyLifted(r: SolveResult): boolean {
  return r.wheels.some((w) => w.lifted);
}

/** The lightest load among the wheels still down (N): falls to zero as the first wheel lifts. */
function lightestLoad(r: SolveResult): number {
  let m = Infinity;
  for (const w of r.wheels) if (!w.lifted && (w.loadN ?? 0) < m) m = (w.loadN ?? 0);
  return m;
}

export function toSample(angleRad: number, r: SolveResult): TiltSample {
  const w = r.wheels;
  return {
    angleRad,
    status: r.status,
    loadsN: [(w[0].loadN ?? 0), (w[1].loadN ?? 0), (w[2].loadN ?? 0), (w[3].loadN ?? 0)],
    lifted: [w[0].lifted, w[1].lifted, w[2].lifted, w[3].lifted],
    forceAngleRad: r.margins.forceAngleRad,
    energyM: r.margins.energyM,
    frictionDemand: maxDemand(r),
  };
}

/** Unit normal of the plane fitted to the ground under the four wheels at the model's pose (terrain frame). */
function groundNormalHere(model: VehicleModel): [number, number, number] {
  const c = Math.cos(model.headingRad);
  const s = Math.sin(model.headingRad);
  const h = [0, 0, 0, 0];
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    const yb = (i & 1) === 0 ? ax.trackM / 2 : -ax.trackM / 2;
    h[i] = model.field.height(model.poseX + c * ax.xM - s * yb, model.poseY + s * ax.xM + c * yb);
  }
  const L = model.wheelbaseM;
  const T = 0.5 * (model.axles[0].trackM + model.axles[1].trackM);
  // Slopes along the body's x and y, turned into the terrain frame.
  const gx = (h[0] + h[1] - h[2] - h[3]) / (2 * L);
  const gy = (h[0] - h[1] + h[2] - h[3]) / (2 * T);
  const dx = c * gx - s * gy;
  const dy = s * gx + c * gy;
  const n = Math.hypot(dx, dy, 1);
  return [-dx / n, -dy / n, 1 / n];
}

/** A state accepted on the stable branch. */
interface BranchPoint {
  readonly angle: number;
  readonly r: SolveResult;
  readonly minEigen: number;
}

const _pred = new Float64Array(STATE_SIZE);

/** Where the stable branch ends at the first lift (the stance just past it is unstable). */
interface LiftEnd {
  readonly lo: BranchPoint;
  readonly hiRes: SolveResult;
}

/**
 * Follows the stable equilibrium branch from the start tilt as the table rises about
 * opts.downhillRad; see the module comment.
 */
export function tiltSweep(model: VehicleModel, pose: Pose, opts: TiltSweepOptions): TiltSweepDetail {
  const start = opts.startAngleRad ?? 0;
  const maxAngle = opts.maxAngleRad ?? 89 * DEG;
  const step = opts.stepRad ?? 1 * DEG;
  const findSlide = opts.findSlide ?? true;
  const resolution = opts.resolutionRad ?? 0.01 * DEG;
  const friction = opts.friction ?? DEFAULT_FRICTION;
  const downhillRad = opts.downhillRad;
  let evaluations = 0;

  const solveAt = (angleRad: number, warm: Float64Array | null, quick = false, maxIterations?: number): SolveResult => {
    // followBranch: the sweep follows its own branch from the state it passes (the solver checks
    // each root's stability and reports its smallest stiffness eigenvalue).
    const r = solveEquilibrium(model, pose, { tilt: { angleRad, downhillRad }, friction, warmStart: warm, followBranch: warm !== null, maxIterations, quick });
    evaluations += r.evaluations;
    return r;
  };
  /** Smallest stiffness eigenvalue of a balance (from the solver's own check; −∞ where it has none). */
  const minEigenOf = (r: SolveResult): number => {
    const e = r.stiffnessMinEigen;
    if (e === null || Number.isNaN(e)) return -Infinity;
    return r.status === 'unstable' ? Math.min(e, -1e-12) : e;
  };
  type Verdict = 'ok' | 'failed' | 'unstable' | 'outside' | 'off-branch';
  /** Whether r at angle continues the branch from prev (null: the start). */
  const judge = (angle: number, r: SolveResult, prev: BranchPoint | null): { verdict: Verdict; minEigen: number } => {
    if (r.status !== 'converged' && r.status !== 'unstable') return { verdict: 'failed', minEigen: NaN };
    if (prev) {
      const limit = BRANCH_TURN_RAD + 2 * Math.abs(angle - prev.angle);
      if (Math.abs(r.state[Q_ROLL] - prev.r.state[Q_ROLL]) > limit || Math.abs(r.state[Q_PITCH] - prev.r.state[Q_PITCH]) > limit) {
        return { verdict: 'off-branch', minEigen: NaN };
      }
    }
    const minEigen = minEigenOf(r);
    if (!(minEigen > MIN_STIFFNESS_EIGEN)) return { verdict: 'unstable', minEigen };
    if (r.margins.forceAngleRad < 0) return { verdict: 'outside', minEigen };
    return { verdict: 'ok', minEigen };
  };

  // Datums: the ground under the vehicle at the pose, and up at a tilt.
  model.setPose(pose.xM, pose.yM, pose.headingRad);
  const n = groundNormalHere(model);
  const dir = pose.headingRad + downhillRad;
  const fromLevel = (a: number): number => {
    const s = Math.sin(a);
    const dot = -s * Math.cos(dir) * n[0] - s * Math.sin(dir) * n[1] + Math.cos(a) * n[2];
    return Math.acos(Math.max(-1, Math.min(1, dot)));
  };
  const at = (a: number): TiltAngle => ({ angleRad: a, fromLevelRad: fromLevel(a), beyondGroundRad: a - start });

  /**
   * Narrows [lo, hi] (pred false at lo, true at hi) to the resolution, by safeguarded regula falsi
   * on an indicator that is positive on the lo side and falls to zero at the event (the lightest
   * wheel's load, the grip left), solving warm from lo. Both ends lie on the stable branch.
   */
  const bisect = (
    lo: number,
    loRes: SolveResult,
    hi: number,
    hiRes: SolveResult,
    pred: (r: SolveResult) => boolean,
    indicator: (r: SolveResult) => number,
    twoSided = false,
  ) => {
    let aimAbove = false;
    let guided = true;
    let sameSide = 0;
    let lastSideHigh: boolean | null = null;
    let prevLo = NaN;
    let prevLoRes: SolveResult | null = null;
    while (hi - lo > resolution) {
      let next = 0.5 * (lo + hi);
      if (guided) {
        let est = NaN;
        const g2 = indicator(loRes);
        if (twoSided) {
          const gh = indicator(hiRes);
          if (g2 > 0 && gh < 0) est = lo + (g2 * (hi - lo)) / (g2 - gh);
        } else if (prevLoRes && prevLo < lo) {
          const g1 = indicator(prevLoRes);
          if (g1 > g2 && g2 > 0) est = lo + (g2 * (lo - prevLo)) / (g1 - g2);
        }
        const aim = est + (aimAbove ? 0.25 : -0.25) * resolution;
        if (aim > lo && aim < hi) next = aim;
      }
      const wasGuided = next !== 0.5 * (lo + hi);
      const r = solveAt(next, loRes.state, hi - lo < QUICK_BRACKET_RAD);
      // A miss inside the bracket counts as past the event (the bracket closes on the lo side).
      const high = r.status !== 'converged' || pred(r);
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
      if (wasGuided) {
        sameSide = lastSideHigh === high ? sameSide + 1 : 1;
        lastSideHigh = high;
        guided = sameSide < (high ? 2 : 3);
      } else {
        sameSide = 0;
        lastSideHigh = null;
        guided = true;
      }
    }
    return { angleRad: 0.5 * (lo + hi), lo, loRes, hi, hiRes };
  };
  /** The wheel that lifted between lo and hi: lifted at hi and not at lo, the lightest at lo first. */
  const liftedWheel = (loRes: SolveResult, hiRes: SolveResult): WheelName => {
    let best = -1;
    for (let i = 0; i < 4; i++) {
      if (!hiRes.wheels[i].lifted || loRes.wheels[i].lifted) continue;
      if (best < 0 || (loRes.wheels[i].loadN ?? 0) < (loRes.wheels[best].loadN ?? 0)) best = i;
    }
    if (best < 0) {
      best = 0;
      for (let i = 1; i < 4; i++) if ((loRes.wheels[i].loadN ?? 0) < (loRes.wheels[best].loadN ?? 0)) best = i;
    }
    return WHEEL_NAMES[best];
  };

  const samples: TiltSample[] = [];
  let firstLift: TiltLift | null = null;
  let tip: TiltTip | null = null;
  let slide: TiltAngle | null = null;
  const done = (): TiltSweepDetail => ({
    downhillRad,
    firstLift,
    tip,
    slide,
    samples,
    evaluations,
    startAngleRad: start,
    startFromLevelRad: fromLevel(start),
    maxAngleRad: maxAngle,
    firstLimit: slide && (!tip || slide.angleRad <= tip.angleRad) ? 'slide' : tip ? 'tip' : null,
  });

  // The start: the reference solve (lowered onto the ground, the tilt applied progressively).
  const r0 = solveAt(start, null);
  const j0 = judge(start, r0, null);
  samples.push(toSample(start, r0));
  if (j0.verdict !== 'ok') {
    tip = {
      ...at(start),
      edge: r0.margins.weakestEdgeWheels,
      reason: 'does-not-stand-at-start',
      lastMinEigen: j0.minEigen,
      lastForceAngleRad: r0.margins.forceAngleRad,
      softFrom: null,
    };
    return done();
  }
  let p1: BranchPoint = { angle: start, r: r0, minEigen: j0.minEigen };
  let p0 = null as BranchPoint | null;
  if (anyLifted(r0)) firstLift = { ...at(start), wheel: WHEEL_NAMES[r0.wheels.findIndex((w) => w.lifted)], atTip: false };
  if (maxDemand(r0) > friction) slide = at(start);

  /** Smallest tilt known (or taken) to lie past the end of the branch, and what was found there. */
  let hi = Infinity;
  let hiVerdict: Verdict = 'failed';
  let hiRes: SolveResult | null = null;
  let stepsOver = 0;
  /** First accepted tilt of the current nearly neutral stretch (NaN: not in one). */
  let softSince = j0.minEigen < NEAR_NEUTRAL_EIGEN ? start : NaN;
  /** The first nearly neutral stretch longer than SOFT_STRETCH_RAD on the branch (it may have stiffened again since). */
  let firstSoft: TiltAngle | null = null;
  /**
   * Where the branch is expected to end, from the last two accepted states (rad; Infinity when
   * neither trend points to an end): near a fold the smallest eigenvalue falls like the square root
   * of the distance to it, so its square is extrapolated linearly to MIN_STIFFNESS_EIGEN²; the
   * force-angle falls linearly to zero at the edge. It only chooses the quick iteration for a trial
   * beyond it: every trial is judged as any other, and a quick miss far from both criteria is
   * stepped over with full solves as any other failure.
   */
  const predictEnd = (): number => {
    if (!p0 || !(p1.angle > p0.angle)) return Infinity;
    const dA = p1.angle - p0.angle;
    let est = Infinity;
    const l0 = p0.minEigen * p0.minEigen;
    const l1 = p1.minEigen * p1.minEigen;
    const lm = MIN_STIFFNESS_EIGEN * MIN_STIFFNESS_EIGEN;
    if (l0 > l1 && l1 > lm) est = p1.angle + ((l1 - lm) * dA) / (l0 - l1);
    const f0 = p0.r.margins.forceAngleRad;
    const f1 = p1.r.margins.forceAngleRad;
    if (f0 > f1 && f1 > 0) est = Math.min(est, p1.angle + (f1 * dA) / (f0 - f1));
    return est;
  };
  /**
   * Whether the branch is in a quiet stretch: stiff (smallest eigenvalue at least QUIET_EIGEN), and
   * neither its end (predictEnd) nor a wheel's lift (the lightest load extrapolated linearly from the
   * last two states) is due within QUIET_AHEAD steps. There the sweep takes QUIET_STEPS steps at
   * once: events are still bracketed between accepted states and narrowed to the resolution.
   */
  const quietStretch = (): boolean => {
    if (!p0 || !(p1.angle > p0.angle) || p1.minEigen < QUIET_EIGEN) return false;
    const ahead = p1.angle + QUIET_AHEAD * step;
    if (predictEnd() < ahead) return false;
    if (!firstLift) {
      const l0 = lightestLoad(p0.r);
      const l1 = lightestLoad(p1.r);
      if (l1 < l0 && p1.angle + (l1 * (p1.angle - p0.angle)) / (l0 - l1) < ahead) return false;
    }
    return true;
  };
  /** Set by accept when the stance just past the first lift is unstable: the branch ends at the lift. */
  let liftEnd = null as LiftEnd | null;
  while (p1.angle < maxAngle - 1e-12 && !liftEnd) {
    if (hi - p1.angle <= resolution) {
      // The branch ends within the resolution past p1, unless the failure there was numerical:
      // p1 far from both criteria and a plain Newton miss. Then step over it with full solves.
      const nearEnd = p1.minEigen < NEAR_FOLD_EIGEN || p1.r.margins.forceAngleRad < NEAR_EDGE_RAD || hiVerdict === 'unstable' || hiVerdict === 'outside';
      let over: BranchPoint | null = null;
      if (!nearEnd && stepsOver < 3) {
        stepsOver++;
        for (const d of STEP_OVER_RAD) {
          const a = Math.min(p1.angle + d, maxAngle);
          const r = solveAt(a, p1.r.state);
          const j = judge(a, r, p1);
          if (j.verdict === 'ok') {
            over = { angle: a, r, minEigen: j.minEigen };
            break;
          }
        }
      }
      if (!over) break;
      accept(over);
      hi = Infinity;
      continue;
    }
    // Full steps while no end is known (two where nothing is due within several: quietStretch);
    // halving the bracket [p1, hi] once one is.
    const trial = hi === Infinity ? Math.min(p1.angle + (quietStretch() ? QUIET_STEPS : 1) * step, maxAngle) : p1.angle + 0.5 * (hi - p1.angle);
    // Predictor: the secant through the last two accepted states.
    const x1 = p1.r.state;
    if (p0 && p1.angle > p0.angle) {
      const f = (trial - p1.angle) / (p1.angle - p0.angle);
      const x0 = p0.r.state;
      for (let k = 0; k < STATE_SIZE; k++) _pred[k] = x1[k] + f * (x1[k] - x0[k]);
    } else _pred.set(x1);
    // Past the predicted end, and inside a bracket narrower than QUICK_BRACKET_RAD, the quick
    // iteration decides, as in bisect (a miss counts as past the end): the full fallbacks cost a
    // hundred evaluations or more for each trial past the end, where no equilibrium is to be found.
    const quick = (hi !== Infinity && hi - p1.angle < QUICK_BRACKET_RAD) || (trial > predictEnd());
    let r = solveAt(trial, _pred, quick, STEP_MAX_ITERATIONS);
    let j = judge(trial, r, p1);
    if (!quick && (j.verdict === 'failed' || j.verdict === 'off-branch')) {
      // The predictor may overshoot where the branch bends (a wheel lifting): try from p1 itself,
      // with the quick iteration (a second opinion from another start; past the end of the branch
      // the full fallbacks would cost a hundred evaluations more, and a miss here only halves the step).
      r = solveAt(trial, x1, true, STEP_MAX_ITERATIONS);
      j = judge(trial, r, p1);
    }
    if (j.verdict === 'ok') {
      accept({ angle: trial, r, minEigen: j.minEigen });
      continue;
    }
    hi = trial;
    hiVerdict = j.verdict;
    hiRes = r;
  }

  const ended = liftEnd as LiftEnd | null; // set inside accept(), which TypeScript does not follow
  if (ended) {
    // The lift ends the branch: the tip is at the lift, about the edge the stance just past it leans over.
    const lo = ended.lo;
    samples.push(toSample(lo.angle, lo.r));
    const tipAngle = firstLift!.angleRad;
    tip = {
      ...at(tipAngle),
      edge: ended.hiRes.margins.weakestEdgeWheels,
      reason: 'fold',
      lastMinEigen: lo.minEigen,
      lastForceAngleRad: lo.r.margins.forceAngleRad,
      softFrom: firstSoft ?? (!Number.isNaN(softSince) && tipAngle - softSince > SOFT_STRETCH_RAD ? at(softSince) : null),
    };
    firstLift = { ...firstLift!, atTip: true };
  } else if (hi !== Infinity) {
    const lo = p1;
    let reason: TipReason;
    if (hiVerdict === 'outside') reason = 'plumb-line-at-edge';
    else if (hiVerdict === 'unstable') reason = hiRes && hiRes.margins.forceAngleRad < 0 && lo.r.margins.forceAngleRad < NEAR_EDGE_RAD ? 'plumb-line-at-edge' : 'fold';
    else reason = lo.r.margins.forceAngleRad < NEAR_EDGE_RAD ? 'plumb-line-at-edge' : 'fold';
    const tipAngle = 0.5 * (lo.angle + hi);
    tip = {
      ...at(tipAngle),
      edge: lo.r.margins.weakestEdgeWheels,
      reason,
      lastMinEigen: lo.minEigen,
      lastForceAngleRad: lo.r.margins.forceAngleRad,
      softFrom: firstSoft ?? (!Number.isNaN(softSince) && tipAngle - softSince > SOFT_STRETCH_RAD ? at(softSince) : null),
    };
    if (!firstLift) {
      firstLift = { ...at(tipAngle), wheel: liftedWheel(lo.r, hiRes && hiRes.status === 'converged' ? hiRes : lo.r), atTip: true };
    }
  }
  return done();

  /** Takes a state onto the branch, bracketing the lift and slide between it and the last one. */
  function accept(next: BranchPoint): void {
    const prev = p1;
    if (!firstLift && anyLifted(next.r)) {
      const b = bisect(prev.angle, prev.r, next.angle, next.r, anyLifted, lightestLoad);
      firstLift = { ...at(b.angleRad), wheel: liftedWheel(b.loRes, b.hiRes), atTip: false };
      // A wheel lifting takes its stiffness away at once. Where the stance just past the lift is
      // unstable, the stable branch ends at the lift (the vehicle lurches over there), even if a
      // whole step lands on a stable three-wheel stance beyond: that one is not reached quasi-statically.
      if (b.hiRes.status === 'converged' || b.hiRes.status === 'unstable') {
        const after = judge(b.hi, b.hiRes, null);
        if (after.verdict === 'unstable') {
          liftEnd = { lo: { angle: b.lo, r: b.loRes, minEigen: minEigenOf(b.loRes) }, hiRes: b.hiRes };
          return;
        }
      }
    }
    if (findSlide && !slide && maxDemand(next.r) > friction) {
      const b = bisect(prev.angle, prev.r, next.angle, next.r, (r) => maxDemand(r) > friction, (r) => friction - maxDemand(r), true);
      slide = at(b.angleRad);
    }
    samples.push(toSample(next.angle, next.r));
    if (next.minEigen >= NEAR_NEUTRAL_EIGEN) softSince = NaN;
    else if (Number.isNaN(softSince)) {
      // The stretch began in this step: at the lift if one came in it (a wheel lifting drops the
      // stiffness at once), else where the eigenvalue crossed the threshold (linearly).
      const liftHere = firstLift && !firstLift.atTip && firstLift.angleRad > prev.angle && firstLift.angleRad <= next.angle;
      const f = (prev.minEigen - NEAR_NEUTRAL_EIGEN) / (prev.minEigen - next.minEigen);
      softSince = liftHere ? firstLift!.angleRad : prev.angle + Math.max(0, Math.min(1, f)) * (next.angle - prev.angle);
    }
    if (!firstSoft && !Number.isNaN(softSince) && next.angle - softSince > SOFT_STRETCH_RAD) firstSoft = at(softSince);
    p0 = prev;
    p1 = next;
  }
}
