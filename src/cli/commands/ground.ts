/**
 * `plumbline ground FILE -o OUT.json`: import real ground (a DEM, a scan mesh or a point cloud)
 * as a height grid and write a scenario standing on it.
 */
import { closeSync, openSync, readFileSync, readSync, statSync, writeFileSync } from 'node:fs';
import { basename, dirname, join, resolve as resolvePath } from 'node:path';
import { fileURLToPath } from 'node:url';
import { fromFile } from 'geotiff';
import { parseScenarioText, scenarioToFile } from '../../core/index';
import { buildGround, GroundError, LENGTH_UNITS_M, scenarioOnGround, type GroundResult, type GroundSettings, type RawGround } from '../../core/ground/index';
import { detectFormat, FORMAT_LIST, readGroundBytes } from '../../ground-io/read';
import { readGeoTiff } from '../../ground-io/geotiff';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, UsageError, type CommandSpec } from '../command';
import { loadScenarioFile } from '../load';

/** The bundled demo the imported ground goes under when no --into scenario is given (an invented vehicle). */
export const DEFAULT_BASE = join(dirname(fileURLToPath(import.meta.url)), '..', '..', '..', 'assets', 'scenarios', 'ledge-crawler.json');

function parseCrop(v: string): [number, number, number, number] {
  const p = v.split(',').map((s) => Number(s.trim()));
  if (p.length !== 4 || p.some((x) => !Number.isFinite(x))) throw new UsageError(`--crop: must be X0,Y0,X1,Y1 (four numbers in the file's coordinates), got "${v}"`);
  if (p[0] === p[2] || p[1] === p[3]) throw new UsageError(`--crop: the area is empty ("${v}")`);
  return [p[0], p[1], p[2], p[3]];
}

/** Reads and processes a ground file (Node): a GeoTIFF reads only its window from disk. */
export async function importGroundFile(file: string, settings: GroundSettings, progress?: (done: number, total: number) => void): Promise<GroundResult> {
  const name = basename(file);
  let size: number;
  try {
    size = statSync(file).size;
  } catch (e) {
    const code = (e as { code?: unknown }).code;
    throw new GroundError(`${file}: ${code === 'ENOENT' ? 'no such file' : (e as Error).message}`);
  }
  if (size === 0) throw new GroundError(`${name}: the file is empty`);
  // The first bytes only: a GeoTIFF is then read window by window, never whole.
  const head = new Uint8Array(16);
  const fd = openSync(file, 'r');
  try {
    readSync(fd, head, 0, 16, 0);
  } finally {
    closeSync(fd);
  }
  let raw: RawGround;
  const format = detectFormat(name, head);
  if (format === 'geotiff') {
    const m = new TextDecoder("latin1").decode(head.subarray(0, 4));
    if (!['II*\0', 'MM\0*', 'II+\0', 'MM\0+'].includes(m)) throw new GroundError(`${name}: not a TIFF (the first bytes are not "II*" or "MM*")`);
    let tiff;
    try {
      tiff = await fromFile(file);
    } catch (e) {
      throw new GroundError(`${name}: the TIFF cannot be opened (${(e as Error).message}): truncated or damaged`);
    }
    try {
      raw = await readGeoTiff(tiff, name, { crop: settings.crop ?? null, onProgress: progress });
    } finally {
      await (tiff as unknown as { close?: () => Promise<void> }).close?.();
    }
  } else {
    const bytes = new Uint8Array(readFileSync(file));
    raw = await readGroundBytes(bytes, name, { resolve: (uri) => new Uint8Array(readFileSync(resolvePath(dirname(file), uri))) });
  }
  return buildGround(raw, settings);
}

