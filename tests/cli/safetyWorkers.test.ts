/**
 * Worker threads fail loudly: `lines` run as a real process with a fault injected into its worker
 * threads (the test-only switch PLUMBLINE_TEST_WORKER_FAULT, see src/cli/linesWorker.ts). A thread
 * that exits, throws, reports an error or stops replying on one line is replaced and the line
 * re-run (the result equals a clean run's); when every thread fails, the command stops with a
 * message and exit 1, and prints nothing on stdout. Nothing may hang: each run has a hard time
 * limit, and a run that reaches it counts as hung. Also: --workers past the core count is capped
 * with a message, a sweep estimated at hours asks for --yes, and SIGTERM ends the threads.
 */
import { spawn, spawnSync } from 'node:child_process';
import { availableParallelism } from 'node:os';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newCounts, printCounts, type Counts } from './safetyCounts';

const DEMO = 'assets/scenarios/ledge-crawler.json';
const SWEEP = ['lines', DEMO, '--offset', '-0.4:0.4:0.4', '--heading', '-4:4:4', '--json', '--quiet'];
/** A run past this is hung (a clean sweep of these 9 lines takes about 5 s on a loaded 2-core machine). */
const HARD_LIMIT_MS = 120_000;

interface Run {
  code: number | null;
  signal: NodeJS.Signals | null;
  out: string;
  err: string;
  hung: boolean;
}

function cli(args: string[], env: Record<string, string> = {}, limitMs = HARD_LIMIT_MS): Run {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...args], {
    env: { ...process.env, ...env },
    encoding: 'utf8',
    timeout: limitMs,
    killSignal: 'SIGKILL',
  });
  return { code: r.status, signal: r.signal, out: r.stdout, err: r.stderr, hung: r.signal === 'SIGKILL' };
}

const counts: Counts = newCounts();

/** Polls until cond() holds (at most 90 s: a loaded machine may take long to start the threads). */
async function waitFor(cond: () => boolean): Promise<void> {
  for (let t0 = Date.now(); !cond(); ) {
    if (Date.now() - t0 > 90_000) throw new Error('timed out waiting for the worker threads to start');
    await new Promise((r) => setTimeout(r, 200));
  }
}
let clean: string;

beforeAll(() => {
  const r = cli([...SWEEP, '--workers', '2']);
  expect(r.code).toBe(0);
  clean = JSON.stringify(JSON.parse(r.out).lines);
});

afterAll(() => {
  printCounts('lines worker faults (exit, throw, error, hang)', counts);
});

describe('lines with a worker thread that fails', () => {
  // One thread fails on its second line: replaced, the line re-run, the result unchanged.
  for (const mode of ['exit', 'throw', 'error', 'hang']) {
    it(`${mode} on one thread: re-run on a fresh thread, same result, exit 0`, () => {
      counts.tried++;
      // A short watchdog so the hang is noticed quickly (a line takes well under a second; 10 s leaves room for a loaded machine).
      const r = cli([...SWEEP, '--workers', '2'], { PLUMBLINE_TEST_WORKER_FAULT: `${mode}:first`, PLUMBLINE_WORKER_WATCHDOG_MS: '10000' });
      if (r.hung) counts.hung++;
      expect(r.hung).toBe(false);
      expect(r.err).toMatch(/lines: a worker thread (exited with code 3|threw|reported an error|stopped replying)[^\n]*re-running it on a fresh thread/);
      if (r.code !== 0) {
        // Only acceptable if the machine was so loaded that a healthy line also overran the watchdog: then it must fail loudly.
        expect(r.err).toMatch(/plumbline: lines: .*no result printed/);
        expect(r.out).toBe('');
        counts.rejected++;
        return;
      }
      expect(JSON.stringify(JSON.parse(r.out).lines)).toBe(clean);
      counts.accepted++;
    });
  }

  // Every thread fails on every line: a message naming the line and the cause, exit 1, nothing on stdout.
  for (const mode of ['exit', 'throw', 'error', 'hang']) {
    it(`${mode} on every thread: exit 1 with a message, nothing printed`, () => {
      counts.tried++;
      const r = cli([...SWEEP, '--workers', '2'], { PLUMBLINE_TEST_WORKER_FAULT: `${mode}:all`, PLUMBLINE_WORKER_WATCHDOG_MS: '3000' });
      if (r.hung) counts.hung++;
      if (r.code === null && !r.hung) counts.crashed++;
      expect(r.hung).toBe(false);
      expect(r.code).toBe(1);
      expect(r.out).toBe('');
      expect(r.err).toMatch(/plumbline: lines: (line \d+ failed twice|\d+ worker threads failed) \(last: a worker thread [^)]+\)+; the sweep is incomplete, no result printed/);
      counts.rejected++;
    });
  }
});

