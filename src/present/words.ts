/**
 * The words: headlines, event sentences, warnings and the cautions, written once for the app,
 * the command line and the report. Pure: no React, three or DOM. Every angle says its datum;
 * every margin says what it is a margin of; numbers go through units.ts (angles 0.1°, loads
 * 3 significant figures, the reader's units).
 */
import type { SolveResult, SolveStatus } from '../core/model/types';
import { passOutcome, type PassEvent, type PassOutcome, type PassResult } from '../core/analysis/pass';
import type { BuildChange } from '../core/analysis/builds';
import type { FilledGroundSpan } from '../core/analysis/filledGround';
import { SPARE_DATUM, type SlopeToSpare, type SpareDirection } from '../core/analysis/spare';
import { DEG_PER_RAD, NO_VALUE, RAD_PER_DEG, angleText, changeText, distanceText, fixed, lengthText, massText, percentText, quantityText, shortText, toDisplay, type UnitSystem } from './units';

/** Slope printed as the maximum in operator manuals of ride-on mowers, utility vehicles and ATVs
 *  (10° when towing): common practice, no single published source (REFERENCES "Limits"). */
export const COMMON_PRACTICE_MAX_SLOPE_DEG = 15;
export const COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG = 10;

/** The short caution under every result (app panels, CLI human output). */
export const QUASI_STATIC_CAUTION =
  'Caution: quasi-static estimates (a slow crawl, no bounce, no driver input). Real margins are smaller; keep to the vehicle maker\'s limits, local regulations and trained practice.';

/** The app's banner, always on screen (after a bold "Caution:"). */
export const APP_CAUTION =
  "results are quasi-static estimates on rigid ground. Bounce, momentum, soft or crumbling ground, tyre pressure and driver input reduce the real margin. Keep well inside the limits shown, use a spotter, and follow the vehicle maker's limits, local regulations and trained practice.";

/** The full caution, the same words at the top and the bottom of every report. */
export const REPORT_CAUTIONS: readonly string[] = [
  'These results are quasi-static estimates: the vehicle is taken to stand still, or crawl so slowly that each position is a standing one, on ground that does not give way.',
  'Real margins are smaller: rough, soft, loose or wet ground, bounce, speed, momentum, steering, braking, wind, load shifting and tyre or suspension wear all reduce them.',
  `Operating limits are a fraction of the static limit. Common practice: makers of utility vehicles, ATVs and ride-on mowers commonly print ${COMMON_PRACTICE_MAX_SLOPE_DEG}° as the maximum slope (${COMMON_PRACTICE_MAX_SLOPE_TOWING_DEG}° when towing), far below the static tip angles shown here. This report uses that ${COMMON_PRACTICE_MAX_SLOPE_DEG}° line as a reference only (common practice, not a published standard).`,
  'Defer to the vehicle maker’s limits, local regulations and licensed or trained practice. Do not use this report to decide that a slope or an obstacle is safe to drive.',
];

/** Tilt-table angles: the datum, said once under each table or chart that shows them. */
export const TILT_DATUM_NOTE = 'Tilt angles are the table\'s tilt from level (degrees), not the ground\'s slope under the vehicle where the terrain itself slopes.';

/** A solve status in a word or two. */
export function statusWords(status: SolveStatus): string {
  switch (status) {
    case 'converged':
      return 'Balanced';
    case 'tipped':
      return 'Tipped';
    case 'no-contact':
      return 'No contact';
    default:
      return 'Not settled';
  }
}

/** Downhill direction in words (vehicle frame, counter-clockwise from the nose). */
export function downhillWords(downhillRad: number): string {
  const d = (((downhillRad * DEG_PER_RAD) % 360) + 360) % 360;
  const near = (a: number) => Math.abs(((d - a + 540) % 360) - 180) < 1e-6;
  if (near(0)) return 'nose down';
  if (near(90)) return 'left side down';
  if (near(180)) return 'tail down';
  if (near(270)) return 'right side down';
  return `${fixed(d, 0)}° from the nose, counter-clockwise`;
}

const PART_WORDS: Readonly<Record<string, string>> = { belly: 'belly', front: 'front bumper', rear: 'rear bumper', 'front-axle': 'front axle', 'rear-axle': 'rear axle' };

