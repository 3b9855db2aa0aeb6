/**
 * From what a reader gives (points, a mesh or a raster, in the source's units and axes) to the
 * height grid the solver queries, each step reported: units and up axis, crop, local origin,
 * outlier removal, levelling, ground filter, gridding or rasterising, hole filling.
 */
import { boundsOf, cropInPlace, localise, originOf, toZUp } from './localFrame';
import { statisticalOutliers, compactPoints, meshEdgeOutliers } from './outliers';
import { progressiveMorphologicalFilter } from './groundFilter';
import { gridOver, gridPoints } from './gridding';
import { rasteriseTop } from './rasterise';
import { fillHoles } from './fill';
import { levelPoints, type LevelResult } from './level';
import { chooseCell, contactPatchLengthM, coveredSpacingM } from './cellSize';
import { sizeWarning } from './units';
import { GroundError, type HeightGrid, type LocalOrigin, type SourceInfo, type StepReport } from './types';

/**
 * Largest grid the scenario holds (nodes): the scenario file's grid limit, SCENARIO_LIMITS.gridNodes
 * (4096 × 4096; written out here so the ground worker does not load the schema; a test keeps them equal).
 */
export const MAX_GRID_NODES = 16_777_216;

export type RawGround =
  | { readonly kind: 'points'; readonly xyz: Float64Array; readonly count: number; readonly classes: Uint8Array | null; readonly info: SourceInfo }
  | {
      readonly kind: 'mesh';
      readonly positions: Float64Array;
      readonly vertexCount: number;
      readonly indices: Uint32Array;
      readonly triangleCount: number;
      readonly info: SourceInfo;
    }
  | {
      /** A raster DEM: row 0 along the lowest y; node (c, r) at (originX + c·cell, originY + r·cell), NaN for nodata. */
      readonly kind: 'raster';
      readonly heights: Float32Array | Float64Array;
      readonly cols: number;
      readonly rows: number;
      readonly originX: number;
      readonly originY: number;
      readonly cell: number;
      readonly info: SourceInfo;
    };

export interface GroundSettings {
  /** Grid cell (m); absent: chosen from the tyre and the point spacing (a raster keeps its own). */
  readonly cellM?: number;
  /** Metres per source unit; absent: what the file says, else metres. */
  readonly unitM?: number;
  /** Up axis; absent: what the file says, else z. */
  readonly up?: 'z' | 'y';
  /** Crop in source coordinates and units (after the up swap): [x0, y0, x1, y1]. */
  readonly crop?: readonly [number, number, number, number] | null;
  readonly level?: boolean;
  readonly fill?: boolean;
  /** Statistical outlier removal on points and mesh vertices. @default true */
  readonly outliers?: boolean;
  /** Ground filter for point clouds: the file's own ground class (2), the morphological filter, or none. @default 'auto' (class when present, else pmf) */
  readonly groundFilter?: 'auto' | 'class' | 'pmf' | 'none';
  /** Percentile of the heights in a cell for point clouds. @default 10 */
  readonly percentile?: number;
  /** Tyre for the cell choice. @default radius 0.4 m, deflection 0.03 m (an invented light-truck tyre) */
  readonly tyre?: { readonly radiusM: number; readonly deflectionM: number };
  /** Called as each step finishes (the app's progress bar). */
  readonly onStep?: (step: string, done: number) => void;
}

/** Steps reported, at most (for a progress bar's total). */
export const GROUND_STEP_COUNT = 9;

export interface GroundSummary {
  readonly file: string;
  readonly format: string;
  readonly crs: string | null;
  readonly georeferenced: boolean;
  readonly unitM: number;
  readonly up: 'z' | 'y';
  readonly pointsRead: number;
  readonly trianglesRead: number;
  readonly cellsRead: number;
  readonly croppedOut: number;
  readonly outliersRemoved: number;
  readonly groundFilterRemoved: number;
  readonly cellM: number;
  readonly cellWhy: string;
  readonly cols: number;
  readonly rows: number;
  readonly cells: number;
  readonly filledShare: number;
  readonly emptyShare: number;
  readonly levellingDeg: number | null;
  /** Source coordinates of the scenario's (0, 0, 0), in source units after the up swap. */
  readonly originSource: LocalOrigin;
  readonly warnings: readonly string[];
  readonly steps: readonly StepReport[];
}

