/**
 * `plumbline rose`, human output: the weakest direction is printed once (in the slope-to-spare
 * lines), a named direction that is the weakest points back to it, and --json keeps its keys.
 * Numbers are checked against the same run's --json; the weakest direction against the rigid
 * tilt-table bound tan θ = (T/2 + w/2 − y)/h (REFERENCES "Rollover of a rigid vehicle": the
 * moment balance about the downhill contact line; a compliant vehicle tips no later) and against
 * the side being the weak way round for a vehicle whose half-track is shorter than its CG's distance
 * to either axle (side roll over the track, pitch over the wheelbase: the same balance).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import demo from '../../assets/scenarios/side-hill-stock.json';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { roseSummaryLines } from '../../src/cli/commands/rose';
import { buildModel, parseScenario, stabilityRose } from '../../src/core';

const FILE = 'assets/scenarios/side-hill-stock.json';
const DEG = Math.PI / 180;

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  return { io, out, err };
}

describe('plumbline rose (human output)', () => {
  it('names the weakest direction once, with the numbers --json gives', async () => {
    const h = capture();
    expect(await runCli(['rose', FILE, '--step', '45', '--quiet'], h.io)).toBe(0);
    const j = capture();
    expect(await runCli(['rose', FILE, '--step', '45', '--quiet', '--json'], j.io)).toBe(0);
    const json = JSON.parse(j.out.join('\n'));
    // --json unchanged but for the filled-ground key added beside it: the same keys as before.
    expect(Object.keys(json)).toEqual(['table', 'maxAngleDeg', 'groundFromLevelDeg', 'weakest', 'weakestLift', 'directions', 'evaluations', 'filledWheels']);
    expect(json.weakest.downhillDeg).toBe(90);

    const text = h.out.join('\n').split('\n');
    const summary = text.slice(0, text.findIndex((l) => l.startsWith('downhill')));
    // Once: no key-value line of it above the slope to spare, and no second line of it below.
    expect(text.filter((l) => /weakest/.test(l))).toEqual([
      `weakest direction 90° (left side down): a wheel (FR) lifts after ${json.weakest.firstLift.beyondGroundDeg.toFixed(1)}° more, it tips after ${json.weakest.tip.beyondGroundDeg.toFixed(1)}° more (a slope of ${json.weakest.tip.fromLevelDeg.toFixed(1)}° from level)`,
      'left side down: the weakest direction, above',
    ]);
    expect(text.some((l) => /^earliest wheel lift/.test(l))).toBe(false); // the same direction: it is in the weakest line
    const nonEmpty = summary.filter((l) => l.trim() !== '');
    expect(new Set(nonEmpty).size).toBe(nonEmpty.length);
    // The table still lists every direction, and the caution closes the output.
    expect(text.filter((l) => /^\s+\d+\.\d\s/.test(l))).toHaveLength(8);
    expect(text.at(-1)).toMatch(/^Caution: quasi-static estimates/);

    // The weakest tip lies below the same vehicle made rigid (total CG: 2150 kg at 0.78 m, centred;
    // 85 kg at 0.95 m, 0.37 m left; 45 kg at 0.88 m, 0.20 m right), left side down.
    const m = 2150 + 85 + 45;
    const hM = (2150 * 0.78 + 85 * 0.95 + 45 * 0.88) / m;
    const yM = (85 * 0.37 - 45 * 0.2) / m;
    expect(json.weakest.tip.fromLevelDeg).toBeLessThan(Math.atan((1.58 / 2 + 0.265 / 2 - yM) / hM) / DEG);
    // Side over pitch: half-track 0.79 m against the CG 1.45 m behind the front axle and 1.65 m ahead of the rear.
    expect([90, 270]).toContain(json.weakest.downhillDeg);
  }, 60_000);

  it('adds the earliest wheel lift only where it is in another direction than the weakest', () => {
    const p = parseScenario(demo);
    if (!p.ok) throw new Error('demo');
    const s = p.scenario;
    const r = stabilityRose(buildModel(s.vehicle, { features: [] }), { xM: 0, yM: 0, headingRad: 0 }, { stepRad: 90 * DEG, friction: s.friction });
    expect(roseSummaryLines(r).some((l) => l.startsWith('earliest wheel lift'))).toBe(false);
    // The same rose with its earliest lift taken from the nose-down direction (a real direction of it).
    const nose = r.directions.find((d) => Math.abs(d.downhillRad) < 1e-9)!;
    expect(nose.firstLift).not.toBeNull();
    const lines = roseSummaryLines({ ...r, weakestLift: nose });
    expect(lines.filter((l) => l.startsWith('earliest wheel lift'))).toEqual([
      `earliest wheel lift: ${nose.firstLift!.wheel} at ${(nose.firstLift!.fromLevelRad / DEG).toFixed(1)}° from level (${(nose.firstLift!.beyondGroundRad / DEG).toFixed(1)}° more than the ground here), 0° (nose down)`,
    ]);
  }, 60_000);
});
