/**
 * USDZ (a zip archive whose first entry is the root USD layer, ASCII .usda or binary .usdc; AOUSD
 * Core Specification 1.0.1 §16.4) read through three's USDLoader (three 0.187,
 * examples/jsm/loaders/USDLoader.js, with its fflate). The loader composes the stage into a three
 * scene, applying every prim's transform, the stage's metersPerUnit and a Z-up stage's turn to
 * Y up; so what comes out is metres, Y up, like glTF. Only the meshes' triangles are kept: their
 * vertices are taken to world space and welded where they coincide exactly (the loader gives
 * three vertices a triangle). Loaded on demand (read.ts imports this module only for a .usdz), so
 * three stays out of the ground worker until a USDZ file arrives.
 */
import { Vector3, type Mesh, type Object3D } from 'three';
import { unzipSync } from 'three/examples/jsm/libs/fflate.module.js';
import { USDLoader } from 'three/examples/jsm/loaders/USDLoader.js';
import type { RawGround } from '../core/ground/pipeline';
import { checkCount, fail, reason } from './bytes';

/** Most uncompressed bytes a USDZ archive may hold (a scan of a few million triangles is a few hundred MB of text). */
export const MAX_USDZ_UNZIPPED = 1024 * 1024 * 1024;

export function readUsdz(bytes: Uint8Array, file: string): RawGround {
  if (bytes.length < 4 || bytes[0] !== 0x50 || bytes[1] !== 0x4b || bytes[2] !== 3 || bytes[3] !== 4) {
    fail(file, 'not a USDZ file (a USDZ is a zip archive; the first bytes are not "PK\\3\\4")');
  }
  // The archive's directory first, nothing decompressed: the sizes it declares, and a USD layer first.
  let total = 0;
  const names: string[] = [];
  try {
    unzipSync(bytes, {
      filter: (f) => {
        names.push(f.name);
        total += f.originalSize;
        return false;
      },
    });
  } catch (e) {
    fail(file, `the zip archive cannot be opened (${reason(e, 'no central directory')}): truncated or damaged`);
  }
  if (names.length === 0) fail(file, 'the USDZ archive is empty');
  if (total > MAX_USDZ_UNZIPPED) {
    fail(file, `the archive unpacks to ${total.toLocaleString('en-US')} bytes, more than the ${MAX_USDZ_UNZIPPED.toLocaleString('en-US')} this import takes`);
  }
  if (!/\.(usd|usda|usdc)$/i.test(names[0])) fail(file, `the first entry of the archive is "${names[0]}", not a USD layer (.usd, .usda or .usdc)`);
  let root: Object3D;
  try {
    const ab = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
    // Textures are of no use for ground, and cannot load without a DOM (Node, a worker): the loader
    // starts them anyway and gathers their promises; given onLoad and onError, it waits on them
    // together and their failures end there, not as unhandled rejections (which end a Node process).
    root = new USDLoader().parse(ab, '', () => {}, () => {});
  } catch (e) {
    fail(file, `the USD stage cannot be read (${reason(e, 'the loader gave no reason')}): damaged, or a USD feature three's loader does not read`);
  }
  root.updateMatrixWorld(true);
  const meshes: Mesh[] = [];
  root.traverse((o) => {
    if ((o as Mesh).isMesh) meshes.push(o as Mesh);
  });
  let corners = 0;
  for (const m of meshes) {
    const idx = m.geometry.index;
    corners += idx ? idx.count : (m.geometry.getAttribute('position')?.count ?? 0);
  }
  checkCount(file, 'triangle', Math.floor(corners / 3));
  // Weld: one vertex for each distinct world position (exact), indices into them; an open-addressing
  // hash table on the coordinates' bits (a string key a corner cost 4× the time on a 1 M-corner scan).
  const nCorners = Math.floor(corners / 3) * 3;
  let positions = new Float64Array(Math.max(3, Math.min(nCorners, 1 << 20) * 3));
  let nv = 0;
  const indices = new Uint32Array(nCorners);
  let ni = 0;
  let size = 1024;
  while (size < 2 * nCorners) size *= 2;
  const table = new Int32Array(size).fill(-1);
  const mask = size - 1;
  const bits = new Float64Array(3);
  const words = new Uint32Array(bits.buffer);
  const v = new Vector3();
  for (const m of meshes) {
    const pos = m.geometry.getAttribute('position');
    if (!pos) continue;
    const idx = m.geometry.index;
    const count = idx ? idx.count - (idx.count % 3) : pos.count - (pos.count % 3);
    for (let k = 0; k < count; k++) {
      const i = idx ? idx.getX(k) : k;
      if (i >= pos.count) fail(file, `mesh "${m.name}": index ${i} refers to a vertex that does not exist (${pos.count})`);
      v.fromBufferAttribute(pos, i).applyMatrix4(m.matrixWorld);
      if (!Number.isFinite(v.x) || !Number.isFinite(v.y) || !Number.isFinite(v.z)) fail(file, `mesh "${m.name}": vertex ${i} is not a finite number`);
      bits[0] = v.x + 0; // + 0: −0 and 0 weld
      bits[1] = v.y + 0;
      bits[2] = v.z + 0;
      let h = 0x811c9dc5;
      for (let w = 0; w < 6; w++) h = Math.imul(h ^ words[w], 0x01000193);
      let slot = (h ^ (h >>> 15)) & mask;
      let at = -1;
      for (;;) {
        const e = table[slot];
        if (e === -1) break;
        if (positions[3 * e] === bits[0] && positions[3 * e + 1] === bits[1] && positions[3 * e + 2] === bits[2]) {
          at = e;
          break;
        }
        slot = (slot + 1) & mask;
      }
      if (at === -1) {
        at = nv++;
        table[slot] = at;
        if (3 * nv > positions.length) {
          const bigger = new Float64Array(positions.length * 2);
          bigger.set(positions);
          positions = bigger;
        }
        positions[3 * at] = bits[0];
        positions[3 * at + 1] = bits[1];
        positions[3 * at + 2] = bits[2];
      }
      indices[ni++] = at;
    }
  }
  if (ni === 0) fail(file, `the USD stage holds ${meshes.length} mesh${meshes.length === 1 ? '' : 'es'} and no triangles`);
  return {
    kind: 'mesh',
    positions: positions.slice(0, 3 * nv),
    vertexCount: nv,
    indices: indices.slice(0, ni),
    triangleCount: ni / 3,
    info: { file, format: 'usdz', crs: null, georeferenced: false, unitM: 1, up: 'y' },
  };
}
