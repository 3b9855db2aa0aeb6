/**
 * Convergence where an equilibrium exists. Independent evidence: a plain Newton iteration with
 * a full finite-difference Jacobian of the model's own residual (VehicleModel.residual, every
 * evaluation a full ray cast; no step limits, no give-up rule) reaches a scaled residual of 1e-9
 * from the solver's last state. If that reference finds an equilibrium, solveEquilibrium must report
 * 'converged' (the SolveStatus contract: 'not-converged' means the cap was reached, 'tipped' means
 * no equilibrium). The cases came from the property test (tests/core/solver/invariants.test.ts,
 * values rounded to 4 digits; they still fail) and from the tilt-table tests.
 */
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { solveLinearInPlace } from '../../../src/core/math/linalg';
import { STATE_SIZE, type VehicleModel } from '../../../src/core/solver/model';
import type { Pose, SolveOptions, Terrain, Vehicle } from '../../../src/core/model/types';
import { BODY, independent, rigidVehicle, testVehicle } from '../../helpers/vehicles';


const DEG = Math.PI / 180;
const N = STATE_SIZE;
/** Scaled residual the reference Newton must reach to count as "an equilibrium exists". */
const REFERENCE_TOLERANCE = 1e-9;

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

/** Plain damped Newton on model.residual with full evaluations; returns the state or null. */
function referenceNewton(model: VehicleModel, pose: Pose, opts: SolveOptions, start: Float64Array): Float64Array | null {
  const tilt = opts.tilt ?? { angleRad: 0, downhillRad: 0 };
  model.setPose(pose.xM, pose.yM, pose.headingRad);
  model.setTilt(tilt.angleRad, tilt.downhillRad);
  const x = Float64Array.from(start);
  const r = new Float64Array(N);
  const rk = new Float64Array(N);
  const J = new Float64Array(N * N);
  const b = new Float64Array(N);
  const dx = new Float64Array(N);
  const xt = new Float64Array(N);
  for (let it = 0; it < 60; it++) {
    model.residual(x, true, r);
    const n0 = maxAbs(r);
    if (n0 < REFERENCE_TOLERANCE) return x;
    for (let k = 0; k < N; k++) {
      const keep = x[k];
      x[k] = keep + 1e-7;
      model.residual(x, true, rk);
      x[k] = keep;
      for (let i = 0; i < N; i++) J[i * N + k] = (rk[i] - r[i]) / 1e-7;
    }
    for (let i = 0; i < N; i++) b[i] = -r[i];
    if (!solveLinearInPlace(N, J, b, dx)) return null;
    let a = 1;
    for (let ls = 0; ls < 30; ls++) {
      for (let k = 0; k < N; k++) xt[k] = x[k] + a * dx[k];
      model.residual(xt, true, rk);
      if (maxAbs(rk) < n0) break;
      a *= 0.5;
    }
    x.set(xt);
  }
  return null;
}

interface Case {
  name: string;
  vehicle: Vehicle;
  pose: Pose;
  terrain: Terrain;
  options?: SolveOptions;
}

