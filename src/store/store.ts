/**
 * The app's one store (zustand/vanilla, usable without React): the scenario in SI, the display
 * units, the latest solve and a few actions that call the pure core. Nothing here does mechanics.
 */
import { createStore, type StoreApi } from 'zustand/vanilla';
import {
  buildModel,
  decodeScenarioBytes,
  fileSizeProblem,
  readScenarioJson,
  parseScenario,
  solveEquilibrium,
  tiltSweep,
  type PathSpec,
  type Pose,
  type Scenario,
  type ScenarioError,
  type SolveResult,
  type Tilt,
  type TiltSweepResult,
  type UnitSystem,
  type Vehicle,
  type VehicleModel,
} from '../core';

/** Most edits kept for undo. */
export const HISTORY_LIMIT = 100;
/** Edits of one field closer together than this merge into one undo step (ms). */
export const EDIT_MERGE_MS = 1500;

export interface SweepState {
  /** The scenario the sweep was run for (stale when it differs from the current one). */
  readonly scenario: Scenario;
  readonly result: TiltSweepResult;
  readonly wallMs: number;
}

/**
 * A pose drawn in the scene in place of (or beside) the scenario's own: a pass station, or a
 * build from the comparison. It is a view only: the scenario is not changed, and the next edit
 * of the scenario ends it.
 */
export interface ShownPose {
  /** What is shown, in words (e.g. "pass station 68 (3.40 m)"). */
  readonly label: string;
  readonly kind: 'pass' | 'build';
  readonly vehicle: Vehicle;
  /** The model the result was solved on (geometry for the view). */
  readonly model: VehicleModel;
  readonly pose: Pose;
  readonly result: SolveResult;
}

export interface PlumbState {
  readonly scenario: Scenario;
  /** Display units only; the scenario stays SI and is never rounded for display. */
  readonly units: UnitSystem;
  readonly result: SolveResult;
  /** The core model the result was solved on (read-only for views: geometry, masses). */
  readonly model: VehicleModel;
  /** Wall time of the last solve (ms). */
  readonly solveMs: number;
  /** Errors of the last import that failed validation (the scenario was kept); null when none. */
  readonly importErrors: readonly ScenarioError[] | null;
  readonly importWarnings: readonly string[];
  readonly sweep: SweepState | null;
  readonly past: readonly Scenario[];
  readonly future: readonly Scenario[];
  /**
   * Drawn in place of the scenario pose (scene, wheel labels, load table); null: the scenario
   * itself. A pass station ends with the next edit; a build follows moves and ends with a vehicle edit.
   */
  readonly shown: ShownPose | null;
  /** A second build drawn as an outline at the scenario pose (follows moves; ends when the vehicle is edited). */
  readonly ghost: ShownPose | null;
  /** A line drawn on the terrain (e.g. the line chosen from a sweep); null: none. */
  readonly overlayPath: PathSpec | null;

  /** Move and/or turn the vehicle. record=false for the steps of a drag (one undo step per drag: call commitDrag at the end). */
  setPose(pose: Partial<Pose>, record?: boolean): void;
  /** Record the pose before a drag so the whole drag undoes in one step. */
  beginDrag(): void;
  endDrag(): void;
  setTilt(tilt: Partial<Tilt>): void;
  setUnits(units: UnitSystem): void;
  /** Replace the whole scenario (an edit; undoable). */
  replaceScenario(scenario: Scenario): void;
  /**
   * An edit from a form field: like replaceScenario, but keystrokes in the same field within
   * EDIT_MERGE_MS make one undo step.
   */
  editScenario(scenario: Scenario, fieldKey: string): void;
  /** Validate and load a scenario file's data; on failure keep the current scenario and set importErrors. */
  importData(data: unknown): boolean;
  /** Open a scenario file's text or bytes; `sizeBytes` (the file's size) is checked before anything is read. */
  importText(text: string | Uint8Array, sizeBytes?: number): boolean;
  clearImportErrors(): void;
  /** Tilt sweep about the current downhill direction, from level. */
  runTiltSweep(): TiltSweepResult;
  undo(): void;
  redo(): void;
  /** Show a solved pose of the scenario's own vehicle (a pass station) in place of the scenario pose. */
  showStation(label: string, pose: Pose, result: SolveResult): void;
  /**
   * Solve another vehicle (a build) at the scenario pose on the scenario terrain and show it:
   * 'alone' in place of the scenario's vehicle, 'ghost' as an outline beside it.
   */
  showBuild(vehicle: Vehicle, label: string, as: 'alone' | 'ghost'): SolveResult;
  /** Back to the scenario's own vehicle and pose (and no outline when ghostToo). */
  clearShown(ghostToo?: boolean): void;
  setOverlayPath(path: PathSpec | null): void;
}

