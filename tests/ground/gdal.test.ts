/**
 * The ground import against GDAL (Debian's gdal-bin) as the outside reference: GeoTIFF heights
 * against gdallocationinfo, point gridding against gdal_grid, slope and aspect against gdaldem
 * (Horn 1981), hole filling against gdal_fillnodata.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { fromFile } from 'geotiff';
import { readGeoTiff } from '../../src/ground-io/geotiff';
import { buildGround, fillHoles, gridPoints, hornSlopeAspect, type HeightGrid } from '../../src/core/ground/index';
import { ascText, fillNodataTool, requireGdal, run, tempDir, xyzMap } from './tools';

/** Park–Miller generator, fixed seed (Park & Miller 1988). */
function rng(seed = 11): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return (s - 1) / 2147483646;
  };
}

/** An invented hillside: a 12 % grade, a ridge and a few bumps (m), on a 0.5 m grid. */
function hill(x: number, y: number): number {
  return 0.12 * x + 0.05 * y + 1.5 * Math.sin(x / 7) * Math.cos(y / 9) + 0.4 * Math.exp(-((x - 20) ** 2 + (y - 15) ** 2) / 18);
}

let dir = '';
beforeAll(() => {
  requireGdal();
  dir = tempDir();
});

/** A GeoTIFF (DEFLATE, tiled, Float32, EPSG:32610, nodata −9999) made by gdal_translate from an ASCII grid. */
function makeTiff(cols: number, rows: number, cell: number, x0: number, y0: number, f: (x: number, y: number) => number, holes = false): { file: string; h: Float64Array } {
  const h = new Float64Array(cols * rows);
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) h[r * cols + c] = Math.fround(f(c * cell, r * cell));
  if (holes) for (let r = 10; r < 14; r++) for (let c = 30; c < 37; c++) h[r * cols + c] = NaN;
  const asc = join(dir, `dem${cols}.asc`);
  writeFileSync(asc, ascText(cols, rows, x0, y0, cell, h));
  const tif = join(dir, `dem${cols}.tif`);
  run('gdal_translate', ['-q', '-of', 'GTiff', '-ot', 'Float32', '-a_srs', 'EPSG:32610', '-a_nodata', '-9999', '-co', 'COMPRESS=DEFLATE', '-co', 'TILED=YES', '-co', 'BLOCKXSIZE=32', '-co', 'BLOCKYSIZE=32', asc, tif]);
  return { file: tif, h };
}

describe('GeoTIFF heights against gdallocationinfo', () => {
  it('every sampled pixel equals GDAL\'s value exactly (float32), whole image and a window; nodata becomes a hole; the CRS is kept', async () => {
    const cols = 150;
    const rows = 120;
    const { file } = makeTiff(cols, rows, 0.5, 500000.25, 4100000.25, (x, y) => 200 + hill(x, y), true);
    const tiff = await fromFile(file);
    const raw = await readGeoTiff(tiff, 'dem.tif');
    expect(raw.info.crs).toBe('EPSG:32610');
    expect(raw.cols).toBe(cols);
    expect(raw.rows).toBe(rows);
    expect(raw.cell).toBe(0.5);
    // Pixel centres: xllcenter / yllcenter as written (the ASCII grid names the south-west pixel's centre).
    expect(raw.originX).toBe(500000.25);
    expect(raw.originY).toBe(4100000.25);
    const r = rng();
    const pix: [number, number][] = [];
    for (let k = 0; k < 60; k++) pix.push([Math.floor(r() * cols), Math.floor(r() * rows)]);
    pix.push([32, rows - 1 - 11]); // inside the nodata hole (image row counted from the top)
    // gdallocationinfo reads "pixel line" pairs from stdin (pixel = column, line = row from the top).
    const out = run('gdallocationinfo', ['-valonly', file], pix.map(([p, l]) => `${p} ${l}`).join('\n') + '\n').trim().split('\n');
    expect(out.length).toBe(pix.length);
    // A window: the crop in map coordinates around x 20–40 m, y 10–30 m of the hill.
    const crop: [number, number, number, number] = [500000.25 + 20, 4100000.25 + 10, 500000.25 + 40, 4100000.25 + 30];
    const win = await readGeoTiff(tiff, 'dem.tif', { crop });
    expect(win.cols).toBeLessThan(cols / 2);
    let inWindow = 0;
    for (let k = 0; k < pix.length; k++) {
      const [p, l] = pix[k];
      const ours = raw.heights[(rows - 1 - l) * cols + p];
      const gdal = Number(out[k]);
      if (gdal === -9999) expect(Number.isNaN(ours)).toBe(true);
      // GDAL prints the float32 value to 15 digits: rounding that to float32 is exact.
      else expect(ours).toBe(Math.fround(gdal));
      const wc = Math.round((500000.25 + p * 0.5 - win.originX) / 0.5);
      const wr = Math.round((4100000.25 + (rows - 1 - l) * 0.5 - win.originY) / 0.5);
      if (wc >= 0 && wc < win.cols && wr >= 0 && wr < win.rows) {
        inWindow++;
        const wv = win.heights[wr * win.cols + wc];
        if (gdal === -9999) expect(Number.isNaN(wv)).toBe(true);
        else expect(wv).toBe(Math.fround(gdal));
      }
    }
    expect(inWindow).toBeGreaterThan(3);
    await tiff.close();
  });
});

