/**
 * Slope to spare in words (src/present/words.ts spareLines) on a rigid vehicle on a level tilt table:
 * the side tip is the static stability factor's angle, atan(T / 2h) (NHTSA's SSF; Gillespie,
 * Fundamentals of Vehicle Dynamics, ch. 9), widened by the tyre's half width at its outer edge; the
 * words carry the datum and the same numbers as the data, to 0.1°.
 */
import { describe, expect, it } from 'vitest';
import { buildModel, spareFromRose, stabilityRose } from '../../src/core';
import { angleText } from '../../src/present/units';
import { spareLines } from '../../src/present/words';
import { rigidVehicle } from '../helpers/vehicles';

describe('slope to spare', () => {
  const v = rigidVehicle();
  const rose = stabilityRose(buildModel(v, { features: [] }), { xM: 0, yM: 0, headingRad: 0 }, { stepRad: Math.PI / 2 });
  const sp = spareFromRose(rose);
  it('side tip of a rigid vehicle on a level table: between atan(T/2h) and atan((T/2 + w/2)/h)', () => {
    const left = sp.cardinals.leftDown.toTipBeyondGroundRad!;
    const h = v.cg.heightM;
    expect(left).toBeGreaterThanOrEqual(Math.atan(v.trackFrontM / 2 / h) - 0.005);
    expect(left).toBeLessThanOrEqual(Math.atan((v.trackFrontM / 2 + v.tyreFront.widthM / 2) / h) + 0.005);
    // Side-to-side rolls come before end-over-end ones (common practice; wheelbase > track).
    expect(sp.weakestTip.toTipBeyondGroundRad!).toBeLessThan(sp.cardinals.noseDown.toTipBeyondGroundRad!);
  });
  it('the words name the datum and give the data to 0.1°', () => {
    const lines = spareLines(sp);
    expect(lines[0]).toMatch(/^Slope to spare, more than the ground here \(the ground is 0\.0° from level\):/);
    expect(lines[1]).toContain(`it tips after ${angleText(sp.weakestTip.toTipBeyondGroundRad!)} more`);
    expect(lines.join('\n')).not.toMatch(/force-angle/);
    expect(lines).toHaveLength(6);
  });
});
