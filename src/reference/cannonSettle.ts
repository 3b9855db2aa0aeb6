/**
 * An independent dynamic reference for Plumbline's quasi-static solver, built on cannon-es.
 *
 * It drops the vehicle onto the terrain and lets a rigid-body simulation settle, then reads the
 * four tyre loads. It shares nothing with the solver except the input types and the terrain
 * height function (TerrainField), so agreement between the two is a real check. It is not part
 * of the core (it imports cannon-es and reads a clock), and it is slow: use it in tests only.
 *
 * Model
 * - One rigid body (cannon-es Body, no collision shapes) for the whole vehicle. Mass = vehicle
 *   mass + payload masses; the body's origin is the combined CG of vehicle and payload. Inertia
 *   is that of a solid box of the body's length (wheelbase + overhangs), width and roof height
 *   (it does not change the static loads, only how the body moves while it settles).
 * - Four spring-damper corners. Hardpoint of wheel i in the vehicle frame: x = ±wheelbase/2
 *   about the reference point (ground, midway between the axles), y = ±track/2, z = tyre radius
 *   (the reference point is on the ground at ride height). Each step a ray is cast from the
 *   hardpoint along the body's −z (cannon-es's own raycast against a CANNON.Heightfield that
 *   samples the terrain's height every gridSpacingM over a region around the pose). By default
 *   (contactRay 'wheel-plane') a second ray is then cast toward the lowest point of a round
 *   wheel over that ground: along the ground normal projected on the wheel plane (normal to
 *   body y). In roll the two rays coincide; in pitch the second one still lands under the wheel
 *   centre, as a round tyre does, instead of r·sin(pitch) ahead of or behind it (on a 10° grade
 *   that shift alone moves 0.13 % of the weight between the axles; with a wheel on a 0.3 m block
 *   about 0.4 %). contactRay 'body-z' keeps the single body −z ray.
 *   Compression c = radius − hit distance (0 at ride height on level ground).
 * - Corner force along body z: the suspension spring (wheel rate ks) in series with the tyre
 *   (kt), k = ks·kt/(ks + kt), preloaded with the corner's static share F0 so that on level ground
 *   at ride height each corner carries it (axle loads from the CG's fore-aft position, W·b/L and
 *   W·a/L, split left/right by the CG's lateral offset). Suspension travel s = kt·c/(ks + kt)
 *   within [−droop, +bump]. Beyond full bump a stiff stop (BUMP_STOP_N_PER_M) acts in parallel
 *   with the spring. At full droop the spring is held by its stop and only the tyre can still
 *   unload; the tyre never pulls, so a corner whose load reaches zero hangs (load 0).
 *   Plus a damper on the compression rate, near-critical for a quarter of the mass.
 * - Contact force, applied at the ray's hit point: a normal force N along the terrain normal,
 *   sized so that its component along body z equals the corner force (N = F / (n·z_body)), and
 *   a tangential "stick" force: a spring-damper in the contact's tangent plane anchored where the
 *   tyre first touched (soft by default, see STICK_STIFFNESS_N_PER_M), capped at
 *   STICK_CAP_RATIO × N. It stands for brakes applied and 4WD held in gear; in these checks it
 *   never reaches the cap (the result reports the largest ratio).
 * - Gravity 9.80665 m/s². A tilt rotates gravity in the terrain frame: the table descends toward
 *   d = (cos(heading + downhill), sin(heading + downhill), 0) and
 *   g_terrain = 9.80665·(sin(angle)·d − cos(angle)·ẑ).
 * - Not modelled: anti-roll bars, unsprung mass, roll-centre height, solid axles, the tyre's
 *   shape (a single ray per corner, not a radial-spring tyre). Casting along body −z from the
 *   wheel centre behaves like an independent suspension with its roll centre at ground level
 *   (a body roll about a ground-level axis moves the hit point only to second order). Compare
 *   it with the solver only for vehicles with independent suspension at both ends, roll centres
 *   at 0, anti-roll bars 0 and unsprung masses 0, on terrain flat under each tyre's plumb point.
 *
 * Run: the body starts at rest on the least-squares plane through the ground heights under the
 * four hardpoints, raised 1 cm above ride height, and is stepped (fixed step, default 1/500 s)
 * until every wheel's normal load has stayed in a band 0.5 % of the weight wide for 0.5 s of
 * simulated time ("settled"), or maxTimeS (default 20 s) passes.
 */
