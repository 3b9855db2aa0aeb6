/**
 * Obstacle pass: the vehicle crawls along a path (so slowly that each station is a static pose),
 * each station's equilibrium warm-started from the last. Per station: wheel loads and shares,
 * travel used, lifts, friction demand, body attitude, margins, underbody clearance. From the
 * stations: events with the stations where they start and end, and the headline answer (which
 * wheel unloads first and where, the first lift, the tip, the smallest margin).
 *
 * Results are quasi-static estimates: no speed, no bounce, no driver input. Real margins are smaller.
 */
import type { PathSpec, Pose, SolveResult, SolveStatus, Tilt, WheelName, WheelResult } from '../model/types';
import { WHEEL_NAMES } from '../model/types';
import { DEFAULT_FRICTION, DEFAULT_MAX_ITERATIONS, solveEquilibrium } from '../solver/equilibrium';
import type { VehicleModel } from '../solver/model';
import { DEFAULT_CLEARANCE_GRID, UNDERBODY_PARTS, UnderbodySampler, type ClearanceGrid, type UnderbodyPart } from './clearance';
import { PathWalker, pathLengthM } from './pathGeometry';
import { FilledGround, filledGroundSpans, filledWheelNames, type FilledGroundSpan } from './filledGround';

/** Share of a wheel's level-ground load below which it counts as light. @default 0.25 */
export const DEFAULT_LIGHT_SHARE = 0.25;
/** Travel fraction counted as at the stop: |fraction| ≥ 1 − this (the stops are stiff, not rigid). */
export const STOP_FRACTION_TOLERANCE = 1e-3;
/** A station that fails is retried with this many times the iteration cap before it counts as a tip. */
const RETRY_ITERATION_FACTOR = 4;
/** Largest residual, as a share of the weight, for a station kept as approximate (see nearlyStanding). */
export const APPROXIMATE_RESIDUAL_SHARE = 1e-3;

export interface PassOptions {
  /** Ground friction coefficient. @default 0.7 */
  readonly friction?: number;
  /** A wheel is light below this share of its level-ground load. @default 0.25 */
  readonly lightShare?: number;
  /** Tilt-table setting applied throughout (e.g. the whole site on a slope). @default none */
  readonly tilt?: Tilt;
  /** Underside sample grid. @default DEFAULT_CLEARANCE_GRID */
  readonly clearanceGrid?: ClearanceGrid;
  /** Called after each station with the stations done and the total planned. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Newton iteration cap per station. @default the solver's */
  readonly maxIterations?: number;
  /** Called with each station and the full solve it was made from (for drawing the vehicle there). */
  readonly onStation?: (station: PassStation, result: SolveResult) => void;
  /**
   * Length over which the heading turns at each corner of a polyline path (m), centred on the corner
   * (see pathGeometry.ts). @default the vehicle's wheelbase
   */
  readonly cornerBlendM?: number;
}

export interface PassWheel {
  readonly loadN: number;
  /** loadN / the wheel's level-ground load. */
  readonly loadShare: number;
  /** +1 full bump, −1 full droop. */
  readonly travelFraction: number;
  readonly lifted: boolean;
  /** Friction coefficient the wheel needs (0 when lifted). */
  readonly frictionDemand: number;
}

export interface PassStation {
  /** Station number, 0 at path.fromM. */
  readonly index: number;
  /** Distance along the path from path.fromM, along its legs (m). */
  readonly distanceM: number;
  readonly pose: Pose;
  readonly status: SolveStatus;
  /** True when the solve stopped short of its tolerance but balances to within 0.1 % of the weight (see APPROXIMATE_RESIDUAL_SHARE). */
  readonly approximate: boolean;
  readonly wheels: readonly [PassWheel, PassWheel, PassWheel, PassWheel];
  /** Body roll and pitch relative to true level (rad, ISO 8855 signs: roll + right side down, pitch + nose down). */
  readonly rollRad: number;
  readonly pitchRad: number;
  readonly forceAngleRad: number;
  readonly energyM: number;
  /** Smallest underbody gap (m; ≤ 0 contact), where (terrain frame) and on which part. */
  readonly clearanceM: number;
  readonly clearancePointWorld: readonly [number, number, number];
  readonly clearancePart: UnderbodyPart;
  /**
   * True at the station where the body outline is inside the ground by more than HANG_UP_DEPTH_M:
   * the vehicle hangs up there (a hard stop; the pass ends). Its solve ignores the body, so its loads
   * are not a state the vehicle can be in and are never shown as standing.
   */
  readonly hungUp: boolean;
  /** Loaded wheels whose contact stands on imported ground that was filled in (filledGround.ts); empty when none. */
  readonly filledWheels?: readonly WheelName[];
}

