import type { PathSpec, Pose, Terrain, Tilt, Vehicle } from '../model/types';
import type { BuildSpec } from '../analysis/builds';

/** Unit system of a scenario file. The core is always SI; this only says how the file's numbers read. */
export type UnitSystem = 'metric' | 'imperial';

/**
 * A scenario in the core's SI form: everything the solver and the analyses need for one run.
 * Produced by `parseScenario`; written back to the file form by `scenarioToFile`.
 */
export interface Scenario {
  /** File format version (currently 1). */
  readonly version: number;
  readonly name: string;
  /** The unit system the file was written in; `scenarioToFile` writes it back in these units by default. */
  readonly units: UnitSystem;
  readonly vehicle: Vehicle;
  readonly terrain: Terrain;
  /** @default x 0, y 0, heading 0 */
  readonly pose: Pose;
  /** @default angle 0, downhill left side (π/2) */
  readonly tilt: Tilt;
  /** Obstacle pass path, or null when the file gives none. */
  readonly path: PathSpec | null;
  /** Ground friction coefficient (tyre on surface). @default 0.7 */
  readonly friction: number;
  /** Free text. @default "" */
  readonly notes: string;
  /** Builds (modifications of the vehicle) for side-by-side comparison; absent or [] when the file gives none. */
  readonly builds?: readonly BuildSpec[];
  /**
   * Saved candidate lines (drawn in the app, compared as the line sweep compares lines, each run at
   * the path's station spacing); absent or [] when the file gives none.
   */
  readonly candidates?: readonly CandidateLine[];
}

/** A named candidate line: a polyline on the ground (terrain frame, m), 2 or more points, in driving order. */
export interface CandidateLine {
  readonly name: string;
  readonly pointsM: readonly (readonly [x: number, y: number])[];
}

/** One problem found in a scenario file: the field path (e.g. `vehicle.track.front`) and what is wrong. */
export interface ScenarioError {
  readonly path: string;
  readonly message: string;
}

export type ParseResult =
  | { readonly ok: true; readonly scenario: Scenario; readonly warnings: string[] }
  | { readonly ok: false; readonly errors: ScenarioError[] };
