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

/**
 * The same statistic on a mesh, with each vertex's own edges as its neighbourhood (the mesh says
 * who its neighbours are, so no search is needed: linear in the triangles): a vertex whose mean
 * edge length exceeds max(μ + α·σ, 2μ) over the vertices, and exceeds each of its neighbours'
 * (a spike's neighbours share its long edge but are not spikes), is an outlier; repeated up to
 * three times on what is left, for spikes side by side. Our adaptation of Rusu et al. 2008 to
 * meshes. Vertices in no triangle are not judged.
 */
export function meshEdgeOutliers(xyz: Float32Array, count: number, indices: Uint32Array, triangleCount: number, alpha = 2): { keep: Uint8Array; removed: number; meanDistanceM: number; thresholdM: number } {
  const keep = new Uint8Array(count).fill(1);
  const sum = new Float64Array(count);
  const n = new Uint32Array(count);
  const mean = new Float64Array(count);
  const localMax = new Uint8Array(count);
  const len = (a: number, b: number) => {
    const dx = xyz[3 * a] - xyz[3 * b];
    const dy = xyz[3 * a + 1] - xyz[3 * b + 1];
    const dz = xyz[3 * a + 2] - xyz[3 * b + 2];
    return Math.sqrt(dx * dx + dy * dy + dz * dz);
  };
  let mu = 0;
  let threshold = Infinity;
  let removed = 0;
  for (let pass = 0; pass < 3; pass++) {
    sum.fill(0);
    n.fill(0);
    for (let t = 0; t < triangleCount; t++) {
      const a = indices[3 * t];
      const b = indices[3 * t + 1];
      const c = indices[3 * t + 2];
      if (!keep[a] || !keep[b] || !keep[c]) continue;
      const ab = len(a, b);
      const bc = len(b, c);
      const ca = len(c, a);
      sum[a] += ab + ca;
      sum[b] += ab + bc;
      sum[c] += bc + ca;
      n[a] += 2;
      n[b] += 2;
      n[c] += 2;
    }
    for (let i = 0; i < count; i++) mean[i] = n[i] > 0 ? sum[i] / n[i] : 0;
    if (pass === 0) {
      let s = 0;
      let s2 = 0;
      let m = 0;
      for (let i = 0; i < count; i++) {
        if (n[i] === 0) continue;
        s += mean[i];
        s2 += mean[i] * mean[i];
        m++;
      }
      if (m === 0) return { keep, removed: 0, meanDistanceM: 0, thresholdM: Infinity };
      mu = s / m;
      const sigma = Math.sqrt(Math.max(0, s2 / m - mu * mu));
      threshold = Math.max(mu + alpha * sigma, 2 * mu);
    }
    localMax.fill(1);
    for (let t = 0; t < triangleCount; t++) {
      const a = indices[3 * t];
      const b = indices[3 * t + 1];
      const c = indices[3 * t + 2];
      if (!keep[a] || !keep[b] || !keep[c]) continue;
      if (mean[b] > mean[a] || mean[c] > mean[a]) localMax[a] = 0;
      if (mean[a] > mean[b] || mean[c] > mean[b]) localMax[b] = 0;
      if (mean[a] > mean[c] || mean[b] > mean[c]) localMax[c] = 0;
    }
    let flagged = 0;
    for (let i = 0; i < count; i++) {
      if (keep[i] && n[i] > 0 && mean[i] > threshold && localMax[i]) {
        keep[i] = 0;
        flagged++;
      }
    }
    removed += flagged;
    if (flagged === 0) break;
  }
  return { keep, removed, meanDistanceM: mu, thresholdM: threshold };
}
