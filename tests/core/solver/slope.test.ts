/**
 * Exactness on sloped ground: a vehicle standing on a plane of slope θ (cross-slope and grade).
 * Statics of a body on an incline (e.g. Meriam & Kraige, Engineering Mechanics: Statics, ch. 6,
 * friction on an inclined plane): the ground's reactions balance the weight, so the normal loads
 * (perpendicular to the plane) add up to m·g·cos θ and the tangential ones to m·g·sin θ; with the
 * grip shared in proportion to the normal loads every wheel needs the friction coefficient tan θ.
 * Tolerances: 0.5 N on the sum (about 2.5e-5 of the weight; the solver's residual bound is 1e-6·W),
 * 0.1 % on each wheel's friction demand. The plumb point lies on the ground (the plumb line from the
 * CG meets the plane there).
 */
import { describe, expect, it, vi } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { GRAVITY_MPS2 } from '../../../src/core/solver/model';
import type { TerrainFeature } from '../../../src/core/model/types';
import { testVehicle } from '../../helpers/vehicles';

vi.mock('react', () => ({}));
vi.mock('three', () => ({}));

const DEG = Math.PI / 180;
const POSE = { xM: 0.3, yM: -0.2, headingRad: 0 };

for (const kind of ['cross-slope', 'grade'] as const) {
  describe(`plane ${kind}`, () => {
    for (const deg of [10, 25, 35]) {
      it(`${deg}°: Σ normal loads = m·g·cos θ within 0.5 N, every friction demand = tan θ within 0.1 %, plumb point on the ground`, () => {
        const th = deg * DEG;
        const plane: TerrainFeature = { type: 'plane', gradeRad: kind === 'grade' ? th : 0, crossSlopeRad: kind === 'grade' ? 0 : th, heightM: 0 };
        const v = testVehicle();
        const model = buildModel(v, { features: [plane] });
        const r = solveEquilibrium(model, POSE);
        expect(r.status, r.reason).toBe('converged');
        const W = v.massKg * GRAVITY_MPS2;
        let sum = 0;
        for (const w of r.wheels) sum += w.loadN!;
        expect(Math.abs(sum - W * Math.cos(th))).toBeLessThan(0.5);
        for (const w of r.wheels) {
          expect(w.lifted).toBe(false);
          expect(Math.abs(w.frictionDemand! / Math.tan(th) - 1)).toBeLessThan(1e-3);
        }
        // The plumb point is on the plane: its height is the plane's height there.
        const p = r.body.plumbPointWorld;
        expect(Math.abs(p[2] - model.field.height(p[0], p[1]))).toBeLessThan(1e-6);
        // …and straight below the CG (gravity is −z here).
        expect(Math.hypot(p[0] - r.body.cgWorld[0], p[1] - r.body.cgWorld[1])).toBeLessThan(1e-9);
      });
    }
  });
}
