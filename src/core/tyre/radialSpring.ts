/**
 * Radial-spring, terrain-enveloping tyre (Davis, "A radial-spring terrain-enveloping tire model",
 * Vehicle System Dynamics 4(1), 1975).
 *
 * Each tyre is cut into slices across its width; each slice is a fan of radial springs from the
 * slice centre (on the wheel axis) to the tread circle. A spring compresses by how far the
 * terrain intrudes along its ray, so every spring force points at the slice centre and the
 * resultant passes through it: on a step edge the force tilts back toward the wheel centre,
 * and a narrow rock is enveloped by the few springs that reach it.
 *
 * The fan is laid out relative to the terrain's down direction projected into the wheel plane
 * (the tyre is axisymmetric, so wheel spin does not matter), from -fanHalfAngle (behind) to
 * +fanHalfAngle (ahead). Slices sit at the tread edges and between them with trapezoid weights,
 * so a rigid wide tyre pivots on its outer tread edge.
 */
import type { TyreModelOptions } from '../model/types';
import type { TerrainField } from '../terrain/field';

export const DEFAULT_TYRE_MODEL: TyreModelOptions = {
  slices: 3,
  springSpacingRad: (2.5 * Math.PI) / 180,
  fanHalfAngleRad: Math.PI / 2,
};

/** Ray searches stop when the bracket is this narrow (m). */
const RAY_TOLERANCE_M = 1e-10;
const RAY_MAX_ITERATIONS = 40;
/** Grazing rays: |m·e| is kept at least this fraction of |m| in the stiffness, so it stays bounded. */
const GRAZING_MIN = 0.05;

/** Geometry of the spring layout, shared by the tyres of one vehicle. */
export interface TyreLayout {
  readonly slices: number;
  /** Slice offsets along the wheel axis from the wheel centre, as fractions of the width (−½ … ½). */
  readonly sliceFraction: Float64Array;
  /** Slice weights, summing to 1. */
  readonly sliceWeight: Float64Array;
  readonly rays: number;
  /** Angle between neighbouring springs (rad); spring k is at ψ = (k − (rays − 1)/2)·psiStepRad. */
  readonly psiStepRad: number;
  readonly raySin: Float64Array;
  readonly rayCos: Float64Array;
}

export function makeTyreLayout(opts: TyreModelOptions = DEFAULT_TYRE_MODEL): TyreLayout {
  const ns = Math.max(1, Math.floor(opts.slices));
  const sliceFraction = new Float64Array(ns);
  const sliceWeight = new Float64Array(ns);
  if (ns === 1) {
    sliceFraction[0] = 0;
    sliceWeight[0] = 1;
  } else {
    for (let j = 0; j < ns; j++) {
      sliceFraction[j] = -0.5 + j / (ns - 1);
      sliceWeight[j] = j === 0 || j === ns - 1 ? 0.5 : 1;
    }
    let sum = 0;
    for (let j = 0; j < ns; j++) sum += sliceWeight[j];
    for (let j = 0; j < ns; j++) sliceWeight[j] /= sum;
  }
  const half = Math.max(0, opts.fanHalfAngleRad);
  const perSide = Math.max(1, Math.round(half / opts.springSpacingRad));
  const rays = 2 * perSide + 1;
  const raySin = new Float64Array(rays);
  const rayCos = new Float64Array(rays);
  for (let k = 0; k < rays; k++) {
    const psi = ((k - perSide) / perSide) * half;
    raySin[k] = Math.sin(psi);
    rayCos[k] = Math.cos(psi);
  }
  return { slices: ns, sliceFraction, sliceWeight, rays, psiStepRad: half / perSide, raySin, rayCos };
}

/**
 * Springs are not point springs: the compression is interpolated linearly between neighbouring
 * springs around the tread and integrated (hat functions), so a tyre meeting the ground loads up
 * smoothly from zero (force ∝ δ² at first touch, ∝ δ^1.5 once several springs bear, as for a
 * continuous tread) instead of in steps when single springs touch. That keeps the equilibrium
 * equations smooth enough for Newton's method across contact changes. Each spring's weight is
 * the integral of max(0, δ(ψ)) times its hat function over its two neighbouring intervals.
 */

