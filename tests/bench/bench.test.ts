/**
 * The bench in quick mode (one run each, small batches), in-process, so its code cannot rot.
 * It asserts that every figure was produced and that the cannon-es settle (cannon-es, a
 * general-purpose rigid-body physics library, is the project's outside reference; see
 * src/reference/cannonSettle.ts) and Plumbline's solve agree on each wheel's normal load within
 * 2 % of the weight, the bound the benchmark issue sets. It never asserts a time: timings in CI
 * say nothing about the code.
 */
import { beforeAll, describe, expect, it } from 'vitest';
import { type BenchReport, FIGURE_NAMES, runBench } from '../../bench/bench';

describe('bench, quick mode', () => {
  let report: BenchReport;
  // One run for both checks, so either passes or fails on its own (run alone, each still runs the bench).
  beforeAll(async () => {
    report = await runBench({ quick: true });
  }, 300_000);

  it('runs and produces every named figure', () => {
    expect(report.quick).toBe(true);
    expect(report.machine.cores).toBeGreaterThan(0);
    const names = report.figures.map((f) => f.name);
    expect(new Set(names).size).toBe(names.length);
    for (const name of FIGURE_NAMES) {
      const f = report.figures.find((x) => x.name === name);
      expect(f, name).toBeDefined();
      if (!f) continue;
      for (const v of [f.median, f.min, f.max]) {
        expect(Number.isFinite(v), `${name} finite`).toBe(true);
        expect(v as number, `${name} > 0`).toBeGreaterThan(0);
      }
      expect(f.runs, name).toBeGreaterThan(0);
      expect(f.unit.length, name).toBeGreaterThan(0);
    }
    // The extra figures (iterations, growth ratios, …) are numbers too, never NaN.
    for (const f of report.figures) {
      if (f.median === null) continue;
      expect(Number.isFinite(f.median) && f.median >= 0, f.name).toBe(true);
    }
  });

  it('cannon-es and Plumbline loads agree within 2 % of the weight on every wheel', () => {
    const s = report.settle;
    expect(s).toBeTruthy();
    if (!s) throw new Error('the bench produced no cannon-es comparison');
    expect(s.settled).toBe(true);
    expect(s.cannonN).toHaveLength(4);
    expect(s.plumblineN).toHaveLength(4);
    let sum = 0;
    for (let i = 0; i < 4; i++) {
      expect(s.plumblineN[i]).toBeGreaterThan(0);
      expect(Math.abs(s.plumblineN[i] - s.cannonN[i])).toBeLessThan(0.02 * s.weightN);
      sum += s.cannonN[i];
    }
    // The loads are the vehicle's, not zeros that agree: on a block with no tilt they carry the weight (statics).
    expect(Math.abs(sum - s.weightN)).toBeLessThan(0.05 * s.weightN);
    const diff = report.figures.find((f) => f.name === 'settle.loadDiff');
    expect(diff?.median as number).toBeLessThan(0.02);
  });
});
