/** Runs analyses in the worker with progress and cancel. One job at a time per client. */
import type { RoseResult, Scenario } from '../core';
import type { WorkerReply, WorkerRequest } from './messages';

export interface Job<T> {
  readonly done: Promise<T>;
  /** Stops the work at once (terminates the worker); `done` rejects with "cancelled". */
  cancel(): void;
}

let nextId = 1;

export function runRose(scenario: Scenario, stepDeg: number, onProgress: (done: number, total: number) => void): Job<{ result: RoseResult; wallMs: number }> {
  const worker = new Worker(new URL('./analysis.worker.ts', import.meta.url), { type: 'module' });
  const id = nextId++;
  let reject: (e: Error) => void = () => undefined;
  const done = new Promise<{ result: RoseResult; wallMs: number }>((res, rej) => {
    reject = rej;
    worker.onmessage = (e: MessageEvent<WorkerReply>) => {
      const m = e.data;
      if (m.id !== id) return;
      if (m.type === 'progress') onProgress(m.done, m.total);
      else if (m.type === 'rose') {
        worker.terminate();
        res({ result: m.result, wallMs: m.wallMs });
      } else {
        worker.terminate();
        rej(new Error(m.message));
      }
    };
    worker.onerror = (e) => {
      worker.terminate();
      rej(new Error(e.message || 'worker failed'));
    };
  });
  const req: WorkerRequest = { type: 'rose', id, scenario, stepDeg };
  worker.postMessage(req);
  return {
    done,
    cancel() {
      worker.terminate();
      reject(new Error('cancelled'));
    },
  };
}
