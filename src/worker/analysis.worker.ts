/// <reference lib="webworker" />
/**
 * Long analyses off the main thread, so the interface never freezes: the stability rose (a tilt
 * sweep for every downhill direction). Cancel = the app terminates this worker.
 */
import { buildModel, stabilityRose } from '../core';
import type { WorkerReply, WorkerRequest } from './messages';

const post = (m: WorkerReply): void => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

self.onmessage = (e: MessageEvent<WorkerRequest>) => {
  const req = e.data;
  if (req.type !== 'rose') return;
  try {
    const t0 = performance.now();
    const s = req.scenario;
    const model = buildModel(s.vehicle, s.terrain);
    const result = stabilityRose(model, s.pose, {
      stepRad: (req.stepDeg * Math.PI) / 180,
      friction: s.friction,
      onProgress: (done, total) => post({ type: 'progress', id: req.id, done, total }),
    });
    post({ type: 'rose', id: req.id, result, wallMs: performance.now() - t0 });
  } catch (err) {
    post({ type: 'error', id: req.id, message: (err as Error).message });
  }
};
