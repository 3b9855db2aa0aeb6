/**
 * The `ground` command end to end: the scenario it writes is accepted by pose and rose; crop,
 * --cell resampling of a DEM, levelling a tilted PLY scan, the size warning, and pose saying when a
 * tyre stands on filled ground.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { TerrainField } from '../../src/core';
import { plyMesh, plyPoints } from './plyWrite';
import { writeLas } from './lasWrite';
import { tempDir } from './tools';

function io(): CliIO & { outs: string[]; errs: string[] } {
  const outs: string[] = [];
  const errs: string[] = [];
  return { outs, errs, out: (l) => void outs.push(l), err: (l) => void errs.push(l), readFile: (p) => readFileSync(p, 'utf8') };
}

const dir = tempDir();

/** A 6 m × 4 m invented slab with a 0.25 m dome, a lattice every 2 cm, as points (x, y, z). */
function slab(tiltDeg = 0): Float64Array {
  const f = new TerrainField({ features: [{ type: 'rock', xM: 1.4, yM: 0.8, heightM: 0.25, radiusM: 0.5 }] });
  const cols = 301;
  const rows = 201;
  const t = (tiltDeg * Math.PI) / 180;
  const pos = new Float64Array(cols * rows * 3);
  for (let j = 0; j < rows; j++) for (let i = 0; i < cols; i++) {
    const x = -3 + i * 0.02;
    const y = -2 + j * 0.02;
    const z = f.height(x, y);
    // Tilted about the y axis by t (a scan taken with the phone not level).
    pos.set([x * Math.cos(t) + z * Math.sin(t), y, -x * Math.sin(t) + z * Math.cos(t)], 3 * (j * cols + i));
  }
  return pos;
}

