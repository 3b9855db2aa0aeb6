import type { Terrain, TerrainFeature } from '../model/types';

/**
 * Horizontal run of a "vertical" face (m). Every feature is made continuous so that the tyre's
 * ray search and the terrain normal are always defined: a vertical face becomes a face this
 * steep (a 0.3 m ledge has a face slope of 150:1, its normal within 0.4° of horizontal).
 */
export const FACE_RUN_M = 0.002;
/** Smallest value of the rock's sqrt term: caps the slope at its rim (a rock sits on the ground). */
const ROCK_RIM_MIN = 1e-3;

const T_PLANE = 0;
const T_STEP = 1;
const T_BLOCK = 2;
const T_ROCK = 3;
const T_RAMP = 4;
const T_PROFILE = 5;
const T_GRID = 6;

/** Parameters per feature in the packed array. */
const STRIDE = 8;

/**
 * Upward edge profile: height at inward distance d from the foot of a face of height h (> 0)
 * whose top edge has radius r. Writes the slope dH/dd to out[1] and returns the height.
 */
function edgeProfile(d: number, h: number, r: number, out: Float64Array): number {
  if (d <= 0) {
    out[1] = 0;
    return 0;
  }
  const rr = r < h ? r : h;
  const faceTop = h - rr;
  if (d < FACE_RUN_M) {
    out[1] = faceTop / FACE_RUN_M;
    return (faceTop * d) / FACE_RUN_M;
  }
  const dc = d - FACE_RUN_M;
  if (dc >= rr) {
    out[1] = 0;
    return h;
  }
  // Quarter circle: centre at (FACE_RUN + rr, h - rr), from the top of the face to the level top.
  const u = rr - dc;
  let s = rr * rr - u * u;
  if (s < 1e-12 * rr * rr) s = 1e-12 * rr * rr;
  const root = Math.sqrt(s);
  let slope = u / root;
  const maxSlope = h / FACE_RUN_M;
  if (slope > maxSlope) slope = maxSlope;
  out[1] = slope;
  return faceTop + root;
}

/**
 * A terrain compiled for fast queries: height and gradient at (x, y) in the terrain frame.
 * Queries allocate nothing. A region query narrows the features to those that can touch a
 * rectangle, so a tyre's hundreds of ray probes only visit the features near it.
 */
export class TerrainField {
  readonly featureCount: number;
  /** The terrain compiled (kept for what the heights alone do not say: an imported grid's filled mask). */
  readonly terrain: Terrain;
  private readonly types: Int32Array;
  private readonly params: Float64Array;
  /** Feature bounds [xmin, xmax, ymin, ymax]; ±Infinity where unbounded. */
  private readonly bounds: Float64Array;
  private readonly data: (Float64Array | null)[];
  private readonly all: Int32Array;
  private readonly scratch = new Float64Array(2);