import * as CANNON from 'cannon-es';
import type { Pose, Terrain, Tilt, Vehicle } from '../core/model/types';
import { TerrainField } from '../core/terrain/field';

/** Standard gravity (m/s², ISO 80000-3). */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
/** Rate of the bump stop beyond full bump, in parallel with the spring (N/m): stiff next to a 40 kN/m wheel rate. */
const BUMP_STOP_N_PER_M = 2e6;
/** Tangential cap of the stick force, as a ratio to the normal force. */
const STICK_CAP_RATIO = 1.5;
/**
 * Default stick stiffness per tyre in the tangent plane (N/m). Deliberately soft: the stick holds
 * the vehicle on a slope (a few cm of creep on a 20° table, harmless on a plane), but the
 * internal tangential forces it traps while the body settles scale with it, and where the tyres
 * stand at different heights those forces shift load. Measured on the one-wheel-on-a-0.3-m-block
 * case, front-left load: 7326 N at 5e4, 7344 N at 2e5, 7513 N at 2e6 N/m; 5e4 is within about
 * 6 N (0.03 % of the weight) of the soft limit.
 */
const STICK_STIFFNESS_N_PER_M = 5e4;
/** Smallest n·z_body accepted when sizing the normal force (a hit on a near-vertical face). */
const MIN_NORMAL_DOT = 0.1;
/** Extra ray length beyond where the corner load reaches zero (m). */
const RAY_MARGIN_M = 0.05;
/** Margin of the sampled terrain region beyond the wheels (m). */
const REGION_MARGIN_M = 1.0;
/** Collision group of the terrain, for the ray filter. */
const TERRAIN_GROUP = 1;

export interface CannonSettleOptions extends CannonRigOptions {
  /** Fixed time step (s). @default 1/500 */
  readonly timeStepS?: number;
  /** Simulated time cap (s). @default 20 */
  readonly maxTimeS?: number;
  /** Spacing of the heightfield samples (m). @default 0.05 */
  readonly gridSpacingM?: number;
  /** Height above ride height the body is dropped from (m). @default 0.01 */
  readonly dropM?: number;
  /** How long the loads must stay in the band to count as settled (s). @default 0.5 */
  readonly settleWindowS?: number;
  /** Width of the band, as a fraction of the weight. @default 0.005 */
  readonly settleBandFraction?: number;
  /** Damping ratio of each corner, for a quarter of the mass. @default 1 */
  readonly dampingRatio?: number;
  /**
   * Direction of each corner's ray from the hardpoint: `body-z` along the body's −z; `wheel-plane`
   * toward the lowest point of a round wheel over the ground hit first (the ground normal projected
   * on the wheel plane), so that a pitched body still touches level ground under the wheel centre.
   * @default 'wheel-plane'
   */
  readonly contactRay?: 'body-z' | 'wheel-plane';
  /** Stick spring per tyre in the contact's tangent plane (N/m); critically damped for a quarter of the mass. @default 5e4 */
  readonly stickStiffnessNPerM?: number;
}

export type WheelTuple = [number, number, number, number];

export interface CannonSettleResult {
  /** Normal load per wheel FL, FR, RL, RR, along the contact normal (N). */
  readonly loadsN: WheelTuple;
  /** Total contact force (normal + stick) per wheel along the gravity up direction (N). */
  readonly verticalLoadsN: WheelTuple;
  /** Suspension travel from ride height, positive in bump (m); at the stop or hanging it reads the limit. */
  readonly travelM: WheelTuple;
  /** Weight of vehicle and payload (N). */
  readonly weightN: number;
  /** Largest stick force / normal force over the loaded wheels at the end (must stay under the cap). */
  readonly maxStickRatio: number;
  readonly settled: boolean;
  readonly simulatedTimeS: number;
  readonly steps: number;
  readonly wallTimeMs: number;
}

