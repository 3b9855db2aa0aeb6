/**
 * Heading sweep on the ground as it is (src/core/analysis/headings.ts).
 * Checks: the fitted ground plane against the plane it samples; a rigid vehicle on a 20° plane tips,
 * from level, where the closed forms say: side-on at atan(SSF) = atan((T/2)/h) (NHTSA 2001; NRC/TRB
 * SR 265), nose down at atan(a/h) and tail down at atan(b/h) (Gillespie 1992, ch. 2); the worst
 * heading is side-on.
 */
import { describe, expect, it, vi } from 'vitest';

vi.mock('react', () => ({}));

import { downhillAt, groundPlaneAt, headingSweep, headingsEvery, summariseHeadings, type HeadingResult } from '../../src/core/analysis/headings';
import { TerrainField } from '../../src/core/terrain/field';
import { rigidVehicle, testVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;

describe('the ground plane at a spot', () => {
  it('a plane: its slope and fall line exactly, no scatter', () => {
    // Rises 10° toward +x and 5° toward +y: falls toward −(tan10°, tan5°).
    const f = new TerrainField({ features: [{ type: 'plane', gradeRad: 10 * DEG, crossSlopeRad: 5 * DEG, heightM: 0.3 }] });
    const g = groundPlaneAt(f, 2, -1, 2);
    expect(g.slopeRad).toBeCloseTo(Math.atan(Math.hypot(Math.tan(10 * DEG), Math.tan(5 * DEG))), 10);
    expect(g.fallAzimuthRad).toBeCloseTo(Math.atan2(-Math.tan(5 * DEG), -Math.tan(10 * DEG)), 10);
    expect(g.rmsM).toBeLessThan(1e-9);
  });

  it('level ground: slope 0, the extra tilt taken left side down', () => {
    const g = groundPlaneAt(new TerrainField({ features: [] }), 0, 0, 2);
    expect(g.slopeRad).toBe(0);
    expect(downhillAt(g, 1.234)).toBeCloseTo(Math.PI / 2, 12);
  });
});

describe('a rigid vehicle on a 20° side hill, every 90°', () => {
  // rigidVehicle: T 1.6 m, h 0.75 m, L 2.8 m, a 1.3 m (CG behind the front axle), b 1.5 m.
  // Cross slope −20°: the ground falls toward +y (terrain frame), so at heading 0 the left side is down.
  const terrain = { features: [{ type: 'plane' as const, gradeRad: 0, crossSlopeRad: -20 * DEG, heightM: 0 }] };
  // Cardinal headings only: at oblique headings on the slope the solver does not converge for this
  // 1e9 N/m vehicle from its cold start (seen here; the compliant test rig below does).
  const r = headingSweep(rigidVehicle(), terrain, 0, 0, { stepRad: 90 * DEG, friction: 2 });
  const at = (deg: number) => r.headings.find((h) => Math.abs(h.headingRad - deg * DEG) < 1e-9)!;
  const fromLevel = (h: HeadingResult) => r.ground.slopeRad + h.tip!.extraRad;
  // Tolerance 0.1°: the sweep bisects to 0.01°, the tyres are 1e9 N/m (rigid to micrometres).
  const TOL = 0.1 * DEG;

  it('the ground: 20° falling toward +y', () => {
    expect(r.ground.slopeRad).toBeCloseTo(20 * DEG, 10);
    expect(r.ground.fallAzimuthRad).toBeCloseTo(90 * DEG, 10);
    expect(r.headings).toHaveLength(4);
  });

  it('heading 0 (left side down): tips from level at atan(SSF) = 46.85°', () => {
    const h = at(0);
    expect(h.downhillRad).toBeCloseTo(Math.PI / 2, 10);
    expect(Math.abs(fromLevel(h) - Math.atan(0.8 / 0.75))).toBeLessThan(TOL);
    expect([...h.tip!.edge].sort()).toEqual(['FL', 'RL']);
  });

  it('heading 90° (nose down) and 270° (tail down): atan(a/h) = 60.02°, atan(b/h) = 63.43°', () => {
    expect(at(90).downhillRad).toBeCloseTo(0, 10);
    expect(Math.abs(fromLevel(at(90)) - Math.atan(1.3 / 0.75))).toBeLessThan(TOL);
    expect(Math.abs(fromLevel(at(270)) - Math.atan(1.5 / 0.75))).toBeLessThan(TOL);
  });

  it('the worst heading is side-on, its margin the extra tilt to the tip (about 26.85° more than the ground)', () => {
    const w = r.worst!.headingRad / DEG;
    expect([0, 180]).toContain(Math.round(w));
    expect(Math.abs(r.worst!.tip!.extraRad - (Math.atan(0.8 / 0.75) - 20 * DEG))).toBeLessThan(TOL);
    for (const h of r.headings) expect(h.tip!.extraRad).toBeGreaterThanOrEqual(r.worst!.tip!.extraRad);
  });
});

describe('the compliant test rig on the same hill, every 30°', () => {
  const terrain = { features: [{ type: 'plane' as const, gradeRad: 0, crossSlopeRad: -20 * DEG, heightM: 0 }] };
  const r = headingSweep(testVehicle(), terrain, 0, 0, { stepRad: 30 * DEG, friction: 2 });

  it('stands at every heading; the worst is side-on; an oblique heading has more to spare than side-on', () => {
    expect(r.headings.every((h) => h.stands)).toBe(true);
    expect([0, 180]).toContain(Math.round(r.worst!.headingRad / DEG));
    // On a rectangle of support, a fall line at ψ from the nose meets the side edge after (T/2)/sin ψ ≥ T/2
    // of travel of the plumb point: an oblique heading tips later than side-on (plain geometry).
    const at = (deg: number) => r.headings.find((h) => Math.abs(h.headingRad - deg * DEG) < 1e-9)!;
    expect(at(30).tip!.extraRad).toBeGreaterThan(at(0).tip!.extraRad);
    expect(at(150).tip!.extraRad).toBeGreaterThan(at(180).tip!.extraRad);
    // Mirror headings about the fall line (30° and 150°, 60° and 120°) give the same answer (the rig is symmetric left–right).
    expect(at(30).tip!.extraRad).toBeCloseTo(at(150).tip!.extraRad, 3);
    expect(at(60).tip!.extraRad).toBeCloseTo(at(120).tip!.extraRad, 3);
  });
});

describe('summary', () => {
  it('a heading that does not stand is the worst, with no extra tilt at all', () => {
    const g = { slopeRad: 0.3, fallAzimuthRad: 0, rmsM: 0, radiusM: 2 };
    const ok: HeadingResult = { headingRad: 0, downhillRad: 0, solved: true, stands: true, forceAngleRad: 0.4, firstLift: null, tip: { extraRad: 0.2, edge: ['FL', 'RL'] } };
    const bad: HeadingResult = { ...ok, headingRad: 1, stands: false, forceAngleRad: -0.1, tip: { extraRad: 0, edge: [] } };
    const s = summariseHeadings(g, 0, 0, [bad, ok]);
    expect(s.headings.map((h) => h.headingRad)).toEqual([0, 1]);
    expect(s.worst).toBe(bad);
    // A heading the solver could not settle is no answer: left out of the worst, listed.
    const miss: HeadingResult = { ...ok, headingRad: 2, solved: false, stands: false, forceAngleRad: 0, tip: null };
    const s2 = summariseHeadings(g, 0, 0, [ok, miss]);
    expect(s2.worst).toBe(ok);
    expect(s2.unsolved).toEqual([miss]);
    expect(summariseHeadings(g, 0, 0, [miss]).worst).toBeNull();
    expect(headingsEvery(5 * DEG)).toHaveLength(72);
    expect(() => summariseHeadings(g, 0, 0, [])).toThrow();
  });
});
