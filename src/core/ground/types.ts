/**
 * Imported ground: the data the pipeline passes from a reader to the height grid the solver
 * queries. Coordinates are local (a 64-bit origin subtracted, then stored 32-bit), in metres,
 * z up (ISO 8855 terrain frame: x forward, y left, z up).
 */

/** Thrown for any problem with an input file or the settings; the message names the problem. */
export class GroundError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'GroundError';
  }
}

/** Where the local frame sits in the source's own coordinates (source units, after the up-axis swap). */
export interface LocalOrigin {
  readonly x: number;
  readonly y: number;
  readonly z: number;
}

/** A point cloud in the local frame. */
export interface PointCloud {
  readonly kind: 'points';
  /** Interleaved x, y, z (m, local frame). */
  readonly xyz: Float32Array;
  readonly count: number;
  /** ASPRS class per point (LAS), or null when the format has none. */
  readonly classes: Uint8Array | null;
}

/** A triangle mesh in the local frame. */
export interface TriangleMesh {
  readonly kind: 'mesh';
  /** Interleaved x, y, z (m, local frame). */
  readonly positions: Float32Array;
  readonly vertexCount: number;
  /** Three vertex indices per triangle. */
  readonly indices: Uint32Array;
  readonly triangleCount: number;
}

/**
 * A height grid: node (c, r) sits at (originM[0] + c·cellM, originM[1] + r·cellM); heights
 * row-major (index r·cols + c), NaN where no data.
 */
export interface HeightGrid {
  readonly kind: 'grid';
  originM: [number, number];
  cellM: number;
  cols: number;
  rows: number;
  heightsM: Float32Array;
  /** 1 where the height was filled (no data there in the source), 0 where measured. */
  filled: Uint8Array;
}

/** What a reader gives back, before the pipeline: raw values in the source's units and axes. */
export interface SourceInfo {
  /** The file name, for messages and the record. */
  readonly file: string;
  /** Short format name: geotiff, asc, ply, obj, gltf, xyz, las. */
  readonly format: string;
  /** A CRS code (e.g. "EPSG:3645") when the file states one, else null. */
  readonly crs: string | null;
  /** True when the file places its data on the earth (a CRS or a geotransform): never levelled. */
  readonly georeferenced: boolean;
  /** Length unit the file states (metres per unit), or null when it does not say. */
  readonly unitM: number | null;
  /** Up axis the file states, or null when it does not say. */
  readonly up: 'z' | 'y' | null;
}

/** One reported pipeline step. */
export interface StepReport {
  readonly step: string;
  /** The published method behind the step (or "common practice"). */
  readonly method: string;
  readonly detail: Readonly<Record<string, number | string | boolean | null>>;
}
