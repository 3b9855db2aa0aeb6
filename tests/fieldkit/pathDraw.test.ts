/**
 * Lines drawn on the ground: the ray–ground intersection behind a click, the drawing store, drawn
 * lines as the scenario path, and their ranking with ties (src/view/PathDrawState.ts,
 * src/core/analysis/pathCandidates.ts).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it, vi } from 'vitest';

vi.mock('react', () => ({}));

import { candidatesToLines, createPathDrawStore, lineToPath, linesToCandidates, rayGroundHit, sameCandidates } from '../../src/view/PathDrawState';
import { LINE_TIE_RESOLUTION_RAD, candidateSpecs, rankCandidates } from '../../src/core/analysis/pathCandidates';
import { runLineSweepJob, type LineSummary } from '../../src/core/analysis/lines';
import { runPass } from '../../src/core/analysis/pass';
import { buildModel } from '../../src/core/solver/equilibrium';
import { parseScenarioText } from '../../src/core/scenario/parse';

const DEG = Math.PI / 180;

describe('a click meets the ground', () => {
  it('on a plane: the analytic line–plane intersection', () => {
    // Plane z = 0.2 + 0.1·x − 0.05·y; ray from (1, 2, 10) along d = (0.3, −0.2, −1)/|…|.
    const h = (x: number, y: number) => 0.2 + 0.1 * x - 0.05 * y;
    const n = Math.hypot(0.3, -0.2, -1);
    const d = [0.3 / n, -0.2 / n, -1 / n] as const;
    const o = [1, 2, 10] as const;
    // Solve o_z + t d_z = 0.2 + 0.1 (o_x + t d_x) − 0.05 (o_y + t d_y) for t.
    const t = (0.2 + 0.1 * o[0] - 0.05 * o[1] - o[2]) / (d[2] - 0.1 * d[0] + 0.05 * d[1]);
    const hit = rayGroundHit(h, o, d)!;
    expect(hit[0]).toBeCloseTo(o[0] + t * d[0], 3);
    expect(hit[1]).toBeCloseTo(o[1] + t * d[1], 3);
    expect(hit[2]).toBeCloseTo(h(hit[0], hit[1]), 3);
  });

  it('a ray grazing over a step hits its face, not the ground beyond; the sky is no hit', () => {
    // Step 0.4 m high from x = 3; a level ray at z = 0.2 from x = 0 meets the face at x = 3.
    const h = (x: number) => (x >= 3 ? 0.4 : 0);
    const hit = rayGroundHit(h, [0, 0, 0.2], [1, 0, 0])!;
    expect(hit[0]).toBeCloseTo(3, 3);
    expect(rayGroundHit(() => 0, [0, 0, 5], [0, 0.6, 0.8])).toBeNull();
    expect(rayGroundHit(() => 1, [0, 0, 0], [0, 0, -1])).toBeNull(); // starts under the ground
  });
});

describe('the drawing store', () => {
  it('clicks add points to one line until it is finished; a drag makes a whole two-point line; points move and go', () => {
    const s = createPathDrawStore();
    const st = () => s.getState();
    st().addPoint([0, 0]);
    expect(st().lines).toEqual([{ name: 'Line 1', points: [[0, 0]] }]);
    expect(st().active).toBe(0);
    st().addPoint([4, 1]);
    st().addPoint([4, 1]); // the same spot again: no leg of length 0
    st().addPoint([8, 1]);
    expect(st().lines[0].points).toEqual([[0, 0], [4, 1], [8, 1]]);
    st().finishLine();
    st().addPoint([0, 2]);
    expect(st().lines.map((l) => l.name)).toEqual(['Line 1', 'Line 2']);
    expect(st().active).toBe(1);
    // A drag draws a new two-point line and finishes the open one.
    st().addLine([1, 1], [2, 2]);
    expect(st().lines[2]).toEqual({ name: 'Line 3', points: [[1, 1], [2, 2]] });
    expect(st().active).toBeNull();
    st().movePoint(0, 1, [4, 1.5]);
    expect(st().lines[0].points).toEqual([[0, 0], [4, 1.5], [8, 1]]);
    st().removePoint(0, 1);
    expect(st().lines[0].points).toEqual([[0, 0], [8, 1]]);
    // A line whose last point goes is gone; the next new line takes the free name.
    st().removePoint(1, 0);
    expect(st().lines.map((l) => l.name)).toEqual(['Line 1', 'Line 3']);
    st().addPoint([5, 5]);
    expect(st().lines[2].name).toBe('Line 2');
    st().rename(0, 'Over the ledge');
    st().removeLine(1);
    expect(st().lines.map((l) => l.name)).toEqual(['Over the ledge', 'Line 2']);
    expect(st().active).toBe(1); // still drawing the line that was third, now second
  });

  it('a drawn line becomes a pass path (its points, the step, heading along the legs); a line still being drawn does not', () => {
    expect(lineToPath({ name: 'a', points: [[1, 2], [5, 2]] }, 0.05)).toEqual({ fromM: [1, 2], toM: [5, 2], stepM: 0.05, headingRad: null });
    expect(lineToPath({ name: 'a', points: [[1, 2], [3, 3], [5, 2]] }, 0.05)).toEqual({ fromM: [1, 2], viaM: [[3, 3]], toM: [5, 2], stepM: 0.05, headingRad: null });
    expect(lineToPath({ name: 'a', points: [[1, 2]] }, 0.05)).toBeNull();
    expect(lineToPath({ name: 'a', points: [[1, 2], [1, 2]] }, 0.05)).toBeNull();
    expect(candidateSpecs([lineToPath({ name: 'a', points: [[0, 0], [1, 0]] }, 0.1), null, lineToPath({ name: 'b', points: [[0, 1], [1, 1]] }, 0.1)]).map((l) => l.index)).toEqual([0, 2]);
  });

  it('drawn lines and the scenario\'s saved lines: only lines that can be run are saved; the same lines compare equal', () => {
    const lines = [
      { name: 'A', points: [[0, 0], [3, 1], [6, 1]] as const },
      { name: 'B', points: [[0, 0]] as const },
    ];
    const saved = linesToCandidates(lines);
    expect(saved).toEqual([{ name: 'A', pointsM: [[0, 0], [3, 1], [6, 1]] }]);
    expect(candidatesToLines(saved)).toEqual([lines[0]]);
    expect(sameCandidates(saved, [{ name: 'A', pointsM: [[0, 0], [3, 1], [6, 1]] }])).toBe(true);
    expect(sameCandidates(saved, [{ name: 'A', pointsM: [[0, 0], [3, 1], [6, 1.0001]] }])).toBe(false);
    expect(sameCandidates(saved, [{ name: 'a', pointsM: [[0, 0], [3, 1], [6, 1]] }])).toBe(false);
    expect(sameCandidates(undefined, [])).toBe(true);
  });
});

const base: LineSummary = {
  index: 0, offsetM: 0, headingChangeRad: 0, path: { fromM: [0, 0], toM: [1, 0], stepM: 0.1, headingRad: null },
  stationsSolved: 11, plannedStations: 11, firstUnload: null, firstLift: null, tip: null, hangUp: null,
  minForceAngleRad: 0.5, minMarginDistanceM: 0, energyAtMinM: 0.1, minClearanceM: 0.2,
};

describe('ranking drawn lines, ties shown as ties', () => {
  it('margins within the 0.1° resolution share a rank; a line that hangs up or tips ranks last', () => {
    const r = rankCandidates([
      { ...base, index: 0, minForceAngleRad: 30 * DEG },
      { ...base, index: 1, minForceAngleRad: 30.05 * DEG },
      { ...base, index: 2, minForceAngleRad: 25 * DEG },
      { ...base, index: 3, minForceAngleRad: 40 * DEG, hangUp: { distanceM: 3, part: 'belly' } },
      { ...base, index: 4, minForceAngleRad: 0, tip: { distanceM: 2, reason: 'x' } },
    ]);
    expect(r.map((c) => [c.summary.index, c.rank, c.tiedWith])).toEqual([
      [1, 1, 2],
      [0, 1, 2],
      [2, 3, 1],
      [3, 4, 1],
      [4, 5, 1],
    ]);
    expect(LINE_TIE_RESOLUTION_RAD).toBeCloseTo(0.1 * DEG, 15);
    // 0.2° apart: not a tie.
    const apart = rankCandidates([{ ...base, index: 0, minForceAngleRad: 30 * DEG }, { ...base, index: 1, minForceAngleRad: 29.8 * DEG }]);
    expect(apart.map((c) => c.rank)).toEqual([1, 2]);
  });

  it('the ledge demo: a line drawn over the boulder and one beside it, run as the line sweep runs them, each equal to a pass along it', () => {
    const parsed = parseScenarioText(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));
    if (!parsed.ok) throw new Error('demo');
    const s = parsed.scenario;
    // Over the boulder (y = 0, as the demo's path) and 2.5 m to the right of it, both 8 m long.
    const paths = [lineToPath({ name: 'over', points: [[-0.5, 0], [7.5, 0]] }, 0.1), lineToPath({ name: 'beside', points: [[-0.5, -2.5], [7.5, -2.5]] }, 0.1)];
    const summaries = runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: { friction: s.friction }, lines: candidateSpecs(paths) });
    const ranked = rankCandidates(summaries);
    // The line over the boulder hangs up on it (belly), so the line beside it ranks first.
    expect(ranked[0].summary.index).toBe(1);
    expect(ranked[1].summary.hangUp?.part).toBe('belly');
    const model = buildModel(s.vehicle, s.terrain);
    for (const sum of summaries) {
      const pass = runPass(model, sum.path, { friction: s.friction });
      expect(sum.firstUnload?.wheel ?? null).toBe(pass.firstUnload?.wheel ?? null);
      expect(sum.stationsSolved).toBe(pass.stations.length);
    }
  });
});
