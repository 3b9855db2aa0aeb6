/**
 * Plumbline's benchmarks: what each figure measures and on what scene. `runBench` runs them all
 * in-process and returns the figures; bench/run.ts prints them and writes the JSON file; the
 * quick mode (one run each, small batches) is what tests/bench/bench.test.ts runs in CI.
 */
import { groundFigures, GROUND_FIGURE_NAMES, GROUND_TARGETS } from './ground';
import { makeLines } from '../src/core/analysis/lines';
import { type PassResult, runPass } from '../src/core/analysis/pass';
import { type RoseResult, stabilityRose } from '../src/core/analysis/rose';
import type { PathSpec, Pose, SolveResult, TyreModelOptions } from '../src/core/model/types';
import { buildModel, solveEquilibrium } from '../src/core/solver/equilibrium';
import type { VehicleModel } from '../src/core/solver/model';
import { STATE_SIZE } from '../src/core/solver/model';
import { tiltSweep } from '../src/core/solver/tilt';
import { createStabilityScratch, stabilityOf } from '../src/core/solver/stability';
import { reusableJacobian } from '../src/core/solver/newton';
import { TerrainField } from '../src/core/terrain/field';
import { DEFAULT_TYRE_MODEL, TyreContact, calibrateTyre, evaluateTyre, makeTyreLayout } from '../src/core/tyre/radialSpring';
import { runLinesParallel } from '../src/cli/parallel';
import { settleWithCannon } from '../src/reference/cannonSettle';
import { testVehicle } from '../tests/helpers/vehicles';
import type { Scenario } from '../src/core/scenario/types';
import { validate, withField, type FieldSpec } from '../src/app/edit';
import {
  type Figure,
  type Machine,
  type RunPlan,
  type Target,
  figure,
  machine,
  ratios,
  summarise,
  table,
  timePaired,
  timeRuns,
  unavailable,
} from './harness';
import {
  DEG,
  GARDEN_FROM_X_M,
  GARDEN_TO_X_M,
  cannonScene,
  demoScenario,
  gridHeightM,
  heightGrid,
  posesAlong,
  rockGarden,
} from './scenes';

export interface BenchOptions {
  /** One run each, small batches: proves the code runs, measures nothing worth quoting. */
  readonly quick?: boolean;
  /** Progress lines (stderr in the CLI). */
  readonly log?: (line: string) => void;
  /**
   * Only the figures whose names start with one of these (`solve` takes every solve.* figure,
   * `rose.72` just that one); a scene runs only when one of its figures is wanted. Empty or
   * absent: everything.
   */
  readonly only?: readonly string[];
}

/** Whether a figure name is selected by `only` (a prefix of the name, or the whole of it). */
export function selected(name: string, only: readonly string[] | undefined): boolean {
  if (!only || only.length === 0) return true;
  return only.some((p) => name.startsWith(p));
}

export interface BenchReport {
  readonly machine: Machine;
  readonly quick: boolean;
  readonly figures: Figure[];
  /** cannon-es and Plumbline per-wheel normal loads on the comparison scene (N), and the weight. */
  readonly settle: { readonly cannonN: number[]; readonly plumblineN: number[]; readonly weightN: number; readonly settled: boolean } | null;
}

/** Targets from the benchmark issue, printed beside the figures (never a reason to fail the run). */
export const TARGETS: readonly Target[] = [
  { name: 'solve.warm', op: '<', bound: 0.2, unit: 'ms' },
  { name: 'solve.cold', op: '<', bound: 1, unit: 'ms' },
  { name: 'tilt.sweep', op: '<', bound: 20, unit: 'ms' },
  { name: 'rose.72', op: '<', bound: 1000, unit: 'ms' },
  { name: 'pass.1000', op: '<', bound: 500, unit: 'ms' },
  { name: 'settle.ratio', op: '>=', bound: 100, unit: '×' },
  { name: 'settle.loadDiff', op: '<=', bound: 0.02, unit: 'of weight' },
  { name: 'grid.4096vs64', op: '<=', bound: 1.5, unit: '×' },
  { name: 'edit.field.grid1000vsPlane', op: '<=', bound: 1.5, unit: '×' },
  ...GROUND_TARGETS,
];

