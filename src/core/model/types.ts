/**
 * Plumbline core model types. SI units throughout (kg, m, s, N, N·m, rad).
 *
 * Frames (ISO 8855): the terrain frame has x forward (at heading 0), y left, z up; the
 * vehicle (body) frame has its origin at the reference point, on the ground midway between
 * the axles and on the centre line, at ride height on level ground; x forward, y left, z up.
 * Inputs are never mutated by the core.
 */

/** Wheel names, in the order used by every per-wheel array in the core. */
export type WheelName = 'FL' | 'FR' | 'RL' | 'RR';
export const WHEEL_NAMES: readonly WheelName[] = ['FL', 'FR', 'RL', 'RR'];
/** Index helpers: wheel i is on the front axle when i < 2, on the left when i is even. */
export const WHEEL_COUNT = 4;

export type SuspensionType = 'solid' | 'independent';

/** One axle's suspension. */
export interface AxleSuspension {
  /** `solid`: a rigid beam axle that heaves and rolls relative to the body; `independent`: each corner moves on its own. */
  readonly type: SuspensionType;
  /** Vertical rate per wheel, measured at the wheel centre (N/m). */
  readonly wheelRateNPerM: number;
  /** Travel available upward (compression) from ride height (m, ≥ 0). */
  readonly bumpM: number;
  /** Travel available downward (extension) from ride height (m, ≥ 0). At full droop the wheel hangs. */
  readonly droopM: number;
  /** Anti-roll bar stiffness: moment per radian of axle-to-body roll (N·m/rad). 0 = disconnected. */
  readonly antiRollNmPerRad: number;
  /** Roll-centre height above level ground at ride height (m). */
  readonly rollCentreHeightM: number;
  /**
   * Solid axles only: lateral distance between the two springs (m). Springs closer than the
   * track give less roll stiffness for the same wheel rate in heave.
   * @default the axle's track
   */
  readonly springSpacingM?: number;
}

export interface TyreSpec {
  /** Unloaded outer radius (m). */
  readonly radiusM: number;
  /** Tread width (m). */
  readonly widthM: number;
  /** Vertical stiffness per tyre on flat ground at its static load and rated pressure (N/m). */
  readonly stiffnessNPerM: number;
}

/** A mass carried on the body (sprung): roof rack, rooftop tent, water, passengers. */
export interface PayloadItem {
  readonly label: string;
  readonly massKg: number;
  /** Position of the item's own CG behind the front axle (m). */
  readonly behindFrontAxleM: number;
  /** Height of the item's CG above level ground at ride height (m). */
  readonly heightM: number;
  /** Lateral position of the item's CG, positive to the left (m). */
  readonly leftOfCentreM: number;
}

/**
 * Underbody outline used for clearance checks and drawings: a box between the bumpers with a
 * flat belly, plus the two axle housings (lowest points under the axles).
 */
export interface BodyShape {
  /** Body length ahead of the front axle (m). */
  readonly frontOverhangM: number;
  /** Body length behind the rear axle (m). */
  readonly rearOverhangM: number;
  /** Overall body width (m). */
  readonly widthM: number;
  /** Belly (frame, skid plates) height above level ground at ride height, between the axles (m). */
  readonly bellyClearanceM: number;
  /** Lowest point of the front bumper above level ground at ride height (m). */
  readonly frontBumperClearanceM: number;
  /** Lowest point of the rear bumper above level ground at ride height (m). */
  readonly rearBumperClearanceM: number;
  /** Roof height above level ground at ride height (m); drawings only. */
  readonly roofHeightM: number;
}

export interface Vehicle {
  readonly name: string;
  readonly wheelbaseM: number;
  /** Tyre centre-line to centre-line (m). */
  readonly trackFrontM: number;
  readonly trackRearM: number;
  /** Total mass as weighed, without the payload list (kg). */
  readonly massKg: number;
  /** CG of the vehicle as weighed (without payload). */
  readonly cg: {
    readonly behindFrontAxleM: number;
    /** Above level ground at ride height (m). */
    readonly heightM: number;
    /** Positive to the left (m). */
    readonly leftOfCentreM: number;
  };
  /** Unsprung mass per axle (kg): wheels, tyres, brakes, hubs and for a solid axle the beam. */
  readonly unsprungMassFrontKg: number;
  readonly unsprungMassRearKg: number;
  readonly tyreFront: TyreSpec;
  readonly tyreRear: TyreSpec;
  readonly suspensionFront: AxleSuspension;
  readonly suspensionRear: AxleSuspension;
  readonly payload: readonly PayloadItem[];
  readonly body: BodyShape;
}

