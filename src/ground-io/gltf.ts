/**
 * glTF 2.0 and GLB (Khronos glTF 2.0 specification, §3.6 "Binary data storage", §3.7 accessors,
 * §5.25 GLB): a minimal typed reader of the triangle primitives' POSITION and indices through the
 * scene's node transforms. glTF says metres and y up (§3.4), so no unit or axis question is asked.
 * External buffers are asked of `resolve` (the CLI reads the file beside the .gltf).
 */
import type { RawGround } from '../core/ground/pipeline';
import { checkCount, fail, textOf } from './bytes';

const GLB_MAGIC = 0x46546c67;
const CHUNK_JSON = 0x4e4f534a;
const CHUNK_BIN = 0x004e4942;

interface Gltf {
  asset?: { version?: string };
  buffers?: { uri?: string; byteLength: number }[];
  bufferViews?: { buffer: number; byteOffset?: number; byteLength: number; byteStride?: number }[];
  accessors?: { bufferView?: number; byteOffset?: number; componentType: number; count: number; type: string; sparse?: unknown }[];
  meshes?: { primitives: { attributes: Record<string, number>; indices?: number; mode?: number; extensions?: Record<string, unknown> }[] }[];
  nodes?: { mesh?: number; children?: number[]; matrix?: number[]; translation?: number[]; rotation?: number[]; scale?: number[] }[];
  scenes?: { nodes?: number[] }[];
  scene?: number;
  extensionsRequired?: string[];
}

type Mat = Float64Array;

function mul(a: Mat, b: Mat): Mat {
  const o = new Float64Array(16);
  for (let c = 0; c < 4; c++) for (let r = 0; r < 4; r++) {
    let s = 0;
    for (let k = 0; k < 4; k++) s += a[k * 4 + r] * b[c * 4 + k];
    o[c * 4 + r] = s;
  }
  return o;
}

/** Column-major node matrix from matrix or T·R·S (§5.25 node). */
function nodeMatrix(n: NonNullable<Gltf['nodes']>[number]): Mat {
  if (n.matrix && n.matrix.length === 16) return Float64Array.from(n.matrix);
  const [tx, ty, tz] = n.translation ?? [0, 0, 0];
  const [x, y, z, w] = n.rotation ?? [0, 0, 0, 1];
  const [sx, sy, sz] = n.scale ?? [1, 1, 1];
  return Float64Array.from([
    (1 - 2 * (y * y + z * z)) * sx, 2 * (x * y + z * w) * sx, 2 * (x * z - y * w) * sx, 0,
    2 * (x * y - z * w) * sy, (1 - 2 * (x * x + z * z)) * sy, 2 * (y * z + x * w) * sy, 0,
    2 * (x * z + y * w) * sz, 2 * (y * z - x * w) * sz, (1 - 2 * (x * x + y * y)) * sz, 0,
    tx, ty, tz, 1,
  ]);
}

function decodeBase64(s: string): Uint8Array {
  const bin = atob(s);
  const out = new Uint8Array(bin.length);
  for (let i = 0; i < bin.length; i++) out[i] = bin.charCodeAt(i);
  return out;
}

