/**
 * The demo library (assets/scenarios): every demo parses, stands at its pose, and runs every CLI
 * command without error; together they use every terrain feature; and the report of each demo
 * holds its headline numbers exactly as the CLI's --json gives them, the cautions, and no address
 * that would load anything from outside the file.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { FEATURE_TYPES, parseScenarioText, REPORT_CAUTIONS, esc } from '../../src/core/index';

const DIR = join(__dirname, '..', '..', 'assets', 'scenarios');
const DEMOS = readdirSync(DIR).filter((f) => f.endsWith('.json')).sort();

async function cli(...argv: string[]): Promise<{ code: number; out: string; err: string }> {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  const code = await runCli(argv, io);
  return { code, out: out.join('\n'), err: err.join('\n') };
}

async function json(...argv: string[]): Promise<any> {
  const r = await cli(...argv, '--json');
  expect(r.code, `${argv.join(' ')}: ${r.err}`).toBe(0);
  return JSON.parse(r.out);
}

describe('demo library', () => {
  it('has at least eight demos', () => expect(DEMOS.length).toBeGreaterThanOrEqual(8));

  it('uses every terrain feature type, builds, both unit systems and paths', () => {
    const used = new Set<string>();
    let builds = 0, imperial = 0, paths = 0;
    for (const f of DEMOS) {
      const r = parseScenarioText(readFileSync(join(DIR, f), 'utf8'));
      expect(r.ok).toBe(true);
      if (!r.ok) continue;
      for (const feat of r.scenario.terrain.features) used.add(feat.type);
      if (r.scenario.builds && r.scenario.builds.length > 0) builds++;
      if (r.scenario.units === 'imperial') imperial++;
      if (r.scenario.path) paths++;
    }
    expect([...used].sort()).toEqual([...FEATURE_TYPES].sort());
    expect(builds).toBeGreaterThanOrEqual(1);
    expect(imperial).toBeGreaterThanOrEqual(1);
    expect(paths).toBe(DEMOS.length);
  });
});

describe.each(DEMOS)('demo %s', (name) => {
  const file = join(DIR, name);

  it('is invented data: its notes say so', () => {
    const d = JSON.parse(readFileSync(file, 'utf8'));
    expect(d.notes).toMatch(/invented/i);
  });

  it('stands at its pose (pose: converged)', async () => {
    const p = await json('pose', file);
    expect(p.status).toBe('converged');
    for (const w of ['FL', 'FR', 'RL', 'RR']) expect(p.wheels[w].loadN).toBeGreaterThan(0);
  });

  it('runs check, rose, pass, lines and compare without error', async () => {
    expect((await cli('check', file)).code).toBe(0);
    const rose = await json('rose', file, '--quiet', '--step', '30');
    expect(rose.directions.length).toBe(12);
    const pass = await json('pass', file, '--quiet');
    expect(pass.stations.length).toBeGreaterThan(1);
    const lines = await cli('lines', file, '--quiet', '--json', '--offset', '0', '--heading', '0', '--workers', '0');
    expect(lines.code, lines.err).toBe(0);
    // compare: the vehicle as given, then the file's builds in order (none: the one column), each
    // with its static stability factor SSF = T / (2 h) (NHTSA's rollover rating, 49 CFR 575.105
    // background; from memory) from the mean track and CG height it reports, to its 5 digits.
    const d = JSON.parse(readFileSync(file, 'utf8'));
    const cmp = await json('compare', file, '--quiet', '--rose-step', '30');
    expect(cmp.builds.map((b: { name: string }) => b.name)).toEqual(['as given', ...(d.builds ?? []).map((b: { name: string }) => b.name)]);
    for (const b of cmp.builds) {
      expect(b.values.cgHeightM).toBeGreaterThan(0);
      expect(b.values.ssf).toBeCloseTo(b.values.trackMeanM / (2 * b.values.cgHeightM), 4);
    }
  });

  it('report holds the CLI --json headline numbers, the cautions, and no external address', async () => {
    const tilts = await Promise.all(['front', 'rear', 'left', 'right'].map((d) => json('tilt', file, '--downhill', d)));
    const rose = await json('rose', file, '--quiet');
    const pass = await json('pass', file, '--quiet');
    const r = await cli('report', file, '--date', '2031-04-05');
    expect(r.code, r.err).toBe(0);
    const html = r.out;
    // Every demo lifts a wheel and tips within the 89° sweep, each way (tilt --json), and tips
    // somewhere on the rose: the report must show those numbers.
    for (const t of tilts) {
      // Same numbers as `tilt --json` (degrees to 4 decimals, as JavaScript writes them).
      expect(t.firstLift).not.toBeNull();
      expect(t.tip).not.toBeNull();
      expect(html).toContain(`${t.firstLift.wheel} at ${t.firstLift.angleDeg}°`);
      expect(html).toContain(`${t.tip.angleDeg}° over ${t.tip.edge.join('–')}`);
    }
    // `rose --json` (level tilt table, every 5°).
    expect(rose.weakest.tip).not.toBeNull();
    expect(html).toContain(`tips at ${rose.weakest.tip.angleDeg}° with downhill ${rose.weakest.downhillDeg}°`);
    // `pass --json`: each headline row as the pass went, its event or the report's "none".
    const row = (label: string, text: string, whole = false) => `<tr><th>${label}</th><td>${esc(text)}${whole ? '</td>' : ''}`;
    expect(html).toContain(pass.firstUnload ? row('First wheel to go light', `${pass.firstUnload.wheel} at ${pass.firstUnload.distanceM} m`) : row('First wheel to go light', 'none', true));
    expect(html).toContain(pass.firstLift ? row('First wheel to lift', `${pass.firstLift.wheel} at ${pass.firstLift.distanceM} m`) : row('First wheel to lift', 'none', true));
    expect(html).toContain(row('Tip', pass.tip ? `at ${pass.tip.distanceM} m` : 'none: the vehicle stands all along the path'));
    expect(pass.minMargin).not.toBeNull();
    expect(html).toContain(row('Smallest force-angle margin', `${pass.minMargin.forceAngleDeg}° at ${pass.minMargin.distanceM} m`));
    // The cautions, at the top and at the bottom.
    for (const c of REPORT_CAUTIONS) expect(html.split(esc(c)).length - 1).toBe(2);
    expect(html.indexOf('id="caution-top"')).toBeLessThan(html.indexOf('id="scenario"'));
    expect(html.indexOf('id="caution-bottom"')).toBeGreaterThan(html.indexOf('id="methods"'));
    // Nothing loads from outside: no scheme, no protocol-relative address, no src/href, no script.
    expect(html).not.toMatch(/https?:/i);
    expect(html).not.toMatch(/\b(src|href|xlink:href)\s*=/i);
    expect(html).not.toMatch(/<script|@import|url\(/i);
    expect(html).not.toMatch(/=\s*["']\/\//);
    expect(html).toContain('2031-04-05');
  });
});
