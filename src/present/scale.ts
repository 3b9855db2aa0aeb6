/**
 * Chart scales and ticks for the app's charts and the report's, from d3-scale (the "nice" round
 * steps of 1, 2 and 5 × 10ⁿ, and tick labels with as many decimals as the step needs). Pure: no
 * React, three or DOM. The charts themselves stay plain SVG.
 */
import { scaleLinear, type ScaleLinear } from 'd3-scale';

export interface Axis {
  /** Data value → pixel. */
  readonly scale: ScaleLinear<number, number>;
  /** The domain after rounding out to whole ticks (when nice) . */
  readonly domain: readonly [number, number];
  readonly ticks: readonly number[];
  /** A tick's label: as many decimals as the tick step needs, "−" never on zero. */
  readonly label: (v: number) => string;
}

/**
 * A linear axis from [lo, hi] onto [p0, p1] pixels, with about `count` ticks. `nice` rounds the
 * domain out to whole ticks (for data ranges; leave it off for a fixed range such as a path's
 * length). A degenerate or non-finite range becomes [lo, lo + 1].
 */
export function linearAxis(lo: number, hi: number, p0: number, p1: number, count = 5, nice = true): Axis {
  let a = Number.isFinite(lo) ? lo : 0;
  let b = Number.isFinite(hi) ? hi : a + 1;
  if (b < a) [a, b] = [b, a];
  if (b - a < 1e-12) b = a + 1;
  const scale = scaleLinear().domain([a, b]).range([p0, p1]);
  if (nice) scale.nice(count);
  const [d0, d1] = scale.domain() as [number, number];
  const ticks = scale.ticks(count);
  const format = scale.tickFormat(count);
  return {
    scale,
    domain: [d0, d1],
    ticks,
    label: (v: number) => format(Math.abs(v) < 1e-12 ? 0 : v).replace('−', '-'),
  };
}

/** Bounds of finite values over several series, in one pass (no spread of large arrays). */
export function extent(series: Iterable<Iterable<number | null | undefined>>, include: readonly number[] = []): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const s of series) {
    for (const v of s) {
      if (v === null || v === undefined || !Number.isFinite(v)) continue;
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
  }
  for (const v of include) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return Number.isFinite(lo) ? [lo, hi] : [0, 1];
}
