/** Analyses built on the pose solver: obstacle pass, stability rose, best line, builds, CG from scale readings. */
export * from './clearance';
export * from './pass';
export * from './rose';
export * from './spare';
export * from './lines';
export * from './builds';
export * from './cg';
export * from './ramp';
export * from './passOptions';
export * from './pathCandidates';
export * from './headings';
export * from './pathGeometry';
export * from './filledGround';
