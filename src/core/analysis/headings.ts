/**
 * Heading sweep on the ground as it is: the vehicle stands at one spot of the scenario's terrain
 * and is turned through every heading; at each it is solved on that ground (no level table), then
 * tilted further about the ground's fall line at that spot (a tilt-table sweep, SAE J2180 / ISO
 * 16333 style, started from the ground as it is) to find the extra tilt at which a wheel lifts and
 * at which it tips. The worst heading is the one with the least extra tilt to the tip.
 *
 * Angles: "extra" is more than the ground here; "from level" adds the ground's slope at the spot
 * (exact where the ground is a plane under the vehicle; an estimate on uneven ground, where the
 * fitted plane stands for it). Quasi-static: real margins are smaller.
 *
 * The per-heading work is a pure function over plain data (HeadingJob), so a pool of workers can
 * share the headings as the line sweep shares its lines.
 */
import type { Pose, Terrain, Vehicle, WheelName } from '../model/types';
import { TerrainField } from '../terrain/field';
import { DEFAULT_FRICTION, buildModel, solveEquilibrium } from '../solver/equilibrium';
import type { VehicleModel } from '../solver/model';
import { tiltSweep } from '../solver/tilt';
import { FilledGround, filledWheelNames } from './filledGround';

import { RAD_PER_DEG as DEG } from '../scenario/fields';
/** Below this slope the spot counts as level and the extra tilt is taken left side down (rad): 0.1°. */
export const LEVEL_SLOPE_RAD = 0.1 * DEG;
/** Largest extra tilt tried (rad). */
export const HEADING_MAX_EXTRA_RAD = 89 * DEG;

/** The ground at a spot as a plane fitted by least squares to heights sampled over a disc. */
export interface GroundPlane {
  /** Slope from level (rad). */
  readonly slopeRad: number;
  /** Direction the ground falls toward, counter-clockwise from +x of the terrain frame (rad). */
  readonly fallAzimuthRad: number;
  /** Root-mean-square height of the samples off the plane (m): how far the ground is from a plane there. */
  readonly rmsM: number;
  readonly radiusM: number;
}

/**
 * Least-squares plane z = a + b·x + c·y through heights on an n × n grid over the disc of radius
 * radiusM around (x, y) (points outside the disc left out). Slope = atan(|(b, c)|), falling toward −(b, c).
 */
export function groundPlaneAt(field: TerrainField, xM: number, yM: number, radiusM: number, n = 13): GroundPlane {
  let s1 = 0, sx = 0, sy = 0, sxx = 0, sxy = 0, syy = 0, sz = 0, sxz = 0, syz = 0;
  const pts: number[] = [];
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const dx = -radiusM + (2 * radiusM * i) / (n - 1);
      const dy = -radiusM + (2 * radiusM * j) / (n - 1);
      if (dx * dx + dy * dy > radiusM * radiusM * (1 + 1e-9)) continue;
      const z = field.height(xM + dx, yM + dy);
      pts.push(dx, dy, z);
      s1 += 1; sx += dx; sy += dy; sxx += dx * dx; sxy += dx * dy; syy += dy * dy; sz += z; sxz += dx * z; syz += dy * z;
    }
  }
  // Normal equations, 3 × 3, by Cramer's rule.
  const det3 = (m: number[]) => m[0] * (m[4] * m[8] - m[5] * m[7]) - m[1] * (m[3] * m[8] - m[5] * m[6]) + m[2] * (m[3] * m[7] - m[4] * m[6]);
  const A = [s1, sx, sy, sx, sxx, sxy, sy, sxy, syy];
  const D = det3(A);
  const a = det3([sz, sx, sy, sxz, sxx, sxy, syz, sxy, syy]) / D;
  const b = det3([s1, sz, sy, sx, sxz, sxy, sy, syz, syy]) / D;
  const c = det3([s1, sx, sz, sx, sxx, sxz, sy, sxy, syz]) / D;
  let ss = 0;
  for (let k = 0; k < pts.length; k += 3) {
    const e = pts[k + 2] - (a + b * pts[k] + c * pts[k + 1]);
    ss += e * e;
  }
  const g = Math.hypot(b, c);
  return { slopeRad: Math.atan(g), fallAzimuthRad: g > 0 ? Math.atan2(-c, -b) : 0, rmsM: Math.sqrt(ss / (pts.length / 3)), radiusM };
}

