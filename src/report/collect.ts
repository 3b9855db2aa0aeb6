/**
 * Runs every analysis a report shows for one scenario, with the same calls and options as the
 * CLI commands, so that the report's headline numbers are the CLI's numbers:
 * - the pose (as `pose`): solveEquilibrium at the scenario pose with its tilt and friction;
 * - the tilt table nose-down, left-down, tail-down, right-down (as `tilt --downhill front|left|
 *   rear|right`): tiltSweep from the scenario tilt;
 * - the stability rose (as `rose`: a level tilt table), the obstacle pass (as `pass`) when the
 *   scenario has a path;
 * - the build comparison (as `compare`) when builds are given, and the CG-height band when a
 *   tolerance is given.
 * Pure and deterministic; takes a few seconds for a rose and a pass.
 */
import type { Pose, SolveResult, TiltSweepResult } from '../core/model/types';
import type { Scenario } from '../core/scenario/types';
import { RAD_PER_DEG } from '../present/units';
import { buildModel, solveEquilibrium } from '../core/solver/equilibrium';
import { tiltSweep } from '../core/solver/tilt';
import { TerrainField } from '../core/terrain/field';
import { runPass, type PassResult, type PassStation } from '../core/analysis/pass';
import { passOptionsOf } from '../core/analysis/passOptions';

export { passOptionsOf };
import { stabilityRose, type CardinalName, type RoseResult } from '../core/analysis/rose';
import { AS_GIVEN, MAX_BUILDS, applyBuild, cgBand, compareVehicles, staticStabilityFactor, totalCgHeightM, type AppliedBuild, type BuildRow, type BuildSpec, type CgBand } from '../core/analysis/builds';

/** The four tilt-table directions of the report, in degrees as the CLI's --downhill words give them. */
export const REPORT_TILTS: readonly { readonly name: CardinalName; readonly label: string; readonly word: string; readonly downhillDeg: number }[] = [
  { name: 'noseDown', label: 'nose down', word: 'front', downhillDeg: 0 },
  { name: 'tailDown', label: 'tail down', word: 'rear', downhillDeg: 180 },
  { name: 'leftDown', label: 'left side down', word: 'left', downhillDeg: 90 },
  { name: 'rightDown', label: 'right side down', word: 'right', downhillDeg: 270 },
];

const LEVEL = { features: [] } as const;
const ORIGIN: Pose = { xM: 0, yM: 0, headingRad: 0 };

export interface ReportOptions {
  /** CG-height tolerance (m) for the band of lift and tip angles. @default none */
  readonly cgToleranceM?: number;
  /** Builds to compare with the vehicle as given (the reference; at most MAX_BUILDS − 1 builds). @default none */
  readonly builds?: readonly BuildSpec[];
  /** Rose direction spacing (rad). @default 5° (the rose command's default) */
  readonly roseStepRad?: number;
  /** Called with a word on what is being computed. */
  readonly onStage?: (stage: string) => void;
}

export interface ReportTilt {
  readonly name: CardinalName;
  readonly label: string;
  readonly downhillDeg: number;
  readonly result: TiltSweepResult;
}

/** The pose drawn: the key station of the pass, or the scenario pose. */
export interface ReportDrawingPose {
  readonly pose: Pose;
  readonly result: SolveResult;
  /** Why this pose: "the scenario pose", or what happens at the pass station (station says which). */
  readonly why: string;
  readonly station: PassStation | null;
}

export interface ReportData {
  readonly scenario: Scenario;
  readonly field: TerrainField;
  readonly pose: SolveResult;
  /** T/(2h): mean track, total CG height with the payload (NHTSA; NRC/TRB SR 265). */
  readonly ssf: number;
  readonly cgHeightM: number;
  readonly trackMeanM: number;
  readonly tilts: readonly ReportTilt[];
  readonly rose: RoseResult;
  readonly pass: PassResult | null;
  readonly drawing: ReportDrawingPose;
  readonly builds: readonly BuildRow[] | null;
  readonly cgBand: CgBand | null;
}


/**
 * The key station of a pass, the one drawn: the last standing station before a tip; else the
 * first lift; else the first wheel to go light; else the station where one wheel's load differs
 * most from its level-ground load (the vehicle on the obstacle). Null when no station stands.
 */
