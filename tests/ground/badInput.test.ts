/**
 * Bad ground files: truncated, wrong magic numbers, NaN and nodata heights, a header that claims
 * billions of points, absurd scale factors, a mesh with no triangles. Each gives a clear message
 * naming the file and the problem within a second, and the CLI leaves the output scenario untouched.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { buildGround } from '../../src/core/ground/index';
import { readGroundBytes } from '../../src/ground-io/read';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { plyMesh, plyPoints } from './plyWrite';
import { writeLas } from './lasWrite';
import { requireGdal, run, tempDir } from './tools';
import { expectRefusal } from './refusal';

const enc = (s: string) => new TextEncoder().encode(s);

function cloud(n = 400): Float64Array {
  const xyz = new Float64Array(n * 3);
  for (let i = 0; i < n; i++) xyz.set([500000 + (i % 20) * 0.1, 4000000 + Math.floor(i / 20) * 0.1, 100 + 0.01 * (i % 7)], 3 * i);
  return xyz;
}

const goodLas = () => writeLas(cloud(), 400, { version: 2, epsg: 32610, unitCode: 9001 });
const goodPly = () => plyMesh(new Float32Array([0, 0, 0, 1, 0, 0, 0, 1, 0, 1, 1, 0.1]), new Uint32Array([0, 1, 2, 1, 3, 2]));

function patch(bytes: Uint8Array, f: (dv: DataView) => void): Uint8Array {
  const c = bytes.slice();
  f(new DataView(c.buffer));
  return c;
}

let tiffBytes: Uint8Array | null = null;
function goodTiff(): Uint8Array {
  if (tiffBytes) return tiffBytes;
  requireGdal();
  const dir = tempDir();
  const asc = ['ncols 64', 'nrows 64', 'xllcorner 0', 'yllcorner 0', 'cellsize 1', 'NODATA_value -9999'];
  for (let r = 0; r < 64; r++) asc.push(Array.from({ length: 64 }, (_, c) => String(c * 0.1 + r * 0.05)).join(' '));
  writeFileSync(join(dir, 'g.asc'), asc.join('\n') + '\n');
  run('gdal_translate', ['-q', '-ot', 'Float32', '-a_srs', 'EPSG:32610', '-co', 'COMPRESS=DEFLATE', join(dir, 'g.asc'), join(dir, 'g.tif')]);
  tiffBytes = new Uint8Array(readFileSync(join(dir, 'g.tif')));
  return tiffBytes;
}

const cases: { name: string; file: string; bytes: () => Uint8Array; message: RegExp; fill?: boolean }[] = [
  { name: 'truncated LAS', file: 'cut.las', bytes: () => goodLas().subarray(0, 227 + 100 + 20 * 50), message: /truncated: the header claims 400 points/ },
  { name: 'LAS with a wrong magic number', file: 'bad.las', bytes: () => patch(goodLas(), (dv) => dv.setUint8(0, 88)), message: /not a LAS file/ },
  { name: 'LAS whose header claims 4 billion points', file: 'huge.las', bytes: () => patch(goodLas(), (dv) => dv.setUint32(107, 4_000_000_000, true)), message: /claims 4,000,000,000 points/ },
  { name: 'LAS 1.4 whose header claims 10¹² points', file: 'huge14.las', bytes: () => patch(writeLas(cloud(), 400, { version: 4 }), (dv) => dv.setBigUint64(247, 10n ** 12n, true)), message: /claims 1,000,000,000,000 points/ },
  { name: 'LAS with an absurd scale factor', file: 'scale.las', bytes: () => patch(goodLas(), (dv) => dv.setFloat64(139, 1e6, true)), message: /Y scale factor 1000000 is absurd/ },
  { name: 'LAS with a zero scale factor', file: 'scale0.las', bytes: () => patch(goodLas(), (dv) => dv.setFloat64(147, 0, true)), message: /Z scale factor 0 is absurd/ },
  { name: 'LAZ (compressed) points', file: 'c.laz', bytes: () => patch(goodLas(), (dv) => dv.setUint8(104, 0x80 | 0)), message: /compressed points \(LAZ\) without the "laszip encoded" record/ },
  { name: 'truncated binary PLY', file: 'cut.ply', bytes: () => goodPly().subarray(0, goodPly().length - 20), message: /truncated/ },
  { name: 'PLY with a wrong magic number', file: 'bad.ply', bytes: () => enc('plx\nformat ascii 1.0\nend_header\n'), message: /not a PLY file/ },
  { name: 'PLY whose header claims 3 billion vertices', file: 'huge.ply', bytes: () => enc('ply\nformat binary_little_endian 1.0\nelement vertex 3000000000\nproperty float x\nproperty float y\nproperty float z\nend_header\n'), message: /claims 3,000,000,000 vertices/ },
  { name: 'binary PLY with NaN coordinates', file: 'nan.ply', bytes: () => plyPoints(new Float64Array([0, 0, 0, 1, 0, NaN, 0, 1, 0, 1, 1, 0])), message: /vertex 1 has a coordinate that is not a finite number/ },
  { name: 'ASCII PLY with NaN coordinates', file: 'nan2.ply', bytes: () => plyPoints(new Float64Array([0, 0, 0, 1, 0, NaN, 0, 1, 0, 1, 1, 0]), true), message: /"NaN" in the vertex 1 is not a number/ },
  { name: 'PLY mesh with no triangles', file: 'empty.ply', bytes: () => enc('ply\nformat ascii 1.0\nelement vertex 3\nproperty float x\nproperty float y\nproperty float z\nelement face 0\nproperty list uchar int vertex_indices\nend_header\n0 0 0\n1 0 0\n0 1 0\n'), message: /no triangles/ },
  { name: 'OBJ with no triangles', file: 'v.obj', bytes: () => enc('v 0 0 0\nv 1 0 0\nv 0 1 0\n'), message: /3 vertices and no triangles/ },
  { name: 'OBJ with a face on a missing vertex', file: 'f.obj', bytes: () => enc('v 0 0 0\nv 1 0 0\nv 0 1 0\nf 1 2 9\n'), message: /line 4: face index 9/ },
  { name: 'GLB with a wrong version', file: 'v1.glb', bytes: () => patch(enc('glTF\0\0\0\0\0\0\0\0\0\0\0\0\0\0\0\0'), (dv) => { dv.setUint32(4, 1, true); dv.setUint32(8, 20, true); }), message: /GLB version 1/ },
  { name: 'glTF with no triangles', file: 'e.gltf', bytes: () => enc(JSON.stringify({ asset: { version: '2.0' }, scenes: [{ nodes: [] }], scene: 0 })), message: /no triangles/ },
  { name: 'not glTF at all', file: 'x.glb', bytes: () => enc('hello'), message: /neither a GLB/ },
  { name: 'XYZ with NaN heights', file: 'nan.xyz', bytes: () => enc('0 0 1\n1 0 nan\n0 1 1\n'), message: /line 2: x, y and z must be finite numbers/ },
  { name: 'ASCII grid of nothing but nodata', file: 'nd.asc', bytes: () => enc('ncols 2\nnrows 2\nxllcorner 0\nyllcorner 0\ncellsize 1\nNODATA_value -9999\n-9999 -9999\n-9999 -9999\n'), message: /every height in the area is nodata/ },
  { name: 'truncated ASCII grid', file: 'cut.asc', bytes: () => enc('ncols 3\nnrows 3\nxllcorner 0\nyllcorner 0\ncellsize 1\n1 2 3\n4 5\n'), message: /truncated: the header promises 3 × 3 = 9 heights, the file holds 5/ },
  { name: 'ASCII grid with holes and no --fill', file: 'holes.asc', bytes: () => enc('ncols 3\nnrows 2\nxllcorner 0\nyllcorner 0\ncellsize 1\nNODATA_value -9999\n1 -9999 3\n4 5 6\n'), message: /16.7 % of the grid \(1 of 6 nodes\) has no height; add --fill/ },
  { name: 'TIFF with a wrong magic number', file: 'bad.tif', bytes: () => patch(goodTiff(), (dv) => dv.setUint8(0, 0x58)), message: /not a TIFF/ },
  { name: 'truncated GeoTIFF', file: 'cut.tif', bytes: () => goodTiff().subarray(0, Math.floor(goodTiff().length / 3)), message: /truncated or (an unsupported compression|damaged)/ },
  { name: 'an empty file', file: 'empty.las', bytes: () => new Uint8Array(0), message: /the file is empty/ },
  { name: 'an unknown format', file: 'x.bin', bytes: () => enc('\u0001\u0002garbage'), message: /not a ground format this import knows/ },
];

describe('bad ground files: a clear message naming the file, within a second', () => {
  for (const c of cases) {
    it(c.name, async () => {
      const bytes = c.bytes();
      await expectRefusal(c.file, c.message, async () => buildGround(await readGroundBytes(bytes, c.file), { fill: c.fill ?? false }));
    });
  }
});

describe('the CLI on a bad file', () => {
  it('exits 2 with the message on stderr and leaves the output scenario untouched', async () => {
    const dir = tempDir();
    const bad = join(dir, 'huge.las');
    writeFileSync(bad, patch(goodLas(), (dv) => dv.setUint32(107, 4_000_000_000, true)));
    const out = join(dir, 'out.json');
    writeFileSync(out, '{"kept": true}');
    const errs: string[] = [];
    const io: CliIO = { out: () => {}, err: (l) => void errs.push(l), readFile: (p) => readFileSync(p, 'utf8') };
    const t0 = performance.now();
    const code = await runCli(['ground', bad, '-o', out], io);
    expect(performance.now() - t0).toBeLessThan(1000);
    expect(code).toBe(2);
    expect(errs.join('\n')).toMatch(/^plumbline: huge\.las: the header claims 4,000,000,000 points/);
    expect(readFileSync(out, 'utf8')).toBe('{"kept": true}');
  });
  it('a good LAS imports and a georeferenced one refuses --level', async () => {
    const dir = tempDir();
    const good = join(dir, 'good.las');
    writeFileSync(good, goodLas());
    const out = join(dir, 'out.json');
    const errs: string[] = [];
    const io: CliIO = { out: () => {}, err: (l) => void errs.push(l), readFile: (p) => readFileSync(p, 'utf8') };
    expect(await runCli(['ground', good, '-o', out, '--level'], io)).toBe(2);
    expect(errs.join('\n')).toMatch(/good\.las: levelling is for scans without a georeference; this ground is georeferenced \(EPSG:32610\)/);
    expect(await runCli(['ground', good, '-o', out, '--cell', '0.1', '--fill'], io)).toBe(0);
    expect(JSON.parse(readFileSync(out, 'utf8')).terrain.features[0].source.crs).toBe('EPSG:32610');
  });
});
