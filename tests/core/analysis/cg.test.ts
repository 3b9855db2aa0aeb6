/** CG from scale readings: level corners and the axle-lift method (src/core/analysis/cg.ts). */
import { describe, expect, it } from 'vitest';
import { cgFromLevelReadings, cgHeightFromAxleLift, withMeasuredCg } from '../../../src/core/analysis/cg';
import { GRAVITY_MPS2 } from '../../../src/core/solver/model';
import { testVehicle } from '../../helpers/vehicles';


describe('axle-lift method', () => {
  it('worked example: W 20 000 N, L 2.60 m, W_f 10 400 → 11 000 N with the rear raised 0.50 m, r 0.35 m → h 0.748 m', () => {
    // Source: REFERENCES "CG height by raising one axle" (derived, verified forward): θ = asin(0.5/2.6) = 11.087°,
    // h = r + L·ΔW/(W·tan θ) = 0.35 + 2.6·600/(20000·0.19596) = 0.748 m (ISO 10392 / SAE J874 practice).
    const r = cgHeightFromAxleLift({
      wheelbaseM: 2.6,
      weightN: 20_000,
      raisedAxle: 'rear',
      raiseM: 0.5,
      levelStayingAxleN: 10_400,
      raisedStayingAxleN: 11_000,
      loadedRadiusM: 0.35,
      suspensionLocked: true,
    });
    expect(r.heightM).toBeCloseTo(0.748, 3);
    expect((r.raiseAngleRad * 180) / Math.PI).toBeCloseTo(11.087, 3);
    expect(r.warnings).toEqual([]);
  });

  it('forward check: rotate a known CG about the staying axle, compute the readings, recover the height', () => {
    // Derived (statics of a rigid body, 2D): the vehicle pivots about the staying axle's contact; each
    // tyre's reaction acts through its contact, directly below its wheel centre (round tyre, flat
    // ground). The front reading is W × (horizontal lever of the CG about the rear contact) / (horizontal
    // wheelbase). Test values invented: L 2.9 m, a 1.25 m behind the front axle, h 0.82 m, r 0.40 m.
    const L = 2.9, a = 1.25, h = 0.82, r = 0.4, W = 24_000;
    for (const raisedAxle of ['rear', 'front'] as const) {
      for (const H of [0.5, 0.8]) {
        const theta = Math.asin(H / L);
        // Body frame: front wheel centre at (0, 0), rear at (−L, 0), CG at (−a, h − r); x forward, z up.
        // Raising the rear (or front) turns the body by ±θ about the staying wheel centre.
        const sign = raisedAxle === 'rear' ? -1 : 1; // nose down (rear up) is a clockwise turn seen from the left
        const c = Math.cos(sign * theta), s = Math.sin(sign * theta);
        const rot = (x: number, z: number) => [c * x - s * z, s * x + c * z];
        const [fx] = rot(0, 0);
        const [rx] = rot(-L, 0);
        const [gx] = rot(-a, h - r);
        const front = (W * (gx - rx)) / (fx - rx);
        const rear = W - front;
        const levelFront = (W * (L - a)) / L;
        const got = cgHeightFromAxleLift({
          wheelbaseM: L,
          weightN: W,
          raisedAxle,
          raiseM: H,
          levelStayingAxleN: raisedAxle === 'rear' ? levelFront : W - levelFront,
          raisedStayingAxleN: raisedAxle === 'rear' ? front : rear,
          loadedRadiusM: r,
          suspensionLocked: true,
        });
        expect(got.heightM, `${raisedAxle} raised ${H} m`).toBeCloseTo(h, 9);
      }
    }
  });

  it('warns below a 10° raise (common practice: 10–15° or more) and reminds to lock the suspension', () => {
    const r = cgHeightFromAxleLift({
      wheelbaseM: 2.6, weightN: 20_000, raisedAxle: 'rear', raiseM: 0.3,
      levelStayingAxleN: 10_400, raisedStayingAxleN: 10_750, loadedRadiusM: 0.35,
    });
    expect(r.warnings).toHaveLength(2);
    expect(r.warnings[0]).toMatch(/^raise angle 6\.6° is below 10°/);
    expect(r.warnings[1]).toMatch(/^lock \(block\) the suspension/);
    // Sensitivity: L / (W tan θ) metres per newton of reading error.
    expect(r.heightPerReadingErrorM).toBeCloseTo(2.6 / (20_000 * Math.tan(Math.asin(0.3 / 2.6))), 12);
  });

  it('refuses a raise of zero or more than the wheelbase', () => {
    const base = { wheelbaseM: 2.6, weightN: 2e4, raisedAxle: 'rear' as const, levelStayingAxleN: 1e4, raisedStayingAxleN: 1.1e4, loadedRadiusM: 0.35 };
    expect(() => cgHeightFromAxleLift({ ...base, raiseM: 0 })).toThrow('raiseM must be > 0 and < the wheelbase (2.6 m), got 0');
    expect(() => cgHeightFromAxleLift({ ...base, raiseM: 3 })).toThrow('raiseM must be > 0 and < the wheelbase (2.6 m), got 3');
  });
});

describe('level corner readings', () => {
  it('forward check: corner loads of a known CG (statics, Gillespie ch. 2) give back mass and position', () => {
    // Derived: W_f = W·b/L, W_r = W·a/L; each axle split by lever arms about its track (rigidStaticLoads).
    const L = 2.7, a = 1.2, y = 0.05, Tf = 1.58, Tr = 1.62, massKg = 2100;
    const W = massKg * GRAVITY_MPS2;
    const wf = (W * (L - a)) / L, wr = W - wf;
    const fl = (wf * (Tf / 2 + y)) / Tf, rl = (wr * (Tr / 2 + y)) / Tr;
    const r = cgFromLevelReadings({ cornersN: [fl, wf - fl, rl, wr - rl], wheelbaseM: L, trackFrontM: Tf, trackRearM: Tr });
    expect(r.massKg).toBeCloseTo(massKg, 9);
    expect(r.behindFrontAxleM).toBeCloseTo(a, 12);
    expect(r.leftOfCentreM).toBeCloseTo(y, 12);
    expect(cgFromLevelReadings({ cornersN: [fl, wf - fl, rl, wr - rl], wheelbaseM: L }).leftOfCentreM).toBeNull();
  });

  it('writes a measured CG into a vehicle without touching the rest', () => {
    const v = testVehicle();
    const w = withMeasuredCg(v, { heightM: 0.9, behindFrontAxleM: 1.4, leftOfCentreM: null, massKg: 2050 });
    expect(w.cg).toEqual({ behindFrontAxleM: 1.4, heightM: 0.9, leftOfCentreM: 0 });
    expect(w.massKg).toBe(2050);
    expect(v.cg.heightM).toBe(0.75);
    expect(w.tyreFront).toBe(v.tyreFront);
  });
});
