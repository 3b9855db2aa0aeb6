/**
 * Core `Scenario` (SI) → scenario file data, in metric or imperial units, row by row from the
 * field table (fields.ts). Every field is written out (no defaults left implicit), so
 * `parseScenario(scenarioToFile(s))` gives back `s` exactly; each number is the shortest decimal
 * in the file's unit that reads back as the same SI value (`fileNumber`), so a value typed in the
 * file's unit is written as typed (1720 lb, not 1719.9999999999998).
 */
import type { PathSpec, TerrainFeature } from '../model/types';
import { pathPoints } from '../analysis/pathGeometry';
import type { Scenario, UnitSystem } from './types';
import { DOWNHILL_NAMES, type DownhillName } from './schema';
import {
  AXLE_FIELDS,
  BODY_FIELDS,
  FEATURE_FIELDS,
  GROUND_FIELDS,
  PATH_END_FIELDS,
  PATH_FIELDS,
  PATH_HEADING_FIELD,
  PATH_POINT_FIELDS,
  PAYLOAD_FIELDS,
  POSE_FIELDS,
  RAD_PER_DEG,
  TILT_FIELDS,
  TYRE_FIELDS,
  VEHICLE_FIELDS,
  fileNumber,
  fromSI,
  rowsToFile,
  type FieldRow,
} from './fields';
import { buildsToFile } from './builds';
import { encodeHeights, encodeMask } from '../ground/base64';

/** JSON-ready scenario file data. */
export type ScenarioFileObject = Record<string, unknown>;

/** Write a scenario in its file form. @default units the scenario's own `units` */
export function scenarioToFile(s: Scenario, units: UnitSystem = s.units): ScenarioFileObject {
  const file = (rows: readonly FieldRow[], si: unknown, head: Record<string, unknown> = {}) => rowsToFile(rows, si, units, head);
  const v = s.vehicle;
  const featureToFile = (f: TerrainFeature): Record<string, unknown> => {
    const out = file(FEATURE_FIELDS[f.type], f, { type: f.type });
    if (f.type === 'grid' && f.source) {
      // Imported ground: heights as base64 float32 (compact, fast to read back), the filled mask one bit per node.
      out.heights = encodeHeights(f.heightsM, fromSI('length', 1, units));
      if (f.filledMask) out.filled = encodeMask(f.filledMask);
      out.source = { file: f.source.file, format: f.source.format, crs: f.source.crs, origin: [...f.source.originSource], unit: f.source.sourceUnitM };
    }
    return out;
  };
  // A downhill direction that is exactly one of the named ones is written by name.
  let downhill: number | DownhillName = fileNumber('angle', s.tilt.downhillRad, units);
  for (const name of Object.keys(DOWNHILL_NAMES) as DownhillName[]) {
    if (s.tilt.downhillRad === DOWNHILL_NAMES[name] * RAD_PER_DEG) downhill = name;
  }
  const vehicle = file(VEHICLE_FIELDS, v, { name: v.name });
  vehicle.tyre = file(TYRE_FIELDS, v.tyreFront);
  vehicle.tyreRear = file(TYRE_FIELDS, v.tyreRear);
  vehicle.suspension = {
    front: file(AXLE_FIELDS, v.suspensionFront, { type: v.suspensionFront.type }),
    rear: file(AXLE_FIELDS, v.suspensionRear, { type: v.suspensionRear.type }),
  };
  vehicle.payload = v.payload.map((p) => file(PAYLOAD_FIELDS, p, { label: p.label }));
  vehicle.body = file(BODY_FIELDS, v.body);
  const out: ScenarioFileObject = {
    version: s.version,
    name: s.name,
    units,
    notes: s.notes,
    vehicle,
    terrain: { features: s.terrain.features.map(featureToFile) },
    pose: file(POSE_FIELDS, s.pose),
    tilt: { ...file(TILT_FIELDS, s.tilt), downhill },
  };
  if (s.path) out.path = pathToFile(s.path, units);
  out.ground = file(GROUND_FIELDS, s);
  if (s.builds && s.builds.length > 0) out.builds = buildsToFile(s.builds, units);
  if (s.candidates && s.candidates.length > 0) out.candidates = s.candidates.map((c) => ({ name: c.name, points: pointsToFile(c.pointsM, units) }));
  return out;
}

/** Points as `{ "x", "y" }` in the file's length unit. */
function pointsToFile(points: readonly (readonly [number, number])[], units: UnitSystem): Record<string, unknown>[] {
  return points.map((q) => rowsToFile(PATH_POINT_FIELDS, { xM: q[0], yM: q[1] }, units, {}));
}

/**
 * A path in its file form: a straight path in the first form (`from`, `to`), which every version of
 * Plumbline reads; a path with corners as `points`.
 */
export function pathToFile(p: PathSpec, units: UnitSystem): Record<string, unknown> {
  const out: Record<string, unknown> =
    p.viaM && p.viaM.length > 0 ? { points: pointsToFile(pathPoints(p), units) } : rowsToFile(PATH_END_FIELDS, p, units, {});
  rowsToFile(PATH_FIELDS, p, units, out);
  if (p.headingRad !== null) rowsToFile([PATH_HEADING_FIELD], p, units, out);
  return out;
}
