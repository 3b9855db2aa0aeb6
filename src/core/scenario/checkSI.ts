/**
 * Checking a scenario that is already in its SI form, after an edit in the app: every field of
 * the field table against its bounds, the names, and the checks across fields, with the same
 * messages as the file parser (in the units asked for). Its cost does not depend on the size of
 * the terrain: list-valued fields (grid heights, profile points) can only come from a file, where
 * `parseScenario` checks them element by element, and an edit never changes them.
 */
import type { Scenario, ScenarioError, UnitSystem } from './types';
import {
  AXLE_FIELDS,
  BODY_FIELDS,
  FEATURE_FIELDS,
  GROUND_FIELDS,
  PATH_FIELDS,
  PATH_HEADING_FIELD,
  PATH_POINT_FIELDS,
  PAYLOAD_FIELDS,
  POSE_FIELDS,
  TILT_FIELDS,
  TYRE_FIELDS,
  VEHICLE_FIELDS,
  COORD,
  fileNumber,
  getPath,
  metricToFileUnits,
  rowsToFile,
  unitLabel,
  type Bound,
  type FieldRow,
  type QuantityKind,
} from './fields';
import { boundMessage, controlCharProblem, describeValue } from './messages';
import { SCENARIO_LIMITS } from './schema';
import { crossChecks } from './parse';
import { pathToFile } from './write';
import { pathPoints } from '../analysis/pathGeometry';

/** The first bound a file value breaks, as a message; null when it keeps them all. */
export function boundProblem(kind: QuantityKind, bounds: readonly Bound[], fileValue: number, units: UnitSystem): string | null {
  const unit = unitLabel(kind, units);
  if (!Number.isFinite(fileValue)) return `must be a finite number${unit ? ` in ${unit}` : ''}, got ${describeValue(fileValue)}`;
  for (const [op, metric] of bounds) {
    const b = metricToFileUnits(kind, metric, units);
    const ok = op === '>' ? fileValue > b : op === '≥' ? fileValue >= b : op === '<' ? fileValue < b : fileValue <= b;
    if (!ok) return boundMessage(op, b, unit, fileValue);
  }
  return null;
}

function textProblem(v: unknown, maxChars: number, nonEmpty: boolean, multiline = false): string | null {
  if (typeof v !== 'string') return `must be text, got ${describeValue(v)}`;
  if (v.length > maxChars) return `must be at most ${maxChars} characters, got ${v.length}`;
  if (nonEmpty && v.length === 0) return 'must not be empty';
  return controlCharProblem(v, multiline);
}

/** Check the SI values of `rows` under `si`, naming each error by its file path `prefix.file`. */
function checkRows(rows: readonly FieldRow[], si: unknown, prefix: string, units: UnitSystem, errors: ScenarioError[]): void {
  const at = (file: string) => (prefix ? `${prefix}.${file}` : file);
  for (const row of rows) {
    const v = getPath(si, row.si);
    switch (row.type) {
      case 'number': {
        if (v === undefined && row.optional) break;
        const p = boundProblem(row.kind, row.bounds, typeof v === 'number' ? fileNumber(row.kind, v, units) : NaN, units);
        if (p) errors.push({ path: at(row.file), message: p });
        break;
      }
      case 'range':
      case 'pair': {
        if (v === null && row.optional) break;
        const r = v as readonly [number, number] | null;
        if (!r) {
          errors.push({ path: at(row.file), message: 'required' });
          break;
        }
        for (let i = 0; i < 2; i++) {
          const p = boundProblem('length', COORD, fileNumber('length', r[i], units), units);
          if (p) errors.push({ path: `${at(row.file)}[${i}]`, message: p });
        }
        if (row.type === 'range' && !(r[0] < r[1])) {
          errors.push({ path: at(row.file), message: `must have from < to, got ${describeValue([fileNumber('length', r[0], units), fileNumber('length', r[1], units)])}` });
        }
        break;
      }
      case 'int':
        if (!Number.isInteger(v) || (v as number) < row.min) errors.push({ path: at(row.file), message: `must be a whole number ≥ ${row.min}, got ${describeValue(v)}` });
        break;
      case 'choice':
        if (!row.values.includes(v as string)) errors.push({ path: at(row.file), message: `must be one of ${row.values.join(', ')}, got ${describeValue(v)}` });
        break;
      default:
        // Lists (grid heights, profile points): checked where they enter, in parseScenario.
        break;
    }
  }
}

/**
 * Every rule of the scenario file, on the SI form, with messages by file path in `units`.
 * @default units the scenario's own
 */
