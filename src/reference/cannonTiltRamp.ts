/**
 * The cannon-es reference run as a tilt table is run (SAE J2180 / ISO 16333 practice: settle on
 * the level table, then raise it slowly and note the angle at which the vehicle goes over).
 *
 * It uses the same rig as the settling reference (cannonSettle.ts: one rigid body on four
 * spring-damper corners, a ray per corner, a stick spring per tyre), on a level table:
 * 1. settle at level (loads steady within 0.5 % of the weight for 0.5 s);
 * 2. raise the tilt about the fixed downhill direction at a constant rate (gravity turns in the
 *    table frame), a fast rate while every wheel still carries a good share of its level load, then
 *    the slow rate (quasi-static: see the tests, where halving the slow rate moves the result by
 *    less than 0.2°);
 * 3. it has gone over once the plumb line from the CG falls outside the quadrilateral of the four
 *    wheels' ground points (a loaded wheel's ray hit, or a lifted wheel's hardpoint dropped by the
 *    tyre radius): nothing can catch the body then. The recorded tip is the table angle at the last
 *    instant before that at which the plumb line was still inside the polygon of the wheels
 *    carrying load (three or four, each more than 0.2 % of the weight: with point contacts, two
 *    wheels are a line and hold nothing),
 *    i.e. where the departure began (a loss of support held again within 0.5 s is not one). The first lift is the table angle at which a wheel's load
 *    first reaches zero (and stays there for liftHoldS).
 *
 * What it models fully: vehicles with independent suspension at both ends, roll centres at the
 * ground, no anti-roll bars, no unsprung mass (the rig has none of these), on a plane table; the
 * tyre is a ray at the tyre centre-line, so a wide tyre's contact moving to its outer shoulder is
 * not modelled (compare with narrow tyres). The tyres are held on the table (brakes, 4WD in gear, a
 * trip rail): a stiff stick without a cap, so the ramp finds the tip, never a slide.
 *
 * Not part of the core: it imports cannon-es and reads a clock. Tests only.
 */
import * as CANNON from 'cannon-es';
import type { Pose, Vehicle, WheelName } from '../core/model/types';
import { CannonRig, type CannonRigOptions } from './cannonSettle';

import { RAD_PER_DEG as DEG } from '../core/scenario/fields';
/** A departure that is held again for this long was not one (s). */
const RESUPPORT_S = 0.5;
/**
 * A wheel carrying less than this share of the weight no longer holds the body up: the tyres are
 * points here, so the body then balances on a line of two, and a wheel brushing the table on the
 * way over (tens of newtons) would otherwise hold the departure's start back.
 */
const SUPPORT_SHARE = 0.002;
/**
 * The table holds the tyres (brakes, 4WD in gear, the trip rail): the stick is stiff and never
 * lets go. A soft stick (the settle's 5e4 N/m) lets the body yaw a few degrees on the table as a
 * wheel unloads and releases its share, which turns the downhill direction under the vehicle and
 * made the tip wander by up to 0.7° between ramp rates; at 1e6 N/m halving the rate moves it by
 * under 0.05°. On a plane table the stiff stick traps no forces that shift load.
 */
const RAMP_STICK_N_PER_M = 1e6;
const RAMP_STICK_CAP = 1e6;
const WHEELS: readonly WheelName[] = ['FL', 'FR', 'RL', 'RR'];

export interface CannonTiltRampOptions extends CannonRigOptions {
  /** Slow (quasi-static) tilt rate (rad/s). @default 0.5°/s */
  readonly rateRadPerS?: number;
  /** Fast rate used while every wheel still carries more than fastUntilShare of its level load (rad/s). @default 2°/s */
  readonly fastRateRadPerS?: number;
  /** @default 0.3 */
  readonly fastUntilShare?: number;
  /** Largest table angle tried (rad). @default 75° */
  readonly maxAngleRad?: number;
  /** Time to settle at level before raising (s), at most. @default 5 */
  readonly settleTimeS?: number;
  /** A wheel counts as lifted once its load stays zero this long (s). @default 0.05 */
  readonly liftHoldS?: number;
}

export interface CannonTiltRampResult {
  readonly downhillRad: number;
  /** Table angle at which the plumb line left the four wheels' footprint (rad); null if it did not up to maxAngleRad. */
  readonly tipRad: number | null;
  /** The first wheel whose load reached zero, and the table angle then. */
  readonly firstLift: { readonly wheel: WheelName; readonly angleRad: number } | null;
  /** Whether the level settle met its band. */
  readonly settled: boolean;
  /** Largest stick / normal ratio seen on a loaded wheel during the ramp (must stay under the cap). */
  readonly maxStickRatio: number;
  readonly simulatedTimeS: number;
  readonly steps: number;
  readonly wallTimeMs: number;
}

const _p = [new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3()];
const _cg = new CANNON.Vec3();

/**
 * Whether the plumb point of the CG (along gravity, onto the mean height of the four wheel
 * points) lies inside the polygon of the wheels selected by `loadedOnly` (the wheels carrying load,
 * or all four), in the table's x–y. The wheels are taken in the order FL → RL → RR → FR, which goes
 * round the footprint; fewer than three points have no inside.
 */
