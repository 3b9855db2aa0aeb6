/**
 * Axle loads on a grade (Gillespie, Fundamentals of Vehicle Dynamics, 1992, ch. 2): facing
 * uphill on grade θ, with a = CG behind the front axle, b = L − a, CG height h and weight W,
 *   W_f = W (b cosθ − h sinθ)/L,   W_r = W (a cosθ + h sinθ)/L,
 * the front (uphill) axle unloads at tanθ = b/h; facing downhill the rear unloads at tanθ = a/h.
 * REFERENCES check values (L 2.5, a 1.2, b 1.3, h 0.8 m, W = 1): 10° → 0.4565 / 0.5283,
 * 20° → 0.3792 / 0.5605, 30° → 0.2903 / 0.5757; front unloads at 58.39°, rear at 56.31°.
 * Tilt table: facing uphill = tail down (downhillRad π). The vehicle is rigidVehicle with that
 * geometry (stiff springs and tyres, so the CG stays where it is given).
 */
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { tiltSweep } from '../../../src/core/solver/tilt';
import { rigidVehicle } from '../../helpers/vehicles';
import { EPS_GRADE_LOAD_FRACTION, EPS_TIP_RAD } from '../../helpers/eps';


const DEG = Math.PI / 180;
const POSE = { xM: 0, yM: 0, headingRad: 0 };
const L = 2.5;
const A = 1.2;
const B = L - A;
const H = 0.8;
const vehicle = rigidVehicle({ wheelbaseM: L, cg: { behindFrontAxleM: A, heightM: H, leftOfCentreM: 0 } });

describe('grade loads, facing uphill (Gillespie ch. 2)', () => {
  const model = buildModel(vehicle, { features: [] });
  const table: [deg: number, front: number, rear: number][] = [
    [10, 0.4565, 0.5283],
    [20, 0.3792, 0.5605],
    [30, 0.2903, 0.5757],
  ];
  for (const [deg, frontRef, rearRef] of table) {
    it(`${deg}°: front ${frontRef} W, rear ${rearRef} W`, () => {
      const th = deg * DEG;
      const r = solveEquilibrium(model, POSE, { tilt: { angleRad: th, downhillRad: Math.PI } });
      expect(r.status).toBe('converged');
      const W = r.weightN;
      const front = (r.wheels[0].loadN + r.wheels[1].loadN) / W;
      const rear = (r.wheels[2].loadN + r.wheels[3].loadN) / W;
      // The formula itself against the REFERENCES table (4 decimals).
      expect(Math.abs((B * Math.cos(th) - H * Math.sin(th)) / L - frontRef)).toBeLessThan(6e-5);
      expect(Math.abs((A * Math.cos(th) + H * Math.sin(th)) / L - rearRef)).toBeLessThan(6e-5);
      // The solver against the formula, 0.5 % of W.
      expect(Math.abs(front - (B * Math.cos(th) - H * Math.sin(th)) / L)).toBeLessThan(EPS_GRADE_LOAD_FRACTION);
      expect(Math.abs(rear - (A * Math.cos(th) + H * Math.sin(th)) / L)).toBeLessThan(EPS_GRADE_LOAD_FRACTION);
      // Left and right share equally (symmetric vehicle, no lateral component).
      expect(Math.abs(r.wheels[0].loadN - r.wheels[1].loadN) / W).toBeLessThan(EPS_GRADE_LOAD_FRACTION);
    });
  }

  it('front axle unloads at atan(b/h) = 58.39° (tail down)', () => {
    const s = tiltSweep(model, POSE, { downhillRad: Math.PI });
    expect(Math.abs(Math.atan(B / H) / DEG - 58.39)).toBeLessThan(0.005);
    expect(s.firstLift).not.toBeNull();
    expect(['FL', 'FR']).toContain(s.firstLift!.wheel);
    expect(Math.abs(s.firstLift!.angleRad - Math.atan(B / H))).toBeLessThan(EPS_TIP_RAD);
  });

  it('facing downhill (nose down), the rear axle unloads at atan(a/h) = 56.31°', () => {
    const s = tiltSweep(model, POSE, { downhillRad: 0 });
    expect(Math.abs(Math.atan(A / H) / DEG - 56.31)).toBeLessThan(0.005);
    expect(['RL', 'RR']).toContain(s.firstLift!.wheel);
    expect(Math.abs(s.firstLift!.angleRad - Math.atan(A / H))).toBeLessThan(EPS_TIP_RAD);
  });
});