/** Per-corner constants. */
interface Corner {
  readonly hardpointBody: CANNON.Vec3;
  readonly radiusM: number;
  readonly preloadN: number;
  readonly springNPerM: number;
  readonly tyreNPerM: number;
  readonly seriesNPerM: number;
  readonly bumpM: number;
  readonly droopM: number;
  readonly dampingNsPerM: number;
  readonly rayLengthM: number;
}

/** Corner force along body z (N, ≥ 0, no damping) and travel for compression c (m). */
function cornerSpring(k: Corner, c: number, travelOut: Float64Array, i: number): number {
  const ks = k.springNPerM;
  const kt = k.tyreNPerM;
  const cBump = (k.bumpM * (ks + kt)) / kt;
  const cDroop = (-k.droopM * (ks + kt)) / kt;
  let f: number;
  let s: number;
  if (c > cBump) {
    const kStop = ks + BUMP_STOP_N_PER_M;
    const fBump = k.preloadN + ks * k.bumpM;
    f = fBump + ((kStop * kt) / (kStop + kt)) * (c - cBump);
    s = k.bumpM + (f - fBump) / kStop;
  } else if (c >= cDroop) {
    f = k.preloadN + k.seriesNPerM * c;
    s = (kt * c) / (ks + kt);
  } else {
    // The spring rests on its droop stop; only the tyre unloads further.
    f = k.preloadN - ks * k.droopM + kt * (c - cDroop);
    s = -k.droopM;
  }
  if (f <= 0) {
    f = 0;
    // Hanging: the wheel drops to full droop, or to where the spring runs out of preload.
    const sFree = -k.preloadN / ks;
    s = sFree > -k.droopM ? sFree : -k.droopM;
  }
  travelOut[i] = s;
  return f;
}

function wheelCount<T>(a: T, b: T, c: T, d: T): [T, T, T, T] {
  return [a, b, c, d];
}

/** Options of the rig itself (shared by the settle and the tilt ramp). */
export interface CannonRigOptions {
  /** Fixed time step (s). @default 1/500 */
  readonly timeStepS?: number;
  /** Spacing of the heightfield samples (m). @default 0.05 */
  readonly gridSpacingM?: number;
  /** Height above ride height the body is dropped from (m). @default 0.01 */
  readonly dropM?: number;
  /** Damping ratio of each corner, for a quarter of the mass. @default 1 */
  readonly dampingRatio?: number;
  /** See CannonSettleOptions.contactRay. @default 'wheel-plane' */
  readonly contactRay?: 'body-z' | 'wheel-plane';
  /** Stick spring per tyre in the contact's tangent plane (N/m). @default 5e4 */
  readonly stickStiffnessNPerM?: number;
  /** Cap of the stick force as a ratio to the normal force. @default 1.5 */
  readonly stickCapRatio?: number;
  /** Margin of the sampled terrain region beyond the wheels (m). @default 1 */
  readonly regionMarginM?: number;
}

/**
 * The vehicle body on its four spring-damper corners in a cannon-es world (see the file header).
 * `contactForces()` casts the rays and applies the corner and stick forces for the current state,
 * filling the per-wheel readings; `advance()` steps the world by one time step.
 */