function plumbInside(rig: CannonRig, loadedOnly: boolean, minLoadN = 0): boolean {
  for (let i = 0; i < 4; i++) rig.wheelGroundPoint(i, _p[i]);
  _cg.copy(rig.body.position);
  const up = rig.upWorld;
  const zMean = 0.25 * (_p[0].z + _p[1].z + _p[2].z + _p[3].z);
  const t = (_cg.z - zMean) / up.z;
  const px = _cg.x - t * up.x;
  const py = _cg.y - t * up.y;
  let n = 0;
  for (const i of ORDER) if (!loadedOnly || rig.loads[i] > minLoadN) _sel[n++] = i;
  if (n < 3) return false;
  let pos = 0;
  let neg = 0;
  for (let k = 0; k < n; k++) {
    const a = _p[_sel[k]];
    const b = _p[_sel[(k + 1) % n]];
    const c = (b.x - a.x) * (py - a.y) - (b.y - a.y) * (px - a.x);
    if (c > 0) pos++;
    else if (c < 0) neg++;
  }
  return pos === 0 || neg === 0;
}
const ORDER = [0, 2, 3, 1];
const _sel = [0, 0, 0, 0];

/** Runs the tilt ramp about one downhill direction (vehicle frame, as in Tilt) on a level table. */
export function tiltRampWithCannon(vehicle: Vehicle, downhillRad: number, opts: CannonTiltRampOptions = {}): CannonTiltRampResult {
  const wallStartMs = performance.now();
  const pose: Pose = { xM: 0, yM: 0, headingRad: 0 };
  const rig = new CannonRig(vehicle, { features: [] }, pose, null, { stickCapRatio: RAMP_STICK_CAP, stickStiffnessNPerM: RAMP_STICK_N_PER_M, ...opts });
  const dt = rig.dt;
  const slow = opts.rateRadPerS ?? 0.5 * DEG;
  const fast = opts.fastRateRadPerS ?? 2 * DEG;
  const fastShare = opts.fastUntilShare ?? 0.3;
  const maxAngle = opts.maxAngleRad ?? 75 * DEG;
  const settleTimeS = opts.settleTimeS ?? 5;
  const liftHoldSteps = Math.max(1, Math.round((opts.liftHoldS ?? 0.05) / dt));
  const halfBandN = (0.005 * rig.weightN) / 2;

  // 1. Settle at level.
  const bandRef = new Float64Array(4);
  let bandStart = 0;
  let steps = 0;
  let settled = false;
  const settleSteps = Math.ceil(settleTimeS / dt);
  for (; steps < settleSteps; steps++) {
    rig.contactForces();
    let inBand = steps > 0;
    for (let i = 0; i < 4; i++) if (Math.abs(rig.loads[i] - bandRef[i]) > halfBandN) inBand = false;
    if (!inBand) {
      bandRef.set(rig.loads);
      bandStart = steps;
    } else if ((steps - bandStart) * dt >= 0.5) {
      settled = true;
      break;
    }
    rig.advance();
  }
  const levelLoads = Float64Array.from(rig.loads);

  // 2–3. Raise the table.
  let angle = 0;
  let tipRad: number | null = null;
  let firstLift: CannonTiltRampResult['firstLift'] = null;
  const zeroSince = new Int32Array(4).fill(-1);
  let maxStick = 0;
  let slowNow = false;
  let rampSteps = 0;
  let leftAt: number | null = null;
  let supportedFor = 0;
  const resupportSteps = Math.max(1, Math.round(RESUPPORT_S / dt));
  while (angle < maxAngle) {
    rig.setTilt(0, { angleRad: angle, downhillRad });
    rig.contactForces();
    rampSteps++;
    steps++;
    const st = rig.maxStickRatio(0.1 * rig.weightN / 4);
    if (st > maxStick) maxStick = st;
    if (!slowNow) {
      for (let i = 0; i < 4; i++) if (rig.loads[i] < fastShare * levelLoads[i]) slowNow = true;
    }
    if (!firstLift) {
      for (let i = 0; i < 4; i++) {
        if (rig.loads[i] > 0) zeroSince[i] = -1;
        else if (zeroSince[i] < 0) zeroSince[i] = rampSteps;
        else if (rampSteps - zeroSince[i] >= liftHoldSteps && !firstLift) {
          // The angle when its load first reached zero (the table rose since by the hold).
          firstLift = { wheel: WHEELS[i], angleRad: angle - (rampSteps - zeroSince[i]) * dt * slow };
        }
      }
    }
    // Support lost: the start of a departure, unless it is held again for resupportSteps (a
    // bounce on the way, or a wheel that lifts and comes down again, does not restart it).
    if (plumbInside(rig, true, SUPPORT_SHARE * rig.weightN)) {
      if (++supportedFor >= resupportSteps) leftAt = null;
    } else {
      supportedFor = 0;
      if (leftAt === null) leftAt = angle;
    }
    if (!plumbInside(rig, false)) {
      tipRad = leftAt ?? angle;
      break;
    }
    if (!Number.isFinite(rig.body.position.x + rig.body.position.y + rig.body.position.z)) break;
    rig.advance();
    angle += (slowNow ? slow : fast) * dt;
  }
  return {
    downhillRad,
    tipRad,
    firstLift,
    settled,
    maxStickRatio: maxStick,
    simulatedTimeS: steps * dt,
    steps,
    wallTimeMs: performance.now() - wallStartMs,
  };
}
