/**
 * LAS 1.0–1.4 point clouds (ASPRS "LAS Specification 1.4 – R15", 2019: the public header block
 * §2.4, variable length records §2.5, point data record formats 0–10 §2.6–2.16). Uncompressed
 * only; a LAZ file (compressed point formats, bit 7 of the format byte) is refused with a message.
 * The CRS comes from the GeoKeyDirectoryTag record (LASF_Projection 34735, GeoTIFF keys) or the
 * OGC WKT record (2112); the length unit from ProjLinearUnitsGeoKey / VerticalUnitsGeoKey.
 */
import type { RawGround } from '../core/ground/pipeline';
import { LENGTH_UNITS_M } from '../core/ground/units';
import { checkCount, fail } from './bytes';

/** Smallest record length of each point data record format (spec tables 7–17). */
const MIN_RECORD = [20, 28, 26, 34, 57, 63, 30, 36, 38, 59, 67];

/** EPSG unit of measure codes to metres (EPSG dataset: 9001 metre, 9002 foot, 9003 US survey foot). */
const EPSG_UNITS: Record<number, number> = { 9001: LENGTH_UNITS_M.m, 9002: LENGTH_UNITS_M.ft, 9003: LENGTH_UNITS_M.usft };

export interface LasHeader {
  readonly versionMajor: number;
  readonly versionMinor: number;
  readonly pointFormat: number;
  readonly recordLength: number;
  readonly pointCount: number;
  readonly offsetToPoints: number;
  readonly scale: readonly [number, number, number];
  readonly offset: readonly [number, number, number];
  /** The header's extent of the points (§2.4: max and min X, Y, Z), as stated. */
  readonly min: readonly [number, number, number];
  readonly max: readonly [number, number, number];
  readonly crs: string | null;
  readonly unitM: number | null;
  readonly verticalUnitM: number | null;
  readonly geographic: boolean;
  /** Bit 7 (or 6) of the point format byte: the points are LAZ-compressed. */
  readonly compressed: boolean;
  /** The "laszip encoded" record (user id "laszip encoded", record 22204): its body's byte offset and length. */
  readonly laszipVlr: { readonly at: number; readonly length: number } | null;
}

function ascii(bytes: Uint8Array, off: number, len: number): string {
  let s = '';
  for (let i = 0; i < len; i++) {
    const c = bytes[off + i];
    if (c === 0) break;
    s += String.fromCharCode(c);
  }
  return s;
}

/** True when the point format byte (offset 104) has the compression bit set (a LAZ file). */
export function isCompressedLas(bytes: Uint8Array): boolean {
  return bytes.length > 104 && (bytes[104] & 0xc0) !== 0;
}

