/**
 * Scenario file → core `Scenario` (SI). Never throws: every problem becomes a `ScenarioError`
 * naming the field path, the bad value and the expected unit or range, and all of them are
 * collected in one pass.
 *
 * Steps: (1) copy the input into plain JSON data, refusing anything else (class instances,
 * functions, cycles) and turning a "__proto__" key into an ordinary own key, so that nothing
 * inherited is ever read and nothing is polluted; (2) the zod schema for the file's unit system;
 * (3) checks across fields; (4) conversion to SI with the defaults applied in one place.
 */
import { base64Length, compactHeightCount, decodeMask } from '../ground/base64';
import { migrateScenario } from './migrate';
import type { AxleSuspension, BodyShape, PathSpec, PayloadItem, Pose, TerrainFeature, Tilt, TyreSpec, Vehicle } from '../model/types';
import type { CandidateLine, ParseResult, Scenario, ScenarioError, UnitSystem } from './types';
import { polylinePath, type PathXY } from '../analysis/pathGeometry';
import {
  DOWNHILL_NAMES,
  SCENARIO_LIMITS,
  scenarioFileSchema,
  type ScenarioFileData,
} from './schema';
import { describeValue, formatLimit, formatPath, withUnit } from './messages';
import {
  AXLE_FIELDS,
  BODY_FIELDS,
  FEATURE_FIELDS,
  GROUND_FIELDS,
  PATH_FIELDS,
  PATH_STEP_DEFAULT_M,
  PAYLOAD_FIELDS,
  POSE_FIELDS,
  RAD_PER_DEG,
  TILT_FIELDS,
  TYRE_FIELDS,
  VEHICLE_FIELDS,
  fileNumber,
  metricToFileUnits,
  rowsToSI,
  toSI,
  unitLabel,
  type FieldRow,
} from './fields';
import { buildsCrossChecks, buildsToSI } from './builds';
import { decodeScenarioBytes, readScenarioJson } from './read';

/**
 * Defaults for optional fields, in metric file units (m, deg). Applied only in `toScenario`.
 */
export const SCENARIO_DEFAULTS = {
  /** @default "" */
  notes: '',
  /** Lateral CG offset (m). @default 0 */
  leftOfCentreM: 0,
  /** Anti-roll bar (N·m/deg). @default 0 (none) */
  antiRollNmPerDeg: 0,
  /** Pose (m, deg). @default 0, 0, 0 */
  poseXM: 0,
  poseYM: 0,
  poseHeadingDeg: 0,
  /** Tilt angle (deg). @default 0 */
  tiltAngleDeg: 0,
  /** Tilt direction. @default "left" (left side down) */
  tiltDownhill: 'left' as const,
  /** Path station spacing (m). @default 0.05 */
  pathStepM: PATH_STEP_DEFAULT_M,
  /** Tyre-on-ground friction coefficient. @default 0.7 (loose moist dirt is 0.60–0.65, Noon 1994) */
  friction: 0.7,
  /** Plane grade and cross slope (deg) and height (m). @default 0 */
  planeDeg: 0,
  /** Edge radius of steps and blocks (m). @default 0 (sharp) */
  edgeRadiusM: 0,
} as const;

/**
 * Rough body outline used when the file gives no `vehicle.body` (or leaves some of its keys out).
 * Ballpark values for a stock mid-size 4×4 (common practice, invented, not measured); a clearance
 * check is only as good as the outline, so the parser warns when it uses them.
 * - overhangs: 0.9 m front, 1.0 m rear
 * - width: the wider track plus the wider tyre (the body reaches the tyres' outer faces)
 * - belly: 0.6 × the smaller tyre radius (a 0.39 m tyre gives 0.23 m of clearance)
 * - bumpers: 1.1 × the front tyre radius, 1.2 × the rear tyre radius
 * - roof: 2.4 × the CG height (a 0.78 m CG gives a 1.87 m roof)
 */