export function readGltf(bytes: Uint8Array, file: string, resolve?: (uri: string) => Uint8Array): RawGround {
  let json: Gltf;
  let bin: Uint8Array | null = null;
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  if (bytes.length >= 4 && dv.getUint32(0, true) === GLB_MAGIC) {
    if (bytes.length < 20) fail(file, 'truncated GLB: shorter than its 12-byte header and first chunk header');
    const version = dv.getUint32(4, true);
    if (version !== 2) fail(file, `GLB version ${version}; only glTF 2.0 is read`);
    const total = dv.getUint32(8, true);
    if (total > bytes.length) fail(file, `truncated GLB: the header says ${total} bytes, the file has ${bytes.length}`);
    let off = 12;
    let jsonText: string | null = null;
    while (off + 8 <= total) {
      const len = dv.getUint32(off, true);
      const type = dv.getUint32(off + 4, true);
      if (off + 8 + len > total) fail(file, `truncated GLB: a chunk of ${len} bytes runs past the end`);
      const body = bytes.subarray(off + 8, off + 8 + len);
      if (type === CHUNK_JSON) jsonText = textOf(body);
      else if (type === CHUNK_BIN && !bin) bin = body;
      off += 8 + len;
    }
    if (jsonText === null) fail(file, 'the GLB has no JSON chunk');
    try {
      json = JSON.parse(jsonText) as Gltf;
    } catch (e) {
      fail(file, `the GLB's JSON chunk is not valid JSON (${(e as Error).message})`);
    }
  } else {
    try {
      json = JSON.parse(textOf(bytes)) as Gltf;
    } catch (e) {
      fail(file, `neither a GLB (magic "glTF") nor valid glTF JSON (${(e as Error).message})`);
    }
  }
  if (!json || typeof json !== 'object' || !json.asset) fail(file, 'not a glTF asset (no "asset" object)');
  if (!String(json.asset.version ?? '').startsWith('2')) fail(file, `glTF version ${json.asset.version}; only 2.0 is read`);
  const req = (json.extensionsRequired ?? []).filter((e) => e !== 'KHR_materials_unlit' && e !== 'KHR_texture_transform');
  if (req.length > 0) fail(file, `needs the glTF extension(s) ${req.join(', ')} (compressed geometry is not read); export without compression`);
  const buffers: Uint8Array[] = (json.buffers ?? []).map((b, i) => {
    if (b.uri === undefined) {
      if (!bin) fail(file, `buffer ${i} has no uri and there is no GLB binary chunk`);
      return bin;
    }
    const m = /^data:[^;,]*;base64,(.*)$/s.exec(b.uri);
    if (m) return decodeBase64(m[1]);
    if (!resolve) fail(file, `buffer ${i} is the external file "${b.uri}", which cannot be read here; use a GLB`);
    return resolve(b.uri);
  });
  const accessor = (ai: number, what: string): { data: Float64Array | Uint32Array; comps: number } => {
    const a = json.accessors?.[ai];
    if (!a) fail(file, `${what}: accessor ${ai} does not exist`);
    if (a.sparse) fail(file, `${what}: sparse accessors are not read`);
    checkCount(file, 'accessor element', a.count);
    const comps = a.type === 'VEC3' ? 3 : a.type === 'SCALAR' ? 1 : 0;
    if (!comps) fail(file, `${what}: accessor type ${a.type} where VEC3 or SCALAR is expected`);
    const size = { 5126: 4, 5125: 4, 5123: 2, 5121: 1 }[a.componentType];
    if (!size) fail(file, `${what}: component type ${a.componentType} is not read`);
    const bv = a.bufferView !== undefined ? json.bufferViews?.[a.bufferView] : undefined;
    if (!bv) fail(file, `${what}: accessor ${ai} has no buffer view`);
    const buf = buffers[bv.buffer];
    if (!buf) fail(file, `${what}: buffer ${bv.buffer} does not exist`);
    const stride = bv.byteStride ?? size * comps;
    const start = (bv.byteOffset ?? 0) + (a.byteOffset ?? 0);
    const need = a.count === 0 ? 0 : start + stride * (a.count - 1) + size * comps;
    if (need > (bv.byteOffset ?? 0) + bv.byteLength || (bv.byteOffset ?? 0) + bv.byteLength > buf.length) {
      fail(file, `truncated: ${what} (accessor ${ai}) runs past the end of its buffer`);
    }
    const v = new DataView(buf.buffer, buf.byteOffset, buf.byteLength);
    const out = a.componentType === 5126 ? new Float64Array(a.count * comps) : new Uint32Array(a.count * comps);
    for (let i = 0; i < a.count; i++) {
      for (let c = 0; c < comps; c++) {
        const o = start + i * stride + c * size;
        out[i * comps + c] =
          a.componentType === 5126 ? v.getFloat32(o, true) : a.componentType === 5125 ? v.getUint32(o, true) : a.componentType === 5123 ? v.getUint16(o, true) : v.getUint8(o);
      }
    }
    return { data: out, comps };
  };
  const pos: number[] = [];
  const idx: number[] = [];
  const visit = (ni: number, parent: Mat, depth: number) => {
    const n = json.nodes?.[ni];
    if (!n || depth > 64) fail(file, `node ${ni} does not exist or the node tree is deeper than 64`);
    const m = mul(parent, nodeMatrix(n));
    if (n.mesh !== undefined) {
      const mesh = json.meshes?.[n.mesh];
      if (!mesh) fail(file, `node ${ni} refers to mesh ${n.mesh}, which does not exist`);
      for (const [pi, prim] of mesh.primitives.entries()) {
        if ((prim.mode ?? 4) !== 4) continue;
        const pa = prim.attributes.POSITION;
        if (pa === undefined) continue;
        const P = accessor(pa, `mesh ${n.mesh} primitive ${pi} POSITION`);
        const base = pos.length / 3;
        const nv = P.data.length / 3;
        for (let i = 0; i < nv; i++) {
          const x = P.data[3 * i];
          const y = P.data[3 * i + 1];
          const z = P.data[3 * i + 2];
          if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) fail(file, `mesh ${n.mesh}: vertex ${i} is not finite`);
          pos.push(m[0] * x + m[4] * y + m[8] * z + m[12], m[1] * x + m[5] * y + m[9] * z + m[13], m[2] * x + m[6] * y + m[10] * z + m[14]);
        }
        if (prim.indices !== undefined) {
          const I = accessor(prim.indices, `mesh ${n.mesh} primitive ${pi} indices`);
          for (let i = 0; i + 2 < I.data.length; i += 3) {
            for (let c = 0; c < 3; c++) {
              const k = I.data[i + c];
              if (k >= nv) fail(file, `mesh ${n.mesh}: index ${k} refers to a vertex that does not exist (${nv})`);
              idx.push(base + k);
            }
          }
        } else for (let i = 0; i + 2 < nv; i += 3) idx.push(base + i, base + i + 1, base + i + 2);
      }
    }
    for (const c of n.children ?? []) visit(c, m, depth + 1);
  };
  const identity = Float64Array.from([1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1, 0, 0, 0, 0, 1]);
  const scene = json.scenes?.[json.scene ?? 0];
  // No scene: every node that is no other node's child is a root.
  const children = new Set((json.nodes ?? []).flatMap((nd) => nd.children ?? []));
  const roots = scene?.nodes ?? (json.nodes ?? []).map((_, i) => i).filter((i) => !children.has(i));
  for (const r of roots) visit(r, identity, 0);
  if (idx.length === 0) fail(file, `a mesh with ${pos.length / 3} vertices and no triangles`);
  return {
    kind: 'mesh',
    positions: Float64Array.from(pos),
    vertexCount: pos.length / 3,
    indices: Uint32Array.from(idx),
    triangleCount: idx.length / 3,
    info: { file, format: 'gltf', crs: null, georeferenced: false, unitM: 1, up: 'y' },
  };
}
