/** Runs analyses in the worker with progress and cancel. One worker per job; cancel terminates it. */
import type { RoseResult, Scenario, SweepRange } from '../core';
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

export function runLines(scenario: Scenario, offsetsM: SweepRange, headingChangesRad: SweepRange, onProgress: OnProgress) {
  return runJob({ type: 'lines', scenario, offsetsM, headingChangesRad }, onProgress);
}
