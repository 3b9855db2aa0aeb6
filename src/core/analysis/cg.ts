/**
 * CG from scale readings.
 *
 * - Level ground, four corner scales: the total weight, the CG along (behind the front axle, by
 *   moments about the front axle: a = L·W_rear/W) and across (left of centre, by moments about
 *   the centre-line: y = [(FL − FR)·T_f/2 + (RL − RR)·T_r/2] / W).
 * - Height by raising one axle (the axle-lift method; road-vehicle practice ISO 10392, earthmoving
 *   SAE J874 / ISO 5005): raise one axle by H, so sin θ = H/L; read the axle that stays on the
 *   scales before (W_s) and after (W_s'); h = r + L·(W_s' − W_s)/(W·tan θ), r = loaded tyre radius
 *   (the height of the axle line above the ground).
 *
 * Readings are forces (N): a scale showing kilograms shows weight / g (the CLI converts).
 * Different labs measuring the same vehicle disagreed significantly (UMTRI round-robin, SAE 920050):
 * report the height with its sensitivity to reading error, as `heightPerReadingErrorM` does.
 */
import type { Vehicle } from '../model/types';
import { GRAVITY_MPS2 } from '../solver/model';

/** Raise angle below which the height is poorly conditioned (common practice: 10–15° or more). */
export const MIN_RAISE_ANGLE_RAD = (10 * Math.PI) / 180;

export interface LevelReadings {
  /** Corner scale readings FL, FR, RL, RR on level ground (N). */
  readonly cornersN: readonly [fl: number, fr: number, rl: number, rr: number];
  readonly wheelbaseM: number;
  /** Tracks, for the lateral position; both or neither. */
  readonly trackFrontM?: number;
  readonly trackRearM?: number;
}

export interface LevelCg {
  readonly weightN: number;
  readonly massKg: number;
  readonly frontAxleN: number;
  readonly rearAxleN: number;
  /** CG behind the front axle (m). */
  readonly behindFrontAxleM: number;
  /** CG left of the centre-line (m); null without the tracks. */
  readonly leftOfCentreM: number | null;
}

/** Total mass and CG position in plan from four level corner readings. */
export function cgFromLevelReadings(r: LevelReadings): LevelCg {
  const [fl, fr, rl, rr] = r.cornersN;
  for (const c of r.cornersN) {
    if (!(Number.isFinite(c) && c >= 0)) throw new Error(`cornersN must be finite and ≥ 0 N, got ${c}`);
  }
  if (r.trackFrontM !== undefined && !(r.trackFrontM > 0 && Number.isFinite(r.trackFrontM))) throw new Error(`trackFrontM must be finite and > 0, got ${r.trackFrontM}`);
  if (r.trackRearM !== undefined && !(r.trackRearM > 0 && Number.isFinite(r.trackRearM))) throw new Error(`trackRearM must be finite and > 0, got ${r.trackRearM}`);
  const front = fl + fr;
  const rear = rl + rr;
  const W = front + rear;
  if (!(W > 0 && Number.isFinite(W))) throw new Error(`cornersN must add up to a finite total > 0 N, got ${W}`);
  if (!(r.wheelbaseM > 0 && Number.isFinite(r.wheelbaseM))) throw new Error(`wheelbaseM must be > 0, got ${r.wheelbaseM}`);
  let left: number | null = null;
  if (r.trackFrontM !== undefined && r.trackRearM !== undefined) {
    left = ((fl - fr) * (r.trackFrontM / 2) + (rl - rr) * (r.trackRearM / 2)) / W;
  }
  return {
    weightN: W,
    massKg: W / GRAVITY_MPS2,
    frontAxleN: front,
    rearAxleN: rear,
    behindFrontAxleM: (r.wheelbaseM * rear) / W,
    leftOfCentreM: left,
  };
}

