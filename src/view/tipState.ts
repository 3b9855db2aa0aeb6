/**
 * What the scene draws for a pose that does not stand: the vehicle as it stands at the tip (the
 * last stable state of a tilt sweep from level about the same downhill direction) and the edge of
 * its support it goes over. The pose's own result is never drawn as a balance and carries no
 * loads; this is the state just before it goes over, drawn as a ghost.
 *
 * Computed once per result (a tilt sweep and a solve, tens of ms) and shared by every view that
 * reads it; null while the pose stands, or when no stable state exists even on the level table.
 */
import { solveEquilibrium, tiltSweep, type SolveResult, type TiltTip } from '../core';
import { RAD_PER_DEG } from '../present/units';
import { shownModel, shownPose, shownResult, shownVehicle, type PlumbState } from '../store/store';

type V3 = readonly [number, number, number];

export interface TipView {
  /** The tip as the sweep found it (table tilt, slope from level, edge tyres, reason). */
  readonly tip: TiltTip;
  /** The last stable state before the tip (standing; drawn as a ghost, its loads never shown). */
  readonly atTip: SolveResult;
  /** The tip edge on the ground, terrain frame (m): from the support polygon of the state at the tip. */
  readonly edgeFromM: V3;
  readonly edgeToM: V3;
  /** The table tilt of the pose shown (rad, from level). */
  readonly poseTiltRad: number;
  readonly downhillRad: number;
}

/** Tilts below the tip tried for the state drawn at the tip (rad): the first that stands is used. */
const BELOW_TIP_RAD = [0.02, 0.1, 0.5, 1].map((d) => d * RAD_PER_DEG);

const cache = new WeakMap<SolveResult, TipView | null>();

/**
 * The last tip found, with what it depends on: the same vehicle, ground, pose, downhill direction
 * and grip give the same tip whatever the table tilt past it, so raising the tilt further reuses it.
 */
let last: { key: readonly unknown[]; view: TipView } | null = null;

/** The tip view of what the scene shows now (memoised on the result object). */
export function tipViewOf(s: PlumbState): TipView | null {
  const r = shownResult(s);
  if (r.standing) return null;
  const hit = cache.get(r);
  if (hit !== undefined) return hit;
  const v = computeTipView(s);
  cache.set(r, v);
  return v;
}

function computeTipView(s: PlumbState): TipView | null {
  const model = shownModel(s);
  const pose = shownPose(s);
  const { downhillRad, angleRad } = s.scenario.tilt;
  const key = [model, shownVehicle(s), s.scenario.terrain, pose, downhillRad, s.scenario.friction];
  if (last && last.key.length === key.length && last.key.every((k, i) => k === key[i]) && last.view.tip.angleRad < angleRad) {
    return { ...last.view, poseTiltRad: angleRad };
  }
  const v = sweepToTip(s, model, pose, downhillRad, angleRad);
  last = v ? { key, view: v } : null;
  return v;
}

function sweepToTip(s: PlumbState, model: ReturnType<typeof shownModel>, pose: ReturnType<typeof shownPose>, downhillRad: number, angleRad: number): TipView | null {
  const sweep = tiltSweep(model, pose, { downhillRad, friction: s.scenario.friction, findSlide: false, maxAngleRad: Math.max(angleRad, 1 * RAD_PER_DEG) });
  const tip = sweep.tip;
  if (!tip || tip.reason === 'does-not-stand-at-start') return null;
  for (const d of BELOW_TIP_RAD) {
    const a = tip.angleRad - d;
    if (a < 0) break;
    const r = solveEquilibrium(model, pose, { tilt: { angleRad: a, downhillRad }, friction: s.scenario.friction });
    const poly = r.supportPolygonWorld;
    const e = r.margins.weakestEdge;
    if (!r.standing || e < 0 || poly.length < 2) continue;
    return {
      tip,
      atTip: r,
      edgeFromM: poly[e % poly.length],
      edgeToM: poly[(e + 1) % poly.length],
      poseTiltRad: angleRad,
      downhillRad,
    };
  }
  return null;
}

/** The result the scene poses the vehicle with: the state at the tip when the pose does not stand, else the pose's own. */
export function drawnResult(s: PlumbState): SolveResult {
  return tipViewOf(s)?.atTip ?? shownResult(s);
}
