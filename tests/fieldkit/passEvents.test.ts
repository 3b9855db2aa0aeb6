/**
 * Pass events for poses the vehicle cannot take: the body inside the ground (hangs up, a hard stop)
 * and a wheel needing more grip than the ground gives (slides), in the core and in `pass --json`
 * and the pass's human output (the CLI, in process).
 */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { passOutcome, runPass } from '../../src/core/analysis/pass';
import { passHeadline } from '../../src/present/words';
import { buildModel } from '../../src/core/solver/equilibrium';
import { parseScenarioText } from '../../src/core/scenario/parse';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';

const LEDGE_DEMO = 'assets/scenarios/ledge-crawler.json';

/**
 * A 0.5 m vertical ledge (edge radius 2 cm) ahead of the ledge demo's crawler on 0.39 m-radius tyres with
 * 15 cm of bump and droop, on ground of grip 0.6. A tyre cannot mount a face taller than its radius by
 * rolling (the contact normal above the axle points backwards: common practice of the trade, and plain
 * geometry), so the crawl can only go on with more grip than the ground has.
 */
function tallLedgeText(): string {
  const s = JSON.parse(readFileSync(LEDGE_DEMO, 'utf8'));
  delete s.builds;
  s.vehicle.tyre.radius = 0.39;
  for (const a of ['front', 'rear']) {
    s.vehicle.suspension[a].bump = 0.15;
    s.vehicle.suspension[a].droop = 0.15;
  }
  s.terrain.features = [{ type: 'step', x: 3.0, height: 0.5, edgeRadius: 0.02 }];
  s.ground.friction = 0.6;
  s.path = { from: [-0.5, 0], to: [5, 0], step: 0.05 };
  return JSON.stringify(s);
}

function scenarioOf(text: string) {
  const r = parseScenarioText(text);
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

function cli(args: string[], files: Record<string, string> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => files[p] ?? readFileSync(p, 'utf8') };
  return runCli(args, io).then((code) => ({ code, out: out.join('\n'), err: err.join('\n') }));
}

describe('body contact: the vehicle hangs up', () => {
  it('the ledge demo: the belly goes into the boulder; the pass stops there and never says it stands', () => {
    const s = scenarioOf(readFileSync(LEDGE_DEMO, 'utf8'));
    const r = runPass(buildModel(s.vehicle, s.terrain), s.path!, { friction: s.friction });
    expect(r.hangUp?.part).toBe('belly');
    // The boulder: x 6.2 m, radius 0.8 m, 0.62 m high, under the left wheels; the belly (0.38 m up, between
    // the axles) reaches it once the reference point is past x ≈ 6.2 − 0.8 = 5.4 m: the hang-up is beyond that.
    expect(r.hangUp!.distanceM + s.path!.fromM[0]).toBeGreaterThan(5.4);
    expect(r.hangUp!.depthM).toBeGreaterThan(0.01);
    const last = r.stations[r.stations.length - 1];
    expect(last.hungUp).toBe(true);
    expect(last.index).toBe(r.hangUp!.station);
    expect(r.stations.length).toBeLessThan(r.plannedStations);
    // No station before it is inside the ground by more than the hang-up depth.
    for (const st of r.stations.slice(0, -1)) expect(st.clearanceM).toBeGreaterThanOrEqual(-0.01);
    expect(r.events.filter((e) => e.kind === 'hang-up')).toHaveLength(1);
    expect(passOutcome(r).kind).toBe('hangs-up');
    const words = passHeadline(r, 'metric');
    expect(words).toMatch(/^Hangs up on the belly at \d+\.\d\d m/);
    expect(words).not.toMatch(/stands/);
  });

  it('pass --json: the hang-up event, the outcome, the headline; the hung-up station has no loads', async () => {
    const { code, out } = await cli(['pass', LEDGE_DEMO, '--json', '--quiet']);
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.outcome.kind).toBe('hangs-up');
    expect(j.outcome.part).toBe('belly');
    expect(j.hangUp.part).toBe('belly');
    expect(j.events.some((e: { kind: string; part: string }) => e.kind === 'hang-up' && e.part === 'belly')).toBe(true);
    expect(j.headline).toMatch(/Hangs up on the belly at/);
    const last = j.stations[j.stations.length - 1];
    expect(last.hungUp).toBe(true);
    expect(last.wheels.FL.loadN).toBeNull();
    expect(j.stations[0].hungUp).toBe(false);
    expect(j.stations[0].wheels.FL.loadN).toBeGreaterThan(0);
  });

  it('pass (human output): the headline leads with the hang-up', async () => {
    const { code, out } = await cli(['pass', LEDGE_DEMO, '--quiet']);
    expect(code).toBe(0);
    const lines = out.split('\n');
    expect(lines[1]).toMatch(/^Hangs up on the belly at \d+\.\d\d m/);
    expect(out).not.toMatch(/stands all along/);
    expect(out).toMatch(/hangs up on the belly: the body is inside the ground/);
  });
});

describe('a ledge taller than the tyre: it slides', () => {
  it('core: a slide event where a wheel needs more grip than the ground gives, named in the headline', () => {
    const s = scenarioOf(tallLedgeText());
    const r = runPass(buildModel(s.vehicle, s.terrain), s.path!, { friction: s.friction });
    expect(r.firstSlide).not.toBeNull();
    expect(r.firstSlide!.frictionDemand).toBeGreaterThan(0.6);
    // The slide starts where the wheel's demand first exceeds the grip, not before.
    const st = r.stations[r.firstSlide!.station];
    const k = ['FL', 'FR', 'RL', 'RR'].indexOf(r.firstSlide!.wheel);
    expect(st.wheels[k].frictionDemand).toBeGreaterThan(0.6);
    for (const prev of r.stations.slice(0, r.firstSlide!.station)) for (const w of prev.wheels) expect(w.lifted || w.frictionDemand <= 0.6).toBe(true);
    expect(r.events.some((e) => e.kind === 'slide' && e.wheel === r.firstSlide!.wheel)).toBe(true);
    const words = passHeadline(r, 'metric');
    expect(words).toMatch(/slides (first )?at \d+\.\d\d m/);
    expect(words).toMatch(/needs grip \d\.\d\d on ground of 0\.60/);
    expect(words).not.toMatch(/stands/);
  });

  it('pass --json: the slide event and the headline', async () => {
    const file = '/virtual/tall-ledge.json';
    const { code, out } = await cli(['pass', file, '--json', '--quiet'], { [file]: tallLedgeText() });
    expect(code).toBe(0);
    const j = JSON.parse(out);
    expect(j.firstSlide.frictionDemand).toBeGreaterThan(0.6);
    expect(j.events.some((e: { kind: string }) => e.kind === 'slide')).toBe(true);
    expect(j.headline).toMatch(/slides (first )?at/i);
    expect(j.outcome.kind).not.toBe('stands');
  });

  it('level ground: the pass stands all along, no slide, no hang-up', () => {
    const s = scenarioOf(tallLedgeText());
    const r = runPass(buildModel(s.vehicle, { features: [] }), s.path!, { friction: s.friction });
    expect(r.hangUp).toBeNull();
    expect(r.firstSlide).toBeNull();
    expect(passOutcome(r).kind).toBe('stands');
    expect(passHeadline(r, 'metric')).toMatch(/^Stands all along the path/);
  });
});
