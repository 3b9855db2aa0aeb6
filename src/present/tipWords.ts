/**
 * The tip edge in words: which side of the vehicle it goes over, and the sentence the app shows
 * beside the drawn edge when a pose does not stand. Pure (no React, three or DOM).
 */
import type { WheelName } from '../core';
import { RAD_PER_DEG, angleText } from './units';
import { downhillWords } from './words';

/** The side a tip edge is, from the tyres whose contacts make it (wheel order FL, FR, RL, RR). */
export function tipSideWords(edge: readonly WheelName[]): string {
  const has = (w: WheelName) => edge.includes(w);
  if (edge.length === 2) {
    if (has('FL') && has('RL')) return 'the left side';
    if (has('FR') && has('RR')) return 'the right side';
    if (has('FL') && has('FR')) return 'the front';
    if (has('RL') && has('RR')) return 'the rear';
    return `the ${edge.join('–')} diagonal`;
  }
  if (edge.length === 1) return `the ${edge[0]} tyre alone`;
  return 'no edge the solver could name';
}

/** What the tip view needs in words: the tip's tilts with their datums and the current table tilt (all rad). */
export interface TipSentenceInput {
  readonly edge: readonly WheelName[];
  readonly downhillRad: number;
  /** Table tilt at the tip (from level). */
  readonly tipTiltRad: number;
  /** Slope of the ground under the vehicle at the tip, from level. */
  readonly tipFromLevelRad: number;
  /** The table tilt of the pose shown (from level). */
  readonly poseTiltRad: number;
}

/**
 * "Tips about the left side (FL–RL) at 38.2° table tilt from level (ground under it 52.0° from
 * level), left side down; this pose, at 60.0° table tilt, is 21.8° past it."
 */
export function tipSentence(t: TipSentenceInput): string {
  const past = t.poseTiltRad - t.tipTiltRad;
  const ground = Math.abs(t.tipFromLevelRad - t.tipTiltRad) >= 0.05 * RAD_PER_DEG ? ` (the ground under it then ${angleText(t.tipFromLevelRad)} from level)` : '';
  const edge = t.edge.length > 0 ? ` (${t.edge.join('–')})` : '';
  return (
    `Tips about ${tipSideWords(t.edge)}${edge} at ${angleText(t.tipTiltRad)} table tilt from level${ground}, ${downhillWords(t.downhillRad)}; ` +
    `this pose, at ${angleText(t.poseTiltRad)} table tilt, is ${angleText(past)} past it.`
  );
}
