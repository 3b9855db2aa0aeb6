/**
 * Ground import figures: `ground.ply50mb` (parse and grid a generated 50 MB binary PLY mesh of an
 * invented rock slab; its peak memory growth over the file size), `ground.tif4000` (a generated
 * 4000² DEFLATE GeoTIFF made by GDAL's gdal_translate: a 1000² window, and the whole file) and
 * `ground.solve4000` (cold solves on the whole 4000² GeoTIFF imported as a grid / the same poses on a
 * 64² grid of the same surface, run by run). Quick mode uses small files. The GeoTIFF figures need
 * gdal-bin; without it they say so.
 */
import { execFileSync } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { join } from 'node:path';
import { fromFile } from 'geotiff';
import { buildGround, groundFeature } from '../src/core/ground/index';
import { buildModel, solveEquilibrium, type Pose, type TerrainFeature, type VehicleModel } from '../src/core/index';
import { readGroundBytes } from '../src/ground-io/read';
import { readGeoTiff } from '../src/ground-io/geotiff';
import { figure, ratios, summarise, timePaired, unavailable, type Figure } from './harness';
import { demoScenario } from './scenes';

export const GROUND_TARGETS = [
  { name: 'ground.ply50mb', op: '<=', bound: 1500, unit: 'ms' },
  { name: 'ground.ply50mb.memory', op: '<=', bound: 4, unit: '× file' },
  { name: 'ground.tif4000.window1000', op: '<=', bound: 1000, unit: 'ms' },
  { name: 'ground.tif4000.whole', op: '<=', bound: 10000, unit: 'ms' },
  { name: 'ground.solve4000', op: '<=', bound: 1.5, unit: '×' },
] as const;

export const GROUND_FIGURE_NAMES = ['ground.ply50mb', 'ground.ply50mb.memory'] as const;

/** A binary PLY mesh of an n × n lattice over a rough invented slab (1 cm spacing). */
function plyLattice(n: number): Uint8Array {
  const nv = n * n;
  const nt = 2 * (n - 1) * (n - 1);
  const header = new TextEncoder().encode(
    `ply\nformat binary_little_endian 1.0\nelement vertex ${nv}\nproperty float x\nproperty float y\nproperty float z\nelement face ${nt}\nproperty list uchar int vertex_indices\nend_header\n`,
  );
  const out = new Uint8Array(header.length + nv * 12 + nt * 13);
  out.set(header);
  const dv = new DataView(out.buffer);
  let o = header.length;
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      const x = i * 0.01;
      const y = j * 0.01;
      dv.setFloat32(o, x, true);
      dv.setFloat32(o + 4, y, true);
      dv.setFloat32(o + 8, 0.3 * Math.sin(x * 0.9) * Math.cos(y * 1.1) + 0.02 * Math.sin(x * 17 + y * 13), true);
      o += 12;
    }
  }
  for (let j = 0; j < n - 1; j++) {
    for (let i = 0; i < n - 1; i++) {
      const a = j * n + i;
      for (const [p, q, r] of [[a, a + 1, a + n + 1], [a, a + n + 1, a + n]]) {
        dv.setUint8(o, 3);
        dv.setInt32(o + 1, p, true);
        dv.setInt32(o + 5, q, true);
        dv.setInt32(o + 9, r, true);
        o += 13;
      }
    }
  }
  return out;
}

/**
 * A full garbage collection before each measured import, so that the memory figure does not start
 * from (and a collection during the import does not free) what earlier benchmarks left behind:
 * V8's gc() made available at run time (the --expose-gc flag, set from inside the process).
 */
function collectGarbage(): void {
  const own = (globalThis as { gc?: () => void }).gc;
  if (own) return own();
  setFlagsFromString('--expose-gc');
  (runInNewContext('gc') as () => void)();
}

