/**
 * A small timing harness: warm-up calls, then several timed runs, each of `batch` calls; a run's
 * figure is its time per call. Reports median, min and max over the runs. Ratios are taken run
 * by run (A and B interleaved in each run, so slow drifts of the machine cancel) and then
 * summarised the same way.
 */
import { cpus, loadavg } from 'node:os';

export interface Figure {
  readonly name: string;
  /** null when the figure could not be measured (see note). */
  readonly median: number | null;
  readonly min: number | null;
  readonly max: number | null;
  readonly runs: number;
  readonly unit: string;
  /** Words on what was measured, or why it is not available. */
  readonly note?: string;
}

export interface Machine {
  readonly cores: number;
  readonly cpuModel: string;
  readonly node: string;
  readonly date: string;
  /** One-minute load average when the bench started: other work on the machine inflates the times. */
  readonly loadAverage1m: number;
}

export interface RunPlan {
  /** Untimed calls before the first run (JIT warm-up). */
  readonly warmup: number;
  /** Timed runs. */
  readonly runs: number;
  /** Calls per run; the run's figure is its time divided by this. */
  readonly batch: number;
}

export function machine(): Machine {
  const list = cpus();
  return {
    cores: list.length,
    cpuModel: list.length > 0 ? list[0].model.trim() : 'unknown',
    node: process.version,
    date: new Date().toISOString(),
    loadAverage1m: Math.round(loadavg()[0] * 100) / 100,
  };
}

export function summarise(samples: readonly number[]): { median: number; min: number; max: number } {
  const s = [...samples].sort((a, b) => a - b);
  const n = s.length;
  if (n === 0) return { median: NaN, min: NaN, max: NaN };
  const median = n % 2 === 1 ? s[(n - 1) >> 1] : 0.5 * (s[n / 2 - 1] + s[n / 2]);
  return { median, min: s[0], max: s[n - 1] };
}

export function figure(name: string, samples: readonly number[], unit: string, note?: string): Figure {
  const { median, min, max } = summarise(samples);
  return { name, median, min, max, runs: samples.length, unit, ...(note ? { note } : {}) };
}

export function unavailable(name: string, unit: string, note: string): Figure {
  return { name, median: null, min: null, max: null, runs: 0, unit, note };
}

/** `call(k)` gets the index of the call within its run (0 … batch−1), e.g. to pick a pose. */
export type Work = (k: number) => void;

function runOnce(work: Work, batch: number): number {
  const t0 = performance.now();
  for (let k = 0; k < batch; k++) work(k);
  return (performance.now() - t0) / batch;
}

/** Milliseconds per call, one sample per run. */
export function timeRuns(work: Work, plan: RunPlan): number[] {
  for (let w = 0; w < plan.warmup; w++) runOnce(work, plan.batch);
  const out: number[] = [];
  for (let r = 0; r < plan.runs; r++) out.push(runOnce(work, plan.batch));
  return out;
}

/**
 * Milliseconds per call of A and of B, one sample of each per run, measured alternately;
 * planB's batch may differ from planA's (its warm-up and runs follow planA).
 */
export function timePaired(a: Work, b: Work, plan: RunPlan, batchB = plan.batch): { a: number[]; b: number[] } {
  for (let w = 0; w < plan.warmup; w++) {
    runOnce(a, plan.batch);
    runOnce(b, batchB);
  }
  const ta: number[] = [];
  const tb: number[] = [];
  for (let r = 0; r < plan.runs; r++) {
    ta.push(runOnce(a, plan.batch));
    tb.push(runOnce(b, batchB));
  }
  return { a: ta, b: tb };
}

export function ratios(num: readonly number[], den: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 0; i < Math.min(num.length, den.length); i++) out.push(num[i] / den[i]);
  return out;
}

/** A target beside a figure: median compared with a bound. */
export interface Target {
  readonly name: string;
  readonly op: '<' | '<=' | '>=';
  readonly bound: number;
  readonly unit: string;
}

export function meets(f: Figure, t: Target): boolean | null {
  if (f.median === null || !Number.isFinite(f.median)) return null;
  if (t.op === '<') return f.median < t.bound;
  if (t.op === '<=') return f.median <= t.bound;
  return f.median >= t.bound;
}

function fmt(v: number | null): string {
  if (v === null) return 'n/a';
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a === 0) return '0';
  if (a >= 1000) return v.toFixed(0);
  if (a >= 100) return v.toFixed(1);
  if (a >= 10) return v.toFixed(2);
  if (a >= 1) return v.toFixed(3);
  if (a >= 0.01) return v.toFixed(4);
  return v.toExponential(2);
}

/** The figures as a plain-text table, targets and PASS/MISS beside them, notes underneath. */
export function table(figures: readonly Figure[], targets: readonly Target[]): string {
  const head = ['name', 'median', 'min', 'max', 'runs', 'unit', 'target', ''];
  const rows: string[][] = figures.map((f) => {
    const t = targets.find((x) => x.name === f.name);
    const ok = t ? meets(f, t) : null;
    return [
      f.name,
      f.median === null ? 'not available' : fmt(f.median),
      fmt(f.min),
      fmt(f.max),
      String(f.runs),
      f.unit,
      t ? `${t.op} ${t.bound} ${t.unit}` : '',
      t ? (ok === null ? '-' : ok ? 'PASS' : 'MISS') : '',
    ];
  });
  const widths = head.map((h, c) => Math.max(h.length, ...rows.map((r) => r[c].length)));
  const line = (cells: string[]) => cells.map((s, c) => (c === 0 || c >= 5 ? s.padEnd(widths[c]) : s.padStart(widths[c]))).join('  ').trimEnd();
  const out = [line(head), widths.map((w) => '-'.repeat(w)).join('  ')];
  for (const r of rows) out.push(line(r));
  const notes = figures.filter((f) => f.note);
  if (notes.length > 0) {
    out.push('', 'notes:');
    for (const f of notes) out.push(`  ${f.name}: ${f.note}`);
  }
  return out.join('\n');
}