describe('plumbline ground', () => {
  it('writes a scenario that pose and rose accept, and --json says what was done', async () => {
    const file = join(dir, 'slab.ply');
    writeFileSync(file, plyPoints(slab()));
    const out = join(dir, 'slab.json');
    const t = io();
    expect(await runCli(['ground', file, '-o', out, '--fill', '--json', '--cell', '0.04', '--ground-filter', 'none'], t)).toBe(0);
    const sum = JSON.parse(t.outs.join('\n'));
    expect(sum.pointsRead).toBe(301 * 201);
    expect(sum.cellM).toBe(0.04);
    expect(sum.cols).toBe(151);
    expect(sum.steps.map((s: { step: string }) => s.step)).toEqual(['units and up axis', 'local origin', 'outlier removal', 'cell size', 'ground filter', 'gridding', 'hole filling']);
    const p = io();
    expect(await runCli(['pose', out, '--json'], p)).toBe(0);
    const pose = JSON.parse(p.outs.join('\n'));
    expect(pose.status).toBe('converged');
    expect(pose.onFilledGround).toBe(false);
    const r = io();
    expect(await runCli(['rose', out, '--step', '90', '--json'], r)).toBe(0);
    expect(JSON.parse(r.outs.join('\n'))).toBeTruthy();
  }, 60_000);

  it('--level brings a scan tilted by 6° back within 0.1°', async () => {
    const file = join(dir, 'tilted.ply');
    writeFileSync(file, plyPoints(slab(6)));
    const t = io();
    expect(await runCli(['ground', file, '-o', join(dir, 'tilted.json'), '--fill', '--json', '--cell', '0.05', '--level', '--ground-filter', 'none'], t)).toBe(0);
    const sum = JSON.parse(t.outs.join('\n'));
    // Known answer: the 6° applied; the RANSAC plane is the level slab around the dome.
    expect(Math.abs(sum.levellingDeg - 6)).toBeLessThan(0.1);
  }, 60_000);

  it('--crop keeps only the area asked for (LAS, map coordinates)', async () => {
    const pts = slab().map((v, k) => (k % 3 === 0 ? v + 500000 : k % 3 === 1 ? v + 4000000 : v + 100));
    const file = join(dir, 'slab.las');
    writeFileSync(file, writeLas(pts, pts.length / 3, { version: 2, epsg: 32610, unitCode: 9001 }));
    const t = io();
    expect(await runCli(['ground', file, '-o', join(dir, 'crop.json'), '--json', '--fill', '--cell', '0.1', '--crop', '499999,3999999,500001,4000000.5'], t)).toBe(0);
    const sum = JSON.parse(t.outs.join('\n'));
    expect(sum.croppedOut).toBeGreaterThan(0);
    expect(sum.cols).toBe(21);
    expect(sum.rows).toBe(16);
    expect(sum.originSource.x).toBeCloseTo(500000, 6);
    expect(sum.originSource.y).toBeCloseTo(3999999.75, 6);
  }, 60_000);

  it('--cell resamples a DEM bilinearly; the size warning flags a scan that is probably in mm', async () => {
    const asc = ['ncols 5', 'nrows 5', 'xllcenter 0', 'yllcenter 0', 'cellsize 1'];
    for (let r = 4; r >= 0; r--) asc.push([0, 1, 2, 3, 4].map((c) => String(0.1 * c + 0.2 * r)).join(' '));
    const file = join(dir, 'plane.asc');
    writeFileSync(file, asc.join('\n') + '\n');
    const t = io();
    expect(await runCli(['ground', file, '-o', join(dir, 'plane.json'), '--json', '--cell', '0.5'], t)).toBe(0);
    const sum = JSON.parse(t.outs.join('\n'));
    expect([sum.cols, sum.rows]).toEqual([9, 9]);
    const g = JSON.parse(readFileSync(join(dir, 'plane.json'), 'utf8')).terrain.features[0];
    expect(g.spacing).toBe(0.5);
    // A plane resamples exactly: node (c, r) at (0.5c, 0.5r) m has height 0.1·0.5c + 0.2·0.5r above the lowest.
    const f = new TerrainField({ features: [{ type: 'grid', originM: g.origin, spacingM: 0.5, cols: 9, rows: 9, heightsM: decodeF32(g.heights) }] });
    expect(f.height(g.origin[0] + 1.5, g.origin[1] + 2)).toBeCloseTo(0.1 * 1.5 + 0.2 * 2, 6);

    const mm = join(dir, 'mm.ply');
    const tri = new Float32Array([0, 0, 0, 3000, 0, 0, 0, 2000, 0, 3000, 2000, 100]);
    writeFileSync(mm, plyMesh(tri, new Uint32Array([0, 1, 2, 1, 3, 2])));
    const w = io();
    expect(await runCli(['ground', mm, '-o', join(dir, 'mm.json'), '--cell', '20', '--keep-outliers'], w)).toBe(0);
    expect(w.errs.join('\n')).toMatch(/warning: the ground is 3000 m across in the chosen unit; a scan that wide is unusual: is it in mm or cm\?/);
  });

  it('pose says when a tyre stands on filled ground', async () => {
    // The slab with the points under the front-left tyre (x 1.4, y 0.8) removed: that patch is filled.
    const pts = slab();
    const kept: number[] = [];
    for (let k = 0; k < pts.length; k += 3) if (Math.hypot(pts[k] - 1.4, pts[k + 1] - 0.8) > 0.45) kept.push(pts[k], pts[k + 1], pts[k + 2]);
    const file = join(dir, 'holed.ply');
    writeFileSync(file, plyPoints(Float64Array.from(kept)));
    const out = join(dir, 'holed.json');
    expect(await runCli(['ground', file, '-o', out, '--fill', '--cell', '0.04', '--ground-filter', 'none'], io())).toBe(0);
    const p = io();
    await runCli(['pose', out, '--json'], p);
    expect(JSON.parse(p.outs.join('\n')).onFilledGround).toBe(true);
    const h = io();
    await runCli(['pose', out], h);
    expect(h.outs.join('\n')).toContain('a tyre stands on ground that was filled in by the import');
  }, 60_000);
});

function decodeF32(s: string): Float32Array {
  const b = Buffer.from(s.slice('base64-f32le:'.length), 'base64');
  return new Float32Array(b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength));
}