describe('point gridding against gdal_grid', () => {
  it('min, max and mean within a 0.3 m circle agree with gdal_grid within 1 mm at every node', () => {
    const r = rng(5);
    const n = 4000;
    const xyz = new Float32Array(n * 3);
    const lines = ['x,y,z'];
    for (let i = 0; i < n; i++) {
      // Coordinates on a 1/1024 m lattice are exact in float32 and in the CSV.
      const x = Math.round(r() * 10 * 1024) / 1024;
      const y = Math.round(r() * 8 * 1024) / 1024;
      const z = Math.round((hill(x, y) + (r() - 0.5) * 0.05) * 1024) / 1024;
      xyz.set([x, y, z], 3 * i);
      lines.push(`${x},${y},${z}`);
    }
    writeFileSync(join(dir, 'pts.csv'), lines.join('\n') + '\n');
    writeFileSync(
      join(dir, 'pts.vrt'),
      `<OGRVRTDataSource><OGRVRTLayer name="pts"><SrcDataSource>${join(dir, 'pts.csv')}</SrcDataSource><GeometryType>wkbPoint</GeometryType><GeometryField encoding="PointFromColumns" x="x" y="y" z="z"/></OGRVRTLayer></OGRVRTDataSource>`,
    );
    // 40 × 32 pixels of 0.25 m over [0, 10] × [0, 8]: gdal_grid's nodes are the pixel centres.
    const cell = 0.25;
    const spec = { originM: [cell / 2, cell / 2] as const, cellM: cell, cols: 40, rows: 32 };
    for (const [alg, stat] of [['minimum', 'min'], ['maximum', 'max'], ['average', 'mean']] as const) {
      const tif = join(dir, `grid-${alg}.tif`);
      run('gdal_grid', ['-q', '-a', `${alg}:radius1=0.3:radius2=0.3:nodata=-9999`, '-txe', '0', '10', '-tye', '0', '8', '-outsize', '40', '32', '-ot', 'Float64', '-of', 'GTiff', '-l', 'pts', join(dir, 'pts.vrt'), tif]);
      const ref = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', tif, '/vsistdout/']));
      const ours = gridPoints(xyz, n, spec, { statistic: stat, radiusM: 0.3 });
      let compared = 0;
      let worst = 0;
      for (let rr = 0; rr < spec.rows; rr++) {
        for (let c = 0; c < spec.cols; c++) {
          const key = `${(cell / 2 + c * cell).toFixed(4)} ${(cell / 2 + rr * cell).toFixed(4)}`;
          const g = ref.get(key);
          expect(g, key).toBeDefined();
          const v = ours.heightsM[rr * spec.cols + c];
          if (g === -9999) {
            expect(Number.isNaN(v)).toBe(true);
            continue;
          }
          compared++;
          worst = Math.max(worst, Math.abs(v - (g as number)));
        }
      }
      expect(compared).toBeGreaterThan(1000);
      // Tolerance 1 mm (the spec); the heights are float32 in our grid.
      expect(worst, alg).toBeLessThan(0.001);
      if (process.env.GROUND_SHOW_MESSAGES) console.log(`gdal_grid ${alg}: ${compared} nodes, worst ${worst} m`);
    }
  });
});

