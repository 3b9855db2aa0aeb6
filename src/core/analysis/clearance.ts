/**
 * Underbody clearance: the body outline (BodyShape) as a box with a flat underside in three parts
 * (the belly between the axles at bellyClearanceM, the front and rear overhangs at their bumper
 * clearances), plus the axle centre-lines between the wheel centres. The underside is sampled on
 * a grid of points in the body frame, carried by the solved body pose into the terrain frame, and
 * compared with the terrain height under each point. The smallest gap and where it is are kept.
 *
 * Limits of the outline (say so wherever the number is shown): the body is a box, so sills, tanks,
 * steps and approach/departure slopes are not drawn; the axle "housing" is its centre-line only
 * (the outline has no housing depth), so the real gap under a differential is smaller by it.
 */
import type { SolveResult, Vehicle } from '../model/types';
import type { TerrainField } from '../terrain/field';

/** Parts of the underbody, as reported. */
export type UnderbodyPart = 'belly' | 'front' | 'rear' | 'front-axle' | 'rear-axle';
export const UNDERBODY_PARTS: readonly UnderbodyPart[] = ['belly', 'front', 'rear', 'front-axle', 'rear-axle'];

/** Grid density of the underside samples. */
export interface ClearanceGrid {
  /** Points along the belly between the axles (≥ 2). @default 9 */
  readonly bellyAlong: number;
  /** Points along each overhang (≥ 1). @default 3 */
  readonly overhangAlong: number;
  /** Points across the body width (≥ 2). @default 5 */
  readonly across: number;
  /** Points along each axle centre-line between the tyres (≥ 1). @default 5 */
  readonly axleAlong: number;
}

export const DEFAULT_CLEARANCE_GRID: ClearanceGrid = { bellyAlong: 9, overhangAlong: 3, across: 5, axleAlong: 5 };

/** Clearance kept clear of the tyres in plan view, beyond the tread's half width (m). */
const TYRE_PLAN_MARGIN_M = 0.02;

/** The smallest underbody gap at one pose. */
export interface ClearanceResult {
  /** Terrain-frame vertical gap between the underside point and the ground under it (m); ≤ 0 is contact. */
  readonly minM: number;
  /** The underside point with the smallest gap, terrain frame (m). */
  readonly pointWorld: readonly [number, number, number];
  readonly part: UnderbodyPart;
}

/**
 * Underside sample points in the body frame, prepared once per vehicle: flat xyz plus a part
 * index per point. Points inside a tyre's plan-view footprint are left out (that is the wheel
 * well, not the underside).
 */
export class UnderbodySampler {
  readonly pointsBody: Float64Array;
  readonly partOf: Uint8Array;
  readonly count: number;
  private readonly axleSamples: Float64Array;
  /** Smallest gap per part (UNDERBODY_PARTS order) at the last `measure` (m; Infinity for a part with no points). */
  readonly partMinM = new Float64Array(UNDERBODY_PARTS.length);