export class CannonRig {
  readonly world: CANNON.World;
  readonly body: CANNON.Body;
  readonly massKg: number;
  readonly weightN: number;
  readonly dt: number;
  /** Combined CG in the vehicle frame (x forward from the reference point, y left, z up) (m). */
  readonly cgBody: CANNON.Vec3;
  /** Per wheel, after contactForces(): normal load (N), load along gravity up (N), travel (m), stick/normal. */
  readonly loads = new Float64Array(4);
  readonly verticalLoads = new Float64Array(4);
  readonly travel = new Float64Array(4);
  readonly stickRatio = new Float64Array(4);
  /** Per wheel, after contactForces(): the ray's hit point (terrain frame) and whether it hit. */
  readonly hitPoint = [new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3()];
  readonly hit = [false, false, false, false];
  /** Unit up (opposite gravity), terrain frame. */
  readonly upWorld = new CANNON.Vec3(0, 0, 1);
  private readonly corners: Corner[];
  private readonly wheelPlane: boolean;
  private readonly stickNPerM: number;
  private readonly stickDampingNsPerM: number;
  private readonly stickCap: number;
  private readonly anchors = [new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3(), new CANNON.Vec3()];
  private readonly anchored = [false, false, false, false];
  private readonly prevCompression = new Float64Array(4);
  private readonly hadHit = [false, false, false, false];
  // Scratch (hoisted out of the step loop).
  private readonly rayFrom = new CANNON.Vec3();
  private readonly rayTo = new CANNON.Vec3();
  private readonly zBodyWorld = new CANNON.Vec3();
  private readonly yBodyWorld = new CANNON.Vec3();
  private readonly rayDir = new CANNON.Vec3();
  private readonly rel = new CANNON.Vec3();
  private readonly vPoint = new CANNON.Vec3();
  private readonly tmp = new CANNON.Vec3();
  private readonly normalForce = new CANNON.Vec3();
  private readonly stickForce = new CANNON.Vec3();
  private readonly totalForce = new CANNON.Vec3();
  private readonly rayResult = new CANNON.RaycastResult();
  private readonly rayOptions: { collisionFilterMask: number; skipBackfaces: boolean } = {
    collisionFilterMask: TERRAIN_GROUP,
    skipBackfaces: true,
  };
  private readonly localUp = new CANNON.Vec3(0, 0, 1);
  private readonly localLeft = new CANNON.Vec3(0, 1, 0);

