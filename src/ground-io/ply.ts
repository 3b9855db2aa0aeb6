/**
 * PLY (Turk 1994, "The PLY polygon file format"; the format as written by Greg Turk's ply.c and
 * read by every scanning tool): an ASCII header of elements and typed properties, then the data
 * in ASCII or binary (little or big endian). Reads the vertex x, y, z and the face vertex lists
 * (fan-triangulated); a PLY without faces is a point cloud. A typed-array reader: no per-vertex
 * objects.
 */
import type { RawGround } from '../core/ground/pipeline';
import { checkCount, fail, headText, textOf } from './bytes';

type PlyType = 'int8' | 'uint8' | 'int16' | 'uint16' | 'int32' | 'uint32' | 'float32' | 'float64';
const TYPE_ALIASES: Record<string, PlyType> = {
  char: 'int8', int8: 'int8', uchar: 'uint8', uint8: 'uint8', short: 'int16', int16: 'int16', ushort: 'uint16', uint16: 'uint16',
  int: 'int32', int32: 'int32', uint: 'uint32', uint32: 'uint32', float: 'float32', float32: 'float32', double: 'float64', float64: 'float64',
};
const SIZE: Record<PlyType, number> = { int8: 1, uint8: 1, int16: 2, uint16: 2, int32: 4, uint32: 4, float32: 4, float64: 8 };

interface Prop {
  readonly name: string;
  readonly type: PlyType;
  /** For list properties: the count's type. */
  readonly countType: PlyType | null;
}
interface Element {
  readonly name: string;
  readonly count: number;
  readonly props: Prop[];
}

function get(dv: DataView, off: number, t: PlyType, le: boolean): number {
  switch (t) {
    case 'int8': return dv.getInt8(off);
    case 'uint8': return dv.getUint8(off);
    case 'int16': return dv.getInt16(off, le);
    case 'uint16': return dv.getUint16(off, le);
    case 'int32': return dv.getInt32(off, le);
    case 'uint32': return dv.getUint32(off, le);
    case 'float32': return dv.getFloat32(off, le);
    case 'float64': return dv.getFloat64(off, le);
  }
}

