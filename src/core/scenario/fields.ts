/**
 * The scenario file's field table: for every numeric field its file key, its key in the core's SI
 * form, what it measures (for unit conversion) and its bounds. The zod schema (schema.ts), the
 * conversion to SI (parse.ts), the writer (write.ts), the JSON Schema (jsonSchema.ts), the field
 * checks on the SI form (checkSI.ts) and the app's vehicle forms all read these rows, so a new
 * field or terrain feature is one row here (plus its SI type in model/types.ts).
 *
 * The unit factors between file units and SI live here and nowhere else in the core.
 */
import type { UnitSystem } from './types';

// --- Units ------------------------------------------------------------------------------------

/**
 * Exact definitions (International Yard and Pound Agreement, 1959): 1 yd = 0.9144 m, so
 * 1 in = 0.0254 m and 1 ft = 0.3048 m; 1 lb = 0.45359237 kg. The pound-force is the weight of
 * one pound under standard gravity gn = 9.80665 m/s² (3rd CGPM, 1901):
 * 1 lbf = 0.45359237 × 9.80665 N = 4.4482216152605 N exactly.
 */
export const M_PER_IN = 0.0254;
export const M_PER_FT = 0.3048;
export const M_PER_MM = 0.001;
export const KG_PER_LB = 0.45359237;
/** Standard acceleration of gravity (m/s²), 3rd CGPM 1901. */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;
export const N_PER_LBF = 4.4482216152605;
export const RAD_PER_DEG = Math.PI / 180;

/**
 * What a number in a scenario file measures.
 * - `length`: m | in
 * - `mass`: kg | lb
 * - `stiffness`: N/m | lbf/in (wheel rate, tyre stiffness)
 * - `rollStiffness`: N·m/deg | lbf·ft/deg (anti-roll bars); the core holds N·m/rad
 * - `angle`: deg in both systems; the core holds rad
 * - `ratio`: no unit (friction coefficient, counts)
 */
export type QuantityKind = 'length' | 'mass' | 'stiffness' | 'rollStiffness' | 'angle' | 'ratio';

/** Factor from the unit-system's file unit to the metric file unit (1 for metric). */
export function metricPerFileUnit(kind: QuantityKind, units: UnitSystem): number {
  if (units === 'metric') return 1;
  switch (kind) {
    case 'length':
      return M_PER_IN;
    case 'mass':
      return KG_PER_LB;
    case 'stiffness':
      return N_PER_LBF / M_PER_IN;
    case 'rollStiffness':
      return N_PER_LBF * M_PER_FT;
    default:
      return 1;
  }
}

/** Factor from the metric file unit to the core's SI unit (degrees become radians). */
export function siPerMetricFileUnit(kind: QuantityKind): number {
  if (kind === 'angle') return RAD_PER_DEG;
  // N·m per degree → N·m per radian: a moment per degree is 180/π times as much per radian.
  if (kind === 'rollStiffness') return 1 / RAD_PER_DEG;
  return 1;
}

/** A file number (in `units`) to the core's SI value. */
export function toSI(kind: QuantityKind, value: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  const s = siPerMetricFileUnit(kind);
  return k === 1 ? value * s : value * k * s;
}

/** A core SI value to the file number in `units` (full precision; see `fileNumber` for writing). */
export function fromSI(kind: QuantityKind, valueSI: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  const s = siPerMetricFileUnit(kind);
  return k === 1 ? valueSI / s : valueSI / s / k;
}

/** A metric file number (m, kg, N/m, N·m/deg, deg) to the same quantity in `units`. */
export function metricToFileUnits(kind: QuantityKind, metricValue: number, units: UnitSystem): number {
  const k = metricPerFileUnit(kind, units);
  return k === 1 ? metricValue : metricValue / k;
}

const LABELS: Readonly<Record<UnitSystem, Readonly<Record<QuantityKind, string>>>> = {
  metric: { length: 'm', mass: 'kg', stiffness: 'N/m', rollStiffness: 'N·m/deg', angle: 'deg', ratio: '' },
  imperial: { length: 'in', mass: 'lb', stiffness: 'lbf/in', rollStiffness: 'lbf·ft/deg', angle: 'deg', ratio: '' },
};