  constructor(vehicle: Vehicle, terrain: Terrain, pose: Pose, tilt: Tilt | null, opts: CannonRigOptions = {}) {
    const dt = opts.timeStepS ?? 1 / 500;
    this.dt = dt;
    const spacingM = opts.gridSpacingM ?? 0.05;
    const dropM = opts.dropM ?? 0.01;
    const zeta = opts.dampingRatio ?? 1;
    const regionMarginM = opts.regionMarginM ?? REGION_MARGIN_M;

    // --- Mass and combined CG (vehicle frame: x forward from the reference point, y left, z up).
    const L = vehicle.wheelbaseM;
    let massKg = vehicle.massKg;
    let behindSum = vehicle.massKg * vehicle.cg.behindFrontAxleM;
    let leftSum = vehicle.massKg * vehicle.cg.leftOfCentreM;
    let heightSum = vehicle.massKg * vehicle.cg.heightM;
    for (const p of vehicle.payload) {
      massKg += p.massKg;
      behindSum += p.massKg * p.behindFrontAxleM;
      leftSum += p.massKg * p.leftOfCentreM;
      heightSum += p.massKg * p.heightM;
    }
    const cgBehindM = behindSum / massKg;
    const cgLeftM = leftSum / massKg;
    const cgHeightM = heightSum / massKg;
    const cgBody = new CANNON.Vec3(L / 2 - cgBehindM, cgLeftM, cgHeightM);
    this.cgBody = cgBody;
    this.massKg = massKg;
    const weightN = massKg * STANDARD_GRAVITY_M_PER_S2;
    this.weightN = weightN;

    // --- Static shares (Gillespie ch. 2: W·b/L front, W·a/L rear; left/right by the lateral offset).
    const frontAxleN = (weightN * (L - cgBehindM)) / L;
    const rearAxleN = (weightN * cgBehindM) / L;
    const tf = vehicle.trackFrontM;
    const tr = vehicle.trackRearM;
    const preload = wheelCount(
      (frontAxleN * (tf / 2 + cgLeftM)) / tf,
      (frontAxleN * (tf / 2 - cgLeftM)) / tf,
      (rearAxleN * (tr / 2 + cgLeftM)) / tr,
      (rearAxleN * (tr / 2 - cgLeftM)) / tr,
    );

    const corners: Corner[] = [];
    for (let i = 0; i < 4; i++) {
      const front = i < 2;
      const left = i % 2 === 0;
      const tyre = front ? vehicle.tyreFront : vehicle.tyreRear;
      const susp = front ? vehicle.suspensionFront : vehicle.suspensionRear;
      const track = front ? tf : tr;
      const ks = susp.wheelRateNPerM;
      const kt = tyre.stiffnessNPerM;
      const k = (ks * kt) / (ks + kt);
      // Compression at which this corner's load reaches zero (negative): the ray must reach past it.
      const cZeroWithin = -preload[i] / k;
      const cDroop = (-susp.droopM * (ks + kt)) / kt;
      const cZero = cZeroWithin >= cDroop ? cZeroWithin : cDroop - (preload[i] - ks * susp.droopM) / kt;
      corners.push({
        hardpointBody: new CANNON.Vec3(
          (front ? L / 2 : -L / 2) - cgBody.x,
          (left ? track / 2 : -track / 2) - cgBody.y,
          tyre.radiusM - cgBody.z,
        ),
        radiusM: tyre.radiusM,
        preloadN: preload[i],
        springNPerM: ks,
        tyreNPerM: kt,
        seriesNPerM: k,
        bumpM: susp.bumpM,
        droopM: susp.droopM,
        dampingNsPerM: 2 * zeta * Math.sqrt((k * massKg) / 4),
        rayLengthM: tyre.radiusM - cZero + RAY_MARGIN_M,
      });
    }
    this.corners = corners;

    // --- Terrain: sample a heightfield over a region around the wheels (terrain frame).
    const field = new TerrainField(terrain);
    const ch = Math.cos(pose.headingRad);
    const sh = Math.sin(pose.headingRad);
    const wheelX = new Float64Array(4);
    const wheelY = new Float64Array(4);
    const groundZ = new Float64Array(4);
    let xMin = Infinity;
    let xMax = -Infinity;
    let yMin = Infinity;
    let yMax = -Infinity;
    for (let i = 0; i < 4; i++) {
      const bx = corners[i].hardpointBody.x + cgBody.x;
      const by = corners[i].hardpointBody.y + cgBody.y;
      wheelX[i] = pose.xM + ch * bx - sh * by;
      wheelY[i] = pose.yM + sh * bx + ch * by;
      groundZ[i] = field.height(wheelX[i], wheelY[i]);
      xMin = Math.min(xMin, wheelX[i]);
      xMax = Math.max(xMax, wheelX[i]);
      yMin = Math.min(yMin, wheelY[i]);
      yMax = Math.max(yMax, wheelY[i]);
    }
    const maxRadiusM = Math.max(vehicle.tyreFront.radiusM, vehicle.tyreRear.radiusM);
    const x0 = xMin - maxRadiusM - regionMarginM;
    const y0 = yMin - maxRadiusM - regionMarginM;
    const nx = Math.ceil((xMax + maxRadiusM + regionMarginM - x0) / spacingM) + 1;
    const ny = Math.ceil((yMax + maxRadiusM + regionMarginM - y0) / spacingM) + 1;
    const heights: number[][] = [];
    for (let ix = 0; ix < nx; ix++) {
      const column: number[] = new Array(ny);
      for (let iy = 0; iy < ny; iy++) column[iy] = field.height(x0 + ix * spacingM, y0 + iy * spacingM);
      heights.push(column);
    }

    // --- World: gravity in the terrain frame, rotated by the tilt.
    const world = new CANNON.World();
    this.world = world;
    this.setTilt(pose.headingRad, tilt);

    const ground = new CANNON.Body({ mass: 0, collisionFilterGroup: TERRAIN_GROUP });
    ground.addShape(new CANNON.Heightfield(heights, { elementSize: spacingM }));
    ground.position.set(x0, y0, 0);
    world.addBody(ground);

    // --- The vehicle body: box inertia set by hand (no shapes, so cannon-es cannot derive it).
    const lengthM = L + vehicle.body.frontOverhangM + vehicle.body.rearOverhangM;
    const widthM = Math.max(vehicle.body.widthM, tf, tr);
    const heightM = vehicle.body.roofHeightM;
    const body = new CANNON.Body({ mass: massKg, collisionFilterGroup: 2, collisionFilterMask: 0 });
    this.body = body;
    body.linearDamping = 0;
    body.angularDamping = 0;
    body.inertia.set(
      (massKg * (widthM * widthM + heightM * heightM)) / 12,
      (massKg * (lengthM * lengthM + heightM * heightM)) / 12,
      (massKg * (lengthM * lengthM + widthM * widthM)) / 12,
    );
    body.invInertia.set(1 / body.inertia.x, 1 / body.inertia.y, 1 / body.inertia.z);

    // Start on the least-squares plane z = a + b·x + c·y through the ground under the hardpoints.
    const plane = fitPlane(wheelX, wheelY, groundZ);
    const normal = new CANNON.Vec3(-plane[1], -plane[2], 1);
    normal.normalize();
    const yaw = new CANNON.Quaternion();
    yaw.setFromAxisAngle(new CANNON.Vec3(0, 0, 1), pose.headingRad);
    const lean = new CANNON.Quaternion();
    lean.setFromVectors(new CANNON.Vec3(0, 0, 1), normal);
    lean.mult(yaw, body.quaternion);
    body.quaternion.normalize();
    const refWorld = new CANNON.Vec3(pose.xM, pose.yM, plane[0] + plane[1] * pose.xM + plane[2] * pose.yM);
    refWorld.addScaledVector(dropM, normal, refWorld);
    const cgOffsetWorld = body.quaternion.vmult(cgBody);
    refWorld.vadd(cgOffsetWorld, body.position);
    body.previousPosition.copy(body.position);
    body.updateInertiaWorld(true);
    world.addBody(body);

    this.wheelPlane = (opts.contactRay ?? 'wheel-plane') === 'wheel-plane';
    this.stickNPerM = opts.stickStiffnessNPerM ?? STICK_STIFFNESS_N_PER_M;
    this.stickDampingNsPerM = 2 * Math.sqrt((this.stickNPerM * massKg) / 4);
    this.stickCap = opts.stickCapRatio ?? STICK_CAP_RATIO;
  }