/**
 * Depth of the body outline inside the ground from which the vehicle hangs up (m). Below it the
 * body touches ('contact'): the outline is a box sampled on a grid, so it cannot tell a graze from
 * a touch at finer than about a centimetre (our own choice of resolution, not a published figure).
 */
export const HANG_UP_DEPTH_M = 0.01;

/**
 * light, lifted, full-bump, full-droop: a wheel's state. slide: the wheel needs more grip than the
 * ground gives (it slips; the vehicle cannot climb there without slipping). contact: the body outline
 * touches the ground. hang-up: the body outline is inside the ground (the pass stops). tip: no balance.
 */
export type PassEventKind = 'light' | 'lifted' | 'full-bump' | 'full-droop' | 'slide' | 'contact' | 'hang-up' | 'tip';

export interface PassEvent {
  readonly kind: PassEventKind;
  /** The wheel, for wheel events; null otherwise. */
  readonly wheel: WheelName | null;
  /** The underbody part, for contact events; null otherwise. */
  readonly part: UnderbodyPart | null;
  /** First station where it holds. */
  readonly startStation: number;
  readonly startDistanceM: number;
  /** Last station where it holds; null when it still holds at the last standing station (the end of the path, or the tip). */
  readonly endStation: number | null;
  readonly endDistanceM: number | null;
}

export interface PassResult {
  readonly path: PathSpec;
  /** Stations planned (from → to at the step, the end included). */
  readonly plannedStations: number;
  /** Stations solved; the last is the tip station when the pass stopped. */
  readonly stations: PassStation[];
  readonly events: PassEvent[];
  /** First wheel to go light (below lightShare), and where. */
  readonly firstUnload: { readonly wheel: WheelName; readonly station: number; readonly distanceM: number } | null;
  readonly firstLift: { readonly wheel: WheelName; readonly station: number; readonly distanceM: number } | null;
  /** Where the body outline is inside the ground (belly, bumper or axle on a rock or ledge): the pass stops there. */
  readonly hangUp: { readonly station: number; readonly distanceM: number; readonly part: UnderbodyPart; readonly depthM: number } | null;
  /** First station where a wheel needs more grip than the ground gives: the wheel, its demand and where. */
  readonly firstSlide: { readonly wheel: WheelName; readonly station: number; readonly distanceM: number; readonly frictionDemand: number } | null;
  /** Where no equilibrium remains (or the margin goes negative): the pass stops there. */
  readonly tip: { readonly station: number; readonly distanceM: number; readonly status: SolveStatus; readonly reason: string } | null;
  /** Station of the smallest force-angle margin, its value and the energy margin there (a tip counts, at ≤ 0). */
  readonly minMargin: { readonly station: number; readonly distanceM: number; readonly forceAngleRad: number; readonly energyM: number } | null;
  /** Smallest underbody clearance over the pass. */
  readonly minClearance: { readonly station: number; readonly distanceM: number; readonly clearanceM: number; readonly part: UnderbodyPart } | null;
  readonly lightShare: number;
  readonly friction: number;
  /** Stations kept as approximate (solver short of its tolerance, residual under 0.1 % of the weight). */
  readonly approximateStations: number;
  /** Full equilibrium evaluations used. */
  readonly evaluations: number;
  /** Where a loaded wheel stands on filled ground (no data there: its load rests on a guessed height), per wheel; empty when never. */
  readonly filledGround?: readonly FilledGroundSpan[];
}

