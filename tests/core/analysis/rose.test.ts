/** Stability rose of a rigid build against the closed forms (SSF and the grade formulas). */
import { describe, expect, it } from 'vitest';
import { cardinalLimits, stabilityRose } from '../../../src/core/analysis/rose';
import { buildModel } from '../../../src/core/solver/equilibrium';
import { rigidVehicle } from '../../helpers/vehicles';


const DEG = Math.PI / 180;
const POSE = { xM: 0, yM: 0, headingRad: 0 };
/** Issue 3 tolerance for the rigid rose against the closed forms. */
const EPS_ROSE_RAD = 0.1 * DEG;

describe('stability rose, rigid build on a level tilt table', () => {
  // Invented rigid vehicle: T 1.6 m, h 0.75 m, a 1.3 m behind the front axle, b 1.5 m, CG 0.12 m left of centre.
  const y = 0.12;
  const v = rigidVehicle({ cg: { behindFrontAxleM: 1.3, heightM: 0.75, leftOfCentreM: y } });
  const model = buildModel(v, { features: [] });
  const rose = stabilityRose(model, POSE, { stepRad: 45 * DEG });

  it('has one sweep per direction, every 45°', () => {
    expect(rose.directions.map((d) => Math.round(d.downhillRad / DEG))).toEqual([0, 45, 90, 135, 180, 225, 270, 315]);
  });

  it('side directions tip at atan((T/2 ∓ y)/h) (SSF with a lateral offset, NHTSA / REFERENCES "Rollover")', () => {
    // Left side down: the CG sits y toward the downhill side, so the lever is T/2 − y; right side down: T/2 + y.
    const left = rose.directions[2];
    const right = rose.directions[6];
    expect(Math.abs(left.tip!.angleRad - Math.atan((0.8 - y) / 0.75))).toBeLessThan(EPS_ROSE_RAD);
    expect(Math.abs(right.tip!.angleRad - Math.atan((0.8 + y) / 0.75))).toBeLessThan(EPS_ROSE_RAD);
    expect(left.tip!.edge).toEqual(['FL', 'RL']);
  });

  it('nose down tips at atan(a/h), tail down at atan(b/h) (Gillespie ch. 2, grade formulas)', () => {
    expect(Math.abs(rose.directions[0].tip!.angleRad - Math.atan(1.3 / 0.75))).toBeLessThan(EPS_ROSE_RAD);
    expect(Math.abs(rose.directions[4].tip!.angleRad - Math.atan(1.5 / 0.75))).toBeLessThan(EPS_ROSE_RAD);
  });

  it('the weakest direction is the smallest tip angle of the rose (left side down here)', () => {
    const tips = rose.directions.map((d) => d.tip!.angleRad);
    expect(rose.weakest.tip!.angleRad).toBe(Math.min(...tips));
    expect(Math.round(rose.weakest.downhillRad / DEG)).toBe(90);
  });

  it('cardinal limits agree with the rose at 0, 90, 180, 270°', () => {
    const c = cardinalLimits(model, POSE);
    expect(c.noseDown.tip!.angleRad).toBeCloseTo(rose.directions[0].tip!.angleRad, 6);
    expect(c.leftDown.tip!.angleRad).toBeCloseTo(rose.directions[2].tip!.angleRad, 6);
    expect(c.tailDown.tip!.angleRad).toBeCloseTo(rose.directions[4].tip!.angleRad, 6);
    expect(c.rightDown.tip!.angleRad).toBeCloseTo(rose.directions[6].tip!.angleRad, 6);
  });
});