/** The unit as written in messages ("m", "in", "lbf·ft/deg"); "" for a plain number. */
export function unitLabel(kind: QuantityKind, units: UnitSystem): string {
  return LABELS[units][kind];
}

/**
 * The number written to a file for an SI value: the shortest decimal (fewest significant digits)
 * in the file's unit that reads back as exactly the same SI value. A value typed in the file's
 * unit (1720 lb) is written as typed, not as its float image (1719.9999999999998); the file
 * still reproduces the scenario bit for bit.
 */
export function fileNumber(kind: QuantityKind, valueSI: number, units: UnitSystem): number {
  if (metricPerFileUnit(kind, units) === 1 && siPerMetricFileUnit(kind) === 1) return valueSI;
  const raw = fromSI(kind, valueSI, units);
  if (!Number.isFinite(raw) || raw === 0) return raw === 0 ? 0 : raw;
  // A number typed with up to 15 significant digits differs from its float image by a few ulps,
  // so 15 digits give it back; JavaScript then prints it in its shortest form.
  for (let digits = 15; digits <= 17; digits++) {
    const r = Number(raw.toPrecision(digits));
    if (toSI(kind, r, units) === valueSI) return r;
  }
  return raw;
}

/**
 * The resolution a value is kept to when it is entered in another unit than the file's (a mass
 * typed in kg into a file in lb): what a practitioner reads and types in that unit. Lengths to
 * 0.1 mm or 0.01 in, masses to 0.1 kg or 0.1 lb, stiffnesses to 5 significant digits, angles to
 * 0.01° (common practice for hand-measured vehicle data: finer digits are noise).
 */
const FILE_STEP: Readonly<Record<UnitSystem, Readonly<Record<QuantityKind, number>>>> = {
  metric: { length: 1e-4, mass: 0.1, stiffness: 0, rollStiffness: 0, angle: 0.01, ratio: 0 },
  imperial: { length: 0.01, mass: 0.1, stiffness: 0, rollStiffness: 0, angle: 0.01, ratio: 0 },
};
const SIGNIFICANT_DIGITS = 5;

/**
 * An SI value entered in another unit system, snapped to the file unit's resolution (see
 * FILE_STEP) and returned in SI: the scenario then holds exactly what the saved file will say.
 */
export function snapToFileUnit(kind: QuantityKind, valueSI: number, units: UnitSystem): number {
  if (!Number.isFinite(valueSI)) return valueSI;
  const v = fromSI(kind, valueSI, units);
  const step = FILE_STEP[units][kind];
  let r: number;
  if (step > 0) {
    const decimals = Math.max(0, Math.round(-Math.log10(step)));
    r = Number((Math.round(v / step) * step).toFixed(decimals));
  } else {
    r = v === 0 ? 0 : Number(v.toPrecision(SIGNIFICANT_DIGITS));
  }
  return toSI(kind, r, units);
}

/** `valueSI / factor` written as the shortest decimal that multiplies back to exactly `valueSI` (wheel fitment in in and mm). */
export function fixedUnitNumber(valueSI: number, factor: number): number {
  const raw = valueSI / factor;
  if (!Number.isFinite(raw) || raw === 0) return raw === 0 ? 0 : raw;
  for (let digits = 15; digits <= 17; digits++) {
    const r = Number(raw.toPrecision(digits));
    if (r * factor === valueSI) return r;
  }
  return raw;
}

// --- Bounds ---------------------------------------------------------------------------------

export type Op = '>' | '≥' | '<' | '≤';
/** A bound in metric file units (m, kg, N/m, N·m/deg, deg, or a plain number). */
export type Bound = readonly [op: Op, metricValue: number];

/**
 * Plausibility bounds, in metric file units (m, kg, deg). A value outside them is almost always a
 * unit mistake (millimetres typed into a metric file) rather than a real vehicle.
 */
