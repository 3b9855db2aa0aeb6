/**
 * Node runner for a line sweep: spreads the lines over worker threads (one per available core,
 * at most one per line), hands each idle worker the next line, and reports progress. The work
 * itself is the core's pure job function (createLineRunner), so results match an in-process run.
 * If workers cannot start (no tsx loader, a sandbox), it runs in-process and says so.
 */
import { availableParallelism } from 'node:os';
import { Worker } from 'node:worker_threads';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { runLineSweepJob, stationCount, type LineSummary, type LineSweepJob } from '../core/index';

export interface ParallelOptions {
  /** Worker threads. @default os.availableParallelism(), or in-process below PARALLEL_MIN_STATIONS */
  readonly workers?: number;
  /** After each line: lines done, total. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Force the in-process path. @default false */
  readonly inProcess?: boolean;
}

export interface ParallelResult {
  readonly summaries: LineSummary[];
  /** Threads used; 0 when the lines ran in-process. */
  readonly workers: number;
  /** Why the lines ran in-process, when they did and workers were asked for. */
  readonly fallbackReason: string | null;
}

/** Below this many stations in all (well under a second of work) the sweep runs in-process. */
export const PARALLEL_MIN_STATIONS = 2_000;

function totalStations(job: LineSweepJob): number {
  let n = 0;
  for (const l of job.lines) n += stationCount(l.path);
  return n;
}

/** Time a worker may take to load and build the model before the sweep falls back (ms). */
const WORKER_START_TIMEOUT_MS = 20_000;

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

export async function runLinesParallel(job: LineSweepJob, opts: ParallelOptions = {}): Promise<ParallelResult> {
  const total = job.lines.length;
  const want = Math.max(1, Math.min(opts.workers ?? availableParallelism(), total));
  const inProcess = (reason: string | null): ParallelResult => ({
    summaries: runLineSweepJob(job, (_s, done, n) => opts.onProgress?.(done, n)),
    workers: 0,
    fallbackReason: reason,
  });
  if (opts.inProcess || total === 0) return inProcess(null);
  // Each thread first loads the bundled core and builds its model: not worth it for a tiny sweep
  // unless threads were asked for by number.
  if (opts.workers === undefined && totalStations(job) < PARALLEL_MIN_STATIONS) return inProcess(null);

  const workers: Worker[] = [];
  const bundle = await workerBundle();
  try {
    const ready = await Promise.all(
      Array.from({ length: want }, () =>
        new Promise<Worker>((resolve, reject) => {
          const w = startWorker(bundle);
          workers.push(w);
          const timer = setTimeout(() => reject(new Error('a worker did not start in time')), WORKER_START_TIMEOUT_MS);
          w.once('error', (e) => {
            clearTimeout(timer);
            reject(e);
          });
          w.once('message', (m: { type: string; message?: string }) => {
            clearTimeout(timer);
            if (m.type === 'ready') resolve(w);
            else reject(new Error(m.message ?? 'worker failed to start'));
          });
          w.postMessage({ type: 'init', vehicle: job.vehicle, terrain: job.terrain, options: job.options });
        }),
      ),
    );
    const byIndex = new Map<number, LineSummary>();
    let next = 0;
    let done = 0;
    await new Promise<void>((resolve, reject) => {
      const feed = (w: Worker) => {
        if (next < total) w.postMessage({ type: 'line', line: job.lines[next++] });
      };
      for (const w of ready) {
        w.on('message', (m: { type: string; summary?: LineSummary; message?: string }) => {
          if (m.type === 'done' && m.summary) {
            byIndex.set(m.summary.index, m.summary);
            done++;
            opts.onProgress?.(done, total);
            if (done === total) resolve();
            else feed(w);
          } else if (m.type === 'error') reject(new Error(m.message ?? 'worker error'));
        });
        w.on('error', reject);
        feed(w);
      }
    });
    // Back in the job's order, whichever worker finished first.
    return { summaries: job.lines.map((l) => byIndex.get(l.index)!), workers: ready.length, fallbackReason: null };
  } catch (e) {
    for (const w of workers) void w.terminate();
    workers.length = 0;
    return inProcess(`worker threads unavailable (${e instanceof Error ? e.message : String(e)}); ran in-process`);
  } finally {
    for (const w of workers) void w.terminate();
  }
}
