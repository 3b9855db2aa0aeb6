/**
 * Node runner for a line sweep: spreads the lines over worker threads (one per available core,
 * at most one per line), hands each idle worker the next line, and reports progress. The work
 * itself is the core's pure job function (createLineRunner), so results match an in-process run.
 * If workers cannot start (no tsx loader, a sandbox), it runs in-process and says so.
 *
 * Failing loudly: a thread that exits, throws or stops replying (a watchdog per line) is replaced
 * by a fresh one and its line re-run once; a line that fails twice, or more thread deaths than
 * the sweep has threads, stops the sweep with an error naming the line and the cause (the CLI
 * prints it and exits 1). SIGINT/SIGTERM stop every thread before the process exits, and so does
 * the death of the parent process (a killed `npm`/`tsx` wrapper leaves no thread running).
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { runLineSweepJob, stationCount, type LineSpec, type LineSummary, type LineSweepJob } from '../core/index';

export interface ParallelOptions {
  /** Worker threads (capped at the core count). @default os.availableParallelism(), or in-process below PARALLEL_MIN_STATIONS */
  readonly workers?: number;
  /** After each line: lines done, total. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Force the in-process path. @default false */
  readonly inProcess?: boolean;
  /** A line's time limit before its thread counts as hung (ms). @default lineWatchdogMs(line) */
  readonly watchdogMs?: number;
  /** Notes for the user (a thread replaced, a line re-run, threads capped), as they happen. */
  readonly onNote?: (note: string) => void;
}

export interface ParallelResult {
  readonly summaries: LineSummary[];
  /** Threads used; 0 when the lines ran in-process. */
  readonly workers: number;
  /** Why the lines ran in-process, when they did and workers were asked for. */
  readonly fallbackReason: string | null;
  /** Threads that died (exited, threw or hung) and were replaced; their lines were re-run. */
  readonly replacedWorkers: number;
}

/** Below this many stations in all (well under a second of work) the sweep runs in-process. */
export const PARALLEL_MIN_STATIONS = 2_000;

/**
 * Seconds one station of a pass is taken to cost for the up-front estimate: 0.5 ms, above the
 * 0.30 ms measured by `npm run bench` (pass.1000) on a shared 2-core machine, so the estimate errs long.
 */
export const STATION_COST_S = 0.5e-3;
/** A sweep estimated past this many seconds needs the user's yes before it starts (one hour). */
export const LONG_JOB_S = 3600;

function totalStations(job: LineSweepJob): number {
  let n = 0;
  for (const l of job.lines) n += stationCount(l.path);
  return n;
}

/** The cores this process may use (the cap for --workers). */
export function coreCount(): number {
  return Math.max(1, availableParallelism());
}

/** Estimated wall time of a sweep (s) on the given threads, from its station count. */
export function estimateSweepSeconds(job: LineSweepJob, workers: number): number {
  return (totalStations(job) * STATION_COST_S) / Math.max(1, Math.min(workers, job.lines.length));
}

/**
 * Thread count for a request: at most the cores, at most one per line. Past the cores, the
 * note says so (more threads than cores only add memory: each builds its own model).
 */
export function capWorkers(requested: number | undefined, lines: number): { workers: number; note: string | null } {
  const cores = coreCount();
  const want = requested ?? cores;
  const note = requested !== undefined && requested > cores ? `--workers ${requested} is more than this machine's ${cores} core(s); using ${cores}` : null;
  return { workers: Math.max(1, Math.min(want, cores, lines)), note };
}

/** Time a worker may take to load and build the model before the sweep falls back (ms). */
const WORKER_START_TIMEOUT_MS = 20_000;

/**
 * A line's time limit: 30 s plus 20 ms a station (about 60 times the measured cost of a station),
 * so only a thread that has stopped replying reaches it. PLUMBLINE_WORKER_WATCHDOG_MS overrides it
 * (the fault-injection tests use a short one).
 */
export function lineWatchdogMs(line: LineSpec): number {
  const env = Number(process.env.PLUMBLINE_WORKER_WATCHDOG_MS);
  if (Number.isFinite(env) && env > 0) return env;
  return 30_000 + 20 * stationCount(line.path);
}

let bundledWorker: string | null | undefined;

/**
 * The worker's code, bundled once per process with esbuild into one plain script, so a thread
 * starts in milliseconds instead of loading TypeScript through tsx (about a second a thread).
 * Null if esbuild is not available; the tsx path below is then used.
 */