/** Figure names every run produces (lines.* may be "not available" until the analysis module lands). */
export const FIGURE_NAMES = [
  'tyre.eval',
  'solve.cold',
  'solve.warm',
  'solve.warmPerEval',
  'solve.stability',
  'solve.stability.reuse',
  'solve.reference',
  'tilt.sweep',
  'rose.72',
  'pass.1000',
  'lines.200.oneWorker',
  'lines.200.allCores',
  'settle.cannon',
  'settle.ratio',
  'settle.loadDiff',
  'grid.4096vs64',
  'edit.field.plane',
  'edit.field.grid1000',
  'edit.field.grid1000vsPlane',
  ...GROUND_FIGURE_NAMES,
] as const;

const US_PER_MS = 1000;

function plans(quick: boolean) {
  return {
    /** Microsecond work (one tyre, one evaluation). */
    micro: (batch: number): RunPlan => (quick ? { warmup: 1, runs: 1, batch: Math.max(1, batch >> 4) } : { warmup: 3, runs: 11, batch }),
    /** Sub-millisecond to millisecond work, batched over poses. */
    solve: (batch: number): RunPlan => (quick ? { warmup: 1, runs: 1, batch: Math.max(1, batch >> 3) } : { warmup: 3, runs: 11, batch }),
    /** Tens of milliseconds to a second per call. */
    heavy: (warmup = 2, runs = 7): RunPlan => (quick ? { warmup: 0, runs: 1, batch: 1 } : { warmup, runs, batch: 1 }),
  };
}

function mean(xs: readonly number[]): number {
  let s = 0;
  for (const x of xs) s += x;
  return xs.length > 0 ? s / xs.length : NaN;
}

function statusCounts(rs: readonly SolveResult[]): string {
  const c = new Map<string, number>();
  for (const r of rs) c.set(r.status, (c.get(r.status) ?? 0) + 1);
  return [...c.entries()].map(([k, v]) => `${v} ${k}`).join(', ');
}

