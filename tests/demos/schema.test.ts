/**
 * The shipped JSON Schema (assets/scenario.schema.json): generated from the zod schema the app
 * validates with, so regenerating it must give the committed file; every demo validates against it
 * with a general-purpose JSON Schema validator (ajv, draft 2020-12); and a set of malformed files
 * is rejected both by the schema and by the app's own validator (parseScenario).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { parseScenario, scenarioJsonSchemaText, SCENARIO_SCHEMA_REF } from '../../src/core/index';

const ROOT = join(__dirname, '..', '..');
const SCHEMA_FILE = join(ROOT, 'assets', 'scenario.schema.json');
const DEMO_DIR = join(ROOT, 'assets', 'scenarios');
const DEMOS = readdirSync(DEMO_DIR).filter((f) => f.endsWith('.json')).sort();
const readDemo = (f: string): Record<string, unknown> => JSON.parse(readFileSync(join(DEMO_DIR, f), 'utf8'));

type Validate = ((data: unknown) => boolean) & { errors?: unknown[] | null };
let validate: Validate;

beforeAll(async () => {
  let Ajv2020: new (opts: object) => { compile(schema: object): Validate };
  try {
    // ajv: the standard general-purpose JSON Schema validator, draft 2020-12 build.
    const mod = (await import('ajv/dist/2020')) as unknown as { default: typeof Ajv2020 };
    Ajv2020 = mod.default;
  } catch {
    throw new Error('install ajv (devDependency) to check the schema');
  }
  // strict: unknown keywords or ambiguous schemas are errors, so a malformed schema cannot pass quietly.
  const ajv = new Ajv2020({ strict: true, allErrors: true, allowUnionTypes: true });
  validate = ajv.compile(JSON.parse(readFileSync(SCHEMA_FILE, 'utf8')));
});

describe('scenario JSON Schema', () => {
  it('is what `npm run schema` generates from the zod schema (no drift)', () => {
    expect(readFileSync(SCHEMA_FILE, 'utf8')).toBe(scenarioJsonSchemaText());
  });

  it('declares draft 2020-12 and one variant per unit system', () => {
    const s = JSON.parse(readFileSync(SCHEMA_FILE, 'utf8'));
    expect(s.$schema).toBe('https://json-schema.org/draft/2020-12/schema');
    expect(Object.keys(s.$defs).sort()).toEqual(['imperial', 'metric']);
    expect(s.$defs.metric.properties.units.const).toBe('metric');
    expect(s.$defs.imperial.properties.units.const).toBe('imperial');
  });

  it.each(DEMOS)('demo %s validates against the schema and names it in "$schema"', (f) => {
    const d = readDemo(f);
    expect(d.$schema).toBe(SCENARIO_SCHEMA_REF);
    const ok = validate(d);
    expect(validate.errors ?? null, JSON.stringify(validate.errors)).toBeNull();
    expect(ok).toBe(true);
    expect(parseScenario(d).ok).toBe(true);
  });

  it('reads bounds in the file\'s units: 700 in of wheelbase is fine in an imperial file, 700 m is not in a metric one', () => {
    const metric = readDemo('side-hill-stock.json') as { vehicle: { wheelbase: number } };
    metric.vehicle.wheelbase = 700;
    expect(validate(metric)).toBe(false);
    expect(parseScenario(metric).ok).toBe(false);
    const imperial = readDemo('quarry-haul-road-utv.json') as { vehicle: { wheelbase: number; cg: { behindFrontAxle: number } } };
    imperial.vehicle.wheelbase = 700;
    expect(validate(imperial)).toBe(true);
    expect(parseScenario(imperial).ok).toBe(true);
    // The imperial bound itself: 20 m = 787.4 in.
    imperial.vehicle.wheelbase = 800;
    expect(validate(imperial)).toBe(false);
    expect(parseScenario(imperial).ok).toBe(false);
  });
});

/** Malformed files: each a demo with one thing broken, and the field the app must name. */
type Doc = Record<string, any>; // eslint-disable-line @typescript-eslint/no-explicit-any
const MALFORMED: readonly (readonly [what: string, base: string, breakIt: (d: Doc) => void, path: string])[] = [
  ['negative track', 'side-hill-stock.json', (d) => void (d.vehicle.track.front = -1.6), 'vehicle.track.front'],
  ['unknown key', 'side-hill-stock.json', (d) => void (d.vehicle.colour = 'red'), 'vehicle.colour'],
  ['unknown unit system', 'side-hill-stock.json', (d) => void (d.units = 'furlongs'), 'units'],
  ['no vehicle', 'side-hill-stock.json', (d) => void delete d.vehicle, 'vehicle'],
  ['wheelbase as text', 'side-hill-stock.json', (d) => void (d.vehicle.wheelbase = '3.1'), 'vehicle.wheelbase'],
  ['future version', 'side-hill-stock.json', (d) => void (d.version = 2), 'version'],
  ['unknown feature type', 'side-hill-stock.json', (d) => void (d.terrain.features[0].type = 'crater'), 'terrain.features[0].type'],
  ['suspension type', 'side-hill-stock.json', (d) => void (d.vehicle.suspension.front.type = 'coil'), 'vehicle.suspension.front.type'],
  ['payload item without mass', 'expedition-roof-tent.json', (d) => void delete d.vehicle.payload[2].mass, 'vehicle.payload[2].mass'],
  ['rock of zero radius', 'rock-diagonal-twist.json', (d) => void (d.terrain.features[0].radius = 0), 'terrain.features[0].radius'],
  ['friction of 5', 'side-hill-stock.json', (d) => void (d.ground.friction = 5), 'ground.friction'],
  ['downhill "uphill"', 'side-hill-stock.json', (d) => void (d.tilt.downhill = 'uphill'), 'tilt.downhill'],
  ['a grid height as text', 'trials-course.json', (d) => void (d.terrain.features[3].heights[7] = 'deep'), 'terrain.features[3].heights[7]'],
  ['path.from with three numbers', 'side-hill-stock.json', (d) => void (d.path.from = [1, 2, 3]), 'path.from'],
  ['ramp steeper than vertical', 'ramp-travel-test.json', (d) => void (d.terrain.features[0].angle = 95), 'terrain.features[0].angle'],
  ['profile with one point', 'quarry-haul-road-utv.json', (d) => void (d.terrain.features[0].points = [[0, 0]]), 'terrain.features[0].points'],
  ['build lift of 2 m', 'side-hill-builds.json', (d) => void (d.builds[0].lift.suspension = 2), 'builds[0].lift.suspension'],
  ['build anti-roll "loose"', 'side-hill-builds.json', (d) => void (d.builds[0].antiRoll = { front: 'loose' }), 'builds[0].antiRoll.front'],
  ['not an object', 'side-hill-stock.json', (d) => void (d.vehicle = [1, 2]), 'vehicle'],
];

describe('malformed files are rejected by both the JSON Schema and parseScenario', () => {
  it.each(MALFORMED)('%s', (_what, base, breakIt, path) => {
    const d = readDemo(base) as Doc;
    breakIt(d);
    expect(validate(d)).toBe(false);
    const r = parseScenario(d);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => e.path)).toContain(path);
  });
});