async function workerBundle(): Promise<string | null> {
  if (bundledWorker !== undefined) return bundledWorker;
  try {
    const esbuild = await import('esbuild');
    const entry = fileURLToPath(new URL('./linesWorker.ts', import.meta.url));
    const out = await esbuild.build({ entryPoints: [entry], bundle: true, platform: 'node', format: 'cjs', write: false, logLevel: 'silent' });
    bundledWorker = out.outputFiles[0].text;
  } catch {
    bundledWorker = null;
  }
  return bundledWorker;
}

/**
 * Starts a worker thread on the bundled script, or else on the TypeScript entry through tsx's
 * API, as `npm run cli` runs main.ts. (Node 20 does not apply `--import tsx` loader hooks to
 * worker threads, so the usual `execArgv: ['--import', 'tsx']` gives "Unknown file extension .ts".)
 */
function startWorker(bundle: string | null): Worker {
  if (bundle) return new Worker(bundle, { eval: true });
  const entry = new URL('./linesWorker.ts', import.meta.url).href;
  // require.resolve picks the package's "require" build; the thread imports its ES module twin.
  const api = pathToFileURL(createRequire(import.meta.url).resolve('tsx/esm/api').replace(/\.cjs$/, '.mjs')).href;
  const code = `import(${JSON.stringify(api)}).then((m) => m.tsImport(${JSON.stringify(entry)}, ${JSON.stringify(entry)}))`;
  return new Worker(code, { eval: true });
}

type WorkerMessage = { type: string; summary?: LineSummary; message?: string };

/** Starts a thread and waits for its model to be built. `ordinal` numbers the threads (for the fault-injection switch). */
function readyWorker(bundle: string | null, job: LineSweepJob, ordinal: number, all: Set<Worker>): Promise<Worker> {
  return new Promise<Worker>((resolve, reject) => {
    const w = startWorker(bundle);
    all.add(w);
    const detach = () => {
      clearTimeout(timer);
      w.off('error', onError);
      w.off('exit', onExit);
      w.off('message', onMessage);
    };
    const fail = (e: Error) => {
      detach();
      all.delete(w);
      void w.terminate();
      reject(e);
    };
    const onError = (e: Error) => fail(e);
    const onExit = (code: number) => fail(new Error(`a worker exited with code ${code} while starting`));
    const onMessage = (m: WorkerMessage) => {
      if (m.type === 'ready') {
        detach();
        resolve(w);
      } else fail(new Error(m.message ?? 'worker failed to start'));
    };
    const timer = setTimeout(() => fail(new Error('a worker did not start in time')), WORKER_START_TIMEOUT_MS);
    w.on('error', onError);
    w.on('exit', onExit);
    w.on('message', onMessage);
    w.postMessage({ type: 'init', vehicle: job.vehicle, terrain: job.terrain, options: job.options, ordinal });
  });
}

/** Stops the given threads when the process is told to stop, or when its parent dies. Returns the undo. */
function stopOnSignals(all: Set<Worker>): () => void {
  const handlers: [NodeJS.Signals, () => void][] = (['SIGINT', 'SIGTERM', 'SIGHUP'] as const).map((sig) => [
    sig,
    () => {
      for (const w of all) void w.terminate();
      process.stderr.write(`lines: stopped by ${sig}; worker threads ended\n`);
      process.exit(sig === 'SIGINT' ? 130 : sig === 'SIGTERM' ? 143 : 129);
    },
  ]);
  for (const [sig, h] of handlers) process.on(sig, h);
  // A wrapper (npm, tsx) killed with SIGKILL cannot pass the signal on: notice being orphaned.
  const parent = process.ppid;
  const orphanTimer = setInterval(() => {
    if (process.ppid !== parent) {
      for (const w of all) void w.terminate();
      process.stderr.write('lines: the parent process ended; worker threads ended\n');
      process.exit(129);
    }
  }, 1000);
  orphanTimer.unref();
  return () => {
    for (const [sig, h] of handlers) process.off(sig, h);
    clearInterval(orphanTimer);
  };
}