export const groundCommand: CommandSpec = {
  name: 'ground',
  summary: 'Import real ground (GeoTIFF, .asc, PLY, OBJ, GLB/glTF, USDZ, LAS, LAZ, XYZ) as a height grid and write a scenario on it.',
  description:
    `Reads ${FORMAT_LIST}; removes outliers, filters the ground of a point cloud, grids it,\n` +
    'optionally levels a scan and fills holes (filled cells are marked in the file), and writes a scenario whose\n' +
    'terrain is the grid (the vehicle, tilt and friction from --into, or the bundled demo), standing at its centre.\n' +
    'Crop coordinates are the file\'s own (map coordinates for a DEM or LAS). Results on imported ground are\n' +
    'only as good as the scan: quasi-static estimates, real margins are smaller.',
  args: [{ name: 'FILE', description: 'ground file' }],
  options: [
    { name: 'output', short: 'o', kind: 'string', valueName: 'OUT.json', description: 'scenario file to write (required)' },
    { name: 'into', kind: 'string', valueName: 'SCENARIO.json', description: 'scenario whose vehicle stands on the ground (default: the bundled demo)' },
    { name: 'cell', kind: 'number', valueName: 'M', description: 'grid cell in metres (default: a quarter of the contact patch, not finer than the data)' },
    { name: 'units', kind: 'string', valueName: 'UNIT', choices: ['m', 'cm', 'mm', 'ft', 'in'], description: 'length unit of the file when it does not say (PLY, OBJ, XYZ)' },
    { name: 'up', kind: 'string', valueName: 'AXIS', choices: ['z', 'y'], description: 'up axis of the file when it does not say' },
    { name: 'crop', kind: 'string', valueName: 'X0,Y0,X1,Y1', description: 'area of interest in the file\'s coordinates' },
    { name: 'level', kind: 'flag', description: 'level a scan without georeference (RANSAC plane, then least squares)' },
    { name: 'fill', kind: 'flag', description: 'fill holes (Laplace); filled cells are marked' },
    { name: 'ground-filter', kind: 'string', valueName: 'HOW', choices: ['auto', 'class', 'pmf', 'none'], description: 'point clouds: the file\'s ground class, the morphological filter, or none (default auto)' },
    { name: 'keep-outliers', kind: 'flag', description: 'skip the statistical outlier removal' },
    { name: 'json', kind: 'flag', description: 'print what was done as one JSON object' },
  ],
  async run(args, io) {
    const file = args.positionals[0];
    const out = args.options.output as string | undefined;
    if (!out) throw new UsageError('ground: -o OUT.json is required');
    const units = args.options.units as keyof typeof LENGTH_UNITS_M | undefined;
    const settings: GroundSettings = {
      cellM: args.options.cell as number | undefined,
      unitM: units ? LENGTH_UNITS_M[units] : undefined,
      up: args.options.up as 'z' | 'y' | undefined,
      crop: args.options.crop ? parseCrop(args.options.crop as string) : null,
      level: args.options.level === true,
      fill: args.options.fill === true,
      outliers: args.options['keep-outliers'] !== true,
      groundFilter: (args.options['ground-filter'] as GroundSettings['groundFilter']) ?? 'auto',
    };
    const baseFile = (args.options.into as string | undefined) ?? DEFAULT_BASE;
    const base = args.options.into ? loadScenarioFile(baseFile, io) : (() => {
      const r = parseScenarioText(readFileSync(DEFAULT_BASE, 'utf8'));
      return r.ok ? { ok: true as const, scenario: r.scenario } : { ok: false as const };
    })();
    if (!base.ok) return EXIT_BAD_INPUT;
    let result: GroundResult;
    try {
      // Progress of a large raster on stderr (stdout stays clean for --json).
      result = await importGroundFile(file, settings, (d, t) => {
        if (t > 1024) io.err(`ground: decoded ${d} of ${t} rows`);
      });
    } catch (e) {
      if (e instanceof GroundError) {
        io.err(`plumbline: ${e.message}`);
        return EXIT_BAD_INPUT;
      }
      throw e;
    }
    const scenario = scenarioOnGround(base.scenario, result);
    const text = JSON.stringify(scenarioToFile(scenario));
    try {
      writeFileSync(out, text);
    } catch (e) {
      io.err(`plumbline: cannot write ${out}: ${(e as Error).message}`);
      return EXIT_FAILURE;
    }
    const s = result.summary;
    for (const w of s.warnings) io.err(`plumbline: warning: ${w}`);
    if (args.options.json) {
      io.out(JSON.stringify({ output: out, ...s }, null, 2));
    } else {
      io.out(`${s.file} (${s.format}${s.crs ? `, ${s.crs}` : ''}) → ${out}`);
      for (const st of s.steps) {
        const d = Object.entries(st.detail)
          .filter(([, v]) => v !== null)
          .map(([k, v]) => `${k} ${typeof v === 'number' ? Number(v.toPrecision(4)) : v}`)
          .join(', ');
        io.out(`  ${st.step}: ${d}  [${st.method}]`);
      }
      io.out(`  grid: ${s.cols} × ${s.rows} nodes at ${s.cellM} m; ${(100 * s.filledShare).toFixed(1)} % filled`);
      if (s.levellingDeg !== null) io.out(`  levelled by ${s.levellingDeg.toFixed(1)}° (from the fitted ground plane to level)`);
      io.out('Caution: the vehicle stands on the ground as scanned; filled cells were not measured. Quasi-static estimates: real margins are smaller.');
    }
    return EXIT_OK;
  },
};