  constructor(vehicle: Vehicle, grid: ClearanceGrid = DEFAULT_CLEARANCE_GRID) {
    const L = vehicle.wheelbaseM;
    const b = vehicle.body;
    const pts: number[] = [];
    const parts: number[] = [];
    const halfW = b.widthM / 2;
    const inTyre = (x: number, y: number): boolean => {
      for (let a = 0; a < 2; a++) {
        const ax = a === 0 ? L / 2 : -L / 2;
        const tyre = a === 0 ? vehicle.tyreFront : vehicle.tyreRear;
        const t = a === 0 ? vehicle.trackFrontM : vehicle.trackRearM;
        if (Math.abs(x - ax) > tyre.radiusM) continue;
        if (Math.abs(Math.abs(y) - t / 2) <= tyre.widthM / 2 + TYRE_PLAN_MARGIN_M) return true;
      }
      return false;
    };
    const add = (x0: number, x1: number, nx: number, z: number, part: number) => {
      for (let i = 0; i < nx; i++) {
        const x = nx === 1 ? 0.5 * (x0 + x1) : x0 + ((x1 - x0) * i) / (nx - 1);
        for (let j = 0; j < grid.across; j++) {
          const y = -halfW + (2 * halfW * j) / (grid.across - 1);
          if (inTyre(x, y)) continue;
          pts.push(x, y, z);
          parts.push(part);
        }
      }
    };
    add(-L / 2, L / 2, grid.bellyAlong, b.bellyClearanceM, 0);
    if (b.frontOverhangM > 0) add(L / 2 + b.frontOverhangM / grid.overhangAlong, L / 2 + b.frontOverhangM, grid.overhangAlong, b.frontBumperClearanceM, 1);
    if (b.rearOverhangM > 0) add(-L / 2 - b.rearOverhangM, -L / 2 - b.rearOverhangM / grid.overhangAlong, grid.overhangAlong, b.rearBumperClearanceM, 2);
    this.pointsBody = Float64Array.from(pts);
    this.partOf = Uint8Array.from(parts);
    this.count = parts.length;
    // Axle centre-line samples: fractions between the left and right wheel centres, clear of the tyres.
    const n = grid.axleAlong;
    this.axleSamples = new Float64Array(2 * n);
    for (let a = 0; a < 2; a++) {
      const t = a === 0 ? vehicle.trackFrontM : vehicle.trackRearM;
      const w = a === 0 ? vehicle.tyreFront.widthM : vehicle.tyreRear.widthM;
      const edge = Math.min(0.45, (w / 2 + TYRE_PLAN_MARGIN_M) / t);
      for (let k = 0; k < n; k++) this.axleSamples[a * n + k] = n === 1 ? 0.5 : edge + ((1 - 2 * edge) * k) / (n - 1);
    }
  }

  /**
   * Smallest gap for a solved pose. Allocates only the returned object.
   * Precondition: `r` is a result of the model whose vehicle built this sampler, at heading headingRad.
   */
  measure(field: TerrainField, r: SolveResult, poseXM: number, poseYM: number, headingRad: number): ClearanceResult {
    // The body frame as solved (src/core/solver/frame.ts): p_terrain = origin + R · p_body.
    const R = r.body.frame.rotation;
    const oz = r.body.frame.originM[2];
    const P = this.pointsBody;
    let best = Infinity, bx = 0, by = 0, bz = 0, bp = 0;
    const pm = this.partMinM;
    pm.fill(Infinity);
    for (let i = 0; i < this.count; i++) {
      const x = P[3 * i], y = P[3 * i + 1], z = P[3 * i + 2];
      const wx = poseXM + R[0] * x + R[1] * y + R[2] * z;
      const wy = poseYM + R[3] * x + R[4] * y + R[5] * z;
      const wz = oz + R[6] * x + R[7] * y + R[8] * z;
      const gap = wz - field.height(wx, wy);
      const part = this.partOf[i];
      if (gap < pm[part]) pm[part] = gap;
      if (gap < best) {
        best = gap; bx = wx; by = wy; bz = wz; bp = part;
      }
    }
    const n = this.axleSamples.length / 2;
    for (let a = 0; a < 2; a++) {
      const cl = r.wheels[2 * a].centreWorld;
      const cr = r.wheels[2 * a + 1].centreWorld;
      for (let k = 0; k < n; k++) {
        // Fraction measured from the right wheel centre toward the left.
        const f = this.axleSamples[a * n + k];
        const wx = cr[0] + f * (cl[0] - cr[0]);
        const wy = cr[1] + f * (cl[1] - cr[1]);
        const wz = cr[2] + f * (cl[2] - cr[2]);
        const gap = wz - field.height(wx, wy);
        if (gap < pm[3 + a]) pm[3 + a] = gap;
        if (gap < best) {
          best = gap; bx = wx; by = wy; bz = wz; bp = 3 + a;
        }
      }
    }
    return { minM: best, pointWorld: [bx, by, bz], part: UNDERBODY_PARTS[bp] };
  }
}
