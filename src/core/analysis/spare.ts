/**
 * Slope to spare: the headline margins, in degrees that mean what they say. From the pose as it
 * stands on its ground, how much more tilt it takes before the first wheel lifts and before it goes
 * over, in the weakest direction and the four named ones (nose down, left side down, tail down,
 * right side down), taken from the tilt sweeps of a stability rose on the scenario's ground (each
 * sweep the end of its stable equilibrium branch, tilt.ts).
 *
 * Every angle states its datum in the data:
 * - `...BeyondGroundRad`: the extra tilt beyond the ground as it lies here ("more than the ground
 *   here"): what is left to spare;
 * - `...FromLevelRad`: the slope of the ground under the vehicle from level at which it happens.
 * On a level table the two are the same angle.
 *
 * The published stability measures (force-angle, energy, static margins) are not slopes to spare:
 * a force-angle margin of 28° does not mean 28° more tilt. They stay as details (see MEASURE_NOTES).
 *
 * Quasi-static estimates: real margins are smaller (bumps, motion, soft ground); keep to the
 * vehicle maker's limits, local rules and trained practice.
 */
import type { Pose, StabilityMargins, WheelName } from '../model/types';
import type { VehicleModel } from '../solver/model';
import type { TipReason } from '../solver/tilt';
import { CARDINALS, stabilityRose, type CardinalName, type RoseDirection, type RoseOptions, type RoseResult } from './rose';

/** The datum of every `...BeyondGroundRad` value, as words for the faces. */
export const SPARE_DATUM = 'more than the ground here';

/** One plain line on what each published measure measures (for the details). */
export const MEASURE_NOTES = {
  forceAngle:
    'force-angle (Papadopoulos & Rey 1996): the angle between gravity through the CG and the nearest tip axis; not a slope to spare',
  energy: 'energy margin (Messuri & Klein 1985): how far the CG must rise to go over the weakest edge (m)',
  static: 'static margin (McGhee & Frank 1968): the level distance from the plumb point to the nearest support edge (m)',
} as const;

export interface SpareDirection {
  readonly downhillRad: number;
  /** Extra tilt to the first wheel lift, more than the ground here (rad); the tip's when no wheel lifts first. Null: neither up to the sweep's end. */
  readonly toLiftBeyondGroundRad: number | null;
  /** Extra tilt to the tip, more than the ground here (rad). Null: no tip up to the sweep's end. */
  readonly toTipBeyondGroundRad: number | null;
  /** Slope of the ground from level at which the first wheel lifts and at which it goes over (rad). */
  readonly liftFromLevelRad: number | null;
  readonly tipFromLevelRad: number | null;
  readonly liftWheel: WheelName | null;
  readonly tipEdge: readonly WheelName[];
  readonly tipReason: TipReason | null;
  /** Where the tip is not sharply defined (a nearly neutral stance), the extra tilt where that began: the limit to use (rad). */
  readonly softFromBeyondGroundRad: number | null;
}

export interface SlopeToSpare {
  /** The datum of every `...BeyondGroundRad` value: SPARE_DATUM. */
  readonly datum: typeof SPARE_DATUM;
  /** Whether the vehicle stands as it is (a stable equilibrium at no extra tilt in every direction). */
  readonly standsNow: boolean;
  /** Slope of the ground under the vehicle from level, as it stands (rad). */
  readonly groundFromLevelRad: number;
  /** The direction with the least tilt to spare before it goes over, and the one before a wheel lifts. */
  readonly weakestTip: SpareDirection;
  readonly weakestLift: SpareDirection;
  readonly cardinals: { readonly [K in CardinalName]: SpareDirection };
  /** Largest tilt the sweeps tried beyond the ground (rad). */
  readonly maxBeyondGroundRad: number;
}

function spareOf(d: RoseDirection): SpareDirection {
  const lift = d.firstLift ?? null;
  const tip = d.tip;
  return {
    downhillRad: d.downhillRad,
    toLiftBeyondGroundRad: lift ? lift.beyondGroundRad : tip ? tip.beyondGroundRad : null,
    toTipBeyondGroundRad: tip ? tip.beyondGroundRad : null,
    liftFromLevelRad: lift ? lift.fromLevelRad : tip ? tip.fromLevelRad : null,
    tipFromLevelRad: tip ? tip.fromLevelRad : null,
    liftWheel: lift ? lift.wheel : null,
    tipEdge: tip ? tip.edge : [],
    tipReason: tip ? tip.reason : null,
    softFromBeyondGroundRad: tip?.softFrom ? tip.softFrom.beyondGroundRad : null,
  };
}

/** Slope to spare from a rose already computed (on the ground at the pose, from no extra tilt). */
export function spareFromRose(rose: RoseResult): SlopeToSpare {
  const dirs = rose.directions.map(spareOf);
  const max = rose.maxAngleRad;
  /** The limit to use: a soft stretch's start where there is one. */
  const tipOf = (s: SpareDirection) => s.softFromBeyondGroundRad ?? s.toTipBeyondGroundRad ?? max;
  const liftOf = (s: SpareDirection) => Math.min(s.toLiftBeyondGroundRad ?? max, tipOf(s));
  let weakestTip = dirs[0];
  let weakestLift = dirs[0];
  for (const s of dirs) {
    if (tipOf(s) < tipOf(weakestTip)) weakestTip = s;
    if (liftOf(s) < liftOf(weakestLift)) weakestLift = s;
  }
  const cardinals = {} as Record<CardinalName, SpareDirection>;
  for (const [name, rad] of CARDINALS) {
    // The rose direction nearest the named one (exact when the spacing divides 90°).
    let best = dirs[0];
    const gap = (a: number) => Math.abs(Math.atan2(Math.sin(a - rad), Math.cos(a - rad)));
    for (const s of dirs) if (gap(s.downhillRad) < gap(best.downhillRad)) best = s;
    cardinals[name] = best;
  }
  const stands = rose.directions.every((d) => !d.tip || d.tip.reason !== 'does-not-stand-at-start');
  return {
    datum: SPARE_DATUM,
    standsNow: stands,
    groundFromLevelRad: rose.groundFromLevelRad,
    weakestTip,
    weakestLift,
    cardinals,
    maxBeyondGroundRad: max,
  };
}

/**
 * Slope to spare for the vehicle at `pose` on the model's ground (the scenario terrain), from the
 * ground as it lies (no table tilt): a rose of tilt sweeps, then spareFromRose.
 */
export function slopeToSpare(model: VehicleModel, pose: Pose, opts: RoseOptions = {}): SlopeToSpare {
  return spareFromRose(stabilityRose(model, pose, opts));
}

/** The published measures at a pose, each with its one-line note (for the details). */
export function publishedMeasures(m: StabilityMargins): { name: keyof typeof MEASURE_NOTES; value: number; unit: 'rad' | 'm'; note: string }[] {
  return [
    { name: 'forceAngle', value: m.forceAngleRad, unit: 'rad', note: MEASURE_NOTES.forceAngle },
    { name: 'energy', value: m.energyM, unit: 'm', note: MEASURE_NOTES.energy },
    { name: 'static', value: m.staticM, unit: 'm', note: MEASURE_NOTES.static },
  ];
}