/** The disc the ground plane is fitted over: half the diagonal of the wheelbase by the wider track, plus a tyre radius (m). */
export function footprintRadiusM(v: Vehicle): number {
  return 0.5 * Math.hypot(v.wheelbaseM, Math.max(v.trackFrontM, v.trackRearM)) + Math.max(v.tyreFront.radiusM, v.tyreRear.radiusM);
}

export interface HeadingResult {
  readonly headingRad: number;
  /** The fall line's direction in the vehicle frame (as Tilt.downhillRad: 0 nose down, π/2 left side down). */
  readonly downhillRad: number;
  /**
   * False when the solver neither converged nor found that no equilibrium exists (a numerical miss,
   * not a tip): the heading is then left out of the worst and listed as not solved.
   */
  readonly solved: boolean;
  /** Whether it stands on the ground as it is at this heading (a stable equilibrium with a positive margin). */
  readonly stands: boolean;
  /** Force-angle margin on the ground as it is (rad; ≤ 0 when it does not stand). */
  readonly forceAngleRad: number;
  /** Extra tilt (more than the ground here) at which the first wheel lifts; null if none before the tip. */
  readonly firstLift: { readonly wheel: WheelName; readonly extraRad: number } | null;
  /** Extra tilt at which it tips, and the edge; 0 when it does not stand here; null if no tip up to HEADING_MAX_EXTRA_RAD. */
  readonly tip: { readonly extraRad: number; readonly edge: readonly WheelName[] } | null;
  /** Loaded wheels standing on imported ground that was filled in, on the ground as it is at this heading (filledGround.ts); empty when none. */
  readonly filledWheels?: readonly WheelName[];
}

export interface HeadingJob {
  readonly vehicle: Vehicle;
  readonly terrain: Terrain;
  readonly xM: number;
  readonly yM: number;
  readonly ground: GroundPlane;
  readonly headingsRad: readonly number[];
  readonly friction?: number;
}

function wrap(a: number): number {
  const t = a % (2 * Math.PI);
  return t < 0 ? t + 2 * Math.PI : t;
}

/** The fall line in the vehicle frame at a heading (left side down on level ground). */
export function downhillAt(ground: GroundPlane, headingRad: number): number {
  return ground.slopeRad < LEVEL_SLOPE_RAD ? Math.PI / 2 : wrap(ground.fallAzimuthRad - headingRad);
}

/** One heading on a model built once. */
export function solveHeading(model: VehicleModel, xM: number, yM: number, ground: GroundPlane, headingRad: number, friction = DEFAULT_FRICTION): HeadingResult {
  const pose: Pose = { xM, yM, headingRad };
  const downhillRad = downhillAt(ground, headingRad);
  const r = solveEquilibrium(model, pose, { friction });
  const filled = FilledGround.of(model.field.terrain);
  const filledWheels = filled && r.status !== 'not-converged' ? filledWheelNames(filled.wheelBits(r)) : [];
  if (r.status === 'not-converged') {
    return { headingRad, downhillRad, solved: false, stands: false, forceAngleRad: 0, firstLift: null, tip: null };
  }
  const stands = r.status === 'converged' && r.margins.forceAngleRad > 0;
  if (!stands) {
    return { headingRad, downhillRad, solved: true, stands, forceAngleRad: Math.min(0, r.margins.forceAngleRad), firstLift: null, tip: { extraRad: 0, edge: [] }, filledWheels };
  }
  const sw = tiltSweep(model, pose, { downhillRad, friction, findSlide: false, maxAngleRad: HEADING_MAX_EXTRA_RAD });
  return {
    headingRad,
    downhillRad,
    solved: true,
    stands,
    forceAngleRad: r.margins.forceAngleRad,
    firstLift: sw.firstLift ? { wheel: sw.firstLift.wheel, extraRad: sw.firstLift.angleRad } : null,
    tip: sw.tip ? { extraRad: sw.tip.angleRad, edge: sw.tip.edge } : null,
    filledWheels,
  };
}

