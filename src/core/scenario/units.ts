/** Unit conversion between scenario files and the SI core: defined once, in the field table (fields.ts). */
export {
  M_PER_IN,
  M_PER_FT,
  M_PER_MM,
  KG_PER_LB,
  STANDARD_GRAVITY_M_PER_S2,
  N_PER_LBF,
  RAD_PER_DEG,
  metricPerFileUnit,
  siPerMetricFileUnit,
  toSI,
  fromSI,
  fileNumber,
  snapToFileUnit,
  metricToFileUnits,
  unitLabel,
  type QuantityKind,
} from './fields';