/** An underbody part in words. */
export function partWords(part: string): string {
  return PART_WORDS[part] ?? part;
}

/**
 * The pass headline, once for the app, the CLI and the report: the outcome leads (tips, hangs up,
 * slides or stands all along), then the first wheel to go light and to lift, the smallest
 * force-angle margin and the least underbody gap. Grip figures to 2 decimals (a friction
 * coefficient is not known better than that).
 */
export function passHeadline(r: PassResult, units: UnitSystem): string {
  const at = (m: number) => distanceText(m, units);
  const o = passOutcome(r);
  const parts: string[] = [];
  switch (o.kind) {
    case 'tips':
      parts.push(`tips at ${at(o.distanceM)}: the pass stops there`);
      break;
    case 'hangs-up':
      parts.push(`hangs up on the ${partWords(o.part)} at ${at(o.distanceM)} (the body ${shortText(o.depthM, units)} inside the ground): the pass stops there`);
      break;
    case 'slides':
      parts.push(`slides at ${at(o.distanceM)}: ${o.wheel} needs grip ${fixed(o.frictionDemand, 2)} on ground of ${fixed(o.friction, 2)}, it cannot climb without slipping`);
      break;
    case 'stands':
      parts.push('stands all along the path');
  }
  // A slide is shown even when a later hang-up leads.
  if (o.kind === 'hangs-up' && r.firstSlide && r.hangUp && r.firstSlide.station < r.hangUp.station) {
    parts.push(`slides first at ${at(r.firstSlide.distanceM)} (${r.firstSlide.wheel} needs grip ${fixed(r.firstSlide.frictionDemand, 2)} on ground of ${fixed(r.friction, 2)})`);
  }
  parts.push(
    r.firstUnload
      ? `${r.firstUnload.wheel} unloads first at ${at(r.firstUnload.distanceM)}`
      : `no wheel goes below ${percentText(r.lightShare)} of its static load`,
  );
  if (r.firstLift) parts.push(`${r.firstLift.wheel} lifts at ${at(r.firstLift.distanceM)}`);
  if (r.minMargin) parts.push(`smallest force-angle margin ${angleText(r.minMargin.forceAngleRad)} at ${at(r.minMargin.distanceM)}`);
  const c = r.minClearance;
  if (c !== null && c.clearanceM > 0) parts.push(`least underbody gap ${shortText(c.clearanceM, units)} (${partWords(c.part)}) at ${at(c.distanceM)}`);
  const s = parts.join('; ');
  return `${s.charAt(0).toUpperCase()}${s.slice(1)}.`;
}

/**
 * How a build's pass ends, in a few words for a comparison cell: where it hangs up and on what
 * (belly, bumper, axle), where it cannot climb without slipping and on which wheel, where it tips,
 * or that it gets through. A slide before a hang-up is said too (the hang-up leads, as in
 * passHeadline). Null (no path): NO_VALUE's dash.
 */
export function passEndWords(end: { readonly outcome: PassOutcome; readonly firstSlide: PassResult['firstSlide'] } | null, units: UnitSystem): string {
  if (end === null) return NO_VALUE;
  const at = (m: number) => distanceText(m, units);
  const o = end.outcome;
  const slipFirst = (before: number) =>
    end.firstSlide && end.firstSlide.distanceM < before ? `; slips first at ${at(end.firstSlide.distanceM)} (${end.firstSlide.wheel} needs grip ${fixed(end.firstSlide.frictionDemand, 2)})` : '';
  switch (o.kind) {
    case 'tips':
      return `tips at ${at(o.distanceM)}${slipFirst(o.distanceM)}`;
    case 'hangs-up':
      return `hangs up on the ${partWords(o.part)} at ${at(o.distanceM)} (${shortText(o.depthM, units)} into the ground)${slipFirst(o.distanceM)}`;
    case 'slides':
      return `cannot climb without slipping at ${at(o.distanceM)}: ${o.wheel} needs grip ${fixed(o.frictionDemand, 2)} on ground of ${fixed(o.friction, 2)}`;
    case 'stands':
      return 'gets through: no hang-up, no slip, no tip';
  }
}

