/**
 * The one place where core data (plain arrays, SI, terrain frame z up) becomes three.js objects.
 * The scene keeps the core's frame: three's world is z up (camera.up = +z), metres.
 */
import * as THREE from 'three';
import { TerrainField, type Pose, type SolveResult, type Terrain, type Tilt, type VehicleModel } from '../core';
import { LOAD_COLOUR_MAX_SHARE, loadColourRGB } from '../present/palette';

type V3 = readonly [number, number, number];

export const UP = new THREE.Vector3(0, 0, 1);

export function toVector3(a: V3, out: THREE.Vector3): THREE.Vector3 {
  return out.set(a[0], a[1], a[2]);
}

/**
 * Tilt-table rotation: the terrain frame turned so that it descends toward heading + downhill
 * by angleRad. Gravity in the terrain frame is then Rᵀ·(0, 0, −g), which is what the core
 * uses (VehicleModel.setTilt): g = (sin a cos d, sin a sin d, −cos a).
 */
export function tiltQuaternion(tilt: Tilt, headingRad: number, out: THREE.Quaternion): THREE.Quaternion {
  const d = headingRad + tilt.downhillRad;
  _axis.set(-Math.sin(d), Math.cos(d), 0);
  return out.setFromAxisAngle(_axis, tilt.angleRad);
}
const _axis = new THREE.Vector3();

/**
 * Body pose in the terrain frame: origin (the reference point) and rotation Rz(heading)·Ry(pitch)·Rx(roll).
 * The origin height comes from the total CG: M·cg = ms·(o + R·cs) + Σ mu·wheelCentre, solved for o.
 */
export function bodyMatrix(model: VehicleModel, pose: Pose, r: SolveResult, out: THREE.Matrix4): THREE.Matrix4 {
  _euler.set(r.body.rollRad, r.body.pitchRad, pose.headingRad, 'ZYX');
  _quat.setFromEuler(_euler);
  const cs = model.cgSprungBody;
  _v.set(cs[0], cs[1], cs[2]).applyQuaternion(_quat);
  const M = model.totalMassKg;
  let sx = M * r.body.cgWorld[0];
  let sy = M * r.body.cgWorld[1];
  let sz = M * r.body.cgWorld[2];
  for (let i = 0; i < 4; i++) {
    const mu = model.axles[i >> 1].unsprungPerWheelKg;
    const c = r.wheels[i].centreWorld;
    sx -= mu * c[0];
    sy -= mu * c[1];
    sz -= mu * c[2];
  }
  const ms = model.sprungMassKg;
  _o.set(sx / ms - _v.x, sy / ms - _v.y, sz / ms - _v.z);
  return out.compose(_o, _quat, _one);
}
const _euler = new THREE.Euler();
const _quat = new THREE.Quaternion();
const _v = new THREE.Vector3();
const _o = new THREE.Vector3();
const _one = new THREE.Vector3(1, 1, 1);

/** Orientation that turns a three cylinder (axis +y) to lie along dir. */
export function alongQuaternion(dir: V3 | THREE.Vector3, out: THREE.Quaternion): THREE.Quaternion {
  if (dir instanceof THREE.Vector3) _d.copy(dir);
  else _d.set(dir[0], dir[1], dir[2]);
  const len = _d.length();
  if (len < 1e-12) return out.identity();
  return out.setFromUnitVectors(_y, _d.multiplyScalar(1 / len));
}
const _d = new THREE.Vector3();
const _y = new THREE.Vector3(0, 1, 0);

export interface TerrainExtent {
  readonly xMinM: number;
  readonly xMaxM: number;
  readonly yMinM: number;
  readonly yMaxM: number;
}

/** Area drawn: around the vehicle and its path, with margin. */
export function terrainExtent(
  pose: Pose,
  path: { fromM: readonly [number, number]; viaM?: readonly (readonly [number, number])[]; toM: readonly [number, number] } | null,
  marginM = 7,
): TerrainExtent {
  let x0 = pose.xM;
  let x1 = pose.xM;
  let y0 = pose.yM;
  let y1 = pose.yM;
  if (path) {
    for (const p of [path.fromM, ...(path.viaM ?? []), path.toM]) {
      x0 = Math.min(x0, p[0]);
      x1 = Math.max(x1, p[0]);
      y0 = Math.min(y0, p[1]);
      y1 = Math.max(y1, p[1]);
    }
  }
  // Round outward to whole metres so the grid lines fall on round numbers.
  return {
    xMinM: Math.floor(x0 - marginM),
    xMaxM: Math.ceil(x1 + marginM),
    yMinM: Math.floor(y0 - marginM),
    yMaxM: Math.ceil(y1 + marginM),
  };
}

/** Largest number of vertices per terrain mesh side; the step grows for large areas. */
const MAX_SIDE = 200;

export interface TerrainBuffers {
  readonly geometry: THREE.BufferGeometry;
  /** Grid lines every gridM on the surface (a LineSegments geometry). */
  readonly grid: THREE.BufferGeometry;
  readonly zMinM: number;
  readonly zMaxM: number;
}

/**
 * Samples the terrain into a shaded mesh: positions from TerrainField.height, normals from its
 * gradient, vertex colours a muted earth tone brightened with height. Steps show as steep faces
 * one sample wide.
 */