export interface GroundResult {
  readonly grid: HeightGrid;
  readonly summary: GroundSummary;
}

const DEFAULT_TYRE = { radiusM: 0.4, deflectionM: 0.03 };

/** The steps done so far; tells `onStep` as each is added. */
class StepList {
  readonly list: StepReport[] = [];
  constructor(private readonly onStep?: (step: string, done: number) => void) {}
  push(r: StepReport): void {
    this.list.push(r);
    this.onStep?.(r.step, this.list.length);
  }
}

export function buildGround(raw: RawGround, settings: GroundSettings = {}): GroundResult {
  const info = raw.info;
  const unitM = settings.unitM ?? info.unitM ?? 1;
  const up = settings.up ?? info.up ?? 'z';
  const crop = settings.crop ?? null;
  const steps = new StepList(settings.onStep);
  const warnings: string[] = [];
  if (!(unitM > 0) || !Number.isFinite(unitM)) throw new GroundError(`${info.file}: the length unit must be a positive number of metres, got ${unitM}`);
  if (settings.cellM !== undefined && !(settings.cellM > 0 && settings.cellM < 1e4)) {
    throw new GroundError(`--cell must be a positive length in metres below 10 km, got ${settings.cellM}`);
  }
  if (settings.level && info.georeferenced) {
    throw new GroundError(`${info.file}: levelling is for scans without a georeference; this ground is georeferenced (${info.crs ?? 'it has map coordinates'}) and its slope is the point`);
  }
  steps.push({
    step: 'units and up axis',
    method: 'from the file where it says; else as given (common practice)',
    detail: { unitM, up, fromFile: info.unitM !== null && settings.unitM === undefined },
  });
  if (raw.kind === 'raster') return rasterGround(raw, settings, unitM, up, crop, steps, warnings);

  // Points or mesh vertices, source units, turned z-up, float64.
  const isMesh = raw.kind === 'mesh';
  const count0 = isMesh ? raw.vertexCount : raw.count;
  const src = isMesh ? raw.positions : raw.xyz;
  const xyz64 = new Float64Array(count0 * 3);
  const t = new Float64Array(3);
  for (let i = 0; i < count0; i++) {
    toZUp(src[3 * i], src[3 * i + 1], src[3 * i + 2], up, t);
    xyz64[3 * i] = t[0];
    xyz64[3 * i + 1] = t[1];
    xyz64[3 * i + 2] = t[2];
  }
  const classes = raw.kind === 'points' && raw.classes ? Uint8Array.from(raw.classes.subarray(0, count0)) : null;
  let count = count0;
  let indices = isMesh ? raw.indices : null;
  let triCount = isMesh ? raw.triangleCount : 0;
  let croppedOut = 0;
  if (crop) {
    if (isMesh) {
      // Keep triangles with any vertex inside; the raster clips to the crop anyway.
      const inside = vertexMask(xyz64, count, crop);
      ({ indices, triCount } = keepTriangles(indices as Uint32Array, triCount, inside, false));
      croppedOut = raw.triangleCount - triCount;
    } else {
      count = cropInPlace(xyz64, count, crop, classes);
      croppedOut = count0 - count;
    }
    steps.push({ step: 'crop', method: 'area of interest (common practice)', detail: { x0: crop[0], y0: crop[1], x1: crop[2], y1: crop[3], removed: croppedOut } });
    if (count === 0 || (isMesh && triCount === 0)) throw new GroundError(`${info.file}: nothing of the ground lies inside the crop ${crop.join(',')}`);
  }
  const b = boundsOf(xyz64, count);
  if (isMesh && crop) {
    b[0] = Math.max(b[0], Math.min(crop[0], crop[2]));
    b[3] = Math.min(b[3], Math.max(crop[0], crop[2]));
    b[1] = Math.max(b[1], Math.min(crop[1], crop[3]));
    b[4] = Math.min(b[4], Math.max(crop[1], crop[3]));
  }
  const origin = originOf(b);
  const sw = sizeWarning(Math.max(b[3] - b[0], b[4] - b[1]), unitM, info.georeferenced);
  if (sw) warnings.push(sw);
  const xyz = localise(xyz64, count, origin, unitM);
  steps.push({
    step: 'local origin',
    method: 'origin subtracted in float64, stored float32 (IEEE 754)',
    detail: { originX: origin.x, originY: origin.y, originZ: origin.z, widthM: (b[3] - b[0]) * unitM, depthM: (b[4] - b[1]) * unitM, heightM: (b[5] - b[2]) * unitM },
  });

  let outliersRemoved = 0;
  if (settings.outliers ?? true) {
    // Meshes: each vertex's own edges are its neighbours (linear time on millions of vertices).
    const r = isMesh ? meshEdgeOutliers(xyz, count, indices as Uint32Array, triCount) : statisticalOutliers(xyz, count, { k: 16 });
    outliersRemoved = r.removed;
    if (isMesh) {
      // A mesh loses the triangles at an outlier vertex (a spike's long edges).
      ({ indices, triCount } = keepTriangles(indices as Uint32Array, triCount, r.keep, true));
    } else count = compactPoints(xyz, count, r.keep, classes);
    steps.push({
      step: 'outlier removal',
      method: isMesh ? 'statistical outlier removal after Rusu et al. 2008, on each vertex\'s mesh edges (mean + 2σ, at least twice the mean)' : 'statistical outlier removal, Rusu et al. 2008 (k = 16, mean + 2σ, at least twice the mean)',
      detail: { removed: r.removed, meanNeighbourDistanceM: r.meanDistanceM, thresholdM: r.thresholdM, trianglesLeft: isMesh ? triCount : null },
    });
  }
  if (count < 3 || (isMesh && triCount === 0)) throw new GroundError(`${info.file}: too little ground is left after outlier removal (${count} points, ${triCount} triangles)`);

  let levelling: LevelResult | null = null;
  if (settings.level) {
    const ext = Math.max(b[3] - b[0], b[4] - b[1]) * unitM;
    levelling = levelPoints(xyz, count, Math.max(0.01, 0.005 * ext));
    steps.push({
      step: 'levelling',
      method: 'RANSAC plane (Fischler & Bolles 1981) refined by least squares on its inliers',
      detail: { tiltDeg: (levelling.tiltRad * 180) / Math.PI, inliers: levelling.inliers, thresholdM: levelling.thresholdM },
    });
  }

  let groundRemoved = 0;
  const lb = boundsOf(xyz, count);
  const spacing = coveredSpacingM(xyz, count);
  const tyre = settings.tyre ?? DEFAULT_TYRE;
  const patch = contactPatchLengthM(tyre.radiusM, tyre.deflectionM);
  const choice = settings.cellM !== undefined ? { cellM: settings.cellM, why: 'as given' } : chooseCell(patch, spacing);
  const cellM = choice.cellM;
  const spec = gridOver([lb[0], lb[1], lb[3], lb[4]], cellM);
  if (spec.cols * spec.rows > MAX_GRID_NODES) {
    throw new GroundError(
      `${info.file}: a ${spec.cols} × ${spec.rows} grid at ${cellM} m is more than ${MAX_GRID_NODES} nodes; use a larger --cell or a --crop`,
    );
  }
  steps.push({
    step: 'cell size',
    method: 'at most a quarter of the contact patch, not finer than the point spacing (common practice)',
    detail: { cellM, why: choice.why, patchLengthM: patch, pointSpacingM: spacing, cols: spec.cols, rows: spec.rows },
  });

  let grid: HeightGrid;
  if (isMesh) {
    grid = rasteriseTop(xyz, indices as Uint32Array, triCount, spec);
    steps.push({ step: 'top surface', method: 'triangle rasterisation by edge functions (Pineda 1988), highest z', detail: { triangles: triCount } });
  } else {
    const mode = settings.groundFilter ?? 'auto';
    let hasGroundClass = false;
    if (classes) for (let i = 0; i < count && !hasGroundClass; i++) if (classes[i] === 2) hasGroundClass = true;
    const use = mode === 'auto' ? (hasGroundClass ? 'class' : 'pmf') : mode;
    if (use === 'class') {
      if (!classes || !hasGroundClass) throw new GroundError(`${info.file}: no point is classed as ground (class 2); use another ground filter`);
      const keep = new Uint8Array(count);
      for (let i = 0; i < count; i++) keep[i] = classes[i] === 2 ? 1 : 0;
      const before = count;
      count = compactPoints(xyz, count, keep, classes);
      groundRemoved = before - count;
      steps.push({ step: 'ground filter', method: 'the file\'s own ground class (ASPRS LAS class 2)', detail: { removed: groundRemoved } });
    } else if (use === 'pmf') {
      const r = progressiveMorphologicalFilter(xyz, count, spec, { cellM });
      const before = count;
      count = compactPoints(xyz, count, r.keep, classes);
      groundRemoved = before - count;
      steps.push({
        step: 'ground filter',
        method: 'progressive morphological filter, Zhang et al. 2003 (windows to 8 m, slope 1, dh 0.15–2.5 m)',
        detail: { removed: groundRemoved, windows: r.windows },
      });
    } else steps.push({ step: 'ground filter', method: 'none (all points kept)', detail: { removed: 0 } });
    const percentile = settings.percentile ?? 10;
    grid = gridPoints(xyz, count, spec, { statistic: { percentile } });
    steps.push({ step: 'gridding', method: `the ${percentile}th percentile of the heights nearest each node (common practice)`, detail: { points: count } });
  }
  return finish(grid, info, settings, unitM, up, origin, steps, warnings, {
    pointsRead: isMesh ? raw.vertexCount : raw.count,
    trianglesRead: isMesh ? raw.triangleCount : 0,
    cellsRead: 0,
    croppedOut,
    outliersRemoved,
    groundFilterRemoved: groundRemoved,
    cellWhy: choice.why,
    levellingDeg: levelling ? (levelling.tiltRad * 180) / Math.PI : null,
  });
}

