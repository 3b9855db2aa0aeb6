/**
 * The report as one self-contained HTML document: inline CSS, inline SVG charts, no scripts, no
 * external address of any kind (fonts are the reader's own), readable offline and printable to
 * PDF on A4 or Letter (the page size is left to the printer; content fits the narrower width).
 *
 * Printing: no forced page breaks (a section starts where it fits, so no page is left nearly
 * empty); a heading is never the last thing on a page (break-after: avoid, and each heading is
 * wrapped with its first block in a `.keep` box that is not split); tables, figures and the
 * caution are kept whole; a long table (the pass events) may run over a page, its header row
 * repeated. The build comparison is a section of its own, under its own title, its table kept with
 * its heading. tests/e2e/reportPrint.test.ts prints it with Chromium and measures the pages.
 *
 * The core never reads a clock: the tool version and the date are passed in.
 */
import { WHEEL_NAMES, type TerrainFeature } from '../core/model/types';
import type { BuildRow } from '../core/analysis/builds';
import { liftAngleOf, tipAngleOf } from '../core/analysis/rose';
import { spareFromRose } from '../core/analysis/spare';
import { pathPoints } from '../core/analysis/pathGeometry';
import { filledPassWords, spareLines } from '../present/words';
import {
  BUILD_METRICS,
  COMMON_PRACTICE_MAX_SLOPE_DEG,
  ENERGY_COLOUR,
  METRICS_NOTE,
  NO_VALUE,
  OF_STATIC_NOTE,
  PASS_END_LABEL,
  RAD_PER_DEG,
  REPORT_CAUTIONS,
  TILT_DATUM_NOTE,
  WHEEL_STYLES,
  angleText,
  buildChangesWords,
  directionText,
  esc,
  eventWhat,
  fixed,
  metricUnit,
  metricValue,
  partWords,
  passEndWords,
  passHeadline as passHeadlineWords,
  percentText,
  quantityText,
  statusWords,
  toDisplay,
  unitSymbol,
  unitsLine,
  type UnitSystem,
} from '../present/index';
import type { ReportData } from './collect';
import { vehicleDrawing } from './drawing';
import { lineChart, polarChart, type ChartEvent, type Series } from './svg';

export { COMMON_PRACTICE_MAX_SLOPE_DEG, COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG, REPORT_CAUTIONS } from '../present/words';

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
  /** Units the report is written in (the app's display units; the CLI's --units). @default the scenario file's */
  readonly units?: UnitSystem;
}

/** A data: URL of a PNG or JPEG image in base64 (nothing that could load from elsewhere). */
const SCENE_IMAGE_URL = /^data:image\/(?:png|jpeg);base64,[A-Za-z0-9+/]+=*$/;

/** A heading kept with the block after it: the pair is never split over two pages. */
function keep(...parts: string[]): string {
  return `<div class="keep">${parts.join('')}</div>`;
}

function sceneImageSection(url: string): string {
  return (
    '<section id="scene-view">' +
    keep(
      '<h2>The 3D view</h2>',
      '<p>The web app\'s 3D view as it was on screen when this report was made (it may show another pose than the drawing of the key station).</p>',
      `<figure><img src="${url}" alt="The 3D view of the vehicle on the terrain" style="max-width:100%;max-height:150mm;height:auto;border:0.5pt solid #888"></figure>`,
    ) +
    '</section>'
  );
}