  constructor(terrain: Terrain) {
    const n = terrain.features.length;
    this.featureCount = n;
    this.terrain = terrain;
    this.types = new Int32Array(n);
    this.params = new Float64Array(n * STRIDE);
    this.bounds = new Float64Array(n * 4);
    this.data = new Array(n).fill(null);
    this.all = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      this.all[i] = i;
      this.compile(i, terrain.features[i]);
    }
  }

  private setBounds(i: number, x0: number, x1: number, y0: number, y1: number): void {
    const b = i * 4;
    this.bounds[b] = x0;
    this.bounds[b + 1] = x1;
    this.bounds[b + 2] = y0;
    this.bounds[b + 3] = y1;
  }

  private compile(i: number, f: TerrainFeature): void {
    const p = i * STRIDE;
    const P = this.params;
    const INF = Infinity;
    switch (f.type) {
      case 'plane':
        this.types[i] = T_PLANE;
        P[p] = Math.tan(f.gradeRad);
        P[p + 1] = Math.tan(f.crossSlopeRad);
        P[p + 2] = f.heightM;
        this.setBounds(i, -INF, INF, -INF, INF);
        break;
      case 'step': {
        this.types[i] = T_STEP;
        const y = f.yRangeM;
        P[p] = f.xM;
        P[p + 1] = f.heightM;
        P[p + 2] = f.edgeRadiusM;
        P[p + 3] = y ? Math.min(y[0], y[1]) : -INF;
        P[p + 4] = y ? Math.max(y[0], y[1]) : INF;
        // A drop (negative height) changes the ground on the near side's edge too.
        const xlo = f.heightM >= 0 ? f.xM : f.xM - FACE_RUN_M - f.edgeRadiusM;
        const pad = f.heightM >= 0 ? 0 : FACE_RUN_M + f.edgeRadiusM;
        this.setBounds(i, xlo, INF, P[p + 3] - pad, P[p + 4] + pad);
        break;
      }
      case 'block': {
        this.types[i] = T_BLOCK;
        const x0 = Math.min(f.xRangeM[0], f.xRangeM[1]);
        const x1 = Math.max(f.xRangeM[0], f.xRangeM[1]);
        const y0 = Math.min(f.yRangeM[0], f.yRangeM[1]);
        const y1 = Math.max(f.yRangeM[0], f.yRangeM[1]);
        P[p] = x0;
        P[p + 1] = x1;
        P[p + 2] = y0;
        P[p + 3] = y1;
        P[p + 4] = f.heightM;
        P[p + 5] = f.edgeRadiusM;
        const pad = f.heightM >= 0 ? 0 : FACE_RUN_M + f.edgeRadiusM;
        this.setBounds(i, x0 - pad, x1 + pad, y0 - pad, y1 + pad);
        break;
      }
      case 'rock':
        this.types[i] = T_ROCK;
        P[p] = f.xM;
        P[p + 1] = f.yM;
        P[p + 2] = f.heightM;
        P[p + 3] = f.radiusM;
        this.setBounds(i, f.xM - f.radiusM, f.xM + f.radiusM, f.yM - f.radiusM, f.yM + f.radiusM);
        break;
      case 'ramp': {
        this.types[i] = T_RAMP;
        const y = f.yRangeM;
        P[p] = f.xM;
        P[p + 1] = Math.tan(f.angleRad);
        P[p + 2] = f.lengthM * Math.cos(f.angleRad);
        P[p + 3] = y ? Math.min(y[0], y[1]) : -INF;
        P[p + 4] = y ? Math.max(y[0], y[1]) : INF;
        this.setBounds(i, f.xM, INF, P[p + 3], P[p + 4]);
        break;
      }
      case 'profile': {
        this.types[i] = T_PROFILE;
        const pts = new Float64Array(f.points.length * 2);
        for (let k = 0; k < f.points.length; k++) {
          pts[2 * k] = f.points[k][0];
          pts[2 * k + 1] = f.points[k][1];
        }
        this.data[i] = pts;
        const a = f.acrossM;
        P[p] = f.axis === 'x' ? 0 : 1;
        P[p + 1] = f.points.length;
        P[p + 2] = a ? Math.min(a[0], a[1]) : -INF;
        P[p + 3] = a ? Math.max(a[0], a[1]) : INF;
        if (f.axis === 'x') this.setBounds(i, -INF, INF, P[p + 2], P[p + 3]);
        else this.setBounds(i, P[p + 2], P[p + 3], -INF, INF);
        break;
      }
      case 'grid': {
        this.types[i] = T_GRID;
        const h = new Float64Array(f.cols * f.rows);
        for (let k = 0; k < h.length; k++) h[k] = f.heightsM[k];
        this.data[i] = h;
        P[p] = f.originM[0];
        P[p + 1] = f.originM[1];
        P[p + 2] = f.spacingM;
        P[p + 3] = f.cols;
        P[p + 4] = f.rows;
        this.setBounds(i, -INF, INF, -INF, INF);
        break;
      }
    }
  }

  /** All features, for queries with no region. */
  get allFeatures(): Int32Array {
    return this.all;
  }

  /**
   * Writes into `list` the indices of features whose footprint meets the rectangle, and returns
   * their count. `list` must hold featureCount entries.
   */
  featuresNear(xmin: number, xmax: number, ymin: number, ymax: number, list: Int32Array): number {
    let n = 0;
    const b = this.bounds;
    for (let i = 0; i < this.featureCount; i++) {
      const o = i * 4;
      if (b[o] <= xmax && b[o + 1] >= xmin && b[o + 2] <= ymax && b[o + 3] >= ymin) list[n++] = i;
    }
    return n;
  }

  /**
   * An upper bound on the terrain height over the rectangle, as a plane: H(x, y) ≤ out[2] +
   * out[0]·x + out[1]·y everywhere in it. Planes enter exactly; every other feature adds its
   * largest height over the rectangle (their heights add, so the sum bounds the total). Lets the
   * tyre skip springs whose tread point lies above all the ground near it without sampling it.
   */
  boundIn(list: Int32Array, count: number, xmin: number, xmax: number, ymin: number, ymax: number, out: Float64Array): void {
    let gx = 0;
    let gy = 0;
    let h = 0;
    const P = this.params;
    for (let li = 0; li < count; li++) {
      const i = list[li];
      const p = i * STRIDE;
      switch (this.types[i]) {
        case T_PLANE:
          gx += P[p];
          gy += P[p + 1];
          h += P[p + 2];
          break;
        case T_STEP:
          h += Math.max(0, P[p + 1]);
          break;
        case T_BLOCK:
          h += Math.max(0, P[p + 4]);
          break;
        case T_ROCK:
          h += Math.max(0, P[p + 2]);
          break;
        case T_RAMP:
          h += Math.max(0, P[p + 1] * P[p + 2]);
          break;
        case T_PROFILE:
          h += this.profileMax(i, xmin, xmax, ymin, ymax);
          break;
        case T_GRID:
          h += this.gridMax(i, xmin, xmax, ymin, ymax);
          break;
      }
    }
    out[0] = gx;
    out[1] = gy;
    out[2] = h;
  }

  /** Largest height of a profile over the rectangle (0 counts: outside a bounded profile it adds 0). */
  private profileMax(i: number, xmin: number, xmax: number, ymin: number, ymax: number): number {
    const pts = this.data[i] as Float64Array;
    const p = i * STRIDE;
    const alongX = this.params[p] === 0;
    const lo = alongX ? xmin : ymin;
    const hi = alongX ? xmax : ymax;
    const np = this.params[p + 1];
    let m = 0;
    // Ends are held level beyond the points; the segment ends inside [lo, hi] and the values at lo
    // and hi bound a piecewise-linear profile.
    for (let k = 0; k < np; k++) {
      const sk = pts[2 * k];
      if (sk >= lo && sk <= hi && pts[2 * k + 1] > m) m = pts[2 * k + 1];
    }
    const at = (v: number): number => {
      if (v <= pts[0]) return pts[1];
      if (v >= pts[2 * (np - 1)]) return pts[2 * (np - 1) + 1];
      let a = 0;
      let b = np - 1;
      while (b - a > 1) {
        const mid = (a + b) >> 1;
        if (pts[2 * mid] <= v) a = mid;
        else b = mid;
      }
      const t = (v - pts[2 * a]) / (pts[2 * b] - pts[2 * a] || 1);
      return pts[2 * a + 1] + t * (pts[2 * b + 1] - pts[2 * a + 1]);
    };
    return Math.max(m, at(lo), at(hi));
  }

  /** Grid cells read at most for a local maximum; beyond it the whole grid's maximum is used. */
  private static readonly GRID_LOCAL_CELLS = 1024;

  /** Largest height of a grid over the rectangle (its nodes there and the edge values held outside). */
  private gridMax(i: number, xmin: number, xmax: number, ymin: number, ymax: number): number {
    const p = i * STRIDE;
    const P = this.params;
    const sp = P[p + 2];
    const cols = P[p + 3];
    const rows = P[p + 4];
    const c0 = Math.max(0, Math.min(cols - 1, Math.floor((xmin - P[p]) / sp)));
    const c1 = Math.max(0, Math.min(cols - 1, Math.ceil((xmax - P[p]) / sp)));
    const r0 = Math.max(0, Math.min(rows - 1, Math.floor((ymin - P[p + 1]) / sp)));
    const r1 = Math.max(0, Math.min(rows - 1, Math.ceil((ymax - P[p + 1]) / sp)));
    if ((c1 - c0 + 1) * (r1 - r0 + 1) > TerrainField.GRID_LOCAL_CELLS) return this.maxData(i);
    const hs = this.data[i] as Float64Array;
    let m = -Infinity;
    for (let r = r0; r <= r1; r++) {
      for (let c = c0; c <= c1; c++) {
        const v = hs[r * cols + c];
        if (v > m) m = v;
      }
    }
    return m;
  }

  private readonly dataMax = new Map<number, number>();

  /** Largest height of a grid, computed once. */
  private maxData(i: number): number {
    let m = this.dataMax.get(i);
    if (m === undefined) {
      const d = this.data[i] as Float64Array;
      m = -Infinity;
      for (let k = 0; k < d.length; k++) if (d[k] > m) m = d[k];
      this.dataMax.set(i, m);
    }
    return m;
  }

  /** Height at (x, y) in m. */
  height(x: number, y: number): number {
    return this.sampleIn(this.all, this.featureCount, x, y, null);
  }

  /** Height and gradient: writes [∂H/∂x, ∂H/∂y] into grad and returns H. */
  sample(x: number, y: number, grad: Float64Array): number {
    return this.sampleIn(this.all, this.featureCount, x, y, grad);
  }

  /**
   * Height at (x, y) summed over the listed features; when grad is given, writes the gradient
   * [∂H/∂x, ∂H/∂y] into grad[0], grad[1].
   */
  sampleIn(list: Int32Array, count: number, x: number, y: number, grad: Float64Array | null): number {
    let h = 0;
    let gx = 0;
    let gy = 0;
    const P = this.params;
    const s = this.scratch;
    for (let li = 0; li < count; li++) {
      const i = list[li];
      const p = i * STRIDE;
      switch (this.types[i]) {
        case T_PLANE:
          h += P[p + 2] + x * P[p] + y * P[p + 1];
          gx += P[p];
          gy += P[p + 1];
          break;
        case T_STEP:
        case T_BLOCK: {
          // Signed inward distance to the footprint's boundary and its gradient.
          let d: number;
          let ddx: number;
          let ddy: number;
          let height: number;
          let radius: number;
          if (this.types[i] === T_STEP) {
            d = x - P[p];
            ddx = 1;
            ddy = 0;
            const dy0 = y - P[p + 3];
            if (dy0 < d) {
              d = dy0;
              ddx = 0;
              ddy = 1;
            }
            const dy1 = P[p + 4] - y;
            if (dy1 < d) {
              d = dy1;
              ddx = 0;
              ddy = -1;
            }
            height = P[p + 1];
            radius = P[p + 2];
          } else {
            d = x - P[p];
            ddx = 1;
            ddy = 0;
            const dx1 = P[p + 1] - x;
            if (dx1 < d) {
              d = dx1;
              ddx = -1;
            }
            const dy0 = y - P[p + 2];
            if (dy0 < d) {
              d = dy0;
              ddx = 0;
              ddy = 1;
            }
            const dy1 = P[p + 3] - y;
            if (dy1 < d) {
              d = dy1;
              ddx = 0;
              ddy = -1;
            }
            height = P[p + 4];
            radius = P[p + 5];
          }
          if (height >= 0) {
            h += edgeProfile(d, height, radius, s);
            gx += s[1] * ddx;
            gy += s[1] * ddy;
          } else {
            // A drop or pit: the rounded edge is on the upper (outer) side.
            h += height + edgeProfile(-d, -height, radius, s);
            gx -= s[1] * ddx;
            gy -= s[1] * ddy;
          }
          break;
        }
        case T_ROCK: {
          const dx = x - P[p];
          const dy = y - P[p + 1];
          const r = P[p + 3];
          const u = 1 - (dx * dx + dy * dy) / (r * r);
          if (u > 0) {
            let root = Math.sqrt(u);
            h += P[p + 2] * root;
            if (root < ROCK_RIM_MIN) root = ROCK_RIM_MIN;
            const k = -P[p + 2] / (r * r * root);
            gx += k * dx;
            gy += k * dy;
          }
          break;
        }
        case T_RAMP: {
          const u = x - P[p];
          if (u <= 0) break;
          const run = P[p + 2];
          let hx: number;
          let hxd: number;
          if (u < run) {
            hx = u * P[p + 1];
            hxd = P[p + 1];
          } else {
            hx = run * P[p + 1];
            hxd = 0;
          }
          const w = wall(y, P[p + 3], P[p + 4], s);
          h += hx * w;
          gx += hxd * w;
          gy += hx * s[1];
          break;
        }
        case T_PROFILE: {
          const pts = this.data[i] as Float64Array;
          const alongX = P[p] === 0;
          const sAlong = alongX ? x : y;
          const across = alongX ? y : x;
          const np = P[p + 1];
          let z: number;
          let dz: number;
          if (sAlong <= pts[0]) {
            z = pts[1];
            dz = 0;
          } else if (sAlong >= pts[2 * (np - 1)]) {
            z = pts[2 * (np - 1) + 1];
            dz = 0;
          } else {
            let lo = 0;
            let hi = np - 1;
            while (hi - lo > 1) {
              const mid = (lo + hi) >> 1;
              if (pts[2 * mid] <= sAlong) lo = mid;
              else hi = mid;
            }
            const s0 = pts[2 * lo];
            const z0 = pts[2 * lo + 1];
            const ds = pts[2 * hi] - s0;
            dz = ds > 0 ? (pts[2 * hi + 1] - z0) / ds : 0;
            z = z0 + dz * (sAlong - s0);
          }
          const w = wall(across, P[p + 2], P[p + 3], s);
          h += z * w;
          if (alongX) {
            gx += dz * w;
            gy += z * s[1];
          } else {
            gy += dz * w;
            gx += z * s[1];
          }
          break;
        }
        case T_GRID: {
          const hs = this.data[i] as Float64Array;
          const sp = P[p + 2];
          const cols = P[p + 3];
          const rows = P[p + 4];
          let fx = (x - P[p]) / sp;
          let fy = (y - P[p + 1]) / sp;
          let inX = true;
          let inY = true;
          if (fx <= 0) {
            fx = 0;
            inX = false;
          } else if (fx >= cols - 1) {
            fx = cols - 1;
            inX = false;
          }
          if (fy <= 0) {
            fy = 0;
            inY = false;
          } else if (fy >= rows - 1) {
            fy = rows - 1;
            inY = false;
          }
          let c0 = Math.floor(fx);
          let r0 = Math.floor(fy);
          if (c0 > cols - 2) c0 = cols - 2;
          if (r0 > rows - 2) r0 = rows - 2;
          if (c0 < 0) c0 = 0;
          if (r0 < 0) r0 = 0;
          const tx = cols > 1 ? fx - c0 : 0;
          const ty = rows > 1 ? fy - r0 : 0;
          const c1 = cols > 1 ? c0 + 1 : c0;
          const r1 = rows > 1 ? r0 + 1 : r0;
          const h00 = hs[r0 * cols + c0];
          const h10 = hs[r0 * cols + c1];
          const h01 = hs[r1 * cols + c0];
          const h11 = hs[r1 * cols + c1];
          const a0 = h00 + (h10 - h00) * tx;
          const a1 = h01 + (h11 - h01) * tx;
          h += a0 + (a1 - a0) * ty;
          if (inX) gx += ((h10 - h00) * (1 - ty) + (h11 - h01) * ty) / sp;
          if (inY) gy += (a1 - a0) / sp;
          break;
        }
      }
    }
    if (grad) {
      grad[0] = gx;
      grad[1] = gy;
    }
    return h;
  }
}

/** Side walls of a bounded feature: 0 outside [lo, hi], 1 inside, a FACE_RUN_M ramp between. Slope to out[1]. */
function wall(v: number, lo: number, hi: number, out: Float64Array): number {
  const d0 = v - lo;
  const d1 = hi - v;
  if (d0 <= 0 || d1 <= 0) {
    out[1] = 0;
    return 0;
  }
  if (d0 < FACE_RUN_M && d0 <= d1) {
    out[1] = 1 / FACE_RUN_M;
    return d0 / FACE_RUN_M;
  }
  if (d1 < FACE_RUN_M) {
    out[1] = -1 / FACE_RUN_M;
    return d1 / FACE_RUN_M;
  }
  out[1] = 0;
  return 1;
}
