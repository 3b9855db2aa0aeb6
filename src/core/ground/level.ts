/**
 * Levelling a scan that has no georeference: a plane found by RANSAC (Fischler & Bolles 1981,
 * "Random sample consensus", Comm. ACM 24(6)) on the points, refined by least squares on its
 * inliers (z = a·x + b·y + c, the normal equations), then the cloud rotated about its centroid so
 * that plane is level (Rodrigues' rotation formula). The random source is a fixed-seed generator,
 * so the same file always levels the same way. Never applied to georeferenced ground: its slope is
 * the point.
 */

export interface LevelResult {
  /** Angle between the fitted plane and level before the rotation (rad). */
  readonly tiltRad: number;
  /** Direction the plane fell toward (rad from +x, counter-clockwise). */
  readonly downhillRad: number;
  readonly inliers: number;
  /** Distance from the plane that counts as on it (m). */
  readonly thresholdM: number;
}

/** Park–Miller minimal standard generator (Park & Miller 1988), fixed seed. */
function lcg(seed: number): () => number {
  let s = seed % 2147483647;
  if (s <= 0) s += 2147483646;
  return () => {
    s = (s * 48271) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

/** Fits the dominant plane; returns [a, b, c] of z = a·x + b·y + c and the inlier count. */
export function fitGroundPlane(xyz: Float32Array, count: number, thresholdM: number, iterations = 400): { plane: [number, number, number]; inliers: number } {
  const rnd = lcg(20260101);
  let bestCount = -1;
  let best: [number, number, number, number] = [0, 0, 1, 0];
  // Score on at most 20 000 points (a fixed stride), for speed.
  const stride = Math.max(1, Math.floor(count / 20000));
  for (let it = 0; it < iterations; it++) {
    const i = Math.floor(rnd() * count) * 3;
    const j = Math.floor(rnd() * count) * 3;
    const k = Math.floor(rnd() * count) * 3;
    const ux = xyz[j] - xyz[i];
    const uy = xyz[j + 1] - xyz[i + 1];
    const uz = xyz[j + 2] - xyz[i + 2];
    const vx = xyz[k] - xyz[i];
    const vy = xyz[k + 1] - xyz[i + 1];
    const vz = xyz[k + 2] - xyz[i + 2];
    let nx = uy * vz - uz * vy;
    let ny = uz * vx - ux * vz;
    let nz = ux * vy - uy * vx;
    const len = Math.hypot(nx, ny, nz);
    if (len < 1e-12) continue;
    nx /= len;
    ny /= len;
    nz /= len;
    // The ground is nearer level than vertical (a scan is levelled from a tilt of tens of degrees, not more).
    if (Math.abs(nz) < 0.5) continue;
    const d = -(nx * xyz[i] + ny * xyz[i + 1] + nz * xyz[i + 2]);
    let n = 0;
    for (let q = 0; q < count; q += stride) {
      const e = nx * xyz[3 * q] + ny * xyz[3 * q + 1] + nz * xyz[3 * q + 2] + d;
      if (e < thresholdM && e > -thresholdM) n++;
    }
    if (n > bestCount) {
      bestCount = n;
      best = [nx, ny, nz, d];
    }
  }
  // Least squares z = a x + b y + c over the inliers (all points), normal equations solved by Cramer's rule.
  const [nx, ny, nz, d] = best;
  let sxx = 0, sxy = 0, syy = 0, sx = 0, sy = 0, sz = 0, sxz = 0, syz = 0, m = 0;
  for (let q = 0; q < count; q++) {
    const x = xyz[3 * q];
    const y = xyz[3 * q + 1];
    const z = xyz[3 * q + 2];
    const e = nx * x + ny * y + nz * z + d;
    if (!(e < thresholdM && e > -thresholdM)) continue;
    sxx += x * x;
    sxy += x * y;
    syy += y * y;
    sx += x;
    sy += y;
    sz += z;
    sxz += x * z;
    syz += y * z;
    m++;
  }
  const A = [
    [sxx, sxy, sx],
    [sxy, syy, sy],
    [sx, sy, m],
  ];
  const rhs = [sxz, syz, sz];
  const det3 = (M: number[][]) =>
    M[0][0] * (M[1][1] * M[2][2] - M[1][2] * M[2][1]) - M[0][1] * (M[1][0] * M[2][2] - M[1][2] * M[2][0]) + M[0][2] * (M[1][0] * M[2][1] - M[1][1] * M[2][0]);
  const D = det3(A);
  if (m < 3 || Math.abs(D) < 1e-18) return { plane: [-nx / nz, -ny / nz, -d / nz], inliers: Math.max(m, 0) };
  const col = (j: number) => A.map((row, r) => row.map((v, c) => (c === j ? rhs[r] : v)));
  return { plane: [det3(col(0)) / D, det3(col(1)) / D, det3(col(2)) / D], inliers: m };
}

/** Rotates the points (in place) so the fitted plane is level; the lowest point stays at its height. */
export function levelPoints(xyz: Float32Array, count: number, thresholdM: number): LevelResult {
  const { plane, inliers } = fitGroundPlane(xyz, count, thresholdM);
  const [a, b] = plane;
  // Plane normal (−a, −b, 1) normalised; rotate it onto +z about k = n × z.
  const len = Math.hypot(a, b, 1);
  const nx = -a / len;
  const ny = -b / len;
  const nz = 1 / len;
  const tilt = Math.acos(Math.min(1, nz));
  const downhill = Math.atan2(-b, -a);
  if (tilt < 1e-12) return { tiltRad: 0, downhillRad: 0, inliers, thresholdM };
  // Axis k = n × ẑ / |n × ẑ| = (ny, −nx, 0) / s.
  const s = Math.hypot(nx, ny);
  const kx = ny / s;
  const ky = -nx / s;
  const cos = nz;
  const sin = s;
  let cx = 0;
  let cy = 0;
  let cz = 0;
  for (let q = 0; q < count; q++) {
    cx += xyz[3 * q];
    cy += xyz[3 * q + 1];
    cz += xyz[3 * q + 2];
  }
  cx /= count;
  cy /= count;
  cz /= count;
  let zmin = Infinity;
  for (let q = 0; q < count; q++) {
    const x = xyz[3 * q] - cx;
    const y = xyz[3 * q + 1] - cy;
    const z = xyz[3 * q + 2] - cz;
    // Rodrigues: v cosθ + (k × v) sinθ + k (k·v)(1 − cosθ), with k_z = 0.
    const kv = kx * x + ky * y;
    const rx = x * cos + ky * z * sin + kx * kv * (1 - cos);
    const ry = y * cos - kx * z * sin + ky * kv * (1 - cos);
    const rz = z * cos + (kx * y - ky * x) * sin;
    xyz[3 * q] = rx + cx;
    xyz[3 * q + 1] = ry + cy;
    xyz[3 * q + 2] = rz + cz;
    if (rz + cz < zmin) zmin = rz + cz;
  }
  for (let q = 0; q < count; q++) xyz[3 * q + 2] -= zmin;
  return { tiltRad: tilt, downhillRad: downhill, inliers, thresholdM };
}
