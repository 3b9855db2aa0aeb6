/**
 * Vehicles and terrains the bench runs on. All invented: the demo scenario's vehicle (parsed from
 * assets/scenarios/), the test rig from tests/helpers, a generated rock garden and generated height
 * grids. Nothing here is timed.
 */
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import type { Pose, Terrain, TerrainFeature, Vehicle } from '../src/core/model/types';
import { parseScenarioText, type Scenario } from '../src/core/scenario/index';

export const DEG = Math.PI / 180;

/** The bundled demo scenario (side hill, stock pickup with a solid rear axle and payload). */
export function demoScenario(): Scenario {
  const path = fileURLToPath(new URL('../assets/scenarios/side-hill-stock.json', import.meta.url));
  const parsed = parseScenarioText(readFileSync(path, 'utf8'));
  if (!parsed.ok) {
    throw new Error(`bench: demo scenario does not parse: ${parsed.errors.map((e) => `${e.path}: ${e.message}`).join('; ')}`);
  }
  return parsed.scenario;
}

/** Small deterministic generator (a 32-bit linear congruential one) so every run sees the same scene. */
function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return s / 4294967296;
  };
}

/** Where the rock garden starts and ends along x (m); the vehicle drives along +x at y = 0. */
export const GARDEN_FROM_X_M = -2;
export const GARDEN_TO_X_M = 48;

/**
 * A rock garden along x: domes of 8–28 cm under both wheel tracks (about ±0.8 m) and a few in
 * between, every 0.7–1.7 m. Heights and sizes are invented, in the range a stock vehicle crawls.
 */
export function rockGarden(seed = 7): Terrain {
  const rnd = lcg(seed);
  const features: TerrainFeature[] = [];
  for (let x = GARDEN_FROM_X_M + 1; x < GARDEN_TO_X_M + 2; x += 0.7 + rnd()) {
    const lane = rnd();
    const yM = lane < 0.4 ? 0.8 + 0.3 * (rnd() - 0.5) : lane < 0.8 ? -0.8 + 0.3 * (rnd() - 0.5) : 0.6 * (rnd() - 0.5);
    features.push({ type: 'rock', xM: x, yM, heightM: 0.08 + 0.2 * rnd(), radiusM: 0.35 + 0.4 * rnd() });
  }
  return { features };
}

/** Poses along the garden's centre line, heading +x, `count` of them evenly from `fromX` to `toX`. */
export function posesAlong(count: number, fromX = GARDEN_FROM_X_M, toX = GARDEN_TO_X_M): Pose[] {
  const poses: Pose[] = [];
  const step = count > 1 ? (toX - fromX) / (count - 1) : 0;
  for (let k = 0; k < count; k++) poses.push({ xM: fromX + k * step, yM: 0, headingRad: 0 });
  return poses;
}

/** Spacing of the generated height grids (m): 64 nodes cover 6.3 m, enough for the whole vehicle. */
export const GRID_SPACING_M = 0.1;

/** Cheap smooth ground for the height grids (m): gentle swells of ±16 cm. */
export function gridHeightM(x: number, y: number): number {
  return 0.12 * Math.sin(0.8 * x + 0.3) * Math.cos(0.6 * y) + 0.04 * Math.sin(2.1 * x - 1.3 * y);
}

/**
 * An n × n node height grid centred on the origin. Nodes sit on multiples of GRID_SPACING_M for
 * every even n, so the ground under a vehicle at the origin is the same on every grid size and a
 * solve there does the same work: only the grid's size differs.
 */
export function heightGrid(n: number): Terrain {
  const heights = new Float64Array(n * n);
  const origin = -(n / 2) * GRID_SPACING_M;
  for (let row = 0; row < n; row++) {
    const y = origin + row * GRID_SPACING_M;
    const base = row * n;
    for (let col = 0; col < n; col++) heights[base + col] = gridHeightM(origin + col * GRID_SPACING_M, y);
  }
  return {
    features: [{ type: 'grid', originM: [origin, origin], spacingM: GRID_SPACING_M, cols: n, rows: n, heightsM: heights }],
  };
}

/**
 * The cannon-es comparison scene (as in tests/reference/cannonVsSolver.test.ts): the front-left
 * wheel on a 0.3 m block whose flat top reaches past the tyre, on level ground. The reference
 * models no tyre shape, anti-roll bar, unsprung mass or roll-centre height, so the vehicle has
 * none (tests/helpers testVehicle).
 */
export function cannonScene(): { terrain: Terrain; pose: Pose } {
  const pose: Pose = { xM: 0, yM: 0, headingRad: 0 };
  const terrain: Terrain = {
    features: [{ type: 'block', xRangeM: [1.4 - 0.5, 1.4 + 0.5], yRangeM: [0.8 - 0.4, 0.8 + 0.4], heightM: 0.3, edgeRadiusM: 0 }],
  };
  return { terrain, pose };
}

export type { Vehicle };