  /** Tilt-table gravity: the table descends toward heading + downhill by the angle (null: level). */
  setTilt(headingRad: number, tilt: Tilt | null): void {
    const g = STANDARD_GRAVITY_M_PER_S2;
    if (tilt) {
      const dir = headingRad + tilt.downhillRad;
      const sa = Math.sin(tilt.angleRad);
      this.world.gravity.set(g * sa * Math.cos(dir), g * sa * Math.sin(dir), -g * Math.cos(tilt.angleRad));
    } else {
      this.world.gravity.set(0, 0, -g);
    }
    this.world.gravity.scale(-1 / g, this.upWorld);
  }

  /** Casts the four rays and applies the corner and stick forces for the current state. */
  contactForces(): void {
    const body = this.body;
    const { rayFrom, rayTo, rayDir, rayResult, rayOptions, zBodyWorld, yBodyWorld, rel, vPoint, tmp } = this;
    const dt = this.dt;
    body.quaternion.vmult(this.localUp, zBodyWorld);
    body.quaternion.vmult(this.localLeft, yBodyWorld);
    for (let i = 0; i < 4; i++) {
      const k = this.corners[i];
      body.pointToWorldFrame(k.hardpointBody, rayFrom);
      rayDir.copy(zBodyWorld);
      rayDir.negate(rayDir);
      rayFrom.addScaledVector(k.rayLengthM, rayDir, rayTo);
      rayResult.reset();
      this.world.raycastClosest(rayFrom, rayTo, rayOptions, rayResult);
      if (this.wheelPlane && rayResult.hasHit) {
        // Round tyre: cast again toward the wheel circle's lowest point over this ground, i.e.
        // along −(ground normal projected on the wheel plane, which is normal to body y).
        const n0 = rayResult.hitNormalWorld;
        n0.addScaledVector(-n0.dot(yBodyWorld), yBodyWorld, rayDir);
        const len = rayDir.length();
        if (len > 1e-9) {
          rayDir.scale(-1 / len, rayDir);
          rayFrom.addScaledVector(k.rayLengthM, rayDir, rayTo);
          rayResult.reset();
          this.world.raycastClosest(rayFrom, rayTo, rayOptions, rayResult);
        }
      }
      this.loads[i] = 0;
      this.verticalLoads[i] = 0;
      this.stickRatio[i] = 0;
      this.hit[i] = rayResult.hasHit;
      if (!rayResult.hasHit) {
        this.hadHit[i] = false;
        this.anchored[i] = false;
        this.travel[i] = -k.droopM;
        continue;
      }
      this.hitPoint[i].copy(rayResult.hitPointWorld);
      const c = k.radiusM - rayResult.distance;
      const rate = this.hadHit[i] ? (c - this.prevCompression[i]) / dt : 0;
      this.prevCompression[i] = c;
      this.hadHit[i] = true;
      let f = cornerSpring(k, c, this.travel, i);
      if (f > 0) {
        f += k.dampingNsPerM * rate;
        if (f < 0) f = 0;
      }
      if (f <= 0) {
        this.anchored[i] = false;
        continue;
      }
      const n = rayResult.hitNormalWorld;
      let nDotZ = n.dot(zBodyWorld);
      if (nDotZ < MIN_NORMAL_DOT) nDotZ = MIN_NORMAL_DOT;
      const normalN = f / nDotZ;
      n.scale(normalN, this.normalForce);

      // Stick: spring-damper in the tangent plane, anchored at the first touch.
      const p = rayResult.hitPointWorld;
      if (!this.anchored[i]) {
        this.anchors[i].copy(p);
        this.anchored[i] = true;
      }
      p.vsub(this.anchors[i], tmp);
      tmp.addScaledVector(-tmp.dot(n), n, tmp);
      tmp.scale(-this.stickNPerM, this.stickForce);
      p.vsub(body.position, rel);
      body.angularVelocity.cross(rel, vPoint);
      vPoint.vadd(body.velocity, vPoint);
      vPoint.addScaledVector(-vPoint.dot(n), n, vPoint);
      this.stickForce.addScaledVector(-this.stickDampingNsPerM, vPoint, this.stickForce);
      const stickN = this.stickForce.length();
      const capN = this.stickCap * normalN;
      if (stickN > capN) this.stickForce.scale(capN / stickN, this.stickForce);
      this.stickRatio[i] = stickN / normalN;

      this.normalForce.vadd(this.stickForce, this.totalForce);
      body.applyForce(this.totalForce, rel);
      this.loads[i] = normalN;
      this.verticalLoads[i] = this.totalForce.dot(this.upWorld);
    }
  }