const CSS = `
@page { margin: 14mm 12mm; }
* { box-sizing: border-box; }
body { font-family: "Helvetica Neue", Arial, sans-serif; font-size: 10pt; color: #000; background: #fff; margin: 0 auto; max-width: 184mm; padding: 6mm 0; line-height: 1.35; }
h1 { font-size: 17pt; margin: 0 0 2mm; }
h2 { font-size: 13pt; margin: 0 0 2mm; border-bottom: 1.2pt solid #000; padding-bottom: 1mm; }
h3 { font-size: 10.5pt; margin: 3mm 0 1mm; }
h1, h2, h3 { break-after: avoid; page-break-after: avoid; }
p { margin: 1mm 0 2mm; orphans: 3; widows: 3; }
section { margin-top: 7mm; }
section.first { margin-top: 0; }
.keep { break-inside: avoid; page-break-inside: avoid; }
.caution { border: 1.6pt solid #000; padding: 2mm 3mm; margin: 3mm 0; break-inside: avoid; page-break-inside: avoid; }
.caution h2 { border: none; margin: 0 0 1mm; font-size: 11pt; }
.caution ul { margin: 0; padding-left: 5mm; }
table { border-collapse: collapse; margin: 1mm 0 3mm; break-inside: avoid; page-break-inside: avoid; }
table.long { break-inside: auto; page-break-inside: auto; }
thead { display: table-header-group; }
tr { break-inside: avoid; page-break-inside: avoid; }
table.compare { width: 100%; table-layout: fixed; font-size: 8.5pt; }
table.compare caption { text-align: left; caption-side: top; font-size: 10pt; }
table.compare col.label { width: 64mm; }
table.compare th, table.compare td { padding: 0.5mm 1.2mm; }
table.compare td.n { white-space: normal; }
table.compare td.words { text-align: left; }
th, td { border: 0.5pt solid #888; padding: 0.6mm 1.6mm; text-align: left; vertical-align: top; }
th { background: #eee; font-weight: 600; }
td.n { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.kv th { width: 48mm; }
.headline { font-size: 11pt; }
.meta { color: #333; }
.small { font-size: 8.5pt; color: #333; }
.warn { font-weight: 600; border-left: 2pt solid #000; padding-left: 2mm; }
figure { margin: 2mm 0 4mm; break-inside: avoid; page-break-inside: avoid; }
figcaption { font-size: 8.5pt; color: #333; }
svg.chart { max-width: 100%; height: auto; display: block; }
figure svg { max-height: 120mm; }
svg .ct { font-size: 11px; font-weight: 600; }
svg .tk { font-size: 9px; }
svg .ev { font-size: 8.5px; }
@media print { body { padding: 0; max-width: none; } a { color: #000; text-decoration: none; } }
`;

/** Rows past which a table may run over a page (its header row repeated): about half an A4 page. */
const LONG_TABLE_ROWS = 24;

function table(headers: readonly string[], rows: readonly (readonly string[])[], numeric: readonly boolean[] = [], attrs = ''): string {
  const th = headers.map((h) => `<th>${esc(h)}</th>`).join('');
  const tr = rows
    .map((r) => `<tr>${r.map((c, j) => `<td${numeric[j] ? ' class="n"' : ''}>${esc(c)}</td>`).join('')}</tr>`)
    .join('');
  const long = rows.length > LONG_TABLE_ROWS ? ' class="long"' : '';
  return `<table${long}${attrs}><thead><tr>${th}</tr></thead><tbody>${tr}</tbody></table>`;
}

function kv(pairs: readonly (readonly [string, string])[]): string {
  return `<table class="kv"><tbody>${pairs.map(([k, v]) => `<tr><th>${esc(k)}</th><td>${esc(v)}</td></tr>`).join('')}</tbody></table>`;
}

function cautionBox(where: string): string {
  return `<div class="caution" id="caution-${where}"><h2>Caution</h2><ul>${REPORT_CAUTIONS.map((c) => `<li>${esc(c)}</li>`).join('')}</ul></div>`;
}

type U = UnitSystem;
const len = (u: U, m: number) => quantityText('length', m, u);
const short = (u: U, m: number | null) => quantityText('short', m, u);
const dist = (u: U, m: number) => quantityText('distance', m, u);
const kg = (u: U, x: number) => quantityText('mass', x, u);
const force = (u: U, n: number | null) => quantityText('force', n, u);
const range = (u: U, r: readonly [number, number] | null) => (r ? `${len(u, r[0])} to ${len(u, r[1])}` : 'unbounded');
/** Angle at 0.1°, a number only (the header or the words around it give the datum). */
const deg = (rad: number | null | undefined) => angleText(rad);

