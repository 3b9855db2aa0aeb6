/**
 * Round trip with a known answer: the analytic `rock` and `step` features sampled into a PLY mesh
 * and a PLY point cloud, imported, and the vehicle's tyre loads on the imported ground compared
 * with its loads on the analytic features (the known answer, from the same solver). Tolerance:
 * 1 % of the weight per wheel (the spec).
 */
import { describe, expect, it } from 'vitest';
import { buildModel, solveEquilibrium, TerrainField, type Terrain, type TerrainFeature } from '../../src/core/index';
import { buildGround, groundFeature } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { testVehicle } from '../helpers/vehicles';
import { plyMesh, plyPoints } from './plyWrite';

function rng(seed = 17): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

const X = 2.6;
const Y = 1.6;
const STEP = 0.01;

/** Samples the terrain on a 1 cm lattice over [−X, X] × [−Y, Y]; interior points jittered ±3 mm (a scan is never a lattice). */
function sample(terrain: Terrain): { pos: Float32Array; cols: number; rows: number } {
  const field = new TerrainField(terrain);
  const cols = Math.round((2 * X) / STEP) + 1;
  const rows = Math.round((2 * Y) / STEP) + 1;
  const pos = new Float32Array(cols * rows * 3);
  const r = rng();
  for (let j = 0; j < rows; j++) {
    for (let i = 0; i < cols; i++) {
      const edge = i === 0 || j === 0 || i === cols - 1 || j === rows - 1;
      const x = -X + i * STEP + (edge ? 0 : (r() - 0.5) * 0.006);
      const y = -Y + j * STEP + (edge ? 0 : (r() - 0.5) * 0.006);
      const k = 3 * (j * cols + i);
      pos[k] = x;
      pos[k + 1] = y;
      pos[k + 2] = field.height(x, y);
    }
  }
  return { pos, cols, rows };
}

function triangulate(cols: number, rows: number): Uint32Array {
  const idx = new Uint32Array((cols - 1) * (rows - 1) * 6);
  let o = 0;
  for (let j = 0; j < rows - 1; j++) {
    for (let i = 0; i < cols - 1; i++) {
      const a = j * cols + i;
      idx.set([a, a + 1, a + cols + 1, a, a + cols + 1, a + cols], o);
      o += 6;
    }
  }
  return idx;
}

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