export function defaultBodyShape(v: Omit<Vehicle, 'body' | 'payload'>): BodyShape {
  return {
    frontOverhangM: 0.9,
    rearOverhangM: 1.0,
    widthM: Math.max(v.trackFrontM, v.trackRearM) + Math.max(v.tyreFront.widthM, v.tyreRear.widthM),
    bellyClearanceM: 0.6 * Math.min(v.tyreFront.radiusM, v.tyreRear.radiusM),
    frontBumperClearanceM: 1.1 * v.tyreFront.radiusM,
    rearBumperClearanceM: 1.2 * v.tyreRear.radiusM,
    roofHeightM: 2.4 * v.cg.heightM,
  };
}

const MAX_DEPTH = 32;

type Plain = Record<string, unknown>;

function isPlainObject(v: unknown): v is Plain {
  if (v === null || typeof v !== 'object' || Array.isArray(v)) return false;
  const proto = Object.getPrototypeOf(v);
  return proto === Object.prototype || proto === null;
}

/** Own property only: inherited values (from a prototype) are never read. */
function own(o: unknown, key: string): unknown {
  return isPlainObject(o) && Object.prototype.hasOwnProperty.call(o, key) ? o[key] : undefined;
}

/**
 * Deep copy into plain JSON data. Keys are defined, not assigned, so a "__proto__" key stays an
 * ordinary (and then unknown) key. Typed arrays become plain arrays.
 */
function toPlainData(
  v: unknown,
  path: (string | number)[],
  errors: ScenarioError[],
  blocked: string[],
  ancestors: unknown[],
): unknown {
  if (v === null || v === undefined || typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  const refuse = (message: string): undefined => {
    const p = formatPath(path);
    errors.push({ path: p, message });
    blocked.push(p);
    return undefined;
  };
  if (typeof v !== 'object') return refuse(`must be JSON data (object, list, text, number, true/false, null), got a ${typeof v}`);
  if (ancestors.includes(v)) return refuse('refers back to itself (a cycle); a scenario must be a tree of JSON data');
  if (ancestors.length >= MAX_DEPTH) return refuse(`nested deeper than ${MAX_DEPTH} levels`);
  if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    return Array.from(v as unknown as ArrayLike<number>);
  }
  ancestors.push(v);
  try {
    if (Array.isArray(v)) {
      const out: unknown[] = new Array(v.length);
      for (let i = 0; i < v.length; i++) {
        const x = v[i];
        if (x === null || typeof x === 'number' || typeof x === 'string' || typeof x === 'boolean') out[i] = x;
        else {
          path.push(i);
          out[i] = toPlainData(x, path, errors, blocked, ancestors);
          path.pop();
        }
      }
      return out;
    }
    if (!isPlainObject(v)) {
      // Name the class only when the prototype itself declares it (Date, Map, a user class).
      const proto: unknown = Object.getPrototypeOf(v);
      const ctor = Object.prototype.hasOwnProperty.call(proto, 'constructor') ? (proto as { constructor?: { name?: unknown } }).constructor : undefined;
      const name = typeof ctor?.name === 'string' && ctor.name !== '' && ctor.name !== 'Object' ? ctor.name : '';
      return refuse(`must be JSON data, got ${name ? `a ${name}` : 'an object with a prototype'}`);
    }
    const out: Plain = {};
    for (const key of Object.keys(v)) {
      path.push(key);
      const value = toPlainData(v[key], path, errors, blocked, ancestors);
      path.pop();
      Object.defineProperty(out, key, { value, enumerable: true, writable: true, configurable: true });
    }
    return out;
  } finally {
    ancestors.pop();
  }
}

/** Message for any zod issue that a field's own message builder did not cover. */
function fallbackMessage(iss: { code?: string; input?: unknown; expected?: unknown }): string {
  if (iss.input === undefined) return 'required';
  switch (iss.code) {
    case 'invalid_type':
      return `must be ${typeof iss.expected === 'string' ? `a ${iss.expected}` : 'of another type'}, got ${describeValue(iss.input)}`;
    case 'too_small':
    case 'too_big':
      return `out of range, got ${describeValue(iss.input)}`;
    default:
      return `not allowed here, got ${describeValue(iss.input)}`;
  }
}