  /** One fixed time step of the world (after contactForces()). */
  advance(): void {
    this.world.step(this.dt);
  }

  /**
   * Where a wheel stands or would touch, terrain frame, into out: the ray's hit point, or for a
   * wheel whose ray found nothing, its hardpoint dropped by the tyre radius along body −z.
   */
  wheelGroundPoint(i: number, out: CANNON.Vec3): CANNON.Vec3 {
    if (this.hit[i]) return out.copy(this.hitPoint[i]);
    const k = this.corners[i];
    this.body.pointToWorldFrame(k.hardpointBody, out);
    this.body.quaternion.vmult(this.localUp, this.tmp);
    return out.addScaledVector(-k.radiusM, this.tmp, out);
  }

  /** The largest stick / normal ratio over the wheels carrying more than minLoadN (default: any load). */
  maxStickRatio(minLoadN = 0): number {
    let m = 0;
    for (let i = 0; i < 4; i++) if (this.loads[i] > minLoadN && this.stickRatio[i] > m) m = this.stickRatio[i];
    return m;
  }
}

/**
 * Settles the vehicle on the terrain with cannon-es and returns the tyre loads. See the file
 * header for the model. Inputs are not mutated.
 */
export function settleWithCannon(
  vehicle: Vehicle,
  terrain: Terrain,
  pose: Pose,
  tilt: Tilt | null,
  opts: CannonSettleOptions = {},
): CannonSettleResult {
  const wallStartMs = performance.now();
  const rig = new CannonRig(vehicle, terrain, pose, tilt, opts);
  const dt = rig.dt;
  const maxTimeS = opts.maxTimeS ?? 20;
  const windowS = opts.settleWindowS ?? 0.5;
  const bandFraction = opts.settleBandFraction ?? 0.005;
  const bandRef = new Float64Array(4);
  const halfBandN = (bandFraction * rig.weightN) / 2;
  const loads = rig.loads;
  const body = rig.body;

  const maxSteps = Math.ceil(maxTimeS / dt);
  let steps = 0;
  let t = 0;
  let bandStartS = 0;
  let settled = false;
  let finite = true;
  for (; steps <= maxSteps; steps++) {
    t = steps * dt;
    rig.contactForces();
    // Settled: every load has stayed within ±halfBand of the band's reference for windowS.
    let inBand = steps > 0;
    for (let i = 0; i < 4; i++) {
      if (Math.abs(loads[i] - bandRef[i]) > halfBandN) inBand = false;
    }
    if (!inBand) {
      for (let i = 0; i < 4; i++) bandRef[i] = loads[i];
      bandStartS = t;
    } else if (t - bandStartS >= windowS - 1e-9) {
      settled = true;
      break;
    }
    if (!Number.isFinite(body.position.x + body.position.y + body.position.z)) {
      finite = false;
      break;
    }
    if (steps === maxSteps) break;
    rig.advance();
  }

  const v = rig.verticalLoads;
  const tr = rig.travel;
  return {
    loadsN: wheelCount(loads[0], loads[1], loads[2], loads[3]),
    verticalLoadsN: wheelCount(v[0], v[1], v[2], v[3]),
    travelM: wheelCount(tr[0], tr[1], tr[2], tr[3]),
    weightN: rig.weightN,
    maxStickRatio: rig.maxStickRatio(),
    settled: settled && finite,
    simulatedTimeS: t,
    steps,
    wallTimeMs: performance.now() - wallStartMs,
  };
}