/** What an event is, without where. */
export function eventWhat(e: PassEvent): string {
  const who = e.wheel ?? (e.part ? partWords(e.part) : '');
  switch (e.kind) {
    case 'light':
      return `${who} goes light`;
    case 'lifted':
      return `${who} lifts`;
    case 'full-bump':
      return `${who} on its bump stop`;
    case 'full-droop':
      return `${who} at full droop`;
    case 'slide':
      return `${who} slides: needs more grip than the ground gives`;
    case 'hang-up':
      return `hangs up on the ${who}: the body is inside the ground`;
    case 'contact':
      return `the ${who} touches the ground`;
    case 'tip':
      return 'tips: no balance remains';
    default:
      return `${who ? `${who} ` : ''}${String((e as { kind: string }).kind)}`;
  }
}

/** An event with where it holds: "FL lifts from 3.40 m to 4.10 m". */
export function eventWords(e: PassEvent, units: UnitSystem): string {
  const from = distanceText(e.startDistanceM, units);
  if (e.kind === 'tip') return `${eventWhat(e)} at ${from}`;
  const to = e.endDistanceM === null ? ' to the end' : e.endDistanceM === e.startDistanceM ? '' : ` to ${distanceText(e.endDistanceM, units)}`;
  return `${eventWhat(e)} from ${from}${to}`;
}

/**
 * Warnings in words for one solve. Thresholds are our own choices (common practice is to keep
 * well clear of a lift): a tyre under NEAR_LIFT_SHARE of its static load is close to lifting; a
 * force-angle margin under NEAR_TIP_RAD is close to tipping.
 */
export const NEAR_LIFT_SHARE = 0.2;
export const NEAR_TIP_RAD = 10 * RAD_PER_DEG;

export type WarningLevel = 'danger' | 'warning' | 'note';

export interface Warning {
  readonly level: WarningLevel;
  readonly text: string;
}

type WarnWheel = { readonly name: string; readonly lifted: boolean; readonly loadShare: number | null; readonly frictionDemand: number | null; readonly travelFraction: number | null };

export function warningsFor(r: Pick<SolveResult, 'status' | 'reason' | 'margins'> & { readonly wheels: readonly WarnWheel[] }, friction: number): Warning[] {
  const out: Warning[] = [];
  if (r.status === 'tipped') {
    const edge = r.margins.weakestEdgeWheels.join('–');
    out.push({ level: 'danger', text: `Tips over: the plumb line from the CG is outside the support${edge ? `, over the ${edge} edge` : ''}.` });
  } else if (r.status === 'no-contact') {
    out.push({ level: 'danger', text: `No tyre touches the ground: ${r.reason}.` });
  } else if (r.status === 'not-converged') {
    out.push({ level: 'warning', text: `The solve did not settle (${r.reason}); the numbers shown are not a balance.` });
  } else if (r.status === 'unstable') {
    out.push({ level: 'danger', text: `Does not stand: the only balance found here is unstable (${r.reason}); it goes over.` });
  }
  // A pose that does not stand has no tyres it stands on: its lifted flags belong to no balance.
  const lifted = r.status === 'converged' ? r.wheels.filter((w) => w.lifted).map((w) => w.name) : [];
  if (lifted.length > 0) {
    out.push({
      level: 'danger',
      text: `${lifted.join(' and ')} ${lifted.length === 1 ? 'has' : 'have'} lifted: the vehicle stands on ${4 - lifted.length} tyre${4 - lifted.length === 1 ? '' : 's'}.`,
    });
  }
  for (const w of r.wheels) {
    if (!w.lifted && w.loadShare !== null && w.loadShare < NEAR_LIFT_SHARE && r.status === 'converged') {
      out.push({ level: 'warning', text: `${w.name} is close to lifting: ${percentText(w.loadShare)} of its static load.` });
    }
  }
  if (r.status === 'converged' && r.margins.forceAngleRad < NEAR_TIP_RAD) {
    const edge = r.margins.weakestEdgeWheels.join('–');
    out.push({ level: 'danger', text: `Close to tipping: force-angle margin ${angleText(r.margins.forceAngleRad)}${edge ? ` about the ${edge} edge` : ''}.` });
  }
  for (const w of r.wheels) {
    if (!w.lifted && w.frictionDemand !== null && w.frictionDemand > friction) {
      out.push({ level: 'warning', text: `${w.name} needs grip ${fixed(w.frictionDemand, 2)}, more than the ground's ${fixed(friction, 2)}: it may slide.` });
    }
  }
  for (const w of r.wheels) {
    if (w.travelFraction === null) continue;
    if (w.travelFraction <= -0.999) out.push({ level: 'note', text: `${w.name} is at full droop.` });
    else if (w.travelFraction >= 0.999) out.push({ level: 'note', text: `${w.name} is on its bump stop.` });
  }
  return out;
}