/** Height features of the terrain; their heights add onto a base at z = 0. */
export type TerrainFeature =
  | {
      readonly type: 'plane';
      /** Rises toward +x (rad). */
      readonly gradeRad: number;
      /** Rises toward +y (rad). */
      readonly crossSlopeRad: number;
      /** Height at the origin (m). @default 0 */
      readonly heightM: number;
    }
  | {
      /** A ledge: the ground beyond x = xM rises by heightM (negative: drops). */
      readonly type: 'step';
      readonly xM: number;
      readonly heightM: number;
      /** Lateral extent; absent = unbounded. */
      readonly yRangeM: readonly [from: number, to: number] | null;
      /** Radius of the upper edge (m). @default 0 */
      readonly edgeRadiusM: number;
    }
  | {
      readonly type: 'block';
      readonly xRangeM: readonly [from: number, to: number];
      readonly yRangeM: readonly [from: number, to: number];
      /** Negative: a pit. */
      readonly heightM: number;
      readonly edgeRadiusM: number;
    }
  | {
      /** A smooth dome (half ellipsoid) on the ground. */
      readonly type: 'rock';
      readonly xM: number;
      readonly yM: number;
      readonly heightM: number;
      /** Footprint radius (m). */
      readonly radiusM: number;
    }
  | {
      /** A ramp rising toward +x from xM at angleRad over lengthM (measured along its surface), then level. */
      readonly type: 'ramp';
      readonly xM: number;
      readonly angleRad: number;
      readonly lengthM: number;
      readonly yRangeM: readonly [from: number, to: number] | null;
    }
  | {
      /** Piecewise-linear section [s, z] along x or y, held level beyond its ends. */
      readonly type: 'profile';
      readonly axis: 'x' | 'y';
      readonly points: readonly (readonly [s: number, z: number])[];
      /** Extent across the profile axis; absent = unbounded. */
      readonly acrossM: readonly [from: number, to: number] | null;
    }
  | {
      /** Height grid, bilinear between nodes, held at its edge values outside. */
      readonly type: 'grid';
      readonly originM: readonly [x: number, y: number];
      readonly spacingM: number;
      /** Nodes along x. */
      readonly cols: number;
      /** Nodes along y. */
      readonly rows: number;
      /** Row-major heights: index = row * cols + col, row along y, col along x (m). */
      readonly heightsM: ArrayLike<number>;
      /** Imported ground: 1 where a height was filled in (no data there), per node; absent or null when all measured. */
      readonly filledMask?: Uint8Array | null;
      /** Imported ground: where it came from; absent or null for a typed grid. */
      readonly source?: GridSource | null;
    };

/** Where an imported height grid came from (kept for the record; the solver does not read it). */
export interface GridSource {
  /** File name as imported. */
  readonly file: string;
  /** Format read (geotiff, asc, ply, obj, gltf, xyz, las1.2, ...). */
  readonly format: string;
  /** CRS code the file stated (e.g. "EPSG:3645"), or null. */
  readonly crs: string | null;
  /** Source coordinates (source units, z up) of the terrain frame's origin (0, 0, 0). */
  readonly originSource: readonly [x: number, y: number, z: number];
  /** Metres per source unit. */
  readonly sourceUnitM: number;
}

export type TerrainFeatureType = TerrainFeature['type'];

export interface Terrain {
  readonly features: readonly TerrainFeature[];
}

/** Where the vehicle stands: its reference point (ground, midway between the axles) and heading. */
export interface Pose {
  readonly xM: number;
  readonly yM: number;
  /** Yaw from +x, counter-clockwise seen from above (rad). */
  readonly headingRad: number;
}

/** Tilt-table setting: the whole terrain is rotated by angleRad so that it descends toward downhillRad. */
export interface Tilt {
  readonly angleRad: number;
  /** Descending direction in the vehicle frame, counter-clockwise from the nose: 0 nose down, π/2 left side down, π tail down, 3π/2 right side down. */
  readonly downhillRad: number;
}

/** Tyre discretisation (radial-spring tyre, Davis 1975). */
export interface TyreModelOptions {
  /** Slices across the tread width (≥ 1). @default 3 */
  readonly slices: number;
  /** Angular spacing of the radial springs (rad). @default 2.5° */
  readonly springSpacingRad: number;
  /** Half-angle of the spring fan either side of straight down (rad). @default 90° */
  readonly fanHalfAngleRad: number;
}

/** How a solve ended. */
export type SolveStatus =
  /** A static equilibrium meeting the residual bound. */
  | 'converged'
  /** No equilibrium: the plumb line from the CG has left the support of the loaded tyres. */
  | 'tipped'
  /** No tyre touches the ground (the vehicle would fall), e.g. tilted past 90°. */
  | 'no-contact'
  /** The iteration cap was reached without meeting the residual bound. */
  | 'not-converged'
  /**
   * The forces balance, but the balance is unstable (the tangent stiffness of the configuration is
   * not positive definite, src/core/solver/stability.ts): any disturbance takes it over. Never standing.
   */
  | 'unstable';

