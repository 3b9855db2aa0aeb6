/**
 * Radial-spring, terrain-enveloping tyre (Davis, Vehicle System Dynamics 4(1), 1975), evaluated
 * directly (evaluateTyre) on TerrainFields, independently of the pose solver.
 */
import { describe, expect, it } from 'vitest';
import { TerrainField } from '../../../src/core/terrain/field';
import { calibrateTyre, evaluateTyre, makeTyreLayout, TyreContact, DEFAULT_TYRE_MODEL } from '../../../src/core/tyre/radialSpring';
import type { Terrain } from '../../../src/core/model/types';
import { EPS_TYRE_STIFFNESS_REL } from '../../helpers/eps';


const R = 0.4;
const WIDTH = 0.25;
const LOAD_N = 5000;
const STIFFNESS = 300_000;
const layout = makeTyreLayout(DEFAULT_TYRE_MODEL);
const cal = calibrateTyre(layout, R, LOAD_N, STIFFNESS);

/** Evaluates an upright tyre (axis +y) with its centre at (x, 0, z); returns the contact and the summed force. */
function press(terrain: Terrain, x: number, z: number): { c: TyreContact; F: [number, number, number] } {
  const field = new TerrainField(terrain);
  const c = new TyreContact(layout.slices);
  evaluateTyre(field, field.allFeatures, field.featureCount, layout, R, WIDTH, cal.rayRateNPerM, x, 0, z, 0, 1, 0, c);
  const F: [number, number, number] = [0, 0, 0];
  for (let j = 0; j < layout.slices; j++) for (let k = 0; k < 3; k++) F[k] += c.force[3 * j + k];
  return { c, F };
}
const FLAT: Terrain = { features: [] };
const flatForce = (deflectionM: number): number => press(FLAT, 0, R - deflectionM).F[2];

describe('flat ground (Davis 1975)', () => {
  it('carries the calibration load at the static deflection (ray-cast force, not the calibration formula)', () => {
    expect(Math.abs(flatForce(cal.staticDeflectionM) - LOAD_N) / LOAD_N).toBeLessThan(1e-6);
  });

  it('secant stiffness over ±10 % of the static deflection equals the stated 300 kN/m within 2 %', () => {
    const d = cal.staticDeflectionM;
    const k = (flatForce(1.1 * d) - flatForce(0.9 * d)) / (0.2 * d);
    expect(Math.abs(k - STIFFNESS) / STIFFNESS).toBeLessThan(EPS_TYRE_STIFFNESS_REL);
  });

  it('force grows about as δ^1.5 over 0.5–2× the static deflection (exponent 1.3–1.7)', () => {
    // Derived: a spring at angle ψ from straight down compresses by R cos ψ − (R − δ) ≈ δ − Rψ²/2,
    // so springs touch for |ψ| < √(2δ/R) and the sum ∫(δ − Rψ²/2)dψ grows as δ^1.5.
    const d0 = cal.staticDeflectionM;
    const xs: number[] = [];
    const ys: number[] = [];
    for (let i = 0; i <= 20; i++) {
      const d = d0 * 0.5 * Math.pow(4, i / 20);
      xs.push(Math.log(d));
      ys.push(Math.log(flatForce(d)));
    }
    const mx = xs.reduce((a, b) => a + b) / xs.length;
    const my = ys.reduce((a, b) => a + b) / ys.length;
    let sxy = 0;
    let sxx = 0;
    for (let i = 0; i < xs.length; i++) {
      sxy += (xs[i] - mx) * (ys[i] - my);
      sxx += (xs[i] - mx) ** 2;
    }
    const exponent = sxy / sxx;
    expect(exponent).toBeGreaterThan(1.3);
    expect(exponent).toBeLessThan(1.7);
  });

  it('on flat ground the force is vertical, with the contact point under the centre on the ground (within 10 µm)', () => {
    const { c, F } = press(FLAT, 1.5, R - 0.02);
    expect(Math.abs(F[0]) / F[2]).toBeLessThan(1e-9);
    expect(Math.abs(F[1]) / F[2]).toBeLessThan(1e-9);
    for (let j = 0; j < layout.slices; j++) {
      // The centre of pressure averages the springs' ground points; 10 µm allows for the ray
      // search and the interpolation between springs, far below any load-relevant length.
      expect(Math.abs(c.point[3 * j] - 1.5)).toBeLessThan(1e-5);
      expect(Math.abs(c.point[3 * j + 2])).toBeLessThan(1e-5);
    }
  });
});

describe('envelopment (Davis 1975: the resultant passes through the wheel centre)', () => {
  it('on a step edge ahead the resultant tilts back, between the rays to the two contacts', () => {
    // Step 0.2 m high at x = 0, wheel centre 0.33 m behind it, 0.38 m up (2 cm into the lower
    // ground). The edge corner (0, 0.2) is √(0.33² + 0.18²) = 0.376 m from the centre: 2.4 cm in.
    // Every spring pushes along its own ray toward the slice centre, so the resultant passes through
    // the centre, and its line points between straight down (lower ground) and the corner.
    const step: Terrain = { features: [{ type: 'step', xM: 0, heightM: 0.2, yRangeM: null, edgeRadiusM: 0 }] };
    const xc = -0.33;
    const zc = R - 0.02;
    const { c, F } = press(step, xc, zc);
    expect(F[2]).toBeGreaterThan(0);
    expect(F[0]).toBeLessThan(0);
    // The line of the force from the centre toward the ground: angle α ahead of straight down.
    const alpha = Math.atan2(-F[0], F[2]);
    const toCorner = Math.atan2(0 - xc, zc - 0.2);
    expect(alpha).toBeGreaterThan(0);
    expect(alpha).toBeLessThan(toCorner);
    for (let j = 0; j < layout.slices; j++) {
      const fx = c.force[3 * j];
      const fz = c.force[3 * j + 2];
      // Through the slice centre, in the wheel plane: the slice force has no lateral part, and the
      // centre of pressure lies in the wheel plane behind the edge and ahead of the centre.
      expect(Math.abs(c.force[3 * j + 1])).toBeLessThan(1e-9 * Math.hypot(fx, fz));
      expect(c.point[3 * j]).toBeGreaterThan(xc);
      expect(c.point[3 * j]).toBeLessThanOrEqual(1e-3);
    }
  });

  it('a narrow rock (radius 0.05 m) under the tyre is enveloped: force up, contact point on the rock', () => {
    // Wheel centre 1 cm clear of the ground, a 5 cm dome under it: only the rock touches, 4 cm in.
    const rock: Terrain = { features: [{ type: 'rock', xM: 0.3, yM: 0, heightM: 0.05, radiusM: 0.05 }] };
    const { c, F } = press(rock, 0.3, R + 0.01);
    expect(F[2]).toBeGreaterThan(0);
    let loaded = 0;
    for (let j = 0; j < layout.slices; j++) {
      if (c.deflection[j] <= 0) continue;
      loaded++;
      const px = c.point[3 * j];
      const py = c.point[3 * j + 1];
      const pz = c.point[3 * j + 2];
      expect(Math.hypot(px - 0.3, py)).toBeLessThanOrEqual(0.05);
      expect(pz).toBeGreaterThan(0);
      expect(pz).toBeLessThanOrEqual(0.05 + 1e-9);
    }
    expect(loaded).toBeGreaterThan(0);
    // A rock 5 cm wide is narrower than the 25 cm tread: the outer slices (±12.5 cm) miss it.
    expect(c.loadedSlices).toBe(1);
  });
});