function featureRow(u: U, f: TerrainFeature, i: number): string[] {
  switch (f.type) {
    case 'plane':
      return [String(i + 1), 'plane', `grade ${deg(f.gradeRad)} from level (rises toward +x), cross slope ${deg(f.crossSlopeRad)} from level (rises toward +y), height ${len(u, f.heightM)} at the origin`];
    case 'step':
      return [String(i + 1), 'step (ledge)', `at x = ${len(u, f.xM)}, ${f.heightM >= 0 ? 'up' : 'down'} ${len(u, Math.abs(f.heightM))}, across y ${range(u, f.yRangeM)}, edge radius ${len(u, f.edgeRadiusM)}`];
    case 'block':
      return [String(i + 1), f.heightM >= 0 ? 'block' : 'pit', `x ${range(u, f.xRangeM)}, y ${range(u, f.yRangeM)}, height ${len(u, f.heightM)}, edge radius ${len(u, f.edgeRadiusM)}`];
    case 'rock':
      return [String(i + 1), 'rock', `centre (${len(u, f.xM)}, ${len(u, f.yM)}), height ${len(u, f.heightM)}, footprint radius ${len(u, f.radiusM)}`];
    case 'ramp':
      return [String(i + 1), 'ramp', `from x = ${len(u, f.xM)}, ${deg(f.angleRad)} from level over ${len(u, f.lengthM)} along its surface, across y ${range(u, f.yRangeM)}`];
    case 'profile': {
      // One pass (a profile may have 100 000 points: no spread into Math.min / Math.max).
      let lo = Infinity, hi = -Infinity;
      for (const p of f.points) {
        if (p[1] < lo) lo = p[1];
        if (p[1] > hi) hi = p[1];
      }
      return [
        String(i + 1),
        'profile',
        `${f.points.length} points along ${f.axis} from ${len(u, f.points[0][0])} to ${len(u, f.points[f.points.length - 1][0])}, heights ${len(u, lo)} to ${len(u, hi)}, across ${range(u, f.acrossM)}`,
      ];
    }
    case 'grid': {
      let lo = Infinity, hi = -Infinity;
      for (let k = 0; k < f.heightsM.length; k++) {
        const z = f.heightsM[k];
        if (z < lo) lo = z;
        if (z > hi) hi = z;
      }
      return [
        String(i + 1),
        'height grid',
        `${f.cols} × ${f.rows} nodes at ${len(u, f.spacingM)} from (${len(u, f.originM[0])}, ${len(u, f.originM[1])}), heights ${len(u, lo)} to ${len(u, hi)}`,
      ];
    }
    default:
      return [String(i + 1), String((f as { type: string }).type), ''];
  }
}

function scenarioSection(d: ReportData, u: U): string {
  const s = d.scenario;
  const v = s.vehicle;
  const out: string[] = [];
  out.push('<section id="scenario">');
  out.push('<div class="keep"><h2>The scenario</h2>');
  out.push(`<p class="small">Units: ${esc(unitsLine(u))}; angles in degrees${s.units !== u ? ` (the scenario file is in ${s.units} units)` : ''}. Positions are behind the front axle, above level ground at ride height, and left of the centre line.</p>`);
  out.push('<h3>Vehicle</h3>');
  out.push(
    kv([
      ['name', v.name],
      ['wheelbase', len(u, v.wheelbaseM)],
      ['track front / rear', `${len(u, v.trackFrontM)} / ${len(u, v.trackRearM)}`],
      ['mass as weighed (no payload)', kg(u, v.massKg)],
      ['CG as weighed', `${len(u, v.cg.behindFrontAxleM)} behind the front axle, ${len(u, v.cg.heightM)} high, ${len(u, v.cg.leftOfCentreM)} left of centre`],
      ['unsprung mass front / rear', `${kg(u, v.unsprungMassFrontKg)} / ${kg(u, v.unsprungMassRearKg)}`],
      ['total mass with payload', kg(u, v.massKg + v.payload.reduce((a, p) => a + p.massKg, 0))],
      ['total CG height with payload', len(u, d.cgHeightM)],
    ]),
  );
  out.push('</div><div class="keep"><h3>Tyres and suspension</h3>');
  const stiff = (x: number) => quantityText('stiffness', x, u).replace(` ${unitSymbol('stiffness', u)}`, '');
  const roll = (x: number) => quantityText('rollStiffness', x, u).replace(` ${unitSymbol('rollStiffness', u)}`, '');
  const axleRow = (name: string, a: typeof v.suspensionFront, t: typeof v.tyreFront) => [
    name,
    a.type,
    stiff(a.wheelRateNPerM),
    short(u, a.bumpM),
    short(u, a.droopM),
    roll(a.antiRollNmPerRad),
    len(u, a.rollCentreHeightM),
    a.springSpacingM === undefined ? NO_VALUE : len(u, a.springSpacingM),
    `${len(u, t.radiusM)} × ${short(u, t.widthM)}`,
    stiff(t.stiffnessNPerM),
  ];
  out.push(
    table(
      [
        'axle',
        'type',
        `wheel rate (${unitSymbol('stiffness', u)})`,
        'bump',
        'droop',
        `anti-roll (${unitSymbol('rollStiffness', u)})`,
        'roll centre',
        'spring spacing',
        'tyre radius × width',
        `tyre stiffness (${unitSymbol('stiffness', u)})`,
      ],
      [axleRow('front', v.suspensionFront, v.tyreFront), axleRow('rear', v.suspensionRear, v.tyreRear)],
      [false, false, true, true, true, true, true, true, true, true],
    ),
  );
  out.push('</div><div class="keep"><h3>Payload</h3>');
  out.push(
    v.payload.length === 0
      ? '<p>None.</p>'
      : table(
          ['item', `mass (${unitSymbol('mass', u)})`, 'behind front axle', 'height', 'left of centre'],
          v.payload.map((p) => [p.label, quantityText('mass', p.massKg, u).replace(` ${unitSymbol('mass', u)}`, ''), len(u, p.behindFrontAxleM), len(u, p.heightM), len(u, p.leftOfCentreM)]),
          [false, true, true, true, true],
        ),
  );
  const b = v.body;
  out.push('</div><div class="keep"><h3>Body outline</h3>');
  out.push(
    kv([
      ['overhang front / rear', `${len(u, b.frontOverhangM)} / ${len(u, b.rearOverhangM)}`],
      ['width', len(u, b.widthM)],
      ['belly clearance', len(u, b.bellyClearanceM)],
      ['bumper clearance front / rear', `${len(u, b.frontBumperClearanceM)} / ${len(u, b.rearBumperClearanceM)}`],
      ['roof height', len(u, b.roofHeightM)],
    ]),
  );
  if (d.builds) out.push('<p class="small">The builds compared, and how each modification is modelled: see the build comparison.</p>');
  out.push('</div><div class="keep"><h3>Terrain</h3>');
  out.push(
    s.terrain.features.length === 0
      ? '<p>Level ground.</p>'
      : table(['#', 'feature', 'description'], s.terrain.features.map((f, i) => featureRow(u, f, i))),
  );
  out.push('</div>');
  const p = s.path;
  out.push(
    kv([
      ['pose', `x ${len(u, s.pose.xM)}, y ${len(u, s.pose.yM)}, heading ${deg(s.pose.headingRad)}`],
      ['tilt table', s.tilt.angleRad === 0 ? 'none' : `${deg(s.tilt.angleRad)} from level, downhill ${directionText(s.tilt.downhillRad)} (0 nose, 90 left, 180 tail, 270 right)`],
      ['obstacle pass path', p ? `${p.viaM && p.viaM.length > 0 ? 'through' : 'from'} ${pathPoints(p).map((q) => `(${len(u, q[0])}, ${len(u, q[1])})`).join(p.viaM && p.viaM.length > 0 ? ', ' : ' to ')} every ${dist(u, p.stepM)}, heading ${p.headingRad === null ? 'along the path' : deg(p.headingRad)}` : 'none'],
      ['ground friction coefficient', fixed(s.friction, 2)],
    ]),
  );
  if (s.notes) out.push(keep('<h3>Notes</h3>', `<p>${esc(s.notes)}</p>`));
  out.push('</section>');
  return out.join('');
}

