/**
 * An invented flat height grid with a filled patch (as the import's hole filling marks it), for the
 * filled-ground tests: 0.1 m spacing, x from −6 to 10 m, y from −3 to 3 m, every height 0 (a flat
 * fill of flat ground, so the mask changes what is said, never the mechanics).
 */
import type { TerrainFeature } from '../../src/core/model/types';
import type { Scenario } from '../../src/core/scenario/types';
import { testVehicle } from './vehicles';

export const GRID = { x0: -6, y0: -3, spacingM: 0.1, cols: 161, rows: 61 } as const;

/** Column and row ranges (inclusive) of the filled nodes. */
export interface Patch {
  readonly c0: number;
  readonly c1: number;
  readonly r0: number;
  readonly r1: number;
}

/** The patch of nodes whose x lies in [xa, xb] and y in [ya, yb] (m). */
export function patchOf(xa: number, xb: number, ya: number, yb: number): Patch {
  const col = (x: number) => Math.round((x - GRID.x0) / GRID.spacingM);
  const row = (y: number) => Math.round((y - GRID.y0) / GRID.spacingM);
  return { c0: col(xa), c1: col(xb), r0: row(ya), r1: row(yb) };
}

/**
 * The open rectangle where the ground takes a share from the patch under bilinear interpolation
 * (Press et al., Numerical Recipes 3rd ed. 2007, §3.6, eq. 3.6.5: a node weighs in over the four
 * cells around it): one spacing beyond the outermost filled nodes on every side.
 */
export function patchReach(p: Patch): { x: [number, number]; y: [number, number] } {
  const s = GRID.spacingM;
  return {
    x: [GRID.x0 + (p.c0 - 1) * s, GRID.x0 + (p.c1 + 1) * s],
    y: [GRID.y0 + (p.r0 - 1) * s, GRID.y0 + (p.r1 + 1) * s],
  };
}

/** The flat grid with the patch marked filled (or no mask with patch null), as an imported grid. */
export function filledGrid(patch: Patch | null, heights?: Float64Array): TerrainFeature & { type: 'grid' } {
  const n = GRID.cols * GRID.rows;
  let mask: Uint8Array | null = null;
  if (patch) {
    mask = new Uint8Array(n);
    for (let r = patch.r0; r <= patch.r1; r++) for (let c = patch.c0; c <= patch.c1; c++) mask[r * GRID.cols + c] = 1;
  }
  return {
    type: 'grid',
    originM: [GRID.x0, GRID.y0],
    spacingM: GRID.spacingM,
    cols: GRID.cols,
    rows: GRID.rows,
    heightsM: heights ?? new Float64Array(n),
    filledMask: mask,
    source: { file: 'invented-slab.ply', format: 'ply', crs: null, originSource: [0, 0, 0], sourceUnitM: 1 },
  };
}

/**
 * A scenario on the filled grid: the base's names, units and friction, an invented test rig (with
 * unsprung masses, as a file needs), standing at the origin heading along +x on level ground, with a
 * path along the left wheels' tracks from x −3.05 to 5.05 m every 0.1 m.
 */
export function filledScenario(base: Scenario, patch: Patch): Scenario {
  return {
    ...base,
    name: 'Invented slab with a filled patch',
    vehicle: testVehicle({ unsprungMassFrontKg: 80, unsprungMassRearKg: 80 }),
    terrain: { features: [filledGrid(patch)] },
    pose: { xM: 0, yM: 0, headingRad: 0 },
    tilt: { angleRad: 0, downhillRad: Math.PI / 2 },
    path: { fromM: [-3.05, 0], toM: [5.05, 0], stepM: 0.1, headingRad: 0 },
  };
}
