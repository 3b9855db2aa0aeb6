/**
 * The same ground through every reader gives the same grid: one invented surface written as a
 * binary PLY mesh, an OBJ, a GLB (y up, as glTF requires), and as points in XYZ text, an ASCII
 * PLY, LAS 1.2 (point format 0) and LAS 1.4 (point format 6); units and up axis as the
 * formats state or as given.
 */
import { describe, expect, it } from 'vitest';
import { buildGround, type GroundSettings } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { plyMesh, plyPoints } from './plyWrite';
import { writeLas } from './lasWrite';

const surf = (x: number, y: number) => 0.2 * Math.sin(x * 1.3) * Math.cos(y * 0.9) + 0.05 * x;

function lattice(n: number, step: number): { pos: Float64Array; idx: Uint32Array } {
  const pos = new Float64Array(n * n * 3);
  for (let j = 0; j < n; j++) for (let i = 0; i < n; i++) pos.set([i * step, j * step, Math.round(surf(i * step, j * step) * 1000) / 1000], 3 * (j * n + i));
  const idx: number[] = [];
  for (let j = 0; j < n - 1; j++) for (let i = 0; i < n - 1; i++) {
    const a = j * n + i;
    idx.push(a, a + 1, a + n + 1, a, a + n + 1, a + n);
  }
  return { pos, idx: Uint32Array.from(idx) };
}

function glb(pos: Float64Array, idx: Uint32Array): Uint8Array {
  // glTF is y up: (x, y, z)_z-up → (x, z, −y).
  const nv = pos.length / 3;
  const bin = new Uint8Array(nv * 12 + idx.length * 4);
  const dv = new DataView(bin.buffer);
  for (let i = 0; i < nv; i++) {
    dv.setFloat32(12 * i, pos[3 * i], true);
    dv.setFloat32(12 * i + 4, pos[3 * i + 2], true);
    dv.setFloat32(12 * i + 8, -pos[3 * i + 1], true);
  }
  for (let k = 0; k < idx.length; k++) dv.setUint32(nv * 12 + 4 * k, idx[k], true);
  const json = {
    asset: { version: '2.0' },
    buffers: [{ byteLength: bin.length }],
    bufferViews: [{ buffer: 0, byteOffset: 0, byteLength: nv * 12 }, { buffer: 0, byteOffset: nv * 12, byteLength: idx.length * 4 }],
    accessors: [{ bufferView: 0, componentType: 5126, count: nv, type: 'VEC3' }, { bufferView: 1, componentType: 5125, count: idx.length, type: 'SCALAR' }],
    meshes: [{ primitives: [{ attributes: { POSITION: 0 }, indices: 1 }] }],
    nodes: [{ mesh: 0 }],
    scenes: [{ nodes: [0] }],
    scene: 0,
  };
  let jt = new TextEncoder().encode(JSON.stringify(json));
  const pad = (4 - (jt.length % 4)) % 4;
  jt = new TextEncoder().encode(JSON.stringify(json) + ' '.repeat(pad));
  const total = 12 + 8 + jt.length + 8 + bin.length;
  const out = new Uint8Array(total);
  const o = new DataView(out.buffer);
  o.setUint32(0, 0x46546c67, true);
  o.setUint32(4, 2, true);
  o.setUint32(8, total, true);
  o.setUint32(12, jt.length, true);
  o.setUint32(16, 0x4e4f534a, true);
  out.set(jt, 20);
  o.setUint32(20 + jt.length, bin.length, true);
  o.setUint32(24 + jt.length, 0x004e4942, true);
  out.set(bin, 28 + jt.length);
  return out;
}

async function gridOf(bytes: Uint8Array, file: string, s: GroundSettings) {
  return buildGround(await readGroundBytes(bytes, file), { cellM: 0.05, fill: true, outliers: false, ...s });
}

describe('one surface through every reader', () => {
  const { pos, idx } = lattice(61, 0.05);
  it('meshes: binary PLY, OBJ (in mm) and GLB (y up) give the same grid', async () => {
    const ply = await gridOf(plyMesh(Float32Array.from(pos), idx), 'a.ply', { unitM: 1, up: 'z' });
    const objText = Array.from({ length: pos.length / 3 }, (_, i) => `v ${pos[3 * i] * 1000} ${pos[3 * i + 1] * 1000} ${pos[3 * i + 2] * 1000}`).join('\n') + '\n' +
      Array.from({ length: idx.length / 3 }, (_, t) => `f ${idx[3 * t] + 1} ${idx[3 * t + 1] + 1} ${idx[3 * t + 2] + 1}`).join('\n');
    const obj = await gridOf(new TextEncoder().encode(objText), 'a.obj', { unitM: 0.001, up: 'z' });
    const g = await gridOf(glb(pos, idx), 'a.glb', {});
    expect(g.summary.up).toBe('y');
    expect(g.summary.trianglesRead).toBe(idx.length / 3);
    for (const other of [obj, g]) {
      expect(other.grid.cols).toBe(ply.grid.cols);
      expect(other.grid.rows).toBe(ply.grid.rows);
      for (let k = 0; k < ply.grid.heightsM.length; k++) expect(Math.abs(other.grid.heightsM[k] - ply.grid.heightsM[k])).toBeLessThan(1e-5);
    }
    // The lattice nodes are the grid nodes: heights equal the surface (to float32 and the mm rounding).
    expect(Math.abs(ply.grid.heightsM[0] + ply.summary.originSource.z - pos[2])).toBeLessThan(1e-6);
  });

  it('points: XYZ, ASCII PLY, LAS 1.2 and LAS 1.4 give identical grids', async () => {
    const xyzText = Array.from({ length: pos.length / 3 }, (_, i) => `${pos[3 * i]},${pos[3 * i + 1]},${pos[3 * i + 2]}`).join('\n');
    const s: GroundSettings = { unitM: 1, up: 'z', groundFilter: 'none' };
    const a = await gridOf(new TextEncoder().encode('x,y,z\n' + xyzText), 'a.xyz', s);
    const b = await gridOf(plyPoints(pos, true), 'b.ply', s);
    const c = await gridOf(writeLas(pos, pos.length / 3, { version: 2 }), 'c.las', s);
    const d = await gridOf(writeLas(pos, pos.length / 3, { version: 4 }), 'd.las', s);
    expect(c.summary.format).toBe('las1.2');
    expect(d.summary.format).toBe('las1.4');
    expect(Array.from(d.grid.heightsM)).toEqual(Array.from(c.grid.heightsM));
    for (const o of [b, c]) for (let k = 0; k < a.grid.heightsM.length; k++) expect(Math.abs(o.grid.heightsM[k] - a.grid.heightsM[k])).toBeLessThan(1e-5);
  });

  it('LAS ground class: only class-2 points are gridded when the file classes them', async () => {
    const n = pos.length / 3;
    const withTrees = new Float64Array(pos.length + 300);
    withTrees.set(pos);
    const classes = new Uint8Array(n + 100).fill(2);
    for (let k = 0; k < 100; k++) {
      withTrees.set([1 + (k % 10) * 0.05, 1 + Math.floor(k / 10) * 0.05, 3], pos.length + 3 * k);
      classes[n + k] = 5; // high vegetation
    }
    const r = await gridOf(writeLas(withTrees, n + 100, { version: 4, classes }), 't.las', { unitM: 1 });
    expect(r.summary.groundFilterRemoved).toBe(100);
    let top = -Infinity;
    for (const v of r.grid.heightsM) top = Math.max(top, v);
    expect(top).toBeLessThan(1);
  });
});
