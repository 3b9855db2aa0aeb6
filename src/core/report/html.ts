/**
 * The report as one self-contained HTML document: inline CSS, inline SVG charts, no scripts, no
 * external address of any kind (fonts are the reader's own), readable offline and printable to
 * PDF on A4 or Letter (the page size is left to the printer; content fits the narrower width,
 * and each section starts a new page).
 *
 * The core never reads a clock: the tool version and the date are passed in.
 */
import { WHEEL_NAMES, type TerrainFeature } from '../model/types';
import { RAD_PER_DEG } from '../scenario/units';
import { passHeadlineText, type PassEvent } from '../analysis/pass';
import type { BuildRow, MetricName } from '../analysis/builds';
import { liftAngleOf, tipAngleOf } from '../analysis/rose';
import type { ReportData } from './collect';
import { vehicleDrawing } from './drawing';
import { lineChart, polarChart, WHEEL_STYLES, type ChartEvent, type Series } from './svg';
import { deg3, degHeadline, degRounded, esc, fixed, len, reportUnits, round4, type ReportUnits } from './text';

export interface ReportMeta {
  /** Plumbline version (package.json). */
  readonly toolVersion: string;
  /** Date of the run, as text (the caller's clock; the core reads none), e.g. "2025-06-01". */
  readonly dateText: string;
  /** Name of the scenario file, shown in the header. @default none */
  readonly fileName?: string;
  /**
   * A picture of the 3D view (the web app's canvas) as a `data:image/png;base64,…` or
   * `data:image/jpeg;base64,…` URL, shown in its own section; anything else is left out, so the
   * report never refers to an outside address. @default none
   */
  readonly sceneImageDataUrl?: string;
}

/** A data: URL of a PNG or JPEG image in base64 (nothing that could load from elsewhere). */
const SCENE_IMAGE_URL = /^data:image\/(?:png|jpeg);base64,[A-Za-z0-9+/]+=*$/;

function sceneImageSection(url: string): string {
  return (
    '<section id="scene-view"><h2>The 3D view</h2>' +
    '<p>The web app\'s 3D view as it was on screen when this report was made (it may show another pose than the drawing below).</p>' +
    `<figure><img src="${url}" alt="The 3D view of the vehicle on the terrain" style="max-width:100%;height:auto;border:0.5pt solid #888"></figure>` +
    '</section>'
  );
}

/**
 * Slope printed as the maximum in operator manuals of ride-on mowers, utility vehicles and ATVs
 * (10° when towing): common practice, no single published source (docs/REFERENCES "Limits").
 */
export const COMMON_PRACTICE_MAX_SLOPE_DEG = 15;
export const COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG = 10;

/** The caution, the same words at the top and the bottom of every report. */
export const REPORT_CAUTIONS: readonly string[] = [
  'These results are quasi-static estimates: the vehicle is taken to stand still, or crawl so slowly that each position is a standing one, on ground that does not give way.',
  'Real margins are smaller: rough, soft, loose or wet ground, bounce, speed, momentum, steering, braking, wind, load shifting and tyre or suspension wear all reduce them.',
  `Operating limits are a fraction of the static limit. Common practice: makers of utility vehicles, ATVs and ride-on mowers commonly print ${COMMON_PRACTICE_MAX_SLOPE_DEG}° as the maximum slope (${COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG}° when towing), far below the static tip angles shown here. This report uses that ${COMMON_PRACTICE_MAX_SLOPE_DEG}° line as a reference only (common practice, not a published standard).`,
  'Defer to the vehicle maker’s limits, local regulations and licensed or trained practice. Do not use this report to decide that a slope or an obstacle is safe to drive.',
];

