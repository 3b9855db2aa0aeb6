/**
 * Ramp travel test, as generally practised (common practice, no single published procedure): drive
 * one front wheel up a ramp (usually 20°) until another wheel lifts; the score is
 * 1000 × distance climbed along the ramp / wheelbase (= 1000/sin θ × lift height / wheelbase:
 * 2924 × height / wheelbase at 20°). 1000 means the rear tyre reaches the ramp first.
 */
import type { Terrain, Vehicle, WheelName } from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { buildModel, solveEquilibrium } from '../solver/equilibrium';
import type { SolveResult } from '../model/types';
import { RAD_PER_DEG as DEG } from '../scenario/units';


export interface RampTestOptions {
  /** @default 20° */
  readonly rampAngleRad?: number;
  /** The front wheel that climbs. @default 'FL' */
  readonly wheel?: 'FL' | 'FR';
  /** Forward step of the crawl (m), before bisecting the lift. @default 0.01 */
  readonly stepM?: number;
  /** Bisection resolution (m). @default 0.001 */
  readonly resolutionM?: number;
  /** Ground friction (the ramp test presumes the tyre does not slide back). @default 1.0 */
  readonly friction?: number;
}

export interface RampTestResult {
  /** Distance the climbing tyre's contact rose along the ramp surface before another wheel lifted (m). */
  readonly distanceM: number;
  /** Height of that contact above the ground (m). */
  readonly liftHeightM: number;
  /** 1000 × distance / wheelbase, capped at 1000 (the rear tyre reached the ramp). */
  readonly score: number;
  /** The wheel that lifted; null when none did before the rear tyre reached the ramp. */
  readonly liftedWheel: WheelName | null;
  readonly reachedRear: boolean;
}

/** Ramp travel score: 1000 × distance up the ramp / wheelbase (common practice). */
export function rampTravelScore(distanceM: number, wheelbaseM: number): number {
  return (1000 * distanceM) / wheelbaseM;
}

/** Runs the ramp travel test on level ground with a ramp under one front wheel's lane. */
export function rampTravelTest(vehicle: Vehicle, opts: RampTestOptions = {}): RampTestResult {
  const angle = opts.rampAngleRad ?? 20 * DEG;
  const side = opts.wheel ?? 'FL';
  const step = opts.stepM ?? 0.01;
  const res = opts.resolutionM ?? 0.001;
  const friction = opts.friction ?? 1.0;
  const L = vehicle.wheelbaseM;
  const T = vehicle.trackFrontM;
  const r = vehicle.tyreFront.radiusM;
  const w = vehicle.tyreFront.widthM;
  const yc = side === 'FL' ? T / 2 : -T / 2;
  const lane: [number, number] = [yc - w, yc + w];
  const x0 = 0;
  const terrain: Terrain = { features: [{ type: 'ramp', xM: x0, angleRad: angle, lengthM: 3 * L, yRangeM: lane }] };
  const model = buildModel(vehicle, terrain);
  const climber = side === 'FL' ? 0 : 1;
  const sinA = Math.sin(angle);
  // Start with the front tyre clear of the ramp's foot; the reference point is L/2 behind the front axle.
  const startX = x0 - r - L / 2 - 0.02;
  // The rear tyre of the same side meets the ramp when its axle is a radius short of the foot.
  const endX = x0 - r + L / 2;
  const solveAt = (x: number, warm: Float64Array | null): SolveResult =>
    solveEquilibrium(model, { xM: x, yM: 0, headingRad: 0 }, { friction, warmStart: warm, maxIterations: 240 });
  const otherLifted = (s: SolveResult): number => {
    for (let i = 0; i < 4; i++) if (i !== climber && (s.wheels[i].lifted || s.status !== 'converged')) return i;
    return -1;
  };
  const heightOf = (s: SolveResult): number => Math.max(0, s.wheels[climber].contactPointWorld[2]);
  let prev = solveAt(startX, null);
  let prevX = startX;
  for (let x = startX + step; x <= endX + 1e-9; x += step) {
    const cur = solveAt(x, prev.state);
    if (otherLifted(cur) >= 0) {
      let lo = prevX, hi = x, loRes = prev, hiRes = cur;
      while (hi - lo > res) {
        const mid = 0.5 * (lo + hi);
        const m = solveAt(mid, loRes.state);
        if (otherLifted(m) >= 0) {
          hi = mid;
          hiRes = m;
        } else {
          lo = mid;
          loRes = m;
        }
      }
      const h = heightOf(loRes);
      const d = h / sinA;
      const k = otherLifted(hiRes);
      return { distanceM: d, liftHeightM: h, score: Math.min(1000, rampTravelScore(d, L)), liftedWheel: WHEEL_NAMES[k], reachedRear: false };
    }
    prev = cur;
    prevX = x;
  }
  const h = heightOf(prev);
  return { distanceM: h / sinA, liftHeightM: h, score: 1000, liftedWheel: null, reachedRear: true };
}
