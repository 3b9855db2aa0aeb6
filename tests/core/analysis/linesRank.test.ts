/**
 * Line ranking with ties (src/core/analysis/lines.ts, rankLines): lines are ranked only where their
 * smallest force-angle margins differ by more than the stated resolution (0.1°, the precision the
 * margins are shown to; the pass samples stations, so finer differences say nothing). Tied lines
 * share a rank (competition ranking, as in sports tables: 1, 1, 3) and list each other. The lines
 * here are hand-made summaries with known margins.
 */
import { describe, expect, it } from 'vitest';
import { LINE_RANK_RESOLUTION_RAD, rankLines, type LineSummary } from '../../../src/core/analysis/lines';

const DEG = Math.PI / 180;
function line(index: number, marginDeg: number, energyM = 0.1): LineSummary {
  return {
    index,
    offsetM: index * 0.1,
    headingChangeRad: 0,
    path: { fromM: [0, 0], toM: [10, 0], stepM: 0.1, headingRad: null },
    stationsSolved: 101,
    plannedStations: 101,
    firstUnload: null,
    firstLift: null,
    tip: null,
    minForceAngleRad: marginDeg * DEG,
    minMarginDistanceM: 5,
    energyAtMinM: energyM,
    minClearanceM: 0.2,
  };
}

describe('line ranking with ties', () => {
  it('the stated resolution is 0.1°', () => {
    expect(LINE_RANK_RESOLUTION_RAD / DEG).toBeCloseTo(0.1, 12);
  });

  it('lines within 0.1° of the best of their group tie; more than 0.1° apart are ranked', () => {
    // 10.05 and 10.00 tie (0.05° apart); 9.93 is within 0.1° of 10.00 but 0.12° below the group's
    // best (10.05), so it starts the next group; 9.80 is 0.13° below 9.93: ranked apart; 5.0 last.
    const r = rankLines([line(0, 10.0), line(1, 9.8), line(2, 10.05), line(3, 5.0), line(4, 9.93)]);
    expect(r.ranked.map((l) => l.index)).toEqual([2, 0, 4, 1, 3]);
    expect(r.rank).toEqual([1, 1, 3, 4, 5]);
    expect(r.tiedWith).toEqual([[0], [2], [], [], []]);
    expect(r.groups.map((g) => g.map((l) => l.index))).toEqual([[2, 0], [4], [1], [3]]);
    expect(r.bestTied).toBe(true);
    expect(r.worstTied).toBe(false);
  });

  it('lines 0.1° apart or closer are never ranked best and worst apart', () => {
    const r = rankLines([line(0, 20.0), line(1, 19.95), line(2, 19.91)]);
    expect(new Set(r.rank)).toEqual(new Set([1]));
    expect(r.bestTied && r.worstTied).toBe(true);
  });
});