function vertexMask(xyz: Float64Array, count: number, crop: readonly [number, number, number, number]): Uint8Array {
  const x0 = Math.min(crop[0], crop[2]);
  const x1 = Math.max(crop[0], crop[2]);
  const y0 = Math.min(crop[1], crop[3]);
  const y1 = Math.max(crop[1], crop[3]);
  const m = new Uint8Array(count);
  for (let i = 0; i < count; i++) {
    const x = xyz[3 * i];
    const y = xyz[3 * i + 1];
    m[i] = x >= x0 && x <= x1 && y >= y0 && y <= y1 ? 1 : 0;
  }
  return m;
}

/** Keeps the triangles whose vertices pass the mask (all of them, or any of them). */
function keepTriangles(indices: Uint32Array, triCount: number, mask: Uint8Array, all: boolean): { indices: Uint32Array; triCount: number } {
  const out = new Uint32Array(triCount * 3);
  let n = 0;
  for (let t = 0; t < triCount; t++) {
    const a = mask[indices[3 * t]];
    const b = mask[indices[3 * t + 1]];
    const c = mask[indices[3 * t + 2]];
    if (all ? a && b && c : a || b || c) {
      out[3 * n] = indices[3 * t];
      out[3 * n + 1] = indices[3 * t + 1];
      out[3 * n + 2] = indices[3 * t + 2];
      n++;
    }
  }
  return { indices: out, triCount: n };
}

