/**
 * LAZ 1.2–1.4 point clouds: a LAS file whose point records are compressed by LASzip (the LAS
 * header of las.ts with bit 7 of the point format byte set, plus the "laszip encoded" variable
 * length record, user id "laszip encoded", record id 22204). The header, the CRS and the units
 * come from las.ts; the records are decompressed by laz-perf (WebAssembly, the `LASZip` class)
 * into the same uncompressed records a LAS file holds, then converted by the same code.
 *
 * Checked here before laz-perf sees the bytes, so a bad file gets a message and not a decoder
 * abort: the laszip record (layout as written by LASzip: compressor u16, coder u16, version
 * u8 u8 u16, options u32, chunk size u32, special EVLR count and offset i64 i64, item count u16,
 * then per item type u16, size u16, version u16; LAZ specification, rapidlasso, from memory, and
 * laz-perf's source), and the chunk table (an i64 byte offset at the start of the point data,
 * -1 when written at the file's end; the table starts with version u32 = 0 and the chunk count
 * u32), which bounds the point count a header may claim.
 */
import { createLazPerf } from 'laz-perf';
import type { RawGround } from '../core/ground/pipeline';
import { GroundError } from '../core/ground/types';
import { fail } from './bytes';
import { checkLasPoints, pointsFromRecords, readLasHeader, type LasHeader } from './las';

/** The part of laz-perf's Emscripten module used here. */
interface LazModule {
  readonly HEAPU8: Uint8Array;
  _malloc(bytes: number): number;
  _free(pointer: number): void;
  LASZip: new () => {
    open(pointer: number, length: number): void;
    getPoint(pointer: number): void;
    getCount(): number;
    getPointLength(): number;
    getPointFormat(): number;
    delete(): void;
  };
}

type LazFactory = (opts?: { locateFile?: (path: string, dir: string) => string }) => Promise<LazModule>;

/** One module per WebAssembly location (Node: the package's own file; the app's worker: the bundled asset). */
const modules = new Map<string, Promise<LazModule>>();

function lazModule(wasmUrl: string | undefined): Promise<LazModule> {
  const key = wasmUrl ?? '';
  let m = modules.get(key);
  if (!m) {
    const create = createLazPerf as unknown as LazFactory;
    m = create(wasmUrl ? { locateFile: () => wasmUrl } : undefined);
    m.catch(() => modules.delete(key));
    modules.set(key, m);
  }
  return m;
}

/** Compressors of the laszip record: 2 = pointwise chunked (point formats 0–5), 3 = layered chunked (6–10). */
const COMPRESSOR_NAMES = ['none', 'pointwise (not chunked)', 'pointwise chunked', 'layered chunked'];

export interface LazLayout {
  readonly compressor: number;
  readonly chunkSize: number | null;
  readonly chunks: number;
  readonly chunkTableAt: number;
}