function liftText(t: ReportData['tilts'][number]): string {
  const r = t.result;
  return r.firstLift ? `${r.firstLift.wheel} at ${deg(r.firstLift.angleRad)}` : 'none before the tip';
}

function tipText(t: ReportData['tilts'][number]): string {
  const r = t.result;
  return r.tip ? `${deg(r.tip.angleRad)} over ${r.tip.edge.join('–')}` : 'no tip up to 89°';
}

/** One wheel's load in words: "FL 5.21 kN (118 % of static)", "FL lifted", "FL —" when the pose does not stand. */
function wheelLoadText(u: U, w: { readonly name: string; readonly loadN: number | null; readonly loadShare: number | null; readonly lifted: boolean }): string {
  if (w.lifted) return `${w.name} lifted`;
  return `${w.name} ${force(u, w.loadN)}${w.loadShare === null ? '' : ` (${percentText(w.loadShare)} of static)`}`;
}

function summarySection(d: ReportData, u: U, meta: ReportMeta): string {
  const s = d.scenario;
  const out: string[] = [];
  out.push('<section class="first" id="summary">');
  out.push(`<div class="keep"><h1>Stability report: ${esc(s.name)}</h1>`);
  out.push(
    `<p class="meta">Vehicle: <b>${esc(s.vehicle.name)}</b>${meta.fileName ? ` · scenario file ${esc(meta.fileName)}` : ''} · Plumbline ${esc(meta.toolVersion)} · ${esc(meta.dateText)}</p>`,
  );
  out.push(cautionBox('top'));
  out.push('</div>');
  out.push('<div class="keep"><h2>Headline</h2>');
  const pose = d.pose;
  const pairs: [string, string][] = [
    ['Static Stability Factor T/(2h)', `${fixed(d.ssf, 3)} (mean track ${len(u, d.trackMeanM)}, CG height with payload ${len(u, d.cgHeightM)})`],
    ['At the scenario pose', `${statusWords(pose.status).toLowerCase()}: ${pose.reason}`],
  ];
  if (pose.standing) {
    pairs.push(['Tyre loads at the scenario pose (normal load)', pose.wheels.map((w) => wheelLoadText(u, w)).join(', ')]);
    pairs.push(['Force-angle margin at the pose', `${deg(pose.margins.forceAngleRad)} (angle between the net force and the tip edge ${pose.margins.weakestEdgeWheels.join('–') || 'none'})`]);
    pairs.push(['Energy margin at the pose', `${short(u, pose.margins.energyM)} (how far the CG must rise to tip)`]);
  }
  out.push(`<div class="headline">${kv(pairs)}</div>`);
  if (pose.standing) out.push(`<p class="small">${esc(OF_STATIC_NOTE)}</p>`);
  out.push('</div>');
  out.push('<div class="keep"><h3>Tilt table at the scenario pose: first wheel lift and tip</h3>');
  out.push(
    table(
      ['downhill', 'first wheel to lift (tilt from level)', 'tips at (tilt from level)', 'slides at (friction ' + fixed(s.friction, 2) + ')'],
      d.tilts.map((t) => [t.label, liftText(t), tipText(t), t.result.slide ? deg(t.result.slide.angleRad) : 'no slide before the tip']),
    ),
  );
  out.push(
    `<p class="small">Tilt-table sweep as in SAE J2180 and ISO 16333 (raise slowly, note the angle at which a wheel lifts and the angle of no equilibrium), from the scenario tilt${s.tilt.angleRad ? ` (${deg(s.tilt.angleRad)})` : ''}, on the scenario terrain, bracketed to 0.01° and shown to 0.1°. ${esc(TILT_DATUM_NOTE)}</p></div>`,
  );
  const maxA = d.rose.maxAngleRad;
  const weak = d.rose.weakest;
  const weakTip = tipAngleOf(weak, maxA);
  out.push(
    kv([
      ['Weakest direction (rose, level tilt table)', `tips at ${weak.tip ? `${deg(weak.tip.angleRad)} from level` : 'no tip up to 89°'} with downhill ${directionText(weak.downhillRad)} (0 nose, 90 left, 180 tail, 270 right)`],
      ['Common-practice operating line', `${COMMON_PRACTICE_MAX_SLOPE_DEG}° is ${fixed((100 * COMMON_PRACTICE_MAX_SLOPE_DEG * RAD_PER_DEG) / weakTip, 0)} % of the weakest static tip angle (common practice, see the caution)`],
    ]),
  );
  if (d.pass) out.push(passHeadline(d, u));
  out.push('</section>');
  return out.join('');
}

