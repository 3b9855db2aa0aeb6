/**
 * The assembled vehicle: geometry, masses, springs and tyres prepared once, with every buffer the
 * equilibrium equations need, so that evaluating them allocates nothing.
 *
 * Unknowns (the solver state, 10 numbers):
 *   0 zRef   height of the reference point in the terrain frame (m)
 *   1 roll   body roll φ about x (rad, ISO 8855: positive = right side down)
 *   2 pitch  body pitch θ about y (rad, positive = nose down)
 *   3,4      front suspension: independent → travel of FL, FR (m, + bump); solid → axle heave (m) and axle roll α (rad)
 *   5,6      rear suspension, the same
 *   7,8      vx, vy: the ground's grip field, a friction vector (dimensionless) in the terrain x-y plane
 *   9        wz: its rotational part, scaled by the wheelbase (dimensionless)
 * x, y and heading are held by the pose: the ground's tangential reactions at the contact patches
 * (grip, brakes, 4WD in gear) take the three in-plane equations. Each contact's tangential force
 * is its normal load times the grip field at its point, projected on its tangent plane:
 *   T = N · P (v + (wz / L) ẑ × (p − o)),
 * i.e. shared in proportion to normal load, as a rigid "creep" field would give.
 *
 * Equations (10): the whole vehicle's force and moment balance about the reference point (6,
 * internal suspension forces cancel) and the generalised force on each suspension coordinate
 * (virtual work of tyre, grip and unsprung-weight forces on that corner or axle against its
 * springs, stops and anti-roll bar).
 */
import type { AxleSuspension, Terrain, TyreModelOptions, Vehicle } from '../model/types';
import { TerrainField } from '../terrain/field';
import {
  DEFAULT_TYRE_MODEL,
  TyreContact,
  type TyreLayout,
  calibrateTyre,
  evaluateTyre,
  makeTyreLayout,
} from '../tyre/radialSpring';

/** Standard gravity (m/s²), ISO 80000-3. */
export const GRAVITY_MPS2 = 9.80665;
export const STATE_SIZE = 10;
export const Q_Z = 0;
export const Q_ROLL = 1;
export const Q_PITCH = 2;
export const Q_SUSP = 3;
export const Q_VX = 7;
export const Q_VY = 8;
export const Q_WZ = 9;
/** First residual row of the suspension equations (rows 0–5 are the whole-vehicle balance). */
export const R_SUSP = 6;

/** Bump stop: rate relative to the wheel rate, and the overshoot over which it doubles (progressive). */
const BUMP_STOP_RATE_FACTOR = 20;
const BUMP_STOP_PROGRESSION_M = 0.01;
/** Droop limit: the corner hangs; modelled as a very stiff stop (N/m per N/m of wheel rate, plus a floor). */
const DROOP_STOP_RATE_FACTOR = 200;
const DROOP_STOP_MIN_NPERM = 1e7;

export interface ModelOptions {
  readonly tyre: TyreModelOptions;
}

interface AxleModel {
  readonly solid: boolean;
  readonly xM: number;
  readonly trackM: number;
  readonly wheelRateNPerM: number;
  readonly bumpM: number;
  readonly droopM: number;
  readonly antiRollNmPerRad: number;
  readonly rollCentreM: number;
  readonly springSpacingM: number;
  /** Lateral travel per unit vertical travel of the left wheel, independent corners (roll-centre geometry). */
  readonly scrubPerTravel: number;
  readonly bumpStopNPerM: number;
  readonly droopStopNPerM: number;
  readonly unsprungPerWheelKg: number;
  readonly radiusM: number;
  readonly widthM: number;
  readonly tyreStiffnessNPerM: number;
}

/** Static loads of a vehicle on level ground by statics alone (Gillespie ch. 2: W·b/L, W·a/L; lateral by lever arms). */
export function rigidStaticLoads(
  weightN: number,
  wheelbaseM: number,
  behindFrontAxleM: number,
  leftOfCentreM: number,
  trackFrontM: number,
  trackRearM: number,
  out: Float64Array,
): Float64Array {
  const wf = (weightN * (wheelbaseM - behindFrontAxleM)) / wheelbaseM;
  const wr = weightN - wf;
  out[0] = (wf * (trackFrontM / 2 + leftOfCentreM)) / trackFrontM;
  out[1] = wf - out[0];
  out[2] = (wr * (trackRearM / 2 + leftOfCentreM)) / trackRearM;
  out[3] = wr - out[2];
  return out;
}

