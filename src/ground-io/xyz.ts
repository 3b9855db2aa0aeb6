/**
 * XYZ / CSV point lists: one point per line, x y z first (comma, semicolon, tab or space
 * separated); a first line that is not numbers is a header; lines starting with # are comments.
 */
import type { RawGround } from '../core/ground/pipeline';
import { fail, roomForTriple, textOf } from './bytes';

export function readXyz(bytes: Uint8Array, file: string): RawGround {
  const text = textOf(bytes);
  let xyz = new Float64Array(1024 * 3);
  let n = 0;
  let line = 0;
  let start = 0;
  while (start < text.length) {
    let end = text.indexOf('\n', start);
    if (end < 0) end = text.length;
    const s = text.slice(start, end).trim();
    start = end + 1;
    line++;
    if (s === '' || s.startsWith('#') || s.startsWith('//')) continue;
    const parts = s.split(/[\s,;]+/);
    if (parts.length < 3) fail(file, `line ${line}: needs x, y and z, got "${s.slice(0, 40)}"`);
    const x = Number(parts[0]);
    const y = Number(parts[1]);
    const z = Number(parts[2]);
    if (!Number.isFinite(x) || !Number.isFinite(y) || !Number.isFinite(z)) {
      if (n === 0 && line === 1 && [x, y, z].some((v) => Number.isNaN(v))) continue; // a header line
      fail(file, `line ${line}: x, y and z must be finite numbers, got "${s.slice(0, 60)}"`);
    }
    xyz = roomForTriple(file, 'point', xyz, n);
    xyz[3 * n] = x;
    xyz[3 * n + 1] = y;
    xyz[3 * n + 2] = z;
    n++;
  }
  if (n < 3) fail(file, `holds ${n} points; at least 3 are needed`);
  return { kind: 'points', xyz, count: n, classes: null, info: { file, format: 'xyz', crs: null, georeferenced: false, unitM: null, up: null } };
}
