/**
 * Warnings in words for one solve. Thresholds are our own choices (common practice is to keep
 * well clear of a lift): a tyre under NEAR_LIFT_SHARE of its static load is close to lifting;
 * a force-angle margin under NEAR_TIP_RAD is close to tipping.
 */
import type { SolveResult } from '../core';

export const NEAR_LIFT_SHARE = 0.2;
export const NEAR_TIP_RAD = (10 * Math.PI) / 180;

export type WarningLevel = 'danger' | 'warning' | 'note';

export interface Warning {
  readonly level: WarningLevel;
  readonly text: string;
}

const deg = (rad: number): string => `${((rad * 180) / Math.PI).toFixed(1)}°`;

export function warningsFor(r: SolveResult, friction: number): Warning[] {
  const out: Warning[] = [];
  if (r.status === 'tipped') {
    const edge = r.margins.weakestEdgeWheels.join('–');
    out.push({ level: 'danger', text: `Tips over: the plumb line from the CG is outside the support${edge ? `, over the ${edge} edge` : ''}.` });
  } else if (r.status === 'no-contact') {
    out.push({ level: 'danger', text: `No tyre touches the ground: ${r.reason}.` });
  } else if (r.status === 'not-converged') {
    out.push({ level: 'warning', text: `The solve did not settle (${r.reason}); the numbers shown are not a balance.` });
  }
  const lifted = r.wheels.filter((w) => w.lifted).map((w) => w.name);
  if (lifted.length > 0) {
    out.push({
      level: 'danger',
      text: `${lifted.join(' and ')} ${lifted.length === 1 ? 'has' : 'have'} lifted: the vehicle stands on ${4 - lifted.length} tyre${4 - lifted.length === 1 ? '' : 's'}.`,
    });
  }
  for (const w of r.wheels) {
    if (!w.lifted && (w.loadShare ?? 0) < NEAR_LIFT_SHARE && r.status === 'converged') {
      out.push({ level: 'warning', text: `${w.name} is close to lifting: ${Math.round((w.loadShare ?? 0) * 100)} % of its static load.` });
    }
  }
  if (r.status === 'converged' && r.margins.forceAngleRad < NEAR_TIP_RAD) {
    const edge = r.margins.weakestEdgeWheels.join('–');
    out.push({ level: 'danger', text: `Close to tipping: force-angle margin ${deg(r.margins.forceAngleRad)}${edge ? ` about the ${edge} edge` : ''}.` });
  }
  for (const w of r.wheels) {
    if (!w.lifted && (w.frictionDemand ?? 0) > friction) {
      out.push({ level: 'warning', text: `${w.name} needs grip ${(w.frictionDemand ?? 0).toFixed(2)}, more than the ground's ${friction.toFixed(2)}: it may slide.` });
    }
  }
  for (const w of r.wheels) {
    if ((w.travelFraction ?? 0) <= -0.999) out.push({ level: 'note', text: `${w.name} is at full droop.` });
    else if ((w.travelFraction ?? 0) >= 0.999) out.push({ level: 'note', text: `${w.name} is on its bump stop.` });
  }
  return out;
}
