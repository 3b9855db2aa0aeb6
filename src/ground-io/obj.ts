/**
 * Wavefront OBJ (the "v" and "f" statements of the OBJ format, Wavefront Technologies,
 * Advanced Visualizer manual, appendix B1): vertices and polygon faces (fan-triangulated);
 * `v/vt/vn` forms and negative (relative) indices accepted; everything else ignored.
 */
import type { RawGround } from '../core/ground/pipeline';
import { fail, roomForTriple, textOf } from './bytes';

export function readObj(bytes: Uint8Array, file: string): RawGround {
  const text = textOf(bytes);
  let v = new Float64Array(1024 * 3);
  let nv = 0;
  let idx = new Uint32Array(1024 * 3);
  let nt = 0;
  let line = 0;
  let start = 0;
  const face: number[] = [];
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const s = text.slice(start, end).trim();
    start = end + 1;
    line++;
    if (s.startsWith('v ') || s.startsWith('v\t')) {
      const p = s.split(/\s+/);
      const x = Number(p[1]);
      const y = Number(p[2]);
      const z = Number(p[3]);
      if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) fail(file, `line ${line}: a vertex needs three finite numbers, got "${s.slice(0, 60)}"`);
      v = roomForTriple(file, 'vertex', v, nv);
      v[3 * nv] = x;
      v[3 * nv + 1] = y;
      v[3 * nv + 2] = z;
      nv++;
    } else if (s.startsWith('f ') || s.startsWith('f\t')) {
      const p = s.split(/\s+/);
      face.length = 0;
      for (let q = 1; q < p.length; q++) {
        const iv = parseInt(p[q], 10);
        if (!Number.isFinite(iv) || iv === 0) fail(file, `line ${line}: bad face index "${p[q]}"`);
        const k = iv > 0 ? iv - 1 : nv + iv;
        if (k < 0 || k >= nv) fail(file, `line ${line}: face index ${iv} refers to a vertex that does not exist (${nv} so far)`);
        face.push(k);
      }
      if (face.length < 3) fail(file, `line ${line}: a face needs at least 3 vertices`);
      for (let q = 1; q + 1 < face.length; q++) {
        idx = roomForTriple(file, 'triangle', idx, nt);
        idx[3 * nt] = face[0];
        idx[3 * nt + 1] = face[q];
        idx[3 * nt + 2] = face[q + 1];
        nt++;
      }
    }
  }
  if (nv === 0) fail(file, 'no vertices ("v" lines): not an OBJ mesh');
  if (nt === 0) fail(file, `a mesh with ${nv} vertices and no triangles ("f" lines)`);
  return { kind: 'mesh', positions: v, vertexCount: nv, indices: idx, triangleCount: nt, info: { file, format: 'obj', crs: null, georeferenced: false, unitM: null, up: null } };
}
