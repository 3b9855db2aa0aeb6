/**
 * Slope and aspect of a height grid by Horn's method (Horn 1981, "Hill shading and the
 * reflectance map", Proc. IEEE 69(1), eq. on p. 18: the 3×3 weighted differences 1-2-1), as GDAL's
 * gdaldem computes them: slope in degrees from level, aspect in degrees clockwise from north (+y)
 * toward the downhill direction. Interior nodes only (NaN on the edge).
 */
import type { HeightGrid } from './types';

export function hornSlopeAspect(g: HeightGrid): { slopeDeg: Float64Array; aspectDeg: Float64Array } {
  const { cols, rows, cellM } = g;
  const h = g.heightsM;
  const slope = new Float64Array(cols * rows).fill(NaN);
  const aspect = new Float64Array(cols * rows).fill(NaN);
  const at = (c: number, r: number) => h[r * cols + c];
  for (let r = 1; r < rows - 1; r++) {
    for (let c = 1; c < cols - 1; c++) {
      // Rows run along +y (north).
      const dzdx = (at(c + 1, r + 1) + 2 * at(c + 1, r) + at(c + 1, r - 1) - (at(c - 1, r + 1) + 2 * at(c - 1, r) + at(c - 1, r - 1))) / (8 * cellM);
      const dzdy = (at(c - 1, r + 1) + 2 * at(c, r + 1) + at(c + 1, r + 1) - (at(c - 1, r - 1) + 2 * at(c, r - 1) + at(c + 1, r - 1))) / (8 * cellM);
      slope[r * cols + c] = (Math.atan(Math.hypot(dzdx, dzdy)) * 180) / Math.PI;
      // Downhill direction (−∇z), clockwise from north.
      let a = (Math.atan2(-dzdx, -dzdy) * 180) / Math.PI;
      if (a < 0) a += 360;
      aspect[r * cols + c] = a;
    }
  }
  return { slopeDeg: slope, aspectDeg: aspect };
}
