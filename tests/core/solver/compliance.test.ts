/**
 * Compliance lowers the limit (REFERENCES "Compliance lowers the limit"; Gillespie, Fundamentals
 * of Vehicle Dynamics, 1992, ch. 9, formula quoted from memory there).
 *
 * On a tilt table the sprung mass rolls toward the downhill side by φ = R_φ·sinθ (R_φ: roll rate,
 * rad of body roll per g of lateral component), moving the CG downhill by (h − h_r)·φ. Moment
 * balance about the downhill contact line with all uphill load gone (derived in REFERENCES):
 *   tan θ = SSF − (1 − h_r/h)·R_φ·sin θ.
 * R_φ is derived here from the model's springs: per axle the suspension roll stiffness
 * k_wheel·T²/2 + anti-roll, in series with the tyres' k_tyre·T²/2; summed over the axles:
 *   R_φ = m_s·g·(h_s − h_r) / K_φ.
 * It is a small-angle estimate: it ignores the pendulum term (m g (h − h_r) φ adds to the overturning
 * moment, ~16 % of K_φ here), the tyre-width pivot shift and the camber of the tyres, which push in
 * opposite directions. Hence the 1.5° tolerance.
 */
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { GRAVITY_MPS2 } from '../../../src/core/solver/model';
import { tiltSweep } from '../../../src/core/solver/tilt';
import type { TiltSweepResult, Vehicle } from '../../../src/core/model/types';
import { independent, testVehicle } from '../../helpers/vehicles';
import { EPS_COMPLIANT_TIP_RAD } from '../../helpers/eps';


const DEG = Math.PI / 180;
const POSE = { xM: 0, yM: 0, headingRad: 0 };
const FLAT = { features: [] };
const LEFT_DOWN = Math.PI / 2;
/** 3000 N·m/deg in N·m/rad (the core takes radians). */
const BAR_NM_PER_RAD = 3000 / DEG;

function sweep(v: Vehicle): TiltSweepResult {
  return tiltSweep(buildModel(v, FLAT), POSE, { downhillRad: LEFT_DOWN });
}

/** The small-angle tilt-table estimate for an independent-suspension vehicle, roll centres equal front and rear. */
function estimatedTipRad(v: Vehicle): number {
  const model = buildModel(v, FLAT);
  const axle = (k: number, T: number, bar: number, kt: number): number => {
    const ks = (k * T * T) / 2 + bar;
    const kTyre = (kt * T * T) / 2;
    return 1 / (1 / ks + 1 / kTyre);
  };
  const sf = v.suspensionFront;
  const sr = v.suspensionRear;
  const K =
    axle(sf.wheelRateNPerM, v.trackFrontM, sf.antiRollNmPerRad, v.tyreFront.stiffnessNPerM) +
    axle(sr.wheelRateNPerM, v.trackRearM, sr.antiRollNmPerRad, v.tyreRear.stiffnessNPerM);
  const hr = sf.rollCentreHeightM;
  const hs = model.cgSprungBody[2];
  const h = model.cgTotalBody[2];
  const Rphi = (model.sprungMassKg * GRAVITY_MPS2 * (hs - hr)) / K;
  const ssf = (0.5 * (v.trackFrontM + v.trackRearM)) / (2 * h);
  // tanθ + (1 − h_r/h) R_φ sinθ − SSF is increasing in θ on (0, 90°): bisect.
  let lo = 0;
  let hi = Math.PI / 2 - 1e-6;
  for (let i = 0; i < 100; i++) {
    const mid = 0.5 * (lo + hi);
    if (Math.tan(mid) + (1 - hr / h) * Rphi * Math.sin(mid) - ssf > 0) hi = mid;
    else lo = mid;
  }
  return 0.5 * (lo + hi);
}