/** One modification as modelled, in words and the reader's units. */
export function buildChangeWords(c: BuildChange, units: UnitSystem): string {
  const mm = (m: number) => shortText(m, units);
  const signed = (m: number) => changeText('short', m, units);
  switch (c.kind) {
    case 'as-given':
      return 'as given';
    case 'tyres':
      return `tyres: radius ${lengthText(c.radiusM, units)}; everything rides ${mm(c.riseM)} higher (CG, payload, body, roll centres)`;
    case 'suspension-lift':
      return `suspension lift ${mm(c.liftM)}: sprung mass (${massText(c.sprungMassKg, units)} of ${massText(c.massKg, units)}), payload and body up ${mm(c.liftM)}; CG up ${mm(c.cgRiseM)}; roll centres and travel kept`;
    case 'body-lift':
      return `body lift ${mm(c.liftM)}: body taken as ${percentText(c.bodyShare)} of the sprung mass (${massText(c.bodyMassKg, units)}) and the payload up ${mm(c.liftM)}; frame, belly and bumpers stay; CG up ${mm(c.cgRiseM)}`;
    case 'wheels': {
      const parts: string[] = [];
      if (c.rimWidthM !== null) {
        // Rim widths are stated in inches by the trade, whatever the system (common practice).
        parts.push(`wheels ${fixed(toDisplay('length', c.rimWidthM, 'imperial'), 1)} in wide at ${mm(c.offsetM ?? 0)} offset${c.stockOffsetM === null ? '' : ` (stock ${mm(c.stockOffsetM)})`}`);
      }
      if (c.spacerM !== null) parts.push(`spacers ${mm(c.spacerM)} per side`);
      return `${parts.join(', ')}: ${c.axle === 'both' ? 'both tracks' : `${c.axle} track`} ${signed(c.trackChangeM)}`;
    }
    case 'payload':
      return `payload: ${c.labels.join(', ')} (${massText(c.massKg, units)})`;
    case 'anti-roll':
      return `${c.end} anti-roll bar ${c.stiffnessNmPerRad === null ? 'disconnected' : quantityText('rollStiffness', c.stiffnessNmPerRad, units)}`;
    case 'travel':
      return `${c.end} travel: bump ${mm(c.bumpM)}, droop ${mm(c.droopM)}`;
    default:
      return String((c as { kind: string }).kind);
  }
}

/** All of a build's modifications in words, joined. */
export function buildChangesWords(changes: readonly BuildChange[], units: UnitSystem, sep = '; '): string {
  return changes.map((c) => buildChangeWords(c, units)).join(sep);
}

/**
 * Slope to spare in words, the headline margin: the extra tilt beyond the ground here to the first
 * wheel lift and to the tip, in the weakest direction and the four cardinal ones, each with the
 * slope from level where it happens. (The force-angle, energy and static margins are details: they
 * are not slopes to spare.)
 */