export class VehicleModel {
  readonly vehicle: Vehicle;
  field: TerrainField;
  readonly layout: TyreLayout;
  readonly axles: readonly [AxleModel, AxleModel];
  readonly wheelbaseM: number;
  readonly totalMassKg: number;
  readonly sprungMassKg: number;
  readonly weightN: number;
  /** Total CG at ride height, body frame. */
  readonly cgTotalBody: Float64Array;
  /** Sprung CG, body frame (derived so that the total CG is honoured exactly). */
  readonly cgSprungBody: Float64Array;
  /** Wheel-centre heights at ride height in the body frame (loaded radius), per wheel. */
  readonly rideRadiusM: Float64Array;
  /** Spring forces at zero travel: per wheel (independent) or per spring, left then right (solid). */
  readonly preloadN: Float64Array;
  /** Radial-spring rate per wheel (N/m). */
  readonly rayRateNPerM: Float64Array;
  /** Loads standing on level ground with the payload, untilted (N); filled by the solver module. */
  readonly staticLoadN = new Float64Array(4);
  readonly contacts: TyreContact[];

  // --- per-evaluation state (set by setPose / setGravity, read by the solver) ---
  poseX = 0;
  poseY = 0;
  headingRad = 0;
  readonly gravity = new Float64Array([0, 0, -GRAVITY_MPS2]);
  /** Multiplies every tyre spring rate: below 1 only while the solver eases into a hard pose (continuation). */
  tyreRateScale = 1;
  /** Number of full (ray-cast) evaluations since the counter was reset. */
  fullEvaluations = 0;

  // --- scratch, filled by kinematics ---
  readonly rot = new Float64Array(9);
  readonly wheelCentre = new Float64Array(12);
  readonly wheelAxis = new Float64Array(12);
  readonly travel = new Float64Array(4);
  private readonly featureLists: Int32Array[];
  private readonly featureCounts = new Int32Array(4);
  /** Linearisation of the slice forces at the last full evaluation. */
  private readonly linCentre: Float64Array;
  private readonly linAxis = new Float64Array(12);
  /** Slice forces, centres and points in use by the current evaluation. */
  readonly sliceForce: Float64Array;
  readonly sliceCentre: Float64Array;
  readonly slicePoint: Float64Array;
  /** Ground normal per slice (frozen between full evaluations). */
  readonly sliceNormal: Float64Array;
  /** Normal load per slice: spring force along the ground normal (N). */
  readonly sliceLoad: Float64Array;
  /** Correction added to the spring force at the contact so the slice's ground force is N·(n + P μ) (N). */
  readonly sliceGrip: Float64Array;

