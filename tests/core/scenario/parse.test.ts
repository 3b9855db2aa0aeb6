/** Scenario parsing: the demo file, defaults, warnings, and the round trip through the file form. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  defaultBodyShape,
  parseScenario,
  parseScenarioText,
  scenarioToFile,
  type Scenario,
} from '../../../src/core/index';
import { baseFile, edit, expectClose, FIXTURE_REL, ROUND_TRIP_REL } from './helpers';


const DEMO = 'assets/scenarios/side-hill-stock.json';
const IMPERIAL = 'tests/fixtures/side-hill-stock-imperial.json';

function parsedFile(path: string): Scenario {
  const r = parseScenarioText(readFileSync(path, 'utf8'));
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return r.scenario;
}
function parsed(o: unknown): { scenario: Scenario; warnings: string[] } {
  const r = parseScenario(o);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return r;
}

/** A file using every feature type and every optional key. */
function everythingFile(units: 'metric' | 'imperial' = 'metric'): Record<string, any> {
  const o = baseFile();
  o.units = units;
  o.notes = 'every feature';
  o.vehicle.cg.leftOfCentre = 0.02;
  o.vehicle.tyreRear = { radius: 0.4, width: 0.27, stiffness: 310000 };
  o.vehicle.payload = [{ label: 'rooftop tent', mass: 60, behindFrontAxle: 1.6, height: 1.95, leftOfCentre: -0.05 }];
  o.vehicle.body = {
    frontOverhang: 0.85, rearOverhang: 1.1, width: 1.9, bellyClearance: 0.26,
    frontBumperClearance: 0.45, rearBumperClearance: 0.5, roofHeight: 1.85,
  };
  o.terrain.features = [
    { type: 'plane', grade: 3.5, crossSlope: -12.25, height: 0.1 },
    { type: 'step', x: 2, height: 0.3, y: [-1, 0], edgeRadius: 0.05 },
    { type: 'block', x: [4, 5], y: [-0.5, 0.7], height: -0.25, edgeRadius: 0.02 },
    { type: 'rock', x: 6.3, y: 0.8, height: 0.35, radius: 0.45 },
    { type: 'ramp', x: 8, angle: 20, length: 1.9, y: [0.2, 1.2] },
    { type: 'ramp', x: 11, angle: -7, length: 3 },
    { type: 'profile', axis: 'y', points: [[-3, 0], [0, 0.12], [2.5, -0.3]], across: [10, 14] },
    { type: 'profile', axis: 'x', points: [[15, 0], [16, 0.4]] },
    { type: 'grid', origin: [-5, -5], spacing: 0.25, cols: 4, rows: 3, heights: [0, 0.1, 0.2, 0.3, 0.01, 0.11, 0.21, 0.31, -0.02, 0.08, 0.18, 0.28] },
  ];
  o.pose = { x: 1.25, y: -0.4, heading: 12.5 };
  o.tilt = { angle: 17.5, downhill: 225 };
  o.path = { from: [-2, 0.1], to: [18, 0.3], step: 0.1, heading: 3 };
  o.ground = { friction: 0.55 };
  if (units === 'imperial') {
    // The chassis in inches (an imperial file of the same build), above the physical lower bounds.
    Object.assign(o.vehicle, { wheelbase: 110, track: { front: 63, rear: 63 } });
    Object.assign(o.vehicle.cg, { behindFrontAxle: 52, height: 29.5 });
    o.vehicle.tyre = { radius: 15, width: 10, stiffness: 1700 };
    o.vehicle.tyreRear = { radius: 15.75, width: 10.6, stiffness: 1750 };
  }
  return o;
}