export interface AxleLiftReadings {
  readonly wheelbaseM: number;
  /** Total weight (N), from the level readings. */
  readonly weightN: number;
  /** Which axle was raised. */
  readonly raisedAxle: 'front' | 'rear';
  /** Height the raised axle was lifted by, measured at its wheel centres or contacts (m). */
  readonly raiseM: number;
  /** Load on the axle that stays on the scales, level (N). */
  readonly levelStayingAxleN: number;
  /** Load on the same axle with the other raised (N). */
  readonly raisedStayingAxleN: number;
  /** Loaded tyre radius: height of the axle line above the ground (m). */
  readonly loadedRadiusM: number;
  /** Whether the suspension was locked (blocked) for the raised reading. @default false */
  readonly suspensionLocked?: boolean;
}

export interface AxleLiftCg {
  readonly heightM: number;
  readonly raiseAngleRad: number;
  /** Change in the CG height per newton of error in the raised reading (m/N): L / (W tan θ). */
  readonly heightPerReadingErrorM: number;
  readonly warnings: string[];
}

/** CG height by the axle-lift method. Throws when the raise is impossible (H ≥ L or ≤ 0). */
export function cgHeightFromAxleLift(r: AxleLiftReadings): AxleLiftCg {
  const L = r.wheelbaseM;
  if (!(L > 0)) throw new Error(`wheelbaseM must be > 0, got ${L}`);
  if (!(r.raiseM > 0 && r.raiseM < L)) throw new Error(`raiseM must be > 0 and < the wheelbase (${L} m), got ${r.raiseM}`);
  if (!(r.weightN > 0 && Number.isFinite(r.weightN))) throw new Error(`weightN must be finite and > 0, got ${r.weightN}`);
  // What one axle carries lies between nothing and the whole weight, before and after the raise.
  for (const [k, v] of [['levelStayingAxleN', r.levelStayingAxleN], ['raisedStayingAxleN', r.raisedStayingAxleN]] as const) {
    if (!(Number.isFinite(v) && v >= 0 && v <= r.weightN)) throw new Error(`${k} must be between 0 and the weight (${r.weightN} N), got ${v}`);
  }
  if (!(r.loadedRadiusM > 0 && Number.isFinite(r.loadedRadiusM))) throw new Error(`loadedRadiusM must be finite and > 0, got ${r.loadedRadiusM}`);
  const sinT = r.raiseM / L;
  const theta = Math.asin(sinT);
  const tanT = Math.tan(theta);
  const dW = r.raisedStayingAxleN - r.levelStayingAxleN;
  const per = L / (r.weightN * tanT);
  const h = r.loadedRadiusM + dW * per;
  // A CG below the ground cannot stand on its wheels: the readings or the raise are wrong.
  if (!(h > 0 && Number.isFinite(h))) {
    throw new Error(`the readings give a CG height of ${h.toPrecision(3)} m (below the ground): check the raised readings, the raise and which axle was raised`);
  }
  const warnings: string[] = [];
  const deg = (theta * 180) / Math.PI;
  if (theta < MIN_RAISE_ANGLE_RAD) {
    warnings.push(
      `raise angle ${deg.toFixed(1)}° is below 10°: the load change is small against the scales' error (common practice: raise 10–15° or more)`,
    );
  }
  if (!r.suspensionLocked) {
    warnings.push('lock (block) the suspension for the raised reading: body movement on the springs shifts the CG and biases the height');
  }
  if (dW <= 0) {
    warnings.push(
      `the ${r.raisedAxle === 'rear' ? 'front' : 'rear'} axle did not gain load when the ${r.raisedAxle} was raised: the CG would be at or below the axle line; check the readings and which axle was raised`,
    );
  }
  return { heightM: h, raiseAngleRad: theta, heightPerReadingErrorM: per, warnings };
}

/** The vehicle with a measured CG written in (height and, when given, the plan position). */
export function withMeasuredCg(
  vehicle: Vehicle,
  cg: { readonly heightM?: number; readonly behindFrontAxleM?: number; readonly leftOfCentreM?: number | null; readonly massKg?: number },
): Vehicle {
  return {
    ...vehicle,
    massKg: cg.massKg ?? vehicle.massKg,
    cg: {
      behindFrontAxleM: cg.behindFrontAxleM ?? vehicle.cg.behindFrontAxleM,
      heightM: cg.heightM ?? vehicle.cg.heightM,
      leftOfCentreM: cg.leftOfCentreM ?? vehicle.cg.leftOfCentreM,
    },
  };
}