const CSS = `
@page { margin: 14mm 12mm; }
* { box-sizing: border-box; }
body { font-family: "Helvetica Neue", Arial, sans-serif; font-size: 10pt; color: #000; background: #fff; margin: 0 auto; max-width: 184mm; padding: 6mm 0; line-height: 1.35; }
h1 { font-size: 17pt; margin: 0 0 2mm; }
h2 { font-size: 13pt; margin: 0 0 2mm; border-bottom: 1.2pt solid #000; padding-bottom: 1mm; }
h3 { font-size: 10.5pt; margin: 3mm 0 1mm; }
p { margin: 1mm 0 2mm; }
section { break-before: page; page-break-before: always; }
section.first { break-before: auto; page-break-before: auto; }
.caution { border: 1.6pt solid #000; padding: 2mm 3mm; margin: 3mm 0; break-inside: avoid; page-break-inside: avoid; }
.caution h2 { border: none; margin: 0 0 1mm; font-size: 11pt; }
.caution ul { margin: 0; padding-left: 5mm; }
table { border-collapse: collapse; margin: 1mm 0 3mm; break-inside: avoid; page-break-inside: avoid; }
th, td { border: 0.5pt solid #888; padding: 0.6mm 1.6mm; text-align: left; vertical-align: top; }
th { background: #eee; font-weight: 600; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.kv th { width: 48mm; }
.headline { font-size: 11pt; }
.meta { color: #333; }
.small { font-size: 8.5pt; color: #333; }
figure { margin: 2mm 0 4mm; break-inside: avoid; page-break-inside: avoid; }
figcaption { font-size: 8.5pt; color: #333; }
svg.chart { max-width: 100%; height: auto; display: block; }
svg .ct { font-size: 11px; font-weight: 600; }
svg .tk { font-size: 9px; }
svg .ev { font-size: 8.5px; }
@media print { body { padding: 0; max-width: none; } a { color: #000; text-decoration: none; } }
`;

function table(headers: readonly string[], rows: readonly (readonly string[])[], numeric: readonly boolean[] = []): string {
  const th = headers.map((h) => `<th>${esc(h)}</th>`).join('');
  const tr = rows
    .map((r) => `<tr>${r.map((c, j) => `<td${numeric[j] ? ' class="n"' : ''}>${esc(c)}</td>`).join('')}</tr>`)
    .join('');
  return `<table><thead><tr>${th}</tr></thead><tbody>${tr}</tbody></table>`;
}