describe('the demo scenario', () => {
  it('parses with no warnings, in SI', () => {
    const r = parseScenarioText(readFileSync(DEMO, 'utf8'));
    expect(r.ok ? r.warnings : r.errors).toEqual([]);
    if (!r.ok) return;
    const s = r.scenario;
    expect(s.vehicle.name).toBe('Corrigan Ridgeback (stock)');
    expect(s.vehicle.wheelbaseM).toBe(3.1);
    expect(s.vehicle.suspensionFront.type).toBe('independent');
    expect(s.vehicle.suspensionRear.springSpacingM).toBe(1.1);
    expect(s.vehicle.suspensionFront.springSpacingM).toBeUndefined();
    // 900 N·m/deg × (180/π) deg/rad = 51566.2 N·m/rad
    expect(s.vehicle.suspensionFront.antiRollNmPerRad).toBeCloseTo((900 * 180) / Math.PI, 9);
    const plane = s.terrain.features[0];
    expect(plane.type).toBe('plane');
    if (plane.type === 'plane') expect(plane.crossSlopeRad).toBeCloseTo((-20 * Math.PI) / 180, 15);
    expect(s.tilt.downhillRad).toBe(Math.PI / 2); // "left"
    expect(s.path).toEqual({ fromM: [-10, 0], toM: [10, 0], stepM: 0.05, headingRad: 0 });
    expect(s.vehicle.payload.map((p) => p.label)).toEqual(['driver', 'tool box and recovery gear']);
  });

  it('the imperial fixture is the same scenario in SI (within 1e-9 relative)', () => {
    const metric = parsedFile(DEMO);
    const imperial = parsedFile(IMPERIAL);
    expect(imperial.units).toBe('imperial');
    const pick = (s: Scenario) => ({ vehicle: s.vehicle, terrain: s.terrain, pose: s.pose, tilt: s.tilt, path: s.path, friction: s.friction });
    expectClose(pick(imperial), pick(metric), FIXTURE_REL);
  });
});

describe('defaults', () => {
  it('fills optional fields, documented in SCENARIO_DEFAULTS', () => {
    const { scenario: s, warnings } = parsed(baseFile());
    expect(s.notes).toBe('');
    expect(s.pose).toEqual({ xM: 0, yM: 0, headingRad: 0 });
    expect(s.tilt).toEqual({ angleRad: 0, downhillRad: Math.PI / 2 });
    expect(s.path).toBeNull();
    expect(s.friction).toBe(0.7);
    expect(s.vehicle.payload).toEqual([]);
    expect(s.vehicle.cg.leftOfCentreM).toBe(0);
    expect(s.vehicle.tyreRear).toEqual(s.vehicle.tyreFront);
    expect(s.vehicle.suspensionRear.antiRollNmPerRad).toBe(0);
    const step = s.terrain.features[1];
    expect(step).toEqual({ type: 'step', xM: 2, heightM: 0.3, yRangeM: null, edgeRadiusM: 0 });
    // Body outline from the vehicle: track 1.6 + tyre 0.25 wide; 0.6 × 0.38 belly; 1.1/1.2 × 0.38 bumpers; 2.4 × 0.75 roof.
    expect(s.vehicle.body).toEqual(defaultBodyShape(s.vehicle));
    expect(s.vehicle.body.widthM).toBeCloseTo(1.85, 12);
    expect(s.vehicle.body.bellyClearanceM).toBeCloseTo(0.228, 12);
    expect(s.vehicle.body.frontBumperClearanceM).toBeCloseTo(0.418, 12);
    expect(s.vehicle.body.rearBumperClearanceM).toBeCloseTo(0.456, 12);
    expect(s.vehicle.body.roofHeightM).toBeCloseTo(1.8, 12);
    expect(s.vehicle.body.frontOverhangM).toBe(0.9);
    expect(s.vehicle.body.rearOverhangM).toBe(1.0);
    expect(warnings).toEqual([
      'vehicle.body: not given; using a rough outline derived from the vehicle: clearance results are only indicative',
    ]);
  });

  it('warns about a partial body and a roll centre above the CG', () => {
    let o = edit(baseFile(), 'vehicle.body', { width: 1.9, roofHeight: 1.8 });
    o = edit(o, 'vehicle.suspension.rear.rollCentreHeight', 0.8);
    const { scenario: s, warnings } = parsed(o);
    expect(s.vehicle.body.widthM).toBe(1.9);
    expect(warnings).toEqual([
      'vehicle.body: frontOverhang, rearOverhang, bellyClearance, frontBumperClearance, rearBumperClearance not given; using rough values derived from the vehicle',
      'vehicle.suspension.rear.rollCentreHeight: at or above the CG height (0.75 m); the body would lean into the slope',
    ]);
  });

  it('accepts "$schema", a byte-order mark and path: null', () => {
    const o = { $schema: '../scenario.schema.json', ...baseFile(), path: null };
    const r = parseScenarioText(`\ufeff${JSON.stringify(o)}`);
    expect(r.ok ? [] : r.errors).toEqual([]);
    if (r.ok) expect(r.scenario.path).toBeNull();
  });

  it('grid heights come back as a Float64Array in metres', () => {
    const o = everythingFile('imperial');
    const { scenario: s } = parsed(o);
    const g = s.terrain.features[8];
    expect(g.type).toBe('grid');
    if (g.type !== 'grid') return;
    expect(g.heightsM).toBeInstanceOf(Float64Array);
    expect(g.heightsM[3]).toBeCloseTo(0.3 * 0.0254, 15);
    expect(g.spacingM).toBeCloseTo(0.25 * 0.0254, 15);
  });
});

