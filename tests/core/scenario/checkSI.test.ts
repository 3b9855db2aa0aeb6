/**
 * The app's per-edit check (checkScenarioSI, on the SI form) against the file parser
 * (parseScenario of the file form): the same rules, the same messages, whatever route a value
 * takes. The file parser is the reference here: it is the documented validation point
 * (docs/scenario-format.md), and its messages are pinned value by value in bad-input.test.ts.
 */
import { describe, expect, it } from 'vitest';
import { checkScenarioSI, parseScenario, scenarioToFile, type Scenario } from '../../../src/core/index';
import { setIn } from '../../../src/app/edit';
import { baseFile, imperialBaseFile } from './helpers';

function scenarioOf(o: unknown): Scenario {
  const r = parseScenario(o);
  if (!r.ok) throw new Error(r.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return r.scenario;
}

const metric = scenarioOf(baseFile());
const imperial = scenarioOf(imperialBaseFile());

/** [what, SI path, SI value] — each breaks one rule (a bound, a cross-field rule or a name rule). */
const EDITS: [string, (string | number)[], unknown][] = [
  ['tyre stiffness 5e-324 N/m', ['vehicle', 'tyreFront', 'stiffnessNPerM'], 5e-324],
  ['a 1e-9 kg vehicle', ['vehicle', 'massKg'], 1e-9],
  ['mass NaN', ['vehicle', 'massKg'], NaN],
  ['wheel rate 0', ['vehicle', 'suspensionRear', 'wheelRateNPerM'], 0],
  ['negative droop', ['vehicle', 'suspensionFront', 'droopM'], -0.01],
  ['CG behind the rear axle', ['vehicle', 'cg', 'behindFrontAxleM'], 3.5],
  ['CG offset past half the track', ['vehicle', 'cg', 'leftOfCentreM'], 0.9],
  ['unsprung as heavy as the vehicle', ['vehicle', 'unsprungMassFrontKg'], 1900],
  ['tyre as wide as the track', ['vehicle', 'tyreRear', 'widthM'], 1.7],
  ['roof below the belly', ['vehicle', 'body', 'roofHeightM'], 0.1],
  ['spring spacing on an independent axle', ['vehicle', 'suspensionFront', 'springSpacingM'], 1.1],
  ['ESC in the vehicle name', ['vehicle', 'name'], 'Wagon\u001b]0;owned\u0007'],
  ['DEL in the scenario name', ['name'], 'Bench\u007f'],
  ['C1 in a payload label', ['vehicle', 'payload'], [{ label: 'tent\u009b', massKg: 60, behindFrontAxleM: 1.4, heightM: 2, leftOfCentreM: 0 }]],
  ['empty vehicle name', ['vehicle', 'name'], ''],
  ['step height past 1 km', ['terrain', 'features', 1, 'heightM'], 1200],
  ['friction 0', ['friction'], 0],
  ['tilt past 180°', ['tilt', 'angleRad'], 4],
  ['pose far away', ['pose', 'xM'], 2e5],
];

describe('checkScenarioSI gives what parseScenario gives for the same scenario', () => {
  for (const [units, base] of [['metric', metric], ['imperial', imperial]] as const) {
    it.each(EDITS)(`%s (${units} file)`, (_what, path, value) => {
      const cand = setIn<Scenario>(base, path, value);
      const viaSI = checkScenarioSI(cand, units);
      const parsed = parseScenario(scenarioToFile(cand, units));
      const viaFile = parsed.ok ? [] : parsed.errors;
      expect(viaSI.length).toBeGreaterThan(0);
      expect(viaSI).toEqual(viaFile);
    });
  }
  it('a valid scenario has no errors either way', () => {
    expect(checkScenarioSI(metric)).toEqual([]);
    expect(checkScenarioSI(imperial)).toEqual([]);
  });
  it('names the field and the bound: vehicle.tyre.stiffness', () => {
    const cand = setIn<Scenario>(metric, ['vehicle', 'tyreFront', 'stiffnessNPerM'], 5e-324);
    expect(checkScenarioSI(cand, 'metric')).toEqual([{ path: 'vehicle.tyre.stiffness', message: 'must be ≥ 10000 N/m, got 5e-324' }]);
  });
});
