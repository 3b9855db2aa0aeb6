/**
 * Best line: the scenario path shifted sideways and turned, each line run as an obstacle pass,
 * ranked by its smallest force-angle margin.
 *
 * The per-line work is a pure function over plain, serialisable data (`LineSweepJob`): the Node
 * CLI spreads lines over worker threads (src/cli/parallel.ts), a browser can do the same with Web
 * Workers, and both call `createLineRunner` / `runLineSweepJob` from here.
 */
import type { PathSpec, Terrain, Tilt, Vehicle, WheelName } from '../model/types';
import { buildModel } from '../solver/equilibrium';
import { runPass, type PassResult } from './pass';

/** A range FROM:TO:STEP, both ends included when the step lands on them. */
export interface SweepRange {
  readonly from: number;
  readonly to: number;
  /** > 0; with from = to a single value. */
  readonly step: number;
}

/** One line: the path moved sideways by offsetM (left of the path's direction positive) and turned by headingChangeRad about its midpoint. */
export interface LineSpec {
  readonly index: number;
  readonly offsetM: number;
  readonly headingChangeRad: number;
  readonly path: PathSpec;
}

/** Pass options that travel with a job (plain data: no callbacks). */
export interface LinePassOptions {
  readonly friction?: number;
  readonly lightShare?: number;
  readonly tilt?: Tilt;
}

/** Everything a worker needs: plain data only (structured-clone and JSON safe, bar grid heights as typed arrays). */
export interface LineSweepJob {
  readonly vehicle: Vehicle;
  readonly terrain: Terrain;
  readonly options: LinePassOptions;
  readonly lines: readonly LineSpec[];
}

/** One line's result, small enough to send back from a worker. */
export interface LineSummary {
  readonly index: number;
  readonly offsetM: number;
  readonly headingChangeRad: number;
  readonly path: PathSpec;
  readonly stationsSolved: number;
  readonly plannedStations: number;
  readonly firstUnload: { readonly wheel: WheelName; readonly distanceM: number } | null;
  readonly firstLift: { readonly wheel: WheelName; readonly distanceM: number } | null;
  readonly tip: { readonly distanceM: number; readonly reason: string } | null;
  /** Where the body outline is inside the ground (the line cannot be driven past it); absent or null when it never is. */
  readonly hangUp?: { readonly distanceM: number; readonly part: string } | null;
  /** Smallest force-angle margin over the line (≤ 0 at a tip or a hang-up), where, and the energy margin there. */
  readonly minForceAngleRad: number;
  readonly minMarginDistanceM: number;
  readonly energyAtMinM: number;
  readonly minClearanceM: number;
  /** Whether a loaded wheel stands on imported ground that was filled in anywhere along the line (filledGround.ts); absent = no. */
  readonly onFilledGround?: boolean;
}

/** The values of a range: from, from + step, ... up to to (within a rounding tolerance). */
/** How many values rangeValues(r) gives, without building them. */
export function rangeCount(r: SweepRange): number {
  if (!(r.step > 0) || r.to < r.from) return r.from === r.to ? 1 : 0;
  return Math.floor((r.to - r.from) / r.step + 1e-9) + 1;
}

export function rangeValues(r: SweepRange): number[] {
  if (!(r.step > 0) || r.to < r.from) return r.from === r.to ? [r.from] : [];
  const n = Math.floor((r.to - r.from) / r.step + 1e-9);
  const out: number[] = [];
  for (let i = 0; i <= n; i++) out.push(r.from + i * r.step);
  return out;
}

/**
 * The lines of a sweep: every (offset, heading change) pair, offsets varying fastest. A line is
 * the path shifted to its left (of the direction from its start to its end) by the offset, then
 * turned counter-clockwise by the heading change about the (shifted) midpoint of start and end; its
 * corner points move with it, and a fixed path heading turns with it.
 */
export function makeLines(path: PathSpec, offsetsM: SweepRange, headingChangesRad: SweepRange): LineSpec[] {
  const dx = path.toM[0] - path.fromM[0];
  const dy = path.toM[1] - path.fromM[1];
  const len = Math.hypot(dx, dy) || 1;
  const lx = -dy / len;
  const ly = dx / len;
  const lines: LineSpec[] = [];
  for (const dh of rangeValues(headingChangesRad)) {
    const c = Math.cos(dh);
    const s = Math.sin(dh);
    for (const off of rangeValues(offsetsM)) {
      const mx = 0.5 * (path.fromM[0] + path.toM[0]) + off * lx;
      const my = 0.5 * (path.fromM[1] + path.toM[1]) + off * ly;
      const hx = 0.5 * dx;
      const hy = 0.5 * dy;
      const rx = c * hx - s * hy;
      const ry = s * hx + c * hy;
      // Corner points move with the line: about the chord's midpoint (cx, cy), shifted and turned.
      const cx = 0.5 * (path.fromM[0] + path.toM[0]);
      const cy = 0.5 * (path.fromM[1] + path.toM[1]);
      const via = path.viaM?.map((q) => [mx + c * (q[0] - cx) - s * (q[1] - cy), my + s * (q[0] - cx) + c * (q[1] - cy)] as const);
      lines.push({
        index: lines.length,
        offsetM: off,
        headingChangeRad: dh,
        path: {
          fromM: [mx - rx, my - ry],
          ...(via && via.length > 0 ? { viaM: via } : {}),
          toM: [mx + rx, my + ry],
          stepM: path.stepM,
          headingRad: path.headingRad === null ? null : path.headingRad + dh,
        },
      });
    }
  }
  return lines;
}