export const PLAUSIBLE = {
  /** Wheelbase up to 20 m (the largest off-road trucks are well under 10 m). */
  wheelbaseMaxM: 20,
  /** Track up to 10 m. */
  trackMaxM: 10,
  /** Mass up to 200 t. */
  massMaxKg: 200_000,
  /** CG height up to 10 m. */
  cgHeightMaxM: 10,
  /** Tyre radius up to 3 m. */
  tyreRadiusMaxM: 3,
  /** Suspension travel, either way, up to 2 m. */
  travelMaxM: 2,
  /** Coordinates (terrain, pose, path, CG and payload positions) within ±100 km of the origin. */
  coordMaxM: 100_000,
  /** Feature heights within ±1 km. */
  heightMaxM: 1_000,
} as const;

/**
 * Physical lower bounds, in metric file units. Below them the model has nothing real to describe
 * and the tyre calibration or the Newton solve "converges" on nonsense (a 5e-324 N/m tyre is
 * pinned at 0.9 of its radius). Chosen well below any wheeled vehicle a person rides in
 * (common practice: a small ride-on mower weighs ~150 kg, its tyres ~50 kN/m):
 */
export const PHYSICAL_MIN = {
  /** Wheelbase and track (m). */
  wheelbaseM: 0.3,
  trackM: 0.3,
  /** Vehicle mass as weighed (kg). */
  massKg: 20,
  /** Unsprung mass per axle (kg). */
  unsprungKg: 1,
  /** CG height above the ground (m). */
  cgHeightM: 0.05,
  /** Tyre radius and width (m). */
  tyreRadiusM: 0.05,
  tyreWidthM: 0.02,
  /** Tyre radial stiffness (N/m). */
  tyreStiffnessNPerM: 1e4,
  /** Wheel rate (N/m). */
  wheelRateNPerM: 1e3,
} as const;

const P = PLAUSIBLE;
const MIN = PHYSICAL_MIN;
/** A coordinate (terrain, pose, path, CG and payload positions). */
export const COORD: readonly Bound[] = [['≥', -P.coordMaxM], ['≤', P.coordMaxM]];
/** A feature height (negative: a pit or a drop). */
export const FEATURE_HEIGHT: readonly Bound[] = [['≥', -P.heightMaxM], ['≤', P.heightMaxM]];
/** A slope whose tangent stays finite. */
export const SLOPE_DEG: readonly Bound[] = [['>', -90], ['<', 90]];
/** A heading, either way round. */
export const HEADING_DEG: readonly Bound[] = [['≥', -360], ['≤', 360]];
export const TYRE_RADIUS: readonly Bound[] = [['≥', MIN.tyreRadiusM], ['≤', P.tyreRadiusMaxM]];
export const TYRE_WIDTH: readonly Bound[] = [['≥', MIN.tyreWidthM], ['≤', P.trackMaxM]];
export const TYRE_STIFFNESS: readonly Bound[] = [['≥', MIN.tyreStiffnessNPerM]];
export const TRAVEL: readonly Bound[] = [['≥', 0], ['≤', P.travelMaxM]];

// --- Rows -----------------------------------------------------------------------------------

interface RowBase {
  /** Dotted path in the file object the row belongs to (`track.front`). */
  readonly file: string;
  /** Dotted path in the SI object (`trackFrontM`, `cg.heightM`). */
  readonly si: string;
  /** Words for a form (the app's vehicle panel). */
  readonly label: string;
  /** May be left out of the file. */
  readonly optional: boolean;
}

