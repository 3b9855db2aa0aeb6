/**
 * Which reader a file goes to: by its extension, then by its first bytes. Pure (bytes in, raw
 * ground out): the CLI and the app's worker share it.
 */
import { fromArrayBuffer } from 'geotiff';
import type { RawGround } from '../core/ground/pipeline';
import { fail, reason } from './bytes';
import { readAsc } from './asc';
import { readGeoTiff } from './geotiff';
import { readGltf } from './gltf';
import { isCompressedLas, readLas } from './las';
import { readLaz } from './laz';
import { readObj } from './obj';
import { readPly } from './ply';
import { readXyz } from './xyz';

export type GroundFormat = 'geotiff' | 'asc' | 'ply' | 'obj' | 'gltf' | 'usdz' | 'xyz' | 'las';

export const FORMAT_LIST = 'GeoTIFF (.tif), ESRI ASCII grid (.asc), PLY, OBJ, GLB/glTF, USDZ, LAS (.las), LAZ (.laz), XYZ/CSV points';

export function detectFormat(file: string, head: Uint8Array): GroundFormat {
  const ext = /\.([A-Za-z0-9]+)$/.exec(file)?.[1].toLowerCase() ?? '';
  const byExt: Record<string, GroundFormat> = {
    tif: 'geotiff', tiff: 'geotiff', asc: 'asc', ply: 'ply', obj: 'obj', glb: 'gltf', gltf: 'gltf', usdz: 'usdz', las: 'las', laz: 'las',
    xyz: 'xyz', csv: 'xyz', txt: 'xyz', pts: 'xyz',
  };
  if (byExt[ext]) return byExt[ext];
  const m = new TextDecoder("latin1").decode(head.subarray(0, 4));
  if (m === 'LASF') return 'las';
  if (m === 'glTF') return 'gltf';
  if (m.startsWith('ply')) return 'ply';
  if (m === 'II*\0' || m === 'MM\0*' || m === 'II+\0' || m === 'MM\0+') return 'geotiff';
  if (head.length === 0) fail(file, 'the file is empty');
  fail(file, `not a ground format this import knows (by its name or first bytes); it reads ${FORMAT_LIST}`);
}

const TIFF_MAGICS = ['II*\0', 'MM\0*', 'II+\0', 'MM\0+'];

export interface ReadOptions {
  /** Crop in source coordinates: a GeoTIFF decodes only that window. */
  readonly crop?: readonly [number, number, number, number] | null;
  /** Reads a file a glTF refers to. */
  readonly resolve?: (uri: string) => Uint8Array;
  /** Where the LAZ decoder's WebAssembly is served (the app's worker); Node finds it in the package. */
  readonly lazWasmUrl?: string;
  /** Progress of a large raster's decoding (rows done of all). */
  readonly onProgress?: (done: number, total: number) => void;
}

/** Reads a whole file's bytes into raw ground. */
export async function readGroundBytes(bytes: Uint8Array, file: string, opts: ReadOptions = {}): Promise<RawGround> {
  if (bytes.length === 0) fail(file, 'the file is empty');
  const format = detectFormat(file, bytes.subarray(0, 16));
  switch (format) {
    case 'geotiff': {
      if (!TIFF_MAGICS.includes(new TextDecoder("latin1").decode(bytes.subarray(0, 4)))) fail(file, 'not a TIFF (the first bytes are not "II*" or "MM*")');
      let tiff;
      try {
        const ab = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) as ArrayBuffer;
        tiff = await fromArrayBuffer(ab);
      } catch (e) {
        fail(file, `the TIFF cannot be opened (${reason(e, 'no image directory')}): truncated or damaged`);
      }
      return readGeoTiff(tiff, file, { crop: opts.crop, onProgress: opts.onProgress });
    }
    case 'asc':
      return readAsc(bytes, file);
    case 'ply':
      return readPly(bytes, file);
    case 'obj':
      return readObj(bytes, file);
    case 'gltf':
      return readGltf(bytes, file, opts.resolve);
    case 'usdz': {
      // three and its USD loader load only when a USDZ arrives (a chunk of their own in the app's worker).
      const { readUsdz } = await import('./usdz');
      return readUsdz(bytes, file);
    }
    case 'las':
      // LAS or LAZ by the content (the compression bit of the point format byte), not the name.
      return isCompressedLas(bytes) ? readLaz(bytes, file, { wasmUrl: opts.lazWasmUrl }) : readLas(bytes, file);
    case 'xyz':
      return readXyz(bytes, file);
  }
}
