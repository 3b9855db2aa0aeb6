/** Plumbline core: the public API. Anything not exported here is internal. */
export * from './model/types';
export { TerrainField, FACE_RUN_M } from './terrain/field';
export * from './scenario/index';
export { buildModel, solveEquilibrium, initialGuess, DEFAULT_FRICTION, DEFAULT_TOLERANCE, DEFAULT_MAX_ITERATIONS } from './solver/equilibrium';
export { tiltSweep, toSample, MIN_STIFFNESS_EIGEN, NEAR_NEUTRAL_EIGEN, type TiltAngle, type TiltLift, type TiltTip, type TiltSweepDetail, type TipReason } from './solver/tilt';
export { VehicleModel, GRAVITY_MPS2, STATE_SIZE, rigidStaticLoads, type ModelOptions } from './solver/model';
export { stabilityMargins, supportHull } from './solver/margins';
export { DEFAULT_TYRE_MODEL, makeTyreLayout, calibrateTyre, flatForcePerRate, evaluateTyre, TyreContact } from './tyre/radialSpring';
export * from './analysis/index';
