/**
 * ESRI ASCII grid (.asc): a six-line header (ncols, nrows, xllcorner|xllcenter,
 * yllcorner|yllcenter, cellsize, optional NODATA_value), then nrows lines of ncols heights, the
 * northern row first (ESRI "ASCII raster format", ArcGIS documentation; GDAL's AAIGrid driver).
 */
import type { RawGround } from '../core/ground/pipeline';
import { checkCount, fail, textOf } from './bytes';

export function readAsc(bytes: Uint8Array, file: string): RawGround {
  const text = textOf(bytes);
  let pos = 0;
  const header: Record<string, string> = {};
  // Header lines: a key then a value.
  for (;;) {
    const m = /^[ \t]*([A-Za-z_]+)[ \t]+(\S+)[ \t]*\r?\n/.exec(text.slice(pos, pos + 200));
    if (!m) break;
    header[m[1].toLowerCase()] = m[2];
    pos += m[0].length;
  }
  const num = (k: string): number | undefined => (header[k] === undefined ? undefined : Number(header[k]));
  const ncols = num('ncols');
  const nrows = num('nrows');
  const cell = num('cellsize');
  if (ncols === undefined || nrows === undefined || cell === undefined) fail(file, 'not an ESRI ASCII grid: the header needs ncols, nrows and cellsize');
  checkCount(file, 'column', ncols);
  checkCount(file, 'row', nrows);
  if (ncols < 2 || nrows < 2) fail(file, `the grid must be at least 2 × 2, got ${ncols} × ${nrows}`);
  if (ncols * nrows > 400_000_000) fail(file, `the header claims ${ncols} × ${nrows} cells, too many to read`);
  if (!(cell > 0) || !Number.isFinite(cell)) fail(file, `cellsize must be a positive number, got ${header.cellsize}`);
  const corner = header.xllcorner !== undefined;
  const xll = num(corner ? 'xllcorner' : 'xllcenter');
  const yll = num(corner ? 'yllcorner' : 'yllcenter');
  if (xll === undefined || yll === undefined || !Number.isFinite(xll) || !Number.isFinite(yll)) fail(file, 'the header needs xllcorner/yllcorner (or xllcenter/yllcenter) as numbers');
  const nodata = num('nodata_value');
  const n = ncols * nrows;
  const heights = new Float64Array(n);
  // Numbers by hand (split on whitespace would build millions of strings).
  let k = 0;
  const re = /[^\s]+/g;
  re.lastIndex = pos;
  let m: RegExpExecArray | null;
  while (k < n && (m = re.exec(text)) !== null) {
    const v = Number(m[0]);
    if (Number.isNaN(v) && m[0].toLowerCase() !== 'nan') fail(file, `height ${k + 1} is not a number: "${m[0].slice(0, 20)}"`);
    const row = Math.floor(k / ncols);
    const col = k - row * ncols;
    // File rows run north to south; the grid's row 0 is the southern one.
    heights[(nrows - 1 - row) * ncols + col] = v === nodata || !Number.isFinite(v) ? NaN : v;
    k++;
  }
  if (k < n) fail(file, `truncated: the header promises ${ncols} × ${nrows} = ${n} heights, the file holds ${k}`);
  return {
    kind: 'raster',
    heights,
    cols: ncols,
    rows: nrows,
    originX: corner ? xll + cell / 2 : xll,
    originY: corner ? yll + cell / 2 : yll,
    cell,
    info: { file, format: 'asc', crs: null, georeferenced: true, unitM: null, up: 'z' },
  };
}
