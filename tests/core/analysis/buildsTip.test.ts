/**
 * Build comparison deltas compare like with like: each build's tip is the end of its stable
 * equilibrium branch, so the change in a fore-aft tip between two builds follows the change of the
 * rigid closed form (tail down the front unloads at tan θ = b/h, nose down the rear at a/h;
 * Gillespie 1992, ch. 2, with the total CG as loaded), within 1°: the suspension only adds a
 * similar compliance to both. (A sweep that stopped where Newton first failed once printed
 * "tail down: tip −7.7°" for a 50 mm lift on 33 in tyres, where the closed form moves by −2.0°.)
 * The demo builds (assets/scenarios/side-hill-builds.json) are invented.
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { compareBuilds, totalCgHeightM } from '../../../src/core/analysis/builds';
import type { Vehicle } from '../../../src/core/model/types';
import { parseScenarioText } from '../../../src/core/scenario/index';

const DEG = Math.PI / 180;

function cgBehindFrontM(v: Vehicle): number {
  let m = v.massKg;
  let ma = v.massKg * v.cg.behindFrontAxleM;
  for (const p of v.payload) {
    m += p.massKg;
    ma += p.massKg * p.behindFrontAxleM;
  }
  return ma / m;
}

describe('build comparison: tip deltas follow the closed form', () => {
  it('side-hill-builds demo: tail-down and nose-down tip changes within 1° of the b/h and a/h changes', () => {
    const parsed = parseScenarioText(readFileSync('assets/scenarios/side-hill-builds.json', 'utf8'));
    if (!parsed.ok) throw new Error('demo does not parse');
    const s = parsed.scenario;
    const builds = [{ name: 'as given' }, ...(s.builds ?? [])];
    expect(builds.length).toBeGreaterThan(1);
    const rows = compareBuilds(s.vehicle, builds, { friction: s.friction, roseStepRad: 90 * DEG });
    const closed = (v: Vehicle) => {
      const h = totalCgHeightM(v);
      const a = cgBehindFrontM(v);
      return { tail: Math.atan((v.wheelbaseM - a) / h), nose: Math.atan(a / h) };
    };
    const base = closed(rows[0].vehicle);
    for (const r of rows.slice(1)) {
      const c = closed(r.vehicle);
      expect(r.change.tailDownTipRad).not.toBeNull();
      expect(Math.abs(r.change.tailDownTipRad! - (c.tail - base.tail)) / DEG, `${r.name}: tail down`).toBeLessThan(1);
      expect(Math.abs(r.change.noseDownTipRad! - (c.nose - base.nose)) / DEG, `${r.name}: nose down`).toBeLessThan(1);
    }
  });
});