  constructor(vehicle: Vehicle, terrain: Terrain, options: Partial<ModelOptions> = {}) {
    this.vehicle = vehicle;
    this.field = new TerrainField(terrain);
    this.layout = makeTyreLayout(options.tyre ?? DEFAULT_TYRE_MODEL);
    const L = vehicle.wheelbaseM;
    this.wheelbaseM = L;
    const ns = this.layout.slices;
    this.contacts = [0, 1, 2, 3].map(() => new TyreContact(ns));
    this.featureLists = [0, 1, 2, 3].map(() => new Int32Array(Math.max(1, this.field.featureCount)));
    this.linCentre = new Float64Array(4 * ns * 3);
    this.sliceForce = new Float64Array(4 * ns * 3);
    this.sliceCentre = new Float64Array(4 * ns * 3);
    this.slicePoint = new Float64Array(4 * ns * 3);
    this.sliceGrip = new Float64Array(4 * ns * 3);
    this.sliceNormal = new Float64Array(4 * ns * 3);
    this.sliceLoad = new Float64Array(4 * ns);

    const g = GRAVITY_MPS2;
    const makeAxle = (s: AxleSuspension, xM: number, trackM: number, unsprungKg: number, front: boolean): AxleModel => {
      const tyre = front ? vehicle.tyreFront : vehicle.tyreRear;
      return {
        solid: s.type === 'solid',
        xM,
        trackM,
        wheelRateNPerM: s.wheelRateNPerM,
        bumpM: s.bumpM,
        droopM: s.droopM,
        antiRollNmPerRad: s.antiRollNmPerRad,
        rollCentreM: s.rollCentreHeightM,
        springSpacingM: s.springSpacingM ?? trackM,
        scrubPerTravel: (2 * s.rollCentreHeightM) / trackM,
        bumpStopNPerM: BUMP_STOP_RATE_FACTOR * s.wheelRateNPerM,
        droopStopNPerM: Math.max(DROOP_STOP_MIN_NPERM, DROOP_STOP_RATE_FACTOR * s.wheelRateNPerM),
        unsprungPerWheelKg: unsprungKg / 2,
        radiusM: tyre.radiusM,
        widthM: tyre.widthM,
        tyreStiffnessNPerM: tyre.stiffnessNPerM,
      };
    };
    this.axles = [
      makeAxle(vehicle.suspensionFront, L / 2, vehicle.trackFrontM, vehicle.unsprungMassFrontKg, true),
      makeAxle(vehicle.suspensionRear, -L / 2, vehicle.trackRearM, vehicle.unsprungMassRearKg, false),
    ];

    // Loads as weighed (no payload): they set the spring preloads and calibrate the tyres, so
    // that the vehicle as weighed stands at ride height on level ground with zero travel.
    const weighed = rigidStaticLoads(
      vehicle.massKg * g,
      L,
      vehicle.cg.behindFrontAxleM,
      vehicle.cg.leftOfCentreM,
      vehicle.trackFrontM,
      vehicle.trackRearM,
      new Float64Array(4),
    );
    this.rideRadiusM = new Float64Array(4);
    this.rayRateNPerM = new Float64Array(4);
    this.preloadN = new Float64Array(4);
    for (let i = 0; i < 4; i++) {
      const ax = this.axles[i >> 1];
      const cal = calibrateTyre(this.layout, ax.radiusM, weighed[i], ax.tyreStiffnessNPerM);
      this.rayRateNPerM[i] = cal.rayRateNPerM;
      this.rideRadiusM[i] = ax.radiusM - cal.staticDeflectionM;
    }
    for (let a = 0; a < 2; a++) {
      const ax = this.axles[a];
      const sL = weighed[2 * a];
      const sR = weighed[2 * a + 1];
      const wu = ax.unsprungPerWheelKg * g;
      if (ax.solid) {
        const sum = sL + sR - 2 * wu;
        const diff = (ax.trackM / ax.springSpacingM) * (sL - sR);
        this.preloadN[2 * a] = 0.5 * (sum + diff);
        this.preloadN[2 * a + 1] = 0.5 * (sum - diff);
      } else {
        this.preloadN[2 * a] = sL - wu;
        this.preloadN[2 * a + 1] = sR - wu;
      }
    }

    // Masses and CGs (body frame, ride height). The vehicle's CG as weighed includes its unsprung
    // masses at the wheel centres; the payload rides on the body.
    let m = vehicle.massKg;
    let mx = m * (L / 2 - vehicle.cg.behindFrontAxleM);
    let my = m * vehicle.cg.leftOfCentreM;
    let mz = m * vehicle.cg.heightM;
    for (const p of vehicle.payload) {
      m += p.massKg;
      mx += p.massKg * (L / 2 - p.behindFrontAxleM);
      my += p.massKg * p.leftOfCentreM;
      mz += p.massKg * p.heightM;
    }
    this.totalMassKg = m;
    this.weightN = m * g;
    this.cgTotalBody = new Float64Array([mx / m, my / m, mz / m]);
    let ms = m;
    for (let i = 0; i < 4; i++) {
      const ax = this.axles[i >> 1];
      const mu = ax.unsprungPerWheelKg;
      const y = (i & 1) === 0 ? ax.trackM / 2 : -ax.trackM / 2;
      ms -= mu;
      mx -= mu * ax.xM;
      my -= mu * y;
      mz -= mu * this.rideRadiusM[i];
    }
    this.sprungMassKg = ms;
    this.cgSprungBody = new Float64Array([mx / ms, my / ms, mz / ms]);
  }

  /** Replaces the terrain (same vehicle). */
  setTerrain(terrain: Terrain): void {
    this.field = new TerrainField(terrain);
    for (let i = 0; i < 4; i++) {
      if (this.featureLists[i].length < this.field.featureCount) this.featureLists[i] = new Int32Array(this.field.featureCount);
    }
  }

  setPose(xM: number, yM: number, headingRad: number): void {
    this.poseX = xM;
    this.poseY = yM;
    this.headingRad = headingRad;
  }

