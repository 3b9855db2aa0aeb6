/**
 * Candidate lines drawn by the user, ranked as the line sweep ranks them (smallest force-angle
 * margin over the pass; a line that tips or hangs up ranks below every line that does not), with
 * lines that the method cannot tell apart shown as ties.
 *
 * Resolution: angles are stated to 0.1° (the precision the quasi-static method and its inputs
 * support for a margin); two lines whose smallest margins differ by less than that are tied.
 */
import { compareLines, type LineSpec, type LineSummary } from './lines';
import type { PathSpec } from '../model/types';
import type { CandidateLine } from '../scenario/types';
import { polylinePath } from './pathGeometry';

/** Margins closer than this are a tie (rad): 0.1°. */
export const LINE_TIE_RESOLUTION_RAD = (0.1 * Math.PI) / 180;

export interface RankedCandidate {
  readonly summary: LineSummary;
  /** Competition rank: 1 + the number of lines strictly better (tied lines share it). */
  readonly rank: number;
  /** How many lines share this rank (1 = no tie). */
  readonly tiedWith: number;
}

/** Whether a line can be driven to its end: no tip and no hang-up. */
export function lineGetsThrough(l: LineSummary): boolean {
  return l.tip === null && !l.hangUp;
}

/**
 * Ranks lines: those that get through first, then by the smallest margin; within a class a new
 * rank starts only where the margin falls by more than `resolutionRad` below the first line of the
 * current rank. Needs no particular order on input.
 */
export function rankCandidates(summaries: readonly LineSummary[], resolutionRad = LINE_TIE_RESOLUTION_RAD): RankedCandidate[] {
  const sorted = [...summaries].sort((a, b) => Number(lineGetsThrough(b)) - Number(lineGetsThrough(a)) || compareLines(a, b));
  const groups: LineSummary[][] = [];
  for (const l of sorted) {
    const g = groups[groups.length - 1];
    const head = g?.[0];
    if (head && lineGetsThrough(head) === lineGetsThrough(l) && head.minForceAngleRad - l.minForceAngleRad <= resolutionRad) g.push(l);
    else groups.push([l]);
  }
  const out: RankedCandidate[] = [];
  let better = 0;
  for (const g of groups) {
    for (const l of g) out.push({ summary: l, rank: better + 1, tiedWith: g.length });
    better += g.length;
  }
  return out;
}

/** Drawn or saved lines (polylines on the ground) as the line sweep's LineSpec, index = drawing order; null (an unfinished line) is skipped. */
export function candidateSpecs(paths: readonly (PathSpec | null)[]): LineSpec[] {
  const out: LineSpec[] = [];
  paths.forEach((path, index) => {
    if (path) out.push({ index, offsetM: 0, headingChangeRad: 0, path });
  });
  return out;
}

/**
 * The scenario's saved candidate lines as the line sweep's LineSpec (index = their order in the
 * file), each run at the scenario path's station spacing and heading rule (along the line), or at
 * `stepM` when the scenario has no path.
 */
export function savedCandidateSpecs(candidates: readonly CandidateLine[], stepM: number): LineSpec[] {
  return candidateSpecs(candidates.map((c) => polylinePath(c.pointsM, stepM)));
}