describe('lines: threads, long jobs and signals', () => {
  it('--workers past the core count is capped, with a message', () => {
    counts.tried++;
    const cores = availableParallelism();
    const r = cli([...SWEEP, '--workers', '300']);
    expect(r.code).toBe(0);
    expect(r.err).toContain(`lines: --workers 300 is more than this machine's ${cores} core(s); using ${cores}`);
    expect(JSON.stringify(JSON.parse(r.out).lines)).toBe(clean);
    counts.accepted++;
  });

  it('a sweep estimated at hours says so and needs --yes', () => {
    counts.tried++;
    // 5000 lines on the demo path (81 stations each at 0.5 ms) is about 200 s: not long. A path of 2 km
    // at 5 cm steps has 40 001 stations: 5000 lines ≈ 5000 × 40 001 × 0.5 ms / cores, hours on any machine.
    const r = cli(['lines', 'tests/cli/fixtures/long-path.json', '--offset', '-25:24.99:0.01', '--quiet']);
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/lines: this sweep would take about [\d.]+ hours on \d+ thread\(s\) \(5000 lines\); run again with --yes/);
    expect(r.out).toBe('');
    counts.rejected++;
  });

  it('SIGTERM during a sweep ends the process and its threads at once', { timeout: 180_000 }, async () => {
    counts.tried++;
    const child = spawn(process.execPath, ['--import', 'tsx', 'src/cli/main.ts', ...SWEEP, '--workers', '2'], {
      env: { ...process.env, PLUMBLINE_TEST_WORKER_FAULT: 'hang:all', PLUMBLINE_WORKER_WATCHDOG_MS: '600000' },
    });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    // Wait until the threads are at work (hung on their first line), then stop it.
    await waitFor(() => err.includes('injected fault: hanging'));
    const t0 = Date.now();
    child.kill('SIGTERM');
    const code = await new Promise<number | null>((res) => {
      const t = setTimeout(() => {
        child.kill('SIGKILL');
        res(null);
      }, 15_000);
      child.on('exit', (c) => {
        clearTimeout(t);
        res(c);
      });
    });
    if (code === null) counts.hung++;
    expect(code).toBe(143);
    expect(Date.now() - t0).toBeLessThan(15_000);
    expect(err).toContain('lines: stopped by SIGTERM; worker threads ended');
    counts.rejected++;
  });

  it('killing the wrapper with SIGKILL leaves no node process running', { timeout: 180_000 }, async () => {
    counts.tried++;
    // npm run -s cli is the wrapper users kill; here a shell stands in for it (its node child is the CLI).
    const wrapper = spawn('bash', ['-c', `"${process.execPath}" --import tsx src/cli/main.ts ${SWEEP.join(' ')} --workers 2 & wait`], {
      env: { ...process.env, PLUMBLINE_TEST_WORKER_FAULT: 'hang:all', PLUMBLINE_WORKER_WATCHDOG_MS: '600000' },
    });
    let err = '';
    wrapper.stderr.on('data', (d: Buffer) => (err += d.toString()));
    await waitFor(() => err.includes('injected fault: hanging'));
    const kids = spawnSync('pgrep', ['-P', String(wrapper.pid)], { encoding: 'utf8' }).stdout.trim().split('\n').filter(Boolean);
    expect(kids.length).toBe(1);
    wrapper.kill('SIGKILL');
    let alive = true;
    for (let i = 0; i < 30 && alive; i++) {
      await new Promise((r) => setTimeout(r, 500));
      alive = spawnSync('kill', ['-0', kids[0]]).status === 0;
    }
    if (alive) {
      counts.hung++;
      spawnSync('kill', ['-9', kids[0]]);
    }
    expect(alive).toBe(false);
    counts.rejected++;
  });

  it('the counts: 0 hung, 0 crashed', () => {
    expect(counts.hung).toBe(0);
    expect(counts.crashed).toBe(0);
    expect(counts.tried).toBe(counts.rejected + counts.accepted);
  });
});