export function readLasHeader(bytes: Uint8Array, file: string): LasHeader {
  if (bytes.length < 4 || ascii(bytes, 0, 4) !== 'LASF') fail(file, 'not a LAS file (the first four bytes are not "LASF")');
  if (bytes.length < 227) fail(file, `truncated: ${bytes.length} bytes, shorter than a LAS header (227 bytes)`);
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const vMaj = bytes[24];
  const vMin = bytes[25];
  if (vMaj !== 1 || vMin > 4) fail(file, `LAS version ${vMaj}.${vMin}; versions 1.0 to 1.4 are read`);
  const headerSize = dv.getUint16(94, true);
  if (headerSize < 227 || headerSize > bytes.length) fail(file, `the header size ${headerSize} is impossible (file ${bytes.length} bytes)`);
  const offsetToPoints = dv.getUint32(96, true);
  const nVlr = dv.getUint32(100, true);
  const fmtByte = bytes[104];
  const recordLength = dv.getUint16(105, true);
  const compressed = (fmtByte & 0xc0) !== 0;
  const pointFormat = fmtByte & 0x3f;
  if (pointFormat > 10) fail(file, `point data record format ${pointFormat} does not exist (0–10)`);
  if (recordLength < MIN_RECORD[pointFormat]) fail(file, `point records of ${recordLength} bytes are shorter than format ${pointFormat}'s ${MIN_RECORD[pointFormat]}`);
  let count = dv.getUint32(107, true);
  if (vMin >= 4 && headerSize >= 255) {
    const big = Number(dv.getBigUint64(247, true));
    if (count === 0 || big > count) count = big;
  }
  checkCount(file, 'point', count);
  const scale = [dv.getFloat64(131, true), dv.getFloat64(139, true), dv.getFloat64(147, true)] as const;
  const offset = [dv.getFloat64(155, true), dv.getFloat64(163, true), dv.getFloat64(171, true)] as const;
  for (const [i, s] of scale.entries()) {
    if (!Number.isFinite(s) || s <= 0 || s < 1e-9 || s > 10) fail(file, `the ${'XYZ'[i]} scale factor ${s} is absurd (expected between 1e-9 and 10, typically 0.01 or 0.001)`);
  }
  for (const [i, o] of offset.entries()) if (!Number.isFinite(o) || Math.abs(o) > 1e12) fail(file, `the ${'XYZ'[i]} offset ${o} is not a usable number`);
  if (offsetToPoints < headerSize || offsetToPoints > bytes.length) fail(file, `the offset to the points (${offsetToPoints}) lies outside the file (${bytes.length} bytes)`);
  const need = offsetToPoints + count * recordLength;
  // Compressed points take fewer bytes than this; laz.ts checks them against the chunk table instead.
  if (!compressed && need > bytes.length) {
    fail(file, `truncated: the header claims ${count.toLocaleString('en-US')} points (${need.toLocaleString('en-US')} bytes) but the file has ${bytes.length.toLocaleString('en-US')} bytes`);
  }
  // VLRs: the CRS and units.
  let crs: string | null = null;
  let unitM: number | null = null;
  let verticalUnitM: number | null = null;
  let geographic = false;
  let laszipVlr: LasHeader['laszipVlr'] = null;
  let off = headerSize;
  for (let v = 0; v < nVlr && v < 10000; v++) {
    if (off + 54 > offsetToPoints) break;
    const user = ascii(bytes, off + 2, 16);
    const rec = dv.getUint16(off + 18, true);
    const len = dv.getUint16(off + 20, true);
    const body = off + 54;
    if (body + len > bytes.length) fail(file, `truncated: variable length record ${v} runs past the end of the file`);
    if (user === 'laszip encoded' && rec === 22204) {
      laszipVlr = { at: body, length: len };
    } else if (user === 'LASF_Projection' && rec === 34735 && len >= 8) {
      const nKeys = dv.getUint16(body + 6, true);
      for (let k = 0; k < nKeys && body + 8 + 8 * k + 8 <= body + len; k++) {
        const e = body + 8 + 8 * k;
        const id = dv.getUint16(e, true);
        const loc = dv.getUint16(e + 2, true);
        const val = dv.getUint16(e + 6, true);
        if (loc !== 0) continue;
        if (id === 3072 && val > 0 && val < 32767) crs = `EPSG:${val}`;
        if (id === 2048 && val > 0 && val < 32767 && crs === null) {
          crs = `EPSG:${val}`;
          geographic = true;
        }
        if (id === 1024 && val === 2) geographic = true;
        if (id === 3076 && EPSG_UNITS[val]) unitM = EPSG_UNITS[val];
        if (id === 4099 && EPSG_UNITS[val]) verticalUnitM = EPSG_UNITS[val];
      }
    } else if (user === 'LASF_Projection' && rec === 2112) {
      const wkt = ascii(bytes, body, len);
      const all = [...wkt.matchAll(/(?:AUTHORITY|ID)\[\s*"EPSG"\s*,\s*"?(\d+)"?\s*\]/g)];
      if (all.length > 0) crs = `EPSG:${all[all.length - 1][1]}`;
      geographic = /^\s*(GEOGCS|GEOGCRS)/.test(wkt);
      if (/UNIT\[\s*"(US survey foot|Foot_US)"/i.test(wkt)) unitM = EPSG_UNITS[9003];
      else if (/UNIT\[\s*"(foot|international foot|Foot)"/i.test(wkt)) unitM = EPSG_UNITS[9002];
      else if (/UNIT\[\s*"(metre|meter)"/i.test(wkt)) unitM = 1;
    }
    off = body + len;
  }
  if (geographic) crs = crs ?? 'geographic';
  const max = [dv.getFloat64(179, true), dv.getFloat64(195, true), dv.getFloat64(211, true)] as const;
  const min = [dv.getFloat64(187, true), dv.getFloat64(203, true), dv.getFloat64(219, true)] as const;
  return { versionMajor: vMaj, versionMinor: vMin, pointFormat, recordLength, pointCount: count, offsetToPoints, scale, offset, min, max, crs, unitM, verticalUnitM, geographic, compressed, laszipVlr };
}

/** The checks every LAS or LAZ file meets before its points are read. */
export function checkLasPoints(h: LasHeader, file: string): void {
  if (h.geographic) fail(file, `the points are in a geographic CRS (${h.crs}: degrees of latitude and longitude); reproject them to a projected CRS in metres or feet first`);
  if (h.pointCount < 3) fail(file, `holds ${h.pointCount} point${h.pointCount === 1 ? '' : 's'}; at least 3 are needed`);
}

export function readLas(bytes: Uint8Array, file: string): RawGround {
  const h = readLasHeader(bytes, file);
  if (h.compressed) fail(file, `compressed points (LAZ, point format byte ${bytes[104]}) reached the LAS reader`);
  checkLasPoints(h, file);
  return pointsFromRecords(h, bytes, h.offsetToPoints, file, `las${h.versionMajor}.${h.versionMinor}`);
}

/**
 * Raw ground from `h.pointCount` uncompressed point records of `h.recordLength` bytes starting at
 * `start` in `records` (the LAS file itself, or the records decompressed from a LAZ file).
 */
export function pointsFromRecords(h: LasHeader, records: Uint8Array, start: number, file: string, format: string): RawGround {
  const bytes = records;
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const n = h.pointCount;
  const xyz = new Float64Array(n * 3);
  const classes = new Uint8Array(n);
  const [sx, sy, sz] = h.scale;
  const [ox, oy, oz] = h.offset;
  const classAt = h.pointFormat >= 6 ? 16 : 15;
  const classMask = h.pointFormat >= 6 ? 0xff : 0x1f;
  // Heights scaled to the horizontal unit, so one unit factor applies to x, y and z.
  const zToH = h.verticalUnitM !== null && h.unitM !== null ? h.verticalUnitM / h.unitM : 1;
  for (let i = 0, o = start; i < n; i++, o += h.recordLength) {
    xyz[3 * i] = dv.getInt32(o, true) * sx + ox;
    xyz[3 * i + 1] = dv.getInt32(o + 4, true) * sy + oy;
    xyz[3 * i + 2] = (dv.getInt32(o + 8, true) * sz + oz) * zToH;
    classes[i] = bytes[o + classAt] & classMask;
  }
  return {
    kind: 'points',
    xyz,
    count: n,
    classes,
    info: { file, format, crs: h.crs, georeferenced: h.crs !== null, unitM: h.unitM, up: 'z' },
  };
}
