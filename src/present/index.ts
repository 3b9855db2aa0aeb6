/**
 * The presentation layer: display units, the words, the build-metric table, chart scales and
 * palettes, used alike by the command line, the app and the report. Pure TypeScript: no React,
 * three or DOM (tests/present/layers.test.ts enforces it).
 */
export * from './units';
export * from './words';
export * from './metrics';
export * from './scale';
export * from './palette';
export * from './text';
export * from './fields';
