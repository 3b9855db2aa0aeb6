/**
 * The cannon-es tilt-ramp reference (src/reference/cannonTiltRamp.ts) checked against the rigid
 * closed forms before it is used to check the solver:
 * - lateral: SSF = T/(2h), the uphill wheels lift and the vehicle goes over at tan θ = T/(2h)
 *   (NHTSA's Static Stability Factor; Gillespie, Fundamentals of Vehicle Dynamics, 1992, ch. 9);
 *   with the CG y to the uphill side, tan θ = (T/2 + y)/h (moment balance about the downhill tyre line);
 * - fore-aft: tail down the front unloads at tan θ = b/h, nose down the rear at tan θ = a/h
 *   (Gillespie ch. 2, axle loads on a grade).
 * A stiff rig (springs and tyres 2 MN/m) stands for the rigid vehicle. Compliance only lowers the
 * angle (the body rolls toward the downhill side and carries the CG with it), so each result must
 * lie at or below the closed form and within 0.5° of it (on this rig the roll under the largest
 * moment is about 0.3°, i.e. a few tenths of a degree of tilt).
 * Then its own quasi-static checks: halving the ramp rate moves the tip by less than 0.2°, and so
 * does five-fold damping (heavy damping could hold the body past its tip while the table rises).
 * Vehicles are invented.
 */
import { describe, expect, it } from 'vitest';
import type { Vehicle } from '../../src/core/model/types';
import { tiltRampWithCannon } from '../../src/reference/cannonTiltRamp';
import { independent, testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;
const stiffCorner = independent({ wheelRateNPerM: 2e6, bumpM: 0.1, droopM: 0.1 });
const stiffTyre = { radiusM: 0.4, widthM: 0.04, stiffnessNPerM: 2e6 };
function stiffRig(over: Partial<Vehicle> = {}): Vehicle {
  return testVehicle({ suspensionFront: stiffCorner, suspensionRear: stiffCorner, tyreFront: stiffTyre, tyreRear: stiffTyre, ...over });
}

/** Tip (deg) of a ramp that must settle, go over and never need more than the stick allows. */
function tipDeg(v: Vehicle, downhillDeg: number, opts: Parameters<typeof tiltRampWithCannon>[2] = {}): number {
  const r = tiltRampWithCannon(v, downhillDeg * DEG, opts);
  expect(r.settled).toBe(true);
  expect(r.tipRad).not.toBeNull();
  return (r.tipRad as number) / DEG;
}

describe('cannon-es tilt ramp against the rigid closed forms', { timeout: 240_000 }, () => {
  // Test rig: T 1.6 m, h 0.75 m, a 1.3 m, b 1.5 m (tests/helpers/vehicles.ts).
  it('left side down: goes over at atan(T/2h) (SSF, NHTSA), within 0.5° below', () => {
    const closed = Math.atan(0.8 / 0.75) / DEG; // 46.848°
    const tip = tipDeg(stiffRig(), 90);
    expect(tip).toBeLessThanOrEqual(closed + 0.02);
    expect(tip).toBeGreaterThan(closed - 0.5);
  });

  it('right side down with the CG 0.1 m left (uphill): atan((T/2 + y)/h)', () => {
    const v = stiffRig({ cg: { behindFrontAxleM: 1.3, heightM: 0.75, leftOfCentreM: 0.1 } });
    const closed = Math.atan(0.9 / 0.75) / DEG; // 50.194°
    const tip = tipDeg(v, 270);
    expect(tip).toBeLessThanOrEqual(closed + 0.02);
    expect(tip).toBeGreaterThan(closed - 0.5);
    // The same vehicle left side down has the CG 0.1 m downhill: atan(0.7/0.75) = 43.025°.
    const other = tipDeg(v, 90);
    expect(other).toBeLessThanOrEqual(Math.atan(0.7 / 0.75) / DEG + 0.02);
    expect(other).toBeGreaterThan(Math.atan(0.7 / 0.75) / DEG - 0.5);
  });

  it('tail down: the front unloads at atan(b/h); nose down the rear at atan(a/h) (Gillespie ch. 2)', () => {
    // A higher CG (1.1 m) keeps both under 60°.
    const v = stiffRig({ cg: { behindFrontAxleM: 1.3, heightM: 1.1, leftOfCentreM: 0 } });
    const tail = tipDeg(v, 180);
    const nose = tipDeg(v, 0);
    const tailClosed = Math.atan(1.5 / 1.1) / DEG; // 53.746°
    const noseClosed = Math.atan(1.3 / 1.1) / DEG; // 49.764°
    expect(tail).toBeLessThanOrEqual(tailClosed + 0.02);
    expect(tail).toBeGreaterThan(tailClosed - 0.5);
    expect(nose).toBeLessThanOrEqual(noseClosed + 0.02);
    expect(nose).toBeGreaterThan(noseClosed - 0.5);
  });
});

describe('cannon-es tilt ramp is quasi-static', { timeout: 240_000 }, () => {
  // The compliant test rig (40 kN/m corners, 300 kN/m tyres), two diagonal directions where a
  // wheel lifts well before the tip (the hardest case for a ramp: the body walks on three wheels).
  for (const downhillDeg of [45, 165]) {
    it(`downhill ${downhillDeg}°: halving the rate, then five-fold damping, each move the tip by < 0.2°`, () => {
      const v = testVehicle();
      const base = tipDeg(v, downhillDeg);
      const half = tipDeg(v, downhillDeg, { rateRadPerS: 0.25 * DEG });
      // Five-fold damping at the halved rate (a damper's lag grows with the rate times the damping).
      const damped = tipDeg(v, downhillDeg, { rateRadPerS: 0.25 * DEG, dampingRatio: 5 });
      expect(Math.abs(half - base)).toBeLessThan(0.2);
      expect(Math.abs(damped - half)).toBeLessThan(0.2);
      // A wheel lifts first, an uphill one, well before the tip.
      const r = tiltRampWithCannon(v, downhillDeg * DEG);
      expect(r.firstLift).not.toBeNull();
      expect(r.firstLift!.wheel).toBe(downhillDeg === 45 ? 'RR' : 'FR');
      expect(r.firstLift!.angleRad / DEG).toBeLessThan(base - 3);
    });
  }
});