function rasterGround(
  raw: Extract<RawGround, { kind: 'raster' }>,
  settings: GroundSettings,
  unitM: number,
  up: 'z' | 'y',
  crop: readonly [number, number, number, number] | null,
  steps: StepList,
  warnings: string[],
): GroundResult {
  const info = raw.info;
  let c0 = 0;
  let r0 = 0;
  let c1 = raw.cols - 1;
  let r1 = raw.rows - 1;
  if (crop) {
    const x0 = Math.min(crop[0], crop[2]);
    const x1 = Math.max(crop[0], crop[2]);
    const y0 = Math.min(crop[1], crop[3]);
    const y1 = Math.max(crop[1], crop[3]);
    c0 = Math.max(0, Math.ceil((x0 - raw.originX) / raw.cell - 1e-9));
    c1 = Math.min(raw.cols - 1, Math.floor((x1 - raw.originX) / raw.cell + 1e-9));
    r0 = Math.max(0, Math.ceil((y0 - raw.originY) / raw.cell - 1e-9));
    r1 = Math.min(raw.rows - 1, Math.floor((y1 - raw.originY) / raw.cell + 1e-9));
    if (c1 - c0 < 1 || r1 - r0 < 1) throw new GroundError(`${info.file}: the crop ${crop.join(',')} holds fewer than 2 × 2 cells of the grid`);
    steps.push({ step: 'crop', method: 'area of interest (common practice)', detail: { x0, y0, x1, y1, cols: c1 - c0 + 1, rows: r1 - r0 + 1 } });
  }
  const cols = c1 - c0 + 1;
  const rows = r1 - r0 + 1;
  if (cols * rows > MAX_GRID_NODES) {
    throw new GroundError(`${info.file}: ${cols} × ${rows} cells is more than ${MAX_GRID_NODES}; use a --crop`);
  }
  let zmin = Infinity;
  let valid = 0;
  for (let r = r0; r <= r1; r++) {
    for (let c = c0; c <= c1; c++) {
      const v = raw.heights[r * raw.cols + c];
      if (Number.isFinite(v)) {
        valid++;
        if (v < zmin) zmin = v;
      }
    }
  }
  if (valid === 0) throw new GroundError(`${info.file}: every height in the area is nodata`);
  const ex0 = raw.originX + c0 * raw.cell;
  const ey0 = raw.originY + r0 * raw.cell;
  const origin: LocalOrigin = { x: ex0 + ((cols - 1) * raw.cell) / 2, y: ey0 + ((rows - 1) * raw.cell) / 2, z: zmin };
  const h = new Float32Array(cols * rows);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      const v = raw.heights[(r + r0) * raw.cols + c + c0];
      h[r * cols + c] = Number.isFinite(v) ? (v - zmin) * unitM : NaN;
    }
  }
  const cellM = raw.cell * unitM;
  steps.push({
    step: 'local origin',
    method: 'origin subtracted in float64, stored float32 (IEEE 754)',
    detail: { originX: origin.x, originY: origin.y, originZ: origin.z, widthM: (cols - 1) * cellM, depthM: (rows - 1) * cellM },
  });
  const grid: HeightGrid = {
    kind: 'grid',
    originM: [(ex0 - origin.x) * unitM, (ey0 - origin.y) * unitM],
    cellM,
    cols,
    rows,
    heightsM: h,
    filled: new Uint8Array(cols * rows),
  };
  let why = 'the raster\'s own cell';
  let out = grid;
  if (settings.cellM !== undefined && Math.abs(settings.cellM - cellM) > 1e-9 * cellM) {
    out = resample(grid, settings.cellM);
    why = `resampled bilinearly from the raster's ${cellM} m`;
  }
  steps.push({ step: 'cell size', method: 'raster cell (or bilinear resampling when a cell is given)', detail: { cellM: out.cellM, cols: out.cols, rows: out.rows } });
  return finish(out, info, settings, unitM, up, origin, steps, warnings, {
    pointsRead: 0,
    trianglesRead: 0,
    cellsRead: raw.cols * raw.rows,
    croppedOut: raw.cols * raw.rows - cols * rows,
    outliersRemoved: 0,
    groundFilterRemoved: 0,
    cellWhy: why,
    levellingDeg: null,
  });
}

