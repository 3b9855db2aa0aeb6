/**
 * The limit card: one printed page (A4 or Letter) per vehicle configuration, for a customer or a
 * cab: the build in the trade's terms, the slope from level at which a wheel lifts and at which it
 * tips (left, right, nose and tail down, on a level tilt table), an operating line well inside
 * them, the load it assumes, the date and the caution. In the scenario's units.
 *
 * Pure: the caller gives the date; no clock, no I/O. The limits come from the tilt-table sweep
 * (SAE J2180 / ISO 16333 style) of each configuration on level ground. Below them, the worst
 * heading on the scenario's own ground (a surveyed site, as it is, not a level table): the heading
 * sweep (src/core/analysis/headings.ts) at the vehicle's spot, with the extra tilt to the tip and to
 * the first lift, each said with its datum (more than the ground here, and from level).
 */
import {
  DEFAULT_FRICTION,
  KG_PER_LB,
  M_PER_IN,
  applyBuild,
  buildModel,
  cardinalLimits,
  headingSweep,
  HEADING_MAX_EXTRA_RAD,
  type BuildSpec,
  type HeadingSweepResult,
  type CardinalName,
  type RoseDirection,
  type Scenario,
  type UnitSystem,
  type Vehicle,
} from '../core';

import { RAD_PER_DEG as DEG, angleText, distanceText, lengthText, shortText } from '../present/units';
import { downhillWords } from '../present/words';
const LEVEL = { features: [] };
const ORIGIN = { xM: 0, yM: 0, headingRad: 0 };

/**
 * The operating line: this fraction of the slope at which the first wheel lifts, and never above
 * OPERATING_CAP_DEG. Common practice, not a published ratio: makers of utility vehicles, ATVs and
 * mowers commonly print about 15° as the maximum slope, far below the static limits (REFERENCES.md,
 * "Limits that standards and regulators set").
 */
export const DEFAULT_OPERATING_FRACTION = 0.5;
export const OPERATING_CAP_DEG = 15;

export const CARD_CAUTION =
  'Quasi-static estimates for a slow vehicle on firm ground: no bounce, no momentum, no soft or crumbling edge, no side load, no driver input. ' +
  'Real margins are smaller. Keep to the vehicle maker\u2019s limits, local regulations and trained practice; use a spotter.';

export interface CardDirection {
  readonly name: CardinalName;
  readonly words: string;
  /** Slope from level at which the first wheel lifts (rad) and which wheel; null when none lifts before the tip. */
  readonly lift: { readonly angleRad: number; readonly wheel: string } | null;
  /** Slope from level at which it tips (rad) and about which tyres; null when no tip up to 89°. */
  readonly tip: { readonly angleRad: number; readonly edge: readonly string[] } | null;
  /** Slope from level at which the grip needed passes the ground's (rad); null when it holds to the tip. */
  readonly slideRad: number | null;
  /** The operating line (rad): fraction × the lift (or the tip), capped at OPERATING_CAP_DEG. */
  readonly operatingRad: number;
}

export interface CardData {
  readonly scenarioName: string;
  readonly configName: string;
  readonly vehicle: Vehicle;
  readonly build: BuildSpec | null;
  readonly directions: readonly CardDirection[];
  readonly payloadKg: number;
  /** Payload at or above the roof line (a roof rack, tent, boxes). */
  readonly roofLoadKg: number;
  readonly friction: number;
  readonly operatingFraction: number;
  readonly units: UnitSystem;
  /**
   * The heading sweep on the scenario's terrain at the vehicle's spot (the ground as it is), for
   * this configuration; its worst heading is printed. Null: left off the card.
   */
  readonly ground: HeadingSweepResult | null;
  /** Heading step of that sweep (rad). */
  readonly headingStepRad: number;
}

/** Heading step of the card's sweep on the ground: 5° (as the app's heading sweep by default). */
export const CARD_HEADING_STEP_RAD = 5 * DEG;

export interface CardOptions {
  /**
   * The heading sweep for this configuration, already run (the app runs it in its workers); null
   * leaves the ground off the card; undefined runs it here (headingSweep on the scenario's
   * terrain at the scenario pose's x, y).
   */
  readonly ground?: HeadingSweepResult | null;
  /** @default CARD_HEADING_STEP_RAD */
  readonly headingStepRad?: number;
  /** Units the card is written in. @default the scenario file's */
  readonly units?: UnitSystem;
}

const WORDS: Record<CardinalName, string> = {
  leftDown: 'left side down',
  rightDown: 'right side down',
  noseDown: 'nose down (front downhill)',
  tailDown: 'tail down (rear downhill)',
};