  /** Tilt-table gravity: the table descends toward downhillRad (vehicle frame) by angleRad. */
  setTilt(angleRad: number, downhillRad: number): void {
    const dir = this.headingRad + downhillRad;
    const s = Math.sin(angleRad);
    this.gravity[0] = GRAVITY_MPS2 * s * Math.cos(dir);
    this.gravity[1] = GRAVITY_MPS2 * s * Math.sin(dir);
    this.gravity[2] = -GRAVITY_MPS2 * Math.cos(angleRad);
  }

  /** Body rotation R = Rz(heading) · Ry(pitch) · Rx(roll) into this.rot (row-major). */
  private bodyRotation(roll: number, pitch: number): void {
    const cp = Math.cos(this.headingRad);
    const sp = Math.sin(this.headingRad);
    const ct = Math.cos(pitch);
    const st = Math.sin(pitch);
    const cf = Math.cos(roll);
    const sf = Math.sin(roll);
    const r = this.rot;
    r[0] = cp * ct;
    r[1] = cp * st * sf - sp * cf;
    r[2] = cp * st * cf + sp * sf;
    r[3] = sp * ct;
    r[4] = sp * st * sf + cp * cf;
    r[5] = sp * st * cf - cp * sf;
    r[6] = -st;
    r[7] = ct * sf;
    r[8] = ct * cf;
  }

  /**
   * Kinematics: wheel centres, axes and travels for state q into the scratch buffers. Also the
   * body-frame wheel centre and the derivative data the equations need are recomputed from q.
   */
  kinematics(q: Float64Array): void {
    this.bodyRotation(q[Q_ROLL], q[Q_PITCH]);
    const r = this.rot;
    const ox = this.poseX;
    const oy = this.poseY;
    const oz = q[Q_Z];
    for (let i = 0; i < 4; i++) {
      const ax = this.axles[i >> 1];
      const left = (i & 1) === 0;
      const y0 = left ? ax.trackM / 2 : -ax.trackM / 2;
      const z0 = this.rideRadiusM[i];
      let by: number;
      let bz: number;
      let ay = 1;
      let az = 0;
      if (ax.solid) {
        const hv = q[Q_SUSP + 2 * (i >> 1)];
        const al = q[Q_SUSP + 2 * (i >> 1) + 1];
        const ca = Math.cos(al);
        const sa = Math.sin(al);
        by = y0 * ca - (z0 - ax.rollCentreM) * sa;
        bz = ax.rollCentreM + y0 * sa + (z0 - ax.rollCentreM) * ca + hv;
        ay = ca;
        az = sa;
      } else {
        const t = q[Q_SUSP + i];
        by = y0 + (left ? ax.scrubPerTravel : -ax.scrubPerTravel) * t;
        bz = z0 + t;
      }
      this.travel[i] = bz - z0;
      const bx = ax.xM;
      const w = this.wheelCentre;
      w[3 * i] = ox + r[0] * bx + r[1] * by + r[2] * bz;
      w[3 * i + 1] = oy + r[3] * bx + r[4] * by + r[5] * bz;
      w[3 * i + 2] = oz + r[6] * bx + r[7] * by + r[8] * bz;
      const a = this.wheelAxis;
      a[3 * i] = r[1] * ay + r[2] * az;
      a[3 * i + 1] = r[4] * ay + r[5] * az;
      a[3 * i + 2] = r[7] * ay + r[8] * az;
    }
  }