export async function runLinesParallel(job: LineSweepJob, opts: ParallelOptions = {}): Promise<ParallelResult> {
  const total = job.lines.length;
  const { workers: want, note } = capWorkers(opts.workers, total);
  if (note && !opts.inProcess) opts.onNote?.(note);
  const inProcess = (reason: string | null): ParallelResult => ({
    summaries: runLineSweepJob(job, (_s, done, n) => opts.onProgress?.(done, n)),
    workers: 0,
    fallbackReason: reason,
    replacedWorkers: 0,
  });
  if (opts.inProcess || total === 0) return inProcess(null);
  // Each thread first loads the bundled core and builds its model: not worth it for a tiny sweep
  // unless threads were asked for by number.
  if (opts.workers === undefined && totalStations(job) < PARALLEL_MIN_STATIONS) return inProcess(null);

  const all = new Set<Worker>();
  const bundle = await workerBundle();
  let ordinal = 0;
  let ready: Worker[];
  try {
    ready = await Promise.all(Array.from({ length: want }, () => readyWorker(bundle, job, ordinal++, all)));
  } catch (e) {
    for (const w of all) void w.terminate();
    all.clear();
    return inProcess(`worker threads unavailable (${e instanceof Error ? e.message : String(e)}); ran in-process`);
  }

  const unhook = stopOnSignals(all);
  try {
    const byIndex = new Map<number, LineSummary>();
    /** Lines not yet handed out (a failed line goes back to the front). */
    const queue: LineSpec[] = [...job.lines];
    /** Failed attempts per line index. */
    const failures = new Map<number, number>();
    let done = 0;
    let replaced = 0;
    await new Promise<void>((resolve, reject) => {
      let finished = false;
      const stop = (e: Error | null) => {
        if (finished) return;
        finished = true;
        for (const x of busy.values()) clearTimeout(x.timer);
        for (const off of listeners.values()) off();
        if (e) reject(e);
        else resolve();
      };
      /** Lines out on each thread, with their watchdog. */
      const busy = new Map<Worker, { line: LineSpec; timer: NodeJS.Timeout }>();

      /** Each attached thread's listeners, to take off when it is dropped. */
      const listeners = new Map<Worker, () => void>();

      const lost = (w: Worker, cause: string) => {
        if (finished) return;
        const job1 = busy.get(w);
        busy.delete(w);
        if (job1) clearTimeout(job1.timer);
        listeners.get(w)?.();
        listeners.delete(w);
        all.delete(w);
        void w.terminate();
        const what = job1 ? `line ${job1.line.index}` : 'no line';
        if (job1) {
          const n = (failures.get(job1.line.index) ?? 0) + 1;
          failures.set(job1.line.index, n);
          if (n >= 2) {
            stop(new Error(`lines: line ${job1.line.index} failed twice (last: a worker thread ${cause}); the sweep is incomplete, no result printed`));
            return;
          }
          queue.unshift(job1.line);
        }
        replaced++;
        if (replaced > want) {
          stop(new Error(`lines: ${replaced} worker threads failed (last: ${cause}, on ${what}); the sweep is incomplete, no result printed`));
          return;
        }
        opts.onNote?.(`a worker thread ${cause} on ${what}; ${job1 ? 're-running it on a fresh thread' : 'replacing it'}`);
        readyWorker(bundle, job, ordinal++, all).then(
          (fresh) => {
            if (finished) return void fresh.terminate();
            attach(fresh);
          },
          (e: unknown) => stop(new Error(`lines: a replacement worker thread could not start (${e instanceof Error ? e.message : String(e)}); the sweep is incomplete`)),
        );
      };

      const feed = (w: Worker) => {
        const line = queue.shift();
        if (!line) return;
        const limit = opts.watchdogMs ?? lineWatchdogMs(line);
        const timer = setTimeout(() => lost(w, `stopped replying (no result within ${(limit / 1000).toFixed(1)} s)`), limit);
        busy.set(w, { line, timer });
        w.postMessage({ type: 'line', line });
      };

      const attach = (w: Worker) => {
        const onMessage = (m: WorkerMessage) => {
          const b = busy.get(w);
          if (m.type === 'done' && m.summary && b) {
            clearTimeout(b.timer);
            busy.delete(w);
            if (!byIndex.has(m.summary.index)) {
              byIndex.set(m.summary.index, m.summary);
              done++;
              opts.onProgress?.(done, total);
            }
            if (done === total) {
              for (const x of busy.values()) clearTimeout(x.timer);
              stop(null);
            } else feed(w);
          } else if (m.type === 'error') {
            lost(w, `reported an error (${m.message ?? 'unknown'})`);
          }
        };
        const onError = (e: Error) => lost(w, `threw (${e.message})`);
        const onExit = (code: number) => lost(w, `exited with code ${code}`);
        w.on('message', onMessage);
        w.on('error', onError);
        w.on('exit', onExit);
        listeners.set(w, () => {
          w.off('message', onMessage);
          w.off('error', onError);
          w.off('exit', onExit);
        });
        feed(w);
      };

      for (const w of ready) attach(w);
    });
    // Back in the job's order, whichever worker finished first.
    return { summaries: job.lines.map((l) => byIndex.get(l.index)!), workers: ready.length, fallbackReason: null, replacedWorkers: replaced };
  } finally {
    unhook();
    for (const w of all) void w.terminate();
    all.clear();
  }
}