describe('round trip: parseScenario(scenarioToFile(s)) reproduces s (1e-12 relative)', () => {
  const sources: [string, () => unknown][] = [
    ['base file', baseFile],
    ['every feature, metric', () => everythingFile('metric')],
    ['every feature, imperial', () => everythingFile('imperial')],
    ['demo', () => JSON.parse(readFileSync(DEMO, 'utf8'))],
    ['imperial fixture', () => JSON.parse(readFileSync(IMPERIAL, 'utf8'))],
  ];
  it.each(sources)('%s, in its own units', (_n, make) => {
    const s = parsed(make()).scenario;
    const file = scenarioToFile(s);
    const again = parsed(JSON.parse(JSON.stringify(file)));
    expect(again.warnings).toEqual([]); // nothing left to default
    expectClose(again.scenario, s, ROUND_TRIP_REL);
  });
  it.each(sources)('%s, through the other unit system', (_n, make) => {
    const s = parsed(make()).scenario;
    const other = s.units === 'metric' ? 'imperial' : 'metric';
    const file = scenarioToFile(s, other);
    expect(file.units).toBe(other);
    const again = parsed(JSON.parse(JSON.stringify(file))).scenario;
    expect(again.units).toBe(other);
    expectClose({ ...again, units: s.units }, s, ROUND_TRIP_REL);
  });
  it('writes a named tilt direction by name', () => {
    const s = parsed(baseFile()).scenario;
    expect((scenarioToFile(s).tilt as { downhill: unknown }).downhill).toBe('left');
    const t = scenarioToFile(parsed(everythingFile()).scenario).tilt as { downhill: unknown };
    expect(t.downhill).toBeCloseTo(225, 12);
  });
});

describe('public API', () => {
  it('core/index exports the scenario module', async () => {
    const core = await import('../../../src/core/index');
    const names = [
      'parseScenario', 'parseScenarioText', 'scenarioToFile', 'scenarioFileSchema', 'defaultBodyShape', 'SCENARIO_DEFAULTS',
      'SCENARIO_VERSION', 'SCENARIO_LIMITS', 'PLAUSIBLE', 'FEATURE_TYPES', 'SUSPENSION_TYPES', 'UNIT_SYSTEMS', 'DOWNHILL_NAMES',
      'MAX_ELEMENT_MESSAGES', 'M_PER_IN', 'M_PER_FT', 'KG_PER_LB', 'N_PER_LBF', 'STANDARD_GRAVITY_M_PER_S2', 'RAD_PER_DEG',
      'toSI', 'fromSI', 'metricToFileUnits', 'metricPerFileUnit', 'siPerMetricFileUnit', 'unitLabel',
    ];
    for (const n of names) expect(core, n).toHaveProperty(n);
    expect(core.FEATURE_TYPES).toEqual(['plane', 'step', 'block', 'rock', 'ramp', 'profile', 'grid']);
    expect(core.SCENARIO_LIMITS).toMatchObject({ features: 200, payloadItems: 50, profilePoints: 100_000, gridNodes: 16_777_216, pathStations: 100_000 });
  });
});
