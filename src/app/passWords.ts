/** The obstacle pass in words: the headline and each event. */
import { passHeadlineText, type PassEvent, type PassResult, type UnitSystem } from '../core';
import { DEG_PER_RAD, distanceText } from './format';

/** "RL unloads first at 3.42 m; RL lifts at 3.90 m; smallest margin 12.3° at 5.10 m." */
export function passHeadline(r: PassResult, units: UnitSystem): string {
  // The outcome (tips, hangs up, slides or stands) and the first unload and lift, from the core's words.
  const head = passHeadlineText(r, (m) => distanceText(m, units)).replace(/\.$/, '');
  const margin = r.minMargin ? `; smallest margin ${(r.minMargin.forceAngleRad * DEG_PER_RAD).toFixed(1)}° at ${distanceText(r.minMargin.distanceM, units)}` : '';
  return `${head}${margin}.`;
}

const PART_WORDS: Record<string, string> = { belly: 'belly', front: 'front bumper', rear: 'rear bumper', 'front-axle': 'front axle', 'rear-axle': 'rear axle' };

export function eventWords(e: PassEvent, units: UnitSystem): string {
  const who = e.wheel ?? (e.part ? PART_WORDS[e.part] ?? e.part : '');
  const what: Record<PassEvent['kind'], string> = {
    light: `${who} goes light`,
    lifted: `${who} lifts`,
    'full-bump': `${who} on its bump stop`,
    'full-droop': `${who} at full droop`,
    slide: `${who} slides: needs more grip than the ground has`,
    contact: `the ${who} touches the ground`,
    'hang-up': `hangs up on the ${who}: the body is inside the ground`,
    tip: 'tips: no balance remains',
  };
  const from = distanceText(e.startDistanceM, units);
  if (e.kind === 'hang-up') return `${what['hang-up']} at ${from}`;
  if (e.kind === 'tip') return `${what.tip} at ${from}`;
  return `${what[e.kind]} from ${from}${e.endDistanceM === null ? ' to the end' : e.endDistanceM === e.startDistanceM ? '' : ` to ${distanceText(e.endDistanceM, units)}`}`;
}
