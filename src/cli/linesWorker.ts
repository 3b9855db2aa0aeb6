/**
 * Worker thread for `plumbline lines`: builds the model once from the job's vehicle and terrain,
 * then runs the lines it is sent, one message per line, with the pure job function of the core.
 * Messages in: {type: 'init', vehicle, terrain, options, ordinal} then {type: 'line', line}; out: {type: 'ready'},
 * {type: 'done', summary} or {type: 'error', message}.
 *
 * Test-only fault injection (the runner's failure handling is tested with it; never set otherwise):
 * PLUMBLINE_TEST_WORKER_FAULT=MODE:WHICH, MODE exit | throw | error | hang, WHICH first (the first
 * thread, on its second line) or all (every thread, on every line).
 */
import { parentPort } from 'node:worker_threads';
import { createLineRunner, type LineSpec, type LineSummary, type LinePassOptions, type Terrain, type Vehicle } from '../core/index';

type InMessage =
  | { readonly type: 'init'; readonly vehicle: Vehicle; readonly terrain: Terrain; readonly options: LinePassOptions; readonly ordinal?: number }
  | { readonly type: 'line'; readonly line: LineSpec };

let run: ((line: LineSpec) => LineSummary) | null = null;
let ordinal = 0;
let linesSeen = 0;

const fault = /^(exit|throw|error|hang):(first|all)$/.exec(process.env.PLUMBLINE_TEST_WORKER_FAULT ?? '');

/** Acts out the injected fault, if this thread and line are the ones named. */
function injectFault(): void {
  if (!fault) return;
  const [, mode, which] = fault;
  if (which === 'first' && !(ordinal === 0 && linesSeen === 2)) return;
  if (mode === 'exit') process.exit(3);
  if (mode === 'throw') {
    setTimeout(() => {
      throw new Error('injected fault: the thread threw');
    });
    return;
  }
  if (mode === 'error') throw new Error('injected fault: the line failed');
  if (mode === 'hang') {
    // Said first, so a test knows the thread is at work before it sends a signal.
    process.stderr.write('lines worker: injected fault: hanging\n');
    for (;;);
  }
}

parentPort?.on('message', (msg: InMessage) => {
  try {
    if (msg.type === 'init') {
      ordinal = msg.ordinal ?? 0;
      run = createLineRunner(msg.vehicle, msg.terrain, msg.options);
      parentPort?.postMessage({ type: 'ready' });
    } else if (msg.type === 'line') {
      if (!run) throw new Error('line before init');
      linesSeen++;
      injectFault();
      if (fault && fault[1] === 'throw' && (fault[2] === 'all' || (ordinal === 0 && linesSeen === 2))) return;
      parentPort?.postMessage({ type: 'done', summary: run(msg.line) });
    }
  } catch (e) {
    parentPort?.postMessage({ type: 'error', message: e instanceof Error ? e.message : String(e) });
  }
});
