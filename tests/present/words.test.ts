/**
 * The words (src/present/words.ts): build changes, the pass headline and the warnings in the
 * reader's units, and a pose that does not stand shown without loads.
 */
import { describe, expect, it } from 'vitest';
import { applyBuild, type Vehicle } from '../../src/core';
import { buildChangesWords, passHeadline, warningsFor } from '../../src/present/words';
import { forceText } from '../../src/present/units';
import { testVehicle } from '../helpers/vehicles';

describe('build changes in words', () => {
  const v: Vehicle = testVehicle();
  it('are worded in the reader\'s units from the numbers the core returns', () => {
    const b = applyBuild(v, { name: 'x', lift: { bodyM: 0.0508 }, tyre: { radiusM: 0.445 }, wheels: { stock: { rimWidthM: 0.2032, offsetM: 0.02 }, fitted: { rimWidthM: 0.2286, offsetM: -0.012 } } });
    const metric = buildChangesWords(b.changes, 'metric');
    const imperial = buildChangesWords(b.changes, 'imperial');
    expect(metric).toContain('radius 0.445 m');
    expect(metric).toContain('body lift 51 mm');
    // 0.0508 m = 2.0 in exactly; 0.445 m = 17.5 in (17.52); 9 in rims whatever the system (common practice).
    expect(imperial).toContain('body lift 2.0 in');
    expect(imperial).toContain('radius 17.5 in');
    expect(imperial).toContain('wheels 9.0 in wide');
    expect(imperial).not.toMatch(/\bmm\b|\bkg\b/);
    expect(metric).toMatch(/both tracks \+64 mm/); // (0.02 − (−0.012)) × 2 = 0.064 m
  });
  it('say "as given" for no change', () => {
    expect(buildChangesWords(applyBuild(v, { name: 'same' }).changes, 'imperial')).toBe('as given');
  });
});

describe('pass headline', () => {
  it('gives distances in the reader\'s units and the margin to 0.1°', () => {
    const r = {
      firstUnload: { wheel: 'RL', station: 3, distanceM: 3.048 },
      firstLift: null,
      tip: null,
      minMargin: { station: 5, distanceM: 6.096, forceAngleRad: (12.345 * Math.PI) / 180, energyM: 0.1 },
      minClearance: null,
      lightShare: 0.25,
    } as unknown as Parameters<typeof passHeadline>[0];
    expect(passHeadline(r, 'imperial')).toBe('Stands all along the path; RL unloads first at 10.00 ft; smallest force-angle margin 12.3° at 20.00 ft.');
    expect(passHeadline(r, 'metric')).toContain('RL unloads first at 3.05 m');
  });
  it('never says "stands" when the body is in the ground', () => {
    const r = {
      firstUnload: null,
      firstLift: null,
      tip: null,
      minMargin: null,
      minClearance: { station: 134, distanceM: 6.7, clearanceM: -0.255, part: 'belly' },
      hangUp: { station: 134, distanceM: 6.7, part: 'belly', depthM: 0.255 },
      firstSlide: null,
      lightShare: 0.25,
    } as unknown as Parameters<typeof passHeadline>[0];
    const t = passHeadline(r, 'metric');
    expect(t).not.toMatch(/stands/);
    expect(t).toContain('Hangs up on the belly at 6.70 m (the body 255 mm inside the ground)');
  });
});

describe('a pose that does not stand', () => {
  it('shows no load (a dash) and no near-lift warning from a null share', () => {
    expect(forceText(null, 'metric')).toBe('—');
    const w = warningsFor(
      {
        status: 'tipped',
        reason: 'no balance',
        margins: { weakestEdgeWheels: ['FL', 'RL'], forceAngleRad: -0.1 } as never,
        wheels: [{ name: 'FL', lifted: false, loadShare: null, frictionDemand: null, travelFraction: 0 }],
      },
      0.7,
    );
    expect(w.map((x) => x.text)).toEqual(['Tips over: the plumb line from the CG is outside the support, over the FL–RL edge.']);
  });
});
