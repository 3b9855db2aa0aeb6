/**
 * Unit conversion against the definitions of the units themselves.
 * International Yard and Pound Agreement (1959): 1 yd = 0.9144 m exactly, 1 lb = 0.45359237 kg
 * exactly; so 1 in = 0.9144 / 36 m = 0.0254 m and 1 ft = 0.3048 m. The pound-force is one pound
 * under standard gravity, gn = 9.80665 m/s² (3rd CGPM, 1901): 1 lbf = 4.4482216152605 N.
 */
import { describe, expect, it } from 'vitest';
import {
  KG_PER_LB,
  M_PER_FT,
  M_PER_IN,
  N_PER_LBF,
  STANDARD_GRAVITY_M_PER_S2,
  fromSI,
  parseScenario,
  toSI,
  unitLabel,
  type QuantityKind,
} from '../../../src/core/index';
import { baseFile, edit } from './helpers';


const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('unit constants (1959 agreement; 3rd CGPM 1901 for gn)', () => {
  it('inch and foot from the yard', () => {
    const YARD_M = 0.9144; // 1959 agreement
    expect(rel(M_PER_IN, YARD_M / 36)).toBeLessThan(1e-15);
    expect(rel(M_PER_FT, YARD_M / 3)).toBeLessThan(1e-15);
    expect(rel(12 * M_PER_IN, M_PER_FT)).toBeLessThan(1e-15);
  });
  it('pound and pound-force', () => {
    expect(KG_PER_LB).toBe(0.45359237); // 1959 agreement, exact
    expect(STANDARD_GRAVITY_M_PER_S2).toBe(9.80665); // 3rd CGPM, exact
    expect(rel(N_PER_LBF, KG_PER_LB * STANDARD_GRAVITY_M_PER_S2)).toBeLessThan(1e-15);
  });
});

describe('toSI / fromSI', () => {
  // [kind, file value, units, SI value derived by hand from the definitions above]
  const cases: [QuantityKind, number, 'metric' | 'imperial', number][] = [
    ['length', 1, 'imperial', 0.0254],
    ['length', 36, 'imperial', 0.9144], // one yard
    ['length', 1, 'metric', 1],
    ['mass', 1, 'imperial', 0.45359237],
    ['mass', 1 / 0.45359237, 'imperial', 1], // 2.20462262… lb = 1 kg
    ['mass', 2150, 'metric', 2150],
    // 1 lbf/in = 4.4482216152605 N / 0.0254 m = 175.126835246476… N/m
    ['stiffness', 1, 'imperial', 4.4482216152605 / 0.0254],
    ['stiffness', 1000, 'imperial', 175126.835246476],
    // 1 N·m/deg = 180/π N·m/rad = 57.2957795130823 N·m/rad
    ['rollStiffness', 1, 'metric', 57.2957795130823],
    // 1 lbf·ft/deg = 4.4482216152605 × 0.3048 N·m per (π/180) rad = 77.6826462 N·m/rad
    ['rollStiffness', 1, 'imperial', (4.4482216152605 * 0.3048 * 180) / Math.PI],
    ['angle', 180, 'metric', Math.PI],
    ['angle', 90, 'imperial', Math.PI / 2],
    ['ratio', 0.7, 'imperial', 0.7],
  ];
  it.each(cases)('%s: %d (%s) = %d SI', (kind, v, units, si) => {
    expect(rel(toSI(kind, v, units), si)).toBeLessThan(1e-13);
    expect(rel(fromSI(kind, si, units), v)).toBeLessThan(1e-13);
  });
  it('1 lbf·ft/deg in N·m/rad, by the numbers', () => {
    // 1 lbf·ft = 4.4482216152605 × 0.3048 = 1.3558179483314 N·m (NIST SP 811, appendix B, lists 1.355818; from memory);
    // per degree → per radian: × 57.2957795130823 = 77.6826462 N·m/rad.
    expect(toSI('rollStiffness', 1, 'imperial')).toBeCloseTo(77.6826462, 6);
    expect(toSI('rollStiffness', 1, 'imperial') / toSI('rollStiffness', 1, 'metric')).toBeCloseTo(1.355818, 6);
  });
  it('labels', () => {
    expect(['length', 'mass', 'stiffness', 'rollStiffness', 'angle'].map((k) => unitLabel(k as QuantityKind, 'metric'))).toEqual([
      'm', 'kg', 'N/m', 'N·m/deg', 'deg',
    ]);
    expect(['length', 'mass', 'stiffness', 'rollStiffness', 'angle'].map((k) => unitLabel(k as QuantityKind, 'imperial'))).toEqual([
      'in', 'lb', 'lbf/in', 'lbf·ft/deg', 'deg',
    ]);
  });
});

describe('an imperial file is read in imperial units', () => {
  it('lengths, masses, stiffnesses, anti-roll, angles', () => {
    let o = edit(baseFile(), 'units', 'imperial');
    o = edit(o, 'vehicle.wheelbase', 110); // in
    o = edit(o, 'vehicle.track', { front: 63, rear: 63 }); // in
    o = edit(o, 'vehicle.cg.height', 29.5); // in
    o = edit(o, 'vehicle.tyre', { radius: 15, width: 10, stiffness: 1800 }); // in, in, lbf/in
    o = edit(o, 'vehicle.mass', 4400); // lb
    o = edit(o, 'vehicle.suspension.front.antiRoll', 500); // lbf·ft/deg
    o = edit(o, 'vehicle.suspension.front.wheelRate', 250); // lbf/in
    o = edit(o, 'terrain.features', [{ type: 'plane', crossSlope: 15, height: 2 }]);
    o = edit(o, 'tilt', { angle: 30, downhill: -90 });
    const r = parseScenario(o);
    expect(r.ok ? [] : r.errors).toEqual([]);
    if (!r.ok) return;
    const v = r.scenario.vehicle;
    expect(rel(v.wheelbaseM, 110 * 0.0254)).toBeLessThan(1e-15); // 2.794 m
    expect(rel(v.massKg, 4400 * 0.45359237)).toBeLessThan(1e-15); // 1995.806428 kg
    expect(rel(v.tyreFront.stiffnessNPerM, (1800 * 4.4482216152605) / 0.0254)).toBeLessThan(1e-14);
    expect(rel(v.suspensionFront.wheelRateNPerM, (250 * 4.4482216152605) / 0.0254)).toBeLessThan(1e-14);
    expect(rel(v.suspensionFront.antiRollNmPerRad, (500 * 4.4482216152605 * 0.3048 * 180) / Math.PI)).toBeLessThan(1e-14);
    // Angles stay degrees in every unit system.
    const plane = r.scenario.terrain.features[0];
    expect(plane.type === 'plane' && plane.crossSlopeRad).toBeCloseTo((15 * Math.PI) / 180, 15);
    expect(plane.type === 'plane' && plane.heightM).toBeCloseTo(0.0508, 15);
    expect(r.scenario.tilt.angleRad).toBeCloseTo(Math.PI / 6, 15);
    // -90° (right side down) is normalised to 270°.
    expect(r.scenario.tilt.downhillRad).toBeCloseTo((3 * Math.PI) / 2, 15);
  });
});
