/**
 * Statistical outlier removal: Rusu, Marton, Blodow, Dolha & Beetz (2008), "Towards 3D point
 * cloud based object maps for household environments", Robotics and Autonomous Systems 56(11),
 * §4: for each point the mean distance to its k nearest neighbours; the distances over the cloud
 * are taken as Gaussian with mean μ and deviation σ, and a point whose mean distance exceeds
 * μ + α·σ is removed (the paper uses k = 30, α = 1; PCL's default k = 50, α = 1). Here α = 2, and
 * never closer than 2μ (see below).
 */
import { BucketIndex } from './neighbours';

export interface OutlierSettings {
  /** Neighbours per point. @default 16 */
  readonly k?: number;
  /** Standard deviations above the mean distance a point may sit. @default 2 */
  readonly alpha?: number;
}

/** Returns a keep mask (1 keep, 0 outlier) and how many were removed. */
export function statisticalOutliers(xyz: Float32Array, count: number, settings: OutlierSettings = {}): { keep: Uint8Array; removed: number; meanDistanceM: number; thresholdM: number } {
  const k = settings.k ?? 16;
  const alpha = settings.alpha ?? 2;
  const keep = new Uint8Array(count).fill(1);
  if (count <= k + 1) return { keep, removed: 0, meanDistanceM: 0, thresholdM: Infinity };
  const index = new BucketIndex(xyz, count, k);
  const best = new Float64Array(k);
  const mean = new Float32Array(count);
  let sum = 0;
  let sum2 = 0;
  for (let i = 0; i < count; i++) {
    const n = index.nearestSq(i, k, best);
    let s = 0;
    for (let q = 0; q < n; q++) s += Math.sqrt(best[q]);
    const m = n > 0 ? s / n : 0;
    mean[i] = m;
    sum += m;
    sum2 += m * m;
  }
  const mu = sum / count;
  const sigma = Math.sqrt(Math.max(0, sum2 / count - mu * mu));
  // Also at least twice the mean: on clean, even data σ is tiny and μ + ασ would cut the scan's
  // edges, whose one-sided neighbourhoods sit ~1.4× the mean away (our addition to the method).
  const threshold = Math.max(mu + alpha * sigma, 2 * mu);
  let removed = 0;
  for (let i = 0; i < count; i++) {
    if (mean[i] > threshold) {
      keep[i] = 0;
      removed++;
    }
  }
  return { keep, removed, meanDistanceM: mu, thresholdM: threshold };
}

/** Compacts interleaved xyz (and an optional per-point byte array) to the kept points; returns the new count. */
export function compactPoints(xyz: Float32Array, count: number, keep: Uint8Array, extra: Uint8Array | null): number {
  let n = 0;
  for (let i = 0; i < count; i++) {
    if (!keep[i]) continue;
    if (n !== i) {
      xyz[3 * n] = xyz[3 * i];
      xyz[3 * n + 1] = xyz[3 * i + 1];
      xyz[3 * n + 2] = xyz[3 * i + 2];
      if (extra) extra[n] = extra[i];
    }
    n++;
  }
  return n;
}