function passHeadline(d: ReportData, u: U): string {
  const p = d.pass!;
  const pairs: [string, string][] = [
    ['Stations', `${p.stations.length} of ${p.plannedStations} planned`],
    ['First wheel to go light', p.firstUnload ? `${p.firstUnload.wheel} at ${dist(u, p.firstUnload.distanceM)} (below ${percentText(p.lightShare)} of static)` : 'none'],
    ['First wheel to lift', p.firstLift ? `${p.firstLift.wheel} at ${dist(u, p.firstLift.distanceM)}` : 'none'],
    ['Tip', p.tip ? `at ${dist(u, p.tip.distanceM)}: ${p.tip.reason}` : 'none'],
    ['Hangs up', p.hangUp ? `on the ${partWords(p.hangUp.part)} at ${dist(u, p.hangUp.distanceM)} (the body ${short(u, p.hangUp.depthM)} inside the ground)` : 'none'],
    ['Slides', p.firstSlide ? `${p.firstSlide.wheel} at ${dist(u, p.firstSlide.distanceM)} (needs grip ${fixed(p.firstSlide.frictionDemand, 2)} on ground of ${fixed(p.friction, 2)})` : 'none'],
    [
      'Smallest force-angle margin',
      p.minMargin ? `${deg(p.minMargin.forceAngleRad)} at ${dist(u, p.minMargin.distanceM)} (energy margin there ${short(u, p.minMargin.energyM)})` : NO_VALUE,
    ],
    ['Smallest underbody gap', p.minClearance ? `${short(u, p.minClearance.clearanceM)} (${partWords(p.minClearance.part)}) at ${dist(u, p.minClearance.distanceM)}` : NO_VALUE],
  ];
  const filledNote = filledPassWords(p, u);
  return keep(
    `<h3>Obstacle pass</h3><p class="headline" id="pass-headline">${esc(passHeadlineWords(p, u))}</p>${kv(pairs)}`,
    `${filledNote ? `<p class="warn" id="pass-filled">${esc(filledNote)}</p>` : ''}<p class="small">Distances along the path from its start, in ${unitSymbol('distance', u)}.</p>`,
  );
}

