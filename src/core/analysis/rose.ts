/**
 * Stability rose: a tilt-table sweep (SAE J2180 / ISO 16333 style: raise the table slowly, note
 * the angle at which a wheel lifts and where it goes over) for downhill directions all round the
 * vehicle. Directions are in the vehicle frame, counter-clockwise from the nose: 0 nose down,
 * π/2 left side down, π tail down, 3π/2 right side down.
 *
 * Each direction's tip is the end of its stable equilibrium branch (tilt.ts), with its reason, and
 * every angle carries its datums (the table tilt, the slope from level, the tilt beyond the ground
 * here). Where the edge the vehicle goes over changes between neighbouring directions the tip
 * angle may change quickly; such directions are flagged (tipEdgeChanged), so a jump in the rose is
 * explained in the data.
 *
 * Static limits only: operating limits are far lower (common practice: makers print about 15°).
 */
import type { Pose, WheelName } from '../model/types';
import { solveEquilibrium } from '../solver/equilibrium';
import { FilledGround, filledWheelNames } from './filledGround';
import { tiltSweep, type TiltAngle, type TiltLift, type TiltSweepDetail, type TiltTip } from '../solver/tilt';
import type { VehicleModel } from '../solver/model';
import { RAD_PER_DEG as DEG } from '../scenario/units';


export interface RoseOptions {
  /** Spacing of the downhill directions (rad). @default 5° */
  readonly stepRad?: number;
  /** Coarse tilt step of each sweep (rad). @default 1° */
  readonly sweepStepRad?: number;
  /** Bisection resolution of each sweep (rad). @default 0.01° */
  readonly resolutionRad?: number;
  /** Largest tilt tried (rad). @default 89° */
  readonly maxAngleRad?: number;
  /** Ground friction coefficient (for the slide angle). @default 0.7 */
  readonly friction?: number;
  /** Called after each direction with the directions done and the total. */
  readonly onProgress?: (done: number, total: number) => void;
}

export interface RoseDirection {
  readonly downhillRad: number;
  readonly firstLift: TiltLift | null;
  readonly tip: TiltTip | null;
  readonly slide: TiltAngle | null;
  /** The tip edge differs from the previous direction's (going round; the first compares with the last). */
  readonly tipEdgeChanged: boolean;
}

export interface RoseResult {
  readonly directions: RoseDirection[];
  /** The direction with the smallest tip angle (a direction with no tip up to maxAngleRad counts as maxAngleRad). */
  readonly weakest: RoseDirection;
  /** The direction with the smallest first-lift angle (no lift counts as its tip, then maxAngleRad). */
  readonly weakestLift: RoseDirection;
  readonly maxAngleRad: number;
  readonly evaluations: number;
  /** Slope of the ground under the vehicle from level at the start of the sweeps (rad): 0 on a level table. */
  readonly groundFromLevelRad: number;
  /** Loaded wheels standing on imported ground that was filled in at the spot, before any tilt (filledGround.ts); empty when none. */
  readonly filledWheels?: readonly WheelName[];
}

function summary(r: TiltSweepDetail): RoseDirection {
  return { downhillRad: r.downhillRad, firstLift: r.firstLift, tip: r.tip, slide: r.slide, tipEdgeChanged: false };
}

/** Marks each direction whose tip edge differs from the one before it (cyclically). */
function markEdgeChanges(dirs: RoseDirection[]): RoseDirection[] {
  const key = (d: RoseDirection) => (d.tip ? d.tip.edge.join('-') : '');
  return dirs.map((d, i) => ({ ...d, tipEdgeChanged: dirs.length > 1 && key(d) !== key(dirs[(i + dirs.length - 1) % dirs.length]) }));
}

export function tipAngleOf(d: RoseDirection, maxAngleRad: number): number {
  return d.tip ? d.tip.angleRad : maxAngleRad;
}

export function liftAngleOf(d: RoseDirection, maxAngleRad: number): number {
  return d.firstLift ? d.firstLift.angleRad : tipAngleOf(d, maxAngleRad);
}

/** Tilt sweeps for every downhill direction from 0 to 2π (exclusive) at stepRad. */
export function stabilityRose(model: VehicleModel, pose: Pose, opts: RoseOptions = {}): RoseResult {
  const step = opts.stepRad ?? 5 * DEG;
  const maxAngleRad = opts.maxAngleRad ?? 89 * DEG;
  const n = Math.max(1, Math.round((2 * Math.PI) / step));
  const directions: RoseDirection[] = [];
  let evaluations = 0;
  let groundFromLevelRad = 0;
  for (let i = 0; i < n; i++) {
    const r = tiltSweep(model, pose, {
      downhillRad: (2 * Math.PI * i) / n,
      stepRad: opts.sweepStepRad,
      resolutionRad: opts.resolutionRad,
      maxAngleRad,
      friction: opts.friction,
    });
    evaluations += r.evaluations;
    groundFromLevelRad = r.startFromLevelRad;
    directions.push(summary(r));
    opts.onProgress?.(i + 1, n);
  }
  const marked = markEdgeChanges(directions);
  // The spot's tyres on filled ground: one solve on the ground as it is, only where the terrain has a filled mask.
  const filled = FilledGround.of(model.field.terrain);
  const filledWheels = filled ? filledWheelNames(filled.wheelBits(solveEquilibrium(model, pose, { friction: opts.friction }))) : [];
  return { directions: marked, ...weakestOf(marked, maxAngleRad), maxAngleRad, evaluations, groundFromLevelRad, filledWheels };
}

function weakestOf(directions: readonly RoseDirection[], maxAngleRad: number): { weakest: RoseDirection; weakestLift: RoseDirection } {
  let weakest = directions[0];
  let weakestLift = directions[0];
  for (const d of directions) {
    if (tipAngleOf(d, maxAngleRad) < tipAngleOf(weakest, maxAngleRad)) weakest = d;
    if (liftAngleOf(d, maxAngleRad) < liftAngleOf(weakestLift, maxAngleRad)) weakestLift = d;
  }
  return { weakest, weakestLift };
}

export interface CardinalLimits {
  readonly noseDown: RoseDirection;
  readonly leftDown: RoseDirection;
  readonly tailDown: RoseDirection;
  readonly rightDown: RoseDirection;
}

export type CardinalName = keyof CardinalLimits;
/** The four named directions and their downhill angle (rad). */
export const CARDINALS: readonly (readonly [name: CardinalName, downhillRad: number])[] = [
  ['noseDown', 0],
  ['leftDown', Math.PI / 2],
  ['tailDown', Math.PI],
  ['rightDown', (3 * Math.PI) / 2],
];

/** Lift and tip for nose-down (0), left-down (π/2), tail-down (π) and right-down (3π/2). */
export function cardinalLimits(model: VehicleModel, pose: Pose, opts: Omit<RoseOptions, 'stepRad' | 'onProgress'> = {}): CardinalLimits {
  const out: Partial<Record<CardinalName, RoseDirection>> = {};
  for (const [name, downhillRad] of CARDINALS) {
    out[name] = summary(
      tiltSweep(model, pose, {
        downhillRad,
        stepRad: opts.sweepStepRad,
        resolutionRad: opts.resolutionRad,
        maxAngleRad: opts.maxAngleRad,
        friction: opts.friction,
      }),
    );
  }
  return out as CardinalLimits;
}