/** Bilinear resampling onto a new cell; a node near a NaN source node becomes NaN (to be filled or left). */
function resample(g: HeightGrid, cellM: number): HeightGrid {
  const w = (g.cols - 1) * g.cellM;
  const d = (g.rows - 1) * g.cellM;
  const cols = Math.floor(w / cellM + 1e-9) + 1;
  const rows = Math.floor(d / cellM + 1e-9) + 1;
  if (cols < 2 || rows < 2) throw new GroundError(`--cell ${cellM} m is larger than the ground itself`);
  if (cols * rows > MAX_GRID_NODES) throw new GroundError(`a ${cols} × ${rows} grid at ${cellM} m is more than ${MAX_GRID_NODES} nodes; use a larger --cell or a --crop`);
  const h = new Float32Array(cols * rows);
  for (let r = 0; r < rows; r++) {
    const fy = Math.min(g.rows - 1, (r * cellM) / g.cellM);
    const ry = Math.min(g.rows - 2, Math.floor(fy));
    const ty = fy - ry;
    for (let c = 0; c < cols; c++) {
      const fx = Math.min(g.cols - 1, (c * cellM) / g.cellM);
      const cx = Math.min(g.cols - 2, Math.floor(fx));
      const tx = fx - cx;
      const k = ry * g.cols + cx;
      const a = g.heightsM[k] + (g.heightsM[k + 1] - g.heightsM[k]) * tx;
      const b = g.heightsM[k + g.cols] + (g.heightsM[k + g.cols + 1] - g.heightsM[k + g.cols]) * tx;
      h[r * cols + c] = a + (b - a) * ty;
    }
  }
  return { kind: 'grid', originM: [g.originM[0], g.originM[1]], cellM, cols, rows, heightsM: h, filled: new Uint8Array(cols * rows) };
}