interface ZodIssueLike {
  readonly code: string;
  readonly path: readonly PropertyKey[];
  readonly message: string;
  readonly keys?: readonly string[];
}

function isUnder(path: string, prefix: string): boolean {
  return (
    path === prefix ||
    prefix === '(file)' ||
    (path.startsWith(prefix) && (path[prefix.length] === '.' || path[prefix.length] === '['))
  );
}

/**
 * Checks across fields, on the plain data, for fields that are themselves valid. Also run on the
 * small file view of an edited scenario (checkSI.ts), so the rules exist once.
 */
export function crossChecks(data: unknown, units: UnitSystem, errors: ScenarioError[]): void {
  const bad = new Set(errors.map((e) => e.path));
  const L = unitLabel('length', units);
  const M = unitLabel('mass', units);
  const push = (path: string, message: string) => errors.push({ path, message });
  /** A finite number at a field that has no error of its own. */
  const num = (path: string, v: unknown): v is number => typeof v === 'number' && Number.isFinite(v) && !bad.has(path);
  const positive = (path: string, v: unknown): v is number => num(path, v) && v > 0;

  const vehicle = own(data, 'vehicle');
  const wb = own(vehicle, 'wheelbase');
  const track = own(vehicle, 'track');
  const tf = own(track, 'front');
  const tr = own(track, 'rear');
  const cg = own(vehicle, 'cg');

  // The vehicle's CG lies between the axles (on an axle at most): the static load split needs it.
  const cx = own(cg, 'behindFrontAxle');
  if (positive('vehicle.wheelbase', wb) && num('vehicle.cg.behindFrontAxle', cx) && (cx < 0 || cx > wb)) {
    push('vehicle.cg.behindFrontAxle', `must lie within the wheelbase (0 to ${withUnit(wb, L)}), got ${describeValue(cx)}`);
  }
  // A CG offset of half a track or more puts it over (or past) a tyre line: tipped at rest.
  const cy = own(cg, 'leftOfCentre');
  if (positive('vehicle.track.front', tf) && positive('vehicle.track.rear', tr) && num('vehicle.cg.leftOfCentre', cy)) {
    const half = Math.min(tf, tr) / 2;
    if (Math.abs(cy) >= half) {
      push('vehicle.cg.leftOfCentre', `must lie within half the narrower track (±${withUnit(half, L)}), got ${describeValue(cy)}`);
    }
  }
  // Unsprung masses are part of the total mass; the body must have a mass of its own.
  const mass = own(vehicle, 'mass');
  const unsprung = own(vehicle, 'unsprungMass');
  const uf = own(unsprung, 'front');
  const ur = own(unsprung, 'rear');
  if (
    positive('vehicle.mass', mass) &&
    positive('vehicle.unsprungMass.front', uf) &&
    positive('vehicle.unsprungMass.rear', ur) &&
    uf + ur >= mass
  ) {
    push('vehicle.unsprungMass', `front + rear must be < vehicle.mass (${withUnit(mass, M)}), got ${formatLimit(uf + ur)}`);
  }
  // Tyres narrower than the track they run on (else the two tyres of an axle overlap).
  const tyre = own(vehicle, 'tyre');
  const tyreRear = own(vehicle, 'tyreRear');
  const hasRear = tyreRear !== undefined;
  const tw = own(tyre, 'width');
  if (num('vehicle.tyre.width', tw) && positive('vehicle.track.front', tf) && (hasRear || positive('vehicle.track.rear', tr))) {
    const useRear = !hasRear && (tr as number) < tf;
    const limit = useRear ? (tr as number) : tf;
    if (tw >= limit) push('vehicle.tyre.width', `must be < the ${useRear ? 'rear' : 'front'} track (${withUnit(limit, L)}), got ${describeValue(tw)}`);
  }
  const twr = own(tyreRear, 'width');
  if (hasRear && num('vehicle.tyreRear.width', twr) && positive('vehicle.track.rear', tr) && twr >= tr) {
    push('vehicle.tyreRear.width', `must be < the rear track (${withUnit(tr, L)}), got ${describeValue(twr)}`);
  }
  // Spring spacing describes a beam axle's two springs; an independent corner has no such thing.
  const susp = own(vehicle, 'suspension');
  for (const end of ['front', 'rear'] as const) {
    const axle = own(susp, end);
    if (own(axle, 'type') === 'independent' && own(axle, 'springSpacing') !== undefined) {
      push(`vehicle.suspension.${end}.springSpacing`, 'only for a "solid" axle; this axle is "independent"');
    }
  }
  // Roof above belly.
  const body = own(vehicle, 'body');
  const belly = own(body, 'bellyClearance');
  const roof = own(body, 'roofHeight');
  if (num('vehicle.body.bellyClearance', belly) && num('vehicle.body.roofHeight', roof) && roof <= belly) {
    push('vehicle.body.roofHeight', `must be > vehicle.body.bellyClearance (${withUnit(belly, L)}), got ${describeValue(roof)}`);
  }

  // Grid: cols × rows within the node limit, and exactly that many heights.
  const features = own(own(data, 'terrain'), 'features');
  if (Array.isArray(features)) {
    for (let i = 0; i < features.length && i < SCENARIO_LIMITS.features; i++) {
      const f = features[i];
      if (own(f, 'type') !== 'grid') continue;
      const p = `terrain.features[${i}]`;
      const cols = own(f, 'cols');
      const rows = own(f, 'rows');
      if (!num(`${p}.cols`, cols) || !num(`${p}.rows`, rows) || !Number.isInteger(cols) || !Number.isInteger(rows)) continue;
      if (cols < 2 || rows < 2) continue;
      const n = cols * rows;
      if (n > SCENARIO_LIMITS.gridNodes) {
        push(p, `cols × rows must be ≤ ${SCENARIO_LIMITS.gridNodes} nodes, got ${n}`);
        continue;
      }
      const heights = own(f, 'heights');
      if (Array.isArray(heights) && heights.length !== n && heights.length <= SCENARIO_LIMITS.gridNodes) {
        push(`${p}.heights`, `must have cols × rows = ${n} values, got ${heights.length}`);
      }
      // The compact (base64) form of imported ground, and its filled mask.
      const count = typeof heights === 'string' ? compactHeightCount(heights) : -1;
      if (count >= 0 && count !== n) push(`${p}.heights`, `must hold cols × rows = ${n} heights, holds ${count}`);
      const filled = own(f, 'filled');
      if (typeof filled === 'string' && base64Length(filled) >= 0 && base64Length(filled) !== Math.ceil(n / 8)) {
        push(`${p}.filled`, `must hold one bit per node (${Math.ceil(n / 8)} bytes), holds ${base64Length(filled)}`);
      }
    }
  }

  // Path: either `points` or the first form `from` + `to`; legs of some length; not more stations
  // than a pass can afford. Saved candidate lines: the same rules, names used once.
  const path = own(data, 'path');
  const pairOk = (p: string, v: unknown): v is [number, number] =>
    Array.isArray(v) && v.length === 2 && num(`${p}[0]`, v[0]) && num(`${p}[1]`, v[1]) && !bad.has(p);
  const stepRaw = own(path, 'step');
  const step = stepRaw === undefined ? metricToFileUnits('length', SCENARIO_DEFAULTS.pathStepM, units) : stepRaw;
  if (isPlainObject(path)) {
    const points = own(path, 'points');
    const from = own(path, 'from');
    const to = own(path, 'to');
    let xy: [number, number][] | null = null;
    if (points !== undefined) {
      if (from !== undefined || to !== undefined) push('path.points', 'give either points or from and to (the first form), not both');
      else xy = pointList('path.points', points);
    } else if (from === undefined && to === undefined) {
      push('path.points', `required (a list of 2 to ${SCENARIO_LIMITS.pathPoints} points { "x", "y" } in ${L}), or from and to`);
    } else if (from === undefined || to === undefined) {
      push(from === undefined ? 'path.from' : 'path.to', `required (with path.${from === undefined ? 'to' : 'from'})`);
    } else if (pairOk('path.from', from) && pairOk('path.to', to)) {
      if (from[0] === to[0] && from[1] === to[1]) push('path.to', `must differ from path.from, got ${describeValue(to)}`);
      else xy = [from, to];
    }
    const dist = xy ? polylineLength(xy) : 0;
    if (dist > 0 && positive('path.step', step)) {
      const stations = Math.floor(dist / step) + 1;
      if (stations > SCENARIO_LIMITS.pathStations) {
        const minStep = dist / (SCENARIO_LIMITS.pathStations - 1);
        push(
          'path.step',
          `must be ≥ ${withUnit(minStep, L)} for at most ${SCENARIO_LIMITS.pathStations} stations on this path, got ${describeValue(step)}${stepRaw === undefined ? ' (the default)' : ''}`,
        );
      }
    }
  }
  const candidates = own(data, 'candidates');
  if (Array.isArray(candidates) && candidates.length <= SCENARIO_LIMITS.candidates) {
    const names = new Map<string, number>();
    candidates.forEach((c, i) => {
      const p = `candidates[${i}]`;
      const name = own(c, 'name');
      if (typeof name === 'string' && !bad.has(`${p}.name`)) {
        const first = names.get(name);
        if (first !== undefined) push(`${p}.name`, `already the name of candidates[${first}] (${describeValue(name)}); each saved line needs its own name`);
        else names.set(name, i);
      }
      const xy = pointList(`${p}.points`, own(c, 'points'));
      const dist = xy ? polylineLength(xy) : 0;
      if (dist > 0 && positive('path.step', step) && Math.floor(dist / step) + 1 > SCENARIO_LIMITS.pathStations) {
        push(`${p}.points`, `this line is ${withUnit(dist, L)} long: more than ${SCENARIO_LIMITS.pathStations} stations at the path's step (${withUnit(step, L)})`);
      }
    });
  }

  /** The points of a list whose entries are valid, each apart from the one before; null when any is bad. */
  function pointList(p: string, v: unknown): [number, number][] | null {
    if (!Array.isArray(v) || v.length < 2 || v.length > SCENARIO_LIMITS.pathPoints || bad.has(p)) return null;
    const out: [number, number][] = [];
    let ok = true;
    for (let i = 0; i < v.length; i++) {
      const x = own(v[i], 'x');
      const y = own(v[i], 'y');
      if (!num(`${p}[${i}].x`, x) || !num(`${p}[${i}].y`, y) || bad.has(`${p}[${i}]`)) {
        ok = false;
        continue;
      }
      const prev = out[out.length - 1];
      if (ok && prev && prev[0] === x && prev[1] === y) {
        push(`${p}[${i}]`, `must differ from ${p}[${i - 1}] (a leg of length 0), got x ${x}, y ${y}`);
        ok = false;
      }
      out.push([x, y]);
    }
    return ok ? out : null;
  }
}

