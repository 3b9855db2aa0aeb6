import { boundsOf } from './localFrame';

/**
 * A flat 2D bucket index over points (x, y), for k-nearest-neighbour queries in 3D distance.
 * Horizontal distance never exceeds the 3D distance, so a ring search can stop once the ring's
 * nearest possible point is farther than the k-th best found.
 */
export class BucketIndex {
  readonly cellM: number;
  readonly cols: number;
  readonly rows: number;
  readonly x0: number;
  readonly y0: number;
  /** start[c] .. start[c + 1] index into `order` for bucket c. */
  readonly start: Uint32Array;
  readonly order: Uint32Array;

  constructor(
    readonly xyz: Float32Array,
    readonly count: number,
    pointsPerBucket: number,
  ) {
    const [x0, y0, , x1, y1] = boundsOf(xyz, count);
    const area = Math.max((x1 - x0) * (y1 - y0), 1e-12);
    let cell = Math.sqrt((area * pointsPerBucket) / Math.max(count, 1));
    if (!(cell > 0)) cell = 1;
    // At most ~4 buckets per point (long thin clouds).
    const maxBuckets = Math.max(16, count * 4);
    while (Math.ceil((x1 - x0) / cell + 1) * Math.ceil((y1 - y0) / cell + 1) > maxBuckets) cell *= 1.5;
    this.cellM = cell;
    this.x0 = x0;
    this.y0 = y0;
    this.cols = Math.floor((x1 - x0) / cell) + 1;
    this.rows = Math.floor((y1 - y0) / cell) + 1;
    const nb = this.cols * this.rows;
    const start = new Uint32Array(nb + 1);
    const bucket = new Uint32Array(count);
    for (let i = 0; i < count; i++) {
      const b = this.bucketOf(xyz[3 * i], xyz[3 * i + 1]);
      bucket[i] = b;
      start[b + 1]++;
    }
    for (let b = 0; b < nb; b++) start[b + 1] += start[b];
    const fill = start.slice(0, nb);
    const order = new Uint32Array(count);
    for (let i = 0; i < count; i++) order[fill[bucket[i]]++] = i;
    this.start = start;
    this.order = order;
  }

  bucketOf(x: number, y: number): number {
    let c = Math.floor((x - this.x0) / this.cellM);
    let r = Math.floor((y - this.y0) / this.cellM);
    if (c < 0) c = 0;
    else if (c >= this.cols) c = this.cols - 1;
    if (r < 0) r = 0;
    else if (r >= this.rows) r = this.rows - 1;
    return r * this.cols + c;
  }

  /**
   * Squared 3D distances to the k nearest other points of point i, ascending, into best (length
   * ≥ k). Returns how many were found (< k only when the cloud has fewer than k + 1 points).
   */
  nearestSq(i: number, k: number, best: Float64Array): number {
    const xyz = this.xyz;
    const px = xyz[3 * i];
    const py = xyz[3 * i + 1];
    const pz = xyz[3 * i + 2];
    const pc = Math.min(this.cols - 1, Math.max(0, Math.floor((px - this.x0) / this.cellM)));
    const pr = Math.min(this.rows - 1, Math.max(0, Math.floor((py - this.y0) / this.cellM)));
    let found = 0;
    const maxRing = Math.max(this.cols, this.rows);
    for (let ring = 0; ring <= maxRing; ring++) {
      // Nearest possible horizontal distance of anything in this ring.
      if (found === k) {
        const d = (ring - 1) * this.cellM;
        if (d > 0 && d * d > best[k - 1]) break;
      }
      const r0 = pr - ring;
      const r1 = pr + ring;
      const c0 = pc - ring;
      const c1 = pc + ring;
      for (let r = r0; r <= r1; r++) {
        if (r < 0 || r >= this.rows) continue;
        const edgeRow = r === r0 || r === r1;
        for (let c = c0; c <= c1; c += edgeRow ? 1 : c1 - c0 || 1) {
          if (c >= 0 && c < this.cols) {
            const b = r * this.cols + c;
            for (let s = this.start[b]; s < this.start[b + 1]; s++) {
              const j = this.order[s];
              if (j === i) continue;
              const dx = xyz[3 * j] - px;
              const dy = xyz[3 * j + 1] - py;
              const dz = xyz[3 * j + 2] - pz;
              const d2 = dx * dx + dy * dy + dz * dz;
              if (found < k) {
                let q = found++;
                while (q > 0 && best[q - 1] > d2) {
                  best[q] = best[q - 1];
                  q--;
                }
                best[q] = d2;
              } else if (d2 < best[k - 1]) {
                let q = k - 1;
                while (q > 0 && best[q - 1] > d2) {
                  best[q] = best[q - 1];
                  q--;
                }
                best[q] = d2;
              }
            }
          }
          if (c1 === c0) break;
        }
      }
    }
    return found;
  }
}