/** A number of one quantity kind. */
export interface NumberRow extends RowBase {
  readonly type: 'number';
  readonly kind: QuantityKind;
  readonly bounds: readonly Bound[];
  /**
   * Value used when the file leaves the field out, in metric file units; `undefined` with
   * `optional`: the SI field is absent (or derived elsewhere, as the body outline is).
   */
  readonly default?: number;
}
/** `[from, to]` lengths with from < to; SI `null` when optional and absent. */
export interface RangeRow extends RowBase {
  readonly type: 'range';
}
/** Two coordinates `[a, b]`, named in messages. */
export interface PairRow extends RowBase {
  readonly type: 'pair';
  readonly names: string;
}
/** A whole number (grid size). */
export interface IntRow extends RowBase {
  readonly type: 'int';
  readonly min: number;
}
/** One of a few words. */
export interface ChoiceRow extends RowBase {
  readonly type: 'choice';
  readonly values: readonly [string, ...string[]];
}
/** Profile points `[s, z]` (lengths, s increasing), or grid heights (lengths), checked by hand. */
export interface ListRow extends RowBase {
  readonly type: 'points' | 'heights';
}
export type FieldRow = NumberRow | RangeRow | PairRow | IntRow | ChoiceRow | ListRow;

type Opts = { readonly optional?: boolean; readonly default?: number; readonly label?: string };
const num = (file: string, si: string, kind: QuantityKind, bounds: readonly Bound[], o: Opts = {}): NumberRow => ({
  type: 'number',
  file,
  si,
  kind,
  bounds,
  optional: o.optional ?? o.default !== undefined,
  label: o.label ?? file,
  ...(o.default === undefined ? {} : { default: o.default }),
});
const range = (file: string, si: string, optional = false): RangeRow => ({ type: 'range', file, si, optional, label: file });
const pair = (file: string, si: string, names: string): PairRow => ({ type: 'pair', file, si, names, optional: false, label: file });
const int = (file: string, si: string, min: number): IntRow => ({ type: 'int', file, si, min, optional: false, label: file });
const choice = (file: string, si: string, values: readonly [string, ...string[]]): ChoiceRow => ({ type: 'choice', file, si, values, optional: false, label: file });
const list = (type: 'points' | 'heights', file: string, si: string): ListRow => ({ type, file, si, optional: false, label: file });

/** `vehicle.*`, relative to the vehicle (name, tyres, suspension, payload, body are their own tables). */
export const VEHICLE_FIELDS: readonly NumberRow[] = [
  num('wheelbase', 'wheelbaseM', 'length', [['≥', MIN.wheelbaseM], ['≤', P.wheelbaseMaxM]], { label: 'Wheelbase' }),
  num('track.front', 'trackFrontM', 'length', [['≥', MIN.trackM], ['≤', P.trackMaxM]], { label: 'Track, front' }),
  num('track.rear', 'trackRearM', 'length', [['≥', MIN.trackM], ['≤', P.trackMaxM]], { label: 'Track, rear' }),
  num('mass', 'massKg', 'mass', [['≥', MIN.massKg], ['≤', P.massMaxKg]], { label: 'Mass as weighed' }),
  // Within the wheelbase and half the narrower track: checked across fields (checks.ts).
  num('cg.behindFrontAxle', 'cg.behindFrontAxleM', 'length', COORD, { label: 'CG behind front axle' }),
  num('cg.height', 'cg.heightM', 'length', [['≥', MIN.cgHeightM], ['≤', P.cgHeightMaxM]], { label: 'CG height' }),
  num('cg.leftOfCentre', 'cg.leftOfCentreM', 'length', COORD, { default: 0, label: 'CG left of centre' }),
  // Per axle; the sum must stay below the mass (checks.ts).
  num('unsprungMass.front', 'unsprungMassFrontKg', 'mass', [['≥', MIN.unsprungKg], ['≤', P.massMaxKg]], { label: 'Unsprung mass, front axle' }),
  num('unsprungMass.rear', 'unsprungMassRearKg', 'mass', [['≥', MIN.unsprungKg], ['≤', P.massMaxKg]], { label: 'Unsprung mass, rear axle' }),
];

/** `vehicle.tyre` and `vehicle.tyreRear` (SI `tyreFront`, `tyreRear`). */
export const TYRE_FIELDS: readonly NumberRow[] = [
  num('radius', 'radiusM', 'length', TYRE_RADIUS, { label: 'tyre radius' }),
  // Narrower than the track it runs on (checks.ts).
  num('width', 'widthM', 'length', TYRE_WIDTH, { label: 'tyre width' }),
  num('stiffness', 'stiffnessNPerM', 'stiffness', TYRE_STIFFNESS, { label: 'tyre stiffness' }),
];