describe('compliant vehicle on a side tilt', () => {
  const base = testVehicle();
  const s = sweep(base);
  const rigidTip = Math.atan(0.8 / 0.75); // SSF of testVehicle, 46.85°

  it('the estimate itself: R_φ 0.1, h_r/h 0.3, SSF 1.0 → tanθ 0.952, 43.58° (REFERENCES check)', () => {
    let lo = 0;
    let hi = Math.PI / 2 - 1e-6;
    for (let i = 0; i < 100; i++) {
      const mid = 0.5 * (lo + hi);
      if (Math.tan(mid) + 0.7 * 0.1 * Math.sin(mid) - 1 > 0) hi = mid;
      else lo = mid;
    }
    expect(Math.abs(lo / DEG - 43.58)).toBeLessThan(0.01);
  });

  it('lifts a wheel and tips below the rigid SSF angle', () => {
    expect(s.firstLift).not.toBeNull();
    expect(s.tip).not.toBeNull();
    expect(s.firstLift!.angleRad).toBeLessThan(rigidTip);
    expect(s.tip!.angleRad).toBeLessThan(rigidTip);
  });

  it('tips within 1.5° of tanθ = SSF − (1 − h_r/h)·R_φ·sinθ', () => {
    // testVehicle: K_φ = 2 × series(40 kN/m·1.28 m², 300 kN/m·1.28 m²) = 90.35 kN·m/rad,
    // R_φ = 2000·9.80665·0.75/90353 = 0.163 rad/g → 43.68°.
    const est = estimatedTipRad(base);
    expect(Math.abs(est / DEG - 43.68)).toBeLessThan(0.05);
    expect(Math.abs(s.tip!.angleRad - est), `tip ${(s.tip!.angleRad / DEG).toFixed(2)}° vs estimate ${(est / DEG).toFixed(2)}°`).toBeLessThan(EPS_COMPLIANT_TIP_RAD);
  });

  it('stands on three wheels just past the first lift (the tripod FL, RL, FR still carries it)', () => {
    // Derived (statics): the loads are continuous in the tilt. When RR's load reaches zero, FR still
    // carries load (the sweep's last sample before the lift shows it), so a little steeper the body
    // stands on the tripod FL–RL–FR, whose plumb point is still inside the triangle. A solve 0.3°
    // past the lift must therefore converge with RR lifted and FR loaded.
    expect(s.firstLift!.wheel).toBe('RR');
    const model = buildModel(base, FLAT);
    const before = solveEquilibrium(model, POSE, { tilt: { angleRad: s.firstLift!.angleRad - 0.05 * DEG, downhillRad: LEFT_DOWN } });
    expect(before.status).toBe('converged');
    expect(before.wheels[1].loadN).toBeGreaterThan(0.01 * before.weightN);
    const r = solveEquilibrium(model, POSE, { tilt: { angleRad: s.firstLift!.angleRad + 0.3 * DEG, downhillRad: LEFT_DOWN } });
    expect(r.status, r.reason).toBe('converged');
    expect(r.wheels[3].lifted).toBe(true);
    expect(r.wheels[1].loadN).toBeGreaterThan(0);
  });

  it('anti-roll bars (3000 N·m/deg front and rear) raise the lift angle', () => {
    // Gillespie ch. 9: more roll stiffness, less roll, less CG shift, a higher threshold.
    const barred = sweep(
      testVehicle({
        suspensionFront: independent({ antiRollNmPerRad: BAR_NM_PER_RAD }),
        suspensionRear: independent({ antiRollNmPerRad: BAR_NM_PER_RAD }),
      }),
    );
    expect(barred.firstLift!.angleRad).toBeGreaterThan(s.firstLift!.angleRad);
  });
});

describe('roll-stiffness distribution decides which axle lifts first (NRC/TRB SR 265; Gillespie ch. 9)', () => {
  // Equal static axle loads: CG at mid-wheelbase. The axle with the higher roll stiffness takes the
  // larger share of the lateral load transfer (common practice: transfer splits as roll stiffness),
  // so its uphill wheel unloads first.
  const mid = { behindFrontAxleM: 1.4, heightM: 0.75, leftOfCentreM: 0 };
  const frontStiff = sweep(testVehicle({ cg: mid, suspensionFront: independent({ antiRollNmPerRad: BAR_NM_PER_RAD }) }));
  const rearStiff = sweep(testVehicle({ cg: mid, suspensionRear: independent({ antiRollNmPerRad: BAR_NM_PER_RAD }) }));

  it('front bar stiffer: the front uphill wheel (FR, left side down) lifts first', () => {
    expect(frontStiff.firstLift?.wheel).toBe('FR');
  });

  it('rear bar stiffer: the rear uphill wheel (RR) lifts first', () => {
    expect(rearStiff.firstLift?.wheel).toBe('RR');
  });

  it('after the stiff end lifts, the other end still holds: the tip comes well after the first lift', () => {
    // Derived (statics): just after FR lifts, the tripod FL–RL–RR carries the vehicle and RR still
    // bears a large load (about a quarter of the weight's normal component at the lift), which falls
    // to zero only as the whole roll moment moves onto the rear axle, i.e. near the vehicle's
    // compliant limit (~42°, tip of the balanced vehicle). So the tip must come more than 2° after
    // the first lift (it is ~7° here).
    expect(frontStiff.tip).not.toBeNull();
    const gap = frontStiff.tip!.angleRad - frontStiff.firstLift!.angleRad;
    expect(gap / DEG, `first lift ${(frontStiff.firstLift!.angleRad / DEG).toFixed(2)}°, tip ${(frontStiff.tip!.angleRad / DEG).toFixed(2)}°`).toBeGreaterThan(2);
  });
});