export function summariseLine(line: LineSpec, r: PassResult): LineSummary {
  return {
    index: line.index,
    offsetM: line.offsetM,
    headingChangeRad: line.headingChangeRad,
    path: line.path,
    stationsSolved: r.stations.length,
    plannedStations: r.plannedStations,
    firstUnload: r.firstUnload ? { wheel: r.firstUnload.wheel, distanceM: r.firstUnload.distanceM } : null,
    firstLift: r.firstLift ? { wheel: r.firstLift.wheel, distanceM: r.firstLift.distanceM } : null,
    tip: r.tip ? { distanceM: r.tip.distanceM, reason: r.tip.reason } : null,
    hangUp: r.hangUp ? { distanceM: r.hangUp.distanceM, part: r.hangUp.part } : null,
    // A line that hangs up cannot be driven: it ranks with the lines that tip (margin ≤ 0).
    minForceAngleRad: r.minMargin ? (r.hangUp ? Math.min(0, r.minMargin.forceAngleRad) : r.minMargin.forceAngleRad) : 0,
    minMarginDistanceM: r.minMargin ? r.minMargin.distanceM : 0,
    energyAtMinM: r.minMargin ? r.minMargin.energyM : 0,
    minClearanceM: r.minClearance ? r.minClearance.clearanceM : Infinity,
    onFilledGround: (r.filledGround?.length ?? 0) > 0,
  };
}

/** A function that runs one line on a model built once (per worker, per sweep). */
export function createLineRunner(vehicle: Vehicle, terrain: Terrain, options: LinePassOptions): (line: LineSpec) => LineSummary {
  const model = buildModel(vehicle, terrain);
  return (line) => summariseLine(line, runPass(model, line.path, options));
}

/** Runs every line of a job in turn (the pure job function). onLine is called after each line. */
export function runLineSweepJob(job: LineSweepJob, onLine?: (summary: LineSummary, done: number, total: number) => void): LineSummary[] {
  const run = createLineRunner(job.vehicle, job.terrain, job.options);
  const out: LineSummary[] = [];
  for (let i = 0; i < job.lines.length; i++) {
    const s = run(job.lines[i]);
    out.push(s);
    onLine?.(s, i + 1, job.lines.length);
  }
  return out;
}

/**
 * Resolution of the ranking (rad): lines whose smallest force-angle margins differ by no more than
 * this are tied. The margins are shown to 0.1°, and the pass samples each line at its stations only
 * (the true smallest margin lies between stations), so a difference below 0.1° says nothing about
 * which line is better.
 */
export const LINE_RANK_RESOLUTION_RAD = (0.1 * Math.PI) / 180;

/** Order of two lines: larger smallest margin first; ties by the energy margin there, then by index. */
export function compareLines(a: LineSummary, b: LineSummary): number {
  return b.minForceAngleRad - a.minForceAngleRad || b.energyAtMinM - a.energyAtMinM || a.index - b.index;
}

export interface LineRanking {
  /** Best first (within a tie: by the energy margin at the smallest force-angle, then by index). */
  readonly ranked: LineSummary[];
  /** Rank of each line in `ranked` (1 = best); tied lines share one rank (competition ranking: 1, 1, 3). */
  readonly rank: number[];
  /** For each line in `ranked`, the indices (LineSummary.index) of the other lines it is tied with. */
  readonly tiedWith: number[][];
  /** The lines grouped by rank, best group first. */
  readonly groups: LineSummary[][];
  readonly best: LineSummary;
  readonly worst: LineSummary;
  /** Whether the best (worst) line shares its rank with another. */
  readonly bestTied: boolean;
  readonly worstTied: boolean;
  /** The resolution used (rad): LINE_RANK_RESOLUTION_RAD. */
  readonly resolutionRad: number;
}

/**
 * Ranks lines by their smallest force-angle margin (a line that tips ranks at ≤ 0), only where they
 * differ by more than the resolution: a group starts at its best line and takes every following
 * line within the resolution of it. Needs ≥ 1 line.
 */
export function rankLines(summaries: readonly LineSummary[], resolutionRad = LINE_RANK_RESOLUTION_RAD): LineRanking {
  if (summaries.length === 0) throw new Error('rankLines: no lines to rank');
  const ranked = [...summaries].sort(compareLines);
  const groups: LineSummary[][] = [];
  const rank: number[] = [];
  for (let i = 0; i < ranked.length; i++) {
    const g = groups[groups.length - 1];
    if (g && g[0].minForceAngleRad - ranked[i].minForceAngleRad <= resolutionRad) {
      g.push(ranked[i]);
      rank.push(rank[i - 1]);
    } else {
      groups.push([ranked[i]]);
      rank.push(i + 1);
    }
  }
  const groupOf = new Map<number, LineSummary[]>();
  for (const g of groups) for (const l of g) groupOf.set(l.index, g);
  const tiedWith = ranked.map((l) => groupOf.get(l.index)!.filter((o) => o !== l).map((o) => o.index));
  return {
    ranked,
    rank,
    tiedWith,
    groups,
    best: ranked[0],
    worst: ranked[ranked.length - 1],
    bestTied: groups[0].length > 1,
    worstTied: groups[groups.length - 1].length > 1,
    resolutionRad,
  };
}

/** In-process sweep: makes the lines, runs them, ranks them. */
export function sweepLines(
  vehicle: Vehicle,
  terrain: Terrain,
  path: PathSpec,
  offsetsM: SweepRange,
  headingChangesRad: SweepRange,
  options: LinePassOptions = {},
  onProgress?: (done: number, total: number) => void,
): LineRanking {
  const lines = makeLines(path, offsetsM, headingChangesRad);
  const summaries = runLineSweepJob({ vehicle, terrain, options, lines }, (_s, done, total) => onProgress?.(done, total));
  return rankLines(summaries);
}