export interface SolveOptions {
  /** Tilt-table setting. @default no tilt */
  readonly tilt?: Tilt;
  /** Ground friction coefficient, for the friction demand flag. @default 0.7 */
  readonly friction?: number;
  /** Newton iteration cap. @default 60 */
  readonly maxIterations?: number;
  /** Bound on the scaled residual (forces / weight, moments / (weight · wheelbase)). @default 1e-7 (ten times inside the 1e-6·W bound the results promise) */
  readonly tolerance?: number;
  /**
   * A previous result's `state`: a speed-up only. The answer stays the scenario's own (the stable
   * equilibrium from the reference start); a warm landing that cannot be shown to be it is solved
   * again from the reference start.
   */
  readonly warmStart?: Float64Array | null;
  /**
   * The caller follows a path of its own from the warm start (a tilt sweep raising the table step by
   * step): accept the root the warm start leads to, checked for stability, without the reference
   * test. @default false
   */
  readonly followBranch?: boolean;
  /**
   * Only the fast iteration: no fallback to the full-equation Jacobian, no eased cold start. For
   * searches that bracket an event from a close warm start, where a miss is cheap to take.
   * @default false
   */
  readonly quick?: boolean;
}

export interface WheelResult {
  readonly name: WheelName;
  /** Normal load: the tyre's radial resultant, along the contact normal (N). 0 when lifted. */
  readonly loadN: number | null;
  /** Total ground force (normal + tangential) along the gravity up direction: what a scale under the tyre reads (N). */
  readonly verticalLoadN: number | null;
  /** loadN / the wheel's load standing on level ground (1 = unchanged). */
  readonly loadShare: number | null;
  /** The wheel's load standing on level ground, untilted (N). */
  readonly staticLoadN: number;
  readonly lifted: boolean;
  /** Centre of pressure of the contact, terrain frame (m). Wheel centre dropped by the radius when lifted. */
  readonly contactPointWorld: readonly [number, number, number];
  /** Unit contact normal (direction of the radial resultant), terrain frame. Terrain up when lifted. */
  readonly contactNormalWorld: readonly [number, number, number];
  /** Wheel centre, terrain frame (m). */
  readonly centreWorld: readonly [number, number, number];
  /** Tyre axis (unit, pointing to the vehicle's left), terrain frame. */
  readonly axisWorld: readonly [number, number, number];
  /** Suspension travel from ride height, positive in bump (m). */
  readonly travelM: number | null;
  /** Travel as a fraction of what is available that way: +1 full bump, −1 full droop (can pass ±1 into the stops). */
  readonly travelFraction: number | null;
  /** Mean tyre deflection along the normal, load-weighted (m). */
  readonly tyreDeflectionM: number | null;
  /** Tangential (grip) force at the contact (N). */
  readonly tangentialN: number | null;
  /** tangentialN / loadN: the friction coefficient this wheel needs (0 when lifted). */
  readonly frictionDemand: number | null;
}

export interface StabilityMargins {
  /** Smallest force-angle over the tip edges (rad); Papadopoulos & Rey 1996. Negative past a tip. */
  readonly forceAngleRad: number;
  /** Force-angle stability measure, 2000 form: angle × distance from edge to force line × force (N·m·rad). */
  readonly forceAngleMeasure: number;
  /** The same divided by the weight (m·rad). */
  readonly forceAngleMeasurePerWeightM: number;
  /** Energy stability margin (Messuri & Klein 1985): height the CG must rise to tip over the weakest edge (m). Negative past a tip. */
  readonly energyM: number;
  /** Static stability margin (McGhee & Frank 1968): least horizontal distance from the CG's plumb point to the support edges (m). */
  readonly staticM: number;
  /** Index into supportPolygonWorld of the weakest edge's first vertex (edge i → i+1), or -1. */
  readonly weakestEdge: number;
  /** The tyres whose contacts make the weakest edge, e.g. ['FL','RL']. */
  readonly weakestEdgeWheels: readonly WheelName[];
}

/**
 * The body frame of a pose as plain data (src/core/solver/frame.ts maps body points with it): origin at
 * the reference point, rotation R = Rz(heading) · Ry(pitch) · Rx(roll), row-major, body → terrain.
 */
export interface BodyFrame {
  /** The reference point in the terrain frame (m). */
  readonly originM: readonly [number, number, number];
  /** 3×3 rotation, row-major (9 numbers): terrain components = R · body components. */
  readonly rotation: readonly number[];
}