function kv(pairs: readonly (readonly [string, string])[]): string {
  return `<table class="kv"><tbody>${pairs.map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`).join('')}</tbody></table>`;
}

function cautionBox(where: string): string {
  return `<div class="caution" id="caution-${where}"><h2>Caution</h2><ul>${REPORT_CAUTIONS.map((c) => `<li>${esc(c)}</li>`).join('')}</ul></div>`;
}

const mm = (u: ReportUnits, m: number) => `${fixed(u.shortLengthOf(m), u.shortLength === 'mm' ? 0 : 1)} ${u.shortLength}`;
const range = (u: ReportUnits, r: readonly [number, number] | null) => (r ? `${len(u, r[0])} to ${len(u, r[1])}` : 'unbounded');
const deg2 = (rad: number) => `${fixed(rad / RAD_PER_DEG, 2)}°`;

function featureRow(u: ReportUnits, f: TerrainFeature, i: number): string[] {
  switch (f.type) {
    case 'plane':
      return [String(i + 1), 'plane', `grade ${deg2(f.gradeRad)} (rises toward +x), cross slope ${deg2(f.crossSlopeRad)} (rises toward +y), height ${len(u, f.heightM)} at the origin`];
    case 'step':
      return [String(i + 1), 'step (ledge)', `at x = ${len(u, f.xM)}, ${f.heightM >= 0 ? 'up' : 'down'} ${len(u, Math.abs(f.heightM))}, across y ${range(u, f.yRangeM)}, edge radius ${len(u, f.edgeRadiusM)}`];
    case 'block':
      return [String(i + 1), f.heightM >= 0 ? 'block' : 'pit', `x ${range(u, f.xRangeM)}, y ${range(u, f.yRangeM)}, height ${len(u, f.heightM)}, edge radius ${len(u, f.edgeRadiusM)}`];
    case 'rock':
      return [String(i + 1), 'rock', `centre (${len(u, f.xM)}, ${len(u, f.yM)}), height ${len(u, f.heightM)}, footprint radius ${len(u, f.radiusM)}`];
    case 'ramp':
      return [String(i + 1), 'ramp', `from x = ${len(u, f.xM)}, ${deg2(f.angleRad)} over ${len(u, f.lengthM)} along its surface, across y ${range(u, f.yRangeM)}`];
    case 'profile': {
      const zs = f.points.map((p) => p[1]);
      return [
        String(i + 1),
        'profile',
        `${f.points.length} points along ${f.axis} from ${len(u, f.points[0][0])} to ${len(u, f.points[f.points.length - 1][0])}, heights ${len(u, Math.min(...zs))} to ${len(u, Math.max(...zs))}, across ${range(u, f.acrossM)}`,
      ];
    }
    case 'grid': {
      let lo = Infinity, hi = -Infinity;
      for (let k = 0; k < f.heightsM.length; k++) {
        lo = Math.min(lo, f.heightsM[k]);
        hi = Math.max(hi, f.heightsM[k]);
      }
      return [
        String(i + 1),
        'height grid',
        `${f.cols} × ${f.rows} nodes at ${len(u, f.spacingM)} from (${len(u, f.originM[0])}, ${len(u, f.originM[1])}), heights ${len(u, lo)} to ${len(u, hi)}`,
      ];
    }
  }
}

function scenarioSection(d: ReportData, u: ReportUnits): string {
  const s = d.scenario;
  const v = s.vehicle;
  const out: string[] = [];
  out.push('<section id="scenario"><h2>The scenario</h2>');
  out.push(`<p class="small">Units: ${s.units === 'imperial' ? 'imperial (in, lb, lbf, lbf/in, lbf·ft/deg)' : 'metric (m, mm, kg, N, N/m, N·m/deg)'}; angles in degrees. Positions are behind the front axle, above level ground at ride height, and left of the centre line.</p>`);
  out.push('<h3>Vehicle</h3>');
  const kg = (x: number) => `${fixed(u.kgOf(x), 0)} ${u.mass}`;
  out.push(
    kv([
      ['name', v.name],
      ['wheelbase', len(u, v.wheelbaseM)],
      ['track front / rear', `${len(u, v.trackFrontM)} / ${len(u, v.trackRearM)}`],
      ['mass as weighed (no payload)', kg(v.massKg)],
      ['CG as weighed', `${len(u, v.cg.behindFrontAxleM)} behind the front axle, ${len(u, v.cg.heightM)} high, ${len(u, v.cg.leftOfCentreM)} left of centre`],
      ['unsprung mass front / rear', `${kg(v.unsprungMassFrontKg)} / ${kg(v.unsprungMassRearKg)}`],
      ['total mass with payload', kg(v.massKg + v.payload.reduce((a, p) => a + p.massKg, 0))],
      ['total CG height with payload', len(u, d.cgHeightM)],
    ]),
  );
  out.push('<h3>Tyres and suspension</h3>');
  const axleRow = (name: string, a: typeof v.suspensionFront, t: typeof v.tyreFront) => [
    name,
    a.type,
    `${fixed(u.stiffnessOf(a.wheelRateNPerM), 0)}`,
    mm(u, a.bumpM),
    mm(u, a.droopM),
    fixed(u.rollStiffnessOf(a.antiRollNmPerRad), 0),
    len(u, a.rollCentreHeightM),
    a.springSpacingM === undefined ? '–' : len(u, a.springSpacingM),
    `${len(u, t.radiusM)} × ${mm(u, t.widthM)}`,
    fixed(u.stiffnessOf(t.stiffnessNPerM), 0),
  ];
  out.push(
    table(
      ['axle', 'type', `wheel rate (${u.stiffness})`, 'bump', 'droop', `anti-roll (${u.rollStiffness})`, 'roll centre', 'spring spacing', 'tyre radius × width', `tyre stiffness (${u.stiffness})`],
      [axleRow('front', v.suspensionFront, v.tyreFront), axleRow('rear', v.suspensionRear, v.tyreRear)],
      [false, false, true, true, true, true, true, true, true, true],
    ),
  );
  out.push('<h3>Payload</h3>');
  out.push(
    v.payload.length === 0
      ? '<p>None.</p>'
      : table(
          ['item', `mass (${u.mass})`, 'behind front axle', 'height', 'left of centre'],
          v.payload.map((p) => [p.label, fixed(u.kgOf(p.massKg), 0), len(u, p.behindFrontAxleM), len(u, p.heightM), len(u, p.leftOfCentreM)]),
          [false, true, true, true, true],
        ),
  );
  const b = v.body;
  out.push('<h3>Body outline</h3>');
  out.push(
    kv([
      ['overhang front / rear', `${len(u, b.frontOverhangM)} / ${len(u, b.rearOverhangM)}`],
      ['width', len(u, b.widthM)],
      ['belly clearance', len(u, b.bellyClearanceM)],
      ['bumper clearance front / rear', `${len(u, b.frontBumperClearanceM)} / ${len(u, b.rearBumperClearanceM)}`],
      ['roof height', len(u, b.roofHeightM)],
    ]),
  );
  if (d.builds) {
    out.push('<h3>Build options</h3>');
    out.push(table(['build', 'modifications as modelled'], d.builds.map((r) => [r.name, r.changes.join('; ')])));
  }
  out.push('<h3>Terrain</h3>');
  out.push(
    s.terrain.features.length === 0
      ? '<p>Level ground.</p>'
      : table(['#', 'feature', 'description'], s.terrain.features.map((f, i) => featureRow(u, f, i))),
  );
  const p = s.path;
  out.push(
    kv([
      ['pose', `x ${len(u, s.pose.xM)}, y ${len(u, s.pose.yM)}, heading ${deg2(s.pose.headingRad)}`],
      ['tilt table', s.tilt.angleRad === 0 ? 'none' : `${deg2(s.tilt.angleRad)}, downhill ${deg2(s.tilt.downhillRad)} (0 nose, 90 left, 180 tail, 270 right)`],
      ['obstacle pass path', p ? `from (${len(u, p.fromM[0])}, ${len(u, p.fromM[1])}) to (${len(u, p.toM[0])}, ${len(u, p.toM[1])}) every ${len(u, p.stepM)}, heading ${p.headingRad === null ? 'along the path' : deg2(p.headingRad)}` : 'none'],
      ['ground friction coefficient', fixed(s.friction, 2)],
    ]),
  );
  if (s.notes) out.push(`<h3>Notes</h3><p>${esc(s.notes)}</p>`);
  out.push('</section>');
  return out.join('');
}

function liftText(t: ReportData['tilts'][number]): string {
  const r = t.result;
  return r.firstLift ? `${r.firstLift.wheel} at ${degHeadline(r.firstLift.angleRad)}` : 'none before the tip';
}

function tipText(t: ReportData['tilts'][number]): string {
  const r = t.result;
  return r.tip ? `${degHeadline(r.tip.angleRad)} over ${r.tip.edge.join('–')}` : 'no tip up to 89°';
}

function summarySection(d: ReportData, u: ReportUnits, meta: ReportMeta): string {
  const s = d.scenario;
  const out: string[] = [];
  out.push('<section class="first" id="summary">');
  out.push(`<h1>Stability report: ${esc(s.name)}</h1>`);
  out.push(
    `<p class="meta">Vehicle: <b>${esc(s.vehicle.name)}</b>${meta.fileName ? ` · scenario file ${esc(meta.fileName)}` : ''} · Plumbline ${esc(meta.toolVersion)} · ${esc(meta.dateText)}</p>`,
  );
  out.push(cautionBox('top'));
  out.push('<h2>Headline</h2>');
  const pose = d.pose;
  const pairs: [string, string][] = [
    ['Static Stability Factor T/(2h)', `${fixed(d.ssf, 3)} (mean track ${len(u, d.trackMeanM)}, CG height with payload ${len(u, d.cgHeightM)})`],
    ['At the scenario pose', `${pose.status}: ${pose.reason}`],
  ];
  if (pose.status === 'converged') {
    pairs.push([
      'Tyre loads at the scenario pose',
      pose.wheels.map((w) => `${w.name} ${fixed(u.forceOf(w.loadN), 0)} ${u.force}${w.lifted ? ' (lifted)' : ''}`).join(', '),
    ]);
    pairs.push(['Force-angle margin at the pose', `${degRounded(pose.margins.forceAngleRad, 2)}° (weakest edge ${pose.margins.weakestEdgeWheels.join('–') || 'none'})`]);
    pairs.push(['Energy margin at the pose', len(u, pose.margins.energyM)]);
  }
  out.push(`<div class="headline">${kv(pairs)}</div>`);
  out.push('<h3>Tilt table at the scenario pose: first wheel lift and tip</h3>');
  out.push(
    table(
      ['downhill', 'first wheel to lift', 'tips at', 'slides at (friction ' + fixed(s.friction, 2) + ')'],
      d.tilts.map((t) => [t.label, liftText(t), tipText(t), t.result.slide ? degHeadline(t.result.slide.angleRad) : 'no slide before the tip']),
    ),
  );
  out.push(
    `<p class="small">Tilt-table sweep as in SAE J2180 and ISO 16333 (raise slowly, note the angle at which a wheel lifts and the angle of no equilibrium), from the scenario tilt${s.tilt.angleRad ? ` (${deg2(s.tilt.angleRad)})` : ''}, on the scenario terrain, to 0.01°. Angles are the tilt of the table, not of the ground under the vehicle when the terrain itself slopes.</p>`,
  );
  const maxA = d.rose.maxAngleRad;
  const weak = d.rose.weakest;
  const weakTip = tipAngleOf(weak, maxA);
  out.push(
    kv([
      ['Weakest direction (rose, level tilt table)', `tips at ${weak.tip ? `${deg3(weak.tip.angleRad)}°` : 'no tip up to 89°'} with downhill ${deg3(weak.downhillRad)}° (0 nose, 90 left, 180 tail, 270 right)`],
      ['Common-practice operating line', `${COMMON_PRACTICE_MAX_SLOPE_DEG}° is ${fixed((100 * COMMON_PRACTICE_MAX_SLOPE_DEG * RAD_PER_DEG) / weakTip, 0)} % of the weakest static tip angle (common practice, see the caution)`],
    ]),
  );
  if (d.pass) out.push(passHeadline(d, u));
  out.push('</section>');
  return out.join('');
}

function passHeadline(d: ReportData, u: ReportUnits): string {
  const p = d.pass!;
  // Distances and angles written as the pass command's JSON gives them.
  const at = (x: number) => `${round4(x)} m`;
  const pairs: [string, string][] = [
    ['Stations', `${p.stations.length} of ${p.plannedStations} planned`],
    ['First wheel to go light', p.firstUnload ? `${p.firstUnload.wheel} at ${at(p.firstUnload.distanceM)} (below ${fixed(100 * p.lightShare, 0)} % of its level load)` : 'none'],
    ['First wheel to lift', p.firstLift ? `${p.firstLift.wheel} at ${at(p.firstLift.distanceM)}` : 'none'],
    ['Outcome', passHeadlineText(p, at)],
    ['Tip', p.tip ? `at ${at(p.tip.distanceM)}: ${p.tip.reason}` : 'none'],
    [
      'Smallest force-angle margin',
      p.minMargin ? `${deg3(p.minMargin.forceAngleRad)}° at ${at(p.minMargin.distanceM)} (energy margin there ${len(u, p.minMargin.energyM)})` : '–',
    ],
    ['Smallest underbody clearance', p.minClearance ? `${len(u, p.minClearance.clearanceM)} (${p.minClearance.part}) at ${at(p.minClearance.distanceM)}` : '–'],
  ];
  return `<h3>Obstacle pass</h3>${kv(pairs)}<p class="small">Distances along the path from its start, in m.</p>`;
}

function roseSection(d: ReportData): string {
  const r = d.rose;
  const maxA = r.maxAngleRad;
  const dirs = r.directions.map((x) => x.downhillRad);
  const tipDeg = r.directions.map((x) => (x.tip ? x.tip.angleRad / RAD_PER_DEG : null));
  const liftDeg = r.directions.map((x) => liftAngleOf(x, maxA) / RAD_PER_DEG);
  let top = 0;
  for (const x of r.directions) top = Math.max(top, tipAngleOf(x, maxA) / RAD_PER_DEG);
  const maxDeg = Math.min(90, Math.max(30, Math.ceil(top / 10) * 10));
  const rings = [];
  for (let g = 10; g <= maxDeg; g += 10) rings.push({ deg: g, label: `${g}°` });
  rings.push({ deg: COMMON_PRACTICE_MAX_SLOPE_DEG, label: `${COMMON_PRACTICE_MAX_SLOPE_DEG}° common practice`, strong: true });
  const chart = polarChart(
    [
      { label: 'tips at', directionsRad: dirs, valuesDeg: tipDeg, colour: '#000', dash: '', fill: true },
      { label: 'first wheel lifts at', directionsRad: dirs, valuesDeg: liftDeg, colour: '#1f4e9c', dash: '5 3' },
    ],
    { title: 'Tilt-table angle by downhill direction (from above, nose up)', maxDeg, rings, size: 420 },
  );
  const step = r.directions.length > 1 ? (r.directions[1].downhillRad - r.directions[0].downhillRad) / RAD_PER_DEG : 360;
  return (
    '<section id="rose"><h2>Stability rose</h2>' +
    `<p>A tilt-table sweep for each downhill direction every ${fixed(step, 0)}°, the vehicle on a level tilt table (as the rose command by default: a property of the build, not of the site). The radius is the table angle: solid, the angle of no equilibrium (tip); dashed, the first wheel lift. The dashed black ring is the ${COMMON_PRACTICE_MAX_SLOPE_DEG}° operating line of common practice. A direction with no tip up to 89° is drawn at the outer ring.</p>` +
    `<figure>${chart}<figcaption>Weakest: tips at ${r.weakest.tip ? `${deg3(r.weakest.tip.angleRad)}°` : 'no tip up to 89°'} with downhill ${deg3(r.weakest.downhillRad)}°; earliest lift ${r.weakestLift.firstLift ? `${r.weakestLift.firstLift.wheel} at ${deg3(r.weakestLift.firstLift.angleRad)}° with downhill ${deg3(r.weakestLift.downhillRad)}°` : 'none before the tip'}.</figcaption></figure>` +
    '</section>'
  );
}

function eventText(e: PassEvent): string {
  const who = e.wheel ?? e.part ?? '';
  const what: Record<PassEvent['kind'], string> = {
    light: 'light',
    lifted: 'lifted',
    'full-bump': 'at full bump',
    'full-droop': 'at full droop',
    slide: 'slides: needs more grip than the ground gives',
    contact: 'underbody touches',
    'hang-up': 'hangs up: the body is inside the ground',
    tip: 'tips',
  };
  return `${who ? `${who} ` : ''}${what[e.kind]}`;
}

function passSection(d: ReportData, u: ReportUnits): string {
  const p = d.pass!;
  const xs = p.stations.map((s) => s.distanceM);
  const loads: Series[] = WHEEL_NAMES.map((name, k) => ({
    label: name,
    xs,
    ys: p.stations.map((s) => u.forceOf(s.wheels[k].loadN)),
    colour: WHEEL_STYLES[k].colour,
    dash: WHEEL_STYLES[k].dash,
  }));
  const marks: ChartEvent[] = [];
  if (p.firstUnload) marks.push({ x: p.firstUnload.distanceM, label: `${p.firstUnload.wheel} light` });
  if (p.firstLift) marks.push({ x: p.firstLift.distanceM, label: `${p.firstLift.wheel} lifts` });
  if (p.minMargin) marks.push({ x: p.minMargin.distanceM, label: 'least margin' });
  if (p.tip) marks.push({ x: p.tip.distanceM, label: 'tip' });
  const bands: ChartEvent[] = p.events
    .filter((e) => e.kind === 'lifted' || e.kind === 'contact' || e.kind === 'hang-up')
    .map((e) => ({ x: e.startDistanceM, x1: e.endDistanceM ?? xs[xs.length - 1], label: eventText(e) }));
  const loadChart = lineChart(loads, {
    title: `Tyre loads (${u.force}) along the path`,
    xLabel: 'distance along the path (m)',
    yLabel: `load (${u.force})`,
    events: [...bands, ...marks],
    yInclude: [0],
  });
  const faChart = lineChart(
    [{ label: 'force-angle margin (°)', xs, ys: p.stations.map((s) => s.forceAngleRad / RAD_PER_DEG), colour: '#000', dash: '' }],
    { title: 'Force-angle margin along the path (Papadopoulos & Rey 1996)', xLabel: 'distance along the path (m)', yLabel: 'degrees', events: marks, refLines: [{ y: 0, label: 'tip' }], yInclude: [0] },
  );
  const enChart = lineChart(
    [{ label: `energy margin (${u.shortLength})`, xs, ys: p.stations.map((s) => u.shortLengthOf(s.energyM)), colour: '#1f4e9c', dash: '5 3' }],
    { title: 'Energy margin along the path (Messuri & Klein 1985)', xLabel: 'distance along the path (m)', yLabel: u.shortLength, events: marks, refLines: [{ y: 0, label: 'tip' }], yInclude: [0] },
  );
  const evRows = p.events.map((e) => [
    eventText(e),
    fixed(e.startDistanceM, 2),
    e.endDistanceM === null ? (e.kind === 'tip' ? '–' : 'to the end') : fixed(e.endDistanceM, 2),
  ]);
  return (
    '<section id="pass"><h2>Obstacle pass</h2>' +
    '<p>The vehicle crawls along the scenario path so slowly that each station is a standing pose, each solved from the last. Shaded: a wheel lifted or the underbody touching. Dashed lines: the first light wheel, the first lift, the least margin and the tip.</p>' +
    passHeadline(d, u) +
    `<figure>${loadChart}</figure><figure>${faChart}</figure><figure>${enChart}</figure>` +
    '<h3>Events</h3>' +
    (evRows.length === 0 ? '<p>None.</p>' : table(['event', 'from (m)', 'to (m)'], evRows, [false, true, true])) +
    '</section>'
  );
}

function drawingSection(d: ReportData, u: ReportUnits): string {
  const dr = d.drawing;
  const r = dr.result;
  const svg = vehicleDrawing({
    vehicle: d.scenario.vehicle,
    field: d.field,
    pose: dr.pose,
    result: r,
    caption: `At ${dr.why}.`,
  });
  const rows = r.wheels.map((w) => [
    w.name,
    fixed(u.forceOf(w.loadN), 0),
    fixed(100 * w.loadShare, 0),
    mm(u, w.travelM),
    fixed(100 * w.travelFraction, 0),
    w.lifted ? 'lifted' : '',
  ]);
  return (
    '<section id="drawing"><h2>The vehicle at the key station</h2>' +
    `<p>Orthographic line drawing from the solved pose at ${esc(dr.why)}: the body outline (a box with a flat belly, as given in the scenario), the wheels at their solved centres, the CG and the plumb line from it along gravity, and the ground under the vehicle.</p>` +
    `<figure>${svg}</figure>` +
    table(['wheel', `load (${u.force})`, 'of level load (%)', 'travel (+ bump)', 'travel used (%)', ''], rows, [false, true, true, true, true, false]) +
    `<p class="small">Body roll / pitch to level: ${degRounded(r.body.rollToLevelRad, 2)}° / ${degRounded(r.body.pitchToLevelRad, 2)}°; force-angle margin ${degRounded(r.margins.forceAngleRad, 2)}°; energy margin ${len(u, r.margins.energyM)}.</p>` +
    '</section>'
  );
}

const BUILD_METRICS: readonly (readonly [MetricName, string, 'deg' | 'm' | 'ratio'])[] = [
  ['ssf', 'SSF T/(2h)', 'ratio'],
  ['cgHeightM', 'CG height with payload', 'm'],
  ['trackMeanM', 'mean track', 'm'],
  ['noseDownLiftRad', 'nose down: first lift', 'deg'],
  ['noseDownTipRad', 'nose down: tip', 'deg'],
  ['tailDownLiftRad', 'tail down: first lift', 'deg'],
  ['tailDownTipRad', 'tail down: tip', 'deg'],
  ['leftDownLiftRad', 'left down: first lift', 'deg'],
  ['leftDownTipRad', 'left down: tip', 'deg'],
  ['rightDownLiftRad', 'right down: first lift', 'deg'],
  ['rightDownTipRad', 'right down: tip', 'deg'],
  ['weakestTipRad', 'weakest tip (rose)', 'deg'],
  ['passFirstLiftM', 'pass: first lift at', 'm'],
  ['passTipM', 'pass: tip at', 'm'],
  ['passMinForceAngleRad', 'pass: least force-angle margin', 'deg'],
  ['passMinClearanceM', 'pass: least clearance', 'm'],
];

function buildsSection(rows: readonly BuildRow[], u: ReportUnits): string {
  const val = (kind: 'deg' | 'm' | 'ratio', x: number | null, signed: boolean): string => {
    if (x === null) return '–';
    const sign = signed && x > 0 ? '+' : '';
    if (kind === 'deg') return `${sign}${fixed(x / RAD_PER_DEG, 2)}°`;
    if (kind === 'ratio') return `${sign}${fixed(x, 3)}`;
    return `${sign}${fixed(u.lengthOf(x), u.length === 'm' ? 3 : 1)} ${u.length}`;
  };
  const headers = ['', ...rows.map((r, i) => (i === 0 ? `${r.name} (reference)` : r.name))];
  const body = BUILD_METRICS.map(([k, label, kind]) => [
    label,
    ...rows.map((r, i) => (i === 0 ? val(kind, r.metrics[k], false) : `${val(kind, r.metrics[k], false)} (${val(kind, r.change[k], true)})`)),
  ]);
  return (
    '<section id="builds"><h2>Build comparison</h2>' +
    '<p>Each build on a level tilt table (lift and tip each way, and the rose) and on the scenario path (pass). Changes from the reference build in brackets. How each modification is modelled is listed under the scenario.</p>' +
    table(headers, body, [false, ...rows.map(() => true)]) +
    '</section>'
  );
}

function bandSection(d: ReportData, u: ReportUnits): string {
  const b = d.cgBand!;
  const names: readonly [keyof typeof b.directions, string][] = [
    ['noseDown', 'nose down'],
    ['tailDown', 'tail down'],
    ['leftDown', 'left side down'],
    ['rightDown', 'right side down'],
  ];
  const rows = names.map(([k, label]) => {
    const x = b.directions[k];
    return [label, `${deg2(x.liftRad[0])} to ${deg2(x.liftRad[1])}`, `${deg2(x.tipRad[0])} to ${deg2(x.tipRad[1])}`];
  });
  return (
    '<section id="cg-band"><h2>CG height band</h2>' +
    `<p>The CG height as weighed is known to ± ${len(u, b.toleranceM)}: from ${len(u, b.heightsM[1])} to ${len(u, b.heightsM[0])}. Lift and tip angles on a level tilt table at the high and the low end of that band (high CG first). Measure the CG height by raising one axle (SAE J874 / ISO 10392 practice) to narrow it; labs measuring the same vehicle have disagreed significantly (UMTRI round-robin, SAE 920050).</p>` +
    table(['downhill', 'first lift (high CG to low CG)', 'tip (high CG to low CG)'], rows) +
    '</section>'
  );
}

function methodsSection(meta: ReportMeta): string {
  const items: [string, string][] = [
    [
      'Quasi-static equilibrium',
      'The rigid body on its suspension (solid axles heave and roll, independent corners move alone, travel to stiff stops, anti-roll bars) is solved for force and moment balance at each pose. No speed, no dynamics, no damping, no driver input.',
    ],
    [
      'Radial-spring tyre (Davis 1975)',
      'Each tyre is a fan of radial springs round its tread that compress where the ground intrudes, so it envelops ledges and rocks; calibrated to the stated vertical stiffness on flat ground. Tyre sidewall bulge, lateral compliance and pressure changes are not modelled; the ground does not give way.',
    ],
    [
      'Tilt table (SAE J2180, ISO 16333 procedures)',
      'The whole ground is tilted about a fixed downhill direction in small steps; the first wheel lift, the slide (grip needed above the ground friction) and the tip (no equilibrium) are bracketed and bisected to 0.01°.',
    ],
    [
      'Force-angle margin (Papadopoulos & Rey 1996)',
      'The smallest angle between the net force on the CG and the normal from the CG to each tip edge of the support polygon; zero at the tip. Shown in degrees.',
    ],
    [
      'Energy margin (Messuri & Klein 1985)',
      'The least height the CG must rise to tip over any edge of the support polygon; zero at the tip.',
    ],
    [
      'Static Stability Factor',
      'T/(2h) with the mean track and the CG height with payload (NHTSA rollover ratings; NRC/TRB Special Report 265). A rigid vehicle on a tilt table lifts at tan θ = SSF; suspension compliance lowers it.',
    ],
    [
      'Axle-lift CG height (SAE J874 / ISO 10392 practice)',
      'CG height from the change of axle load when one axle is raised; the result is only as good as the readings, so it is shown as a band.',
    ],
    [
      'Underbody clearance',
      'The body outline is a box with a flat belly and overhangs at bumper height, and axle centre-lines; sills, tanks, steps and axle housings are not drawn, so real gaps are smaller.',
    ],
  ];
  return (
    '<section id="methods"><h2>Methods and their limits</h2>' +
    kv(items) +
    `<p class="small">Produced by Plumbline ${esc(meta.toolVersion)} on ${esc(meta.dateText)}. Every number in this report comes from the scenario as given: a wrong mass, CG or stiffness gives wrong results.</p>` +
    cautionBox('bottom') +
    '</section>'
  );
}

/** The report for collected results: one HTML document as a string. */
export function renderReportHtml(d: ReportData, meta: ReportMeta): string {
  const u = reportUnits(d.scenario.units);
  const parts: string[] = [
    '<!DOCTYPE html>',
    '<html lang="en"><head><meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${esc(`Plumbline report: ${d.scenario.name}`)}</title>`,
    `<style>${CSS}</style>`,
    '</head><body>',
    summarySection(d, u, meta),
    scenarioSection(d, u),
    roseSection(d),
  ];
  if (meta.sceneImageDataUrl && SCENE_IMAGE_URL.test(meta.sceneImageDataUrl)) parts.push(sceneImageSection(meta.sceneImageDataUrl));
  if (d.pass) parts.push(passSection(d, u));
  parts.push(drawingSection(d, u));
  if (d.builds) parts.push(buildsSection(d.builds, u));
  if (d.cgBand) parts.push(bandSection(d, u));
  parts.push(methodsSection(meta));
  parts.push('</body></html>');
  return `${parts.join('\n')}\n`;
}