function direction(name: CardinalName, d: RoseDirection, fraction: number): CardDirection {
  const base = d.firstLift?.angleRad ?? d.tip?.angleRad ?? 89 * DEG;
  return {
    name,
    words: WORDS[name],
    lift: d.firstLift ? { angleRad: d.firstLift.angleRad, wheel: d.firstLift.wheel } : null,
    tip: d.tip ? { angleRad: d.tip.angleRad, edge: d.tip.edge } : null,
    slideRad: d.slide ? d.slide.angleRad : null,
    operatingRad: Math.min(OPERATING_CAP_DEG * DEG, fraction * base),
  };
}

/** One card's data for a vehicle (as given, or with a build applied). */
export function cardFor(scenario: Scenario, configName: string, vehicle: Vehicle, build: BuildSpec | null, fraction = DEFAULT_OPERATING_FRACTION, opts: CardOptions = {}): CardData {
  const friction = scenario.friction ?? DEFAULT_FRICTION;
  const headingStepRad = opts.headingStepRad ?? CARD_HEADING_STEP_RAD;
  const ground =
    opts.ground !== undefined ? opts.ground : headingSweep(vehicle, scenario.terrain, scenario.pose.xM, scenario.pose.yM, { stepRad: headingStepRad, friction });
  const lim = cardinalLimits(buildModel(vehicle, LEVEL), ORIGIN, { friction });
  const order: CardinalName[] = ['leftDown', 'rightDown', 'noseDown', 'tailDown'];
  let payloadKg = 0;
  let roofLoadKg = 0;
  for (const p of vehicle.payload) {
    payloadKg += p.massKg;
    if (p.heightM >= vehicle.body.roofHeightM) roofLoadKg += p.massKg;
  }
  return {
    scenarioName: scenario.name,
    configName,
    vehicle,
    build,
    directions: order.map((n) => direction(n, lim[n], fraction)),
    payloadKg,
    roofLoadKg,
    friction,
    operatingFraction: fraction,
    units: opts.units ?? scenario.units,
    ground,
    headingStepRad,
  };
}

/** The configurations a card set covers: the vehicle as given, then each build (as many as `max` in all). */
export function cardConfigs(scenario: Scenario, max = 8): { readonly name: string; readonly vehicle: Vehicle; readonly build: BuildSpec | null }[] {
  const out: { name: string; vehicle: Vehicle; build: BuildSpec | null }[] = [{ name: 'as given', vehicle: scenario.vehicle, build: null }];
  for (const b of (scenario.builds ?? []).slice(0, Math.max(0, max - 1))) out.push({ name: b.name, vehicle: applyBuild(scenario.vehicle, b).vehicle, build: b });
  return out;
}

/**
 * Cards for the vehicle as given and each of the scenario's builds (as many as `max`). `grounds`:
 * each configuration's heading sweep, already run, in cardConfigs' order (else each is run here).
 */