/** Checks the laszip record and the chunk table against the header; returns what they say. */
export function checkLazLayout(bytes: Uint8Array, h: LasHeader, file: string): LazLayout {
  const dv = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const vlr = h.laszipVlr;
  if (!vlr) fail(file, 'compressed points (LAZ) without the "laszip encoded" record (record 22204) that says how they are compressed: damaged, or not a LAZ file');
  if (vlr.length < 34) fail(file, `the laszip record is ${vlr.length} bytes, shorter than its fixed part (34 bytes)`);
  const at = vlr.at;
  const compressor = dv.getUint16(at, true);
  const coder = dv.getUint16(at + 2, true);
  if (compressor !== 2 && compressor !== 3) {
    fail(file, `the laszip record names compressor ${compressor}${COMPRESSOR_NAMES[compressor] ? ` (${COMPRESSOR_NAMES[compressor]})` : ''}; only the chunked compressors 2 and 3 are read`);
  }
  if (coder !== 0) fail(file, `the laszip record names coder ${coder}; only 0 (arithmetic) exists`);
  const chunkRaw = dv.getUint32(at + 12, true);
  const chunkSize = chunkRaw === 0xffffffff ? null : chunkRaw;
  if (chunkSize === 0) fail(file, 'the laszip record gives a chunk size of 0 points');
  const nItems = dv.getUint16(at + 32, true);
  if (nItems === 0 || 34 + 6 * nItems > vlr.length) fail(file, `the laszip record lists ${nItems} point items in ${vlr.length} bytes: damaged`);
  let itemBytes = 0;
  for (let k = 0; k < nItems; k++) itemBytes += dv.getUint16(at + 34 + 6 * k + 2, true);
  if (itemBytes !== h.recordLength) {
    fail(file, `the laszip record's items add up to ${itemBytes} bytes a point, but the header says ${h.recordLength}: the record does not belong to these points`);
  }
  const start = h.offsetToPoints;
  if (start + 8 > bytes.length) fail(file, `truncated: the compressed points should start at byte ${start}, the file has ${bytes.length} bytes`);
  let tableAt = Number(dv.getBigInt64(start, true));
  // Written while streaming: the offset is then in the file's last 8 bytes (LASzip's convention).
  if (tableAt === -1 && bytes.length >= 8) tableAt = Number(dv.getBigInt64(bytes.length - 8, true));
  if (tableAt < start + 8 || tableAt + 8 > bytes.length) {
    fail(file, `truncated or damaged: the chunk table of the compressed points is said to start at byte ${tableAt.toLocaleString('en-US')}, outside the file's ${bytes.length.toLocaleString('en-US')} bytes`);
  }
  const version = dv.getUint32(tableAt, true);
  const chunks = dv.getUint32(tableAt + 4, true);
  if (version !== 0) fail(file, `the chunk table has version ${version}; only 0 exists: damaged`);
  if (chunks === 0) fail(file, 'the chunk table lists no chunks of points');
  const n = h.pointCount;
  if (chunkSize !== null && n > chunks * chunkSize) {
    fail(file, `the header claims ${n.toLocaleString('en-US')} points, but the chunk table holds ${chunks.toLocaleString('en-US')} chunk${chunks === 1 ? '' : 's'} of at most ${chunkSize.toLocaleString('en-US')} points`);
  }
  if (chunkSize !== null && n <= (chunks - 1) * chunkSize) {
    fail(file, `the header claims ${n.toLocaleString('en-US')} points, but the chunk table holds ${chunks.toLocaleString('en-US')} chunks of ${chunkSize.toLocaleString('en-US')} points: more than that many points need`);
  }
  // Every chunk starts with one whole point record stored as is (LASzip's first point of a chunk).
  if (chunks * h.recordLength > tableAt - start - 8) {
    fail(file, `truncated or damaged: ${chunks.toLocaleString('en-US')} chunks cannot fit in the ${(tableAt - start - 8).toLocaleString('en-US')} bytes of compressed points`);
  }
  return { compressor, chunkSize, chunks, chunkTableAt: tableAt };
}

export interface LazRecords {
  readonly header: LasHeader;
  /** pointCount × recordLength bytes: the uncompressed point records, as a LAS file would hold them. */
  readonly records: Uint8Array;
}