export async function runBench(opts: BenchOptions = {}): Promise<BenchReport> {
  const quick = opts.quick ?? false;
  const log = opts.log ?? (() => {});
  const P = plans(quick);
  const figures: Figure[] = [];
  const want = (...names: string[]) => names.some((n) => selected(n, opts.only));
  const push = (f: Figure) => {
    if (!selected(f.name, opts.only)) return;
    figures.push(f);
    log(`${f.name}: ${f.median === null ? 'not available' : `${f.median.toPrecision(4)} ${f.unit}`}`);
  };

  const atStart = machine();
  const demo = demoScenario();
  const vehicle = demo.vehicle;
  const garden = rockGarden();

  // --- 1. One tyre evaluation on a height grid.
  if (want('tyre.eval')) {
    const terrain = heightGrid(256);
    const field = new TerrainField(terrain);
    const layout = makeTyreLayout(DEFAULT_TYRE_MODEL);
    const tyre = vehicle.tyreFront;
    const cal = calibrateTyre(layout, tyre.radiusM, 5000, tyre.stiffnessNPerM);
    const contact = new TyreContact(layout.slices);
    const list = new Int32Array(Math.max(1, field.featureCount));
    const spots = 64;
    const cx = new Float64Array(spots);
    const cy = new Float64Array(spots);
    const cz = new Float64Array(spots);
    for (let k = 0; k < spots; k++) {
      cx[k] = 3 * Math.cos((2 * Math.PI * k) / spots);
      cy[k] = 2 * Math.sin((2 * Math.PI * k) / spots);
      // Pressed about 3 cm into the ground below its centre (a loaded tyre).
      cz[k] = gridHeightM(cx[k], cy[k]) + tyre.radiusM - 0.03;
    }
    let loaded = 0;
    const work = (k: number) => {
      const s = k % spots;
      const reach = tyre.radiusM + tyre.widthM;
      const n = field.featuresNear(cx[s] - reach, cx[s] + reach, cy[s] - reach, cy[s] + reach, list);
      evaluateTyre(field, list, n, layout, tyre.radiusM, tyre.widthM, cal.rayRateNPerM, cx[s], cy[s], cz[s], 0, 1, 0, contact);
      loaded += contact.loadedSlices;
    };
    const t = timeRuns(work, P.micro(4000));
    push(
      figure(
        'tyre.eval',
        t.map((ms) => ms * US_PER_MS),
        'µs',
        `evaluateTyre, ${layout.slices} slices × ${layout.rays} springs, 256² height grid, 64 wheel spots pressed 3 cm in; ${loaded > 0 ? 'slices in contact' : 'NO CONTACT'}`,
      ),
    );
  }

  // --- 2, 3. Pose solves on the rock garden: cold, warm from 2 cm back; one evaluation + Jacobian.
  if (want('solve.')) {
    const model = buildModel(vehicle, garden);
    const nPoses = quick ? 16 : 200;
    const poses = posesAlong(nPoses);
    const warmFrom: Float64Array[] = [];
    const converged: Float64Array[] = [];
    const coldRes: SolveResult[] = [];
    const warmRes: SolveResult[] = [];
    /** Newton's last Jacobian of each warm solve where the acceptance check reuses it (else null). */
    const warmJ: (Float64Array | null)[] = [];
    for (const p of poses) {
      const back = solveEquilibrium(model, { ...p, xM: p.xM - 0.02 });
      warmFrom.push(back.state);
      const cold = solveEquilibrium(model, p);
      coldRes.push(cold);
      const warm = solveEquilibrium(model, p, { warmStart: back.state });
      const J = reusableJacobian();
      warmJ.push(J ? Float64Array.from(J) : null);
      warmRes.push(warm);
      converged.push(warm.state);
    }
    {
      const cold = timeRuns((k) => void solveEquilibrium(model, poses[k % nPoses]), P.solve(nPoses));
      push(figure('solve.cold', cold, 'ms', `demo vehicle, ${nPoses} poses along a rock garden (${statusCounts(coldRes)})`));
      push(figure('solve.cold.iterations', coldRes.map((r) => r.iterations), 'count', `per solve, over the ${nPoses} poses; mean ${mean(coldRes.map((r) => r.iterations)).toFixed(2)}`));
      push(figure('solve.cold.evaluations', coldRes.map((r) => r.evaluations), 'count', `full evaluations per solve; mean ${mean(coldRes.map((r) => r.evaluations)).toFixed(2)}`));
    }
    {
      const r = new Float64Array(STATE_SIZE);
      const warmWork = (k: number) => {
        const i = k % nPoses;
        solveEquilibrium(model, poses[i], { warmStart: warmFrom[i] });
      };
      const evalWork = (k: number) => {
        const i = k % nPoses;
        model.setPose(poses[i].xM, poses[i].yM, poses[i].headingRad);
        model.setTilt(0, 0);
        const x = converged[i];
        model.residual(x, true, r);
        for (let j = 0; j < STATE_SIZE; j++) model.residual(x, false, r);
      };
      const t = timePaired(warmWork, evalWork, P.solve(nPoses));
      push(figure('solve.warm', t.a, 'ms', `same poses, warm-started from the solution 2 cm back (${statusCounts(warmRes)})`));
      push(figure('solve.warm.iterations', warmRes.map((x) => x.iterations), 'count', `per solve; mean ${mean(warmRes.map((x) => x.iterations)).toFixed(2)}`));
      push(figure('solve.warm.evaluations', warmRes.map((x) => x.evaluations), 'count', `full evaluations per solve; mean ${mean(warmRes.map((x) => x.evaluations)).toFixed(2)}`));
      const rest = timeRuns((k) => {
        const i = k % nPoses;
        solveEquilibrium(model, poses[i], { warmStart: converged[i] });
      }, P.solve(nPoses));
      push(figure('solve.atRest', rest, 'ms', 'warm-started from its own solution (0 iterations): one full evaluation plus building the result (margins, support polygon)'));
      push(figure('solve.evalJacobian', t.b.map((ms) => ms * US_PER_MS), 'µs', 'one full residual (tyre springs cast) + 10 linearised residuals (the Jacobian), at the converged states'));
      push(figure('solve.warmPerEval', ratios(t.a, t.b), '×', 'warm solve / (one evaluation + Jacobian), run by run; 1 = the least work possible'));
    }

    {
      // The second-order check of a converged pose, timed by itself (it evaluates the tyres at the
      // state afresh, then the tangent stiffness and its eigenvalues).
      const sc = createStabilityScratch();
      const check = (k: number) => {
        const i = k % nPoses;
        model.setPose(poses[i].xM, poses[i].yM, poses[i].headingRad);
        model.setTilt(0, 0);
        stabilityOf(model, converged[i], sc, { fresh: true });
      };
      push(
        figure(
          'solve.stability',
          timeRuns(check, P.solve(nPoses)).map((ms) => ms * US_PER_MS),
          'µs',
          'stability check of a converged pose by itself (tyres evaluated at the state, tangent stiffness by central differences over the tyre linearisation, Householder + QL eigenvalues; over the full equations only near zero), rock-garden poses',
        ),
      );
      // The same check as the warm solve's acceptance runs it: the stiffness from Newton's last
      // Jacobian (kept from each warm solve above), the eigenvalues; the model placed at the state
      // by its kinematics only (what the check reads besides the Jacobian).
      const acceptPoses = warmJ.map((J, i) => (J ? i : -1)).filter((i) => i >= 0);
      const accept = (k: number) => {
        const i = acceptPoses[k % acceptPoses.length];
        model.setPose(poses[i].xM, poses[i].yM, poses[i].headingRad);
        model.setTilt(0, 0);
        model.kinematics(converged[i]);
        stabilityOf(model, converged[i], sc, { fresh: false, exact: false, jacobian: warmJ[i] });
      };
      push(
        acceptPoses.length === 0
          ? unavailable('solve.stability.reuse', 'µs', 'no warm solve left a Jacobian to reuse')
          : figure(
              'solve.stability.reuse',
              timeRuns(accept, P.solve(acceptPoses.length)).map((ms) => ms * US_PER_MS),
              'µs',
              `the check as a warm solve's acceptance runs it: stiffness from Newton's last Jacobian, eigenvalues (${acceptPoses.length} of ${nPoses} warm solves reuse the Jacobian; the others difference the linearisation as solve.stability does)`,
            ),
      );
      // The reference start where it does the most: the demo vehicle on a 20° side hill at 36
      // headings, no warm start (set down square on the ground, gravity turned to the real one in steps).
      const hill = buildModel(vehicle, { features: [{ type: 'plane', gradeRad: 0, crossSlopeRad: -20 * DEG, heightM: 0 }] });
      const headings = Array.from({ length: 36 }, (_, k) => ({ xM: 0, yM: 0, headingRad: k * 10 * DEG }));
      const refRes = headings.map((h) => solveEquilibrium(hill, h));
      const ref = timeRuns((k) => void solveEquilibrium(hill, headings[k % headings.length]), P.solve(headings.length));
      push(figure('solve.reference', ref, 'ms', `a solve from the reference start (no warm start) on a 20° side hill, 36 headings (${statusCounts(refRes)})`));
    }
  }

  // --- 4. Tilt sweep to tip, 72-direction rose, 1000-station pass, 200-line sweep.
  const table_ = buildModel(vehicle, { features: [] });
  const origin: Pose = { xM: 0, yM: 0, headingRad: 0 };
  if (want('tilt.sweep')) {
    let last: ReturnType<typeof tiltSweep> | null = null;
    const t = timeRuns(() => {
      last = tiltSweep(table_, origin, { downhillRad: Math.PI / 2 });
    }, P.heavy(3, 11));
    const res = last as ReturnType<typeof tiltSweep> | null;
    const tip = res?.tip ? `tip ${(res.tip.angleRad / DEG).toFixed(2)}°` : 'no tip';
    const lift = res?.firstLift ? `, first lift ${res.firstLift.wheel} at ${(res.firstLift.angleRad / DEG).toFixed(2)}°` : '';
    push(figure('tilt.sweep', t, 'ms', `demo vehicle on a tilt table, left side down, 2° steps, then each event bracketed and narrowed to 0.01° (secant-guided bisection): ${tip}${lift}, ${res?.evaluations ?? 0} evaluations`));
  }
  if (want('rose.72')) {
    let rose: RoseResult | null = null;
    const t = timeRuns(() => {
      rose = stabilityRose(table_, origin, { stepRad: 5 * DEG });
    }, P.heavy(1, 5));
    const r = rose as RoseResult | null;
    const w = r?.weakest;
    push(
      figure(
        'rose.72',
        t,
        'ms',
        `stabilityRose, every 5° (${r?.directions.length ?? 0} directions), demo vehicle on a tilt table: weakest tip ${w?.tip ? (w.tip.angleRad / DEG).toFixed(2) : '-'}° at downhill ${w ? (w.downhillRad / DEG).toFixed(0) : '-'}°, ${r?.evaluations ?? 0} evaluations`,
      ),
    );
  }
  if (want('pass.1000', 'pass.250', 'pass.500', 'growth.pass.')) {
    const span = GARDEN_TO_X_M - GARDEN_FROM_X_M;
    const passModel = buildModel(vehicle, garden);
    // n stations over the same 50 m, both ends included (stationCount): n − 1 steps.
    const pathFor = (n: number): PathSpec => {
      const stepM = span / n;
      return { fromM: [GARDEN_FROM_X_M, 0], toM: [GARDEN_FROM_X_M + (n - 1) * stepM, 0], stepM, headingRad: 0 };
    };
    let last: PassResult | null = null;
    const runOne = (n: number) => {
      const path = pathFor(n);
      return () => {
        last = runPass(passModel, path);
      };
    };
    const plan = P.heavy(2, 7);
    // Growth: 250, 500 and 1000 stations over the same 50 m, run alternately.
    const t250: number[] = [];
    const t500: number[] = [];
    const t1000: number[] = [];
    const w250 = runOne(250);
    const w500 = runOne(500);
    const w1000 = runOne(1000);
    const once: RunPlan = { warmup: 0, runs: 1, batch: 1 };
    for (let r = 0; r < plan.warmup + plan.runs; r++) {
      const a = timeRuns(w250, once)[0];
      const b = timeRuns(w500, once)[0];
      const c = timeRuns(w1000, once)[0];
      if (r < plan.warmup) continue;
      t250.push(a);
      t500.push(b);
      t1000.push(c);
    }
    const p = last as PassResult | null;
    const head = p
      ? `${p.stations.length}/${p.plannedStations} stations solved, ${p.evaluations} evaluations, first lift ${p.firstLift ? `${p.firstLift.wheel} at ${p.firstLift.distanceM.toFixed(2)} m` : 'none'}, tip ${p.tip ? `at ${p.tip.distanceM.toFixed(2)} m` : 'none'}`
      : '';
    push(figure('pass.1000', t1000, 'ms', `runPass (loads, margins, clearance, events), demo vehicle, 1000 stations every 5 cm over the 50 m rock garden: ${head}`));
    push(figure('pass.250', t250, 'ms', 'the same 50 m at 250 stations (20 cm)'));
    push(figure('pass.500', t500, 'ms', 'the same 50 m at 500 stations (10 cm)'));
    push(figure('growth.pass.500vs250', ratios(t500, t250), '×', 'linear would be 2 (closer stations warm-start closer, so less is possible)'));
    push(figure('growth.pass.1000vs250', ratios(t1000, t250), '×', 'linear would be 4'));
  }
  if (want('lines.200.')) {
    // 200 lines: 20 sideways offsets × 10 heading changes around a 5 m stretch of the rock garden
    // (10 cm stations: 51 per line). Quick mode: the same 200 lines, 2 stations each.
    const lengthM = quick ? 0.1 : 5;
    const base: PathSpec = { fromM: [10, 0], toM: [10 + lengthM, 0], stepM: 0.1, headingRad: null };
    const lineSpecs = makeLines(base, { from: -0.95, to: 0.95, step: 0.1 }, { from: -4.5 * DEG, to: 4.5 * DEG, step: 1 * DEG });
    const job = { vehicle, terrain: garden, options: {}, lines: lineSpecs };
    const cores = machine().cores;
    const plan = P.heavy(0, 3);
    const one: number[] = [];
    const all: number[] = [];
    let usedOne = -1;
    let usedAll = -1;
    let fallback: string | null = null;
    let tips = 0;
    let stations = 0;
    for (let r = 0; r < plan.warmup + plan.runs; r++) {
      let t0 = performance.now();
      const a = await runLinesParallel(job, { workers: 1 });
      const ta = performance.now() - t0;
      t0 = performance.now();
      const b = await runLinesParallel(job, { workers: cores });
      const tb = performance.now() - t0;
      usedOne = a.workers;
      usedAll = b.workers;
      fallback = a.fallbackReason ?? b.fallbackReason ?? fallback;
      tips = b.summaries.filter((x) => x.tip).length;
      stations = b.summaries.length > 0 ? b.summaries[0].plannedStations : 0;
      if (r < plan.warmup) continue;
      one.push(ta);
      all.push(tb);
    }
    const what = `runLinesParallel, ${lineSpecs.length} lines × ${stations} stations on the rock garden, worker start-up included`;
    if (usedOne === 1 && usedAll >= 1) {
      push(figure('lines.200.oneWorker', one, 'ms', `${what}; 1 worker thread; ${tips} lines tip`));
      push(figure('lines.200.allCores', all, 'ms', `the same on ${usedAll} worker threads (${cores} cores)`));
      push(figure('lines.200.speedup', ratios(one, all), '×', `one worker / ${usedAll} workers`));
    } else {
      const why = `not available: the sweep did not run on worker threads (${fallback ?? `workers used: ${usedOne}, ${usedAll}`})`;
      push(unavailable('lines.200.oneWorker', 'ms', why));
      push(unavailable('lines.200.allCores', 'ms', why));
    }
  }

  // --- 5. Side by side with cannon-es settling the same vehicle on the same terrain and pose.
  let settle: BenchReport['settle'] = null;
  if (want('settle.')) {
    const rig = testVehicle();
    const scene = cannonScene();
    const rigModel = buildModel(rig, scene.terrain);
    // A settle takes only milliseconds of wall time: many runs, so a garbage collection in one does not set the median.
    const plan = P.heavy(3, 15);
    const cannonMs: number[] = [];
    const plumbMs: number[] = [];
    const diffs: number[] = [];
    let allSettled = true;
    let simS = 0;
    let steps = 0;
    let sol = solveEquilibrium(rigModel, scene.pose);
    const solveBatch = quick ? 5 : 50;
    for (let r = 0; r < plan.warmup + plan.runs; r++) {
      const t0 = performance.now();
      const ref = settleWithCannon(rig, scene.terrain, scene.pose, null);
      const tc = performance.now() - t0;
      const tp = timeRuns(() => {
        sol = solveEquilibrium(rigModel, scene.pose);
      }, { warmup: 0, runs: 1, batch: solveBatch })[0];
      if (r < plan.warmup) continue;
      cannonMs.push(tc);
      plumbMs.push(tp);
      allSettled = allSettled && ref.settled && sol.status === 'converged';
      simS = ref.simulatedTimeS;
      steps = ref.steps;
      let d = 0;
      for (let i = 0; i < 4; i++) d = Math.max(d, Math.abs((sol.wheels[i].loadN ?? 0) - ref.loadsN[i]) / ref.weightN);
      diffs.push(d);
      settle = { cannonN: [...ref.loadsN], plumblineN: sol.wheels.map((w) => (w.loadN ?? 0)), weightN: ref.weightN, settled: ref.settled && sol.status === 'converged' };
    }
    const scn = 'test rig, front-left wheel on a 0.3 m block';
    push(figure('settle.cannon', cannonMs, 'ms', `settleWithCannon (1/500 s steps until loads stay within 0.5 % of weight for 0.5 s): ${scn}; ${steps} steps, ${simS.toFixed(2)} s simulated${allSettled ? '' : ', NOT SETTLED'}`));
    push(figure('settle.plumbline', plumbMs, 'ms', `Plumbline cold solve of the same pose (model built once): ${sol.iterations} iterations, ${sol.evaluations} full evaluations`));
    push(figure('settle.ratio', ratios(cannonMs, plumbMs), '×', 'cannon-es settle time / Plumbline cold solve time, run by run'));
    push(figure('settle.loadDiff', diffs, 'of weight', 'largest per-wheel |normal load difference| / weight'));
  }

  // --- 6. Growth: grid size, tyre springs and slices.
  if (want('grid.')) {
    const gridPoses: Pose[] = [];
    for (let k = 0; k < 8; k++) gridPoses.push({ xM: -1 + (2 * k) / 7, yM: 0.2 * Math.sin(k), headingRad: 0.05 * Math.cos(k) });
    const small = buildModel(vehicle, heightGrid(64));
    const solveAll = (m: VehicleModel) => () => {
      for (const p of gridPoses) solveEquilibrium(m, p);
    };
    const sizes = [256, 1024, 4096];
    const abs: string[] = [];
    for (const n of sizes) {
      let big: VehicleModel | null = buildModel(vehicle, heightGrid(n));
      const t = timePaired(solveAll(small), solveAll(big), P.solve(quick ? 8 : 40));
      const per = (ms: number) => (ms / gridPoses.length).toFixed(4);
      abs.push(`${n}²: ${per(summarise(t.b).median)} ms`);
      if (n === sizes[0]) abs.unshift(`64²: ${per(summarise(t.a).median)} ms`);
      push(figure(`grid.${n}vs64`, ratios(t.b, t.a), '×', `cold solve on a ${n}² grid (0.1 m spacing) / the same on 64²; same ground under the vehicle`));
      // Drop the 4096² model before the next size is built (memory, not logic).
      // eslint-disable-next-line no-useless-assignment
      big = null;
    }
    const last = figures[figures.length - 1];
    figures[figures.length - 1] = { ...last, note: `${last.note}; per solve: ${abs.join(', ')}` };
  }
  if (want('growth.slices.', 'growth.springs.')) {
    const gp = posesAlong(quick ? 8 : 40);
    const r = new Float64Array(STATE_SIZE);
    const measureTyre = (name: string, tyre: TyreModelOptions, what: string) => {
      const base = buildModel(vehicle, garden);
      const alt = buildModel(vehicle, garden, { tyre });
      const solvedB = gp.map((p) => solveEquilibrium(base, p));
      const solvedA = gp.map((p) => solveEquilibrium(alt, p));
      const eb = mean(solvedB.map((x) => x.evaluations));
      const ea = mean(solvedA.map((x) => x.evaluations));
      // One full evaluation (every spring cast) at each pose's solved state.
      const evalAll = (m: VehicleModel, solved: SolveResult[]) => () => {
        for (let i = 0; i < gp.length; i++) {
          m.setPose(gp[i].xM, gp[i].yM, gp[i].headingRad);
          m.setTilt(0, 0);
          m.residual(solved[i].state, true, r);
        }
      };
      const solveAll = (m: VehicleModel) => () => {
        for (const p of gp) solveEquilibrium(m, p);
      };
      const te = timePaired(evalAll(alt, solvedA), evalAll(base, solvedB), P.solve(quick ? 1 : 40));
      const ts = timePaired(solveAll(alt), solveAll(base), P.solve(quick ? 1 : 5));
      const springs = (m: VehicleModel) => m.layout.slices * m.layout.rays;
      push(
        figure(
          name,
          ratios(te.a, te.b),
          '×',
          `one full evaluation (all four tyres cast), ${what}: ${springs(alt)} vs ${springs(base)} springs per tyre (${(springs(alt) / springs(base)).toFixed(2)}×, linear growth gives that), ${gp.length} rock-garden states`,
        ),
      );
      push(figure(`${name}.solve`, ratios(ts.a, ts.b), '×', `cold solve, the same change; full evaluations per solve ${eb.toFixed(2)} → ${ea.toFixed(2)}`));
    };
    measureTyre('growth.slices.6vs3', { ...DEFAULT_TYRE_MODEL, slices: 6 }, '6 slices vs 3 (springs 2.5°)');
    measureTyre('growth.springs.1.25vs2.5deg', { ...DEFAULT_TYRE_MODEL, springSpacingRad: 1.25 * DEG }, 'springs every 1.25° vs 2.5° (3 slices)');
  }

  // --- 7. One field edited in the app (edit.ts: the candidate with the new value, then the field
  // table's checks and the cross-field rules on the SI form), on a plane and on a 1000² grid.
  if (want('edit.field.')) {
    const plane: Scenario = { ...demo, terrain: { features: [{ type: 'plane', gradeRad: 0, crossSlopeRad: 0, heightM: 0 }] } };
    const grid: Scenario = { ...demo, terrain: heightGrid(1000) };
    const spec: FieldSpec = { label: 'Mass as weighed', si: ['vehicle', 'massKg'], file: 'vehicle.mass', kind: 'mass' };
    let accepted = 0;
    const keystroke = (s: Scenario) => (k: number) => {
      // Alternate between two valid masses (a typed digit and its correction).
      const cand = withField(s, spec, s.vehicle.massKg + (k & 1), s.units);
      if (validate(cand, s.units).ok) accepted++;
    };
    const t = timePaired(keystroke(plane), keystroke(grid), P.micro(400));
    const us = (ms: number[]) => ms.map((x) => x * US_PER_MS);
    push(figure('edit.field.plane', us(t.a), 'µs', `one vehicle field edited and checked (withField + validate) on the demo with a plane; ${accepted > 0 ? 'accepted' : 'NOTHING ACCEPTED'}`));
    push(figure('edit.field.grid1000', us(t.b), 'µs', 'the same edit on the demo with a 1000² height grid (1 M heights)'));
    push(figure('edit.field.grid1000vsPlane', ratios(t.b, t.a), '×', 'edit on the 1000² grid / edit on the plane, run by run'));
  }
  if (want('ground.')) for (const f of await groundFigures(quick, log)) push(f);

  return { machine: atStart, quick, figures, settle };
}

export function report(r: BenchReport): string {
  const m = r.machine;
  const head = `Plumbline bench${r.quick ? ' (quick mode: one run each, not a measurement)' : ''} — ${m.date}, ${m.cores} cores, ${m.cpuModel}, Node ${m.node}, load average ${m.loadAverage1m} at start`;
  return `${head}\n\n${table(r.figures, TARGETS)}`;
}
