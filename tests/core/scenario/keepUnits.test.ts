/**
 * A file keeps its own units when saved: open an imperial file, edit, save: still imperial; every
 * value the user typed is written back as typed; a value entered in the other unit system is
 * rounded to the file unit's resolution (0.1 lb, 0.01 in: common practice for hand-measured
 * vehicle data) and the scenario holds exactly what the saved file says.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { parseScenarioText, scenarioToFile, toSI, type Scenario } from '../../../src/core/index';
import { validate, withField, type FieldSpec } from '../../../src/app/edit';

const QUARRY = 'assets/scenarios/quarry-haul-road-utv.json';

function open(path: string): { text: string; scenario: Scenario } {
  const text = readFileSync(path, 'utf8');
  const r = parseScenarioText(text);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return { text, scenario: r.scenario };
}

/** Every number in `original` at the same place in `written` (keys `written` adds are ignored). */
function numbersKept(original: unknown, written: unknown, path = ''): string[] {
  const out: string[] = [];
  if (typeof original === 'number') {
    if (written !== original) out.push(`${path}: ${original} written as ${String(written)}`);
  } else if (Array.isArray(original)) {
    original.forEach((x, i) => out.push(...numbersKept(x, (written as unknown[] | undefined)?.[i], `${path}[${i}]`)));
  } else if (original !== null && typeof original === 'object') {
    for (const [k, x] of Object.entries(original)) out.push(...numbersKept(x, (written as Record<string, unknown> | undefined)?.[k], path ? `${path}.${k}` : k));
  }
  return out;
}

const mass: FieldSpec = { label: 'Mass as weighed', si: ['vehicle', 'massKg'], file: 'vehicle.mass', kind: 'mass' };
const track: FieldSpec = { label: 'Track, front', si: ['vehicle', 'trackFrontM'], file: 'vehicle.track.front', kind: 'length' };

describe('a file keeps its units and its typed values', () => {
  it.each(readdirSync('assets/scenarios').map((f) => `assets/scenarios/${f}`))('%s: saved unedited, every number is written as it was typed', (path) => {
    const { text, scenario } = open(path);
    const written = scenarioToFile(scenario);
    expect(written.units).toBe(JSON.parse(text).units);
    expect(numbersKept(JSON.parse(text), written)).toEqual([]);
  });

  it('the imperial demo, mass typed in lb: still imperial, 1750 lb written as 1750, the rest untouched', () => {
    const { text, scenario } = open(QUARRY);
    const typed = toSI('mass', 1750, 'imperial');
    const cand = withField(scenario, mass, typed, 'imperial');
    expect(validate(cand, 'imperial').ok).toBe(true);
    const written = scenarioToFile(cand);
    expect(written.units).toBe('imperial');
    expect((written.vehicle as { mass: number }).mass).toBe(1750);
    const original = JSON.parse(text);
    original.vehicle.mass = 1750;
    expect(numbersKept(original, written)).toEqual([]);
  });

  it('the imperial demo, mass typed in kg (app in metric): written in lb to 0.1 lb, and reopening gives the same scenario', () => {
    const { scenario } = open(QUARRY);
    // 800 kg = 800 / 0.45359237 lb = 1763.6980… lb (1959 agreement) → 1763.7 lb.
    const cand = withField(scenario, mass, 800, 'metric');
    const written = scenarioToFile(cand);
    expect(written.units).toBe('imperial');
    expect((written.vehicle as { mass: number }).mass).toBe(1763.7);
    const again = parseScenarioText(JSON.stringify(written));
    expect(again.ok && again.scenario.vehicle.massKg).toBe(cand.vehicle.massKg);
  });

  it('a length typed in m into the imperial file is kept to 0.01 in', () => {
    const { scenario } = open(QUARRY);
    // 1.3 m = 1.3 / 0.0254 in = 51.1811… in → 51.18 in.
    const written = scenarioToFile(withField(scenario, track, 1.3, 'metric'));
    expect((written.vehicle as { track: { front: number } }).track.front).toBe(51.18);
  });

  it('no float images in the saved imperial file (no 780.1788764 where 1720 lb was typed)', () => {
    const { scenario } = open(QUARRY);
    const out = JSON.stringify(scenarioToFile(scenario));
    expect(out).toContain('"mass":1720');
    expect(out).not.toMatch(/\d\.\d{9,}/);
  });
});
