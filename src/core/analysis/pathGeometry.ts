/**
 * Path geometry: a pass path as a polyline (from, the corner points `viaM`, to), its arc length and
 * the pose of the vehicle's reference point at a distance along it.
 *
 * Position: the reference point (on the ground, midway between the axles) follows the drawn
 * polyline exactly. Heading: along each leg; at a corner the heading turns at a constant rate with
 * distance over a blend length centred on the corner (one wheelbase in the pass), shortened to half
 * of the shorter neighbouring leg so that two corners never blend into each other. The pose sequence
 * is then continuous; without the blend the heading would jump by the whole corner angle between two
 * stations. This is our own choice (a quasi-static pose has no steering geometry): it is not a
 * turning-circle or tyre-scrub model. A fixed heading (`headingRad`) overrides it, as on a straight path.
 *
 * A two-point path gives exactly the old straight-path arithmetic (same stations, same poses).
 */
import type { PathSpec } from '../model/types';

export type PathXY = readonly [x: number, y: number];

/** The path's points in order: from, the corner points, to. */
export function pathPoints(p: PathSpec): PathXY[] {
  return [p.fromM, ...(p.viaM ?? []), p.toM];
}

/** A path through `points` (≥ 2, in driving order); the corner points are copied. */
export function polylinePath(points: readonly PathXY[], stepM: number, headingRad: number | null = null): PathSpec {
  if (points.length < 2) throw new Error('polylinePath: needs at least two points');
  const n = points.length;
  const via = points.slice(1, n - 1).map((q) => [q[0], q[1]] as const);
  return {
    fromM: [points[0][0], points[0][1]],
    ...(via.length > 0 ? { viaM: via } : {}),
    toM: [points[n - 1][0], points[n - 1][1]],
    stepM,
    headingRad,
  };
}

/** Length of the path along its legs (m). */
export function pathLengthM(p: PathSpec): number {
  const via = p.viaM;
  if (!via || via.length === 0) return Math.hypot(p.toM[0] - p.fromM[0], p.toM[1] - p.fromM[1]);
  let sum = 0;
  let prev = p.fromM;
  for (let i = 0; i <= via.length; i++) {
    const q = i < via.length ? via[i] : p.toM;
    sum += Math.hypot(q[0] - prev[0], q[1] - prev[1]);
    prev = q;
  }
  return sum;
}

/**
 * Walks a path: `at(s)` sets `xM`, `yM` and `headingRad` for the distance s along it (clamped to
 * [0, length]). Allocation-free after construction; calls with increasing s are cheapest (the leg
 * is found by walking on from the last one). The heading is continuous (not wrapped into ±π).
 */
export class PathWalker {
  readonly lengthM: number;
  xM = 0;
  yM = 0;
  headingRad = 0;
  /** Leg start points, unit directions, lengths, start distances and (unwrapped) headings. */
  private readonly px: Float64Array;
  private readonly py: Float64Array;
  private readonly ux: Float64Array;
  private readonly uy: Float64Array;
  private readonly len: Float64Array;
  private readonly start: Float64Array;
  private readonly heading: Float64Array;
  /** Half blend length at the corner that starts leg k (k ≥ 1); 0 for leg 0. */
  private readonly half: Float64Array;
  private readonly fixed: number | null;
  private leg = 0;

  /** @param blendM length over which a corner's heading change is spread (m; 0: a step at the corner) */
  constructor(path: PathSpec, blendM: number) {
    const pts = pathPoints(path);
    const n = pts.length - 1;
    this.px = new Float64Array(n);
    this.py = new Float64Array(n);
    this.ux = new Float64Array(n);
    this.uy = new Float64Array(n);
    this.len = new Float64Array(n);
    this.start = new Float64Array(n);
    this.heading = new Float64Array(n);
    this.half = new Float64Array(n);
    this.fixed = path.headingRad;
    let s = 0;
    for (let k = 0; k < n; k++) {
      const dx = pts[k + 1][0] - pts[k][0];
      const dy = pts[k + 1][1] - pts[k][1];
      const l = Math.hypot(dx, dy);
      this.px[k] = pts[k][0];
      this.py[k] = pts[k][1];
      this.ux[k] = l > 0 ? dx / l : 1;
      this.uy[k] = l > 0 ? dy / l : 0;
      this.len[k] = l;
      this.start[k] = s;
      const h = Math.atan2(dy, dx);
      if (k === 0) this.heading[k] = h;
      else {
        // Unwrapped: the turn from the last leg, taken the short way round.
        let turn = h - this.heading[k - 1];
        turn -= 2 * Math.PI * Math.round(turn / (2 * Math.PI));
        this.heading[k] = this.heading[k - 1] + turn;
        this.half[k] = Math.max(0, Math.min(0.5 * blendM, 0.5 * this.len[k - 1], 0.5 * l));
      }
      s += l;
    }
    // One leg: the same sum as the straight path's hypot.
    this.lengthM = n === 1 ? this.len[0] : s;
  }

  at(sIn: number): void {
    const n = this.len.length;
    const s = sIn < 0 ? 0 : sIn > this.lengthM ? this.lengthM : sIn;
    let k = this.leg;
    if (k >= n || s < this.start[k]) k = 0;
    while (k + 1 < n && s >= this.start[k + 1]) k++;
    this.leg = k;
    const d = s - this.start[k];
    this.xM = this.px[k] + this.ux[k] * d;
    this.yM = this.py[k] + this.uy[k] * d;
    if (this.fixed !== null) {
      this.headingRad = this.fixed;
      return;
    }
    let h = this.heading[k];
    // Blend in from the corner behind (leg k's start) and towards the corner ahead (leg k + 1's start).
    const hb = this.half[k];
    if (k > 0 && hb > 0 && d < hb) {
      const t = (d + hb) / (2 * hb);
      h = this.heading[k - 1] + (this.heading[k] - this.heading[k - 1]) * t;
    } else if (k + 1 < n) {
      const ha = this.half[k + 1];
      const toCorner = this.len[k] - d;
      if (ha > 0 && toCorner < ha) {
        const t = (ha - toCorner) / (2 * ha);
        h = this.heading[k] + (this.heading[k + 1] - this.heading[k]) * t;
      }
    }
    this.headingRad = h;
  }
}
