/** Scenario files: schema, validation, unit conversion, and writing back. */
export type { Scenario, ScenarioError, ParseResult, UnitSystem, CandidateLine } from './types';
export { parseScenario, parseScenarioText, parseScenarioBytes, defaultBodyShape, SCENARIO_DEFAULTS } from './parse';
export { fileSizeProblem, decodeScenarioBytes, readScenarioJson, scanScenarioJson, type ReadResult } from './read';
export { scenarioToFile, pathToFile, type ScenarioFileObject } from './write';
export { checkScenarioSI, boundProblem } from './checkSI';
export { buildsToSI, buildsToFile, buildsCrossChecks } from './builds';
export {
  scenarioFileSchema,
  SCENARIO_VERSION,
  SCENARIO_LIMITS,
  BUILD_LIMITS,
  PLAUSIBLE,
  FEATURE_TYPES,
  SUSPENSION_TYPES,
  UNIT_SYSTEMS,
  DOWNHILL_NAMES,
  MAX_ELEMENT_MESSAGES,
  type DownhillName,
  type ScenarioFileData,
  type ScenarioFileSchema,
} from './schema';
export {
  VEHICLE_FIELDS,
  TYRE_FIELDS,
  AXLE_FIELDS,
  BODY_FIELDS,
  PAYLOAD_FIELDS,
  FEATURE_FIELDS,
  POSE_FIELDS,
  TILT_FIELDS,
  PATH_FIELDS,
  PATH_POINT_FIELDS,
  PATH_END_FIELDS,
  PATH_STEP_DEFAULT_M,
  GROUND_FIELDS,
  PHYSICAL_MIN,
  fileNumber,
  fixedUnitNumber,
  snapToFileUnit,
  type FieldRow,
  type NumberRow,
  type Bound,
} from './fields';
export {
  M_PER_IN,
  M_PER_FT,
  KG_PER_LB,
  N_PER_LBF,
  STANDARD_GRAVITY_M_PER_S2,
  RAD_PER_DEG,
  toSI,
  fromSI,
  metricToFileUnits,
  metricPerFileUnit,
  siPerMetricFileUnit,
  unitLabel,
  type QuantityKind,
} from './units';
export { migrateScenario, MIGRATION_STEPS, type MigrateResult, type MigrationStep } from './migrate';
export { scenarioJsonSchema, scenarioJsonSchemaFor, scenarioJsonSchemaText, SCENARIO_SCHEMA_REF } from './jsonSchema';
