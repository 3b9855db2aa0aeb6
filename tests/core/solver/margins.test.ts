/**
 * Tip-over margins on a box (REFERENCES "Tip-over margins"): support points (±L/2, ±0.8, 0),
 * CG 0.7 m above the support plane on the centre line, weight m g, on a lateral slope φ
 * (the gravity vector turned by φ toward +y, the downhill side).
 *
 * Derived closed forms for the downhill edge y = +T/2 (the weakest once φ > 0):
 * - Force-angle (Papadopoulos & Rey, ICRA 1996): the CG-to-edge normal l = (0, T/2, −h) makes
 *   atan((T/2)/h) = 48.81° with −z, gravity makes φ, so θ = 48.81° − φ. The 2000 form divides as
 *   θ·d with d = |l| sin θ, the distance from the edge to the force line: at 20°, 28.81° and
 *   0.5028·(1.0630·sin 28.81°) = 0.2577 m·rad.
 * - Energy (Messuri & Klein 1985; García & González de Santos 2005): |l|(1 − cos θ), with
 *   |l| = 1.0630 m: 0.3630, 0.2347, 0.1316, 0.0568, 0.0024 m at 0, 10, 20, 30, 45°.
 * - Static (McGhee & Frank 1968): (T/2) cos φ − h sin φ.
 * All three vanish at φ = atan((T/2)/h) = 48.81° and are negative beyond.
 */
import { describe, expect, it } from 'vitest';
import { stabilityMargins } from '../../../src/core/solver/margins';
import { EPS_MARGIN_ANGLE_RAD, EPS_MARGIN_M } from '../../helpers/eps';


const DEG = Math.PI / 180;
const L = 2.8;
const HALF_T = 0.8;
const H = 0.7;
const MASS_KG = 1500;
const G = 9.80665;
const PTS = [L / 2, HALF_T, 0, L / 2, -HALF_T, 0, -L / 2, -HALF_T, 0, -L / 2, HALF_T, 0];
const CG = [0, 0, H];

function onSlope(phiRad: number) {
  const force = [0, MASS_KG * G * Math.sin(phiRad), -MASS_KG * G * Math.cos(phiRad)];
  return stabilityMargins(PTS, 4, CG, force);
}

describe('stabilityMargins on a box on a lateral slope', () => {
  it('force-angle at 20°: 28.81°, and the 2000-form measure/(m g) = 0.2577 m·rad', () => {
    const m = onSlope(20 * DEG);
    expect(Math.abs(m.forceAngleRad - 28.81 * DEG)).toBeLessThan(EPS_MARGIN_ANGLE_RAD);
    expect(Math.abs(m.forceAngleMeasure / (MASS_KG * G) - 0.2577)).toBeLessThan(EPS_MARGIN_M);
  });

  it('force-angle follows atan((T/2)/h) − φ over the slope range', () => {
    for (const deg of [0, 5, 15, 25, 35, 45]) {
      const m = onSlope(deg * DEG);
      expect(Math.abs(m.forceAngleRad - (Math.atan(HALF_T / H) - deg * DEG)), `${deg}°`).toBeLessThan(1e-9);
    }
  });

  const energy: [deg: number, m: number][] = [
    [0, 0.363],
    [10, 0.2347],
    [20, 0.1316],
    [30, 0.0568],
    [45, 0.0024],
  ];
  for (const [deg, ref] of energy) {
    it(`energy margin at ${deg}°: ${ref} m (Messuri & Klein 1985)`, () => {
      expect(Math.abs(onSlope(deg * DEG).energyM - ref)).toBeLessThan(EPS_MARGIN_M);
    });
  }

  it('static margin = (T/2) cos φ − h sin φ (McGhee & Frank 1968)', () => {
    for (const deg of [0, 10, 20, 30, 45]) {
      const phi = deg * DEG;
      expect(Math.abs(onSlope(phi).staticM - (HALF_T * Math.cos(phi) - H * Math.sin(phi))), `${deg}°`).toBeLessThan(1e-9);
    }
  });

  it('all margins ≈ 0 at atan((T/2)/h) = 48.81° and negative beyond', () => {
    const tip = Math.atan(HALF_T / H);
    expect(Math.abs(tip / DEG - 48.81)).toBeLessThan(0.005);
    const at = onSlope(tip);
    expect(Math.abs(at.forceAngleRad)).toBeLessThan(1e-9);
    expect(Math.abs(at.energyM)).toBeLessThan(1e-9);
    expect(Math.abs(at.staticM)).toBeLessThan(1e-9);
    for (const deg of [50, 55, 70]) {
      const m = onSlope(deg * DEG);
      expect(m.forceAngleRad, `${deg}°`).toBeLessThan(0);
      expect(m.energyM, `${deg}°`).toBeLessThan(0);
      expect(m.staticM, `${deg}°`).toBeLessThan(0);
    }
  });

  it('the weakest edge is the downhill edge (+y) on a slope', () => {
    const m = onSlope(20 * DEG);
    const a = m.hull[m.weakestEdge];
    const b = m.hull[(m.weakestEdge + 1) % m.hull.length];
    expect(PTS[3 * a + 1]).toBe(HALF_T);
    expect(PTS[3 * b + 1]).toBe(HALF_T);
  });
});