/** `vehicle.suspension.front|rear` (SI `suspensionFront|Rear`); the `type` word is its own field. */
export const AXLE_FIELDS: readonly NumberRow[] = [
  num('wheelRate', 'wheelRateNPerM', 'stiffness', [['≥', MIN.wheelRateNPerM]], { label: 'Wheel rate' }),
  // Travel from ride height; 0 is allowed (a locked corner, a bump stop at rest).
  num('bump', 'bumpM', 'length', TRAVEL, { label: 'Bump travel' }),
  num('droop', 'droopM', 'length', TRAVEL, { label: 'Droop travel' }),
  num('antiRoll', 'antiRollNmPerRad', 'rollStiffness', [['≥', 0]], { default: 0, label: 'Anti-roll bar' }),
  // A roll centre may sit below the ground (some independent layouts), so only plausibility bounds apply.
  num('rollCentreHeight', 'rollCentreHeightM', 'length', [['≥', -P.cgHeightMaxM], ['≤', P.cgHeightMaxM]], { label: 'Roll-centre height' }),
  // Solid axles only (checks.ts).
  num('springSpacing', 'springSpacingM', 'length', [['>', 0], ['≤', P.trackMaxM]], { optional: true, label: 'Spring spacing' }),
];

/** `vehicle.body`: each key left out is derived from the vehicle (parse.ts defaultBodyShape). */
export const BODY_FIELDS: readonly NumberRow[] = [
  num('frontOverhang', 'frontOverhangM', 'length', [['≥', 0], ['≤', P.wheelbaseMaxM]], { optional: true, label: 'Front overhang' }),
  num('rearOverhang', 'rearOverhangM', 'length', [['≥', 0], ['≤', P.wheelbaseMaxM]], { optional: true, label: 'Rear overhang' }),
  num('width', 'widthM', 'length', [['>', 0], ['≤', P.trackMaxM]], { optional: true, label: 'Body width' }),
  num('bellyClearance', 'bellyClearanceM', 'length', [['>', 0], ['≤', P.cgHeightMaxM]], { optional: true, label: 'Belly clearance' }),
  num('frontBumperClearance', 'frontBumperClearanceM', 'length', [['>', 0], ['≤', P.cgHeightMaxM]], { optional: true, label: 'Front bumper clearance' }),
  num('rearBumperClearance', 'rearBumperClearanceM', 'length', [['>', 0], ['≤', P.cgHeightMaxM]], { optional: true, label: 'Rear bumper clearance' }),
  // Above the belly (checks.ts).
  num('roofHeight', 'roofHeightM', 'length', [['>', 0], ['≤', P.cgHeightMaxM]], { optional: true, label: 'Roof height' }),
];

/** One payload item (vehicle.payload[i], a build's payload[i]); `label` is its text field. */
export const PAYLOAD_FIELDS: readonly NumberRow[] = [
  num('mass', 'massKg', 'mass', [['>', 0], ['≤', P.massMaxKg]], { label: 'Mass' }),
  num('behindFrontAxle', 'behindFrontAxleM', 'length', COORD, { label: 'Behind front axle' }),
  num('height', 'heightM', 'length', [['≥', 0], ['≤', P.cgHeightMaxM]], { label: 'Height' }),
  num('leftOfCentre', 'leftOfCentreM', 'length', COORD, { default: 0, label: 'Left of centre' }),
];

export const FEATURE_TYPES = ['plane', 'step', 'block', 'rock', 'ramp', 'profile', 'grid'] as const;
export type FeatureType = (typeof FEATURE_TYPES)[number];

