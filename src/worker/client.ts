/**
 * Runs analyses in the worker with progress and cancel. One worker per job; cancel terminates it.
 * Workers fail loudly: a crash, an unreadable message or silence past the watchdog ends the worker,
 * re-runs the job once in a fresh one, and then fails with the reason (the panel shows it).
 */
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

/**
 * A worker that sends nothing (no progress, no result) for this long is taken as hung (ms). Every
 * analysis reports progress at least once a station or a line, far more often than this.
 */
export const WORKER_IDLE_LIMIT_MS = 120_000;

/** Test-only switches (set in localStorage by the browser tests; never set otherwise). */
function testSwitch(key: string): string | null {
  try {
    return typeof localStorage !== 'undefined' ? localStorage.getItem(key) : null;
  } catch {
    return null;
  }
}

function idleLimitMs(): number {
  const v = Number(testSwitch('plumbline.test.workerIdleMs'));
  return Number.isFinite(v) && v > 0 ? v : WORKER_IDLE_LIMIT_MS;
}

/** Why an attempt ended without a result: the analysis itself failed (not worth re-running) or the worker did. */
class WorkerLost extends Error {}

/** One attempt in a fresh worker. */
function attempt<T extends WorkerRequest['type']>(body: Body<T>, onProgress: OnProgress, n: number): Job<ReplyOf<T>> {
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  const id = nextId++;
  let reject: (e: Error) => void = () => undefined;
  let timer: ReturnType<typeof setTimeout> | undefined;
  const limit = idleLimitMs();
  const done = new Promise<ReplyOf<T>>((res, rej) => {
    const end = (e: Error | null, value?: ReplyOf<T>) => {
      clearTimeout(timer);
      worker.terminate();
      if (e) rej(e);
      else res(value as ReplyOf<T>);
    };
    reject = (e) => end(e);
    const watch = () => {
      clearTimeout(timer);
      timer = setTimeout(() => end(new WorkerLost(`the analysis worker stopped replying (nothing for ${(limit / 1000).toFixed(0)} s)`)), limit);
    };
    watch();
    worker.onmessage = (e: MessageEvent<WorkerReply>) => {
      const m = e.data;
      if (m.id !== id) return;
      watch();
      if (m.type === 'progress') onProgress(m.done, m.total, m.stage);
      else if (m.type === 'error') end(new Error(m.message));
      else if (m.type === body.type) {
        const { type: _t, id: _i, ...rest } = m;
        end(null, rest as unknown as ReplyOf<T>);
      }
    };
    worker.onerror = (e) => {
      e.preventDefault?.();
      end(new WorkerLost(`the analysis worker failed (${e.message || 'no message'})`));
    };
    worker.onmessageerror = () => end(new WorkerLost('the analysis worker sent a message that could not be read'));
  });
  const fault = testSwitch('plumbline.test.workerFault');
  worker.postMessage({ ...body, id, ...(fault ? { fault, attempt: n } : {}) } as WorkerRequest);
  return {
    done,
    cancel() {
      reject(new Error('cancelled'));
    },
  };
}

/**
 * Starts one job of the given type in a fresh worker. A worker that crashes or stops replying
 * (a watchdog: nothing for WORKER_IDLE_LIMIT_MS) is ended and the job re-run once in a fresh
 * one; a second loss, or an error from the analysis itself, rejects `done` with the reason.
 */
export function runJob<T extends WorkerRequest['type']>(body: Body<T>, onProgress: OnProgress): Job<ReplyOf<T>> {
  let current = attempt(body, onProgress, 1);
  let cancelled = false;
  const done = current.done.catch((e: unknown) => {
    if (cancelled || !(e instanceof WorkerLost)) throw e;
    current = attempt(body, onProgress, 2);
    return current.done.catch((e2: unknown) => {
      throw new Error(`${(e2 as Error).message}; it had already failed once (${e.message}), so the job was stopped`);
    });
  });
  return {
    done,
    cancel() {
      cancelled = true;
      current.cancel();
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