const POSE0 = { xM: 0, yM: 0, headingRad: 0 };
const FLAT: Terrain = { features: [] };
const wide = { radiusM: 0.4, widthM: 0.3, stiffnessNPerM: 1e9 };
const cases: Case[] = [
  {
    name: "3.6 m solid/solid rig facing down a 15\u00b0 grade, a 2 cm block under RL",
    vehicle: { ...{"name": "Random rig (invented)", "wheelbaseM": 3.6, "trackFrontM": 1.615, "trackRearM": 1.615, "massKg": 3331.0, "cg": {"behindFrontAxleM": 2.34, "heightM": 1.1, "leftOfCentreM": 0}, "unsprungMassFrontKg": 0, "unsprungMassRearKg": 0, "tyreFront": {"radiusM": 0.3863, "widthM": 0.35, "stiffnessNPerM": 547971.0}, "tyreRear": {"radiusM": 0.3863, "widthM": 0.35, "stiffnessNPerM": 547971.0}, "suspensionFront": {"type": "solid", "wheelRateNPerM": 20000.0, "bumpM": 0.08, "droopM": 0.09265, "antiRollNmPerRad": 0, "rollCentreHeightM": 1.658e-07}, "suspensionRear": {"type": "solid", "wheelRateNPerM": 20000.0, "bumpM": 0.09421, "droopM": 0.08219, "antiRollNmPerRad": 0, "rollCentreHeightM": 0}, "payload": []}, body: BODY } as Vehicle,
    pose: {"xM": 0, "yM": 0, "headingRad": 0},
    terrain: {"features": [{"type": "plane", "gradeRad": -0.2618, "crossSlopeRad": 0, "heightM": 0}, {"type": "block", "xRangeM": [-2.468, -1.132], "yRangeM": [0.1391, 1.475], "heightM": 0.02, "edgeRadiusM": 0.03}]} as Terrain,
  },
  {
    name: "2.38 m solid/solid rig on a 15\u00b0 grade, a 0.2 m block under FR",
    vehicle: { ...{"name": "Random rig (invented)", "wheelbaseM": 2.384, "trackFrontM": 1.82, "trackRearM": 1.82, "massKg": 3728.0, "cg": {"behindFrontAxleM": 1.55, "heightM": 0.9772, "leftOfCentreM": 0}, "unsprungMassFrontKg": 0, "unsprungMassRearKg": 0, "tyreFront": {"radiusM": 0.3384, "widthM": 0.1818, "stiffnessNPerM": 202650.0}, "tyreRear": {"radiusM": 0.3384, "widthM": 0.1818, "stiffnessNPerM": 202650.0}, "suspensionFront": {"type": "solid", "wheelRateNPerM": 21562.0, "bumpM": 0.1256, "droopM": 0.08, "antiRollNmPerRad": 0, "rollCentreHeightM": 0}, "suspensionRear": {"type": "solid", "wheelRateNPerM": 63059.0, "bumpM": 0.08865, "droopM": 0.167, "antiRollNmPerRad": 0, "rollCentreHeightM": 0}, "payload": []}, body: BODY } as Vehicle,
    pose: {"xM": 0, "yM": 0, "headingRad": 6.283},
    terrain: {"features": [{"type": "plane", "gradeRad": 0.2618, "crossSlopeRad": 0, "heightM": 0}, {"type": "block", "xRangeM": [0.5856, 1.799], "yRangeM": [-1.517, -0.3035], "heightM": 0.2, "edgeRadiusM": 0.03}]} as Terrain,
  },
  {
    name: "2.54 m solid/solid rig on a 15\u00b0 cross-slope, a 0.16 m rock under FL",
    vehicle: { ...{"name": "Random rig (invented)", "wheelbaseM": 2.544, "trackFrontM": 1.3, "trackRearM": 1.3, "massKg": 3436.0, "cg": {"behindFrontAxleM": 0.8903, "heightM": 0.9252, "leftOfCentreM": 0}, "unsprungMassFrontKg": 0, "unsprungMassRearKg": 0, "tyreFront": {"radiusM": 0.3, "widthM": 0.2091, "stiffnessNPerM": 329418.0}, "tyreRear": {"radiusM": 0.3, "widthM": 0.2091, "stiffnessNPerM": 329418.0}, "suspensionFront": {"type": "solid", "wheelRateNPerM": 75399.0, "bumpM": 0.1955, "droopM": 0.1159, "antiRollNmPerRad": 0, "rollCentreHeightM": 0}, "suspensionRear": {"type": "solid", "wheelRateNPerM": 27312.0, "bumpM": 0.08656, "droopM": 0.08, "antiRollNmPerRad": 0, "rollCentreHeightM": 0}, "payload": []}, body: BODY } as Vehicle,
    pose: {"xM": 0, "yM": 5.0, "headingRad": 0},
    terrain: {"features": [{"type": "plane", "gradeRad": 0, "crossSlopeRad": 0.2618, "heightM": 0}, {"type": "rock", "xM": 1.272, "yM": 5.65, "heightM": 0.1597, "radiusM": 0.3}]} as Terrain,
  },
  {
    name: 'testVehicle at 42.25° left side down: RR lifted, on the tripod FL–RL–FR',
    vehicle: testVehicle(),
    pose: POSE0,
    terrain: FLAT,
    options: { tilt: { angleRad: 42.25 * DEG, downhillRad: Math.PI / 2 } },
  },
  {
    name: 'testVehicle, CG mid-wheelbase, front bar 3000 N·m/deg, at 38° left side down: FR lifted',
    vehicle: testVehicle({ cg: { behindFrontAxleM: 1.4, heightM: 0.75, leftOfCentreM: 0 }, suspensionFront: independent({ antiRollNmPerRad: 3000 / DEG }) }),
    pose: POSE0,
    terrain: FLAT,
    options: { tilt: { angleRad: 38 * DEG, downhillRad: Math.PI / 2 } },
  },
  {
    name: 'rigid vehicle on 0.3 m wide rigid tyres at 51° left side down: on the downhill tyres',
    vehicle: rigidVehicle({ tyreFront: wide, tyreRear: wide }),
    pose: POSE0,
    terrain: FLAT,
    options: { tilt: { angleRad: 51 * DEG, downhillRad: Math.PI / 2 } },
  },
];

describe('solveEquilibrium converges where an equilibrium exists', () => {
  for (const c of cases) {
    it(c.name, () => {
      const model = buildModel(c.vehicle, c.terrain);
      const r = solveEquilibrium(model, c.pose, c.options);
      const ref = referenceNewton(model, c.pose, c.options ?? {}, r.state);
      expect(ref, 'the reference Newton should find the equilibrium (else the case proves nothing)').not.toBeNull();
      const check = solveEquilibrium(model, c.pose, { ...c.options, warmStart: ref, maxIterations: 0 });
      expect(check.status).toBe('converged');
      expect(check.margins.forceAngleRad).toBeGreaterThan(0);
      const loads = check.wheels.map((w) => w.loadN.toFixed(0)).join(', ');
      const got = r.wheels.map((w) => w.loadN.toFixed(0)).join(', ');
      expect(r.status, `${r.reason}; equilibrium loads ${loads} N, solver stopped at ${got} N`).toBe('converged');
      for (let i = 0; i < 4; i++) expect(Math.abs(r.wheels[i].loadN - check.wheels[i].loadN)).toBeLessThan(1e-6 * r.weightN);
    });
  }
});
