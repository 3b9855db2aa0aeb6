/**
 * The live tilt readout's arithmetic, pure: the device's orientation (W3C DeviceOrientation Event
 * Specification: alpha, beta, gamma in degrees, the device rotated by Z(alpha)·X'(beta)·Y''(gamma)
 * from the earth frame) to gravity in the device's frame, and, against a zero taken on level ground
 * and the way the device is mounted, the vehicle's roll and pitch (ISO 8855: roll + right side down,
 * pitch + nose down).
 */

export type Vec3 = readonly [number, number, number];

import { RAD_PER_DEG as DEG } from '../../present/units';

/**
 * Gravity's direction (unit) in the device frame (x right, y toward the top edge, z out of the screen).
 * R = Rz(α)·Rx(β)·Ry(γ) turns device into earth axes; gravity (0, 0, −1) in earth axes is −(third row of R)
 * in device axes = (cos β sin γ, −sin β, −cos β cos γ). Alpha (the compass heading) drops out.
 */
export function gravityInDevice(betaDeg: number, gammaDeg: number): Vec3 {
  const b = betaDeg * DEG;
  const g = gammaDeg * DEG;
  return [Math.cos(b) * Math.sin(g), -Math.sin(b), -Math.cos(b) * Math.cos(g)];
}

/** How the device sits in the vehicle: its axis pointing to the vehicle's front. */
export type Mount = 'flat-top-forward' | 'upright-facing-driver';

/** The device axis that points forward for a mount: lying flat with its top edge forward (+y), or upright with the screen toward the driver (−z). */
export function forwardAxis(m: Mount): Vec3 {
  return m === 'flat-top-forward' ? [0, 1, 0] : [0, 0, -1];
}

const dot = (a: Vec3, b: Vec3) => a[0] * b[0] + a[1] * b[1] + a[2] * b[2];
const cross = (a: Vec3, b: Vec3): Vec3 => [a[1] * b[2] - a[2] * b[1], a[2] * b[0] - a[0] * b[2], a[0] * b[1] - a[1] * b[0]];
const unit = (a: Vec3): Vec3 => {
  const n = Math.hypot(a[0], a[1], a[2]);
  return [a[0] / n, a[1] / n, a[2] / n];
};

/** The vehicle's axes in the device frame, from gravity on level ground (the zero) and the mount. Null if the forward axis is (nearly) vertical. */
export function vehicleAxes(gravityAtZero: Vec3, mount: Mount): { fwd: Vec3; left: Vec3; up: Vec3 } | null {
  const up = unit([-gravityAtZero[0], -gravityAtZero[1], -gravityAtZero[2]]);
  const f = forwardAxis(mount);
  const k = dot(f, up);
  const p: Vec3 = [f[0] - k * up[0], f[1] - k * up[1], f[2] - k * up[2]];
  if (Math.hypot(p[0], p[1], p[2]) < 0.2) return null;
  const fwd = unit(p);
  return { fwd, left: cross(up, fwd), up };
}

export interface VehicleTilt {
  /** ISO 8855 roll, + right side down (rad). */
  readonly rollRad: number;
  /** ISO 8855 pitch, + nose down (rad). */
  readonly pitchRad: number;
}

/** Roll and pitch of the vehicle from gravity now, both in the device frame. */
export function vehicleTilt(gravityNow: Vec3, axes: { fwd: Vec3; left: Vec3; up: Vec3 }): VehicleTilt {
  const g = unit(gravityNow);
  const dx = dot(g, axes.fwd);
  const dy = dot(g, axes.left);
  const dz = dot(g, axes.up);
  // Left side down: gravity leans to the left (+y); nose down: it leans forward (+x).
  return { rollRad: -Math.atan2(dy, -dz), pitchRad: Math.atan2(dx, -dz) };
}

export interface AxisLimits {
  /** Slope from level at which a wheel lifts / it tips, each way (rad). */
  readonly liftRad: number;
  readonly tipRad: number;
  readonly operatingRad: number;
}

export interface AxisReading {
  /** |angle| and the side it is toward. */
  readonly angleRad: number;
  readonly toward: 'left side down' | 'right side down' | 'nose down' | 'tail down' | 'level';
  /** Degrees left to the first lift and to the tip (negative past it). */
  readonly toLiftRad: number;
  readonly toTipRad: number;
  readonly pastOperating: boolean;
}

/** One axis against this build's limits for the side it leans toward. */
export function readAxis(angleRad: number, kind: 'roll' | 'pitch', positive: AxisLimits, negative: AxisLimits): AxisReading {
  const lim = angleRad >= 0 ? positive : negative;
  const a = Math.abs(angleRad);
  const toward = a < 0.05 * DEG ? 'level' : kind === 'roll' ? (angleRad > 0 ? 'right side down' : 'left side down') : angleRad > 0 ? 'nose down' : 'tail down';
  return { angleRad: a, toward, toLiftRad: lim.liftRad - a, toTipRad: lim.tipRad - a, pastOperating: a > lim.operatingRad };
}