/** Decompresses a LAZ file's point records (the header, laszip record and chunk table checked first). */
export async function decodeLazRecords(bytes: Uint8Array, file: string, wasmUrl?: string): Promise<LazRecords> {
  const h = readLasHeader(bytes, file);
  if (!h.compressed) fail(file, 'the points are not compressed (a LAS file named as LAZ)');
  checkLazLayout(bytes, h, file);
  let lp: LazModule;
  try {
    lp = await lazModule(wasmUrl);
  } catch (e) {
    fail(file, `the LAZ decoder (laz-perf WebAssembly) could not start: ${e instanceof Error ? e.message : String(e)}`);
  }
  const n = h.pointCount;
  const len = h.recordLength;
  const records = new Uint8Array(n * len);
  let data = 0;
  let point = 0;
  let zip: InstanceType<LazModule['LASZip']> | null = null;
  try {
    data = lp._malloc(bytes.length);
    point = lp._malloc(len);
    if (data === 0 || point === 0) fail(file, `the LAZ decoder has no memory for a ${bytes.length.toLocaleString('en-US')}-byte file`);
    lp.HEAPU8.set(bytes, data);
    zip = new lp.LASZip();
    zip.open(data, bytes.length);
    if (zip.getCount() !== n) fail(file, `the LAZ decoder reads ${zip.getCount()} points where the header says ${n}`);
    if (zip.getPointLength() !== len) fail(file, `the LAZ decoder gives ${zip.getPointLength()}-byte points where the header says ${len}`);
    for (let i = 0, o = 0; i < n; i++) {
      zip.getPoint(point);
      // The heap may be replaced when the module's memory grows: take it afresh for each point.
      const heap = lp.HEAPU8;
      for (let b = 0; b < len; b++) records[o++] = heap[point + b];
    }
  } catch (e) {
    if (e instanceof GroundError) throw e;
    // laz-perf is built without C++ exception catching: it throws a bare number or string, no message.
    fail(file, 'the compressed points cannot be decoded (the LAZ decoder stopped): damaged or truncated data, or a LAZ variant it does not read');
  } finally {
    zip?.delete();
    if (point) lp._free(point);
    if (data) lp._free(data);
  }
  return { header: h, records };
}

export interface LazOptions {
  /** Where the laz-perf WebAssembly file is served (the app's worker: the bundled asset's URL). Node needs none. */
  readonly wasmUrl?: string;
}

/**
 * LASzip carries no checksum: a header that claims more points than were compressed, or damaged
 * bytes, can decode without an error into wrong points. The header's extent (LAS 1.4 R15 §2.4: the
 * actual max and min of the points) catches most of them: a point beyond it by more than 1 % of the
 * extent (and one scale step) is refused. Skipped when the header states no extent (max < min, or all 0).
 */
function checkExtent(h: LasHeader, records: Uint8Array, file: string): void {
  const [sx, sy, sz] = h.scale;
  const [ox, oy, oz] = h.offset;
  const stated = [0, 1, 2].every((k) => Number.isFinite(h.min[k]) && Number.isFinite(h.max[k]) && h.max[k] >= h.min[k]) && [0, 1, 2].some((k) => h.max[k] !== 0 || h.min[k] !== 0);
  if (!stated) return;
  const tol = [0, 1, 2].map((k) => h.scale[k] + 0.01 * (h.max[k] - h.min[k]));
  const dv = new DataView(records.buffer, records.byteOffset, records.byteLength);
  for (let i = 0, o = 0; i < h.pointCount; i++, o += h.recordLength) {
    const x = dv.getInt32(o, true) * sx + ox;
    const y = dv.getInt32(o + 4, true) * sy + oy;
    const z = dv.getInt32(o + 8, true) * sz + oz;
    if (x < h.min[0] - tol[0] || x > h.max[0] + tol[0] || y < h.min[1] - tol[1] || y > h.max[1] + tol[1] || z < h.min[2] - tol[2] || z > h.max[2] + tol[2]) {
      const p = (v: number) => String(Math.round(v * 1000) / 1000);
      fail(file, `point ${(i + 1).toLocaleString('en-US')} of ${h.pointCount.toLocaleString('en-US')} decodes to (${p(x)}, ${p(y)}, ${p(z)}), outside the header's extent: the compressed data are damaged, or the header claims more points than it holds`);
    }
  }
}

/** Reads a LAZ file into raw ground: the same points, CRS and units a LAS file of the same records gives. */
export async function readLaz(bytes: Uint8Array, file: string, opts: LazOptions = {}): Promise<RawGround> {
  const h0 = readLasHeader(bytes, file);
  checkLasPoints(h0, file);
  const { header: h, records } = await decodeLazRecords(bytes, file, opts.wasmUrl);
  checkExtent(h, records, file);
  return pointsFromRecords(h, records, 0, file, `laz${h.versionMajor}.${h.versionMinor}`);
}
