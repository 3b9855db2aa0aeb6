/**
 * Slope to spare (src/core/analysis/spare.ts) against the rigid closed forms: a rigid vehicle goes
 * over when the plumb line reaches the support edge, tan θ = (T/2)/h sideways (SSF, NHTSA 2001),
 * tan θ = a/h nose down and b/h tail down (Gillespie 1992, ch. 2), θ being the slope from level.
 * On ground already sloping by s toward the downhill side, the tilt to spare is θ − s; against the
 * slope it is θ + s (derived: the ground under the vehicle is then at θ from level either way).
 * The rigid rig and the hill are invented.
 */
import { describe, expect, it } from 'vitest';
import { SPARE_DATUM, slopeToSpare } from '../../../src/core/analysis/spare';
import { buildModel } from '../../../src/core/solver/equilibrium';
import { rigidVehicle } from '../../helpers/vehicles';

const DEG = Math.PI / 180;
const POSE = { xM: 0, yM: 0, headingRad: 0 };
// rigidVehicle: T 1.6 m, h 0.75 m, a 1.3 m, b 1.5 m.
const SSF_RAD = Math.atan(0.8 / 0.75);
const EPS = 0.1 * DEG;

describe('slope to spare', () => {
  it('level table: the extra tilt to the tip each way is the closed form, and from level the same', () => {
    const s = slopeToSpare(buildModel(rigidVehicle(), { features: [] }), POSE, { stepRad: 90 * DEG });
    expect(s.datum).toBe(SPARE_DATUM);
    expect(s.standsNow).toBe(true);
    expect(s.groundFromLevelRad).toBeCloseTo(0, 9);
    const c = s.cardinals;
    expect(Math.abs(c.leftDown.toTipBeyondGroundRad! - SSF_RAD)).toBeLessThan(EPS);
    expect(Math.abs(c.rightDown.toTipBeyondGroundRad! - SSF_RAD)).toBeLessThan(EPS);
    expect(Math.abs(c.noseDown.toTipBeyondGroundRad! - Math.atan(1.3 / 0.75))).toBeLessThan(EPS);
    expect(Math.abs(c.tailDown.toTipBeyondGroundRad! - Math.atan(1.5 / 0.75))).toBeLessThan(EPS);
    expect(c.leftDown.tipFromLevelRad).toBeCloseTo(c.leftDown.toTipBeyondGroundRad!, 9);
    // The weakest way is sideways; a wheel lifts no later than the tip.
    expect(Math.abs(s.weakestTip.toTipBeyondGroundRad! - SSF_RAD)).toBeLessThan(EPS);
    expect(s.weakestLift.toLiftBeyondGroundRad!).toBeLessThanOrEqual(s.weakestTip.toTipBeyondGroundRad! + 1e-9);
  });

  it('on a 12° side hill (left side down): 12° less to spare downhill, 12° more uphill; the same slope from level', () => {
    const s0 = 12 * DEG;
    const hill = { features: [{ type: 'plane' as const, gradeRad: 0, crossSlopeRad: -s0, heightM: 0 }] };
    const s = slopeToSpare(buildModel(rigidVehicle(), hill), POSE, { stepRad: 90 * DEG });
    expect(s.groundFromLevelRad / DEG).toBeCloseTo(12, 6);
    const left = s.cardinals.leftDown;
    const right = s.cardinals.rightDown;
    expect(Math.abs(left.toTipBeyondGroundRad! - (SSF_RAD - s0))).toBeLessThan(EPS);
    expect(Math.abs(left.tipFromLevelRad! - SSF_RAD)).toBeLessThan(EPS);
    expect(Math.abs(right.toTipBeyondGroundRad! - (SSF_RAD + s0))).toBeLessThan(EPS);
    expect(Math.abs(right.tipFromLevelRad! - SSF_RAD)).toBeLessThan(EPS);
    expect(s.weakestTip.downhillRad).toBeCloseTo(Math.PI / 2, 9);
  });
});