describe('slope and aspect of an imported grid against gdaldem (Horn 1981)', () => {
  it('agree within 0.1° at every interior node', async () => {
    const cols = 80;
    const rows = 60;
    const { file } = makeTiff(cols, rows, 0.5, 600000.25, 4200000.25, (x, y) => 100 + hill(x, y));
    const raw = await readGeoTiff(await fromFile(file), 'hill.tif');
    const res = buildGround(raw, {});
    const { slopeDeg, aspectDeg } = hornSlopeAspect(res.grid);
    const slopeRef = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', (run('gdaldem', ['slope', '-q', file, join(dir, 'slope.tif')]), join(dir, 'slope.tif')), '/vsistdout/']));
    run('gdaldem', ['aspect', '-q', file, join(dir, 'aspect.tif')]);
    const aspectRef = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', join(dir, 'aspect.tif'), '/vsistdout/']));
    let n = 0;
    for (let r = 1; r < rows - 1; r++) {
      for (let c = 1; c < cols - 1; c++) {
        const key = `${(600000.25 + c * 0.5).toFixed(4)} ${(4200000.25 + r * 0.5).toFixed(4)}`;
        const s = slopeRef.get(key);
        const a = aspectRef.get(key);
        expect(s, key).toBeDefined();
        expect(Math.abs(slopeDeg[r * cols + c] - (s as number))).toBeLessThan(0.1);
        if ((s as number) > 1) {
          let d = Math.abs(aspectDeg[r * cols + c] - (a as number));
          if (d > 180) d = 360 - d;
          expect(d).toBeLessThan(0.1);
        }
        n++;
      }
    }
    expect(n).toBe((cols - 2) * (rows - 2));
  });
});

describe('hole filling against gdal_fillnodata', () => {
  it('on holes punched into the hill, the Laplace fill\'s RMS error is no worse than gdal_fillnodata\'s', () => {
    const cols = 100;
    const rows = 80;
    const cell = 0.5;
    const truth = new Float64Array(cols * rows);
    for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) truth[r * cols + c] = Math.fround(hill(c * cell, r * cell));
    const h = Float32Array.from(truth);
    const holes: number[] = [];
    const rr = rng(9);
    for (let k = 0; k < 6; k++) {
      const hc = 8 + Math.floor(rr() * (cols - 16));
      const hr = 8 + Math.floor(rr() * (rows - 16));
      const rad = 2 + Math.floor(rr() * 4);
      for (let r = hr - rad; r <= hr + rad; r++) for (let c = hc - rad; c <= hc + rad; c++) {
        if ((r - hr) ** 2 + (c - hc) ** 2 <= rad * rad && !Number.isNaN(h[r * cols + c])) {
          h[r * cols + c] = NaN;
          holes.push(r * cols + c);
        }
      }
    }
    const asc = join(dir, 'holes.asc');
    writeFileSync(asc, ascText(cols, rows, 0, 0, cell, h));
    const tif = join(dir, 'holes.tif');
    run('gdal_translate', ['-q', '-ot', 'Float32', '-a_nodata', '-9999', asc, tif]);
    const filledTif = join(dir, 'filled.tif');
    run(fillNodataTool(), ['-q', '-md', '20', tif, filledTif]);
    const ref = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', filledTif, '/vsistdout/']));
    const g: HeightGrid = { kind: 'grid', originM: [0, 0], cellM: cell, cols, rows, heightsM: h, filled: new Uint8Array(cols * rows) };
    expect(fillHoles(g)).toBe(holes.length);
    let se = 0;
    let seGdal = 0;
    for (const k of holes) {
      const r = Math.floor(k / cols);
      const c = k - r * cols;
      const gv = ref.get(`${(c * cell).toFixed(4)} ${(r * cell).toFixed(4)}`) as number;
      expect(gv).not.toBe(-9999);
      se += (h[k] - truth[k]) ** 2;
      seGdal += (gv - truth[k]) ** 2;
      expect(g.filled[k]).toBe(1);
    }
    const rms = Math.sqrt(se / holes.length);
    const rmsGdal = Math.sqrt(seGdal / holes.length);
    expect(holes.length).toBeGreaterThan(50);
    if (process.env.GROUND_SHOW_MESSAGES) console.log(`fill RMS over ${holes.length} nodes: Laplace ${rms} m, gdal_fillnodata ${rmsGdal} m`);
    expect(rms).toBeLessThanOrEqual(rmsGdal);
    void readFileSync;
  });
});