function roseSection(d: ReportData): string {
  const r = d.rose;
  const maxA = r.maxAngleRad;
  const dirs = r.directions.map((x) => x.downhillRad);
  const tipDeg = r.directions.map((x) => (x.tip ? toDisplay('angle', x.tip.angleRad, 'metric') : null));
  const liftDeg = r.directions.map((x) => toDisplay('angle', liftAngleOf(x, maxA), 'metric'));
  let top = 0;
  for (const x of r.directions) top = Math.max(top, toDisplay('angle', tipAngleOf(x, maxA), 'metric'));
  const maxDeg = Math.min(90, Math.max(30, Math.ceil(top / 10) * 10));
  const rings = [];
  for (let g = 10; g <= maxDeg; g += 10) rings.push({ deg: g, label: `${g}°` });
  rings.push({ deg: COMMON_PRACTICE_MAX_SLOPE_DEG, label: `${COMMON_PRACTICE_MAX_SLOPE_DEG}° common practice`, strong: true });
  const chart = polarChart(
    [
      { label: 'tips at', directionsRad: dirs, valuesDeg: tipDeg, colour: '#000', dash: '', fill: true },
      { label: 'first wheel lifts at', directionsRad: dirs, valuesDeg: liftDeg, colour: WHEEL_STYLES[0].colour, dash: '5 3' },
    ],
    { title: 'Tilt-table angle from level by downhill direction (from above, nose up)', maxDeg, rings, size: 420 },
  );
  const step = r.directions.length > 1 ? r.directions[1].downhillRad - r.directions[0].downhillRad : 2 * Math.PI;
  return (
    '<section id="rose"><div class="keep"><h2>Stability rose</h2>' +
    `<p>A tilt-table sweep for each downhill direction every ${directionText(step)}, the vehicle on a level tilt table (as the rose command by default: a property of the build, not of the site). The radius is the table's tilt from level: solid, the angle of no equilibrium (tip); dashed, the first wheel lift. The dashed black ring is the ${COMMON_PRACTICE_MAX_SLOPE_DEG}° operating line of common practice. A direction with no tip up to 89° is drawn at the outer ring.</p>` +
    `<ul class="spare" id="slope-to-spare">${spareLines(spareFromRose(r)).map((l) => `<li>${esc(l)}</li>`).join('')}</ul></div>` +
    `<figure>${chart}<figcaption>Weakest: tips at ${r.weakest.tip ? deg(r.weakest.tip.angleRad) : 'no tip up to 89°'} from level with downhill ${directionText(r.weakest.downhillRad)}; earliest lift ${r.weakestLift.firstLift ? `${r.weakestLift.firstLift.wheel} at ${deg(r.weakestLift.firstLift.angleRad)} from level with downhill ${directionText(r.weakestLift.downhillRad)}` : 'none before the tip'}.</figcaption></figure>` +
    '</section>'
  );
}

