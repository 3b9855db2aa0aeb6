/**
 * The path as a polyline in the scenario file (`path.points`), the first form (`from`, `to`) still
 * read, saved candidate lines (`candidates`), messages naming the field, and the round trip through
 * the file form in both unit systems. The inch is 0.0254 m exactly (International Yard and Pound
 * Agreement, 1959).
 */
import { describe, expect, it } from 'vitest';
import Ajv2020 from 'ajv/dist/2020';
import { checkScenarioSI, parseScenario, scenarioJsonSchemaFor, scenarioToFile, type Scenario } from '../../../src/core/index';
import { ROUND_TRIP_REL, baseFile, expectClose } from './helpers';

function ok(o: unknown): Scenario {
  const r = parseScenario(o);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return r.scenario;
}
function errorsOf(o: unknown): string[] {
  const r = parseScenario(o);
  if (r.ok) throw new Error('expected the file to be refused');
  return r.errors.map((e) => `${e.path}: ${e.message}`);
}
const pts = (...xy: [number, number][]) => xy.map(([x, y]) => ({ x, y }));

describe('path points in the scenario file', () => {
  it('a file with only from and to opens as the same straight path as two points', () => {
    const old = baseFile();
    old.path = { from: [-2, 0.5], to: [6, 0.5], step: 0.1 };
    const now = baseFile();
    now.path = { points: pts([-2, 0.5], [6, 0.5]), step: 0.1 };
    const a = ok(old).path!;
    expect(a).toEqual({ fromM: [-2, 0.5], toM: [6, 0.5], stepM: 0.1, headingRad: null });
    expect(ok(now).path).toEqual(a);
  });

  it('points become from, the corner points and to, in SI; imperial inches × 0.0254', () => {
    const f = baseFile();
    f.path = { points: pts([0, 0], [4, 1], [4, 6], [9, 6]), step: 0.05 };
    expect(ok(f).path).toEqual({ fromM: [0, 0], viaM: [[4, 1], [4, 6]], toM: [9, 6], stepM: 0.05, headingRad: null });
    // The base file written in inches, then an imperial path put in: 100 in = 2.54 m exactly.
    const imperial = scenarioToFile(ok(baseFile()), 'imperial');
    imperial.path = { points: pts([0, 0], [100, 50], [200, 50]), step: 2 };
    const p = ok(imperial).path!;
    expect(p.fromM).toEqual([0, 0]);
    expect(p.viaM).toEqual([[100 * 0.0254, 50 * 0.0254]]);
    expect(p.toM).toEqual([200 * 0.0254, 50 * 0.0254]);
    expect(p.stepM).toBe(2 * 0.0254);
  });

  it('writes a straight path in the first form and a path with corners as points; both read back the same, metric and imperial', () => {
    const straight = baseFile();
    straight.path = { from: [1, 2], to: [7, 2], step: 0.05, heading: 10 };
    const s1 = ok(straight);
    const w1 = scenarioToFile(s1);
    expect(w1.path).toEqual({ from: [1, 2], to: [7, 2], step: 0.05, heading: 10 });
    const bent = baseFile();
    bent.path = { points: pts([0, 0], [4.1, 1.3], [4.1, 6.7], [9.25, 6.7]), step: 0.05 };
    bent.candidates = [
      { name: 'Left of the boulder', points: pts([0, 1], [5, 2], [9, 1]) },
      { name: 'Straight up', points: pts([0, 0], [9, 0]) },
    ];
    const s2 = ok(bent);
    const w2 = scenarioToFile(s2);
    expect(w2.path).toEqual({ points: pts([0, 0], [4.1, 1.3], [4.1, 6.7], [9.25, 6.7]), step: 0.05 });
    expect(w2.candidates).toEqual(bent.candidates);
    expect(ok(JSON.parse(JSON.stringify(w2)))).toEqual(s2);
    // In inches and back: the same SI numbers within a few ulps (7 m has no decimal in inches that
    // multiplies back to exactly 7, so the writer keeps the nearest; ROUND_TRIP_REL = 1e-12).
    for (const s of [s1, s2]) {
      const inches = scenarioToFile(s, 'imperial');
      const back = ok(JSON.parse(JSON.stringify(inches)));
      expectClose(back.path, s.path, ROUND_TRIP_REL);
      expectClose(back.candidates ?? null, s.candidates ?? null, ROUND_TRIP_REL);
      expect(back.path!.viaM?.length ?? 0).toBe(s.path!.viaM?.length ?? 0);
    }
    expect((scenarioToFile(s2, 'imperial').path as { points: { x: number }[] }).points[1].x).toBeCloseTo(4.1 / 0.0254, 9);
  });

  it('messages name the field: a bad coordinate, a leg of length 0, both forms, too few and too many points', () => {
    const f = baseFile();
    f.path = { points: pts([0, 0], [1, 0], [2, 0], [200_000, 0]), step: 0.05 };
    expect(errorsOf(f)).toEqual(['path.points[3].x: must be ≤ 100000 m, got 200000']);
    f.path = { points: [{ x: 0, y: 0 }, { x: 1 }], step: 0.05 };
    expect(errorsOf(f)).toEqual(['path.points[1].y: required (m)']);
    f.path = { points: pts([0, 0], [1, 0], [1, 0], [2, 0]), step: 0.05 };
    expect(errorsOf(f)).toEqual(['path.points[2]: must differ from path.points[1] (a leg of length 0), got x 1, y 0']);
    f.path = { points: pts([0, 0], [1, 0]), from: [0, 0], to: [1, 0] };
    expect(errorsOf(f)).toEqual(['path.points: give either points or from and to (the first form), not both']);
    f.path = { step: 0.05 };
    expect(errorsOf(f)[0]).toMatch(/^path\.points: required \(a list of 2 to 200 points/);
    f.path = { from: [0, 0] };
    expect(errorsOf(f)).toEqual(['path.to: required (with path.from)']);
    f.path = { points: pts([0, 0]) };
    expect(errorsOf(f)[0]).toMatch(/^path\.points: must have at least 2 points/);
    f.path = { points: Array.from({ length: 201 }, (_, i) => ({ x: i, y: 0 })) };
    expect(errorsOf(f)[0]).toMatch(/^path\.points: must have at most 200 points/);
    // The station limit counts along every leg: 3 legs of 1000 m at 1 cm is 300 001 stations.
    f.path = { points: pts([0, 0], [1000, 0], [1000, 1000], [0, 1000]), step: 0.01 };
    expect(errorsOf(f)[0]).toMatch(/^path\.step: must be ≥ 0\.03\d* m for at most 100000 stations on this path/);
  });

  it('saved lines: named once each, points checked as the path points are', () => {
    const f = baseFile();
    f.candidates = [
      { name: 'A', points: pts([0, 0], [1, 1]) },
      { name: 'A', points: pts([0, 0], [1, -1]) },
    ];
    expect(errorsOf(f)).toEqual(['candidates[1].name: already the name of candidates[0] ("A"); each saved line needs its own name']);
    f.candidates = [{ name: 'B', points: pts([0, 0], [0, 0]) }];
    expect(errorsOf(f)).toEqual(['candidates[0].points[1]: must differ from candidates[0].points[0] (a leg of length 0), got x 0, y 0']);
    f.candidates = [{ name: '', points: pts([0, 0], [1, 0]) }];
    expect(errorsOf(f)).toEqual(['candidates[0].name: must not be empty']);
    f.candidates = Array.from({ length: 21 }, (_, i) => ({ name: `L${i}`, points: pts([0, 0], [1, i]) }));
    expect(errorsOf(f)[0]).toMatch(/^candidates: must have at most 20 candidate lines/);
  });

  it('an edit in the app is checked on the SI form with the same messages', () => {
    const f = baseFile();
    f.path = { points: pts([0, 0], [4, 1], [9, 1]), step: 0.05 };
    const s = ok(f);
    expect(checkScenarioSI(s)).toEqual([]);
    const far: Scenario = { ...s, path: { ...s.path!, viaM: [[200_000, 1]] } };
    expect(checkScenarioSI(far).map((e) => `${e.path}: ${e.message}`)).toEqual(['path.points[1].x: must be ≤ 100000 m, got 200000']);
    const zero: Scenario = { ...s, path: { ...s.path!, viaM: [[0, 0]] } };
    expect(checkScenarioSI(zero).map((e) => `${e.path}: ${e.message}`)).toEqual(['path.points[1]: must differ from path.points[0] (a leg of length 0), got x 0, y 0']);
    const twice: Scenario = { ...s, candidates: [{ name: 'X', pointsM: [[0, 0], [1, 0]] }, { name: 'X', pointsM: [[0, 0], [2, 0]] }] };
    expect(checkScenarioSI(twice).map((e) => e.path)).toEqual(['candidates[1].name']);
  });

  it('the JSON Schema (checked with ajv, an independent validator) takes both path forms and the saved lines', () => {
    const ajv = new Ajv2020({ strict: true, allErrors: true, allowUnionTypes: true });
    const validate = ajv.compile(scenarioJsonSchemaFor('metric'));
    const f = baseFile();
    f.path = { points: pts([0, 0], [4, 1], [9, 1]), step: 0.05 };
    f.candidates = [{ name: 'Left', points: pts([0, 0], [9, 2]) }];
    expect(validate(f)).toBe(true);
    f.path = { from: [0, 0], to: [9, 1] };
    expect(validate(f)).toBe(true);
    f.path = { points: [{ x: 0, y: 0 }, { x: 1, z: 0 }] };
    expect(validate(f)).toBe(false);
  });
});
