/**
 * The result builder: turns a solver state (with the model's buffers holding its full evaluation)
 * into the plain SolveResult the rest of Plumbline reads.
 */
import type { SolveResult, SolveStatus, StabilityMargins, WheelName, WheelResult } from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { stabilityMargins } from './margins';
import { Q_PITCH, Q_ROLL, Q_Z, R_SUSP, type VehicleModel } from './model';
import { groundUnderWheels } from './newton';

const _gradPlumb = new Float64Array(2);

/**
 * Where the plumb line from the CG (along the unit gravity direction g) meets the ground: Newton on
 * f(t) = (cg + t·g)_z − h((cg + t·g)_xy), safeguarded by bisection once bracketed; falls back to
 * `fallback` (the point on the support plane) when no crossing is found.
 */
function plumbOnGround(
  model: VehicleModel,
  cg: readonly [number, number, number],
  g: readonly [number, number, number],
  fallback: readonly [number, number, number],
): [number, number, number] {
  const field = model.field;
  // Start from the support plane's point: the ground is near it.
  let t = (fallback[0] - cg[0]) * g[0] + (fallback[1] - cg[1]) * g[1] + (fallback[2] - cg[2]) * g[2];
  if (!Number.isFinite(t)) t = 0;
  let lo = -Infinity;
  let hi = Infinity;
  for (let it = 0; it < 50; it++) {
    const x = cg[0] + t * g[0];
    const y = cg[1] + t * g[1];
    const f = cg[2] + t * g[2] - field.sample(x, y, _gradPlumb);
    if (Math.abs(f) < 1e-10) return [x, y, cg[2] + t * g[2]];
    // f falls as t grows while the line goes down faster than the ground along it.
    if (f > 0) lo = Math.max(lo, t);
    else hi = Math.min(hi, t);
    const df = g[2] - _gradPlumb[0] * g[0] - _gradPlumb[1] * g[1];
    let next = df < 0 ? t - f / df : NaN;
    if (!(next > lo && next < hi)) next = Number.isFinite(lo) && Number.isFinite(hi) ? 0.5 * (lo + hi) : t + (f > 0 ? 0.5 : -0.5);
    t = next;
  }
  return [fallback[0], fallback[1], fallback[2]];
}

/** Travel below this counts as none when expressing travel as a fraction of what is available (m). */
const MIN_TRAVEL_M = 1e-9;
const _ground = new Float64Array(4);

const _pts: number[] = [];
const _ptWheel: number[] = [];

