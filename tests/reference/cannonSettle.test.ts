/**
 * The cannon-es settling reference (src/reference/cannonSettle.ts) against handbook statics.
 * The vehicle is invented: a 2000 kg two-axle 4×4 with independent suspension at both ends.
 */
import { describe, expect, it } from 'vitest';
import type { PayloadItem, Terrain, Tilt, Vehicle } from '../../src/core/model/types';
import { settleWithCannon, STANDARD_GRAVITY_M_PER_S2 } from '../../src/reference/cannonSettle';
import { testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;

/** The shared invented test rig (tests/helpers/vehicles.ts) with a lateral CG offset and a payload. */
function makeVehicle(cgLeftM: number, payload: PayloadItem[]): Vehicle {
  return testVehicle({ cg: { behindFrontAxleM: 1.3, heightM: 0.75, leftOfCentreM: cgLeftM }, payload });
}

const symmetric = makeVehicle(0, []);
/** Offset CG and a roof box, so the static split is not trivially even. */
const roofBox: PayloadItem = { label: 'roof box', massKg: 120, behindFrontAxleM: 1.9, heightM: 1.95, leftOfCentreM: -0.1 };
const offset = makeVehicle(0.06, [roofBox]);

const level: Terrain = { features: [] };
const pose = { xM: 0, yM: 0, headingRad: 0 };
const sum = (a: readonly number[]): number => a.reduce((s, x) => s + x, 0);

describe('cannon-es settling reference', () => {
  it('level ground: loads match the static distribution (Gillespie ch. 2) and sum to the weight', () => {
    const r = settleWithCannon(offset, level, pose, null);
    // Combined CG of vehicle and roof box, worked here independently of the reference.
    const m = offset.massKg + roofBox.massKg;
    const a = (offset.massKg * 1.3 + roofBox.massKg * roofBox.behindFrontAxleM) / m;
    const y = (offset.massKg * 0.06 + roofBox.massKg * roofBox.leftOfCentreM) / m;
    const W = m * STANDARD_GRAVITY_M_PER_S2;
    const L = 2.8;
    const T = 1.6;
    // Gillespie, Fundamentals of Vehicle Dynamics (1992), ch. 2: front axle W·b/L, rear W·a/L;
    // each axle split left/right by moments about the tyre centre-lines: (T/2 ± y)/T.
    const front = (W * (L - a)) / L;
    const rear = (W * a) / L;
    const expected = [front * (T / 2 + y) / T, front * (T / 2 - y) / T, rear * (T / 2 + y) / T, rear * (T / 2 - y) / T];
    expect(r.weightN).toBeCloseTo(W, 6);
    for (let i = 0; i < 4; i++) expect(Math.abs(r.loadsN[i] - expected[i])).toBeLessThan(0.01 * W);
    expect(Math.abs(sum(r.loadsN) - W)).toBeLessThan(0.005 * W);
    expect(Math.abs(sum(r.verticalLoadsN) - W)).toBeLessThan(0.005 * W);
    // The split is uneven enough that a wrong distribution would fail the 1 % bound.
    expect(expected[0] - expected[3]).toBeGreaterThan(0.05 * W);
    expect(r.settled).toBe(true);
  });

  it('20° side-hill, downhill left: downhill wheels carry more; normal loads sum to W·cos 20°', () => {
    const tilt: Tilt = { angleRad: 20 * DEG, downhillRad: Math.PI / 2 };
    const r = settleWithCannon(symmetric, level, pose, tilt);
    const W = r.weightN;
    const [fl, fr, rl, rr] = r.loadsN;
    expect(fl).toBeGreaterThan(fr);
    expect(rl).toBeGreaterThan(rr);
    // Equilibrium normal to the table (the stick forces lie in it): Σ N = W·cos θ.
    expect(Math.abs(sum(r.loadsN) - W * Math.cos(20 * DEG))).toBeLessThan(0.01 * W);
    // Along gravity the scale readings add up to the whole weight.
    expect(Math.abs(sum(r.verticalLoadsN) - W)).toBeLessThan(0.005 * W);
    // Lateral transfer. Rigid vehicle (tilt-table moment balance about the downhill tyre line,
    // as behind SSF, NHTSA 2001): downhill side W·(cos θ/2 + h·sin θ/T). Compliant (derived,
    // linearised): the body rolls φ = W·h·sin θ / (K − W·h·cos θ) about the ground-level roll
    // centre, K = k·T² with k the corner rate in series with the tyre, which adds W·h·cos θ·φ/T.
    const h = 0.75;
    const T = 1.6;
    const k = (40e3 * 300e3) / (40e3 + 300e3);
    const th = 20 * DEG;
    const rigidDownhill = W * (Math.cos(th) / 2 + (h * Math.sin(th)) / T);
    const phi = (W * h * Math.sin(th)) / (k * T * T - W * h * Math.cos(th));
    const compliantDownhill = W * (Math.cos(th) / 2 + (h * (Math.sin(th) + Math.cos(th) * phi)) / T);
    expect(fl + rl).toBeGreaterThan(rigidDownhill);
    expect(Math.abs(fl + rl - compliantDownhill)).toBeLessThan(0.01 * W);
    expect(r.maxStickRatio).toBeLessThan(1.5);
  });

  it('10° grade facing uphill: axle loads match W(b cos θ − h sin θ)/L and W(a cos θ + h sin θ)/L (Gillespie ch. 2)', () => {
    const th = 10 * DEG;
    const r = settleWithCannon(symmetric, level, pose, { angleRad: th, downhillRad: Math.PI });
    const W = r.weightN;
    const a = 1.3;
    const b = 1.5;
    const h = 0.75;
    const L = 2.8;
    const front = (W * (b * Math.cos(th) - h * Math.sin(th))) / L;
    const rear = (W * (a * Math.cos(th) + h * Math.sin(th))) / L;
    // Rigid-vehicle formula; the compliant body pitches about 0.5° nose down, moving the CG
    // uphill by a few mm (about 0.3 % of W in axle load), inside the 1 % bound.
    expect(Math.abs(r.loadsN[0] + r.loadsN[1] - front)).toBeLessThan(0.01 * W);
    expect(Math.abs(r.loadsN[2] + r.loadsN[3] - rear)).toBeLessThan(0.01 * W);
    expect(r.loadsN[2]).toBeGreaterThan(r.loadsN[0]);
  });

  it('settles well under the time cap, and the step count matches the time', () => {
    const opts = { maxTimeS: 20 };
    for (const tilt of [null, { angleRad: 20 * DEG, downhillRad: Math.PI / 2 }]) {
      const r = settleWithCannon(symmetric, level, pose, tilt, opts);
      expect(r.settled).toBe(true);
      expect(r.simulatedTimeS).toBeLessThan(opts.maxTimeS);
      // The settle window alone is 0.5 s.
      expect(r.simulatedTimeS).toBeGreaterThanOrEqual(0.5);
      expect(r.steps * (1 / 500)).toBeCloseTo(r.simulatedTimeS, 9);
      expect(r.wallTimeMs).toBeGreaterThan(0);
    }
  });

  it('reports not settled when the cap is too short to settle', () => {
    const r = settleWithCannon(symmetric, level, pose, null, { maxTimeS: 0.2 });
    expect(r.settled).toBe(false);
    expect(r.simulatedTimeS).toBeCloseTo(0.2, 6);
  });
});