function passSection(d: ReportData, u: U): string {
  const p = d.pass!;
  const du = unitSymbol('distance', u);
  const xs = p.stations.map((s) => toDisplay('distance', s.distanceM, u));
  const at = (m: number) => toDisplay('distance', m, u);
  const loads: Series[] = WHEEL_NAMES.map((name, k) => ({
    label: name,
    xs,
    ys: p.stations.map((s) => {
      const l = s.wheels[k].loadN as number | null;
      return l === null ? NaN : toDisplay('force', l, u);
    }),
    colour: WHEEL_STYLES[k].colour,
    dash: WHEEL_STYLES[k].dash,
  }));
  const marks: ChartEvent[] = [];
  if (p.firstUnload) marks.push({ x: at(p.firstUnload.distanceM), label: `${p.firstUnload.wheel} light` });
  if (p.firstLift) marks.push({ x: at(p.firstLift.distanceM), label: `${p.firstLift.wheel} lifts` });
  if (p.minMargin) marks.push({ x: at(p.minMargin.distanceM), label: 'least margin' });
  if (p.tip) marks.push({ x: at(p.tip.distanceM), label: 'tip' });
  const lastX = xs.length > 0 ? xs[xs.length - 1] : 0;
  const bands: ChartEvent[] = p.events
    .filter((e) => e.kind === 'lifted' || e.kind === 'contact' || e.kind === 'hang-up')
    .map((e) => ({ x: at(e.startDistanceM), x1: e.endDistanceM === null ? lastX : at(e.endDistanceM), label: eventWhat(e) }));
  const fu = unitSymbol('force', u);
  const su = unitSymbol('short', u);
  const loadChart = lineChart(loads, {
    title: `Normal load per tyre (${fu}) along the path`,
    xLabel: `distance along the path (${du})`,
    yLabel: `load (${fu})`,
    events: [...bands, ...marks],
    yInclude: [0],
  });
  const faChart = lineChart(
    [{ label: 'force-angle margin (°)', xs, ys: p.stations.map((s) => toDisplay('angle', s.forceAngleRad, u)), colour: '#000', dash: '' }],
    { title: 'Force-angle margin along the path (Papadopoulos & Rey 1996)', xLabel: `distance along the path (${du})`, yLabel: 'degrees', events: marks, refLines: [{ y: 0, label: 'tip' }], yInclude: [0] },
  );
  const enChart = lineChart(
    [{ label: `energy margin (${su})`, xs, ys: p.stations.map((s) => toDisplay('short', s.energyM, u)), colour: ENERGY_COLOUR, dash: '5 3' }],
    { title: 'Energy margin along the path: CG rise to tip (Messuri & Klein 1985)', xLabel: `distance along the path (${du})`, yLabel: su, events: marks, refLines: [{ y: 0, label: 'tip' }], yInclude: [0] },
  );
  const evRows = p.events.map((e) => [
    eventWhat(e),
    dist(u, e.startDistanceM).replace(` ${du}`, ''),
    e.endDistanceM === null ? (e.kind === 'tip' ? NO_VALUE : 'to the end') : dist(u, e.endDistanceM).replace(` ${du}`, ''),
  ]);
  return (
    '<section id="pass">' +
    keep(
      '<h2>Obstacle pass</h2>',
      '<p>The vehicle crawls along the scenario path so slowly that each station is a standing pose, each solved from the last. Shaded: a wheel lifted or the underbody touching. Dashed lines: the first light wheel, the first lift, the least margin and the tip.</p>',
      passHeadline(d, u),
    ) +
    `<figure>${loadChart}</figure><figure>${faChart}</figure><figure>${enChart}</figure>` +
    // The heading with the table's first rows (a long table runs on, its header repeated).
    (evRows.length === 0
      ? keep('<h3>Events</h3>', '<p>None.</p>')
      : evRows.length > LONG_TABLE_ROWS
        ? `<h3>Events</h3>${table(['event', `from (${du})`, `to (${du})`], evRows, [false, true, true])}`
        : keep('<h3>Events</h3>', table(['event', `from (${du})`, `to (${du})`], evRows, [false, true, true]))) +
    '</section>'
  );
}

function drawingSection(d: ReportData, u: U): string {
  const dr = d.drawing;
  const r = dr.result;
  const where = dr.station ? `pass station ${dr.station.index} (${dist(u, dr.station.distanceM)} along the path): ${dr.why}` : dr.why;
  const svg = vehicleDrawing({
    vehicle: d.scenario.vehicle,
    field: d.field,
    pose: dr.pose,
    result: r,
    caption: `At ${where}.`,
    units: u,
  });
  const rows = r.wheels.map((w) => {
    const load = w.loadN as number | null;
    const share = w.loadShare as number | null;
    return [
      w.name,
      quantityText('force', load, u).replace(` ${unitSymbol('force', u)}`, ''),
      percentText(share).replace(' %', ''),
      short(u, w.travelM),
      percentText(w.travelFraction).replace(' %', ''),
      w.lifted ? 'lifted' : '',
    ];
  });
  return (
    '<section id="drawing">' +
    keep(
      '<h2>The vehicle at the key station</h2>',
      `<p>Orthographic line drawing from the solved pose at ${esc(where)}: the body outline (a box with a flat belly, as given in the scenario), the wheels at their solved centres, the CG and the plumb line from it along gravity, and the ground under the vehicle.</p>`,
      `<figure>${svg}</figure>`,
    ) +
    table(['wheel', `normal load (${unitSymbol('force', u)})`, 'of static (%)', 'travel (+ bump)', 'travel used (%)', ''], rows, [false, true, true, true, true, false]) +
    `<p class="small">${esc(OF_STATIC_NOTE)} Body roll / pitch from level: ${deg(r.body.rollToLevelRad)} / ${deg(r.body.pitchToLevelRad)}; force-angle margin ${deg(r.margins.forceAngleRad)}; energy margin (CG rise to tip) ${short(u, r.margins.energyM)}.</p>` +
    '</section>'
  );
}

