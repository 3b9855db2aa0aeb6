/** The line sweep's list as the panel shows it: ranks and ties from the core's ranking. */
import { LINE_RANK_RESOLUTION_RAD, rankLines, type LineSummary } from '../../core';

/** One listed line: its rank (tied lines share one: 1, 1, 3) and how many others share it. */
export interface LineRow {
  readonly line: LineSummary;
  readonly rank: number;
  readonly tied: number;
}

/** The ranked lines as listed, with ranks and ties from the core's ranking (rankLines), and its resolution. */
export function lineRows(ranked: readonly LineSummary[]): { rows: LineRow[]; resolutionRad: number } {
  if (ranked.length === 0) return { rows: [], resolutionRad: LINE_RANK_RESOLUTION_RAD };
  const r = rankLines(ranked);
  return { rows: r.ranked.map((line, i) => ({ line, rank: r.rank[i], tied: r.tiedWith[i].length })), resolutionRad: r.resolutionRad };
}