export function collectCards(
  scenario: Scenario,
  opts: { readonly fraction?: number; readonly max?: number; readonly grounds?: readonly (HeadingSweepResult | null)[]; readonly headingStepRad?: number; readonly units?: UnitSystem } = {},
): CardData[] {
  return cardConfigs(scenario, opts.max).map((c, i) =>
    cardFor(scenario, c.name, c.vehicle, c.build, opts.fraction, { ground: opts.grounds ? (opts.grounds[i] ?? null) : undefined, headingStepRad: opts.headingStepRad, units: opts.units }),
  );
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** Lengths, masses and angles in the card's units (angles in degrees to 0.1°, as the method can tell). */
function fmt(u: UnitSystem) {
  const metric = u === 'metric';
  return {
    len: (m: number) => (metric ? `${Math.round(m * 1000)} mm` : `${(m / M_PER_IN).toFixed(1)} in`),
    small: (m: number) => (metric ? `${Math.round(m * 1000)} mm` : `${(m / M_PER_IN).toFixed(2)} in`),
    mass: (kg: number) => (metric ? `${Math.round(kg)} kg` : `${Math.round(kg / KG_PER_LB)} lb`),
    deg: (rad: number) => `${(rad / DEG).toFixed(1)}°`,
  };
}

/** The vehicle in the trade's terms. */
function buildLines(c: CardData): string[] {
  const f = fmt(c.units);
  const v = c.vehicle;
  const tyre = (t: Vehicle['tyreFront']) => `${(2 * t.radiusM / M_PER_IN).toFixed(1)} in (${Math.round(2 * t.radiusM * 1000)} mm) across, ${f.small(t.widthM)} wide`;
  const same = v.tyreFront.radiusM === v.tyreRear.radiusM && v.tyreFront.widthM === v.tyreRear.widthM;
  const lines = [
    `Wheelbase ${f.len(v.wheelbaseM)}; track ${f.len(v.trackFrontM)} front, ${f.len(v.trackRearM)} rear`,
    same ? `Tyres ${tyre(v.tyreFront)}` : `Tyres: front ${tyre(v.tyreFront)}; rear ${tyre(v.tyreRear)}`,
    `Mass as weighed ${f.mass(v.massKg)}; CG ${f.len(v.cg.heightM)} high, ${f.len(v.cg.behindFrontAxleM)} behind the front axle`,
    `Suspension travel: front bump ${f.small(v.suspensionFront.bumpM)}, droop ${f.small(v.suspensionFront.droopM)}; rear bump ${f.small(v.suspensionRear.bumpM)}, droop ${f.small(v.suspensionRear.droopM)}`,
    `Anti-roll bars: front ${v.suspensionFront.antiRollNmPerRad > 0 ? 'fitted' : 'none or disconnected'}, rear ${v.suspensionRear.antiRollNmPerRad > 0 ? 'fitted' : 'none or disconnected'}`,
  ];
  const b = c.build;
  if (b) {
    const mods: string[] = [];
    if (b.lift?.suspensionM) mods.push(`suspension lift ${f.small(b.lift.suspensionM)}`);
    if (b.lift?.bodyM) mods.push(`body lift ${f.small(b.lift.bodyM)}`);
    if (b.tyre) mods.push(`tyres ${(2 * b.tyre.radiusM / M_PER_IN).toFixed(1)} in across`);
    if (b.wheels?.fitted) {
      const w = b.wheels.fitted;
      const parts = [`${(w.rimWidthM / M_PER_IN).toFixed(1)} in wide`];
      if (w.offsetM !== undefined) parts.push(`offset ${w.offsetM >= 0 ? '+' : ''}${Math.round(w.offsetM * 1000)} mm`);
      if (w.backspacingM !== undefined) parts.push(`backspacing ${(w.backspacingM / M_PER_IN).toFixed(2)} in`);
      mods.push(`wheels ${parts.join(', ')}`);
    }
    if (b.wheels?.spacerM) mods.push(`wheel spacers ${f.small(b.wheels.spacerM)}`);
    if (b.antiRoll?.front !== undefined) mods.push(`front anti-roll bar ${b.antiRoll.front === 'disconnected' ? 'disconnected' : 'changed'}`);
    if (b.antiRoll?.rear !== undefined) mods.push(`rear anti-roll bar ${b.antiRoll.rear === 'disconnected' ? 'disconnected' : 'changed'}`);
    if (b.travel) mods.push('suspension travel changed (above)');
    if (b.payload?.length) mods.push(`added load: ${b.payload.map((p) => `${p.label} ${f.mass(p.massKg)}`).join(', ')}`);
    lines.push(`Modifications: ${mods.length ? mods.join('; ') : 'none'}`);
  }
  return lines;
}

/** A heading on the ground in degrees, counter-clockwise from the terrain's x axis (0–360°, to 0.1°). */
function headingDeg(rad: number): string {
  const d = ((rad / DEG) % 360 + 360) % 360;
  return `${d.toFixed(1) === '360.0' ? '0.0' : d.toFixed(1)}°`;
}

/**
 * The worst heading on the scenario's ground, in words: where, the ground there (slope from
 * level), the extra tilt to the tip and to the first lift (more than the ground here, and from
 * level), and the force-angle margin standing there. Null when the card has no ground sweep.
 */
export function groundLines(c: CardData): string[] | null {
  const g = c.ground;
  if (!g) return null;
  const u = c.units;
  const slope = g.ground.slopeRad;
  const uneven = g.ground.rmsM >= 0.005;
  const out: string[] = [];
  out.push(
    `At the vehicle's spot on the scenario's ground (x ${lengthText(g.xM, u)}, y ${lengthText(g.yM, u)}), turned through every heading ${angleText(c.headingStepRad)} apart. ` +
      `The ground there is ${angleText(slope)} from level${uneven ? ` (uneven: ${shortText(g.ground.rmsM, u)} rms off a plane fitted within ${distanceText(g.ground.radiusM, u)}, so "from level" is an estimate)` : ''}.`,
  );
  const w = g.worst;
  if (!w) {
    out.push('No heading could be solved here: no worst heading to print.');
    return out;
  }
  const where = `Worst heading ${headingDeg(w.headingRad)} (from the terrain's x axis, counter-clockwise; downhill: ${downhillWords(w.downhillRad)})`;
  if (!w.stands) {
    out.push(`${where}: it does not stand there at all.`);
  } else {
    const tip = w.tip
      ? `it tips after ${angleText(w.tip.extraRad)} more than the ground here (a slope of ${angleText(w.tip.extraRad + slope)} from level${w.tip.edge.length ? `, over ${w.tip.edge.join('–')}` : ''})`
      : `no tip up to ${angleText(HEADING_MAX_EXTRA_RAD)} more than the ground here`;
    const lift = w.firstLift ? `; ${w.firstLift.wheel} lifts after ${angleText(w.firstLift.extraRad)} more (${angleText(w.firstLift.extraRad + slope)} from level)` : '';
    out.push(`${where}: ${tip}${lift}. Force-angle margin standing there: ${angleText(w.forceAngleRad)}.`);
  }
  if (g.unsolved.length > 0) out.push(`Not solved, left out of the worst (the solver did not settle; not a tip): ${g.unsolved.map((h) => headingDeg(h.headingRad)).join(', ')}.`);
  return out;
}

/** Top view of the vehicle with the slope from level at which it tips on each side (SVG). */
function diagram(c: CardData): string {
  const f = fmt(c.units);
  const d = (n: CardinalName) => c.directions.find((x) => x.name === n)!;
  const t = (n: CardinalName) => (d(n).tip ? f.deg(d(n).tip!.angleRad) : '> 89°');
  const l = (n: CardinalName) => (d(n).lift ? f.deg(d(n).lift!.angleRad) : '–');
  // Nose up the page; left side on the left.
  return `<svg viewBox="0 0 240 200" style="width:46mm;height:38mm;flex:none" role="img" aria-label="Tip and lift slopes by side">
<rect x="95" y="45" width="50" height="110" rx="8" fill="#eef1f4" stroke="#000"/>
<path d="M120 52 l-10 14 h20 z" fill="#000"/>
<text x="120" y="16" text-anchor="middle" font-size="16" font-weight="700">${esc(t('noseDown'))}</text>
<text x="120" y="32" text-anchor="middle" font-size="13">lifts ${esc(l('noseDown'))}</text>
<text x="120" y="176" text-anchor="middle" font-size="16" font-weight="700">${esc(t('tailDown'))}</text>
<text x="120" y="193" text-anchor="middle" font-size="13">lifts ${esc(l('tailDown'))}</text>
<text x="46" y="96" text-anchor="middle" font-size="16" font-weight="700">${esc(t('leftDown'))}</text>
<text x="46" y="113" text-anchor="middle" font-size="13">lifts ${esc(l('leftDown'))}</text>
<text x="194" y="96" text-anchor="middle" font-size="16" font-weight="700">${esc(t('rightDown'))}</text>
<text x="194" y="113" text-anchor="middle" font-size="13">lifts ${esc(l('rightDown'))}</text>
</svg>`;
}

const CSS = `
@page { margin: 12mm; }
* { box-sizing: border-box; }
html, body { margin: 0; padding: 0; }
body { font: 10pt/1.35 system-ui, -apple-system, 'Segoe UI', Roboto, sans-serif; color: #000; background: #fff; }
.card { width: 186mm; height: 250mm; overflow: hidden; border: 1.5pt solid #000; padding: 5mm 7mm; margin: 0 auto; display: flex; flex-direction: column; gap: 1.5mm; break-inside: avoid; page-break-inside: avoid; }
.card + .card { break-before: page; page-break-before: always; }
@media screen { body { background: #dfe3e8; padding: 8mm 0; } .card { background: #fff; margin-bottom: 8mm; } }
.card h1 { font-size: 15pt; margin: 0; }
.card h2 { font-size: 11pt; margin: 0 0 1mm; border-bottom: 0.8pt solid #000; }
.card .sub { font-size: 10pt; margin: 0; }
.card ul { margin: 0; padding-left: 5mm; }
.card table { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; }
.card th, .card td { border: 0.6pt solid #000; padding: 0.8mm 2mm; text-align: right; }
.card th:first-child, .card td:first-child { text-align: left; }
.card thead th { background: #eee; font-size: 9pt; }
.card td.op { font-weight: 700; font-size: 12pt; }
.card .row { display: flex; gap: 5mm; align-items: center; }
.card .caution { border: 1.2pt solid #000; background: #fff4d6; padding: 1.5mm 3mm; font-size: 9pt; }
.card .fine { font-size: 8pt; color: #333; margin: 0; }
.card .ground p { margin: 0 0 0.8mm; }
.card .ground p.worst { font-size: 9.5pt; font-weight: 700; }
.card .foot { margin-top: auto; display: flex; justify-content: space-between; font-size: 8pt; color: #333; }
`;

/** The vehicle's name without the configuration's (a build's vehicle is named "base (build)"; the next line names the build). */
function baseName(c: CardData): string {
  const tail = ` (${c.configName})`;
  return c.vehicle.name.endsWith(tail) ? c.vehicle.name.slice(0, -tail.length) : c.vehicle.name;
}

function groundBlock(c: CardData): string {
  const lines = groundLines(c);
  if (!lines) return '';
  return `<div class="ground" data-testid="card-worst-heading"><h2>On this ground: the worst heading</h2>${lines.map((l, i) => `<p class="${i === 1 ? 'worst' : 'fine'}">${esc(l)}</p>`).join('')}</div>`;
}

function cardHtml(c: CardData, opts: { readonly dateText: string; readonly toolVersion: string; readonly fileName?: string }): string {
  const f = fmt(c.units);
  const rows = c.directions
    .map(
      (d) =>
        `<tr><td>${esc(d.words)}</td><td>${d.lift ? `${f.deg(d.lift.angleRad)} <small>(${esc(d.lift.wheel)} first)</small>` : 'none before the tip'}</td><td>${d.tip ? f.deg(d.tip.angleRad) : 'none up to 89°'}</td><td>${d.slideRad === null ? 'holds to the tip' : f.deg(d.slideRad)}</td><td class="op">${f.deg(d.operatingRad)}</td></tr>`,
    )
    .join('');
  const items = c.vehicle.payload.length
    ? c.vehicle.payload.map((p) => `${esc(p.label)} ${f.mass(p.massKg)} at ${f.len(p.heightM)} up`).join('; ')
    : 'none';
  return `<section class="card" data-testid="limit-card" data-config="${esc(c.configName)}">
<div><h1>Limit card: ${esc(baseName(c))}</h1><p class="sub">Configuration: <b>${esc(c.configName)}</b> · ${esc(c.scenarioName)}</p></div>
<div><h2>The build</h2><ul>${buildLines(c).map((l) => `<li>${esc(l)}</li>`).join('')}</ul></div>
<div><h2>Load assumed</h2><p class="sub">Payload ${f.mass(c.payloadKg)}, of which on the roof ${f.mass(c.roofLoadKg)} (items at or above the ${f.len(c.vehicle.body.roofHeightM)} roof line): ${items}. Fuel, passengers and gear not listed here are not counted.</p></div>
<div><h2>Slope from level at which it lifts a wheel and tips</h2>
<div class="row">${diagram(c)}<p class="fine">Measured as a tilt table measures it (SAE J2180 / ISO 16333 style): the vehicle standing on firm, level-surfaced ground tilted slowly; the angle is the slope of that ground from level. Large, bold: where it tips; small: where the first wheel lifts. Slides: where the grip it needs passes ${c.friction.toFixed(2)} (the scenario's ground).</p></div>
<table><thead><tr><th>Downhill side</th><th>A wheel lifts at</th><th>Tips at</th><th>Slides at (grip ${c.friction.toFixed(2)})</th><th>Operating line</th></tr></thead><tbody>${rows}</tbody></table>
<p class="fine">Operating line: ${Math.round(c.operatingFraction * 100)} % of the slope at which the first wheel lifts, and never more than ${OPERATING_CAP_DEG}° (common practice, not a published ratio: makers of utility vehicles commonly print about ${OPERATING_CAP_DEG}° as the maximum slope). Angles to 0.1°: the method tells no finer.</p></div>
${groundBlock(c)}
<div class="caution"><b>Caution.</b> ${esc(CARD_CAUTION)}</div>
<div class="foot"><span>Plumbline ${esc(opts.toolVersion)}${opts.fileName ? ` · ${esc(opts.fileName)}` : ''}</span><span>Printed ${esc(opts.dateText)}</span></div>
</section>`;
}

/** The cards as one self-contained HTML document, one printed page per card. */
export function renderCardsHtml(cards: readonly CardData[], opts: { readonly dateText: string; readonly toolVersion: string; readonly fileName?: string }): string {
  const title = cards.length ? `Limit card: ${cards[0].vehicle.name}` : 'Limit card';
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)}</title><style>${CSS}</style></head><body>${cards.map((c) => cardHtml(c, opts)).join('\n')}</body></html>`;
}