/** Number of stations from → to (along every leg) at the step, both ends included (the last may be short). */
export function stationCount(path: PathSpec): number {
  const d = pathLengthM(path);
  const n = Math.floor(d / path.stepM + 1e-9);
  return d - n * path.stepM > 1e-9 * Math.max(1, d) ? n + 2 : n + 1;
}

const K_LIGHT = 0, K_LIFT = 1, K_BUMP = 2, K_DROOP = 3, K_FRICTION = 4;
const WHEEL_KINDS: readonly PassEventKind[] = ['light', 'lifted', 'full-bump', 'full-droop', 'slide'];

function standing(r: SolveResult): boolean {
  return r.status === 'converged' && r.margins.forceAngleRad >= 0;
}

/**
 * A solve that stopped short of the tolerance but whose state balances the vehicle to within
 * APPROXIMATE_RESIDUAL_SHARE of its weight (and weight × wheelbase), with the plumb line inside the
 * support: a numerical miss (a tyre on a ledge's edge), not a tip. Kept as an approximate station.
 */
function nearlyStanding(r: SolveResult, wheelbaseM: number): boolean {
  return (
    r.status === 'not-converged' &&
    r.margins.forceAngleRad > 0 &&
    r.residualN <= APPROXIMATE_RESIDUAL_SHARE * r.weightN &&
    r.residualNm <= APPROXIMATE_RESIDUAL_SHARE * r.weightN * wheelbaseM
  );
}

/**
 * Runs the pass. The vehicle's reference point (ground, midway between the axles) moves from
 * path.fromM through path.viaM to path.toM; its heading is path.headingRad or, when null, along the
 * leg it is on, turning over `cornerBlendM` at each corner (pathGeometry.ts).
 * At each station the solve is warm-started from the last (a speed-up: the solver returns the
 * station's own answer); if that fails it is retried with a higher iteration cap before the station counts as a tip. Allocates the per-station results only.
 */
