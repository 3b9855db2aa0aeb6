/**
 * GeoTIFF elevation models through geotiff.js: the first band of the first image, only the
 * window that covers the crop (tiles and strips outside it are not decoded; with `fromFile` or
 * `fromBlob` they are not even read). The geotransform from ModelTiepoint + ModelPixelScale
 * (OGC GeoTIFF 1.1, §7.3), PixelIsArea or PixelIsPoint (GTRasterTypeGeoKey), GDAL's nodata tag
 * (42113), the CRS from ProjectedCSTypeGeoKey, the units from ProjLinearUnitsGeoKey and
 * VerticalUnitsGeoKey.
 */
import type { GeoTIFF } from 'geotiff';
import type { RawGround } from '../core/ground/pipeline';
import { LENGTH_UNITS_M } from '../core/ground/units';
import { fail, reason } from './bytes';

const EPSG_UNITS: Record<number, number> = { 9001: LENGTH_UNITS_M.m, 9002: LENGTH_UNITS_M.ft, 9003: LENGTH_UNITS_M.usft };

export interface GeoTiffOptions {
  /** Crop in the file's map coordinates [x0, y0, x1, y1]: only that window is decoded. */
  readonly crop?: readonly [number, number, number, number] | null;
  /** Rows decoded so far of all (a large raster is read in bands of rows). */
  readonly onProgress?: (doneRows: number, totalRows: number) => void;
}

/** Rows per band when a large raster is read piece by piece (progress, and no second full-size copy). */
const BAND_ROWS = 256;

export async function readGeoTiff(tiff: GeoTIFF, file: string, opts: GeoTiffOptions = {}): Promise<RawGround & { kind: 'raster' }> {
  let image;
  try {
    image = await tiff.getImage(0);
  } catch (e) {
    fail(file, `the TIFF has no readable image (${reason(e, 'no image directory')})`);
  }
  const width = image.getWidth();
  const height = image.getHeight();
  if (width < 2 || height < 2) fail(file, `the image is ${width} × ${height} pixels; at least 2 × 2 are needed`);
  const keys = (image.getGeoKeys() ?? {}) as Record<string, number | undefined>;
  let originXY: number[];
  let res: number[];
  try {
    originXY = image.getOrigin();
    res = image.getResolution();
  } catch {
    fail(file, 'a TIFF without a georeference (no ModelTiepoint / ModelPixelScale): not a GeoTIFF elevation model');
  }
  const rx = res[0];
  const ry = res[1];
  if (!(Number.isFinite(rx) && Number.isFinite(ry) && rx > 0 && ry !== 0)) fail(file, `the pixel size ${rx} × ${ry} is not usable`);
  if (Math.abs(Math.abs(ry) - rx) > 1e-9 * rx) fail(file, `the pixels are not square (${rx} × ${Math.abs(ry)}); resample to square pixels first (e.g. gdalwarp -tr)`);
  const proj = keys.ProjectedCSTypeGeoKey;
  const geog = keys.GeographicTypeGeoKey;
  const model = keys.GTModelTypeGeoKey;
  if (model === 2 || (proj === undefined && geog !== undefined)) {
    fail(file, `the heights are on a geographic grid (EPSG:${geog ?? '?'}: degrees of latitude and longitude); reproject to a projected CRS in metres first (gdalwarp -t_srs)`);
  }
  const crs = proj !== undefined ? (proj === 32767 ? 'user-defined' : `EPSG:${proj}`) : null;
  const unitM = keys.ProjLinearUnitsGeoKey !== undefined ? (EPSG_UNITS[keys.ProjLinearUnitsGeoKey] ?? null) : crs ? null : null;
  const vUnit = keys.VerticalUnitsGeoKey !== undefined ? (EPSG_UNITS[keys.VerticalUnitsGeoKey] ?? null) : null;
  const zToH = vUnit !== null && unitM !== null ? vUnit / unitM : 1;
  // Map coordinates of the corner of pixel (0, 0); PixelIsPoint tiepoints name the pixel's centre.
  const pointGeo = keys.GTRasterTypeGeoKey === 2;
  const cornerX = originXY[0] - (pointGeo ? rx / 2 : 0);
  const cornerY = originXY[1] - (pointGeo ? ry / 2 : 0);
  let wx0 = 0;
  let wy0 = 0;
  let wx1 = width;
  let wy1 = height;
  const crop = opts.crop;
  if (crop) {
    const xa = Math.min(crop[0], crop[2]);
    const xb = Math.max(crop[0], crop[2]);
    const ya = Math.min(crop[1], crop[3]);
    const yb = Math.max(crop[1], crop[3]);
    // Pixel columns whose centres can fall in [xa, xb]; rows likewise (ry < 0: north up).
    wx0 = Math.max(0, Math.floor((xa - cornerX) / rx - 0.5));
    wx1 = Math.min(width, Math.ceil((xb - cornerX) / rx + 0.5));
    const r0 = (yb - cornerY) / ry;
    const r1 = (ya - cornerY) / ry;
    wy0 = Math.max(0, Math.floor(Math.min(r0, r1) - 0.5));
    wy1 = Math.min(height, Math.ceil(Math.max(r0, r1) + 0.5));
    if (wx1 - wx0 < 2 || wy1 - wy0 < 2) fail(file, `the crop ${crop.join(',')} lies outside the raster or holds fewer than 2 × 2 pixels`);
  }
  const nodata = image.getGDALNoData();
  const w = wx1 - wx0;
  const hgt = wy1 - wy0;
  const heights = new Float64Array(w * hgt);
  // Bands of rows: a progress report after each, and only one band's decoded copy at a time.
  for (let b0 = 0; b0 < hgt; b0 += BAND_ROWS) {
    const b1 = Math.min(hgt, b0 + BAND_ROWS);
    let data: ArrayLike<number>;
    try {
      data = (await image.readRasters({ window: [wx0, wy0 + b0, wx1, wy0 + b1], samples: [0], interleave: true })) as unknown as ArrayLike<number>;
    } catch (e) {
      fail(file, `the pixels cannot be decoded (${reason(e, 'the data ends early')}): truncated or an unsupported compression`);
    }
    for (let j = b0; j < b1; j++) {
      const r = ry < 0 ? hgt - 1 - j : j;
      const o = (j - b0) * w;
      for (let i = 0; i < w; i++) {
        const v = data[o + i];
        heights[r * w + i] = (nodata !== null && v === nodata) || !Number.isFinite(v) ? NaN : v * zToH;
      }
    }
    opts.onProgress?.(b1, hgt);
  }
  // Centre of the south-west pixel of the window.
  const originX = cornerX + (wx0 + 0.5) * rx;
  const originY = ry < 0 ? cornerY + (wy1 - 0.5) * ry : cornerY + (wy0 + 0.5) * ry;
  return {
    kind: 'raster',
    heights,
    cols: w,
    rows: hgt,
    originX,
    originY,
    cell: rx,
    info: { file, format: 'geotiff', crs, georeferenced: true, unitM, up: 'z' },
  };
}
