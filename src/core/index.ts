/** Plumbline core: the public API. Anything not exported here is internal. */
export * from './model/types';
export { TerrainField, FACE_RUN_M } from './terrain/field';
export * from './scenario/index';