export function spareLines(sp: SlopeToSpare): string[] {
  const a = (rad: number | null) => (rad === null ? `more than ${angleText(sp.maxBeyondGroundRad)}` : angleText(rad));
  const one = (d: SpareDirection) => {
    const lift = d.toLiftBeyondGroundRad === null ? `no lift up to ${a(null)}` : `a wheel${d.liftWheel ? ` (${d.liftWheel})` : ''} lifts after ${a(d.toLiftBeyondGroundRad)} more`;
    const tip = d.toTipBeyondGroundRad === null ? `no tip up to ${a(null)} more` : `it tips after ${a(d.toTipBeyondGroundRad)} more (a slope of ${a(d.tipFromLevelRad)} from level)`;
    const soft = d.softFromBeyondGroundRad !== null ? `; nearly neutral from ${a(d.softFromBeyondGroundRad)} more: take that as the limit` : '';
    return `${lift}, ${tip}${soft}`;
  };
  const dir = (d: SpareDirection) => downhillWords(d.downhillRad);
  const out = [
    `Slope to spare, ${SPARE_DATUM} (the ground is ${angleText(sp.groundFromLevelRad)} from level):`,
    `weakest direction ${dir(sp.weakestTip)}: ${one(sp.weakestTip)}`,
  ];
  for (const name of Object.keys(sp.cardinals) as (keyof SlopeToSpare['cardinals'])[]) {
    const d = sp.cardinals[name];
    out.push(`${downhillWords(d.downhillRad)}: ${one(d)}`);
  }
  if (!sp.standsNow) out.push('It does not stand as it is: there is no slope to spare.');
  return out;
}

/** What filled ground is, said once wherever a result says a tyre stands on it. */
export const FILLED_GROUND_NOTE =
  'Filled ground: the import filled in heights where the scan or survey had no data; a tyre standing there rests on a guessed height, so its load and the margins near it are less certain.';

/** "FL and RL": wheel names joined for a sentence. */
function wheelList(wheels: readonly string[]): string {
  return wheels.length <= 1 ? (wheels[0] ?? '') : `${wheels.slice(0, -1).join(', ')} and ${wheels[wheels.length - 1]}`;
}

/** One wheel's stretch of a pass on filled ground: "FL stands on filled ground from 2.10 m to 3.40 m" (or "at 2.10 m"). */
export function filledSpanWords(span: FilledGroundSpan, units: UnitSystem): string {
  const from = distanceText(span.startDistanceM, units);
  if (span.endDistanceM === span.startDistanceM) return `${span.wheel} stands on filled ground at ${from}`;
  return `${span.wheel} stands on filled ground from ${from} to ${distanceText(span.endDistanceM, units)}`;
}

/** The note for one spot (rose, heading sweep): which tyres stand on filled ground there; null when none. */
export function filledSpotWords(wheels: readonly string[] | undefined): string | null {
  if (!wheels || wheels.length === 0) return null;
  return `${wheelList(wheels)} ${wheels.length === 1 ? 'stands' : 'stand'} on filled ground here (no data there: the import filled it in), so the limits at this spot rest on guessed heights.`;
}

/** The note for a heading sweep: the headings at which a tyre stands on filled ground; null when none. */
export function filledHeadingsWords(headings: readonly { readonly headingRad: number; readonly filledWheels?: readonly string[] }[]): string | null {
  const on = headings.filter((h) => (h.filledWheels?.length ?? 0) > 0);
  if (on.length === 0) return null;
  const list = on.length === headings.length ? 'every heading' : on.length === 1 ? `the heading ${angleText(on[0].headingRad)}` : `${on.length} of ${headings.length} headings`;
  return `At ${list} a tyre stands on filled ground (no data there: the import filled it in), so the limits there rest on guessed heights.`;
}

/** The note for a line sweep: how many lines have a tyre on filled ground; null when none. */
export function filledLinesWords(lines: readonly { readonly onFilledGround?: boolean }[]): string | null {
  const n = lines.filter((l) => l.onFilledGround).length;
  if (n === 0) return null;
  return `${n} of ${lines.length} line${lines.length === 1 ? '' : 's'} put a tyre on filled ground (marked "filled"): their margins rest on guessed heights.`;
}

/** The note for a pass: every wheel's stretch on filled ground, then what filled ground is; null when none. */
export function filledPassWords(r: Pick<PassResult, 'filledGround'>, units: UnitSystem): string | null {
  const spans = r.filledGround ?? [];
  if (spans.length === 0) return null;
  return `${spans.map((s) => filledSpanWords(s, units)).join('; ')}. ${FILLED_GROUND_NOTE}`;
}