export function terrainBuffers(terrain: Terrain, ext: TerrainExtent, stepM = 0.08, gridM = 1): TerrainBuffers {
  const field = new TerrainField(terrain);
  const w = ext.xMaxM - ext.xMinM;
  const h = ext.yMaxM - ext.yMinM;
  const step = Math.max(stepM, w / MAX_SIDE, h / MAX_SIDE);
  const nx = Math.ceil(w / step) + 1;
  const ny = Math.ceil(h / step) + 1;
  const pos = new Float32Array(nx * ny * 3);
  const nor = new Float32Array(nx * ny * 3);
  const col = new Float32Array(nx * ny * 3);
  const grad = new Float64Array(2);
  let zMin = Infinity;
  let zMax = -Infinity;
  for (let j = 0; j < ny; j++) {
    const y = Math.min(ext.yMinM + j * step, ext.yMaxM);
    for (let i = 0; i < nx; i++) {
      const x = Math.min(ext.xMinM + i * step, ext.xMaxM);
      const z = field.sample(x, y, grad);
      const k = 3 * (j * nx + i);
      pos[k] = x;
      pos[k + 1] = y;
      pos[k + 2] = z;
      const inv = 1 / Math.hypot(grad[0], grad[1], 1);
      nor[k] = -grad[0] * inv;
      nor[k + 1] = -grad[1] * inv;
      nor[k + 2] = inv;
      if (z < zMin) zMin = z;
      if (z > zMax) zMax = z;
    }
  }
  const span = Math.max(zMax - zMin, 1e-6);
  for (let n = 0; n < nx * ny; n++) {
    const t = (pos[3 * n + 2] - zMin) / span;
    col[3 * n] = 0.55 + 0.2 * t;
    col[3 * n + 1] = 0.5 + 0.18 * t;
    col[3 * n + 2] = 0.42 + 0.14 * t;
  }
  const idx = new Uint32Array((nx - 1) * (ny - 1) * 6);
  let q = 0;
  for (let j = 0; j < ny - 1; j++) {
    for (let i = 0; i < nx - 1; i++) {
      const a = j * nx + i;
      const b = a + 1;
      const c = a + nx;
      const d = c + 1;
      idx[q++] = a;
      idx[q++] = b;
      idx[q++] = d;
      idx[q++] = a;
      idx[q++] = d;
      idx[q++] = c;
    }
  }
  const geometry = new THREE.BufferGeometry();
  geometry.setAttribute('position', new THREE.BufferAttribute(pos, 3));
  geometry.setAttribute('normal', new THREE.BufferAttribute(nor, 3));
  geometry.setAttribute('color', new THREE.BufferAttribute(col, 3));
  geometry.setIndex(new THREE.BufferAttribute(idx, 1));
  geometry.computeBoundingSphere();

  // Grid lines: along x at every whole gridM of y, and along y at every whole gridM of x,
  // following the surface at the mesh step, lifted a little to sit on top of it.
  const lift = 0.01;
  const lines: number[] = [];
  const addLine = (alongX: boolean, c: number): void => {
    const n = alongX ? nx : ny;
    let px = 0;
    let py = 0;
    let pz = 0;
    for (let s = 0; s < n; s++) {
      const x = alongX ? Math.min(ext.xMinM + s * step, ext.xMaxM) : c;
      const y = alongX ? c : Math.min(ext.yMinM + s * step, ext.yMaxM);
      const z = field.height(x, y) + lift;
      if (s > 0) lines.push(px, py, pz, x, y, z);
      px = x;
      py = y;
      pz = z;
    }
  };
  for (let y = Math.ceil(ext.yMinM / gridM) * gridM; y <= ext.yMaxM; y += gridM) addLine(true, y);
  for (let x = Math.ceil(ext.xMinM / gridM) * gridM; x <= ext.xMaxM; x += gridM) addLine(false, x);
  const grid = new THREE.BufferGeometry();
  grid.setAttribute('position', new THREE.BufferAttribute(new Float32Array(lines), 3));
  return { geometry, grid, zMinM: zMin, zMaxM: zMax };
}

const _rgb: [number, number, number] = [0, 0, 0];

/** Colour for a share of the static load (the one basis: normal load) on the load colour map over 0…2. */
export function loadShareColor(share: number | null, out: THREE.Color): THREE.Color {
  const [r, g, b] = loadColourRGB((share ?? 0) / LOAD_COLOUR_MAX_SHARE, _rgb);
  return out.setRGB(r, g, b, THREE.SRGBColorSpace);
}

/** Ring of the support polygon, lifted off the ground a little, as a flat position array (closed). */
export function polygonPositions(poly: SolveResult['supportPolygonWorld'], liftM: number, up: V3): Float32Array {
  const n = poly.length;
  const out = new Float32Array((n + (n > 0 ? 1 : 0)) * 3);
  for (let i = 0; i <= n && n > 0; i++) {
    const p = poly[i % n];
    out[3 * i] = p[0] + up[0] * liftM;
    out[3 * i + 1] = p[1] + up[1] * liftM;
    out[3 * i + 2] = p[2] + up[2] * liftM;
  }
  return out;
}
