/**
 * The quasi-static tip (tiltSweep: the end of the stable equilibrium branch) against the
 * independent cannon-es tilt ramp (src/reference/cannonTiltRamp.ts: settle level, raise the table
 * at 0.5°/s, record where the vehicle goes over; checked against SSF and b/h and for rate and
 * damping in cannonTiltRamp.test.ts). Agreement within 1° on 4 vehicles × 8 directions.
 *
 * Only vehicles the reference models fully: independent corners at both ends, roll centres at the
 * ground, no anti-roll bars, no unsprung mass, no payload, narrow (4 cm) tyres so that the
 * radial-spring tyre's contact stays near its centre-line like the reference's single ray. The
 * vehicles are invented.
 */
import { describe, expect, it } from 'vitest';
import type { Vehicle } from '../../src/core/model/types';
import { buildModel } from '../../src/core/solver/equilibrium';
import { tiltSweep } from '../../src/core/solver/tilt';
import { tiltRampWithCannon } from '../../src/reference/cannonTiltRamp';
import { independent, testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;
const narrow = { radiusM: 0.4, widthM: 0.04, stiffnessNPerM: 300_000 };
const VEHICLES: [string, Vehicle][] = [
  ['test rig', testVehicle({ tyreFront: narrow, tyreRear: narrow })],
  [
    'pickup-like: long wheelbase, stiffer rear, CG forward',
    testVehicle({
      wheelbaseM: 3.1,
      trackFrontM: 1.58,
      trackRearM: 1.58,
      massKg: 2150,
      cg: { behindFrontAxleM: 1.45, heightM: 0.78, leftOfCentreM: 0 },
      suspensionFront: independent({ wheelRateNPerM: 45_000, bumpM: 0.09, droopM: 0.11 }),
      suspensionRear: independent({ wheelRateNPerM: 50_000, bumpM: 0.1, droopM: 0.14 }),
      tyreFront: { radiusM: 0.39, widthM: 0.04, stiffnessNPerM: 320_000 },
      tyreRear: { radiusM: 0.39, widthM: 0.04, stiffnessNPerM: 320_000 },
    }),
  ],
  [
    'high CG, soft, CG offset left',
    testVehicle({
      cg: { behindFrontAxleM: 1.2, heightM: 1.05, leftOfCentreM: 0.06 },
      suspensionFront: independent({ wheelRateNPerM: 30_000 }),
      suspensionRear: independent({ wheelRateNPerM: 30_000 }),
      tyreFront: narrow,
      tyreRear: narrow,
    }),
  ],
  [
    'short and narrow, stiff',
    testVehicle({
      wheelbaseM: 2.2,
      trackFrontM: 1.3,
      trackRearM: 1.35,
      massKg: 1200,
      cg: { behindFrontAxleM: 1.0, heightM: 0.7, leftOfCentreM: 0 },
      suspensionFront: independent({ wheelRateNPerM: 60_000, bumpM: 0.08, droopM: 0.1 }),
      suspensionRear: independent({ wheelRateNPerM: 60_000, bumpM: 0.08, droopM: 0.1 }),
      tyreFront: { radiusM: 0.33, widthM: 0.04, stiffnessNPerM: 250_000 },
      tyreRear: { radiusM: 0.33, widthM: 0.04, stiffnessNPerM: 250_000 },
    }),
  ],
];
const DIRECTIONS_DEG = [0, 45, 90, 135, 165, 200, 270, 315];

describe('quasi-static tip vs the cannon-es tilt ramp (within 1°)', { timeout: 240_000 }, () => {
  for (const [name, v] of VEHICLES) {
    it(`${name}: 8 directions`, () => {
      const model = buildModel(v, { features: [] });
      // Each failure message carries the row: direction, the reference, the quasi-static tip and its reason.
      const rows: string[] = [];
      for (const d of DIRECTIONS_DEG) {
        const ref = tiltRampWithCannon(v, d * DEG);
        expect(ref.settled).toBe(true);
        expect(ref.tipRad).not.toBeNull();
        const qs = tiltSweep(model, { xM: 0, yM: 0, headingRad: 0 }, { downhillRad: d * DEG, findSlide: false });
        expect(qs.tip).not.toBeNull();
        const diff = (qs.tip!.angleRad - ref.tipRad!) / DEG;
        rows.push(`${d}°: cannon ${(ref.tipRad! / DEG).toFixed(2)}°, quasi-static ${(qs.tip!.angleRad / DEG).toFixed(2)}° (${qs.tip!.reason})`);
        expect(Math.abs(diff), rows[rows.length - 1]).toBeLessThan(1);
      }
    });
  }
});