function buildsSection(d: ReportData, rows: readonly BuildRow[], u: U): string {
  const headers = ['', ...rows.map((r, i) => (i === 0 ? `${r.name} (reference)` : r.name))];
  const body = BUILD_METRICS.map((m) => {
    const unit = metricUnit(m.kind, u);
    return [
      unit ? `${m.label} (${unit})` : m.label,
      ...rows.map((r, i) => (i === 0 ? metricValue(m.kind, r.metrics[m.key], u) : `${metricValue(m.kind, r.metrics[m.key], u)} (${metricValue(m.kind, r.change[m.key], u, true)})`)),
    ];
  });
  const th = headers.map((h) => `<th>${esc(h)}</th>`).join('');
  const tr = body.map((r) => `<tr>${r.map((c, j) => `<td${j > 0 ? ' class="n"' : ''}>${esc(c)}</td>`).join('')}</tr>`).join('');
  // The hang-up column: how each build's pass ends, in words (where, on what).
  const ends = rows[0].passEnd
    ? `<tr id="builds-pass-end"><td>${esc(PASS_END_LABEL)}</td>${rows.map((r) => `<td class="words">${esc(passEndWords(r.passEnd, u))}</td>`).join('')}</tr>`
    : '';
  const path = d.scenario.path;
  // The title and its lead-in are the table's caption: part of the table's box, so they print on the
  // page where the table starts (a kept box taller than what is left of a page would be split).
  const caption =
    `<caption><h2>Build comparison: ${esc(d.scenario.vehicle.name)}, ${rows.length} configurations</h2>` +
    `<p>Each build on a level tilt table (lift and tip each way, and the rose)${path ? ' and on the scenario path (the pass: where it goes light, lifts a wheel, hangs up, slips or tips)' : ''}. Changes from the reference build in brackets.</p></caption>`;
  const compare = `<table class="compare" id="builds-table">${caption}<colgroup><col class="label">${rows.map(() => '<col>').join('')}</colgroup><thead><tr>${th}</tr></thead><tbody>${tr}${ends}</tbody></table>`;
  return (
    '<section id="builds">' +
    compare +
    `<p class="small">${esc(METRICS_NOTE)}</p>` +
    keep(
      '<h3>The builds as modelled</h3>',
      table(['build', 'modifications as modelled'], rows.map((r) => [r.name, buildChangesWords(r.changes, u)])),
    ) +
    '</section>'
  );
}

function bandSection(d: ReportData, u: U): string {
  const b = d.cgBand!;
  const names: readonly [keyof typeof b.directions, string][] = [
    ['noseDown', 'nose down'],
    ['tailDown', 'tail down'],
    ['leftDown', 'left side down'],
    ['rightDown', 'right side down'],
  ];
  const rows = names.map(([k, label]) => {
    const x = b.directions[k];
    return [label, `${deg(x.liftRad[0])} to ${deg(x.liftRad[1])}`, `${deg(x.tipRad[0])} to ${deg(x.tipRad[1])}`];
  });
  return (
    '<section id="cg-band"><div class="keep"><h2>CG height band</h2>' +
    `<p>The CG height as weighed is known to ± ${len(u, b.toleranceM)}: from ${len(u, b.heightsM[1])} to ${len(u, b.heightsM[0])}. Lift and tip angles (tilt from level) on a level tilt table at the high and the low end of that band (high CG first). Measure the CG height by raising one axle (SAE J874 / ISO 10392 practice) to narrow it; labs measuring the same vehicle have disagreed significantly (UMTRI round-robin, SAE 920050).</p>` +
    table(['downhill', 'first lift (high CG to low CG)', 'tip (high CG to low CG)'], rows) +
    '</div></section>'
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
    '<section id="methods">' +
    keep('<h2>Methods and their limits</h2>', kv(items.slice(0, 2))) +
    kv(items.slice(2)) +
    `<p class="small">Produced by Plumbline ${esc(meta.toolVersion)} on ${esc(meta.dateText)}. Every number in this report comes from the scenario as given: a wrong mass, CG or stiffness gives wrong results.</p>` +
    cautionBox('bottom') +
    '</section>'
  );
}

/** The report for collected results: one HTML document as a string. */
export function renderReportHtml(d: ReportData, meta: ReportMeta): string {
  const u: U = meta.units ?? d.scenario.units;
  // The results first (headline, the comparison a shop hands over, rose, pass, drawing), then the
  // inputs they come from, the CG band and the methods.
  const parts: string[] = [
    '<!DOCTYPE html>',
    '<html lang="en"><head><meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${esc(`Plumbline report: ${d.scenario.name}`)}</title>`,
    `<style>${CSS}</style>`,
    '</head><body>',
    summarySection(d, u, meta),
  ];
  if (d.builds) parts.push(buildsSection(d, d.builds, u));
  parts.push(roseSection(d));
  if (d.pass) parts.push(passSection(d, u));
  parts.push(drawingSection(d, u));
  if (meta.sceneImageDataUrl && SCENE_IMAGE_URL.test(meta.sceneImageDataUrl)) parts.push(sceneImageSection(meta.sceneImageDataUrl));
  parts.push(scenarioSection(d, u));
  if (d.cgBand) parts.push(bandSection(d, u));
  parts.push(methodsSection(meta));
  parts.push('</body></html>');
  return `${parts.join('\n')}\n`;
}
