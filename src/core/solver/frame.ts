/**
 * The body frame of a solved pose as plain data, and the one mapping from body points to the terrain
 * frame. Everything outside the solver reads the pose through this (never the solver's state vector).
 *
 * Body frame (ISO 8855): origin at the vehicle's reference point (on the ground at ride height, midway
 * between the axles, on the centre line), x forward, y left, z up. Rotation R = Rz(heading) · Ry(pitch)
 * · Rx(roll), row-major, taking body components to terrain components: p_terrain = origin + R · p_body.
 */
import type { BodyFrame } from '../model/types';
import { Q_PITCH, Q_ROLL, Q_Z, type VehicleModel } from './model';

export type { BodyFrame } from '../model/types';

/** The body frame of state x on the model's pose (allocates the returned object). */
export function bodyFrameOf(model: VehicleModel, x: Float64Array): BodyFrame {
  const roll = x[Q_ROLL];
  const pitch = x[Q_PITCH];
  const cp = Math.cos(model.headingRad), sp = Math.sin(model.headingRad);
  const ct = Math.cos(pitch), st = Math.sin(pitch);
  const cf = Math.cos(roll), sf = Math.sin(roll);
  return {
    originM: [model.poseX, model.poseY, x[Q_Z]],
    rotation: [
      cp * ct, cp * st * sf - sp * cf, cp * st * cf + sp * sf,
      sp * ct, sp * st * sf + cp * cf, sp * st * cf - cp * sf,
      -st, ct * sf, ct * cf,
    ],
  };
}

/**
 * A point given in the body frame (m), in the terrain frame (m): origin + R · p. Writes into `out`
 * when given (no allocation), else returns a new array.
 */
export function bodyToTerrain(
  frame: BodyFrame,
  xM: number,
  yM: number,
  zM: number,
  out: [number, number, number] | Float64Array = [0, 0, 0],
): [number, number, number] | Float64Array {
  const R = frame.rotation;
  const o = frame.originM;
  out[0] = o[0] + R[0] * xM + R[1] * yM + R[2] * zM;
  out[1] = o[1] + R[3] * xM + R[4] * yM + R[5] * zM;
  out[2] = o[2] + R[6] * xM + R[7] * yM + R[8] * zM;
  return out;
}