function finish(
  grid: HeightGrid,
  info: SourceInfo,
  settings: GroundSettings,
  unitM: number,
  up: 'z' | 'y',
  origin: LocalOrigin,
  steps: StepList,
  warnings: string[],
  counts: Pick<GroundSummary, 'pointsRead' | 'trianglesRead' | 'cellsRead' | 'croppedOut' | 'outliersRemoved' | 'groundFilterRemoved' | 'cellWhy' | 'levellingDeg'>,
): GroundResult {
  const n = grid.cols * grid.rows;
  let empty = 0;
  for (let k = 0; k < n; k++) if (Number.isNaN(grid.heightsM[k])) empty++;
  let filled = 0;
  if (settings.fill) {
    filled = fillHoles(grid);
    steps.push({ step: 'hole filling', method: 'Laplace (harmonic) interpolation, Press et al. Numerical Recipes §3.8; SOR (Young 1954)', detail: { filled, share: filled / n } });
  } else if (empty > 0) {
    throw new GroundError(
      `${info.file}: ${((100 * empty) / n).toFixed(1)} % of the grid (${empty} of ${n} nodes) has no height; add --fill to fill the holes (they are marked as filled), or use a larger --cell`,
    );
  }
  return {
    grid,
    summary: {
      file: info.file,
      format: info.format,
      crs: info.crs,
      georeferenced: info.georeferenced,
      unitM,
      up,
      ...counts,
      cellM: grid.cellM,
      cols: grid.cols,
      rows: grid.rows,
      cells: n,
      filledShare: filled / n,
      emptyShare: empty / n,
      originSource: origin,
      warnings,
      steps: steps.list,
    },
  };
}
