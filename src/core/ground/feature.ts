/** The imported ground as a scenario terrain feature: a height grid with its filled mask and where it came from. */
import type { Scenario } from '../scenario/types';
import type { TerrainFeature } from '../model/types';
import type { GroundResult } from './pipeline';
import { FilledGround } from '../analysis/filledGround';

export function groundFeature(r: GroundResult): TerrainFeature & { type: 'grid' } {
  const g = r.grid;
  const s = r.summary;
  let anyFilled = false;
  for (let k = 0; k < g.filled.length && !anyFilled; k++) if (g.filled[k]) anyFilled = true;
  return {
    type: 'grid',
    originM: [g.originM[0], g.originM[1]],
    spacingM: g.cellM,
    cols: g.cols,
    rows: g.rows,
    heightsM: g.heightsM,
    filledMask: anyFilled ? g.filled : null,
    source: { file: s.file, format: s.format, crs: s.crs, originSource: [s.originSource.x, s.originSource.y, s.originSource.z], sourceUnitM: s.unitM },
  };
}

/**
 * A scenario standing on the imported ground: the base scenario's vehicle, tilt and friction; its
 * terrain replaced by the grid (features typed afterwards add onto it); the pose moved to the
 * grid's centre (the local origin) with the base's heading; a path kept only when it lies on the grid.
 */
export function scenarioOnGround(base: Scenario, r: GroundResult, name?: string): Scenario {
  const f = groundFeature(r);
  const x0 = f.originM[0];
  const y0 = f.originM[1];
  const x1 = x0 + (f.cols - 1) * f.spacingM;
  const y1 = y0 + (f.rows - 1) * f.spacingM;
  const on = (p: readonly [number, number]) => p[0] >= x0 && p[0] <= x1 && p[1] >= y0 && p[1] <= y1;
  const path = base.path && on(base.path.fromM) && on(base.path.toM) ? base.path : null;
  return {
    ...base,
    name: name ?? `${base.name} on ${r.summary.file}`,
    terrain: { features: [f] },
    pose: { ...base.pose, xM: 0, yM: 0 },
    path,
  };
}

/**
 * Whether any of the given ground points (terrain frame, m) stands on filled ground of an imported
 * grid: the height there takes a share from a node that was filled in (the rule of
 * analysis/filledGround.ts, which every analysis uses).
 */
export function onFilledGround(feature: TerrainFeature, points: readonly (readonly [number, number])[]): boolean {
  const fg = FilledGround.of({ features: [feature] });
  if (!fg) return false;
  for (const [x, y] of points) if (fg.at(x, y)) return true;
  return false;
}