export interface BodyResult {
  /** The body frame (position and attitude) as plain data. */
  readonly frame: BodyFrame;
  /** Reference point height above its rest height on the local ground (m). */
  readonly heaveM: number;
  /** Body roll relative to the terrain (table) frame, ISO 8855 sign: positive = right side down (rad). */
  readonly rollRad: number;
  /** Body pitch relative to the terrain frame, positive nose down (rad), ISO 8855 sign. */
  readonly pitchRad: number;
  /** Body roll and pitch relative to true level (gravity), rad. */
  readonly rollToLevelRad: number;
  readonly pitchToLevelRad: number;
  /** Total CG (vehicle + payload + unsprung at the wheels), terrain frame (m). */
  readonly cgWorld: readonly [number, number, number];
  /** Point where the plumb line from the CG meets the ground, terrain frame (m). */
  readonly plumbPointWorld: readonly [number, number, number];
}

export interface SolveResult {
  readonly status: SolveStatus;
  /** The vehicle stands here: a converged, stable equilibrium (status 'converged'). Nothing else is ever shown as standing. */
  readonly standing: boolean;
  /**
   * Smallest eigenvalue of the tangent stiffness of the configuration (per W·L, dimensionless), where
   * the forces balance (converged or unstable); null otherwise. Positive: stable; it falls to zero at a fold.
   */
  readonly stiffnessMinEigen: number | null;
  /** Why it ended as it did, in words. */
  readonly reason: string;
  readonly iterations: number;
  /** Full evaluations of the equilibrium equations (tyre ray casts) used. */
  readonly evaluations: number;
  /** Largest force residual (N) and moment residual (N·m) of the state returned. */
  readonly residualN: number;
  readonly residualNm: number;
  readonly wheels: readonly [WheelResult, WheelResult, WheelResult, WheelResult];
  readonly body: BodyResult;
  readonly margins: StabilityMargins;
  /** Convex hull of the loaded contact points, counter-clockwise seen from above (gravity up), terrain frame. */
  readonly supportPolygonWorld: readonly (readonly [number, number, number])[];
  /** Gravity direction (unit), terrain frame. */
  readonly gravityDirWorld: readonly [number, number, number];
  /** Total weight (N). */
  readonly weightN: number;
  /** The solver state, for warm-starting the next solve. */
  readonly state: Float64Array;
}

export interface TiltSample {
  readonly angleRad: number;
  readonly status: SolveStatus;
  /** Normal loads FL, FR, RL, RR (N). */
  readonly loadsN: readonly [number, number, number, number];
  readonly lifted: readonly [boolean, boolean, boolean, boolean];
  readonly forceAngleRad: number;
  readonly energyM: number;
  /** Largest friction demand over the loaded wheels. */
  readonly frictionDemand: number;
}

export interface TiltSweepOptions {
  /** Descending direction in the vehicle frame (rad), as in Tilt. */
  readonly downhillRad: number;
  /** Tilt to start from (rad). @default 0 */
  readonly startAngleRad?: number;
  /** Largest tilt tried (rad). @default 89° */
  readonly maxAngleRad?: number;
  /** Coarse step before bisection (rad). @default 2° */
  readonly stepRad?: number;
  /** Look for the slide angle too (a rose does not need it). @default true */
  readonly findSlide?: boolean;
  /** Bisection stops when the bracket is this narrow (rad). @default 0.01° */
  readonly resolutionRad?: number;
  /** Ground friction coefficient. @default 0.7 */
  readonly friction?: number;
}

export interface TiltSweepResult {
  readonly downhillRad: number;
  /** First wheel to lift and the tilt at which it does; null if none lifts before the tip or the end. */
  readonly firstLift: { readonly wheel: WheelName; readonly angleRad: number } | null;
  /** Tilt at which no equilibrium remains, and the tyres about whose contacts it goes over. */
  readonly tip: { readonly angleRad: number; readonly edge: readonly WheelName[] } | null;
  /** Tilt at which the friction demand first exceeds the ground's friction. */
  readonly slide: { readonly angleRad: number } | null;
  readonly samples: readonly TiltSample[];
  /** Full equilibrium evaluations used by the whole sweep. */
  readonly evaluations: number;
}

/**
 * Vehicle path for an obstacle pass, in the terrain frame: a polyline from `fromM` through the
 * points `viaM` (in order) to `toM`. Without `viaM` (or with it empty) the path is the straight
 * line from → to, as every path was before polylines.
 */
export interface PathSpec {
  readonly fromM: readonly [x: number, y: number];
  /** Corner points between from and to, in driving order (m); absent or empty: straight. */
  readonly viaM?: readonly (readonly [x: number, y: number])[];
  readonly toM: readonly [x: number, y: number];
  /** Station spacing (m). */
  readonly stepM: number;
  /** Fixed heading (rad); null = along the path. */
  readonly headingRad: number | null;
}
