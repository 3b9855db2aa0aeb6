/**
 * Tip continuity at 1° on every demo vehicle (issue: "the tip angles of directions 1° apart differ by
 * less than 0.5°, except where the tip edge changes, which must be explained in the result").
 *
 * Allowance: 0.5° plus 1.5 × the change of the same vehicle's rigid closed form between the two
 * directions (tan θ = reach/h over the support rectangle: SSF = T/2h sideways, NHTSA 2001; a/h and b/h
 * fore-aft, Gillespie 1992 ch. 2): near the corners of the support even a rigid vehicle's tip moves
 * faster than 0.5° per degree of direction, so the allowance follows the geometry, not the solver.
 * Exempt, and said in the result: a change of tip edge (RoseDirection.tipEdgeChanged) and a tip on a
 * nearly neutral stretch (tip.softFrom, where that stretch began: the slope to spare takes it as the limit).
 *
 * The case that made this test: the ledge-down demo's rear-right wheel lifts at about 38.3° with the
 * table tilted 60–65° round from the nose, and the three-wheel stance just past the lift is unstable
 * (the stability check's smallest eigenvalue is negative there), stable again about 1° further on.
 * The sweep used to end the branch at the lift in some directions and step over the unstable stretch
 * in others (tips 38.3° and 41.9° one degree apart); the stable branch ends at the lift in all of them.
 */
import { readFileSync, readdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { stabilityRose } from '../../../src/core/analysis/rose';
import type { Vehicle } from '../../../src/core/model/types';
import { rigidTipRad } from '../../helpers/rigidTip';
import { parseScenarioText } from '../../../src/core/scenario/index';
import { buildModel, solveEquilibrium } from '../../../src/core/solver/equilibrium';
import { tiltSweep } from '../../../src/core/solver/tilt';

const DEG = Math.PI / 180;
const DIR = 'assets/scenarios';
const POSE = { xM: 0, yM: 0, headingRad: 0 };


function demoVehicle(file: string): { vehicle: Vehicle; friction: number } {
  const parsed = parseScenarioText(readFileSync(`${DIR}/${file}`, 'utf8'));
  if (!parsed.ok) throw new Error(`${file}: does not parse`);
  return { vehicle: parsed.scenario.vehicle, friction: parsed.scenario.friction };
}

describe('a wheel lifting onto an unstable stance ends the stable branch there', { timeout: 240_000 }, () => {
  it('ledge-down demo, 60° and 61° round from the nose: the same tip, at the rear-right lift, and the stance just past it is unstable', () => {
    const { vehicle, friction } = demoVehicle('ledge-down-crawler.json');
    const model = buildModel(vehicle, { features: [] });
    const tips: number[] = [];
    for (const d of [60, 61]) {
      const r = tiltSweep(model, POSE, { downhillRad: d * DEG, friction, findSlide: false });
      expect(r.tip, `${d}°`).not.toBeNull();
      expect(r.firstLift!.wheel).toBe('RR');
      expect(r.firstLift!.atTip, `${d}°: the lift is the tip`).toBe(true);
      expect(r.tip!.angleRad).toBeCloseTo(r.firstLift!.angleRad, 10);
      expect(r.tip!.reason).toBe('fold');
      tips.push(r.tip!.angleRad / DEG);
      // The solver's own second-order check just past the lift, followed from just before it.
      const before = solveEquilibrium(model, POSE, { tilt: { angleRad: r.tip!.angleRad - 0.05 * DEG, downhillRad: d * DEG }, friction });
      expect(before.status).toBe('converged');
      const after = solveEquilibrium(model, POSE, { tilt: { angleRad: r.tip!.angleRad + 0.25 * DEG, downhillRad: d * DEG }, friction, warmStart: before.state, followBranch: true });
      expect(after.status, `${d}°: just past the lift`).toBe('unstable');
    }
    expect(Math.abs(tips[1] - tips[0])).toBeLessThan(0.5);
  });
});

describe('every demo vehicle, every 1° of direction', { timeout: 600_000 }, () => {
  const seen = new Set<string>();
  const files: string[] = [];
  for (const f of readdirSync(DIR).filter((x) => x.endsWith('.json')).sort()) {
    const key = JSON.stringify(demoVehicle(f).vehicle);
    if (!seen.has(key)) {
      seen.add(key);
      files.push(f);
    }
  }
  for (const f of files) {
    it(`${f}: tips 1° apart differ by < 0.5° + 1.5 × the rigid change, or the result says why (edge change, nearly neutral)`, () => {
      const { vehicle, friction } = demoVehicle(f);
      const rose = stabilityRose(buildModel(vehicle, { features: [] }), POSE, { friction, stepRad: DEG, resolutionRad: 0.02 * DEG });
      const n = rose.directions.length;
      expect(n).toBe(360);
      let checked = 0;
      for (let i = 0; i < n; i++) {
        const a = rose.directions[i];
        const b = rose.directions[(i + 1) % n];
        expect(a.tip, `${i}°`).not.toBeNull();
        if (b.tipEdgeChanged || a.tip!.softFrom || b.tip!.softFrom) continue;
        checked++;
        const jump = Math.abs(b.tip!.angleRad - a.tip!.angleRad) / DEG;
        const rigid = Math.abs(rigidTipRad(vehicle, b.downhillRad) - rigidTipRad(vehicle, a.downhillRad)) / DEG;
        expect(jump, `${i}° → ${(i + 1) % n}°`).toBeLessThan(0.5 + 1.5 * rigid);
      }
      // Most pairs are checked, not exempted (a test that exempts everything checks nothing).
      expect(checked).toBeGreaterThan(0.8 * n);
    });
  }
});
