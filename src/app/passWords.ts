/** The obstacle pass in words: the headline and each event. */
import type { PassEvent, PassResult, UnitSystem } from '../core';
import { DEG_PER_RAD, distanceText } from './format';

/** "RL unloads first at 3.42 m; RL lifts at 3.90 m; smallest margin 12.3° at 5.10 m." */
export function passHeadline(r: PassResult, units: UnitSystem): string {
  const parts: string[] = [];
  parts.push(r.firstUnload ? `${r.firstUnload.wheel} unloads first at ${distanceText(r.firstUnload.distanceM, units)}` : `no wheel goes below ${Math.round(r.lightShare * 100)} % of its level load`);
  if (r.firstLift) parts.push(`${r.firstLift.wheel} lifts at ${distanceText(r.firstLift.distanceM, units)}`);
  if (r.tip) parts.push(`tips at ${distanceText(r.tip.distanceM, units)}`);
  if (r.minMargin) parts.push(`smallest margin ${(r.minMargin.forceAngleRad * DEG_PER_RAD).toFixed(1)}° at ${distanceText(r.minMargin.distanceM, units)}`);
  const s = parts.join('; ');
  return `${s.charAt(0).toUpperCase()}${s.slice(1)}.`;
}

const PART_WORDS: Record<string, string> = { belly: 'belly', front: 'front bumper', rear: 'rear bumper', 'front-axle': 'front axle', 'rear-axle': 'rear axle' };

export function eventWords(e: PassEvent, units: UnitSystem): string {
  const who = e.wheel ?? (e.part ? PART_WORDS[e.part] ?? e.part : '');
  const what: Record<PassEvent['kind'], string> = {
    light: `${who} goes light`,
    lifted: `${who} lifts`,
    'full-bump': `${who} on its bump stop`,
    'full-droop': `${who} at full droop`,
    friction: `${who} needs more grip than the ground has`,
    contact: `the ${who} touches the ground`,
    tip: 'tips: no balance remains',
  };
  const from = distanceText(e.startDistanceM, units);
  if (e.kind === 'tip') return `${what.tip} at ${from}`;
  return `${what[e.kind]} from ${from}${e.endDistanceM === null ? ' to the end' : e.endDistanceM === e.startDistanceM ? '' : ` to ${distanceText(e.endDistanceM, units)}`}`;
}
