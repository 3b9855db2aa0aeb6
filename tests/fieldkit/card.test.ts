/**
 * The limit card (src/report/card.ts) and `plumbline card`.
 * A rigid vehicle's card states the closed-form tilt-table limits: side tip at atan((T/2)/h) (SSF,
 * NHTSA 2001; NRC/TRB SR 265), nose down at atan(a/h), tail down at atan(b/h) (Gillespie 1992, ch. 2);
 * the operating line is 50 % of the lift slope capped at 15° (common practice, see card.ts).
 */
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { OPERATING_CAP_DEG, cardFor, collectCards, groundLines, renderCardsHtml } from '../../src/report/card';
import { parseScenarioText, type Scenario } from '../../src/core';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { rigidVehicle } from '../helpers/vehicles';

const DEG = Math.PI / 180;

function scenario(file: string): Scenario {
  const r = parseScenarioText(readFileSync(file, 'utf8'));
  if (!r.ok) throw new Error(JSON.stringify(r.errors));
  return r.scenario;
}

describe('card data', () => {
  it('a rigid vehicle: lift and tip at the closed forms, from level; the operating line of common practice', () => {
    const s = scenario('assets/scenarios/side-hill-stock.json');
    const c = cardFor({ ...s, friction: 2 }, 'rigid', rigidVehicle(), null, undefined, { ground: null });
    const d = Object.fromEntries(c.directions.map((x) => [x.name, x]));
    // rigidVehicle: T 1.6, h 0.75, a 1.3, b 1.5 (m). Tolerance 0.1°: the sweep bisects to 0.01°, the vehicle is rigid to micrometres.
    const TOL = 0.1 * DEG;
    expect(Math.abs(d.leftDown.tip!.angleRad - Math.atan(0.8 / 0.75))).toBeLessThan(TOL);
    expect(Math.abs(d.rightDown.tip!.angleRad - Math.atan(0.8 / 0.75))).toBeLessThan(TOL);
    expect(Math.abs(d.noseDown.tip!.angleRad - Math.atan(1.3 / 0.75))).toBeLessThan(TOL);
    expect(Math.abs(d.tailDown.tip!.angleRad - Math.atan(1.5 / 0.75))).toBeLessThan(TOL);
    for (const x of c.directions) {
      const base = x.lift?.angleRad ?? x.tip!.angleRad;
      expect(x.operatingRad).toBeCloseTo(Math.min(OPERATING_CAP_DEG * DEG, 0.5 * base), 12);
      expect(x.operatingRad).toBeLessThanOrEqual(15 * DEG + 1e-12);
    }
  });

  it('payload and roof load: items at or above the roof line count as roof load', () => {
    const s = scenario('assets/scenarios/ledge-crawler.json');
    const cards = collectCards(s, { grounds: [null, null, null] });
    expect(cards.map((c) => c.configName)).toEqual(['as given', ...s.builds!.map((b) => b.name)]);
    // As given: driver 85 kg + recovery gear 35 kg, none on the roof (roof line 1.95 m).
    expect(cards[0].payloadKg).toBeCloseTo(120, 9);
    expect(cards[0].roofLoadKg).toBe(0);
    // The tent build adds a 75 kg tent and rack at 2.1 m (above the roof) and 40 kg of water at 0.85 m.
    const tent = cards.find((c) => c.configName.startsWith('rooftop tent'))!;
    expect(tent.payloadKg).toBeCloseTo(120 + 75 + 40, 9);
    expect(tent.roofLoadKg).toBeCloseTo(75, 9);
    // A roof load raises the CG: the tent build tips at a smaller side slope than the vehicle as given.
    const side = (c: typeof tent) => Math.min(c.directions[0].tip!.angleRad, c.directions[1].tip!.angleRad);
    expect(side(tent)).toBeLessThan(side(cards[0]));
  });

  it('the HTML: one limit-card root per configuration, the caution, the date, angles to 0.1°, the user\'s units', () => {
    const s = scenario('tests/fixtures/side-hill-stock-imperial.json');
    const cards = collectCards(s, { headingStepRad: 45 * DEG });
    const html = renderCardsHtml(cards, { dateText: '2026-12-02', toolVersion: '0.0.0' });
    expect(html.match(/data-testid="limit-card"/g)).toHaveLength(cards.length);
    expect(html).toContain('Printed 2026-12-02');
    expect(html).toContain('Real margins are smaller');
    expect(html).toMatch(/common practice/);
    expect(html).not.toMatch(/\d+\.\d{2,}°/);
    // Imperial: lengths in inches and masses in pounds, no mm or kg in the build lines (tyre diameter also in mm, as the trade writes both).
    expect(html).toMatch(/Wheelbase \d+\.\d in/);
    expect(html).toMatch(/Mass as weighed \d+ lb/);
    const tip = cards[0].directions[0].tip!.angleRad / DEG;
    expect(html).toContain(`${tip.toFixed(1)}°`);
    // The worst heading on the file's own ground, on every card.
    expect(html.match(/data-testid="card-worst-heading"/g)).toHaveLength(cards.length);
    expect(html).toMatch(/Worst heading \d+\.\d° \(from the terrain's x axis, counter-clockwise/);
    expect(html).toMatch(/more than the ground here \(a slope of \d+\.\d° from level/);
  });
});

describe('the worst heading on the scenario\'s ground', () => {
  it('a rigid vehicle across a 10° side slope: the worst heading is side-on, tipping at atan((T/2)/h) from level', () => {
    // A plane rising toward +y at 10° (falls toward −y): headings 0° and 180° put the vehicle side-on.
    // A rigid vehicle tips when the slope from level reaches atan((T/2)/h) = atan(0.8/0.75) = 46.85° (SSF,
    // NHTSA 2001; NRC/TRB SR 265), the least over all directions since the side edge is the support's
    // nearest (0.8 m against 1.3 and 1.5 m fore and aft: Gillespie 1992, ch. 2). So the extra tilt beyond
    // the ground is 46.85° − 10° = 36.85°. Tolerance 0.1°: the sweep bisects to 0.01°, the vehicle is rigid.
    const s = scenario('assets/scenarios/side-hill-stock.json');
    const slope = 10 * DEG;
    const onPlane: Scenario = { ...s, friction: 2, pose: { xM: 0, yM: 0, headingRad: 0 }, terrain: { features: [{ type: 'plane', gradeRad: 0, crossSlopeRad: slope, heightM: 0 }] } };
    const c = cardFor(onPlane, 'rigid', rigidVehicle(), null, undefined, { headingStepRad: 30 * DEG });
    const g = c.ground!;
    expect(Math.abs(g.ground.slopeRad - slope)).toBeLessThan(1e-9);
    const w = g.worst!;
    expect(w.stands).toBe(true);
    const side = Math.atan(0.8 / 0.75);
    expect(Math.abs(w.tip!.extraRad + slope - side)).toBeLessThan(0.1 * DEG);
    // Side-on: heading 0° or 180° (a tie between the two sides of a symmetric vehicle).
    const hd = Math.round(w.headingRad / DEG);
    expect([0, 180]).toContain(hd);
    const lines = groundLines(c)!;
    expect(lines[0]).toContain('The ground there is 10.0° from level');
    expect(lines[1]).toContain(`Worst heading ${hd}.0° (from the terrain's x axis, counter-clockwise; downhill: ${hd === 0 ? 'right' : 'left'} side down)`);
    expect(lines[1]).toContain(`it tips after ${((side - slope) / DEG).toFixed(1)}° more than the ground here (a slope of ${(side / DEG).toFixed(1)}° from level`);
    const html = renderCardsHtml([c], { dateText: '2026-12-02', toolVersion: '0.0.0' });
    expect(html).toContain('On this ground: the worst heading');
  });

  it('a sweep run elsewhere (the app\'s workers) is printed as given; null leaves the block off', () => {
    const s = scenario('assets/scenarios/side-hill-stock.json');
    const none = collectCards(s, { max: 1, grounds: [null] });
    expect(none[0].ground).toBeNull();
    expect(renderCardsHtml(none, { dateText: '2026-12-02', toolVersion: '0.0.0' })).not.toContain('card-worst-heading');
  });
});

describe('plumbline card', () => {
  it('writes the card file: three configurations of the ledge demo; --as-given one; a bad fraction is bad input', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-card-'));
    const out: string[] = [];
    const err: string[] = [];
    const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
    const file = join(dir, 'card.html');
    expect(await runCli(['card', 'assets/scenarios/ledge-crawler.json', '-o', file, '--date', '2026-12-02', '--heading-step', '45'], io)).toBe(0);
    const html = readFileSync(file, 'utf8');
    expect(html.match(/data-testid="limit-card"/g)).toHaveLength(3);
    expect(err.join('\n')).toContain('3 cards');
    const one = join(dir, 'one.html');
    expect(await runCli(['card', 'assets/scenarios/ledge-crawler.json', '-o', one, '--as-given', '--heading-step', '45', '--units', 'imperial'], io)).toBe(0);
    const oneHtml = readFileSync(one, 'utf8');
    expect(oneHtml.match(/data-testid="limit-card"/g)).toHaveLength(1);
    expect(oneHtml.match(/data-testid="card-worst-heading"/g)).toHaveLength(1);
    expect(oneHtml).toMatch(/Wheelbase \d+\.\d in/);
    expect(await runCli(['card', 'assets/scenarios/ledge-crawler.json', '--fraction', '2'], io)).toBe(2);
    expect(await runCli(['card', 'assets/scenarios/ledge-crawler.json', '--heading-step', '0'], io)).toBe(2);
  });
});
