/**
 * Terrain feature presets, placed relative to where the vehicle stands now (terrain frame).
 * Sizes are invented, typical of trail obstacles (common practice), not from any course standard.
 */
import type { Scenario, TerrainFeature } from '../core';
import { RAD_PER_DEG as DEG } from '../present/units';

export type PresetName = 'side-hill' | 'ledge-up' | 'ledge-down' | 'rock' | 'twist' | 'ramp';

export const PRESETS: readonly { name: PresetName; label: string }[] = [
  { name: 'side-hill', label: 'Side hill' },
  { name: 'ledge-up', label: 'Ledge up' },
  { name: 'ledge-down', label: 'Ledge down' },
  { name: 'rock', label: 'Rock under one wheel' },
  { name: 'twist', label: 'Diagonal twist' },
  { name: 'ramp', label: 'Ramp' },
];

/** A point given in the vehicle frame (forward, left) of the current pose, in the terrain frame. */
function at(s: Scenario, forwardM: number, leftM: number): [number, number] {
  const { xM, yM, headingRad } = s.pose;
  const c = Math.cos(headingRad);
  const sn = Math.sin(headingRad);
  return [xM + c * forwardM - sn * leftM, yM + sn * forwardM + c * leftM];
}

export function presetFeatures(name: PresetName, s: Scenario): TerrainFeature[] {
  const v = s.vehicle;
  const L = v.wheelbaseM;
  const ahead = at(s, L / 2 + v.tyreFront.radiusM + 0.4, 0);
  switch (name) {
    case 'side-hill':
      // Descends to the left of +x by 20°.
      return [{ type: 'plane', gradeRad: 0, crossSlopeRad: -20 * DEG, heightM: 0 }];
    case 'ledge-up':
      return [{ type: 'step', xM: ahead[0], heightM: 0.3, yRangeM: null, edgeRadiusM: 0.03 }];
    case 'ledge-down':
      return [{ type: 'step', xM: ahead[0], heightM: -0.3, yRangeM: null, edgeRadiusM: 0.03 }];
    case 'rock': {
      const [x, y] = at(s, L / 2, v.trackFrontM / 2);
      return [{ type: 'rock', xM: x, yM: y, heightM: 0.3, radiusM: 0.5 }];
    }
    case 'twist': {
      // Blocks under the front-left and rear-right tyres: the axles articulate in opposite senses.
      const fl = at(s, L / 2, v.trackFrontM / 2);
      const rr = at(s, -L / 2, -v.trackRearM / 2);
      const block = (c: [number, number]): TerrainFeature => ({
        type: 'block',
        xRangeM: [c[0] - 0.6, c[0] + 0.6],
        yRangeM: [c[1] - 0.4, c[1] + 0.4],
        heightM: 0.3,
        edgeRadiusM: 0.05,
      });
      return [block(fl), block(rr)];
    }
    case 'ramp':
      return [{ type: 'ramp', xM: ahead[0], angleRad: 15 * DEG, lengthM: 2.5, yRangeM: null }];
  }
}
