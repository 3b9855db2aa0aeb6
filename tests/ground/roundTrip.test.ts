/**
 * Round trip with a known answer: the analytic `rock` and `step` features sampled into a PLY mesh
 * and a PLY point cloud, imported, and the vehicle's tyre loads on the imported ground compared
 * with its loads on the analytic features (the known answer, from the same solver). Tolerance:
 * 1 % of the weight per wheel (the spec).
 */
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium, type Terrain, type TerrainFeature } from '../../src/core/index';
import { buildGround, groundFeature } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { testVehicle } from '../helpers/vehicles';
import { plyMesh, plyPoints } from './plyWrite';
import { sample, triangulate } from './analytic';

const cases: { name: string; features: TerrainFeature[] }[] = [
  // A dome under the front-left tyre (front axle at x = +1.4 m, left wheels at y = +0.8 m).
  { name: 'rock', features: [{ type: 'rock', xM: 1.4, yM: 0.8, heightM: 0.3, radiusM: 0.7 }] },
  // The left side up a 0.15 m ledge whose edge runs along x, 0.8 m from the tyres.
  { name: 'step', features: [{ type: 'step', xM: -3, heightM: 0.15, yRangeM: [0, 3], edgeRadiusM: 0 }] },
];

describe('analytic features → PLY → imported grid: same tyre loads', () => {
  for (const c of cases) {
    for (const as of ['mesh', 'points'] as const) {
      it(`${c.name} as a ${as}: every wheel within 1 % of the weight`, async () => {
        const terrain: Terrain = { features: c.features };
        const { pos, cols, rows } = sample(terrain);
        const bytes = as === 'mesh' ? plyMesh(pos, triangulate(cols, rows)) : plyPoints(pos);
        const raw = await readGroundBytes(bytes, `${c.name}.ply`);
        expect(raw.kind).toBe(as);
        const res = buildGround(raw, { cellM: 0.02, fill: true, unitM: 1, up: 'z' });
        expect(res.summary.cellM).toBe(0.02);
        const imported: Terrain = { features: [groundFeature(res)] };
        const v = testVehicle();
        const pose = { xM: 0, yM: 0, headingRad: 0 };
        const a = solveEquilibrium(buildModel(v, terrain), pose);
        const b = solveEquilibrium(buildModel(v, imported), pose);
        expect(a.status).toBe('converged');
        expect(b.status).toBe('converged');
        // The case must load the wheels unevenly, or the check would be trivial.
        const spread = Math.max(...a.wheels.map((w) => w.loadN!)) - Math.min(...a.wheels.map((w) => w.loadN!));
        expect(spread).toBeGreaterThan(0.05 * a.weightN);
        for (let w = 0; w < 4; w++) expect(Math.abs(a.wheels[w].loadN! - b.wheels[w].loadN!), a.wheels[w].name).toBeLessThan(0.01 * a.weightN);
      });
    }
  }
});