/**
 * An interval compressed at one end only: P > 0 at the `near` spring, Q ≤ 0 at the `far` one, so
 * the compression falls to zero at t0 = P / (P − Q) of the way. Writes both weights and their
 * derivatives by P and Q into the given slots of out.
 */
function partialInterval(
  P: number,
  Q: number,
  out: Float64Array,
  near: number,
  far: number,
  nearByP: number,
  nearByQ: number,
  farByP: number,
  farByQ: number,
): void {
  const D = P - Q;
  const t0 = P / D;
  const tP = -Q / (D * D);
  const tQ = P / (D * D);
  out[near] = P * (t0 / 2 - (t0 * t0) / 6);
  out[far] = (P * t0 * t0) / 6;
  const dNear = P * (0.5 - t0 / 3);
  const dFar = (P * t0) / 3;
  out[nearByP] = t0 / 2 - (t0 * t0) / 6 + dNear * tP;
  out[nearByQ] = dNear * tQ;
  out[farByP] = (t0 * t0) / 6 + dFar * tP;
  out[farByQ] = dFar * tQ;
}

/** Adds segment [k, k+1] with compressions A, B to the spring weights (per unit interval). */
function segmentWeights(A: number, B: number, out: Float64Array): void {
  // out: [c_k, c_k1, dck/dA, dck/dB, dck1/dA, dck1/dB]
  if (A >= 0 && B >= 0) {
    out[0] = A / 3 + B / 6;
    out[1] = A / 6 + B / 3;
    out[2] = 1 / 3;
    out[3] = 1 / 6;
    out[4] = 1 / 6;
    out[5] = 1 / 3;
  } else if (A > 0) {
    partialInterval(A, B, out, 0, 1, 2, 3, 4, 5);
  } else if (B > 0) {
    // The mirror image: the compressed end is k + 1.
    partialInterval(B, A, out, 1, 0, 5, 4, 3, 2);
  } else {
    out[0] = out[1] = out[2] = out[3] = out[4] = out[5] = 0;
  }
}

const _seg = new Float64Array(6);

/**
 * Vertical force per unit spring rate of an upright tyre pressed δ into flat ground: the springs'
 * compressions along their rays, d_k = R − (R − δ)/cos ψ_k, integrated as above, times cos ψ_k.
 */
export function flatForcePerRate(layout: TyreLayout, radiusM: number, deflectionM: number): number {
  const H = radiusM - deflectionM;
  let f = 0;
  let prev = radiusM - H / layout.rayCos[0];
  for (let k = 0; k + 1 < layout.rays; k++) {
    const next = radiusM - H / layout.rayCos[k + 1];
    segmentWeights(prev, next, _seg);
    f += _seg[0] * layout.rayCos[k] + _seg[1] * layout.rayCos[k + 1];
    prev = next;
  }
  return f;
}

export interface TyreCalibration {
  /** Rate of one radial spring summed over the slices (N/m); slice j's springs have rayRate·weight_j. */
  readonly rayRateNPerM: number;
  /** Deflection at the calibration load on flat ground (m). */
  readonly staticDeflectionM: number;
}

/**
 * Spring rate such that on flat ground the tyre carries staticLoadN and its vertical stiffness
 * there equals stiffnessNPerM. The ray model's force grows about as δ^1.5 (derived: the number of
 * springs in contact grows as √δ), so the stiffness is a local secant over ±10 % of δ, which
 * smooths the steps where single springs enter contact.
 */
