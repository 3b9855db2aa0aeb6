/**
 * `pass` along the scenario's polyline and `lines --saved` over its saved candidate lines, in-process,
 * against the core run here on the same file (the CLI must report what the core computes).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { buildModel, parseScenario, rankLines, runLineSweepJob, runPass, savedCandidateSpecs, stationCount, type Scenario } from '../../src/core/index';

const DEMO = 'assets/scenarios/ledge-crawler.json';
const FILE = 'bent-path.json';

/** The ledge demo with a three-point path through the ledge and three saved lines, 10 cm stations. */
function bentFile(): Record<string, unknown> {
  const f = JSON.parse(readFileSync(DEMO, 'utf8'));
  f.path = { points: [{ x: -0.5, y: 0 }, { x: 3, y: 0.4 }, { x: 7.5, y: 0.4 }], step: 0.1 };
  f.candidates = [
    { name: 'Straight up', points: [{ x: -0.5, y: 0 }, { x: 7.5, y: 0 }] },
    { name: 'Jog left', points: [{ x: -0.5, y: 0 }, { x: 3, y: 0.4 }, { x: 7.5, y: 0.4 }] },
    { name: 'Wide right', points: [{ x: -0.5, y: -0.5 }, { x: 3, y: -1 }, { x: 7.5, y: -1 }] },
  ];
  delete f.builds;
  return f;
}

function capture(text: string) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => (p === FILE ? text : readFileSync(p, 'utf8')) };
  return { io, out, err };
}

function scenarioOf(f: unknown): Scenario {
  const r = parseScenario(f);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

describe('the CLI on a polyline path and saved lines', () => {
  it('pass walks the points: the same stations and first wheel to unload as the core', async () => {
    const f = bentFile();
    const s = scenarioOf(f);
    const core = runPass(buildModel(s.vehicle, s.terrain), s.path!, { friction: s.friction });
    const c = capture(JSON.stringify(f));
    expect(await runCli(['pass', FILE, '--json', '--quiet'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    // 0.5 + 3.5 m (hypot(3.5, 0.4)) + 4.5 m along the legs, every 10 cm, both ends.
    const len = Math.hypot(3.5, 0.4) + 4.5;
    expect(j.plannedStations).toBe(Math.floor(len / 0.1) + 2);
    expect(j.plannedStations).toBe(stationCount(s.path!));
    expect(j.stations).toHaveLength(core.stations.length);
    // Every station stands on the drawn legs, by hand: on the first leg at s·(3.5, 0.4)/|(3.5, 0.4)| from
    // the start, on the second at (3 + s − L1, 0.4); the JSON rounds to 0.1 mm (4 decimals in m).
    const L1 = Math.hypot(3.5, 0.4);
    for (const st of j.stations as { distanceM: number; xM: number; yM: number }[]) {
      const d = core.stations[j.stations.indexOf(st)].distanceM;
      expect(st.xM).toBeCloseTo(d <= L1 ? -0.5 + (3.5 * d) / L1 : 3 + (d - L1), 4);
      expect(st.yM).toBeCloseTo(d <= L1 ? (0.4 * d) / L1 : 0.4, 4);
    }
    expect(j.firstUnload?.wheel ?? null).toBe(core.firstUnload?.wheel ?? null);
    expect(j.events.map((e: { kind: string }) => e.kind)).toEqual(core.events.map((e) => e.kind));
    const t = capture(JSON.stringify(f));
    expect(await runCli(['pass', FILE, '--quiet'], t.io)).toBe(0);
    if (core.firstUnload) expect(t.out.join('\n')).toContain(`first wheel to go light  ${core.firstUnload.wheel} at`);
  });

  it('lines --saved ranks the saved lines by name as the core ranks them; ties as ties', async () => {
    const f = bentFile();
    const s = scenarioOf(f);
    const ranking = rankLines(runLineSweepJob({ vehicle: s.vehicle, terrain: s.terrain, options: { friction: s.friction }, lines: savedCandidateSpecs(s.candidates!, s.path!.stepM) }));
    const c = capture(JSON.stringify(f));
    expect(await runCli(['lines', FILE, '--saved', '--workers', '0', '--json', '--quiet'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.lineCount).toBe(3);
    expect(j.lines.map((l: { name: string }) => l.name)).toEqual(ranking.ranked.map((l) => s.candidates![l.index].name));
    expect(j.lines.map((l: { rank: number }) => l.rank)).toEqual(ranking.rank);
    expect(j.lines.map((l: { tiedWith: number[] }) => l.tiedWith)).toEqual(ranking.tiedWith);
    const jog = j.lines.find((l: { name: string }) => l.name === 'Jog left');
    expect(jog.pointsM).toEqual([[-0.5, 0], [3, 0.4], [7.5, 0.4]]);
    // Text: the names in the table, the caution at the end.
    const t = capture(JSON.stringify(f));
    expect(await runCli(['lines', FILE, '--saved', '--workers', '0', '--quiet'], t.io)).toBe(0);
    expect(t.out[0]).toMatch(/3 saved lines$/);
    expect(t.out.join('\n')).toContain('Wide right');
    expect(t.out.join('\n')).toContain('Real margins are smaller');
  });

  it('lines --saved with no saved lines, or with an offset, is bad input with a message', async () => {
    const none = capture('');
    expect(await runCli(['lines', DEMO, '--saved', '--quiet'], none.io)).toBe(2);
    expect(none.err[0]).toMatch(/candidates: no saved lines in this file/);
    const both = capture(JSON.stringify(bentFile()));
    expect(await runCli(['lines', FILE, '--saved', '--offset', '-1:1:1'], both.io)).toBe(2);
    expect(both.err).toEqual(['lines: --saved ranks the saved lines as drawn; leave out --offset and --heading']);
  });
});