/** Terrain features, one table per type (the `type` word is the union's tag). */
export const FEATURE_FIELDS: Readonly<Record<FeatureType, readonly FieldRow[]>> = {
  plane: [
    // A plane steeper than vertical has no height function; tan must stay finite.
    num('grade', 'gradeRad', 'angle', SLOPE_DEG, { default: 0 }),
    num('crossSlope', 'crossSlopeRad', 'angle', SLOPE_DEG, { default: 0 }),
    num('height', 'heightM', 'length', FEATURE_HEIGHT, { default: 0 }),
  ],
  step: [
    num('x', 'xM', 'length', COORD),
    num('height', 'heightM', 'length', FEATURE_HEIGHT),
    range('y', 'yRangeM', true),
    num('edgeRadius', 'edgeRadiusM', 'length', [['≥', 0]], { default: 0 }),
  ],
  block: [
    range('x', 'xRangeM'),
    range('y', 'yRangeM'),
    num('height', 'heightM', 'length', FEATURE_HEIGHT),
    num('edgeRadius', 'edgeRadiusM', 'length', [['≥', 0]], { default: 0 }),
  ],
  rock: [
    num('x', 'xM', 'length', COORD),
    num('y', 'yM', 'length', COORD),
    num('height', 'heightM', 'length', [['>', 0], ['≤', P.heightMaxM]]),
    num('radius', 'radiusM', 'length', [['>', 0], ['≤', P.coordMaxM]]),
  ],
  ramp: [
    num('x', 'xM', 'length', COORD),
    num('angle', 'angleRad', 'angle', SLOPE_DEG),
    num('length', 'lengthM', 'length', [['>', 0], ['≤', P.coordMaxM]]),
    range('y', 'yRangeM', true),
  ],
  profile: [choice('axis', 'axis', ['x', 'y']), list('points', 'points', 'points'), range('across', 'acrossM', true)],
  grid: [
    pair('origin', 'originM', 'x, y'),
    num('spacing', 'spacingM', 'length', [['>', 0], ['≤', P.coordMaxM]]),
    int('cols', 'cols', 2),
    int('rows', 'rows', 2),
    list('heights', 'heights', 'heightsM'),
  ],
};

/** `pose.*`. */
export const POSE_FIELDS: readonly NumberRow[] = [
  num('x', 'xM', 'length', COORD, { default: 0 }),
  num('y', 'yM', 'length', COORD, { default: 0 }),
  num('heading', 'headingRad', 'angle', HEADING_DEG, { default: 0 }),
];

/** `tilt.angle` (the `downhill` direction, a name or an angle, is checked by hand). */
export const TILT_FIELDS: readonly NumberRow[] = [
  // Past ±180° the table would come round again; 180° is upside down.
  num('angle', 'angleRad', 'angle', [['≥', -180], ['≤', 180]], { default: 0 }),
];

/** `path.*` besides its points. The station spacing default is 5 cm. */
export const PATH_STEP_DEFAULT_M = 0.05;
export const PATH_FIELDS: readonly FieldRow[] = [
  num('step', 'stepM', 'length', [['>', 0]], { default: PATH_STEP_DEFAULT_M, label: 'Station spacing' }),
];
/**
 * One point of a path or of a saved candidate line, `{ "x": …, "y": … }` in the file's length unit
 * (terrain frame). `path.points` and `candidates[i].points` are lists of these (2 to
 * PATH_POINTS_MAX points, consecutive points apart); parse.ts and write.ts convert them.
 */
export const PATH_POINT_FIELDS: readonly NumberRow[] = [
  num('x', 'xM', 'length', COORD, { label: 'x' }),
  num('y', 'yM', 'length', COORD, { label: 'y' }),
];
/**
 * The first form of a path, still read and written for a straight path: `from` and `to`, each
 * `[x, y]` in the file's length unit. A path gives either these two or `points`.
 */
export const PATH_END_FIELDS: readonly PairRow[] = [pair('from', 'fromM', 'x, y'), pair('to', 'toM', 'x, y')];
/** The path's heading: optional, SI `null` when absent (the path's own direction). */
export const PATH_HEADING_FIELD: NumberRow = num('heading', 'headingRad', 'angle', HEADING_DEG, { optional: true });

