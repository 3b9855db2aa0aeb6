/**
 * TerrainField: heights of each feature against values worked by hand from the feature
 * definitions (src/core/model/types.ts), gradients against central finite differences, and the
 * rule that feature heights add onto a base at z = 0.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FACE_RUN_M, TerrainField } from '../../../src/core/terrain/field';
import type { TerrainFeature } from '../../../src/core/model/types';
import { EPS_GRADIENT_REL, EPS_HEIGHT_M } from '../../helpers/eps';


const DEG = Math.PI / 180;
const field = (...features: TerrainFeature[]): TerrainField => new TerrainField({ features });
const close = (a: number, b: number, eps = EPS_HEIGHT_M): void => {
  expect(Math.abs(a - b), `${a} vs ${b}`).toBeLessThan(eps);
};

describe('feature heights against hand values', () => {
  it('no features: level ground at z = 0', () => {
    close(field().height(3, -2), 0);
  });

  it('plane, grade 10°: tan 10° at x = 1; cross-slope rises toward +y; height offset', () => {
    close(field({ type: 'plane', gradeRad: 10 * DEG, crossSlopeRad: 0, heightM: 0 }).height(1, 5), Math.tan(10 * DEG));
    close(field({ type: 'plane', gradeRad: 0, crossSlopeRad: 5 * DEG, heightM: 0.3 }).height(7, -2), 0.3 - 2 * Math.tan(5 * DEG));
  });

  it('step 0.2 m at x = 1 with a 0.05 m edge radius: 0 before, the quarter circle, then 0.2', () => {
    const f = field({ type: 'step', xM: 1, heightM: 0.2, yRangeM: null, edgeRadiusM: 0.05 });
    close(f.height(0.9, 0), 0);
    close(f.height(1 + FACE_RUN_M + 0.05 + 0.01, 0), 0.2);
    // Quarter circle of radius r centred at (x_edge + FACE_RUN + r, h − r): halfway in, h − r + r·√3/2.
    close(f.height(1 + FACE_RUN_M + 0.025, 0), 0.2 - 0.05 + 0.05 * Math.sqrt(3) / 2);
    // The face: from 0 to h − r over FACE_RUN_M.
    close(f.height(1 + FACE_RUN_M / 2, 0), (0.2 - 0.05) / 2);
    // Bounded laterally: outside its y range the ground is level.
    close(field({ type: 'step', xM: 1, heightM: 0.2, yRangeM: [-1, 1], edgeRadiusM: 0 }).height(2, 1.5), 0);
  });

  it('block 0.3 m over x 1–2, y −0.5–0.5: 0.3 on top, 0 outside; a pit goes down', () => {
    const f = field({ type: 'block', xRangeM: [1, 2], yRangeM: [-0.5, 0.5], heightM: 0.3, edgeRadiusM: 0 });
    close(f.height(1.5, 0), 0.3);
    close(f.height(0.9, 0), 0);
    close(f.height(1.5, 0.6), 0);
    const pit = field({ type: 'block', xRangeM: [1, 2], yRangeM: [-0.5, 0.5], heightM: -0.25, edgeRadiusM: 0 });
    close(pit.height(1.5, 0), -0.25);
    close(pit.height(3, 0), 0);
  });

  it('rock dome: height at the centre, 0 at the rim, h·√(1 − ¼) halfway out', () => {
    const f = field({ type: 'rock', xM: 2, yM: 1, heightM: 0.4, radiusM: 0.6 });
    close(f.height(2, 1), 0.4);
    close(f.height(2.6, 1), 0);
    close(f.height(2, 1.6), 0);
    close(f.height(2.3, 1), 0.4 * Math.sqrt(0.75));
    close(f.height(3, 1), 0);
  });

  it('ramp from x = 1 at 20° over 2 m of surface: rise x·tan 20°, then level at 2 sin 20°', () => {
    const f = field({ type: 'ramp', xM: 1, angleRad: 20 * DEG, lengthM: 2, yRangeM: null });
    close(f.height(0.5, 0), 0);
    close(f.height(1.5, 0), 0.5 * Math.tan(20 * DEG));
    close(f.height(1 + 2 * Math.cos(20 * DEG) + 0.5, 0), 2 * Math.sin(20 * DEG));
  });

  it('profile along x: linear between points, held level beyond its ends; along y too', () => {
    const points: [number, number][] = [
      [0, 0],
      [1, 0.3],
      [2, 0.1],
    ];
    const f = field({ type: 'profile', axis: 'x', points, acrossM: null });
    close(f.height(0.5, 9), 0.15);
    close(f.height(1.5, -9), 0.2);
    close(f.height(-3, 0), 0);
    close(f.height(5, 0), 0.1);
    const g = field({ type: 'profile', axis: 'y', points, acrossM: null });
    close(g.height(4, 0.25), 0.075);
  });

  it('grid: bilinear between nodes, edge values held outside', () => {
    // 2 × 2 nodes, spacing 1 m from (0, 0): h00 = 0, h10 = 1 (x = 1), h01 = 2 (y = 1), h11 = 4.
    const f = field({ type: 'grid', originM: [0, 0], spacingM: 1, cols: 2, rows: 2, heightsM: [0, 1, 2, 4] });
    close(f.height(0, 0), 0);
    close(f.height(1, 1), 4);
    // Bilinear at (0.5, 0.5): mean of the four = 7/4; at (0.25, 0.75): (1−x)(1−y)·0 + x(1−y)·1 + (1−x)y·2 + xy·4.
    close(f.height(0.5, 0.5), 1.75);
    close(f.height(0.25, 0.75), 0.25 * 0.25 * 1 + 0.75 * 0.75 * 2 + 0.25 * 0.75 * 4);
    // Held: beyond x = 1 the x = 1 column, below y = 0 the y = 0 row.
    close(f.height(5, 0.5), f.height(1, 0.5));
    close(f.height(0.5, -3), f.height(0.5, 0));
    close(f.height(-2, -2), 0);
  });
});

describe('gradient against central finite differences (1e-6 relative)', () => {
  // Smooth features (away from their kinks, faces and rims, where the derivative jumps).
  const features: TerrainFeature[] = [
    { type: 'plane', gradeRad: 7 * DEG, crossSlopeRad: -4 * DEG, heightM: 0.1 },
    { type: 'rock', xM: 0, yM: 0, heightM: 0.3, radiusM: 2 },
    { type: 'profile', axis: 'y', points: [[-3, 0], [3, 0.6]], acrossM: null },
    { type: 'grid', originM: [-3, -3], spacingM: 6, cols: 2, rows: 2, heightsM: [0, 0.2, -0.1, 0.4] },
    { type: 'ramp', xM: -3, angleRad: 10 * DEG, lengthM: 10, yRangeM: null },
  ];
  const f = new TerrainField({ features });
  const H = 1e-6;

  it('at random interior points (seeded)', () => {
    const grad = new Float64Array(2);
    fc.assert(
      fc.property(
        fc.double({ min: -1.3, max: 1.3, noNaN: true }),
        fc.double({ min: -1.3, max: 1.3, noNaN: true }),
        (x, y) => {
          f.sample(x, y, grad);
          const gx = (f.height(x + H, y) - f.height(x - H, y)) / (2 * H);
          const gy = (f.height(x, y + H) - f.height(x, y - H)) / (2 * H);
          expect(Math.abs(grad[0] - gx)).toBeLessThan(EPS_GRADIENT_REL * Math.max(1, Math.abs(gx)));
          expect(Math.abs(grad[1] - gy)).toBeLessThan(EPS_GRADIENT_REL * Math.max(1, Math.abs(gy)));
        },
      ),
      { seed: 7, numRuns: 200 },
    );
  });

  it('on the step edge circle and the sample height equals height()', () => {
    const g = field({ type: 'step', xM: 0, heightM: 0.25, yRangeM: null, edgeRadiusM: 0.1 });
    const grad = new Float64Array(2);
    for (const d of [0.01, 0.03, 0.05, 0.08]) {
      const x = FACE_RUN_M + d;
      const h = g.sample(x, 0.3, grad);
      close(h, g.height(x, 0.3));
      const gx = (g.height(x + H, 0.3) - g.height(x - H, 0.3)) / (2 * H);
      expect(Math.abs(grad[0] - gx)).toBeLessThan(EPS_GRADIENT_REL * Math.max(1, Math.abs(gx)));
      expect(grad[1]).toBe(0);
    }
  });

  it('features add: heights and gradients of the whole equal the sums over single features', () => {
    const singles = features.map((ft) => new TerrainField({ features: [ft] }));
    const g = new Float64Array(2);
    const gs = new Float64Array(2);
    for (const [x, y] of [
      [0.2, -0.4],
      [1.1, 0.9],
      [-0.7, 0.3],
    ]) {
      const h = f.sample(x, y, g);
      let hs = 0;
      let sx = 0;
      let sy = 0;
      for (const s of singles) {
        hs += s.sample(x, y, gs);
        sx += gs[0];
        sy += gs[1];
      }
      close(h, hs);
      close(g[0], sx);
      close(g[1], sy);
    }
  });
});
