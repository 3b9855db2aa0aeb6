/**
 * The local frame: a 64-bit origin subtracted from every coordinate before it is stored in
 * 32 bits. A UTM easting of 500 000 m held in float32 keeps only ~3 cm; relative to a local
 * origin a few hundred metres away it keeps ~0.03 mm (IEEE 754 single precision, 24-bit
 * significand). Also applies the unit (to metres) and the up axis (y-up files turned z-up by
 * a +90° rotation about x: (x, y, z) → (x, −z, y), which keeps the frame right-handed).
 */
import type { LocalOrigin } from './types';

export interface FrameSettings {
  /** Metres per source unit. */
  readonly unitM: number;
  readonly up: 'z' | 'y';
  /** Crop in source coordinates (after the up swap), [x0, y0, x1, y1], or null. */
  readonly crop: readonly [number, number, number, number] | null;
}

/** Swaps a source point to z-up in place (out[0..2]). */
export function toZUp(x: number, y: number, z: number, up: 'z' | 'y', out: Float64Array): void {
  if (up === 'y') {
    out[0] = x;
    out[1] = -z;
    out[2] = y;
  } else {
    out[0] = x;
    out[1] = y;
    out[2] = z;
  }
}

/**
 * Subtracts the origin in float64, converts to metres and stores float32. `src` holds
 * interleaved x, y, z already z-up, in source units. Returns the local coordinates.
 */
export function localise(src: ArrayLike<number>, count: number, origin: LocalOrigin, unitM: number): Float32Array {
  const out = new Float32Array(count * 3);
  for (let i = 0; i < count; i++) {
    out[3 * i] = (src[3 * i] - origin.x) * unitM;
    out[3 * i + 1] = (src[3 * i + 1] - origin.y) * unitM;
    out[3 * i + 2] = (src[3 * i + 2] - origin.z) * unitM;
  }
  return out;
}

/** Bounding box of interleaved xyz (first `count` points), float64. */
export function boundsOf(src: ArrayLike<number>, count: number): [number, number, number, number, number, number] {
  let x0 = Infinity;
  let y0 = Infinity;
  let z0 = Infinity;
  let x1 = -Infinity;
  let y1 = -Infinity;
  let z1 = -Infinity;
  for (let i = 0; i < count; i++) {
    const x = src[3 * i];
    const y = src[3 * i + 1];
    const z = src[3 * i + 2];
    if (x < x0) x0 = x;
    if (x > x1) x1 = x;
    if (y < y0) y0 = y;
    if (y > y1) y1 = y;
    if (z < z0) z0 = z;
    if (z > z1) z1 = z;
  }
  return [x0, y0, z0, x1, y1, z1];
}

/**
 * The origin of the local frame: the centre of the (cropped) area in x and y, so that the
 * scenario's pose (0, 0) stands in its middle, and the lowest point in z.
 */
export function originOf(bounds: readonly number[]): LocalOrigin {
  return { x: (bounds[0] + bounds[3]) / 2, y: (bounds[1] + bounds[4]) / 2, z: bounds[2] };
}

/** Keeps the points inside the crop (source coordinates); returns the new count (compacts in place). */
export function cropInPlace(xyz: Float64Array, count: number, crop: readonly [number, number, number, number], extra: Uint8Array | null): number {
  const x0 = Math.min(crop[0], crop[2]);
  const x1 = Math.max(crop[0], crop[2]);
  const y0 = Math.min(crop[1], crop[3]);
  const y1 = Math.max(crop[1], crop[3]);
  let n = 0;
  for (let i = 0; i < count; i++) {
    const x = xyz[3 * i];
    const y = xyz[3 * i + 1];
    if (x < x0 || x > x1 || y < y0 || y > y1) continue;
    if (n !== i) {
      xyz[3 * n] = x;
      xyz[3 * n + 1] = y;
      xyz[3 * n + 2] = xyz[3 * i + 2];
      if (extra) extra[n] = extra[i];
    }
    n++;
  }
  return n;
}