export async function groundFigures(quick: boolean, log: (line: string) => void): Promise<Figure[]> {
  const figures: Figure[] = [];
  // --- ground.ply50mb: ~38 bytes per lattice vertex (12 + 2 × 13): 1150² ≈ 50 MB.
  const n = quick ? 120 : 1150;
  const bytes = plyLattice(n);
  const mb = bytes.length / 1e6;
  const runs = quick ? 1 : 3;
  const samples: number[] = [];
  let memRatio = 0;
  let cells = 0;
  for (let r = 0; r < runs + (quick ? 0 : 1); r++) {
    collectGarbage();
    // Let the collector's concurrent sweeping finish before the baseline is read.
    await new Promise((done) => setTimeout(done, 20));
    const before = process.memoryUsage();
    // Resident set, and the JavaScript heap plus memory outside it (typed arrays): a small import can
    // fit in pages the process already holds, so the resident set alone may not grow at all. The
    // growth is the largest rise above the lowest level seen before it: typed arrays that earlier
    // benchmarks dropped are released by the collector in the background, sometimes during the import.
    const held = (m: NodeJS.MemoryUsage) => m.heapUsed + m.external;
    let lowRss = before.rss;
    let lowHeld = held(before);
    let riseRss = 0;
    let riseHeld = 0;
    const sample = () => {
      const m = process.memoryUsage();
      lowRss = Math.min(lowRss, m.rss);
      lowHeld = Math.min(lowHeld, held(m));
      riseRss = Math.max(riseRss, m.rss - lowRss);
      riseHeld = Math.max(riseHeld, held(m) - lowHeld);
    };
    const timer = setInterval(sample, 5);
    const t0 = performance.now();
    const raw = await readGroundBytes(bytes, 'bench.ply');
    sample();
    const res = buildGround(raw, { cellM: 0.02, fill: true, unitM: 1, up: 'z' });
    const ms = performance.now() - t0;
    sample();
    clearInterval(timer);
    cells = res.summary.cells;
    if (quick || r > 0) {
      samples.push(ms);
      memRatio = Math.max(memRatio, Math.max(riseRss, riseHeld) / bytes.length);
    }
  }
  figures.push(figure('ground.ply50mb', samples, 'ms', `read and grid a ${mb.toFixed(1)} MB binary PLY mesh (${n * n} vertices, ${2 * (n - 1) * (n - 1)} triangles) at 2 cm: outlier removal, rasterising, fill; ${cells} nodes`));
  figures.push(figure('ground.ply50mb.memory', [memRatio], '× file', 'memory growth during the import (sampled every 5 ms and between its steps: the larger rise, of the resident set or of the heap plus typed arrays, above the lowest level seen before it) over the file size'));
  log(`ground.ply50mb: ${samples.map((s) => s.toFixed(0)).join(', ')} ms`);

  // --- ground.tif4000: a DEFLATE, tiled Float32 GeoTIFF made by gdal_translate from raw heights.
  const size = quick ? 500 : 4000;
  const win = quick ? 125 : 1000;
  let gdal = true;
  try {
    execFileSync('gdal_translate', ['--version'], { stdio: 'ignore' });
  } catch {
    gdal = false;
  }
  if (!gdal) {
    figures.push(unavailable('ground.tif4000.window1000', 'ms', 'gdal_translate (gdal-bin) is not installed: the GeoTIFF cannot be generated'));
    figures.push(unavailable('ground.tif4000.whole', 'ms', 'gdal_translate (gdal-bin) is not installed'));
    figures.push(unavailable('ground.solve4000', '×', 'gdal_translate (gdal-bin) is not installed: the GeoTIFF cannot be generated'));
    return figures;
  }
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-bench-'));
  try {
    const h = new Float32Array(size * size);
    for (let r = 0; r < size; r++) for (let c = 0; c < size; c++) h[r * size + c] = 100 + 20 * Math.sin(c / 300) * Math.cos(r / 410) + 0.5 * Math.sin(c / 7 + r / 11);
    writeFileSync(join(dir, 'dem.bil'), new Uint8Array(h.buffer));
    writeFileSync(join(dir, 'dem.hdr'), `ENVI\nsamples = ${size}\nlines = ${size}\nbands = 1\nheader offset = 0\nfile type = ENVI Standard\ndata type = 4\ninterleave = bsq\nbyte order = 0\nmap info = {UTM, 1, 1, 500000, 4200000, 1, 1, 10, North, WGS-84}\n`);
    const tif = join(dir, 'dem.tif');
    execFileSync('gdal_translate', ['-q', '-of', 'GTiff', '-a_srs', 'EPSG:32610', '-co', 'COMPRESS=DEFLATE', '-co', 'TILED=YES', join(dir, 'dem.bil'), tif]);
    const x0 = 500000 + (size / 2 - win / 2);
    const y0 = 4200000 - (size / 2 + win / 2);
    const crop: [number, number, number, number] = [x0, y0, x0 + win - 1, y0 + win - 1];
    const winMs: number[] = [];
    const wholeMs: number[] = [];
    let wholeRaw: Awaited<ReturnType<typeof readGeoTiff>> | null = null;
    for (let r = 0; r < (quick ? 1 : 3); r++) {
      let t0 = performance.now();
      let tiff = await fromFile(tif);
      const w = buildGround(await readGeoTiff(tiff, 'dem.tif', { crop }), { crop });
      winMs.push(performance.now() - t0);
      await tiff.close();
      if (r === 0) log(`ground.tif4000 window: ${w.grid.cols} × ${w.grid.rows}`);
      // The whole raster decoded to heights (a 4000² grid is more than a scenario holds: the import then asks for a crop).
      t0 = performance.now();
      tiff = await fromFile(tif);
      let reports = 0;
      const whole = await readGeoTiff(tiff, 'dem.tif', { onProgress: () => void reports++ });
      wholeMs.push(performance.now() - t0);
      await tiff.close();
      if (r === 0) log(`ground.tif4000 whole: ${whole.cols} × ${whole.rows}, ${reports} progress reports`);
      if (r === 0) wholeRaw = whole;
    }
    figures.push(figure('ground.tif4000.window1000', winMs, 'ms', `a ${win}² window of a ${size}² DEFLATE tiled GeoTIFF (read from disk, only the tiles it needs) to a grid`));
    figures.push(figure('ground.tif4000.whole', wholeMs, 'ms', `the whole ${size}² GeoTIFF decoded to heights, in bands of 256 rows with a progress report after each`));
    figures.push(solveOnImported(wholeRaw!, quick, log));
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
  return figures;
}

/**
 * ground.solve4000: the whole GeoTIFF imported (buildGround: the raster's own 1 m cell, local origin
 * at its centre) as the scenario's grid, and a 64² grid cut from it around the centre (the same
 * nodes: the same surface under the vehicle, only the grid's size differs). Cold solves of the demo
 * vehicle at eight poses near the centre on each, alternately; the figure is big / small, run by run.
 */
export function solveOnImported(raw: Parameters<typeof buildGround>[0], quick: boolean, log: (line: string) => void): Figure {
  const res = buildGround(raw, {});
  const big = groundFeature(res);
  const n = 64;
  const c0 = Math.floor((big.cols - n) / 2);
  const r0 = Math.floor((big.rows - n) / 2);
  const h = new Float32Array(n * n);
  for (let r = 0; r < n; r++) for (let c = 0; c < n; c++) h[r * n + c] = big.heightsM[(r0 + r) * big.cols + c0 + c];
  const small: TerrainFeature = {
    type: 'grid',
    originM: [big.originM[0] + c0 * big.spacingM, big.originM[1] + r0 * big.spacingM],
    spacingM: big.spacingM,
    cols: n,
    rows: n,
    heightsM: h,
  };
  // Poses within ±8 m of the small grid's centre: the vehicle and its tyres stay well inside it.
  const cx = small.originM[0] + ((n - 1) / 2) * big.spacingM;
  const cy = small.originM[1] + ((n - 1) / 2) * big.spacingM;
  const poses: Pose[] = [];
  for (let k = 0; k < 8; k++) poses.push({ xM: cx - 8 + (16 * k) / 7, yM: cy + 6 * Math.sin(k), headingRad: (2 * Math.PI * k) / 8 });
  const vehicle = demoScenario().vehicle;
  const mBig: VehicleModel = buildModel(vehicle, { features: [big] });
  const mSmall: VehicleModel = buildModel(vehicle, { features: [small] });
  // Same ground, same answer: the loads on the two grids agree (a check that the comparison is fair).
  for (const p of poses) {
    const a = solveEquilibrium(mBig, p);
    const b = solveEquilibrium(mSmall, p);
    for (let w = 0; w < 4; w++) {
      if (Math.abs((a.wheels[w].loadN ?? 0) - (b.wheels[w].loadN ?? 0)) > 1e-6 * a.weightN) throw new Error('ground.solve4000: the two grids give different loads');
    }
  }
  const solveAll = (m: VehicleModel) => () => {
    for (const p of poses) solveEquilibrium(m, p);
  };
  const t = timePaired(solveAll(mSmall), solveAll(mBig), quick ? { warmup: 1, runs: 1, batch: 1 } : { warmup: 3, runs: 21, batch: 5 });
  const per = (ms: readonly number[]) => (summarise(ms).median / poses.length).toFixed(3);
  log(`ground.solve4000: ${big.cols} × ${big.rows} imported: ${per(t.b)} ms a solve; 64²: ${per(t.a)} ms`);
  return figure(
    'ground.solve4000',
    ratios(t.b, t.a),
    '×',
    `cold solve on the whole ${big.cols} × ${big.rows} GeoTIFF imported as a grid (${big.spacingM} m cell) / the same 8 poses on the 64² grid cut from it around the vehicle; per solve ${per(t.b)} ms / ${per(t.a)} ms`,
  );
}
