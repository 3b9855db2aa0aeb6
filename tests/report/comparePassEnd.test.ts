/**
 * The comparison's hang-up column: how each build's pass ends (hangs up on what and where, slips,
 * tips, or gets through), from the pass's own events (passOutcome), in the core's BuildRow, in words
 * (passEndWords) and in `compare` (human, --json, --csv).
 *
 * The check is geometry: the ledge demo's boulder (x 6.2 m, y 0.85 m, radius 0.8 m, 0.62 m high)
 * under a flat belly between the axles. A belly lower than the boulder's top must meet it once the
 * belly is over it (the reference point past 6.2 − 0.8 = 5.4 m, as tests/fieldkit/passEvents.test.ts
 * reasons); a belly higher than it cannot (a flat plate above the highest point of the ground does
 * not touch it: plain geometry, the body being the outline's box).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { AS_GIVEN, applyBuild, compareVehicles, parseScenarioText, type BuildRow, type Scenario } from '../../src/core';
import { passEndWords } from '../../src/present/words';
import { PASS_END_LABEL } from '../../src/present/metrics';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';

const BOULDER_TOP_M = 0.62;
const START_X_M = 5.0;

/** The ledge demo from x = 5 m (all four wheels on the ledge's top), with one build: a 0.35 m suspension lift. */
function fileText(): string {
  const s = JSON.parse(readFileSync('assets/scenarios/ledge-crawler.json', 'utf8'));
  s.path = { from: [START_X_M, 0], to: [7.5, 0], step: 0.05 };
  s.builds = [{ name: 'tall: 0.35 m lift', lift: { suspension: 0.35 } }];
  return JSON.stringify(s);
}

let scenario: Scenario;
let rows: BuildRow[];

beforeAll(() => {
  const r = parseScenarioText(fileText());
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  scenario = r.scenario;
  const applied = [{ name: 'as given', vehicle: scenario.vehicle, changes: AS_GIVEN }, applyBuild(scenario.vehicle, scenario.builds![0])];
  // Four rose directions: the rose is not what is checked here.
  rows = compareVehicles(applied, { terrain: scenario.terrain, path: scenario.path, friction: scenario.friction, roseStepRad: Math.PI / 2 });
}, 300_000);

describe('BuildRow.passEnd', () => {
  it('the belly below the boulder top hangs up on the belly once over the boulder; above it, it does not', () => {
    const [given, tall] = rows;
    expect(given.vehicle.body.bellyClearanceM).toBeLessThan(BOULDER_TOP_M);
    expect(given.passEnd?.outcome.kind).toBe('hangs-up');
    const o = given.passEnd!.outcome;
    if (o.kind !== 'hangs-up') throw new Error('unreachable');
    expect(o.part).toBe('belly');
    expect(START_X_M + o.distanceM).toBeGreaterThan(6.2 - 0.8);
    expect(o.depthM).toBeGreaterThan(0.01);
    // The lift raises the body outline by 0.35 m: its belly clears the boulder's top.
    expect(tall.vehicle.body.bellyClearanceM).toBeGreaterThan(BOULDER_TOP_M);
    expect(tall.passEnd?.outcome.kind).not.toBe('hangs-up');
    expect(tall.metrics.passMinClearanceM!).toBeGreaterThan(0);
  });

  it('no path, no pass end', () => {
    const none = compareVehicles([{ name: 'as given', vehicle: scenario.vehicle, changes: AS_GIVEN }], { roseStepRad: Math.PI / 2 });
    expect(none[0].passEnd).toBeNull();
    expect(passEndWords(none[0].passEnd, 'metric')).toBe('—');
  });
});

