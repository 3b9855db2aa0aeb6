/** Ground import: from points, meshes and rasters to the height grid the solver queries. Pure. */
export * from './types';
export * from './units';
export { localise, boundsOf, originOf, toZUp } from './localFrame';
export { statisticalOutliers, compactPoints, meshEdgeOutliers } from './outliers';
export { gridPoints, gridOver, emptyShare, type GridSpec, type GridStatistic } from './gridding';
export { rasteriseTop } from './rasterise';
export { progressiveMorphologicalFilter } from './groundFilter';
export { fillHoles } from './fill';
export { fitGroundPlane, levelPoints } from './level';
export { chooseCell, contactPatchLengthM, pointSpacingM } from './cellSize';
export { buildGround, MAX_GRID_NODES, GROUND_STEP_COUNT, type RawGround, type GroundSettings, type GroundSummary, type GroundResult } from './pipeline';
export { groundFeature, scenarioOnGround, onFilledGround } from './feature';
export { encodeHeights, decodeHeights, encodeMask, decodeMask, HEIGHTS_PREFIX } from './base64';
export { hornSlopeAspect } from './slope';
