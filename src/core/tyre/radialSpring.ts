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
  return { slices: ns, sliceFraction, sliceWeight, rays, raySin, rayCos };
}

/**
 * Vertical force per unit spring rate of an upright tyre pressed δ into flat ground:
 * Σ_k max(0, R cos ψ_k − (R − δ)) (each spring's compression along its ray times cos ψ).
 */
export function flatForcePerRate(layout: TyreLayout, radiusM: number, deflectionM: number): number {
  let f = 0;
  const base = radiusM - deflectionM;
  for (let k = 0; k < layout.rays; k++) {
    const c = layout.rayCos[k];
    const d = radiusM * c - base;
    if (d > 0) f += d;
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
    this.deflection = new Float64Array(slices);
    this.normal = new Float64Array(3 * slices);
  }
}

const _grad = new Float64Array(2);

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

  for (let j = 0; j < layout.slices; j++) {
    const off = layout.sliceFraction[j] * widthM;
    const rate = rayRateNPerM * layout.sliceWeight[j];
    const sx = cx + off * ax;
    const sy = cy + off * ay;
    const sz = cz + off * az;
    centre[3 * j] = sx;
    centre[3 * j + 1] = sy;
    centre[3 * j + 2] = sz;
    let Fx = 0;
    let Fy = 0;
    let Fz = 0;
    let k00 = 0, k01 = 0, k02 = 0, k10 = 0, k11 = 0, k12 = 0, k20 = 0, k21 = 0, k22 = 0;
    let px = 0;
    let py = 0;
    let pz = 0;
    let dsum = 0;
    let d2sum = 0;
    let nxs = 0;
    let nys = 0;
    let nzs = 0;
    // Height of the slice centre above the ground below it: f(0) of every ray's search.
    const f0 = sz - field.sampleIn(features, featureCount, sx, sy, null);

    for (let k = 0; k < layout.rays; k++) {
      const sn = layout.raySin[k];
      const cs = layout.rayCos[k];
      const ex = sn * fx - cs * ux;
      const ey = sn * fy - cs * uy;
      const ez = sn * fz - cs * uz;
      // Tread point of this spring: is it below the ground?
      const gR = sz + R * ez - field.sampleIn(features, featureCount, sx + R * ex, sy + R * ey, _grad);
      if (gR >= 0) continue;
      // Find ρ* in (0, R) where the ray meets the ground: safeguarded Newton on
      // g(ρ) = z(ρ) − H(x(ρ), y(ρ)), bracketed by g(lo) > 0 > g(hi).
      let rho: number;
      let mx: number;
      let my: number;
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
      const delta = R - rho;
      const fk = rate * delta;
      Fx -= fk * ex;
      Fy -= fk * ey;
      Fz -= fk * ez;
      // dδ/dc = m / (m·e) with m = (−Hx, −Hy, 1) the unnormalised ground normal at the hit.
      const mn = Math.sqrt(mx * mx + my * my + 1);
      let me = mx * ex + my * ey + ez;
      if (me > -GRAZING_MIN * mn) me = -GRAZING_MIN * mn;
      const c = -rate / me;
      k00 += c * ex * mx;
      k01 += c * ex * my;
      k02 += c * ex;
      k10 += c * ey * mx;
      k11 += c * ey * my;
      k12 += c * ey;
      k20 += c * ez * mx;
      k21 += c * ez * my;
      k22 += c * ez;
      px += delta * (sx + rho * ex);
      py += delta * (sy + rho * ey);
      pz += delta * (sz + rho * ez);
      dsum += delta;
      d2sum += delta * delta;
      nxs += (delta * mx) / mn;
      nys += (delta * my) / mn;
      nzs += delta / mn;
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
    if (dsum > 0) {
      point[3 * j] = px / dsum;
      point[3 * j + 1] = py / dsum;
      point[3 * j + 2] = pz / dsum;
      defl[j] = d2sum / dsum;
      const nl = Math.sqrt(nxs * nxs + nys * nys + nzs * nzs);
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