/** Least-squares plane z = a + b·x + c·y through the points; returns [a, b, c]. */
function fitPlane(x: Float64Array, y: Float64Array, z: Float64Array): [number, number, number] {
  const n = x.length;
  let sx = 0;
  let sy = 0;
  let sz = 0;
  let sxx = 0;
  let syy = 0;
  let sxy = 0;
  let sxz = 0;
  let syz = 0;
  for (let i = 0; i < n; i++) {
    sx += x[i];
    sy += y[i];
    sz += z[i];
    sxx += x[i] * x[i];
    syy += y[i] * y[i];
    sxy += x[i] * y[i];
    sxz += x[i] * z[i];
    syz += y[i] * z[i];
  }
  // Normal equations [[n, sx, sy], [sx, sxx, sxy], [sy, sxy, syy]]·[a, b, c] = [sz, sxz, syz] (Cramer's rule).
  const det3 = (
    a11: number, a12: number, a13: number,
    a21: number, a22: number, a23: number,
    a31: number, a32: number, a33: number,
  ): number => a11 * (a22 * a33 - a23 * a32) - a12 * (a21 * a33 - a23 * a31) + a13 * (a21 * a32 - a22 * a31);
  const d = det3(n, sx, sy, sx, sxx, sxy, sy, sxy, syy);
  if (Math.abs(d) < 1e-12) return [sz / n, 0, 0];
  return [
    det3(sz, sx, sy, sxz, sxx, sxy, syz, sxy, syy) / d,
    det3(n, sz, sy, sx, sxz, sxy, sy, syz, syy) / d,
    det3(n, sx, sz, sx, sxx, sxz, sy, sxy, syz) / d,
  ];
}