/** Length along a list of points (in their unit). */
function polylineLength(xy: readonly (readonly [number, number])[]): number {
  let d = 0;
  for (let i = 1; i < xy.length; i++) d += Math.hypot(xy[i][0] - xy[i - 1][0], xy[i][1] - xy[i - 1][1]);
  return d;
}

/** Validated file data → the SI core form, defaults applied (from the field table, fields.ts). */
function toScenario(d: ScenarioFileData, warnings: string[]): Scenario {
  const u = d.units;
  const D = SCENARIO_DEFAULTS;
  const si = <T>(rows: readonly FieldRow[], file: unknown, extra: Record<string, unknown> = {}): T =>
    rowsToSI(rows, file, u, extra) as T;

  const v = d.vehicle;
  const tyre = (t: unknown): TyreSpec => si<TyreSpec>(TYRE_FIELDS, t);
  const axle = (a: { type: AxleSuspension['type'] }): AxleSuspension => si<AxleSuspension>(AXLE_FIELDS, a, { type: a.type });
  const payload: PayloadItem[] = (v.payload ?? []).map((p) => si<PayloadItem>(PAYLOAD_FIELDS, p, { label: p.label }));
  const base = si<Omit<Vehicle, 'body' | 'payload'>>(VEHICLE_FIELDS, v, {
    name: v.name,
    tyreFront: tyre(v.tyre),
    tyreRear: tyre(v.tyreRear ?? v.tyre),
    suspensionFront: axle(v.suspension.front),
    suspensionRear: axle(v.suspension.rear),
  });
  const fallback = defaultBodyShape(base);
  const given = si<Partial<BodyShape>>(BODY_FIELDS, v.body ?? {});
  const body: Record<string, number> = {};
  const defaulted: string[] = [];
  for (const row of BODY_FIELDS) {
    const key = row.si as keyof BodyShape;
    const value = given[key];
    if (value === undefined) defaulted.push(row.file);
    body[key] = value ?? fallback[key];
  }
  if (defaulted.length === BODY_FIELDS.length) {
    warnings.push('vehicle.body: not given; using a rough outline derived from the vehicle: clearance results are only indicative');
  } else if (defaulted.length > 0) {
    warnings.push(`vehicle.body: ${defaulted.join(', ')} not given; using rough values derived from the vehicle`);
  }
  const vehicle: Vehicle = { ...base, payload, body: body as unknown as BodyShape };

  // A roll centre at or above the CG reverses the body's lean: legal, but usually a typo.
  for (const [end, a] of [['front', vehicle.suspensionFront], ['rear', vehicle.suspensionRear]] as const) {
    if (a.rollCentreHeightM >= vehicle.cg.heightM) {
      warnings.push(
        `vehicle.suspension.${end}.rollCentreHeight: at or above the CG height (${withUnit(fileNumber('length', vehicle.cg.heightM, u), unitLabel('length', u))}); the body would lean into the slope`,
      );
    }
  }

  const features = d.terrain.features.map((f): TerrainFeature => {
    const out = si<TerrainFeature>(FEATURE_FIELDS[f.type], f, { type: f.type });
    if (f.type !== 'grid' || out.type !== 'grid') return out;
    // Imported ground: the filled-cell mask and the record of where it came from.
    return {
      ...out,
      ...(f.filled !== undefined ? { filledMask: decodeMask(f.filled, out.cols * out.rows) } : {}),
      ...(f.source !== undefined
        ? { source: { file: f.source.file, format: f.source.format, crs: f.source.crs, originSource: f.source.origin, sourceUnitM: f.source.unit } }
        : {}),
    } as TerrainFeature;
  });

  const tilt = d.tilt ?? {};
  const downhill = tilt.downhill ?? D.tiltDownhill;
  // Downhill direction, normalised into [0°, 360°) before conversion.
  const downhillDeg = typeof downhill === 'string' ? DOWNHILL_NAMES[downhill] : ((downhill % 360) + 360) % 360;
  let path: PathSpec | null = null;
  if (d.path) {
    const m = (v: number) => toSI('length', v, u);
    const pts: PathXY[] = d.path.points
      ? d.path.points.map((q) => [m(q.x as number), m(q.y as number)] as const)
      : [d.path.from as PathXY, d.path.to as PathXY].map((q) => [m(q[0]), m(q[1])] as const);
    const rest = si<Pick<PathSpec, 'stepM'>>(PATH_FIELDS, d.path);
    path = polylinePath(pts, rest.stepM, d.path.heading === undefined ? null : toSI('angle', d.path.heading as number, u));
  }
  const candidates: CandidateLine[] | undefined = d.candidates?.map((c) => ({
    name: c.name,
    pointsM: c.points.map((q) => [toSI('length', q.x as number, u), toSI('length', q.y as number, u)] as const),
  }));
  return {
    version: d.version,
    name: d.name,
    units: u,
    vehicle,
    terrain: { features },
    pose: si<Pose>(POSE_FIELDS, d.pose ?? {}),
    tilt: { ...si<Pick<Tilt, 'angleRad'>>(TILT_FIELDS, tilt), downhillRad: downhillDeg * RAD_PER_DEG },
    path,
    ...si<{ friction: number }>(GROUND_FIELDS, d.ground ?? {}),
    notes: d.notes ?? D.notes,
    ...(d.builds ? { builds: buildsToSI(d.builds, u) } : {}),
    ...(candidates ? { candidates } : {}),
  };
}

