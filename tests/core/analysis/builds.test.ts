/** Build options: wheel fitment, the physical change of each modification, SSF, the builds block of the scenario file. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  applyBuild,
  backspacingFromOffsetM,
  cgBand,
  compareBuilds,
  offsetFromBackspacingM,
  staticStabilityFactor,
  totalCgHeightM,
  trackChangeM,
} from '../../../src/core/analysis/builds';
import { parseScenario, parseScenarioText } from '../../../src/core/scenario/parse';
import { scenarioToFile } from '../../../src/core/scenario/write';
import { rigidVehicle, testVehicle } from '../../helpers/vehicles';


const IN = 0.0254;
const MM = 0.001;
const DEG = Math.PI / 180;

describe('wheel fitment arithmetic (common practice, REFERENCES "Wheel fitment")', () => {
  it('backspacing = (rim + 1 in)/2 + offset: 8 in rim at 0 → 4.5 in, +25.4 mm → 5.5 in, −12 mm → 4.03 in', () => {
    expect(backspacingFromOffsetM(8 * IN, 0) / IN).toBeCloseTo(4.5, 12);
    expect(backspacingFromOffsetM(8 * IN, 25.4 * MM) / IN).toBeCloseTo(5.5, 12);
    expect(backspacingFromOffsetM(8 * IN, -12 * MM) / IN).toBeCloseTo(4.03, 2);
    expect(offsetFromBackspacingM(8 * IN, 5.5 * IN) / MM).toBeCloseTo(25.4, 9);
  });

  it('a spacer of s per side widens the track by 2s; backspacing lower by d widens it by 2d', () => {
    expect(trackChangeM({ spacerM: 0.03 })).toBeCloseTo(0.06, 12);
    const stock = { rimWidthM: 8 * IN, backspacingM: 4.5 * IN };
    const fitted = { rimWidthM: 8 * IN, backspacingM: 3.5 * IN };
    expect(trackChangeM({ stock, fitted }) / IN).toBeCloseTo(2, 12);
    // A wider rim at the same backspacing moves the centre-line out by half the width change per side.
    expect(trackChangeM({ stock, fitted: { rimWidthM: 10 * IN, backspacingM: 4.5 * IN } }) / IN).toBeCloseTo(2, 12);
    // Offset form: stock 0 mm, fitted −12 mm, plus a 25 mm spacer → 2·(12 + 25) mm.
    expect(trackChangeM({ stock: { rimWidthM: 8 * IN, offsetM: 0 }, fitted: { rimWidthM: 9 * IN, offsetM: -12 * MM }, spacerM: 25 * MM }) / MM).toBeCloseTo(74, 9);
    expect(() => trackChangeM({ fitted })).toThrow('wheels.fitted needs wheels.stock');
  });
});

describe('modifications as physical changes', () => {
  const v = testVehicle({ unsprungMassFrontKg: 150, unsprungMassRearKg: 170 }); // 2000 kg, CG 0.75 m

  it('suspension lift Δ raises the CG by Δ·m_sprung/m and the payload and body by Δ', () => {
    // Derived: the sprung mass (m − unsprung) rises by Δ, the unsprung stays: mass-weighted mean.
    const withTent = { ...v, payload: [{ label: 'tent', massKg: 60, behindFrontAxleM: 1.3, heightM: 2.0, leftOfCentreM: 0 }] };
    const b = applyBuild(withTent, { name: 'lift', lift: { suspensionM: 0.05 } }).vehicle;
    expect(b.cg.heightM).toBeCloseTo(0.75 + (0.05 * 1680) / 2000, 12);
    expect(b.payload[0].heightM).toBeCloseTo(2.05, 12);
    expect(b.body.bellyClearanceM).toBeCloseTo(v.body.bellyClearanceM + 0.05, 12);
    expect(b.suspensionFront.rollCentreHeightM).toBe(v.suspensionFront.rollCentreHeightM);
    expect(withTent.payload[0].heightM).toBe(2.0); // input untouched
  });

  it('body lift Δ raises only the body share of the sprung mass; belly and bumpers stay', () => {
    const b = applyBuild(v, { name: 'body', lift: { bodyM: 0.05, bodyMassShare: 0.4 } }).vehicle;
    expect(b.cg.heightM).toBeCloseTo(0.75 + (0.05 * 0.4 * 1680) / 2000, 12);
    expect(b.body.bellyClearanceM).toBe(v.body.bellyClearanceM);
    expect(b.body.roofHeightM).toBeCloseTo(v.body.roofHeightM + 0.05, 12);
    const d = applyBuild(v, { name: 'body', lift: { bodyM: 0.05 } });
    expect(d.vehicle.cg.heightM).toBeCloseTo(0.75 + (0.05 * 0.35 * 1680) / 2000, 12);
    expect(d.changes[0]).toMatch(/body taken as 35 % of the sprung mass/);
  });

  it('bigger tyres raise everything by the radius change', () => {
    const b = applyBuild(v, { name: 'tyres', tyre: { radiusM: 0.45 } }).vehicle;
    expect(b.cg.heightM).toBeCloseTo(0.8, 12);
    expect(b.tyreFront.radiusM).toBe(0.45);
    expect(b.tyreRear.radiusM).toBe(0.45);
    expect(b.body.frontBumperClearanceM).toBeCloseTo(v.body.frontBumperClearanceM + 0.05, 12);
    expect(b.suspensionRear.rollCentreHeightM).toBeCloseTo(v.suspensionRear.rollCentreHeightM + 0.05, 12);
  });

  it('SSF = T/(2h) with the mean track and the total CG height (NHTSA; REFERENCES check T 1.60, h 0.70 → 1.1429)', () => {
    const w = testVehicle({ cg: { behindFrontAxleM: 1.3, heightM: 0.7, leftOfCentreM: 0 } });
    expect(staticStabilityFactor(w)).toBeCloseTo(1.1429, 4);
    const load = { ...w, payload: [{ label: 'roof', massKg: 100, behindFrontAxleM: 1.3, heightM: 1.9, leftOfCentreM: 0 }] };
    expect(totalCgHeightM(load)).toBeCloseTo((2000 * 0.7 + 100 * 1.9) / 2100, 12);
  });

  it('anti-roll bar disconnected and travel changes', () => {
    const s = testVehicle({ suspensionFront: { ...v.suspensionFront, antiRollNmPerRad: 30_000 } });
    const b = applyBuild(s, { name: 'x', antiRoll: { front: 'disconnected' }, travel: { rear: { droopM: 0.25 } } }).vehicle;
    expect(b.suspensionFront.antiRollNmPerRad).toBe(0);
    expect(b.suspensionRear.droopM).toBe(0.25);
    expect(b.suspensionRear.bumpM).toBe(s.suspensionRear.bumpM);
  });
});

describe('comparing builds', () => {
  it('a wider track and a lower CG raise the side tip angle, and the change column is value − first', () => {
    const base = rigidVehicle();
    const rows = compareBuilds(base, [{ name: 'as given' }, { name: 'spacers', wheels: { spacerM: 0.05 } }], { roseStepRad: 90 * DEG });
    const [a, b] = rows;
    // Rigid vehicle on a tilt table: tan θ = (T/2)/h (SSF, NHTSA); +0.1 m of track.
    expect(a.metrics.leftDownTipRad!).toBeCloseTo(Math.atan(0.8 / 0.75), 3);
    expect(b.metrics.leftDownTipRad!).toBeCloseTo(Math.atan(0.85 / 0.75), 3);
    expect(b.change.leftDownTipRad!).toBeCloseTo(b.metrics.leftDownTipRad! - a.metrics.leftDownTipRad!, 12);
    expect(b.change.trackMeanM!).toBeCloseTo(0.1, 12);
    expect(a.change.ssf).toBe(0);
    expect(() => compareBuilds(base, new Array(7).fill({ name: 'x' }))).toThrow('at most 6 builds, got 7');
  });

  it('CG-height band: a higher CG tips earlier; the band brackets the nominal tip', () => {
    const band = cgBand(rigidVehicle(), 0.05);
    const [hi, lo] = band.directions.leftDown.tipRad;
    // Rigid: tan θ = (T/2)/(h ± 0.05) (SSF).
    expect(hi).toBeCloseTo(Math.atan(0.8 / 0.8), 3);
    expect(lo).toBeCloseTo(Math.atan(0.8 / 0.7), 3);
  });
});

describe('the builds block of the scenario file', () => {
  const demo = JSON.parse(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));

  it('reads the demo: rim width and backspacing in inches, offset in mm, other lengths in the file units', () => {
    const r = parseScenarioText(JSON.stringify(demo));
    if (!r.ok) throw new Error(JSON.stringify(r.errors));
    const b = r.scenario.builds!;
    expect(b).toHaveLength(2);
    expect(b[0].wheels!.fitted).toEqual({ rimWidthM: 9 * IN, offsetM: -12 * MM });
    expect(b[0].lift!.suspensionM).toBe(0.0635);
    expect(b[1].antiRoll!.front).toBe('disconnected');
    // Round trip through the file form.
    const again = parseScenario(scenarioToFile(r.scenario));
    if (!again.ok) throw new Error(JSON.stringify(again.errors));
    expect(again.scenario.builds).toEqual(b);
  });

  it('imperial file: lift and spacer in inches; fitment still in and mm', () => {
    const parsed = parseScenarioText(JSON.stringify(demo));
    if (!parsed.ok) throw new Error(JSON.stringify(parsed.errors));
    const file = scenarioToFile(parsed.scenario, 'imperial');
    // And back: the imperial file reads to the same builds.
    const back = parseScenario(file);
    expect(back.ok && back.scenario.builds![1].wheels!.spacerM).toBeCloseTo(0.0254, 12);
    const builds = file.builds as { lift?: { suspension: number }; wheels?: { offset?: number; spacer?: number } }[];
    expect(builds[0].lift!.suspension).toBeCloseTo(2.5, 9);
    expect(builds[0].wheels!.offset).toBeCloseTo(-12, 9);
    expect(builds[1].wheels!.spacer).toBeCloseTo(1, 9);
  });

  it('names each bad build field', () => {
    const bad = structuredClone(demo);
    bad.builds[0].wheels = { rimWidth: 9 };
    bad.builds[1].wheels = { rimWidth: 30, offset: -12, backspacing: 4, stock: { rimWidth: 8 } };
    bad.builds[1].antiRoll = { front: 'off' };
    bad.builds.push({ name: bad.builds[0].name });
    const r = parseScenario(bad);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    const lines = r.errors.map((e) => `${e.path}: ${e.message}`);
    expect(lines).toEqual(
      expect.arrayContaining([
        'builds[0].wheels: a new wheel needs offset (mm) or backspacing (in) with its rimWidth (in)',
        'builds[0].wheels.stock: required with a new wheel: the stock rimWidth (in) and offset (mm) or backspacing (in) the track was measured on',
        'builds[1].wheels.rimWidth: must be ≤ 20 in, got 30',
        'builds[1].wheels: give offset (mm) or backspacing (in), not both',
        'builds[1].wheels.stock: give offset (mm) or backspacing (in), one of the two',
        'builds[1].antiRoll.front: must be "disconnected" or a stiffness ≥ 0 N·m/deg, got "off"',
        `builds[2].name: must differ from builds[0].name, got ${JSON.stringify(demo.builds[0].name)}`,
      ]),
    );
  });
});