/** Runs the headings of a job in turn (the pure job function for a worker). */
export function runHeadingJob(job: HeadingJob, onHeading?: (done: number, total: number) => void): HeadingResult[] {
  const model = buildModel(job.vehicle, job.terrain);
  const out: HeadingResult[] = [];
  for (let i = 0; i < job.headingsRad.length; i++) {
    out.push(solveHeading(model, job.xM, job.yM, job.ground, job.headingsRad[i], job.friction));
    onHeading?.(i + 1, job.headingsRad.length);
  }
  return out;
}

/** Headings 0, step, 2·step … below 2π (rad). */
export function headingsEvery(stepRad: number): number[] {
  const n = Math.max(1, Math.round((2 * Math.PI) / stepRad));
  return Array.from({ length: n }, (_, i) => (2 * Math.PI * i) / n);
}

const tipExtra = (h: HeadingResult) => (h.tip ? h.tip.extraRad : HEADING_MAX_EXTRA_RAD);
const liftExtra = (h: HeadingResult) => (h.firstLift ? h.firstLift.extraRad : tipExtra(h));

export interface HeadingSweepResult {
  readonly ground: GroundPlane;
  readonly xM: number;
  readonly yM: number;
  /** In heading order. */
  readonly headings: readonly HeadingResult[];
  /** The solved heading with the least extra tilt to the tip (ties: the first in heading order); null when none was solved. */
  readonly worst: HeadingResult | null;
  /** The solved heading with the least extra tilt to the first lift; null when none was solved. */
  readonly worstLift: HeadingResult | null;
  /** Headings the solver could not settle (left out of the worst). */
  readonly unsolved: readonly HeadingResult[];
}

/** Sorts the results by heading and names the worst. Needs ≥ 1 result. */
export function summariseHeadings(ground: GroundPlane, xM: number, yM: number, results: readonly HeadingResult[]): HeadingSweepResult {
  if (results.length === 0) throw new Error('summariseHeadings: no headings');
  const headings = [...results].sort((a, b) => a.headingRad - b.headingRad);
  let worst: HeadingResult | null = null;
  let worstLift: HeadingResult | null = null;
  for (const h of headings) {
    if (!h.solved) continue;
    if (worst === null || tipExtra(h) < tipExtra(worst)) worst = h;
    if (worstLift === null || liftExtra(h) < liftExtra(worstLift)) worstLift = h;
  }
  return { ground, xM, yM, headings, worst, worstLift, unsolved: headings.filter((h) => !h.solved) };
}

/** In-process sweep: every heading at stepRad at (xM, yM) on the terrain. */
export function headingSweep(
  vehicle: Vehicle,
  terrain: Terrain,
  xM: number,
  yM: number,
  opts: { readonly stepRad?: number; readonly friction?: number; readonly onProgress?: (done: number, total: number) => void } = {},
): HeadingSweepResult {
  const ground = groundPlaneAt(new TerrainField(terrain), xM, yM, footprintRadiusM(vehicle));
  const results = runHeadingJob({ vehicle, terrain, xM, yM, ground, headingsRad: headingsEvery(opts.stepRad ?? 5 * DEG), friction: opts.friction }, opts.onProgress);
  return summariseHeadings(ground, xM, yM, results);
}
