/** Warp (one front wheel on a block) and the ramp travel test (src/core/analysis/ramp.ts). */
import { describe, expect, it } from 'vitest';
import { rampTravelScore, rampTravelTest } from '../../../src/core/analysis/ramp';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import type { Vehicle, WheelName } from '../../../src/core/model/types';
import { independent, testVehicle } from '../../helpers/vehicles';


const POSE = { xM: 0, yM: 0, headingRad: 0 };

/** Raises a block under the FL tyre in 1 cm steps; the first wheel other than FL to lift, and the block height. */
function firstLiftOnBlock(v: Vehicle): { wheel: WheelName; heightM: number; frLoadN: number } {
  const x = v.wheelbaseM / 2;
  const y = v.trackFrontM / 2;
  let warm: Float64Array | null = null;
  for (let h = 0.01; h < 1.0; h += 0.01) {
    const terrain = { features: [{ type: 'block' as const, xRangeM: [x - 0.6, x + 0.6] as const, yRangeM: [y - 0.3, y + 0.3] as const, heightM: h, edgeRadiusM: 0 }] };
    const model = buildModel(v, terrain);
    const r = solveEquilibrium(model, POSE, { warmStart: warm, maxIterations: 240 });
    expect(r.status, `block ${h.toFixed(2)} m`).toBe('converged');
    warm = r.state;
    const lifted = r.wheels.filter((w, i) => i !== 0 && w.lifted);
    if (lifted.length > 0) return { wheel: lifted[0].name, heightM: h, frLoadN: r.wheels[1].loadN };
  }
  throw new Error('no wheel lifted');
}

describe('warp: one front wheel raised on a block beyond the articulation available', () => {
  // Why: with FL pushed up, the diagonal FL–RR takes the load and the other diagonal (FR, RL) is
  // unloaded by the same warp moment at both ends of the vehicle (equal suspensions front and rear),
  // so the wheel of that diagonal with the smaller level-ground load reaches zero first (common
  // practice; statics of the warp moment).
  it('a front-heavy vehicle lifts the rear wheel of the unloaded diagonal (RL) while FR still carries load', () => {
    const v = testVehicle({ cg: { behindFrontAxleM: 1.1, heightM: 0.75, leftOfCentreM: 0 } }); // 61 % on the front
    const r = firstLiftOnBlock(v);
    expect(r.wheel).toBe('RL');
    expect(r.frLoadN).toBeGreaterThan(0);
  });

  it('a rear-heavy vehicle lifts the front wheel of that diagonal (FR) instead', () => {
    const v = testVehicle({ cg: { behindFrontAxleM: 1.7, heightM: 0.75, leftOfCentreM: 0 } }); // 39 % on the front
    expect(firstLiftOnBlock(v).wheel).toBe('FR');
  });
});

describe('ramp travel test (common practice: 20° ramp under one front wheel)', () => {
  const vehicle = (travelM: number, rateNPerM: number) => {
    const s = independent({ bumpM: travelM, droopM: travelM, wheelRateNPerM: rateNPerM });
    return testVehicle({ suspensionFront: s, suspensionRear: s });
  };

  it('score = 1000 × distance up the ramp / wheelbase; REFERENCES check 62 in on a 94 in wheelbase → 659.6', () => {
    expect(rampTravelScore(62, 94)).toBeCloseTo(659.6, 1);
    const r = rampTravelTest(vehicle(0.12, 20_000));
    expect(r.reachedRear).toBe(false);
    expect(r.score).toBeCloseTo((1000 * r.distanceM) / 2.8, 9);
    // The same score from the lift height: 1000 / sin 20° ≈ 2924 × height / wheelbase.
    expect(r.score).toBeCloseTo((1000 / Math.sin((20 * Math.PI) / 180)) * (r.liftHeightM / 2.8), 9);
    expect(r.liftedWheel).not.toBe('FL');
  });

  it('the distance grows with the travel available and falls with the spring rate', () => {
    const d = (t: number, k: number) => rampTravelTest(vehicle(t, k)).distanceM;
    const short = d(0.1, 20_000);
    const long = d(0.15, 20_000);
    expect(long).toBeGreaterThan(short + 0.1);
    const stiff = d(0.15, 40_000);
    const stiffer = d(0.15, 80_000);
    expect(stiff).toBeLessThan(long - 0.1);
    expect(stiffer).toBeLessThan(stiff - 0.1);
  });
});
