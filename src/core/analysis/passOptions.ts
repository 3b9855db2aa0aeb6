import type { Scenario } from '../scenario/types';

/** Options of the pass as the `pass` command runs it: the scenario's friction and (when set) its tilt. */
export function passOptionsOf(s: Scenario): { friction: number; tilt?: Scenario['tilt'] } {
  return s.tilt.angleRad !== 0 ? { friction: s.friction, tilt: s.tilt } : { friction: s.friction };
}