export function calibrateTyre(
  layout: TyreLayout,
  radiusM: number,
  staticLoadN: number,
  stiffnessNPerM: number,
): TyreCalibration {
  const target = stiffnessNPerM / Math.max(staticLoadN, 1e-9);
  const ratio = (d: number): number => {
    const f = flatForcePerRate(layout, radiusM, d);
    const k = (flatForcePerRate(layout, radiusM, 1.1 * d) - flatForcePerRate(layout, radiusM, 0.9 * d)) / (0.2 * d);
    return k / f;
  };
  // ratio(δ) falls roughly as 1.5/δ: bisect on log δ.
  let lo = 1e-9 * radiusM;
  let hi = 0.9 * radiusM;
  for (let it = 0; it < 200 && hi / lo > 1 + 1e-12; it++) {
    const mid = Math.sqrt(lo * hi);
    if (ratio(mid) > target) lo = mid;
    else hi = mid;
  }
  const d = Math.sqrt(lo * hi);
  return { rayRateNPerM: staticLoadN / flatForcePerRate(layout, radiusM, d), staticDeflectionM: d };
}

/**
 * Per-slice contact state of one tyre, filled by evaluateTyre and read by the solver. Slice j's
 * values sit at [3j…3j+2] (vectors) or [9j…9j+8] (3×3 row-major stiffness).
 */
export class TyreContact {
  readonly slices: number;
  /** Resultant of slice j's springs, acting on the wheel at the slice centre (N), terrain frame. */
  readonly force: Float64Array;
  /** Slice centre on the wheel axis (m). */
  readonly centre: Float64Array;
  /** Centre of pressure of slice j on the terrain (m). */
  readonly point: Float64Array;
  /** ∂force/∂centre for a translation of the slice (N/m). */
  readonly stiffness: Float64Array;
  /**
   * ∂force/∂ω for a small turn ω of the spring fan about the slice centre through the change in
   * the springs' compressions (N/rad); the turn of the force's direction itself (ω × F) is not in it.
   */
  readonly turnStiffness: Float64Array;
  /** Load-weighted mean spring compression of the slice (m). */
  readonly deflection: Float64Array;
  /** Unit ground normal under the slice: the compression-weighted mean of the normals where its springs touch. */
  readonly normal: Float64Array;
  /** Number of slices with any spring in contact. */
  loadedSlices = 0;

  constructor(slices: number) {
    this.slices = slices;
    this.force = new Float64Array(3 * slices);
    this.centre = new Float64Array(3 * slices);
    this.point = new Float64Array(3 * slices);
    this.stiffness = new Float64Array(9 * slices);
    this.turnStiffness = new Float64Array(9 * slices);
    this.deflection = new Float64Array(slices);
    this.normal = new Float64Array(3 * slices);
  }
}

const _grad = new Float64Array(2);
const _bound = new Float64Array(3);
/** Per-spring scratch for one slice: compression, its gradient, ground point and normal. */
let _rayD = new Float64Array(0);
let _rayG = new Float64Array(0);
let _rayHit = new Float64Array(0);
let _rayN = new Float64Array(0);
/** Ray directions of the current wheel's fan (shared by its slices) and each ray's turn vector ρ (e × G). */
let _rayE = new Float64Array(0);
let _rayT = new Float64Array(0);
/** Whether ray r's tread point lies at or below the ground bound plane (so the ray may touch). */
function tipUnderBound(E: Float64Array, r: number, sx: number, sy: number, sz: number, R: number, bh: number, bgx: number, bgy: number): boolean {
  return sz + R * E[3 * r + 2] <= bh + bgx * (sx + R * E[3 * r]) + bgy * (sy + R * E[3 * r + 1]);
}

function ensureRayScratch(rays: number): void {
  if (_rayD.length >= rays) return;
  _rayD = new Float64Array(rays);
  _rayG = new Float64Array(3 * rays);
  _rayHit = new Float64Array(3 * rays);
  _rayN = new Float64Array(3 * rays);
  _rayE = new Float64Array(3 * rays);
  _rayT = new Float64Array(3 * rays);
}

/**
 * Evaluates one tyre at wheel centre (cx, cy, cz) with unit axis (ax, ay, az), both in the
 * terrain frame. `features`/`featureCount` narrow the terrain to what lies under the tyre.
 */
