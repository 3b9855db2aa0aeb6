/**
 * Support polygon and tip-over stability margins for a vehicle standing on its contact points.
 *
 * - Force-angle stability measure: Papadopoulos & Rey, "A new measure of tipover stability margin
 *   for mobile manipulators", ICRA 1996 (angle form) and Vehicle System Dynamics 2000 (angle ×
 *   distance × force form).
 * - Energy stability margin: Messuri & Klein, IEEE J. Robotics & Automation 1985; the closed form
 *   for an inclined edge follows García & González de Santos, Robotica 2005.
 * - Static stability margin: McGhee & Frank 1968.
 * All three are positive while the plumb line from the CG falls inside the support polygon,
 * zero on its edge (the tip) and negative outside.
 */

/** Grid the projected support points are snapped to (1/m): 1 nm. */
const HULL_GRID = 1e9;

export interface MarginsOut {
  forceAngleRad: number;
  forceAngleMeasure: number;
  energyM: number;
  staticM: number;
  /** Hull vertex index of the weakest edge's start, or -1. */
  weakestEdge: number;
  /** Hull vertices (indices into the input points), counter-clockwise seen from up. */
  hull: number[];
  /** Plumb point: the CG's projection along gravity onto the mean plane of the hull. */
  plumb: [number, number, number];
}

/**
 * Convex hull (Andrew's monotone chain) of points projected onto the plane normal to `up`.
 * pts: flat xyz array of n points. Returns vertex indices counter-clockwise seen from up.
 */
export function supportHull(pts: ArrayLike<number>, n: number, up: ArrayLike<number>): number[] {
  // Basis (e1, e2) of the plane normal to up, right-handed: e1 × e2 = up.
  const ux = up[0], uy = up[1], uz = up[2];
  let e1x: number, e1y: number, e1z: number;
  if (Math.abs(ux) < 0.9) {
    // e1 = normalize(x̂ − (x̂·up) up)
    e1x = 1 - ux * ux; e1y = -ux * uy; e1z = -ux * uz;
  } else {
    e1x = -uy * ux; e1y = 1 - uy * uy; e1z = -uy * uz;
  }
  const l = Math.hypot(e1x, e1y, e1z);
  e1x /= l; e1y /= l; e1z /= l;
  const e2x = uy * e1z - uz * e1y;
  const e2y = uz * e1x - ux * e1z;
  const e2z = ux * e1y - uy * e1x;
  const idx: number[] = [];
  const u: number[] = [];
  const v: number[] = [];
  for (let i = 0; i < n; i++) {
    idx.push(i);
    // Snap to a 1 nm grid so that points collinear in 3D tie exactly after projection; noisy
    // ties would let the monotone chain drop an extreme point as if it were a middle one.
    u.push(Math.round((pts[3 * i] * e1x + pts[3 * i + 1] * e1y + pts[3 * i + 2] * e1z) * HULL_GRID) / HULL_GRID);
    v.push(Math.round((pts[3 * i] * e2x + pts[3 * i + 1] * e2y + pts[3 * i + 2] * e2z) * HULL_GRID) / HULL_GRID);
  }
  idx.sort((a, b) => u[a] - u[b] || v[a] - v[b]);
  if (n < 3) return idx;
  const cross = (o: number, a: number, b: number): number => (u[a] - u[o]) * (v[b] - v[o]) - (v[a] - v[o]) * (u[b] - u[o]);
  const lower: number[] = [];
  for (const p of idx) {
    while (lower.length >= 2 && cross(lower[lower.length - 2], lower[lower.length - 1], p) <= 0) lower.pop();
    lower.push(p);
  }
  const upper: number[] = [];
  for (let k = idx.length - 1; k >= 0; k--) {
    const p = idx[k];
    while (upper.length >= 2 && cross(upper[upper.length - 2], upper[upper.length - 1], p) <= 0) upper.pop();
    upper.push(p);
  }
  lower.pop();
  upper.pop();
  return lower.concat(upper);
}

/**
 * Margins of a CG `cg` under net force `force` (gravity: weight along its direction) on the
 * support points `pts` (n points, flat xyz). `up` is the unit vector opposite the force.
 */
