/** The analysis commands (pass, rose, lines, compare, cg) on the demo scenario, in-process. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { GRAVITY_MPS2 } from '../../src/core/solver/model';

const DEMO = 'assets/scenarios/ledge-crawler.json';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  return { io, out, err };
}

describe('plumbline pass', () => {
  it('--json prints the documented object, degrees and metres named in the keys, nothing else on stdout', async () => {
    const c = capture();
    expect(await runCli(['pass', DEMO, '--json'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(Object.keys(j)).toEqual(expect.arrayContaining(['stations', 'firstUnload', 'firstLift', 'tip', 'minMargin', 'events']));
    expect(j.firstUnload).toEqual({ wheel: 'RL', station: expect.any(Number), distanceM: expect.any(Number) });
    expect(j.firstLift).toBeNull();
    expect(j.tip).toBeNull();
    expect(Object.keys(j.minMargin)).toEqual(['station', 'distanceM', 'forceAngleDeg', 'energyM']);
    // The demo's belly goes into the boulder: the pass stops at the hang-up station (it used to run all 161).
    expect(j.plannedStations).toBe(161);
    expect(j.stations).toHaveLength(j.hangUp.station + 1);
    expect(Object.keys(j.stations[0].wheels)).toEqual(['FL', 'FR', 'RL', 'RR']);
    expect(j.stations[0]).toHaveProperty('forceAngleDeg');
    expect(j.events.map((e: { kind: string }) => e.kind)).toContain('light');
  });

  it('text and CSV forms; a --light share above 1 is bad input', async () => {
    const t = capture();
    expect(await runCli(['pass', DEMO], t.io)).toBe(0);
    expect(t.out.join('\n')).toMatch(/first wheel to go light\s+RL at 5\.\d\d m \(station \d+\)/);
    expect(t.out.join('\n')).toContain('Real margins are smaller');
    const c = capture();
    expect(await runCli(['pass', DEMO, '--csv'], c.io)).toBe(0);
    // A header and one row per station solved (the pass stops at the belly's hang-up).
    const rows = c.out.join('\n').split('\n');
    expect(rows.length).toBeGreaterThan(100);
    expect(rows.length).toBeLessThan(162);
    expect(c.out[0].startsWith('station,distance_m,x_m,y_m,status,approximate,FL_load_n')).toBe(true);
    const p = capture();
    expect(await runCli(['pass', 'assets/scenarios/side-hill-stock.json', '--quiet', '--light', '2'], p.io)).toBe(2);
    expect(p.err).toEqual(['--light: must be between 0 and 1, got 2']);
  });
});

describe('plumbline rose, lines, compare', () => {
  it('rose --json: one direction per step, the weakest named; progress only on stderr', async () => {
    const c = capture();
    expect(await runCli(['rose', DEMO, '--step', '30', '--json'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.directions.map((d: { downhillDeg: number }) => d.downhillDeg)).toEqual([0, 30, 60, 90, 120, 150, 180, 210, 240, 270, 300, 330]);
    expect(j.weakest.tip.angleDeg).toBe(Math.min(...j.directions.map((d: { tip: { angleDeg: number } }) => d.tip.angleDeg)));
    expect(c.err.at(-1)).toBe('rose: 12/12 (100 %)');
    const csv = capture();
    expect(await runCli(['rose', DEMO, '--step', '90', '--csv', '--quiet'], csv.io)).toBe(0);
    expect(csv.out.join('\n').split('\n')).toHaveLength(5);
    expect(csv.err).toEqual([]);
  });

  it('lines: ranked best first on worker threads; --json best has the largest smallest margin', async () => {
    const c = capture();
    expect(await runCli(['lines', DEMO, '--offset', '-0.4:0.4:0.4', '--heading', '0:10:10', '--workers', '2', '--json'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.lineCount).toBe(6);
    const margins = j.lines.map((l: { minForceAngleDeg: number }) => l.minForceAngleDeg);
    expect(j.best.minForceAngleDeg).toBe(Math.max(...margins));
    expect(margins).toEqual([...margins].sort((a: number, b: number) => b - a));
    expect(c.err.at(-1)).toMatch(/^lines: 6 lines in [\d.]+ s on 2 thread\(s\)$/);
    const bad = capture();
    expect(await runCli(['lines', DEMO, '--offset', '1:0:1'], bad.io)).toBe(2);
    expect(bad.err).toEqual(['plumbline: --offset: TO must be ≥ FROM, got "1:0:1"']);
  });

  it('compare: the vehicle as given and the file\'s two builds; change from the first', async () => {
    const c = capture();
    expect(await runCli(['compare', DEMO, '--rose-step', '90', '--json', '--quiet'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.builds.map((b: { name: string }) => b.name)).toEqual([
      'as given',
      '2.5 in lift, 40 in tyres, 9 in wheels at -12 mm',
      'rooftop tent, water, front bar off, 1 in spacers',
    ]);
    const [a, b] = j.builds;
    expect(b.values.cgHeightM).toBeGreaterThan(a.values.cgHeightM);
    expect(b.changeFromFirst.ssf).toBeCloseTo(b.values.ssf - a.values.ssf, 4);
    expect(b.values.leftDownTipDeg).toBeLessThan(a.values.leftDownTipDeg);
    expect(a.values.passFirstUnloadM).not.toBeNull();
    const t = capture();
    expect(await runCli(['compare', DEMO, '--rose-step', '90', '--quiet'], t.io)).toBe(0);
    expect(t.out.join('\n')).toMatch(/^SSF \(T\/2h\)\s+1\.\d{3}\s+1\.\d{3} \(-0\.\d{3}\)/m);
  });
});

describe('plumbline cg', () => {
  // REFERENCES "CG height by raising one axle": W 20 000 N, L 2.60 m, W_f 10 400 → 11 000 N, rear raised 0.50 m, r 0.35 m → 0.748 m.
  // Scale readings in kg are the corner forces / g.
  const kg = (n: number) => String(n / GRAVITY_MPS2);
  const level = [kg(5200), kg(5200), kg(4800), kg(4800)].join(',');
  const raised = [kg(5500), kg(5500)].join(',');

  it('--json: mass, CG along and height from the worked example', async () => {
    const c = capture();
    const argv = ['cg', '--level', level, '--wheelbase', '2.6', '--track-front', '1.6', '--track-rear', '1.6', '--raised-axle', 'rear', '--raise', '0.5', '--raised-loads', raised, '--radius', '0.35', '--locked', '--json'];
    expect(await runCli(argv, c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.mass).toBeCloseTo(20_000 / GRAVITY_MPS2, 2);
    expect(j.behindFrontAxle).toBeCloseTo((2.6 * 9600) / 20_000, 4);
    expect(j.leftOfCentre).toBe(0);
    expect(j.height).toBeCloseTo(0.748, 3);
    expect(j.warnings).toEqual([]);
    expect(c.err).toEqual([]);
  });

  it('imperial units, the unlocked reminder, and missing parts of the height', async () => {
    const c = capture();
    const lb = (n: number) => String(n / GRAVITY_MPS2 / 0.45359237);
    const argv = ['cg', '--units', 'imperial', '--level', [lb(5200), lb(5200), lb(4800), lb(4800)].join(','), '--wheelbase', String(2.6 / 0.0254),
      '--raised-axle', 'rear', '--raise', String(0.5 / 0.0254), '--raised-loads', [lb(5500), lb(5500)].join(','), '--radius', String(0.35 / 0.0254), '--json'];
    expect(await runCli(argv, c.io)).toBe(0);
    expect(JSON.parse(c.out.join('\n')).height).toBeCloseTo(0.748 / 0.0254, 1);
    expect(c.err).toEqual(['cg: warning: lock (block) the suspension for the raised reading: body movement on the springs shifts the CG and biases the height']);
    const m = capture();
    expect(await runCli(['cg', '--level', level, '--wheelbase', '2.6', '--raise', '0.5'], m.io)).toBe(2);
    expect(m.err).toEqual(['plumbline: cg: the height needs all of --raised-axle, --raise, --raised-loads and --radius']);
  });

  it('--into writes the measured CG into a scenario', async () => {
    const c = capture();
    const argv = ['cg', '--level', level, '--wheelbase', '2.4', '--raised-axle', 'rear', '--raise', '0.5', '--raised-loads', raised, '--radius', '0.35', '--locked', '--into', DEMO];
    expect(await runCli(argv, c.io)).toBe(0);
    const file = JSON.parse(c.out.join('\n'));
    expect(file.vehicle.cg.behindFrontAxle).toBeCloseTo((2.4 * 9600) / 20_000, 6);
    expect(file.vehicle.mass).toBeCloseTo(20_000 / GRAVITY_MPS2, 6);
    expect(file.builds).toHaveLength(2);
  });
});