export function runPass(model: VehicleModel, path: PathSpec, opts: PassOptions = {}): PassResult {
  const friction = opts.friction ?? DEFAULT_FRICTION;
  const lightShare = opts.lightShare ?? DEFAULT_LIGHT_SHARE;
  const sampler = new UnderbodySampler(model.vehicle, opts.clearanceGrid ?? DEFAULT_CLEARANCE_GRID);
  const walker = new PathWalker(path, opts.cornerBlendM ?? model.wheelbaseM);
  const length = walker.lengthM;
  const total = stationCount(path);
  const solveOpts = { tilt: opts.tilt, friction, maxIterations: opts.maxIterations, warmStart: null as Float64Array | null };
  const retryIterations = RETRY_ITERATION_FACTOR * (opts.maxIterations ?? DEFAULT_MAX_ITERATIONS);

  const stations: PassStation[] = [];
  const events: PassEvent[] = [];
  // Open events: start station per (kind, wheel), per underbody part; -1 when closed.
  const openWheel = new Int32Array(WHEEL_KINDS.length * 4).fill(-1);
  const openPart = new Int32Array(UNDERBODY_PARTS.length).fill(-1);
  const distanceOf = (i: number): number => Math.min(i * path.stepM, length);
  const close = (kind: PassEventKind, wheel: WheelName | null, part: UnderbodyPart | null, start: number, end: number | null) => {
    events.push({
      kind,
      wheel,
      part,
      startStation: start,
      startDistanceM: distanceOf(start),
      endStation: end,
      endDistanceM: end === null ? null : distanceOf(end),
    });
  };

  let firstUnload: PassResult['firstUnload'] = null;
  let firstLift: PassResult['firstLift'] = null;
  let tip: PassResult['tip'] = null;
  let hangUp: PassResult['hangUp'] = null;
  let firstSlide: PassResult['firstSlide'] = null;
  let minMargin: PassResult['minMargin'] = null;
  let minClearance: PassResult['minClearance'] = null;
  let evaluations = 0;
  let approximateStations = 0;
  let warm: Float64Array | null = null;
  const filled = FilledGround.of(model.field.terrain);
  const filledBits: number[] = [];

  for (let i = 0; i < total; i++) {
    const s = distanceOf(i);
    walker.at(s);
    const pose: Pose = { xM: walker.xM, yM: walker.yM, headingRad: walker.headingRad };
    solveOpts.warmStart = warm;
    let r = solveEquilibrium(model, pose, solveOpts);
    evaluations += r.evaluations;
    if (!standing(r)) {
      // Hard poses (a tyre on a ledge face) can need more Newton steps (the solver itself falls back
      // from the warm start to its reference start).
      solveOpts.maxIterations = retryIterations;
      const again = solveEquilibrium(model, pose, solveOpts);
      evaluations += again.evaluations;
      if (standing(again)) r = again;
      solveOpts.maxIterations = opts.maxIterations;
    }
    const approximate = !standing(r) && nearlyStanding(r, model.wheelbaseM);
    const ok = approximate || standing(r);
    if (approximate) approximateStations++;
    const clearance = sampler.measure(model.field, r, pose.xM, pose.yM, pose.headingRad);
    const hungUp = ok && clearance.minM < -HANG_UP_DEPTH_M;
    const w = r.wheels;
    const fBits = filled ? filled.wheelBits(r) : 0;
    filledBits.push(fBits);
    const station: PassStation = {
      index: i,
      distanceM: s,
      pose,
      status: r.status,
      approximate,
      wheels: [passWheel(w[0]), passWheel(w[1]), passWheel(w[2]), passWheel(w[3])],
      rollRad: r.body.rollToLevelRad,
      pitchRad: r.body.pitchToLevelRad,
      forceAngleRad: r.margins.forceAngleRad,
      energyM: r.margins.energyM,
      clearanceM: clearance.minM,
      clearancePointWorld: clearance.pointWorld,
      clearancePart: clearance.part,
      hungUp,
      filledWheels: filledWheelNames(fBits),
    };
    stations.push(station);
    opts.onStation?.(station, r);

    if (!ok) {
      // The tip: its margin counts as at most zero (no equilibrium is no margin at all).
      const fa = Math.min(0, r.margins.forceAngleRad);
      const en = Math.min(0, r.margins.energyM);
      if (minMargin === null || fa <= minMargin.forceAngleRad) minMargin = { station: i, distanceM: s, forceAngleRad: fa, energyM: en };
      tip = {
        station: i,
        distanceM: s,
        status: r.status,
        reason: r.status === 'converged' ? 'the plumb line from the CG left the support of the loaded tyres' : r.reason,
      };
      close('tip', null, null, i, null);
      opts.onProgress?.(i + 1, total);
      break;
    }
    if (minClearance === null || clearance.minM < minClearance.clearanceM) {
      minClearance = { station: i, distanceM: s, clearanceM: clearance.minM, part: clearance.part };
    }
    if (hungUp) {
      // A hard stop: the body is inside the ground, so the vehicle cannot stand here or go on.
      hangUp = { station: i, distanceM: s, part: clearance.part, depthM: -clearance.minM };
      close('hang-up', null, clearance.part, i, null);
      opts.onProgress?.(i + 1, total);
      break;
    }
    warm = r.state;

    if (minMargin === null || r.margins.forceAngleRad < minMargin.forceAngleRad) {
      minMargin = { station: i, distanceM: s, forceAngleRad: r.margins.forceAngleRad, energyM: r.margins.energyM };
    }

    for (let k = 0; k < 4; k++) {
      const wk = w[k];
      for (let e = 0; e < WHEEL_KINDS.length; e++) {
        let on: boolean;
        switch (e) {
          case K_LIGHT: on = wk.lifted || (wk.loadShare ?? 0) < lightShare; break;
          case K_LIFT: on = wk.lifted; break;
          case K_BUMP: on = (wk.travelFraction ?? 0) >= 1 - STOP_FRACTION_TOLERANCE; break;
          case K_DROOP: on = (wk.travelFraction ?? 0) <= -1 + STOP_FRACTION_TOLERANCE; break;
          case K_FRICTION: on = !wk.lifted && (wk.frictionDemand ?? 0) > friction; break;
          default: on = false;
        }
        const slot = e * 4 + k;
        if (on && openWheel[slot] < 0) {
          openWheel[slot] = i;
          if (e === K_LIGHT && firstUnload === null) firstUnload = { wheel: WHEEL_NAMES[k], station: i, distanceM: s };
          if (e === K_LIFT && firstLift === null) firstLift = { wheel: WHEEL_NAMES[k], station: i, distanceM: s };
          if (e === K_FRICTION && firstSlide === null) firstSlide = { wheel: WHEEL_NAMES[k], station: i, distanceM: s, frictionDemand: wk.frictionDemand ?? 0 };
        } else if (!on && openWheel[slot] >= 0) {
          close(WHEEL_KINDS[e], WHEEL_NAMES[k], null, openWheel[slot], i - 1);
          openWheel[slot] = -1;
        }
      }
    }
    // Underbody contact, per part.
    for (let p = 0; p < UNDERBODY_PARTS.length; p++) {
      const on = sampler.partMinM[p] <= 0;
      if (on && openPart[p] < 0) openPart[p] = i;
      else if (!on && openPart[p] >= 0) {
        close('contact', null, UNDERBODY_PARTS[p], openPart[p], i - 1);
        openPart[p] = -1;
      }
    }
    opts.onProgress?.(i + 1, total);
  }
  // Still open at the end of the pass or at the tip: end = null.
  for (let e = 0; e < WHEEL_KINDS.length; e++) {
    for (let k = 0; k < 4; k++) {
      const start = openWheel[e * 4 + k];
      if (start >= 0) close(WHEEL_KINDS[e], WHEEL_NAMES[k], null, start, null);
    }
  }
  for (let p = 0; p < UNDERBODY_PARTS.length; p++) {
    if (openPart[p] >= 0) close('contact', null, UNDERBODY_PARTS[p], openPart[p], null);
  }
  events.sort((a, b) => a.startStation - b.startStation || kindOrder(a.kind) - kindOrder(b.kind));
  const filledGround = filledGroundSpans(filledBits, stations.map((st) => st.distanceM));
  return { path, plannedStations: total, stations, events, firstUnload, firstLift, hangUp, firstSlide, tip, minMargin, minClearance, lightShare, friction, approximateStations, evaluations, filledGround };
}