export type PlumbStore = StoreApi<PlumbState>;

/** Holds the vehicle model for the current vehicle and terrain; rebuilt only when they change. */
interface ModelCache {
  model: VehicleModel | null;
  vehicle: Scenario['vehicle'] | null;
  terrain: Scenario['terrain'] | null;
}

function modelFor(cache: ModelCache, s: Scenario): VehicleModel {
  if (cache.model && cache.vehicle === s.vehicle) {
    if (cache.terrain !== s.terrain) {
      cache.model.setTerrain(s.terrain);
      cache.terrain = s.terrain;
    }
    return cache.model;
  }
  cache.model = buildModel(s.vehicle, s.terrain);
  cache.vehicle = s.vehicle;
  cache.terrain = s.terrain;
  return cache.model;
}

const now = (): number => (typeof performance !== 'undefined' ? performance.now() : Date.now());

export function createPlumbStore(initial: Scenario, units: UnitSystem = initial.units): PlumbStore {
  const cache: ModelCache = { model: null, vehicle: null, terrain: null };
  let dragStart: Scenario | null = null;
  let lastEdit = { key: '', atMs: -Infinity };

  /** Solve s, warm-started from prev when the vehicle is the same. */
  const solve = (s: Scenario, prev: SolveResult | null, prevScenario: Scenario | null): { result: SolveResult; solveMs: number } => {
    const t0 = now();
    const sameVehicle = prevScenario !== null && prevScenario.vehicle === s.vehicle;
    const model = modelFor(cache, s);
    // The warm start is only a speed-up: the solver returns the scenario's own answer either way.
    const warm = sameVehicle && prev && prev.standing ? prev.state : null;
    const result = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction, warmStart: warm });
    return { result, solveMs: now() - t0 };
  };

  const first = solve(initial, null, null);

  /** Models of other vehicles (builds), by vehicle object. */
  const otherModels = new Map<Vehicle, { model: VehicleModel; terrain: Scenario['terrain'] }>();
  const modelOf = (v: Vehicle, terrain: Scenario['terrain']): VehicleModel => {
    const m = otherModels.get(v);
    if (!m) {
      if (otherModels.size > 8) otherModels.clear();
      const model = buildModel(v, terrain);
      otherModels.set(v, { model, terrain });
      return model;
    }
    if (m.terrain !== terrain) {
      m.model.setTerrain(terrain);
      m.terrain = terrain;
    }
    return m.model;
  };
  /** Another vehicle at the scenario pose (warm from prev when given and converged). */
  const solveOther = (v: Vehicle, s: Scenario, prev: SolveResult | null): { model: VehicleModel; result: SolveResult } => {
    const model = modelOf(v, s.terrain);
    const warm = prev && prev.standing ? prev.state : null;
    const result = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction, warmStart: warm });
    return { model, result };
  };
  /** A build shown after a change of scenario: it follows the pose and terrain, and ends with a vehicle edit. */
  const ghostFor = (ghost: ShownPose | null, prev: Scenario, next: Scenario): ShownPose | null => {
    if (!ghost || ghost.kind !== 'build' || next.vehicle !== prev.vehicle) return null;
    const { model, result } = solveOther(ghost.vehicle, next, ghost.result);
    return { ...ghost, model, pose: next.pose, result };
  };

  return createStore<PlumbState>()((set, get) => {
    /** Apply a new scenario: solve and set; record pushes the old one on the undo stack. */
    const apply = (next: Scenario, record: boolean): void => {
      const st = get();
      if (next === st.scenario) return;
      const { result, solveMs } = solve(next, st.result, st.scenario);
      const past = record ? [...st.past, st.scenario].slice(-HISTORY_LIMIT) : st.past;
      set({
        scenario: next,
        result,
        solveMs,
        past,
        future: record ? [] : st.future,
        model: cache.model as VehicleModel,
        shown: ghostFor(st.shown, st.scenario, next),
        ghost: ghostFor(st.ghost, st.scenario, next),
      });
    };

    return {
      scenario: initial,
      units,
      result: first.result,
      model: cache.model as VehicleModel,
      solveMs: first.solveMs,
      importErrors: null,
      importWarnings: [],
      sweep: null,
      past: [],
      future: [],
      shown: null,
      ghost: null,
      overlayPath: null,

      setPose(pose, record = true) {
        const s = get().scenario;
        const p = { ...s.pose, ...pose };
        if (p.xM === s.pose.xM && p.yM === s.pose.yM && p.headingRad === s.pose.headingRad) return;
        apply({ ...s, pose: p }, record && dragStart === null);
      },
      beginDrag() {
        dragStart = get().scenario;
      },
      endDrag() {
        const start = dragStart;
        dragStart = null;
        const st = get();
        if (start && start !== st.scenario) {
          set({ past: [...st.past, start].slice(-HISTORY_LIMIT), future: [] });
        }
      },
      setTilt(tilt) {
        const s = get().scenario;
        const t = { ...s.tilt, ...tilt };
        if (t.angleRad === s.tilt.angleRad && t.downhillRad === s.tilt.downhillRad) return;
        apply({ ...s, tilt: t }, true);
      },
      setUnits(u) {
        set({ units: u });
      },
      replaceScenario(scenario) {
        lastEdit = { key: '', atMs: -Infinity };
        apply(scenario, true);
      },
      editScenario(scenario, fieldKey) {
        const t = now();
        const merge = fieldKey === lastEdit.key && t - lastEdit.atMs < EDIT_MERGE_MS && get().past.length > 0;
        lastEdit = { key: fieldKey, atMs: t };
        apply(scenario, !merge);
      },
      importData(data) {
        const parsed = parseScenario(data);
        if (!parsed.ok) {
          set({ importErrors: parsed.errors, importWarnings: [] });
          return false;
        }
        apply(parsed.scenario, true);
        // The app shows a file in its own units (the user can switch after).
        set({ importErrors: null, importWarnings: parsed.warnings, sweep: null, units: parsed.scenario.units });
        return true;
      },
      importText(text, sizeBytes) {
        // The same reading rules as the CLI (core/scenario/read.ts): size from the file size before
        // reading, the encoding from the bytes, duplicate keys and oversized grids before JSON.parse.
        const tooBig = sizeBytes === undefined ? null : fileSizeProblem(sizeBytes);
        const decoded = tooBig ? null : typeof text === 'string' ? ({ ok: true, value: text } as const) : decodeScenarioBytes(text);
        const read = tooBig ? null : decoded!.ok ? readScenarioJson(decoded!.value) : decoded!;
        if (!read || !read.ok) {
          set({ importErrors: read ? read.errors : [{ path: '(file)', message: tooBig! }], importWarnings: [] });
          return false;
        }
        return get().importData(read.value);
      },
      clearImportErrors() {
        set({ importErrors: null });
      },
      runTiltSweep() {
        const s = get().scenario;
        const t0 = now();
        const model = modelFor(cache, s);
        const result = tiltSweep(model, s.pose, { downhillRad: s.tilt.downhillRad, friction: s.friction });
        set({ sweep: { scenario: s, result, wallMs: now() - t0 } });
        return result;
      },
      undo() {
        const st = get();
        if (st.past.length === 0) return;
        const prev = st.past[st.past.length - 1];
        const { result, solveMs } = solve(prev, st.result, st.scenario);
        set({
          scenario: prev,
          result,
          solveMs,
          model: cache.model as VehicleModel,
          past: st.past.slice(0, -1),
          future: [st.scenario, ...st.future],
          shown: ghostFor(st.shown, st.scenario, prev),
          ghost: ghostFor(st.ghost, st.scenario, prev),
        });
      },
      redo() {
        const st = get();
        if (st.future.length === 0) return;
        const next = st.future[0];
        const { result, solveMs } = solve(next, st.result, st.scenario);
        set({
          scenario: next,
          result,
          solveMs,
          model: cache.model as VehicleModel,
          past: [...st.past, st.scenario].slice(-HISTORY_LIMIT),
          future: st.future.slice(1),
          shown: ghostFor(st.shown, st.scenario, next),
          ghost: ghostFor(st.ghost, st.scenario, next),
        });
      },
      showStation(label, pose, result) {
        const st = get();
        set({ shown: { label, kind: 'pass', vehicle: st.scenario.vehicle, model: st.model, pose, result } });
      },
      showBuild(vehicle, label, as) {
        const st = get();
        const prev = as === 'ghost' ? st.ghost : st.shown?.kind === 'build' ? st.shown : null;
        const { model, result } = solveOther(vehicle, st.scenario, prev && prev.vehicle === vehicle ? prev.result : null);
        const shown: ShownPose = { label, kind: 'build', vehicle, model, pose: st.scenario.pose, result };
        set(as === 'ghost' ? { ghost: shown } : { shown });
        return result;
      },
      clearShown(ghostToo = false) {
        set(ghostToo ? { shown: null, ghost: null } : { shown: null });
      },
      setOverlayPath(path) {
        set({ overlayPath: path });
      },
    };
  });
}

/** What the scene draws: the shown pose when there is one, else the scenario's (views read through these). */
export const shownResult = (s: PlumbState): SolveResult => s.shown?.result ?? s.result;
export const shownPose = (s: PlumbState): Pose => s.shown?.pose ?? s.scenario.pose;
export const shownVehicle = (s: PlumbState): Vehicle => s.shown?.vehicle ?? s.scenario.vehicle;
export const shownModel = (s: PlumbState): VehicleModel => s.shown?.model ?? s.model;