export function evaluateTyre(
  field: TerrainField,
  features: Int32Array,
  featureCount: number,
  layout: TyreLayout,
  radiusM: number,
  widthM: number,
  rayRateNPerM: number,
  cx: number,
  cy: number,
  cz: number,
  ax: number,
  ay: number,
  az: number,
  out: TyreContact,
): void {
  // Fan frame: u = terrain up projected into the wheel plane, f = a × u (forward in the wheel plane).
  let ux = -az * ax;
  let uy = -az * ay;
  let uz = 1 - az * az;
  let un = Math.sqrt(ux * ux + uy * uy + uz * uz);
  if (un < 1e-9) {
    // Degenerate: the wheel lies flat (axis along terrain up). Use terrain x as the fan's up; the
    // springs then point sideways and the tyre carries nothing, which is the honest answer.
    ux = 1;
    uy = 0;
    uz = 0;
    un = 1;
  }
  ux /= un;
  uy /= un;
  uz /= un;
  const fx = ay * uz - az * uy;
  const fy = az * ux - ax * uz;
  const fz = ax * uy - ay * ux;

  const force = out.force;
  const centre = out.centre;
  const point = out.point;
  const K = out.stiffness;
  const defl = out.deflection;
  const R = radiusM;
  let loaded = 0;
  // Springs whose tread point is above every bit of ground near the tyre cannot touch: skip them.
  const reach = R + widthM;
  field.boundIn(features, featureCount, cx - reach, cx + reach, cy - reach, cy + reach, _bound);
  const bgx = _bound[0];
  const bgy = _bound[1];
  const bh = _bound[2];

  ensureRayScratch(layout.rays);
  const E = _rayE;
  const TV = _rayT;
  for (let k = 0; k < layout.rays; k++) {
    const sn = layout.raySin[k];
    const cs = layout.rayCos[k];
    E[3 * k] = sn * fx - cs * ux;
    E[3 * k + 1] = sn * fy - cs * uy;
    E[3 * k + 2] = sn * fz - cs * uz;
  }
  const D = _rayD;
  const G = _rayG;
  const Hp = _rayHit;
  const Nm = _rayN;
  for (let j = 0; j < layout.slices; j++) {
    const off = layout.sliceFraction[j] * widthM;
    const rate = rayRateNPerM * layout.sliceWeight[j];
    const sx = cx + off * ax;
    const sy = cy + off * ay;
    const sz = cz + off * az;
    centre[3 * j] = sx;
    centre[3 * j + 1] = sy;
    centre[3 * j + 2] = sz;
    // Height of the slice centre above the ground below it: g(0) of every ray's search.
    const f0 = sz - field.sampleIn(features, featureCount, sx, sy, null);

    // Pass 1: each spring's signed compression d_k along its ray (negative: the gap, estimated from
    // the tread point), its gradient ∂d_k/∂c = m / (m·e) and where it meets the ground.
    let kFirst = -1;
    let kLast = -2;
    const rays = layout.rays;
    // The tread point's height above the bound plane, C − M cos(ψ − ψ*), is a sinusoid in ψ: the
    // springs that may touch form one arc around ψ*. Only that arc and one spring either side are
    // visited (the rest cannot touch and bear nothing).
    const nbx = -bgx;
    const nby = -bgy;
    const nbn = Math.sqrt(nbx * nbx + nby * nby + 1);
    const Cq = (sz - bh - bgx * sx - bgy * sy) / nbn;
    const Aq = (fx * nbx + fy * nby + fz) / nbn;
    const Bq = (ux * nbx + uy * nby + uz) / nbn;
    const Mq = R * Math.sqrt(Aq * Aq + Bq * Bq);
    let kBegin = 0;
    let kEnd = -1;
    if (Cq <= Mq) {
      const psiStar = Math.atan2(-Aq, Bq);
      const halfArc = Math.acos(Math.max(-1, Cq / Mq));
      const mid = (rays - 1) / 2;
      kBegin = Math.max(0, Math.floor((psiStar - halfArc) / layout.psiStepRad + mid) - 1);
      kEnd = Math.min(rays - 1, Math.ceil((psiStar + halfArc) / layout.psiStepRad + mid) + 1);
    }
    for (let k = kBegin - 1 >= 0 ? kBegin - 1 : 0; k < kBegin; k++) D[k] = -R;
    if (kEnd < kBegin) {
      for (let k = 0; k < rays; k++) D[k] = -R;
    }
    for (let k = kEnd + 1; k < rays && k <= kEnd + 1; k++) D[k] = -R;
    for (let k = kBegin; k <= kEnd; k++) {
      const ez = E[3 * k + 2];
      const tipZ = sz + R * ez;
      // Height of the ground bound (a plane over the tyre's neighbourhood) under this tread point.
      const groundMax = bh + bgx * (sx + R * E[3 * k]) + bgy * (sy + R * E[3 * k + 1]);
      if (tipZ > groundMax) {
        // Above all the ground near the tyre. Only a neighbour of a spring that may touch needs
        // its gap (for the interval between them); the rest are left out altogether.
        const nearLow =
          (k > 0 && tipUnderBound(E, k - 1, sx, sy, sz, R, bh, bgx, bgy)) ||
          (k + 1 < rays && tipUnderBound(E, k + 1, sx, sy, sz, R, bh, bgx, bgy));
        G[3 * k] = 0;
        G[3 * k + 1] = 0;
        if (!nearLow) {
          D[k] = -R;
          G[3 * k + 2] = 0;
          Nm[3 * k + 2] = 0;
          continue;
        }
        // The gap along the ray down to the bound plane (exact for a plane), with that plane's
        // normal m = (−bgx, −bgy, 1): d = (tip − ground) / (m·e), ∂d/∂c = m / (m·e).
        const mn = Math.sqrt(bgx * bgx + bgy * bgy + 1);
        let me = -bgx * E[3 * k] - bgy * E[3 * k + 1] + ez;
        if (me > -GRAZING_MIN * mn) me = -GRAZING_MIN * mn;
        D[k] = (tipZ - groundMax) / me;
        G[3 * k] = -bgx / me;
        G[3 * k + 1] = -bgy / me;
        G[3 * k + 2] = 1 / me;
        Hp[3 * k] = sx + R * E[3 * k];
        Hp[3 * k + 1] = sy + R * E[3 * k + 1];
        Hp[3 * k + 2] = tipZ;
        Nm[3 * k] = -bgx / mn;
        Nm[3 * k + 1] = -bgy / mn;
        Nm[3 * k + 2] = 1 / mn;
        continue;
      }
      const ex = E[3 * k];
      const ey = E[3 * k + 1];
      G[3 * k] = 0;
      G[3 * k + 1] = 0;
      G[3 * k + 2] = 0;
      const gR = tipZ - field.sampleIn(features, featureCount, sx + R * ex, sy + R * ey, _grad);
      let mx = -_grad[0];
      let my = -_grad[1];
      if (gR >= 0) {
        // Not touching: gap along the ray from the slope of g at the tread point.
        const mn = Math.sqrt(mx * mx + my * my + 1);
        let me = mx * ex + my * ey + ez;
        if (me > -GRAZING_MIN * mn) me = -GRAZING_MIN * mn;
        D[k] = gR / me;
        const c = 1 / me;
        G[3 * k] = c * mx;
        G[3 * k + 1] = c * my;
        G[3 * k + 2] = c;
        Hp[3 * k] = sx + R * ex;
        Hp[3 * k + 1] = sy + R * ey;
        Hp[3 * k + 2] = tipZ;
        Nm[3 * k] = mx / mn;
        Nm[3 * k + 1] = my / mn;
        Nm[3 * k + 2] = 1 / mn;
        continue;
      }
      let rho: number;
      if (f0 <= 0) {
        // The slice centre itself is under the ground (a wheel sunk in a hole): full compression.
        rho = 0;
        field.sampleIn(features, featureCount, sx, sy, _grad);
        mx = -_grad[0];
        my = -_grad[1];
      } else {
        let lo = 0;
        let hi = R;
        rho = R;
        let g = gR;
        let dg = ez - _grad[0] * ex - _grad[1] * ey;
        for (let it = 0; it < RAY_MAX_ITERATIONS; it++) {
          // Newton step from the current point when it stays inside the bracket, else bisection.
          let next = dg < 0 ? rho - g / dg : NaN;
          if (!(next > lo && next < hi)) next = 0.5 * (lo + hi);
          rho = next;
          g = sz + rho * ez - field.sampleIn(features, featureCount, sx + rho * ex, sy + rho * ey, _grad);
          dg = ez - _grad[0] * ex - _grad[1] * ey;
          if (g > 0) lo = rho;
          else hi = rho;
          if (Math.abs(g) < 1e-12 || hi - lo < RAY_TOLERANCE_M) break;
        }
        mx = -_grad[0];
        my = -_grad[1];
      }
      D[k] = R - rho;
      if (kFirst < 0) kFirst = k;
      kLast = k;
      // dδ/dc = m / (m·e) with m = (−Hx, −Hy, 1) the unnormalised ground normal at the hit.
      const mn = Math.sqrt(mx * mx + my * my + 1);
      let me = mx * ex + my * ey + ez;
      if (me > -GRAZING_MIN * mn) me = -GRAZING_MIN * mn;
      const c = 1 / me;
      G[3 * k] = c * mx;
      G[3 * k + 1] = c * my;
      G[3 * k + 2] = c;
      Hp[3 * k] = sx + rho * ex;
      Hp[3 * k + 1] = sy + rho * ey;
      Hp[3 * k + 2] = sz + rho * ez;
      Nm[3 * k] = mx / mn;
      Nm[3 * k + 1] = my / mn;
      Nm[3 * k + 2] = 1 / mn;
    }

    let Fx = 0;
    let Fy = 0;
    let Fz = 0;
    let k00 = 0, k01 = 0, k02 = 0, k10 = 0, k11 = 0, k12 = 0, k20 = 0, k21 = 0, k22 = 0;
    let r00 = 0, r01 = 0, r02 = 0, r10 = 0, r11 = 0, r12 = 0, r20 = 0, r21 = 0, r22 = 0;
    let px = 0;
    let py = 0;
    let pz = 0;
    let wsum = 0;
    let dsum = 0;
    let nxs = 0;
    let nys = 0;
    let nzs = 0;
    // Pass 2: integrate the compressions over the tread (segment by segment) into the slice's
    // force, its stiffness, the centre of pressure and the mean ground normal.
    // Turn vectors ρ_k (e_k × G_k) of the rays that can bear: the contact range and one either side.
    const kLo = kFirst > 0 ? kFirst - 1 : 0;
    const kHi = kLast + 1 < layout.rays ? kLast + 1 : layout.rays - 1;
    for (let k = kLo; k <= kHi && kFirst >= 0; k++) {
      const ex = E[3 * k], ey = E[3 * k + 1], ez = E[3 * k + 2];
      const gx = G[3 * k], gy = G[3 * k + 1], gz = G[3 * k + 2];
      const rho = R - D[k];
      TV[3 * k] = rho * (ey * gz - ez * gy);
      TV[3 * k + 1] = rho * (ez * gx - ex * gz);
      TV[3 * k + 2] = rho * (ex * gy - ey * gx);
    }
    if (kFirst >= 0) {
      for (let k = kLo; k < kHi; k++) {
        const A = D[k];
        const B = D[k + 1];
        if (A <= 0 && B <= 0) continue;
        segmentWeights(A, B, _seg);
        for (let side = 0; side < 2; side++) {
          const r = k + side;
          const w = _seg[side];
          const dA = _seg[2 + 2 * side];
          const dB = _seg[3 + 2 * side];
          const ex = E[3 * r];
          const ey = E[3 * r + 1];
          const ez = E[3 * r + 2];
          const fk = rate * w;
          Fx -= fk * ex;
          Fy -= fk * ey;
          Fz -= fk * ez;
          // ∂w/∂c = dA·G_k + dB·G_{k+1}; K += −rate · e (∂w/∂c)ᵀ.
          const vx = dA * G[3 * k] + dB * G[3 * k + 3];
          const vy = dA * G[3 * k + 1] + dB * G[3 * k + 4];
          const vz = dA * G[3 * k + 2] + dB * G[3 * k + 5];
          k00 -= rate * ex * vx;
          k01 -= rate * ex * vy;
          k02 -= rate * ex * vz;
          k10 -= rate * ey * vx;
          k11 -= rate * ey * vy;
          k12 -= rate * ey * vz;
          k20 -= rate * ez * vx;
          k21 -= rate * ez * vy;
          k22 -= rate * ez * vz;
          // Turning the fan by ω moves each ray: ∂d_b/∂ω = ρ_b (e_b × G_b).
          const tx = dA * TV[3 * k] + dB * TV[3 * k + 3];
          const ty = dA * TV[3 * k + 1] + dB * TV[3 * k + 4];
          const tz = dA * TV[3 * k + 2] + dB * TV[3 * k + 5];
          r00 -= rate * ex * tx;
          r01 -= rate * ex * ty;
          r02 -= rate * ex * tz;
          r10 -= rate * ey * tx;
          r11 -= rate * ey * ty;
          r12 -= rate * ey * tz;
          r20 -= rate * ez * tx;
          r21 -= rate * ez * ty;
          r22 -= rate * ez * tz;
          if (w > 0) {
            // A spring with no ground under its own ray (a partial interval) bears at its tread point.
            const hx = D[r] > 0 || G[3 * r + 2] !== 0 ? Hp[3 * r] : sx + R * ex;
            const hy = D[r] > 0 || G[3 * r + 2] !== 0 ? Hp[3 * r + 1] : sy + R * ey;
            const hz = D[r] > 0 || G[3 * r + 2] !== 0 ? Hp[3 * r + 2] : sz + R * ez;
            px += w * hx;
            py += w * hy;
            pz += w * hz;
            wsum += w;
            dsum += w * (D[r] > 0 ? D[r] : 0);
            if (G[3 * r + 2] !== 0) {
              nxs += w * Nm[3 * r];
              nys += w * Nm[3 * r + 1];
              nzs += w * Nm[3 * r + 2];
            }
          }
        }
      }
    }
    force[3 * j] = Fx;
    force[3 * j + 1] = Fy;
    force[3 * j + 2] = Fz;
    const kb = 9 * j;
    K[kb] = k00;
    K[kb + 1] = k01;
    K[kb + 2] = k02;
    K[kb + 3] = k10;
    K[kb + 4] = k11;
    K[kb + 5] = k12;
    K[kb + 6] = k20;
    K[kb + 7] = k21;
    K[kb + 8] = k22;
    const T = out.turnStiffness;
    T[kb] = r00;
    T[kb + 1] = r01;
    T[kb + 2] = r02;
    T[kb + 3] = r10;
    T[kb + 4] = r11;
    T[kb + 5] = r12;
    T[kb + 6] = r20;
    T[kb + 7] = r21;
    T[kb + 8] = r22;
    if (wsum > 0) {
      point[3 * j] = px / wsum;
      point[3 * j + 1] = py / wsum;
      point[3 * j + 2] = pz / wsum;
      defl[j] = dsum / wsum;
      let nl = Math.sqrt(nxs * nxs + nys * nys + nzs * nzs);
      if (!(nl > 0)) {
        nxs = 0;
        nys = 0;
        nzs = 1;
        nl = 1;
      }
      out.normal[3 * j] = nxs / nl;
      out.normal[3 * j + 1] = nys / nl;
      out.normal[3 * j + 2] = nzs / nl;
      loaded++;
    } else {
      point[3 * j] = sx;
      point[3 * j + 1] = sy;
      point[3 * j + 2] = sz - R;
      defl[j] = 0;
      out.normal[3 * j] = 0;
      out.normal[3 * j + 1] = 0;
      out.normal[3 * j + 2] = 1;
    }
  }
  out.loadedSlices = loaded;
}