describe('passEndWords', () => {
  // Distances: metres or feet (0.3048 m exactly, NIST SP 811) to 0.01; depths in mm, or inches (0.0254 m exactly) to 0.1.
  it('says where and on what, in the reader\'s units', () => {
    const hang = { outcome: { kind: 'hangs-up' as const, distanceM: 6.35, part: 'belly' as const, depthM: 0.0108 }, firstSlide: null };
    expect(passEndWords(hang, 'metric')).toBe('hangs up on the belly at 6.35 m (11 mm into the ground)');
    // 6.35 / 0.3048 = 20.833 ft; 0.0108 / 0.0254 = 0.425 in.
    expect(passEndWords(hang, 'imperial')).toBe('hangs up on the belly at 20.83 ft (0.4 in into the ground)');
    const slipFirst = { ...hang, firstSlide: { wheel: 'FL' as const, station: 88, distanceM: 4.4, frictionDemand: 0.958 } };
    expect(passEndWords(slipFirst, 'metric')).toBe('hangs up on the belly at 6.35 m (11 mm into the ground); slips first at 4.40 m (FL needs grip 0.96)');
    const slide = { outcome: { kind: 'slides' as const, distanceM: 4.4, wheel: 'FL' as const, frictionDemand: 0.92, friction: 0.9 }, firstSlide: null };
    expect(passEndWords(slide, 'metric')).toBe('cannot climb without slipping at 4.40 m: FL needs grip 0.92 on ground of 0.90');
    expect(passEndWords({ outcome: { kind: 'tips', distanceM: 2, reason: 'x' }, firstSlide: null }, 'metric')).toBe('tips at 2.00 m');
    expect(passEndWords({ outcome: { kind: 'stands' }, firstSlide: null }, 'metric')).toBe('gets through: no hang-up, no slip, no tip');
    // The bumper and the axle in words.
    expect(passEndWords({ outcome: { kind: 'hangs-up', distanceM: 1, part: 'front', depthM: 0.02 }, firstSlide: null }, 'metric')).toMatch(/^hangs up on the front bumper at/);
  });
});

describe('plumbline compare: the hang-up column', () => {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-compare-end-'));
  const file = join(dir, 'ledge-top.json');
  writeFileSync(file, fileText());
  const cli = async (args: string[]) => {
    const out: string[] = [];
    const err: string[] = [];
    const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
    const code = await runCli(args, io);
    return { code, out: out.join('\n'), err: err.join('\n') };
  };

  it('human, --json and --csv say where the build hangs up and on what', async () => {
    const human = await cli(['compare', file, '--rose-step', '90', '--quiet']);
    expect(human.code).toBe(0);
    expect(human.out).toContain(`${PASS_END_LABEL}:`);
    expect(human.out).toMatch(/\[1\] hangs up on the belly at \d+\.\d\d m \(\d+ mm into the ground\)/);
    expect(human.out).not.toMatch(/\[2\] hangs up/);

    const json = await cli(['compare', file, '--rose-step', '90', '--quiet', '--json']);
    expect(json.code).toBe(0);
    const j = JSON.parse(json.out) as { builds: { passEnd: { outcome: string; atM: number; on: string; depthM: number } | null }[] };
    expect(j.builds[0].passEnd?.outcome).toBe('hangs-up');
    expect(j.builds[0].passEnd?.on).toBe('belly');
    // Full precision in JSON: the same number as the core's.
    const o = rows[0].passEnd!.outcome;
    if (o.kind !== 'hangs-up') throw new Error('unreachable');
    expect(j.builds[0].passEnd?.atM).toBe(o.distanceM);
    expect(j.builds[0].passEnd?.depthM).toBe(o.depthM);
    expect(j.builds[1].passEnd?.outcome).not.toBe('hangs-up');

    const csv = await cli(['compare', file, '--rose-step', '90', '--quiet', '--csv']);
    expect(csv.code).toBe(0);
    const lines = csv.out.split('\n');
    expect(lines).toContain('as given,passEnd,hangs-up,');
    expect(lines).toContain('as given,passEndOn,belly,');
    expect(lines.some((l) => l.startsWith('as given,passEndAtM,'))).toBe(true);
  }, 300_000);
});
