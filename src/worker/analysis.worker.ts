/// <reference lib="webworker" />
/**
 * Long analyses off the main thread, so the interface never freezes: the stability rose, the
 * obstacle pass, the build comparison, the line sweep and the report. Cancel = the app
 * terminates this worker.
 */
import {
  AS_GIVEN,
  MAX_BUILDS,
  applyBuild,
  buildModel,
  compareVehicles,
  passOptionsOf,
  runHeadingJob,
  runLineSweepJob,
  stabilityRose,
  type AppliedBuild,
} from '../core';
import { collectReport, renderReportHtml } from '../report';
import { RAD_PER_DEG } from '../present/units';
import type { WorkerReply, WorkerRequest } from './messages';
import { runPassWithSolves } from './passReplay';

const post = (m: WorkerReply): void => (self as unknown as DedicatedWorkerGlobalScope).postMessage(m);

function handle(req: WorkerRequest): void {
  const t0 = performance.now();
  const s = req.scenario;
  const progress = (done: number, total: number, stage?: string) => post({ type: 'progress', id: req.id, done, total, stage });
  switch (req.type) {
    case 'rose': {
      const model = buildModel(s.vehicle, s.terrain);
      const result = stabilityRose(model, s.pose, { stepRad: req.stepDeg * RAD_PER_DEG, friction: s.friction, onProgress: (d, t) => progress(d, t) });
      post({ type: 'rose', id: req.id, result, wallMs: performance.now() - t0 });
      return;
    }
    case 'pass': {
      if (!s.path) throw new Error('the scenario has no path');
      const model = buildModel(s.vehicle, s.terrain);
      const opts = passOptionsOf(s);
      const { result, solved } = runPassWithSolves(model, s.path, { ...opts, onProgress: (d, t) => progress(d, t, 'pass') });
      post({ type: 'pass', id: req.id, result, solved, wallMs: performance.now() - t0 });
      return;
    }
    case 'compare': {
      // As the compare command with one file: the vehicle as given first, then each build.
      const builds = s.builds ?? [];
      if (builds.length === 0) throw new Error('the scenario has no builds');
      const applied: AppliedBuild[] = [{ name: 'as given', vehicle: s.vehicle, changes: AS_GIVEN }, ...builds.slice(0, MAX_BUILDS - 1).map((b) => applyBuild(s.vehicle, b))];
      const rows = compareVehicles(applied, {
        terrain: s.terrain,
        path: s.path,
        friction: s.friction,
        tilt: passOptionsOf(s).tilt,
        roseStepRad: 5 * RAD_PER_DEG,
        onProgress: (d, t) => progress(d, t),
      });
      post({ type: 'compare', id: req.id, rows, wallMs: performance.now() - t0 });
      return;
    }
    case 'lines': {
      const summaries = runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: passOptionsOf(s), lines: req.lines }, (_x, d, t) => progress(d, t));
      post({ type: 'lines', id: req.id, summaries, wallMs: performance.now() - t0 });
      return;
    }
    case 'headings': {
      const results = runHeadingJob(
        { vehicle: s.vehicle, terrain: s.terrain, xM: req.xM, yM: req.yM, ground: req.ground, headingsRad: req.headingsRad, friction: s.friction },
        (d, t) => progress(d, t),
      );
      post({ type: 'headings', id: req.id, results, wallMs: performance.now() - t0 });
      return;
    }
    case 'report': {
      const data = collectReport(s, { builds: s.builds, onStage: (stage) => progress(0, 1, stage) });
      const html = renderReportHtml(data, {
        toolVersion: req.toolVersion,
        dateText: req.dateText,
        ...(req.units ? { units: req.units } : {}),
        ...(req.sceneImageDataUrl ? { sceneImageDataUrl: req.sceneImageDataUrl } : {}),
      });
      post({ type: 'report', id: req.id, html, wallMs: performance.now() - t0 });
      return;
    }
  }
}

/**
 * Test-only fault injection (the browser tests set localStorage "plumbline.test.workerFault"; the
 * client passes it on): on the first attempt (every attempt with ':always'), 'close' ends the worker silently, 'throw' throws
 * outside the handler, 'hang' never returns. Never set otherwise.
 */
function injectFault(req: WorkerRequest & { fault?: string; attempt?: number }): boolean {
  if (!req.fault) return false;
  // MODE fails the first attempt only; MODE:always every attempt.
  const [mode, always] = req.fault.split(':');
  if (always !== 'always' && req.attempt !== 1) return false;
  if (mode === 'close') {
    self.close();
    return true;
  }
  if (mode === 'throw') {
    setTimeout(() => {
      throw new Error('injected fault: the worker threw');
    });
    return true;
  }
  if (mode === 'hang') for (;;);
  return false;
}

self.onmessage = (e: MessageEvent<WorkerRequest>) => {
  if (injectFault(e.data)) return;
  try {
    handle(e.data);
  } catch (err) {
    post({ type: 'error', id: e.data.id, message: (err as Error).message });
  }
};
