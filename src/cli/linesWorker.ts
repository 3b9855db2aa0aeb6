/**
 * Worker thread for `plumbline lines`: builds the model once from the job's vehicle and terrain,
 * then runs the lines it is sent, one message per line, with the pure job function of the core.
 * Messages in: {type: 'init', vehicle, terrain, options} then {type: 'line', line}; out: {type: 'ready'},
 * {type: 'done', summary} or {type: 'error', message}.
 */
import { parentPort } from 'node:worker_threads';
import { createLineRunner, type LineSpec, type LineSummary, type LinePassOptions, type Terrain, type Vehicle } from '../core/index';

type InMessage =
  | { readonly type: 'init'; readonly vehicle: Vehicle; readonly terrain: Terrain; readonly options: LinePassOptions }
  | { readonly type: 'line'; readonly line: LineSpec };

let run: ((line: LineSpec) => LineSummary) | null = null;

parentPort?.on('message', (msg: InMessage) => {
  try {
    if (msg.type === 'init') {
      run = createLineRunner(msg.vehicle, msg.terrain, msg.options);
      parentPort?.postMessage({ type: 'ready' });
    } else if (msg.type === 'line') {
      if (!run) throw new Error('line before init');
      parentPort?.postMessage({ type: 'done', summary: run(msg.line) });
    }
  } catch (e) {
    parentPort?.postMessage({ type: 'error', message: e instanceof Error ? e.message : String(e) });
  }
});