export function checkScenarioSI(s: Scenario, units: UnitSystem = s.units): ScenarioError[] {
  const L = SCENARIO_LIMITS;
  const errors: ScenarioError[] = [];
  const text = (path: string, v: unknown, max: number, nonEmpty: boolean, multiline = false) => {
    const p = textProblem(v, max, nonEmpty, multiline);
    if (p) errors.push({ path, message: p });
  };
  const v = s.vehicle;
  text('name', s.name, L.nameChars, true);
  text('notes', s.notes, L.notesChars, false, true);
  text('vehicle.name', v.name, L.nameChars, true);
  checkRows(VEHICLE_FIELDS, v, 'vehicle', units, errors);
  checkRows(TYRE_FIELDS, v.tyreFront, 'vehicle.tyre', units, errors);
  checkRows(TYRE_FIELDS, v.tyreRear, 'vehicle.tyreRear', units, errors);
  for (const end of ['front', 'rear'] as const) {
    const a = end === 'front' ? v.suspensionFront : v.suspensionRear;
    if (a.type !== 'solid' && a.type !== 'independent') {
      errors.push({ path: `vehicle.suspension.${end}.type`, message: `must be "solid" or "independent", got ${describeValue(a.type)}` });
    }
    checkRows(AXLE_FIELDS, a, `vehicle.suspension.${end}`, units, errors);
  }
  checkRows(BODY_FIELDS, v.body, 'vehicle.body', units, errors);
  if (v.payload.length > L.payloadItems) {
    errors.push({ path: 'vehicle.payload', message: `must have at most ${L.payloadItems} payload items, got ${v.payload.length}` });
  }
  v.payload.forEach((p, i) => {
    text(`vehicle.payload[${i}].label`, p.label, L.nameChars, true);
    checkRows(PAYLOAD_FIELDS, p, `vehicle.payload[${i}]`, units, errors);
  });
  if (s.terrain.features.length > L.features) {
    errors.push({ path: 'terrain.features', message: `must have at most ${L.features} features, got ${s.terrain.features.length}` });
  }
  s.terrain.features.forEach((f, i) => {
    const rows = FEATURE_FIELDS[f.type];
    if (!rows) errors.push({ path: `terrain.features[${i}].type`, message: `unknown feature type ${describeValue(f.type)}` });
    else checkRows(rows, f, `terrain.features[${i}]`, units, errors);
  });
  checkRows(POSE_FIELDS, s.pose, 'pose', units, errors);
  checkRows(TILT_FIELDS, s.tilt, 'tilt', units, errors);
  if (s.path) {
    checkRows(PATH_FIELDS, s.path, 'path', units, errors);
    if (s.path.headingRad !== null) checkRows([PATH_HEADING_FIELD], s.path, 'path', units, errors);
    const n = 2 + (s.path.viaM?.length ?? 0);
    if (n > L.pathPoints) errors.push({ path: 'path.points', message: `must have at most ${L.pathPoints} points ({ "x", "y" }), got ${n}` });
    else pathPoints(s.path).forEach((q, i) => checkRows(PATH_POINT_FIELDS, { xM: q[0], yM: q[1] }, `path.points[${i}]`, units, errors));
  }
  const candidates = s.candidates ?? [];
  if (candidates.length > L.candidates) {
    errors.push({ path: 'candidates', message: `must have at most ${L.candidates} candidate lines, got ${candidates.length}` });
  } else {
    candidates.forEach((c, i) => {
      text(`candidates[${i}].name`, c.name, L.nameChars, true);
      if (c.pointsM.length < 2 || c.pointsM.length > L.pathPoints) {
        errors.push({ path: `candidates[${i}].points`, message: `must have 2 to ${L.pathPoints} points ({ "x", "y" }), got ${c.pointsM.length}` });
      } else c.pointsM.forEach((q, k) => checkRows(PATH_POINT_FIELDS, { xM: q[0], yM: q[1] }, `candidates[${i}].points[${k}]`, units, errors));
    });
  }
  checkRows(GROUND_FIELDS, s, 'ground', units, errors);

  // Checks across fields: the same function as for a file, on a file view of the vehicle and the
  // path only (no terrain lists, so its cost is fixed).
  const view: Record<string, unknown> = { vehicle: rowsToFile(VEHICLE_FIELDS, v, units, {}) };
  const vehicle = view.vehicle as Record<string, unknown>;
  vehicle.tyre = rowsToFile(TYRE_FIELDS, v.tyreFront, units, {});
  vehicle.tyreRear = rowsToFile(TYRE_FIELDS, v.tyreRear, units, {});
  vehicle.suspension = {
    front: rowsToFile(AXLE_FIELDS, v.suspensionFront, units, { type: v.suspensionFront.type }),
    rear: rowsToFile(AXLE_FIELDS, v.suspensionRear, units, { type: v.suspensionRear.type }),
  };
  vehicle.body = rowsToFile(BODY_FIELDS, v.body, units, {});
  // Paths and saved lines in the file form (their points, step), for the leg and station rules.
  if (s.path) view.path = pathToFile(s.path, units);
  if (candidates.length > 0 && candidates.length <= L.candidates) {
    view.candidates = candidates.map((c) => ({ name: c.name, points: c.pointsM.map((q) => rowsToFile(PATH_POINT_FIELDS, { xM: q[0], yM: q[1] }, units, {})) }));
  }
  crossChecks(view, units, errors);
  return errors;
}
