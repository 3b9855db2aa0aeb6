/**
 * Chart axes (src/present/scale.ts, d3-scale): round steps of 1, 2 or 5 × 10ⁿ ("nice numbers",
 * Heckbert, Graphics Gems 1990, as d3-array's tickIncrement), a data range rounded out to whole
 * ticks, labels with the decimals the step needs; bounds found without spreading large arrays.
 */
import { describe, expect, it } from 'vitest';
import { extent, linearAxis } from '../../src/present/scale';

describe('linear axis', () => {
  it('rounds a data range out to whole ticks of 1, 2 or 5 × 10ⁿ', () => {
    const a = linearAxis(0.13, 9.7, 0, 100, 5);
    expect(a.domain).toEqual([0, 10]);
    expect(a.ticks).toEqual([0, 2, 4, 6, 8, 10]);
    expect(a.scale(5)).toBeCloseTo(50, 12);
    const b = linearAxis(-0.037, 0.112, 0, 1, 4);
    for (const t of b.ticks) {
      const step = b.ticks[1] - b.ticks[0];
      const m = step / 10 ** Math.floor(Math.log10(step));
      expect([1, 2, 5].some((x) => Math.abs(m - x) < 1e-9)).toBe(true);
      expect(t).toBeGreaterThanOrEqual(b.domain[0] - 1e-12);
    }
    expect(b.domain[0]).toBeLessThanOrEqual(-0.037);
    expect(b.domain[1]).toBeGreaterThanOrEqual(0.112);
  });

  it('keeps a fixed range as given when not nice, and labels with the step\'s decimals', () => {
    const a = linearAxis(0, 12.34, 0, 600, 6, false);
    expect(a.domain).toEqual([0, 12.34]);
    expect(a.ticks.at(-1)).toBeLessThanOrEqual(12.34);
    expect(a.label(2)).toBe('2');
    const b = linearAxis(0, 0.3, 0, 1, 6, false);
    expect(b.ticks.map(b.label)).toEqual(['0.00', '0.05', '0.10', '0.15', '0.20', '0.25', '0.30']);
    expect(linearAxis(-1, 1, 0, 1, 4).label(-0.5)).toBe('-0.5');
  });

  it('turns an empty or flat range into one of width 1', () => {
    expect(linearAxis(3, 3, 0, 1).domain[1]).toBeGreaterThan(3);
    expect(linearAxis(Number.NaN, Number.NaN, 0, 1).domain).toEqual([0, 1]);
  });
});

describe('extent', () => {
  it('skips null and non-finite values and takes included values', () => {
    expect(extent([[3, null, 7, Number.NaN], [undefined, -2]], [10])).toEqual([-2, 10]);
    expect(extent([[null]])).toEqual([0, 1]);
  });
  it('handles 500 000 values (no spread into Math.min)', () => {
    const big = Array.from({ length: 500_000 }, (_, i) => i - 1);
    expect(extent([big])).toEqual([-1, 499_998]);
  });
});