  /**
   * Tyre slice forces for the current kinematics. full: cast the springs against the terrain and
   * store the linearisation; otherwise use the linearisation from the last full evaluation
   * (F = F0 + K (c − c0)), which is what the Jacobian's finite differences use.
   */
  tyreForces(full: boolean): void {
    const ns = this.layout.slices;
    for (let i = 0; i < 4; i++) {
      const ax = this.axles[i >> 1];
      const w = this.wheelCentre;
      const a = this.wheelAxis;
      const cx = w[3 * i];
      const cy = w[3 * i + 1];
      const cz = w[3 * i + 2];
      const c = this.contacts[i];
      const base = i * ns * 3;
      if (full) {
        const reach = ax.radiusM + ax.widthM;
        const list = this.featureLists[i];
        this.featureCounts[i] = this.field.featuresNear(cx - reach, cx + reach, cy - reach, cy + reach, list);
        evaluateTyre(
          this.field, list, this.featureCounts[i], this.layout, ax.radiusM, ax.widthM, this.rayRateNPerM[i] * this.tyreRateScale,
          cx, cy, cz, a[3 * i], a[3 * i + 1], a[3 * i + 2], c,
        );
        this.linAxis[3 * i] = a[3 * i];
        this.linAxis[3 * i + 1] = a[3 * i + 1];
        this.linAxis[3 * i + 2] = a[3 * i + 2];
        for (let k = 0; k < ns * 3; k++) {
          this.linCentre[base + k] = c.centre[k];
          this.sliceCentre[base + k] = c.centre[k];
          this.sliceForce[base + k] = c.force[k];
          this.slicePoint[base + k] = c.point[k];
          this.sliceNormal[base + k] = c.normal[k];
        }
      } else {
        // The spring fan turns with the wheel plane: a camber change ω = a0 × a (small) turns each
        // slice force and its contact point about the slice centre; translations go through K.
        const a0x = this.linAxis[3 * i], a0y = this.linAxis[3 * i + 1], a0z = this.linAxis[3 * i + 2];
        const ax1 = a[3 * i], ay1 = a[3 * i + 1], az1 = a[3 * i + 2];
        const wx = a0y * az1 - a0z * ay1;
        const wy = a0z * ax1 - a0x * az1;
        const wz = a0x * ay1 - a0y * ax1;
        for (let j = 0; j < ns; j++) {
          const off = this.layout.sliceFraction[j] * ax.widthM;
          const k3 = base + 3 * j;
          const sx = cx + off * ax1;
          const sy = cy + off * ay1;
          const sz = cz + off * az1;
          const c0x = this.linCentre[k3], c0y = this.linCentre[k3 + 1], c0z = this.linCentre[k3 + 2];
          const dx = sx - c0x;
          const dy = sy - c0y;
          const dz = sz - c0z;
          const K = c.stiffness;
          const kb = 9 * j;
          const f0x = c.force[3 * j], f0y = c.force[3 * j + 1], f0z = c.force[3 * j + 2];
          this.sliceCentre[k3] = sx;
          this.sliceCentre[k3 + 1] = sy;
          this.sliceCentre[k3 + 2] = sz;
          const T = c.turnStiffness;
          this.sliceForce[k3] = f0x + (wy * f0z - wz * f0y) + K[kb] * dx + K[kb + 1] * dy + K[kb + 2] * dz
            + T[kb] * wx + T[kb + 1] * wy + T[kb + 2] * wz;
          this.sliceForce[k3 + 1] = f0y + (wz * f0x - wx * f0z) + K[kb + 3] * dx + K[kb + 4] * dy + K[kb + 5] * dz
            + T[kb + 3] * wx + T[kb + 4] * wy + T[kb + 5] * wz;
          this.sliceForce[k3 + 2] = f0z + (wx * f0y - wy * f0x) + K[kb + 6] * dx + K[kb + 7] * dy + K[kb + 8] * dz
            + T[kb + 6] * wx + T[kb + 7] * wy + T[kb + 8] * wz;
          // The contact point slides over the ground with the wheel: only the tangential part of the
          // slice centre's move carries it (a wheel that rises leaves its contact on the ground).
          const nx = c.normal[3 * j], ny = c.normal[3 * j + 1], nz = c.normal[3 * j + 2];
          const dn = dx * nx + dy * ny + dz * nz;
          const rx = c.point[3 * j] - c0x, ry = c.point[3 * j + 1] - c0y, rz = c.point[3 * j + 2] - c0z;
          this.slicePoint[k3] = c.point[3 * j] + dx - dn * nx + (wy * rz - wz * ry);
          this.slicePoint[k3 + 1] = c.point[3 * j + 1] + dy - dn * ny + (wz * rx - wx * rz);
          this.slicePoint[k3 + 2] = c.point[3 * j + 2] + dz - dn * nz + (wx * ry - wy * rx);
        }
      }
    }
  }

