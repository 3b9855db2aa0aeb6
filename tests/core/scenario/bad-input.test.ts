/**
 * Ill-behaved scenario files: every case asserts the exact messages. The expected wording is
 * Plumbline's own file-format contract (docs in src/core/scenario/schema.ts); the ranges come
 * from the checks documented there.
 */
import { describe, expect, it } from 'vitest';
import { parseScenario, parseScenarioText, SCENARIO_LIMITS } from '../../../src/core/index';
import { baseFile, DELETE, edit, imperialBaseFile } from './helpers';

// Core tests must not pull in UI libraries: any accidental import then fails here.

type Case = { name: string; input: () => unknown; errors: string[] };

const base = baseFile;
const imperialBase = imperialBaseFile;
const withFeature = (f: unknown) => {
  const o = base();
  o.terrain.features.push(f);
  return o;
};
const grid = (over: Record<string, unknown>) => ({ type: 'grid', origin: [0, 0], spacing: 0.5, cols: 3, rows: 2, heights: [0, 0, 0, 0, 0, 0], ...over });

const CASES: Case[] = [
  { name: 'missing wheelbase', input: () => edit(base(), 'vehicle.wheelbase', DELETE), errors: ['vehicle.wheelbase: required (m)'] },
  { name: 'negative track', input: () => edit(base(), 'vehicle.track.front', -1.6), errors: ['vehicle.track.front: must be ≥ 0.3 m, got -1.6'] },
  {
    name: 'negative track, imperial file',
    input: () => edit(imperialBase(), 'vehicle.track.front', -1.6),
    errors: ['vehicle.track.front: must be ≥ 11.811 in, got -1.6'],
  },
  { name: 'zero mass', input: () => edit(base(), 'vehicle.mass', 0), errors: ['vehicle.mass: must be ≥ 20 kg, got 0'] },
  { name: 'NaN mass', input: () => edit(base(), 'vehicle.mass', NaN), errors: ['vehicle.mass: must be a finite number in kg, got NaN'] },
  {
    name: 'infinite wheelbase',
    input: () => edit(base(), 'vehicle.wheelbase', Infinity),
    errors: ['vehicle.wheelbase: must be a finite number in m, got Infinity'],
  },
  {
    name: 'wheelbase as text',
    input: () => edit(base(), 'vehicle.wheelbase', '2.8'),
    errors: ['vehicle.wheelbase: must be a finite number in m, got "2.8"'],
  },
  {
    name: 'wheelbase in millimetres in a metric file',
    input: () => edit(base(), 'vehicle.wheelbase', 2800),
    errors: ['vehicle.wheelbase: must be ≤ 20 m, got 2800'],
  },
  {
    name: 'wheelbase past the plausible limit, imperial (20 m = 787.4016 in)',
    input: () => edit(imperialBase(), 'vehicle.wheelbase', 800),
    errors: ['vehicle.wheelbase: must be ≤ 787.4016 in, got 800'],
  },
  {
    name: 'CG behind the rear axle',
    input: () => edit(base(), 'vehicle.cg.behindFrontAxle', 3.1),
    errors: ['vehicle.cg.behindFrontAxle: must lie within the wheelbase (0 to 2.8 m), got 3.1'],
  },
  {
    name: 'CG ahead of the front axle',
    input: () => edit(base(), 'vehicle.cg.behindFrontAxle', -0.2),
    errors: ['vehicle.cg.behindFrontAxle: must lie within the wheelbase (0 to 2.8 m), got -0.2'],
  },
  { name: 'CG height zero', input: () => edit(base(), 'vehicle.cg.height', 0), errors: ['vehicle.cg.height: must be ≥ 0.05 m, got 0'] },
  {
    name: 'CG offset past half the narrower track',
    input: () => edit(edit(base(), 'vehicle.track.rear', 1.5), 'vehicle.cg.leftOfCentre', -0.8),
    errors: ['vehicle.cg.leftOfCentre: must lie within half the narrower track (±0.75 m), got -0.8'],
  },
  {
    name: 'negative bump travel',
    input: () => edit(base(), 'vehicle.suspension.rear.bump', -0.02),
    errors: ['vehicle.suspension.rear.bump: must be ≥ 0 m, got -0.02'],
  },
  {
    name: 'unknown suspension type',
    input: () => edit(base(), 'vehicle.suspension.front.type', 'coil'),
    errors: ['vehicle.suspension.front.type: must be "solid" or "independent", got "coil"'],
  },
  {
    name: 'zero wheel rate',
    input: () => edit(base(), 'vehicle.suspension.front.wheelRate', 0),
    errors: ['vehicle.suspension.front.wheelRate: must be ≥ 1000 N/m, got 0'],
  },
  {
    name: 'negative anti-roll, imperial',
    input: () => edit(imperialBase(), 'vehicle.suspension.front.antiRoll', -5),
    errors: ['vehicle.suspension.front.antiRoll: must be ≥ 0 lbf·ft/deg, got -5'],
  },
  {
    name: 'spring spacing on an independent axle',
    input: () => edit(base(), 'vehicle.suspension.front.springSpacing', 1.1),
    errors: ['vehicle.suspension.front.springSpacing: only for a "solid" axle; this axle is "independent"'],
  },
  {
    name: 'unsprung mass as heavy as the vehicle',
    input: () => edit(edit(base(), 'vehicle.unsprungMass.front', 1000), 'vehicle.unsprungMass.rear', 1000),
    errors: ['vehicle.unsprungMass: front + rear must be < vehicle.mass (2000 kg), got 2000'],
  },
  {
    name: 'tyre wider than the track',
    input: () => edit(base(), 'vehicle.tyre.width', 1.7),
    errors: ['vehicle.tyre.width: must be < the front track (1.6 m), got 1.7'],
  },
  {
    name: 'units "si"',
    input: () => edit(base(), 'units', 'si'),
    errors: ['units: must be "metric" or "imperial", got "si"'],
  },
  // A newer format version is refused by the migration step (migrate.ts) before the schema sees it.
  { name: 'version 2', input: () => edit(base(), 'version', 2), errors: ['version: this file is format version 2, newer than this version of Plumbline reads (1); update Plumbline to open it'] },
  { name: 'version 0', input: () => edit(base(), 'version', 0), errors: ['version: must be 1, got 0'] },
  {
    name: 'unknown feature type',
    input: () => withFeature({ type: 'cliff', x: 1 }),
    errors: ['terrain.features[2].type: unknown feature type "cliff"; expected one of plane, step, block, rock, ramp, profile, grid'],
  },
  {
    name: 'feature without a type',
    input: () => withFeature({ x: 1, height: 0.2 }),
    errors: ['terrain.features[2].type: required (one of plane, step, block, rock, ramp, profile, grid)'],
  },
  {
    name: 'feature that is a number',
    input: () => withFeature(7),
    errors: ['terrain.features[2]: must be an object with a "type" key, got 7'],
  },
  {
    name: 'step with its y range reversed',
    input: () => edit(base(), 'terrain.features.1.y', [0, -1]),
    errors: ['terrain.features[1].y: must have from < to, got [0, -1]'],
  },
  {
    name: 'grid with fewer heights than cols × rows',
    input: () => withFeature(grid({ heights: [0, 0, 0, 0, 0] })),
    errors: ['terrain.features[2].heights: must have cols × rows = 6 values, got 5'],
  },
  {
    name: 'grid with NaN heights and a single column (every error at once)',
    input: () => withFeature(grid({ cols: 1, heights: [0, NaN] })),
    errors: ['terrain.features[2].cols: must be ≥ 2, got 1', 'terrain.features[2].heights[1]: must be a finite number in m, got NaN'],
  },
  {
    name: 'grid with fractional rows',
    input: () => withFeature(grid({ rows: 2.5 })),
    errors: ['terrain.features[2].rows: must be a whole number, got 2.5'],
  },
  {
    name: 'grid larger than the node limit',
    input: () => withFeature(grid({ cols: 8192, rows: 4096, heights: [] })),
    errors: [`terrain.features[2]: cols × rows must be ≤ ${SCENARIO_LIMITS.gridNodes} nodes, got 33554432`],
  },
  {
    name: 'unsorted profile',
    input: () => withFeature({ type: 'profile', axis: 'x', points: [[0, 0], [1.5, 0.2], [1, 0.1]] }),
    errors: ["terrain.features[2].points[2][0]: must be > the previous point's s (1.5 m), got 1"],
  },
  {
    name: 'profile with one point',
    input: () => withFeature({ type: 'profile', axis: 'y', points: [[0, 0]] }),
    errors: ['terrain.features[2].points: must have at least 2 points, got 1'],
  },
  {
    name: 'profile point that is not a pair',
    input: () => withFeature({ type: 'profile', axis: 'z', points: [[0, 0], 3] }),
    errors: ['terrain.features[2].axis: must be "x" or "y", got "z"', 'terrain.features[2].points[1]: must be [s, z] in m, got 3'],
  },
  {
    name: 'rock with zero radius',
    input: () => withFeature({ type: 'rock', x: 1, y: 0, height: 0.4, radius: 0 }),
    errors: ['terrain.features[2].radius: must be > 0 m, got 0'],
  },
  {
    name: 'vertical ramp',
    input: () => withFeature({ type: 'ramp', x: 1, angle: 90, length: 2 }),
    errors: ['terrain.features[2].angle: must be < 90 deg, got 90'],
  },
  {
    name: 'too many features',
    input: () => edit(base(), 'terrain.features', Array.from({ length: 201 }, () => ({ type: 'plane' }))),
    errors: ['terrain.features: must have at most 200 features, got 201'],
  },
  {
    name: 'features missing',
    input: () => edit(base(), 'terrain', {}),
    errors: ['terrain.features: required (a list of features)'],
  },
  {
    name: 'too many payload items',
    input: () =>
      edit(base(), 'vehicle.payload', Array.from({ length: 51 }, (_, i) => ({ label: `crate ${i}`, mass: 1, behindFrontAxle: 1, height: 1 }))),
    errors: ['vehicle.payload: must have at most 50 payload items, got 51'],
  },
  {
    name: 'payload item with an empty label and a negative mass',
    input: () => edit(base(), 'vehicle.payload', [{ label: '', mass: -3, behindFrontAxle: 1, height: 1 }]),
    errors: ['vehicle.payload[0].label: must not be empty', 'vehicle.payload[0].mass: must be > 0 kg, got -3'],
  },
  {
    name: 'unknown key (a typo)',
    input: () => edit(base(), 'vehicle.wheelbsae', 2.8),
    errors: ['vehicle.wheelbsae: unknown key'],
  },
  {
    name: 'friction zero',
    input: () => edit(base(), 'ground', { friction: 0 }),
    errors: ['ground.friction: must be > 0, got 0'],
  },
  {
    name: 'friction above 3',
    input: () => edit(base(), 'ground', { friction: 4.5 }),
    errors: ['ground.friction: must be ≤ 3, got 4.5'],
  },
  {
    name: 'tilt past 180°',
    input: () => edit(base(), 'tilt', { angle: 200 }),
    errors: ['tilt.angle: must be ≤ 180 deg, got 200'],
  },
  {
    name: 'tilt direction by an unknown name',
    input: () => edit(base(), 'tilt', { downhill: 'uphill' }),
    errors: ['tilt.downhill: must be an angle in deg or one of "front", "left", "rear", "right", got "uphill"'],
  },
  {
    name: 'path of zero length and zero step',
    input: () => edit(base(), 'path', { from: [1, 2], to: [1, 2], step: 0 }),
    errors: ['path.step: must be > 0 m, got 0', 'path.to: must differ from path.from, got [1, 2]'],
  },
  {
    name: 'path with too many stations (20 m / 100000 stations → step ≥ 0.0002 m)',
    input: () => edit(base(), 'path', { from: [0, 0], to: [20, 0], step: 0.0001 }),
    errors: ['path.step: must be ≥ 0.0002 m for at most 100000 stations on this path, got 0.0001'],
  },
  {
    name: 'a scenario that is a list',
    input: () => [1, 2],
    errors: ['(file): must be a JSON object, got [1, 2]'],
  },
  {
    name: 'a function where a name belongs',
    input: () => ({ ...base(), name: () => 'x' }),
    errors: ['name: must be JSON data (object, list, text, number, true/false, null), got a function'],
  },
  {
    name: 'a Date where the vehicle belongs',
    input: () => ({ ...base(), vehicle: new Date(0) }),
    errors: ['vehicle: must be JSON data, got a Date'],
  },
  {
    name: 'many errors at once, all collected',
    input: () => {
      let o = edit(base(), 'vehicle.mass', DELETE);
      o = edit(o, 'vehicle.track.rear', 0);
      o = edit(o, 'vehicle.suspension.front.droop', -0.1);
      o = edit(o, 'pose', { heading: 400, z: 1 });
      return o;
    },
    errors: [
      'vehicle.track.rear: must be ≥ 0.3 m, got 0',
      'vehicle.mass: required (kg)',
      'vehicle.suspension.front.droop: must be ≥ 0 m, got -0.1',
      'pose.heading: must be ≤ 360 deg, got 400',
      'pose.z: unknown key',
    ],
  },
];