function passWheel(w: WheelResult): PassWheel {
  return { loadN: (w.loadN ?? 0), loadShare: (w.loadShare ?? 0), travelFraction: (w.travelFraction ?? 0), lifted: w.lifted, frictionDemand: (w.frictionDemand ?? 0) };
}

function kindOrder(k: PassEventKind): number {
  return ['light', 'lifted', 'full-bump', 'full-droop', 'slide', 'contact', 'hang-up', 'tip'].indexOf(k);
}

/** How a pass ends, in order of what stops it: a tip, a hang-up, a slide (the pass goes on past it, assuming the grip is found), or it stands. */
export type PassOutcome =
  | { readonly kind: 'tips'; readonly distanceM: number; readonly reason: string }
  | { readonly kind: 'hangs-up'; readonly distanceM: number; readonly part: UnderbodyPart; readonly depthM: number }
  | { readonly kind: 'slides'; readonly distanceM: number; readonly wheel: WheelName; readonly frictionDemand: number; readonly friction: number }
  | { readonly kind: 'stands' };

/** The outcome the headline leads with. "stands" only when the pass has no tip, no hang-up and no slide. */
export function passOutcome(r: PassResult): PassOutcome {
  if (r.tip) return { kind: 'tips', distanceM: r.tip.distanceM, reason: r.tip.reason };
  if (r.hangUp) return { kind: 'hangs-up', distanceM: r.hangUp.distanceM, part: r.hangUp.part, depthM: r.hangUp.depthM };
  if (r.firstSlide) return { kind: 'slides', distanceM: r.firstSlide.distanceM, wheel: r.firstSlide.wheel, frictionDemand: r.firstSlide.frictionDemand, friction: r.friction };
  return { kind: 'stands' };
}

/** The underbody parts in words. */
export const UNDERBODY_PART_WORDS: Readonly<Record<UnderbodyPart, string>> = {
  belly: 'belly',
  front: 'front bumper',
  rear: 'rear bumper',
  'front-axle': 'front axle',
  'rear-axle': 'rear axle',
};