export function stabilityMargins(
  pts: ArrayLike<number>,
  n: number,
  cg: ArrayLike<number>,
  force: ArrayLike<number>,
): MarginsOut {
  const fmag = Math.hypot(force[0], force[1], force[2]);
  const up = [-force[0] / fmag, -force[1] / fmag, -force[2] / fmag];
  const hull = supportHull(pts, n, up);
  const out: MarginsOut = {
    forceAngleRad: -Math.PI,
    forceAngleMeasure: -Infinity,
    energyM: -Infinity,
    staticM: -Infinity,
    weakestEdge: -1,
    hull,
    plumb: [cg[0], cg[1], cg[2]],
  };
  // Plumb point on the hull's mean plane (through the hull's mean point, normal up).
  if (hull.length > 0) {
    let mx = 0, my = 0, mz = 0;
    for (const h of hull) {
      mx += pts[3 * h]; my += pts[3 * h + 1]; mz += pts[3 * h + 2];
    }
    mx /= hull.length; my /= hull.length; mz /= hull.length;
    const d = (cg[0] - mx) * up[0] + (cg[1] - my) * up[1] + (cg[2] - mz) * up[2];
    out.plumb = [cg[0] - d * up[0], cg[1] - d * up[1], cg[2] - d * up[2]];
  }
  if (hull.length < 3) {
    // Fewer than three support points: no area; the vehicle can only balance, so every margin is 0 at best.
    out.forceAngleRad = hull.length === 0 ? -Math.PI : 0;
    out.forceAngleMeasure = 0;
    out.energyM = 0;
    out.staticM = 0;
    out.weakestEdge = hull.length === 2 ? 0 : -1;
    if (hull.length === 2) {
      // Signed by which side the plumb line falls... with no area it can only be on the line or off it.
      const a = hull[0], b = hull[1];
      const dist = distToLine(pts, a, b, out.plumb);
      if (dist > 1e-9) {
        out.forceAngleRad = -Math.abs(out.forceAngleRad);
        out.staticM = -dist;
      }
    }
    return out;
  }
  let best = Infinity;
  for (let e = 0; e < hull.length; e++) {
    const a = hull[e];
    const b = hull[(e + 1) % hull.length];
    const ax = pts[3 * a], ay = pts[3 * a + 1], az = pts[3 * a + 2];
    let dx = pts[3 * b] - ax, dy = pts[3 * b + 1] - ay, dz = pts[3 * b + 2] - az;
    const dl = Math.hypot(dx, dy, dz);
    if (dl < 1e-12) continue;
    dx /= dl; dy /= dl; dz /= dl;
    // l: from CG to the axis, perpendicular to it.
    let lx = ax - cg[0], ly = ay - cg[1], lz = az - cg[2];
    const la = lx * dx + ly * dy + lz * dz;
    lx -= la * dx; ly -= la * dy; lz -= la * dz;
    // Force component normal to the axis.
    let fx = force[0], fy = force[1], fz = force[2];
    const fa = fx * dx + fy * dy + fz * dz;
    fx -= fa * dx; fy -= fa * dy; fz -= fa * dz;
    const lm = Math.hypot(lx, ly, lz);
    const fm = Math.hypot(fx, fy, fz);
    // Which side of the edge the plumb line falls: inside is to the left of a→b seen from up.
    const side = (dy * (out.plumb[2] - az) - dz * (out.plumb[1] - ay)) * up[0]
      + (dz * (out.plumb[0] - ax) - dx * (out.plumb[2] - az)) * up[1]
      + (dx * (out.plumb[1] - ay) - dy * (out.plumb[0] - ax)) * up[2];
    const sign = side >= 0 ? 1 : -1;
    let theta = 0;
    let dist = 0;
    if (lm > 1e-12 && fm > 1e-12) {
      const cx = ly * fz - lz * fy, cy = lz * fx - lx * fz, cz = lx * fy - ly * fx;
      theta = Math.atan2(Math.hypot(cx, cy, cz), lx * fx + ly * fy + lz * fz);
      // Distance from the axis to the line of the force through the CG: |l × f̂|.
      dist = Math.hypot(cx, cy, cz) / fm;
    }
    theta *= sign;
    // Energy: rotate R = −l about the axis; the CG's highest point is √(A² + B²) above the axis.
    const A = -(lx * up[0] + ly * up[1] + lz * up[2]);
    const bx = dy * -lz - dz * -ly, by = dz * -lx - dx * -lz, bz = dx * -ly - dy * -lx;
    const B = bx * up[0] + by * up[1] + bz * up[2];
    const energy = sign * (Math.sqrt(A * A + B * B) - A);
    // Static: horizontal distance from the plumb point to the edge, in the plane normal to up.
    const stat = sign * distToLineInPlane(pts, a, b, out.plumb, up);
    if (theta < best) {
      best = theta;
      out.weakestEdge = e;
      out.forceAngleRad = theta;
      out.forceAngleMeasure = theta * dist * fmag;
    }
    if (energy < out.energyM || out.energyM === -Infinity) out.energyM = energy;
    if (stat < out.staticM || out.staticM === -Infinity) out.staticM = stat;
  }
  return out;
}

function distToLine(pts: ArrayLike<number>, a: number, b: number, p: ArrayLike<number>): number {
  const ax = pts[3 * a], ay = pts[3 * a + 1], az = pts[3 * a + 2];
  let dx = pts[3 * b] - ax, dy = pts[3 * b + 1] - ay, dz = pts[3 * b + 2] - az;
  const dl = Math.hypot(dx, dy, dz) || 1;
  dx /= dl; dy /= dl; dz /= dl;
  const px = p[0] - ax, py = p[1] - ay, pz = p[2] - az;
  return Math.hypot(py * dz - pz * dy, pz * dx - px * dz, px * dy - py * dx);
}

function distToLineInPlane(pts: ArrayLike<number>, a: number, b: number, p: ArrayLike<number>, up: ArrayLike<number>): number {
  // Project the edge onto the plane normal to up, then the in-plane distance to it.
  const proj = (x: number, y: number, z: number): [number, number, number] => {
    const d = x * up[0] + y * up[1] + z * up[2];
    return [x - d * up[0], y - d * up[1], z - d * up[2]];
  };
  const A = proj(pts[3 * a], pts[3 * a + 1], pts[3 * a + 2]);
  const B = proj(pts[3 * b], pts[3 * b + 1], pts[3 * b + 2]);
  const P = proj(p[0], p[1], p[2]);
  let dx = B[0] - A[0], dy = B[1] - A[1], dz = B[2] - A[2];
  const dl = Math.hypot(dx, dy, dz) || 1;
  dx /= dl; dy /= dl; dz /= dl;
  const px = P[0] - A[0], py = P[1] - A[1], pz = P[2] - A[2];
  return Math.hypot(py * dz - pz * dy, pz * dx - px * dz, px * dy - py * dx);
}