function dedupe(errors: ScenarioError[]): ScenarioError[] {
  const seen = new Set<string>();
  const out: ScenarioError[] = [];
  for (const e of errors) {
    const k = `${e.path}\u0000${e.message}`;
    if (seen.has(k)) continue;
    seen.add(k);
    out.push(e);
  }
  return out;
}

function internalError(e: unknown): ParseResult {
  const why = e instanceof Error ? e.message : String(e);
  return { ok: false, errors: [{ path: '(file)', message: `could not be read: internal error (${why})` }] };
}

/**
 * Validate a scenario given as parsed JSON data (or any value) and convert it to the SI core form.
 * Never throws. Errors list every problem found; warnings note defaults and odd-but-legal values.
 */
export function parseScenario(input: unknown): ParseResult {
  try {
    const errors: ScenarioError[] = [];
    const blocked: string[] = [];
    const plain = toPlainData(input, [], errors, blocked, []);
    // Older files are brought up to the current format version first (migrate.ts).
    const migrated = migrateScenario(plain);
    if (!migrated.ok) return { ok: false, errors: migrated.errors };
    const data = migrated.file;
    if (data !== undefined && !isPlainObject(data) && blocked.length === 0) {
      return { ok: false, errors: [{ path: '(file)', message: `must be a JSON object, got ${describeValue(data)}` }] };
    }
    if (data === undefined && blocked.length === 0) {
      return { ok: false, errors: [{ path: '(file)', message: 'must be a JSON object, got nothing' }] };
    }
    // Units first: they decide how every other number reads. An unknown system is reported by the
    // schema; the remaining messages then speak metric.
    const units: UnitSystem = own(data, 'units') === 'imperial' ? 'imperial' : 'metric';
    const result = scenarioFileSchema(units).safeParse(data, { error: fallbackMessage });
    if (!result.success) {
      for (const iss of result.error.issues as readonly ZodIssueLike[]) {
        if (iss.code === 'unrecognized_keys' && iss.keys) {
          for (const key of iss.keys) errors.push({ path: formatPath([...iss.path, key]), message: 'unknown key' });
          continue;
        }
        const p = formatPath(iss.path);
        // A value already refused as non-JSON data is not reported again.
        if (blocked.some((b) => isUnder(p, b))) continue;
        errors.push({ path: p, message: iss.message });
      }
    }
    crossChecks(data, units, errors);
    buildsCrossChecks(data, errors);
    if (errors.length > 0 || !result.success) return { ok: false, errors: dedupe(errors) };
    const warnings: string[] = [...migrated.warnings];
    const scenario = toScenario(result.data, warnings);
    return { ok: true, scenario, warnings };
  } catch (e) {
    return internalError(e);
  }
}

/**
 * Validate a scenario file's text (JSON). Never throws; a syntax error, a duplicate key or a file
 * past the size limit is one error at its place ("(file)" or the key's path).
 */
export function parseScenarioText(text: string): ParseResult {
  try {
    if (typeof text !== 'string') {
      return { ok: false, errors: [{ path: '(file)', message: `must be text, got ${describeValue(text)}` }] };
    }
    const read = readScenarioJson(text);
    return read.ok ? parseScenario(read.value) : { ok: false, errors: read.errors };
  } catch (e) {
    return internalError(e);
  }
}

/** Validate a scenario file's bytes: the size limit first, then the encoding (read.ts), then as text. */
export function parseScenarioBytes(bytes: Uint8Array): ParseResult {
  try {
    const decoded = decodeScenarioBytes(bytes);
    return decoded.ok ? parseScenarioText(decoded.value) : { ok: false, errors: decoded.errors };
  } catch (e) {
    return internalError(e);
  }
}
