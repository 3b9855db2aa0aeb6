/**
 * Plumbline's quasi-static solver (buildModel / solveEquilibrium) against the independent
 * cannon-es settling reference (src/reference/cannonSettle.ts, a general-purpose physics engine
 * stepping a rigid body on spring-damper corners until it comes to rest).
 *
 * The two share only the input types and the terrain height function. The reference has no tyre
 * shape (one ray per corner), no anti-roll bar, no unsprung mass and an effective roll centre at
 * ground level, so the vehicle here is chosen to have exactly that: independent suspension both
 * ends, roll centres 0, anti-roll 0, unsprung 0, and each tyre stands on flat ground (a block's
 * flat top reaches well past the tyre's footprint). Bound: 2 % of the weight per wheel.
 * The vehicle and the scene are invented.
 */
import { describe, expect, it } from 'vitest';
import type { Pose, Terrain, Tilt, Vehicle } from '../../src/core/model/types';
import { buildModel, solveEquilibrium } from '../../src/core/solver/equilibrium';
import { settleWithCannon } from '../../src/reference/cannonSettle';
import { testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;

// The shared invented test rig: independent both ends, roll centres at the ground, no bars, no unsprung mass.
const vehicle: Vehicle = testVehicle();

const pose: Pose = { xM: 0, yM: 0, headingRad: 0 };
// Wheel positions at this pose: x ±1.4 m, y ±0.8 m. A block reaches 0.5 m fore and aft of the
// wheel centre and 0.4 m either side: the tyre (r 0.4 m, width 0.25 m) touches only its flat top.
function blockUnder(xM: number, yM: number, heightM: number) {
  return {
    type: 'block' as const,
    xRangeM: [xM - 0.5, xM + 0.5] as const,
    yRangeM: [yM - 0.4, yM + 0.4] as const,
    heightM,
    edgeRadiusM: 0,
  };
}

const cases: { name: string; terrain: Terrain; tilt: Tilt | null }[] = [
  { name: 'level ground', terrain: { features: [] }, tilt: null },
  { name: '20° side-hill, downhill left', terrain: { features: [] }, tilt: { angleRad: 20 * DEG, downhillRad: Math.PI / 2 } },
  { name: 'front-left wheel on a 0.3 m block', terrain: { features: [blockUnder(1.4, 0.8, 0.3)] }, tilt: null },
  {
    name: 'diagonal twist: FL and RR on 0.15 m blocks',
    terrain: { features: [blockUnder(1.4, 0.8, 0.15), blockUnder(-1.4, -0.8, 0.15)] },
    tilt: null,
  },
];

describe('quasi-static solver vs cannon-es settling reference', () => {
  for (const c of cases) {
    it(`${c.name}: per-wheel normal loads agree within 2 % of the weight`, () => {
      const ref = settleWithCannon(vehicle, c.terrain, pose, c.tilt);
      expect(ref.settled).toBe(true);
      const model = buildModel(vehicle, c.terrain);
      const sol = solveEquilibrium(model, pose, c.tilt ? { tilt: c.tilt } : {});
      expect(sol.status).toBe('converged');
      const W = ref.weightN;
      expect(sol.weightN).toBeCloseTo(W, 3);
      for (let i = 0; i < 4; i++) {
        expect(sol.wheels[i].lifted).toBe(false);
        expect(Math.abs(sol.wheels[i].loadN! - ref.loadsN[i])).toBeLessThan(0.02 * W);
      }
    });
  }
});