export function keyStationOf(pass: PassResult): { station: PassStation; why: string } | null {
  const standing = (st: PassStation) => !st.hungUp && st.status === 'converged' && st.forceAngleRad >= 0;
  const at = (i: number) => pass.stations[i];
  if (pass.tip) {
    for (let i = pass.tip.station - 1; i >= 0; i--) if (standing(at(i))) return { station: at(i), why: 'the last standing station before the tip' };
    return null;
  }
  if (pass.firstLift && standing(at(pass.firstLift.station))) return { station: at(pass.firstLift.station), why: `the first lift (${pass.firstLift.wheel})` };
  if (pass.firstUnload && standing(at(pass.firstUnload.station))) return { station: at(pass.firstUnload.station), why: `the first wheel to go light (${pass.firstUnload.wheel})` };
  let best: PassStation | null = null;
  let bestDev = -1;
  for (const st of pass.stations) {
    if (!standing(st)) continue;
    for (const w of st.wheels) {
      const dev = Math.abs(w.loadShare - 1);
      if (dev > bestDev) {
        bestDev = dev;
        best = st;
      }
    }
  }
  return best ? { station: best, why: 'the largest change of one wheel\'s load from level ground' } : null;
}

export function collectReport(s: Scenario, opts: ReportOptions = {}): ReportData {
  const stage = opts.onStage ?? (() => {});
  const model = buildModel(s.vehicle, s.terrain);
  stage('pose');
  const pose = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction });
  stage('tilt table');
  const tilts = REPORT_TILTS.map((t) => ({
    name: t.name,
    label: t.label,
    downhillDeg: t.downhillDeg,
    // The CLI's --downhill words map to degrees × (π/180), the same product as here.
    result: tiltSweep(model, s.pose, { downhillRad: t.downhillDeg * RAD_PER_DEG, startAngleRad: s.tilt.angleRad, friction: s.friction }),
  }));
  stage('stability rose');
  // As the rose command by default: the vehicle on a level tilt table (a property of the build, not of the site).
  const rose = stabilityRose(buildModel(s.vehicle, LEVEL), ORIGIN, { friction: s.friction, stepRad: opts.roseStepRad ?? 5 * RAD_PER_DEG });
  let pass: PassResult | null = null;
  let drawing: ReportDrawingPose = { pose: s.pose, result: pose, why: 'the scenario pose', station: null };
  if (s.path) {
    stage('obstacle pass');
    pass = runPass(model, s.path, passOptionsOf(s));
    const found = keyStationOf(pass);
    if (found) {
      const key = found.station;
      // The station's pose solved as a scenario of its own (the solver's one answer for it).
      const r = solveEquilibrium(model, key.pose, passOptionsOf(s));
      if (r.standing) {
        drawing = { pose: key.pose, result: r, why: found.why, station: key };
      }
    }
  }
  let builds: BuildRow[] | null = null;
  if (opts.builds && opts.builds.length > 0) {
    stage('builds');
    // As the compare command: the vehicle as given first (the reference), then each build.
    const applied: AppliedBuild[] = [
      { name: 'as given', vehicle: s.vehicle, changes: AS_GIVEN },
      ...opts.builds.slice(0, MAX_BUILDS - 1).map((b) => applyBuild(s.vehicle, b)),
    ];
    builds = compareVehicles(applied, {
      terrain: s.terrain,
      path: s.path,
      friction: s.friction,
      tilt: passOptionsOf(s).tilt,
      roseStepRad: 5 * RAD_PER_DEG,
      cgToleranceM: opts.cgToleranceM,
    });
  }
  let band: CgBand | null = null;
  if (opts.cgToleranceM !== undefined && opts.cgToleranceM > 0) {
    stage('CG band');
    band = cgBand(s.vehicle, opts.cgToleranceM, { friction: s.friction });
  }
  return {
    scenario: s,
    field: model.field,
    pose,
    ssf: staticStabilityFactor(s.vehicle),
    cgHeightM: totalCgHeightM(s.vehicle),
    trackMeanM: 0.5 * (s.vehicle.trackFrontM + s.vehicle.trackRearM),
    tilts,
    rose,
    pass,
    drawing,
    builds,
    cgBand: band,
  };
}
