/**
 * pass, rose and lines on a scenario file whose imported grid has a filled patch under the
 * front-left tyre's path: --json carries where, the text says it in words, and the lines' worker
 * threads get the mask too. The positions themselves are checked against the geometry in
 * tests/core/analysis/filledGround.test.ts; here the file's answers must equal the core's.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { buildModel, parseScenarioText, runPass, scenarioToFile, type Scenario } from '../../src/core/index';
import { FILLED_GROUND_NOTE, filledSpanWords, filledSpotWords } from '../../src/present/words';
import { filledScenario, patchOf } from '../helpers/filledGrid';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  return { io, out, err };
}

const dir = mkdtempSync(join(tmpdir(), 'plumbline-filled-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function scenarioFile(name: string, patch: ReturnType<typeof patchOf>): { path: string; scenario: Scenario } {
  const stock = parseScenarioText(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8'));
  if (!stock.ok) throw new Error('demo does not parse');
  const s: Scenario = filledScenario(stock.scenario, patch);
  const path = join(dir, name);
  writeFileSync(path, JSON.stringify(scenarioToFile(s)));
  // What the commands will see: the file read back (heights through float32, the mask through base64).
  const back = parseScenarioText(readFileSync(path, 'utf8'));
  if (!back.ok) throw new Error(back.errors.map((e) => `${e.path}: ${e.message}`).join('\n'));
  return { path, scenario: back.scenario };
}

describe('filled ground in the command line', () => {
  // Filled nodes from x 2.0 to 3.0 m along the left track (y 0.6 to 1.0 m): FL, then RL, cross them;
  // at the pose (the origin) FL stands at (1.4, 0.8), also on them.
  const { path: file, scenario } = scenarioFile('patch.json', patchOf(1.2, 3.0, 0.6, 1.0));

  it('pass --json: the spans per wheel and each station\'s wheels, as the core finds them; the text says where', async () => {
    const core = runPass(buildModel(scenario.vehicle, scenario.terrain), scenario.path!, { friction: scenario.friction });
    expect(core.filledGround!.map((s) => s.wheel)).toEqual(['FL', 'RL']);
    const c = capture();
    expect(await runCli(['pass', file, '--json', '--quiet'], c.io)).toBe(0);
    const j = JSON.parse(c.out.join('\n'));
    expect(j.filledGround).toEqual(
      core.filledGround!.map((s) => ({ wheel: s.wheel, startStation: s.startStation, startDistanceM: expect.closeTo(s.startDistanceM, 6), endStation: s.endStation, endDistanceM: expect.closeTo(s.endDistanceM, 6) })),
    );
    expect(j.stations.map((s: { filledWheels: string[] }) => s.filledWheels)).toEqual(core.stations.map((s) => s.filledWheels));

    const t = capture();
    expect(await runCli(['pass', file, '--quiet'], t.io)).toBe(0);
    const text = t.out.join('\n');
    for (const s of core.filledGround!) expect(text).toContain(`${filledSpanWords(s, 'metric')}.`);
    expect(text).toMatch(/FL stands on filled ground from \d+\.\d\d m to \d+\.\d\d m\./);
    expect(text).toContain(FILLED_GROUND_NOTE);
    const f = capture();
    expect(await runCli(['pass', file, '--quiet', '--units', 'imperial'], f.io)).toBe(0);
    expect(f.out.join('\n')).toMatch(/FL stands on filled ground from \d+\.\d+ ft to \d+\.\d+ ft\./);

    const csv = capture();
    expect(await runCli(['pass', file, '--csv', '--quiet'], csv.io)).toBe(0);
    const rows = csv.out.join('\n').trim().split('\n');
    expect(rows[0].endsWith(',filled_wheels')).toBe(true);
    const fl = core.filledGround!.find((s) => s.wheel === 'FL')!;
    expect(rows[1 + fl.startStation].endsWith(',FL')).toBe(true);
    expect(rows[1 + fl.startStation - 1].endsWith(',')).toBe(true);
  }, 60_000);

  it('rose --terrain: the note and filledWheels at the spot; on the level table (no terrain) none', async () => {
    const c = capture();
    expect(await runCli(['rose', file, '--terrain', '--step', '90', '--json', '--quiet'], c.io)).toBe(0);
    expect(JSON.parse(c.out.join('\n')).filledWheels).toEqual(['FL']);
    const t = capture();
    expect(await runCli(['rose', file, '--terrain', '--step', '90', '--quiet'], t.io)).toBe(0);
    expect(t.out).toContain(filledSpotWords(['FL']));
    const level = capture();
    expect(await runCli(['rose', file, '--step', '90', '--json', '--quiet'], level.io)).toBe(0);
    expect(JSON.parse(level.out.join('\n')).filledWheels).toEqual([]);
  }, 60_000);

  it('lines: per line a flag, in-process and on a worker thread (the mask travels with the job)', async () => {
    // Offsets 0 and −1.6 m (one track to the right: every wheel off the patch).
    for (const workers of ['0', '1']) {
      const c = capture();
      expect(await runCli(['lines', file, '--offset', '-1.6:0:1.6', '--workers', workers, '--json', '--quiet'], c.io)).toBe(0);
      const j = JSON.parse(c.out.join('\n'));
      const byOffset = Object.fromEntries(j.lines.map((l: { offsetM: number; onFilledGround: boolean }) => [l.offsetM, l.onFilledGround]));
      expect(byOffset).toEqual({ '0': true, '-1.6': false });
    }
    const t = capture();
    expect(await runCli(['lines', file, '--offset', '-1.6:0:1.6', '--workers', '0', '--quiet'], t.io)).toBe(0);
    const text = t.out.join('\n');
    expect(text).toContain('1 of 2 lines put a tyre on filled ground (marked "filled")');
    expect(text).toMatch(/\sfilled\s*$/m);
  }, 120_000);
});
