/** Runs analyses in the worker with progress and cancel. One worker per job; cancel terminates it. */
import { TerrainField, footprintRadiusM, groundPlaneAt, headingsEvery, makeLines, rankLines, summariseHeadings, type HeadingSweepResult, type LineSpec, type LineSummary, type RoseResult, type Scenario, type SweepRange } from '../core';
import type { ReplyOf, WorkerReply, WorkerRequest } from './messages';

export interface Job<T> {
  readonly done: Promise<T>;
  /** Stops the work at once (terminates the worker); `done` rejects with "cancelled". */
  cancel(): void;
}

export type OnProgress = (done: number, total: number, stage?: string) => void;

let nextId = 1;

type Body<T extends WorkerRequest['type']> = Omit<Extract<WorkerRequest, { type: T }>, 'id'> & { readonly type: T };

/** Starts one job of the given type in a fresh worker. */
export function runJob<T extends WorkerRequest['type']>(body: Body<T>, onProgress: OnProgress): Job<ReplyOf<T>> {
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  const id = nextId++;
  let reject: (e: Error) => void = () => undefined;
  const done = new Promise<ReplyOf<T>>((res, rej) => {
    reject = rej;
    worker.onmessage = (e: MessageEvent<WorkerReply>) => {
      const m = e.data;
      if (m.id !== id) return;
      if (m.type === 'progress') onProgress(m.done, m.total, m.stage);
      else if (m.type === 'error') {
        worker.terminate();
        rej(new Error(m.message));
      } else if (m.type === body.type) {
        worker.terminate();
        const { type: _t, id: _i, ...rest } = m;
        res(rest as unknown as ReplyOf<T>);
      }
    };
    worker.onerror = (e) => {
      worker.terminate();
      rej(new Error(e.message || 'worker failed'));
    };
  });
  worker.postMessage({ ...body, id } as WorkerRequest);
  return {
    done,
    cancel() {
      worker.terminate();
      reject(new Error('cancelled'));
    },
  };
}

export function runRose(scenario: Scenario, stepDeg: number, onProgress: (done: number, total: number) => void): Job<{ result: RoseResult; wallMs: number }> {
  return runJob({ type: 'rose', scenario, stepDeg }, onProgress);
}

/** A finished line sweep: the lines, ranked by smallest margin, and how many workers ran them. */
export interface LineSweepReply {
  readonly lines: readonly LineSpec[];
  readonly ranked: readonly LineSummary[];
  readonly wallMs: number;
  readonly workers: number;
}

/** Workers for a line sweep: one per core the browser reports, at most four, at least one. */
function sweepWorkers(lines: number): number {
  const cores = typeof navigator !== 'undefined' && navigator.hardwareConcurrency > 0 ? navigator.hardwareConcurrency : 1;
  return Math.max(1, Math.min(4, cores, lines));
}

/**
 * A line sweep spread over several workers (the lines dealt out in turn), ranked here when all
 * are back. Progress counts lines over all workers; cancel stops them all.
 */
export function runLines(
  scenario: Scenario,
  offsetsM: SweepRange,
  headingChangesRad: SweepRange,
  onProgress: OnProgress,
): Job<LineSweepReply> {
  if (!scenario.path) return failed(new Error('the scenario has no path'));
  const lines = makeLines(scenario.path, offsetsM, headingChangesRad);
  if (lines.length === 0) return failed(new Error('no lines: check the ranges'));
  return runLineSpecs(scenario, lines, onProgress);
}

/** Given lines (a sweep's, or lines drawn on the ground) spread over the line sweep's workers and ranked. */
export function runLineSpecs(scenario: Scenario, lines: readonly LineSpec[], onProgress: OnProgress): Job<LineSweepReply> {
  const t0 = performance.now();
  if (lines.length === 0) return failed(new Error('no lines to run'));
  const n = sweepWorkers(lines.length);
  const parts: LineSpec[][] = Array.from({ length: n }, () => []);
  lines.forEach((l, i) => parts[i % n].push(l));
  const doneBy = new Array<number>(n).fill(0);
  const jobs = parts.map((part, k) =>
    runJob({ type: 'lines', scenario, lines: part }, (d) => {
      doneBy[k] = d;
      onProgress(
        doneBy.reduce((a, b) => a + b, 0),
        lines.length,
      );
    }),
  );
  const done = Promise.all(jobs.map((j) => j.done)).then((replies) => {
    const summaries = replies.flatMap((r) => r.summaries).sort((a, b) => a.index - b.index);
    return { lines, ranked: rankLines(summaries).ranked, wallMs: performance.now() - t0, workers: n };
  });
  // One failing part stops the others.
  done.catch(() => jobs.forEach((j) => j.cancel()));
  return {
    done,
    cancel() {
      for (const j of jobs) j.cancel();
    },
  };
}

function failed<T>(e: Error): Job<T> {
  return { done: Promise.reject(e), cancel: () => undefined };
}

/**
 * A heading sweep at the vehicle's spot on the scenario's ground, the headings dealt out over the
 * same workers as a line sweep (one per core, at most four), summarised when all are back.
 */
export function runHeadings(scenario: Scenario, stepRad: number, onProgress: OnProgress): Job<{ readonly result: HeadingSweepResult; readonly wallMs: number; readonly workers: number }> {
  const t0 = performance.now();
  const { xM, yM } = scenario.pose;
  const ground = groundPlaneAt(new TerrainField(scenario.terrain), xM, yM, footprintRadiusM(scenario.vehicle));
  const headings = headingsEvery(stepRad);
  const n = sweepWorkers(headings.length);
  const parts: number[][] = Array.from({ length: n }, () => []);
  headings.forEach((h, i) => parts[i % n].push(h));
  const doneBy = new Array<number>(n).fill(0);
  const jobs = parts.map((part, k) =>
    runJob({ type: 'headings', scenario, xM, yM, ground, headingsRad: part }, (d) => {
      doneBy[k] = d;
      onProgress(
        doneBy.reduce((a, b) => a + b, 0),
        headings.length,
      );
    }),
  );
  const done = Promise.all(jobs.map((j) => j.done)).then((replies) => ({
    result: summariseHeadings(ground, xM, yM, replies.flatMap((r) => r.results)),
    wallMs: performance.now() - t0,
    workers: n,
  }));
  done.catch(() => jobs.forEach((j) => j.cancel()));
  return {
    done,
    cancel() {
      for (const j of jobs) j.cancel();
    },
  };
}