describe('scenario: bad input, exact messages', () => {
  it('has at least 25 cases', () => {
    expect(CASES.length).toBeGreaterThanOrEqual(25);
  });
  it('the base file is valid', () => {
    const r = parseScenario(baseFile());
    expect(r.ok ? [] : r.errors).toEqual([]);
  });
  it.each(CASES)('$name', ({ input, errors }) => {
    const r = parseScenario(input());
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.map((e) => `${e.path}: ${e.message}`).sort()).toEqual([...errors].sort());
  });
});

describe('scenario: hostile input', () => {
  it('a "__proto__" key is an unknown key and pollutes nothing', () => {
    const text = JSON.stringify(baseFile()).replace('"vehicle":{', '"vehicle":{"__proto__":{"polluted":true,"wheelbase":99},');
    expect(text).toContain('__proto__');
    const r = parseScenarioText(text);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors).toEqual([{ path: 'vehicle.__proto__', message: 'unknown key' }]);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  });

  it('a top-level "__proto__" key is rejected too', () => {
    const r = parseScenarioText(`{"__proto__": {"isAdmin": true}, ${JSON.stringify(baseFile()).slice(1)}`);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors).toEqual([{ path: '__proto__', message: 'unknown key' }]);
    expect(({} as Record<string, unknown>).isAdmin).toBeUndefined();
  });

  it('inherited properties are never read', () => {
    const o = baseFile();
    const vehicle = Object.create({ wheelbase: 2.8 });
    Object.assign(vehicle, o.vehicle);
    delete vehicle.wheelbase;
    const r = parseScenario({ ...o, vehicle });
    // The prototype-bearing object is refused outright, so its inherited wheelbase cannot slip in.
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors).toEqual([{ path: 'vehicle', message: 'must be JSON data, got an object with a prototype' }]);
  });

  it('a cycle is reported, not followed', () => {
    const o = baseFile();
    o.vehicle.payload = [];
    o.vehicle.payload.push(o.vehicle);
    const r = parseScenario(o);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      expect(r.errors).toContainEqual({
        path: 'vehicle.payload[0]',
        message: 'refers back to itself (a cycle); a scenario must be a tree of JSON data',
      });
    }
  });

  it('a grid full of bad heights lists the first ten and counts the rest', () => {
    const heights = new Array(10_000).fill(null);
    const r = parseScenario(edit(baseFile(), 'terrain.features', [grid({ cols: 100, rows: 100, heights })]));
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toHaveLength(11);
    expect(r.errors[0]).toEqual({ path: 'terrain.features[0].heights[0]', message: 'must be a finite number in m, got null' });
    expect(r.errors[10]).toEqual({ path: 'terrain.features[0].heights', message: '9990 more bad heights not listed' });
  });

  it('JSON syntax errors become one error at "(file)"', () => {
    for (const text of ['{"version": 1,', '', 'not json', '{"a": 1,\n "b": }']) {
      const r = parseScenarioText(text);
      expect(r.ok).toBe(false);
      if (r.ok) continue;
      expect(r.errors).toHaveLength(1);
      expect(r.errors[0].path).toBe('(file)');
      expect(r.errors[0].message.startsWith('not valid JSON')).toBe(true);
    }
  });

  it('JSON that is not an object', () => {
    expect(parseScenarioText('42')).toEqual({ ok: false, errors: [{ path: '(file)', message: 'must be a JSON object, got 42' }] });
    expect(parseScenarioText('null')).toEqual({ ok: false, errors: [{ path: '(file)', message: 'must be a JSON object, got null' }] });
  });

  it('never throws, and never lets a zod message through', async () => {
    const fc = await import('fast-check');
    // Messages that zod writes itself start like these; ours never do.
    const zodWords = /Invalid input|Invalid option|Unrecognized key|Too (small|big)|expected .* received/;
    const file = fc.letrec((tie) => ({
      value: fc.oneof(
        { depthSize: 'small' },
        fc.constantFrom<unknown>(null, true, 0, -1, NaN, Infinity, 'x', 'metric', 'grid', 'solid', []),
        fc.double(),
        fc.array(tie('value'), { maxLength: 4 }),
        fc.dictionary(
          fc.constantFrom('version', 'units', 'vehicle', 'terrain', 'features', 'type', 'x', 'y', 'height', 'points', 'cols', '__proto__', 'zz'),
          tie('value'),
          { maxKeys: 5 },
        ),
      ),
    })).value;
    fc.assert(
      fc.property(file, (v) => {
        const r = parseScenario(v);
        if (!r.ok) {
          expect(r.errors.length).toBeGreaterThan(0);
          for (const e of r.errors) expect(zodWords.test(e.message), `${e.path}: ${e.message}`).toBe(false);
        }
      }),
      { numRuns: 300, seed: 1959 },
    );
    // Mutations of a valid file: each field replaced by an odd value.
    const oddValues: unknown[] = [undefined, null, -1, 0, NaN, 'x', [], {}, [1, 2, 3], true];
    const paths = ['version', 'name', 'units', 'vehicle', 'vehicle.track', 'vehicle.cg.height', 'vehicle.tyre', 'vehicle.suspension.rear',
      'vehicle.suspension.rear.type', 'vehicle.payload', 'terrain.features', 'terrain.features.1', 'terrain.features.1.x'];
    for (const p of paths) {
      for (const odd of oddValues) {
        const r = parseScenario(edit(baseFile(), p, odd === undefined ? DELETE : odd));
        if (!r.ok) for (const e of r.errors) expect(zodWords.test(e.message), `${e.path}: ${e.message}`).toBe(false);
      }
    }
  });
});
