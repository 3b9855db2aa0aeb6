/**
 * Test fixture: a LAS writer (ASPRS LAS 1.4 R15 layout): version 1.2 with point format 0 or
 * version 1.4 with point format 6, a GeoKeyDirectory record with ProjectedCSTypeGeoKey and
 * ProjLinearUnitsGeoKey.
 */
export function writeLas(xyz: Float64Array, count: number, opts: { version: 2 | 4; epsg?: number; unitCode?: number; classes?: Uint8Array; scale?: number }): Uint8Array {
  const v14 = opts.version === 4;
  const headerSize = v14 ? 375 : 227;
  const fmt = v14 ? 6 : 0;
  const rec = v14 ? 30 : 20;
  const keys: [number, number, number, number][] = [[1024, 0, 1, 1]];
  if (opts.epsg) keys.push([3072, 0, 1, opts.epsg]);
  if (opts.unitCode) keys.push([3076, 0, 1, opts.unitCode]);
  const vlrBody = 8 + 8 * keys.length;
  const vlrLen = 54 + vlrBody;
  const offset = headerSize + vlrLen;
  const out = new Uint8Array(offset + count * rec);
  const dv = new DataView(out.buffer);
  out.set([76, 65, 83, 70], 0); // LASF
  out[24] = 1;
  out[25] = opts.version;
  dv.setUint16(94, headerSize, true);
  dv.setUint32(96, offset, true);
  dv.setUint32(100, 1, true);
  out[104] = fmt;
  dv.setUint16(105, rec, true);
  dv.setUint32(107, v14 ? 0 : count, true);
  const s = opts.scale ?? 0.001;
  const mn = [Infinity, Infinity, Infinity];
  const mx = [-Infinity, -Infinity, -Infinity];
  for (let i = 0; i < count; i++) for (let k = 0; k < 3; k++) {
    mn[k] = Math.min(mn[k], xyz[3 * i + k]);
    mx[k] = Math.max(mx[k], xyz[3 * i + k]);
  }
  const off = mn.map((v) => Math.floor(v));
  for (let k = 0; k < 3; k++) {
    dv.setFloat64(131 + 8 * k, s, true);
    dv.setFloat64(155 + 8 * k, off[k], true);
    dv.setFloat64(179 + 16 * k, mx[k], true);
    dv.setFloat64(187 + 16 * k, mn[k], true);
  }
  if (v14) dv.setBigUint64(247, BigInt(count), true);
  // VLR: GeoKeyDirectoryTag.
  let o = headerSize;
  out.set(new TextEncoder().encode('LASF_Projection'), o + 2);
  dv.setUint16(o + 18, 34735, true);
  dv.setUint16(o + 20, vlrBody, true);
  o += 54;
  dv.setUint16(o, 1, true);
  dv.setUint16(o + 2, 1, true);
  dv.setUint16(o + 4, 0, true);
  dv.setUint16(o + 6, keys.length, true);
  keys.forEach((k, i) => k.forEach((v, j) => dv.setUint16(o + 8 + 8 * i + 2 * j, v, true)));
  for (let i = 0; i < count; i++) {
    const p = offset + i * rec;
    for (let k = 0; k < 3; k++) dv.setInt32(p + 4 * k, Math.round((xyz[3 * i + k] - off[k]) / s), true);
    out[p + (v14 ? 16 : 15)] = opts.classes ? opts.classes[i] : 2;
  }
  return out;
}