export function readPly(bytes: Uint8Array, file: string): RawGround {
  const head = headText(bytes, 65536);
  if (!/^ply\r?\n/.test(head)) fail(file, 'not a PLY file (it does not start with "ply")');
  const endMatch = /end_header\r?\n/.exec(head);
  if (!endMatch) fail(file, 'the PLY header has no end_header line (truncated or not PLY)');
  const dataStart = endMatch.index + endMatch[0].length;
  const lines = head.slice(0, endMatch.index).split(/\r?\n/);
  let format = '';
  const elements: Element[] = [];
  for (const raw of lines.slice(1)) {
    const p = raw.trim().split(/\s+/);
    if (p[0] === 'format') format = p[1];
    else if (p[0] === 'element') {
      const count = Number(p[2]);
      checkCount(file, p[1], count);
      elements.push({ name: p[1], count, props: [] });
    } else if (p[0] === 'property') {
      const el = elements[elements.length - 1];
      if (!el) fail(file, 'a property comes before any element in the header');
      if (p[1] === 'list') {
        const ct = TYPE_ALIASES[p[2]];
        const it = TYPE_ALIASES[p[3]];
        if (!ct || !it) fail(file, `unknown property type in "${raw.trim()}"`);
        el.props.push({ name: p[4], type: it, countType: ct });
      } else {
        const t = TYPE_ALIASES[p[1]];
        if (!t) fail(file, `unknown property type in "${raw.trim()}"`);
        el.props.push({ name: p[2], type: t, countType: null });
      }
    }
  }
  if (format !== 'ascii' && format !== 'binary_little_endian' && format !== 'binary_big_endian') fail(file, `unknown PLY format "${format}"`);
  const vEl = elements.find((e) => e.name === 'vertex');
  if (!vEl) fail(file, 'the PLY has no vertex element');
  const xi = vEl.props.findIndex((q) => q.name === 'x');
  const yi = vEl.props.findIndex((q) => q.name === 'y');
  const zi = vEl.props.findIndex((q) => q.name === 'z');
  if (xi < 0 || yi < 0 || zi < 0) fail(file, 'the PLY vertices have no x, y and z properties');
  const fEl = elements.find((e) => e.name === 'face');
  const listIdx = fEl ? fEl.props.findIndex((q) => q.countType !== null && (q.name === 'vertex_indices' || q.name === 'vertex_index')) : -1;
  const positions = new Float64Array(vEl.count * 3);
  let idx = new Uint32Array(fEl ? Math.max(fEl.count, 1) * 3 : 0);
  let nt = 0;
  const pushTri = (a: number, b: number, c: number) => {
    if (nt * 3 + 3 > idx.length) {
      const g = new Uint32Array(Math.max(idx.length * 2, 3 * 1024));
      g.set(idx);
      idx = g;
    }
    idx[3 * nt] = a;
    idx[3 * nt + 1] = b;
    idx[3 * nt + 2] = c;
    nt++;
  };
  const nv = vEl.count;
  const checkIndex = (k: number, f: number) => {
    if (!(k >= 0 && k < nv)) fail(file, `face ${f} refers to vertex ${k}, but there are ${nv}`);
  };

  if (format === 'ascii') {
    const text = textOf(bytes.subarray(dataStart));
    const re = /\S+/g;
    const next = (what: string): number => {
      const m = re.exec(text);
      if (!m) fail(file, `truncated: the data ends inside the ${what}`);
      const v = Number(m[0]);
      if (Number.isNaN(v)) fail(file, `"${m[0].slice(0, 20)}" in the ${what} is not a number`);
      return v;
    };
    for (const el of elements) {
      for (let i = 0; i < el.count; i++) {
        for (let q = 0; q < el.props.length; q++) {
          const pr = el.props[q];
          if (pr.countType) {
            const n = next(`${el.name} ${i}`);
            const face: number[] = [];
            for (let j = 0; j < n; j++) face.push(next(`${el.name} ${i}`));
            if (el === fEl && q === listIdx) {
              for (const k of face) checkIndex(k, i);
              for (let j = 1; j + 1 < face.length; j++) pushTri(face[0], face[j], face[j + 1]);
            }
          } else {
            const v = next(`${el.name} ${i}`);
            if (el === vEl) {
              if (q === xi) positions[3 * i] = v;
              else if (q === yi) positions[3 * i + 1] = v;
              else if (q === zi) positions[3 * i + 2] = v;
            }
          }
        }
      }
    }
  } else {
    const le = format === 'binary_little_endian';
    const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
    let off = dataStart;
    const end = bytes.byteLength;
    for (const el of elements) {
      const fixed = el.props.every((q) => q.countType === null);
      if (fixed) {
        let stride = 0;
        const offs: number[] = [];
        for (const q of el.props) {
          offs.push(stride);
          stride += SIZE[q.type];
        }
        if (off + stride * el.count > end) {
          fail(file, `truncated: the header promises ${el.count} ${el.name}s (${stride * el.count} bytes) but only ${end - off} bytes remain`);
        }
        if (el === vEl) {
          const ox = offs[xi];
          const oy = offs[yi];
          const oz = offs[zi];
          const tx = el.props[xi].type;
          const ty = el.props[yi].type;
          const tz = el.props[zi].type;
          if (tx === 'float32' && ty === 'float32' && tz === 'float32') {
            for (let i = 0, o = off; i < el.count; i++, o += stride) {
              positions[3 * i] = dv.getFloat32(o + ox, le);
              positions[3 * i + 1] = dv.getFloat32(o + oy, le);
              positions[3 * i + 2] = dv.getFloat32(o + oz, le);
            }
          } else {
            for (let i = 0, o = off; i < el.count; i++, o += stride) {
              positions[3 * i] = get(dv, o + ox, tx, le);
              positions[3 * i + 1] = get(dv, o + oy, ty, le);
              positions[3 * i + 2] = get(dv, o + oz, tz, le);
            }
          }
        }
        off += stride * el.count;
      } else if (el === fEl && el.props.length === 1 && listIdx === 0 && el.props[0].countType === 'uint8' && (el.props[0].type === 'int32' || el.props[0].type === 'uint32')) {
        // The common face layout (one uchar-counted int list): read inline, no per-value switch.
        for (let i = 0; i < el.count; i++) {
          if (off + 1 > end) fail(file, `truncated: the data ends inside face ${i} of ${el.count}`);
          const n = bytes[off];
          off++;
          if (off + 4 * n > end) fail(file, `truncated: the data ends inside face ${i} of ${el.count}`);
          if (n >= 3) {
            const a = dv.getInt32(off, le);
            let b = dv.getInt32(off + 4, le);
            if (!(a >= 0 && a < nv && b >= 0 && b < nv)) checkIndex(a < 0 || a >= nv ? a : b, i);
            for (let j = 2; j < n; j++) {
              const c = dv.getInt32(off + 4 * j, le);
              if (!(c >= 0 && c < nv)) checkIndex(c, i);
              if (nt * 3 + 3 > idx.length) pushTri(a, b, c);
              else {
                idx[3 * nt] = a;
                idx[3 * nt + 1] = b;
                idx[3 * nt + 2] = c;
                nt++;
              }
              b = c;
            }
          }
          off += 4 * n;
        }
      } else {
        for (let i = 0; i < el.count; i++) {
          for (let q = 0; q < el.props.length; q++) {
            const pr = el.props[q];
            if (pr.countType) {
              if (off + SIZE[pr.countType] > end) fail(file, `truncated: the data ends inside ${el.name} ${i} of ${el.count}`);
              const n = get(dv, off, pr.countType, le);
              off += SIZE[pr.countType];
              const sz = SIZE[pr.type];
              if (off + n * sz > end) fail(file, `truncated: the data ends inside ${el.name} ${i} of ${el.count}`);
              if (el === fEl && q === listIdx) {
                if (n >= 3) {
                  const a = get(dv, off, pr.type, le);
                  checkIndex(a, i);
                  let b = get(dv, off + sz, pr.type, le);
                  checkIndex(b, i);
                  for (let j = 2; j < n; j++) {
                    const c = get(dv, off + j * sz, pr.type, le);
                    checkIndex(c, i);
                    pushTri(a, b, c);
                    b = c;
                  }
                }
              }
              off += n * sz;
            } else {
              if (off + SIZE[pr.type] > end) fail(file, `truncated: the data ends inside ${el.name} ${i} of ${el.count}`);
              off += SIZE[pr.type];
            }
          }
        }
      }
    }
  }
  for (let i = 0; i < positions.length; i++) {
    if (!Number.isFinite(positions[i])) fail(file, `vertex ${Math.floor(i / 3)} has a coordinate that is not a finite number (${positions[i]})`);
  }
  const info = { file, format: 'ply', crs: null, georeferenced: false, unitM: null, up: null };
  if (!fEl) {
    if (nv < 3) fail(file, `holds ${nv} points; at least 3 are needed`);
    return { kind: 'points', xyz: positions, count: nv, classes: null, info };
  }
  if (nt === 0) fail(file, `a mesh with ${nv} vertices and no triangles`);
  return { kind: 'mesh', positions, vertexCount: nv, indices: idx, triangleCount: nt, info };
}
