/**
 * Test fixture: an analytic terrain sampled on a 1 cm lattice over [−X, X] × [−Y, Y] (interior
 * points jittered ±3 mm: a scan is never a lattice) and that lattice triangulated, for the round
 * trips through the ground readers (PLY, USDZ).
 */
import { TerrainField, type Terrain } from '../../src/core/index';

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
export function sample(terrain: Terrain): { pos: Float32Array; cols: number; rows: number } {
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

export function triangulate(cols: number, rows: number): Uint32Array {
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