/** `ground.friction` (SI: the scenario's `friction`). */
export const GROUND_FIELDS: readonly NumberRow[] = [
  // A friction coefficient above 3 is no tyre on any ground (Noon 1994 lists 0.1 to 0.75 on roads).
  // Default 0.7: loose moist dirt is 0.60–0.65 (Noon 1994).
  num('friction', 'friction', 'ratio', [['>', 0], ['≤', 3]], { default: 0.7 }),
];

// --- Reading and writing by row ---------------------------------------------------------------

type Obj = Record<string, unknown>;

/** Value at a dotted path (own properties only), or undefined. */
export function getPath(o: unknown, path: string): unknown {
  let cur: unknown = o;
  let start = 0;
  for (;;) {
    const dot = path.indexOf('.', start);
    const key = dot < 0 ? path.slice(start) : path.slice(start, dot);
    if (cur === null || typeof cur !== 'object' || !Object.prototype.hasOwnProperty.call(cur, key)) return undefined;
    cur = (cur as Obj)[key];
    if (dot < 0) return cur;
    start = dot + 1;
  }
}

/** Set a value at a dotted path, creating plain objects on the way (defined, not assigned). */
export function setPath(o: Obj, path: string, value: unknown): void {
  const keys = path.split('.');
  let cur = o;
  for (let i = 0; i < keys.length - 1; i++) {
    const k = keys[i];
    if (!Object.prototype.hasOwnProperty.call(cur, k)) Object.defineProperty(cur, k, { value: {}, enumerable: true, writable: true, configurable: true });
    cur = cur[k] as Obj;
  }
  Object.defineProperty(cur, keys[keys.length - 1], { value, enumerable: true, writable: true, configurable: true });
}

/**
 * Validated file values → SI, row by row, into `out`. A number row left out takes its default
 * (or stays absent); a range left out becomes `null`.
 */
export function rowsToSI(rows: readonly FieldRow[], file: unknown, u: UnitSystem, out: Obj): Obj {
  for (const row of rows) {
    const v = getPath(file, row.file);
    switch (row.type) {
      case 'number': {
        if (v === undefined) {
          if (row.default !== undefined) setPath(out, row.si, toSI(row.kind, metricToFileUnits(row.kind, row.default, u), u));
        } else setPath(out, row.si, toSI(row.kind, v as number, u));
        break;
      }
      case 'range':
      case 'pair': {
        const r = v as readonly [number, number] | undefined;
        setPath(out, row.si, r ? [toSI('length', r[0], u), toSI('length', r[1], u)] : null);
        break;
      }
      case 'points':
        setPath(out, row.si, (v as readonly (readonly [number, number])[]).map((p) => [toSI('length', p[0], u), toSI('length', p[1], u)] as const));
        break;
      case 'heights': {
        // The schema has already copied the heights into a fresh Float64Array; converted in place.
        const h = v as Float64Array;
        if (u !== 'metric') for (let i = 0; i < h.length; i++) h[i] = toSI('length', h[i], u);
        setPath(out, row.si, h);
        break;
      }
      default:
        setPath(out, row.si, v);
    }
  }
  return out;
}

/** SI → file numbers, row by row, into `out` (a null range and an absent optional number are left out). */
export function rowsToFile(rows: readonly FieldRow[], si: unknown, u: UnitSystem, out: Obj): Obj {
  const m = (x: number) => fileNumber('length', x, u);
  for (const row of rows) {
    const v = getPath(si, row.si);
    switch (row.type) {
      case 'number':
        if (v !== undefined) setPath(out, row.file, fileNumber(row.kind, v as number, u));
        break;
      case 'range':
      case 'pair': {
        const r = v as readonly [number, number] | null;
        if (r) setPath(out, row.file, [m(r[0]), m(r[1])]);
        break;
      }
      case 'points':
        setPath(out, row.file, (v as readonly (readonly [number, number])[]).map((p) => [m(p[0]), m(p[1])]));
        break;
      case 'heights': {
        const h = v as ArrayLike<number>;
        const a: number[] = new Array(h.length);
        for (let i = 0; i < h.length; i++) a[i] = m(h[i]);
        setPath(out, row.file, a);
        break;
      }
      default:
        setPath(out, row.file, v);
    }
  }
  return out;
}