  /**
   * The equilibrium equations at state q, scaled (forces / weight, moments / (weight · wheelbase)),
   * into res (length STATE_SIZE). full = true casts the tyre springs; false uses their
   * linearisation at the last full evaluation.
   */
  residual(q: Float64Array, full: boolean, res: Float64Array): void {
    if (full) this.fullEvaluations++;
    this.kinematics(q);
    this.tyreForces(full);
    const ns = this.layout.slices;
    const g = this.gravity;
    const r = this.rot;
    const ox = this.poseX;
    const oy = this.poseY;
    const oz = q[Q_Z];
    const L = this.wheelbaseM;
    const vx = q[Q_VX];
    const vy = q[Q_VY];
    const wz = q[Q_WZ] / L;

    // Whole-vehicle balance about o.
    let Fx = 0, Fy = 0, Fz = 0, Mx = 0, My = 0, Mz = 0;
    // Sprung weight.
    {
      const c = this.cgSprungBody;
      const px = r[0] * c[0] + r[1] * c[1] + r[2] * c[2];
      const py = r[3] * c[0] + r[4] * c[1] + r[5] * c[2];
      const pz = r[6] * c[0] + r[7] * c[1] + r[8] * c[2];
      const m = this.sprungMassKg;
      const gx = m * g[0], gy = m * g[1], gz = m * g[2];
      Fx += gx; Fy += gy; Fz += gz;
      Mx += py * gz - pz * gy;
      My += pz * gx - px * gz;
      Mz += px * gy - py * gx;
    }
    for (let i = 0; i < 4; i++) {
      const ax = this.axles[i >> 1];
      const wc = this.wheelCentre;
      const cx = wc[3 * i] - ox, cy = wc[3 * i + 1] - oy, cz = wc[3 * i + 2] - oz;
      const mu = ax.unsprungPerWheelKg;
      // Forces on this wheel, and their moment about o, and about the axle's roll centre.
      let wx = mu * g[0], wy = mu * g[1], wzF = mu * g[2];
      let mxo = cy * wzF - cz * wy;
      let myo = cz * wx - cx * wzF;
      let mzo = cx * wy - cy * wx;
      for (let j = 0; j < ns; j++) {
        const k3 = (i * ns + j) * 3;
        const fx = this.sliceForce[k3], fy = this.sliceForce[k3 + 1], fz = this.sliceForce[k3 + 2];
        const sx = this.sliceCentre[k3] - ox, sy = this.sliceCentre[k3 + 1] - oy, sz = this.sliceCentre[k3 + 2] - oz;
        wx += fx; wy += fy; wzF += fz;
        mxo += sy * fz - sz * fy;
        myo += sz * fx - sx * fz;
        mzo += sx * fy - sy * fx;
        // Ground reaction of the slice: its springs set the normal load N = F·n; the tangential
        // part is the grip field, N · P (v + wz ẑ × (p − o)), at the centre of pressure. So the
        // correction T added to the spring force replaces the springs' own tangential part.
        const nx = this.sliceNormal[k3], ny = this.sliceNormal[k3 + 1], nz = this.sliceNormal[k3 + 2];
        const Nn = fx * nx + fy * ny + fz * nz;
        let tx = 0, ty = 0, tz = 0;
        if (Nn > 0) {
          const px = this.slicePoint[k3] - ox, py = this.slicePoint[k3 + 1] - oy, pz = this.slicePoint[k3 + 2] - oz;
          const mux = vx - wz * py;
          const muy = vy + wz * px;
          const mun = mux * nx + muy * ny;
          tx = Nn * (mux - nx * mun) - (fx - Nn * nx);
          ty = Nn * (muy - ny * mun) - (fy - Nn * ny);
          tz = Nn * (-nz * mun) - (fz - Nn * nz);
          wx += tx; wy += ty; wzF += tz;
          mxo += py * tz - pz * ty;
          myo += pz * tx - px * tz;
          mzo += px * ty - py * tx;
        }
        this.sliceLoad[i * ns + j] = Nn > 0 ? Nn : 0;
        this.sliceGrip[k3] = tx;
        this.sliceGrip[k3 + 1] = ty;
        this.sliceGrip[k3 + 2] = tz;
      }
      Fx += wx; Fy += wy; Fz += wzF;
      Mx += mxo; My += myo; Mz += mzo;
      this.wheelForce[3 * i] = wx;
      this.wheelForce[3 * i + 1] = wy;
      this.wheelForce[3 * i + 2] = wzF;
      this.wheelMoment[3 * i] = mxo;
      this.wheelMoment[3 * i + 1] = myo;
      this.wheelMoment[3 * i + 2] = mzo;
    }
    const W = this.weightN;
    res[0] = Fx / W;
    res[1] = Fy / W;
    res[2] = Fz / W;
    res[3] = Mx / (W * L);
    res[4] = My / (W * L);
    res[5] = Mz / (W * L);

    // Suspension coordinates.
    for (let a = 0; a < 2; a++) {
      const ax = this.axles[a];
      const iL = 2 * a;
      const iR = 2 * a + 1;
      const k = ax.wheelRateNPerM;
      if (!ax.solid) {
        const dT = (this.travel[iL] - this.travel[iR]) / ax.trackM;
        for (let side = 0; side < 2; side++) {
          const i = iL + side;
          const sc = side === 0 ? ax.scrubPerTravel : -ax.scrubPerTravel;
          // Direction of the wheel's travel in the terrain frame: R (0, ±scrub, 1).
          const dx = r[1] * sc + r[2];
          const dy = r[4] * sc + r[5];
          const dz = r[7] * sc + r[8];
          const t = this.travel[i];
          let Q = dx * this.wheelForce[3 * i] + dy * this.wheelForce[3 * i + 1] + dz * this.wheelForce[3 * i + 2];
          Q -= this.preloadN[i] + k * t + this.stopForce(ax, t);
          const arb = (ax.antiRollNmPerRad * dT) / ax.trackM;
          Q -= side === 0 ? arb : -arb;
          res[R_SUSP + i] = Q / W;
        }
      } else {
        const hv = q[Q_SUSP + 2 * a];
        const al = q[Q_SUSP + 2 * a + 1];
        const ca = Math.cos(al);
        const sa = Math.sin(al);
        // Heave: all axle points move along body z.
        const zx = r[2], zy = r[5], zz = r[8];
        let Qh = 0;
        // Roll about the body x axis through the roll centre (which heaves with the axle).
        const rcx = r[0] * ax.xM + r[2] * (ax.rollCentreM + hv);
        const rcy = r[3] * ax.xM + r[5] * (ax.rollCentreM + hv);
        const rcz = r[6] * ax.xM + r[8] * (ax.rollCentreM + hv);
        let Qa = 0;
        for (let side = 0; side < 2; side++) {
          const i = iL + side;
          const fx = this.wheelForce[3 * i], fy = this.wheelForce[3 * i + 1], fz = this.wheelForce[3 * i + 2];
          Qh += zx * fx + zy * fy + zz * fz;
          // Moment about the roll centre = moment about o − (rc − o) × F, along body x.
          const mx = this.wheelMoment[3 * i] - (rcy * fz - rcz * fy);
          const my = this.wheelMoment[3 * i + 1] - (rcz * fx - rcx * fz);
          const mz = this.wheelMoment[3 * i + 2] - (rcx * fy - rcy * fx);
          Qa += r[0] * mx + r[3] * my + r[6] * mz;
          // Stops act on the wheel's own travel.
          const y0 = side === 0 ? ax.trackM / 2 : -ax.trackM / 2;
          const dtda = y0 * ca - (this.rideRadiusM[i] - ax.rollCentreM) * sa;
          const stop = this.stopForce(ax, this.travel[i]);
          Qh -= stop;
          Qa -= stop * dtda;
        }
        // Springs at the spring spacing, at the mean ride-height wheel-centre height.
        const zs = 0.5 * (this.rideRadiusM[iL] + this.rideRadiusM[iR]) - ax.rollCentreM;
        const ys = ax.springSpacingM / 2;
        const dL = hv + ys * sa + zs * (ca - 1);
        const dR = hv - ys * sa + zs * (ca - 1);
        const fL = this.preloadN[iL] + k * dL;
        const fR = this.preloadN[iR] + k * dR;
        Qh -= fL + fR;
        Qa -= fL * (ys * ca - zs * sa) + fR * (-ys * ca - zs * sa);
        Qa -= ax.antiRollNmPerRad * al;
        res[R_SUSP + 2 * a] = Qh / W;
        res[R_SUSP + 2 * a + 1] = Qa / (W * ax.trackM);
      }
    }
  }

  /** Force of the bump stop or droop limit at travel t, pushing the wheel down (N); 0 in between. */
  private stopForce(ax: AxleModel, t: number): number {
    if (t > ax.bumpM) {
      const e = t - ax.bumpM;
      return ax.bumpStopNPerM * (e + (e * e) / BUMP_STOP_PROGRESSION_M);
    }
    if (t < -ax.droopM) return -ax.droopStopNPerM * (-ax.droopM - t);
    return 0;
  }

  /** Total force on each wheel (tyre + grip + unsprung weight), terrain frame, from the last residual. */
  readonly wheelForce = new Float64Array(12);
  /** Moment of those forces about the reference point. */
  readonly wheelMoment = new Float64Array(12);
}
