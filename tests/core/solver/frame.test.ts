/**
 * The body frame carried by results (src/core/solver/frame.ts): a body point mapped with it lands
 * where the solver put it. Check: each wheel centre, known in the body frame from the geometry
 * (±L/2, ±T/2, loaded radius + travel; independent corners with the roll centre on the ground move
 * straight up and down), against the wheel centre the solver reports; and the rotation is a proper
 * rotation (RᵀR = I, det R = 1).
 */
import { describe, expect, it, vi } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { bodyToTerrain } from '../../../src/core/solver/frame';
import { testVehicle } from '../../helpers/vehicles';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));

const DEG = Math.PI / 180;

describe('body frame', () => {
  it('maps the wheel centres (body frame) onto the solved wheel centres on a rock, heading 30°, tilted 12°', () => {
    const v = testVehicle();
    const model = buildModel(v, { features: [{ type: 'rock', xM: 1.5, yM: 1.2, heightM: 0.25, radiusM: 0.5 }] });
    const pose = { xM: 0.2, yM: 0.1, headingRad: 30 * DEG };
    const r = solveEquilibrium(model, pose, { tilt: { angleRad: 12 * DEG, downhillRad: 100 * DEG } });
    expect(r.standing).toBe(true);
    const f = r.body.frame;
    const R = f.rotation;
    for (let i = 0; i < 3; i++) {
      for (let j = 0; j < 3; j++) {
        let d = 0;
        for (let k = 0; k < 3; k++) d += R[3 * k + i] * R[3 * k + j];
        expect(Math.abs(d - (i === j ? 1 : 0))).toBeLessThan(1e-12);
      }
    }
    const det = R[0] * (R[4] * R[8] - R[5] * R[7]) - R[1] * (R[3] * R[8] - R[5] * R[6]) + R[2] * (R[3] * R[7] - R[4] * R[6]);
    expect(Math.abs(det - 1)).toBeLessThan(1e-12);
    for (let i = 0; i < 4; i++) {
      const x = i < 2 ? v.wheelbaseM / 2 : -v.wheelbaseM / 2;
      const y = (i & 1) === 0 ? v.trackFrontM / 2 : -v.trackFrontM / 2;
      const z = model.rideRadiusM[i] + r.wheels[i].travelM!;
      const p = bodyToTerrain(f, x, y, z);
      for (let k = 0; k < 3; k++) expect(Math.abs(p[k] - r.wheels[i].centreWorld[k])).toBeLessThan(1e-12);
    }
    expect(f.originM[0]).toBe(pose.xM);
    expect(f.originM[1]).toBe(pose.yM);
  });
});