/** Builds the plain result object from state x (model buffers must hold x's full evaluation). */
export function buildResult(
  model: VehicleModel,
  x: Float64Array,
  r: Float64Array,
  statusIn: SolveStatus,
  iterations: number,
  reasonIn: string,
  friction: number,
  minEigen: number | null,
): SolveResult {
  let status = statusIn;
  let reason = reasonIn;
  const ns = model.layout.slices;
  const g = model.gravity;
  const G = Math.hypot(g[0], g[1], g[2]);
  const up: [number, number, number] = [-g[0] / G, -g[1] / G, -g[2] / G];
  const W = model.weightN;
  _pts.length = 0;
  _ptWheel.length = 0;
  const wheels: WheelResult[] = [];
  let totalLoad = 0;
  for (let i = 0; i < 4; i++) {
    const ax = model.axles[i >> 1];
    // Per wheel: normal load (sum over slices), the ground force (springs + correction), its
    // normal direction, the centre of pressure and the mean deflection.
    let load = 0, fx = 0, fy = 0, fz = 0, nx = 0, ny = 0, nz = 0, px = 0, py = 0, pz = 0, dsum = 0;
    for (let j = 0; j < ns; j++) {
      const k3 = (i * ns + j) * 3;
      const Nj = model.sliceLoad[i * ns + j];
      fx += model.sliceForce[k3] + model.sliceGrip[k3];
      fy += model.sliceForce[k3 + 1] + model.sliceGrip[k3 + 1];
      fz += model.sliceForce[k3 + 2] + model.sliceGrip[k3 + 2];
      if (Nj > 0) {
        load += Nj;
        nx += Nj * model.sliceNormal[k3]; ny += Nj * model.sliceNormal[k3 + 1]; nz += Nj * model.sliceNormal[k3 + 2];
        px += Nj * model.slicePoint[k3]; py += Nj * model.slicePoint[k3 + 1]; pz += Nj * model.slicePoint[k3 + 2];
        dsum += Nj * model.contacts[i].deflection[j];
        _pts.push(model.slicePoint[k3], model.slicePoint[k3 + 1], model.slicePoint[k3 + 2]);
        _ptWheel.push(i);
      }
    }
    const nl = Math.hypot(nx, ny, nz) || 1;
    nx /= nl; ny /= nl; nz /= nl;
    const fn = fx * nx + fy * ny + fz * nz;
    const tx = fx - fn * nx, ty = fy - fn * ny, tz = fz - fn * nz;
    totalLoad += load;
    const lifted = model.contacts[i].loadedSlices === 0 || !(load > 0);
    const c = model.wheelCentre;
    const centre: [number, number, number] = [c[3 * i], c[3 * i + 1], c[3 * i + 2]];
    const axis: [number, number, number] = [model.wheelAxis[3 * i], model.wheelAxis[3 * i + 1], model.wheelAxis[3 * i + 2]];
    const tangential = Math.hypot(tx, ty, tz);
    const t = model.travel[i];
    const avail = t >= 0 ? ax.bumpM : ax.droopM;
    wheels.push({
      name: WHEEL_NAMES[i],
      loadN: lifted ? 0 : load,
      verticalLoadN: lifted ? 0 : fx * up[0] + fy * up[1] + fz * up[2],
      loadShare: lifted ? 0 : load / model.staticLoadN[i],
      staticLoadN: model.staticLoadN[i],
      lifted,
      contactPointWorld: lifted ? [centre[0], centre[1], centre[2] - ax.radiusM] : [px / load, py / load, pz / load],
      contactNormalWorld: lifted ? [0, 0, 1] : [nx, ny, nz],
      centreWorld: centre,
      axisWorld: axis,
      travelM: t,
      // No travel that way (a corner with zero droop, or a value too small to divide by): ±1 once it moves.
      travelFraction: avail > MIN_TRAVEL_M ? t / avail : Math.abs(t) <= MIN_TRAVEL_M ? 0 : Math.sign(t),
      tyreDeflectionM: lifted ? 0 : dsum / load,
      tangentialN: lifted ? 0 : tangential,
      frictionDemand: lifted ? 0 : tangential / load,
    });
  }

  // Total CG in the terrain frame.
  const R = model.rot;
  const cs = model.cgSprungBody;
  let cgx = model.sprungMassKg * (model.poseX + R[0] * cs[0] + R[1] * cs[1] + R[2] * cs[2]);
  let cgy = model.sprungMassKg * (model.poseY + R[3] * cs[0] + R[4] * cs[1] + R[5] * cs[2]);
  let cgz = model.sprungMassKg * (x[Q_Z] + R[6] * cs[0] + R[7] * cs[1] + R[8] * cs[2]);
  for (let i = 0; i < 4; i++) {
    const mu = model.axles[i >> 1].unsprungPerWheelKg;
    cgx += mu * model.wheelCentre[3 * i];
    cgy += mu * model.wheelCentre[3 * i + 1];
    cgz += mu * model.wheelCentre[3 * i + 2];
  }
  const M = model.totalMassKg;
  const cg: [number, number, number] = [cgx / M, cgy / M, cgz / M];

  const npts = _ptWheel.length;
  const force = [g[0] * M, g[1] * M, g[2] * M];
  const mg = stabilityMargins(_pts, npts, cg, force);
  const edgeWheels: WheelName[] = [];
  if (mg.weakestEdge >= 0 && mg.hull.length >= 2) {
    const a = _ptWheel[mg.hull[mg.weakestEdge]];
    const b = _ptWheel[mg.hull[(mg.weakestEdge + 1) % mg.hull.length]];
    const lo = Math.min(a, b);
    const hi = Math.max(a, b);
    edgeWheels.push(WHEEL_NAMES[lo]);
    if (hi !== lo) edgeWheels.push(WHEEL_NAMES[hi]);
  }
  const finite = (v: number): number => (Number.isFinite(v) ? v : 0);
  const margins: StabilityMargins = {
    forceAngleRad: finite(mg.forceAngleRad),
    forceAngleMeasure: finite(mg.forceAngleMeasure),
    forceAngleMeasurePerWeightM: finite(mg.forceAngleMeasure / W),
    energyM: finite(mg.energyM),
    staticM: finite(mg.staticM),
    weakestEdge: mg.weakestEdge,
    weakestEdgeWheels: edgeWheels,
  };

  if (status !== 'converged') {
    if (status === 'not-converged' && totalLoad === 0) {
      status = 'no-contact';
      reason = reason || 'no tyre reaches the ground';
    } else if (status === 'not-converged' && (npts === 0 || margins.forceAngleRad < 0)) {
      status = 'tipped';
      reason = `${reason}; the plumb line from the CG falls outside the support of the loaded tyres`;
    }
  }

  // Attitude relative to the terrain frame (the state) and to true level.
  const yUp = R[1] * up[0] + R[4] * up[1] + R[7] * up[2];
  const zUp = R[2] * up[0] + R[5] * up[1] + R[8] * up[2];
  const xUp = R[0] * up[0] + R[3] * up[1] + R[6] * up[2];
  const gw = groundUnderWheels(model, _ground);
  const groundMean = 0.25 * (gw[0] + gw[1] + gw[2] + gw[3]);

  let resF = 0;
  let resM = 0;
  for (let k = 0; k < 3; k++) resF = Math.max(resF, Math.abs(r[k]) * W);
  for (let k = 3; k < 6; k++) resM = Math.max(resM, Math.abs(r[k]) * W * model.wheelbaseM);
  for (let a = 0; a < 2; a++) {
    const ax = model.axles[a];
    if (ax.solid) {
      resF = Math.max(resF, Math.abs(r[R_SUSP + 2 * a]) * W);
      resM = Math.max(resM, Math.abs(r[R_SUSP + 2 * a + 1]) * W * ax.trackM);
    } else {
      resF = Math.max(resF, Math.abs(r[R_SUSP + 2 * a]) * W, Math.abs(r[R_SUSP + 2 * a + 1]) * W);
    }
  }

  // A pose that does not stand carries no loads, travels or grip figures as if they were real: they
  // belong to no equilibrium (or to an unstable one). Positions and the lifted flags stay for drawing.
  const standing = status === 'converged';
  const shown: WheelResult[] = standing
    ? wheels
    : wheels.map((w) => ({
        ...w,
        loadN: null,
        verticalLoadN: null,
        loadShare: null,
        travelM: null,
        travelFraction: null,
        tyreDeflectionM: null,
        tangentialN: null,
        frictionDemand: null,
      }));
  const poly: [number, number, number][] = mg.hull.map((h) => [_pts[3 * h], _pts[3 * h + 1], _pts[3 * h + 2]]);
  return {
    status,
    standing,
    stiffnessMinEigen: minEigen,
    reason,
    iterations,
    evaluations: model.fullEvaluations,
    residualN: finite(resF),
    residualNm: finite(resM),
    wheels: shown as unknown as SolveResult['wheels'],
    body: {
      heaveM: finite(x[Q_Z] - groundMean),
      rollRad: finite(x[Q_ROLL]),
      pitchRad: finite(x[Q_PITCH]),
      rollToLevelRad: finite(Math.atan2(yUp, zUp)),
      pitchToLevelRad: finite(-Math.asin(Math.max(-1, Math.min(1, xUp)))),
      cgWorld: cg,
      plumbPointWorld: plumbOnGround(model, cg, [-up[0], -up[1], -up[2]], mg.plumb),
    },
    margins,
    supportPolygonWorld: poly,
    gravityDirWorld: [-up[0], -up[1], -up[2]],
    weightN: W,
    state: Float64Array.from(x),
  };
}
