/** `plumbline rose FILE`: tilt-table lift and tip angles for downhill directions all round the vehicle. */
import { buildModel, spareFromRose, stabilityRose, type RoseDirection, type RoseResult } from '../../core/index';
import { RAD_PER_DEG, directionText } from '../../present/units';
import { QUASI_STATIC_CAUTION, downhillWords, filledSpotWords, spareLines } from '../../present/words';
import { EXIT_BAD_INPUT, EXIT_OK, type CommandSpec } from '../command';
import { formatTable } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { deg, formatCsv, progressReporter } from '../analysisOutput';
import { angleWords } from './tilt';


/** The table tilt, the slope from level and the tilt beyond the ground here (degrees). */
function datums(e: { angleRad: number; fromLevelRad: number; beyondGroundRad: number }) {
  return { angleDeg: deg(e.angleRad), fromLevelDeg: deg(e.fromLevelRad), beyondGroundDeg: deg(e.beyondGroundRad) };
}

function directionJson(d: RoseDirection): object {
  return {
    downhillDeg: deg(d.downhillRad),
    firstLift: d.firstLift ? { wheel: d.firstLift.wheel, ...datums(d.firstLift), atTip: d.firstLift.atTip } : null,
    tip: d.tip ? { ...datums(d.tip), edge: d.tip.edge, reason: d.tip.reason, softFrom: d.tip.softFrom ? datums(d.tip.softFrom) : null } : null,
    tipEdgeChanged: d.tipEdgeChanged,
    slide: d.slide ? datums(d.slide) : null,
  };
}

export function roseJson(r: RoseResult, onTerrain: boolean): object {
  return {
    table: onTerrain ? 'scenario terrain at the scenario pose' : 'level tilt table',
    maxAngleDeg: deg(r.maxAngleRad),
    groundFromLevelDeg: deg(r.groundFromLevelRad),
    weakest: directionJson(r.weakest),
    weakestLift: directionJson(r.weakestLift),
    directions: r.directions.map(directionJson),
    evaluations: r.evaluations,
    filledWheels: r.filledWheels ?? [],
  };
}

/** Words for a downhill direction (vehicle frame): "90° (left side down)", "100° from the nose, counter-clockwise". */
function directionWords(rad: number): string {
  const w = downhillWords(rad);
  return /down$/.test(w) ? `${directionText(rad)} (${w})` : w;
}

/** Two downhill directions the same, whole turns apart or not (rad). */
const sameDirection = (a: number, b: number): boolean => {
  const d = (a - b) / (2 * Math.PI);
  return Math.abs(d - Math.round(d)) < 1e-9;
};

/**
 * The human summary above the table: the slope to spare (the weakest direction once, then the four
 * named ones; a named one that is the weakest points back to it rather than repeating it), and the
 * earliest wheel lift only where it is in another direction than the weakest (else it is in that line).
 */
export function roseSummaryLines(r: RoseResult): string[] {
  const sp = spareFromRose(r);
  const lines = spareLines(sp);
  // spareLines: the heading, the weakest direction, then one line per named direction in the order of sp.cardinals.
  const named = Object.values(sp.cardinals);
  const out = [lines[0], lines[1].replace(/^weakest direction [^:]*:/, `weakest direction ${directionWords(sp.weakestTip.downhillRad)}:`)];
  named.forEach((d, i) => {
    out.push(sameDirection(d.downhillRad, sp.weakestTip.downhillRad) ? `${downhillWords(d.downhillRad)}: the weakest direction, above` : lines[2 + i]);
  });
  for (let i = 2 + named.length; i < lines.length; i++) out.push(lines[i]);
  const lift = r.weakestLift;
  if (!lift.firstLift) out.push('earliest wheel lift: none before the tip in any direction');
  else if (!sameDirection(lift.downhillRad, sp.weakestTip.downhillRad)) {
    out.push(`earliest wheel lift: ${lift.firstLift.wheel} at ${angleWords(lift.firstLift)}, ${directionWords(lift.downhillRad)}`);
  }
  return out;
}

export const roseCommand: CommandSpec = {
  name: 'rose',
  summary: 'Stability rose: tilt at first wheel lift and at tip for downhill directions all round.',
  description:
    'Directions in the vehicle frame: 0 nose down, 90 left side down, 180 tail down, 270 right side down.\n' +
    'By default on a level tilt table (the scenario\'s terrain is not used); --terrain tilts the scenario\'s\n' +
    'terrain at its pose instead. Static limits only: operating limits are far lower (common practice:\n' +
    'makers print about 15° for utility vehicles and ATVs).',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [
    { name: 'step', kind: 'number', valueName: 'DEG', description: 'spacing of the downhill directions', default: 5 },
    { name: 'terrain', kind: 'flag', description: 'tilt the scenario terrain at the scenario pose instead of a level table' },
    { name: 'json', kind: 'flag', description: 'print one JSON object (degrees)' },
    { name: 'csv', kind: 'flag', description: 'print one CSV row per direction' },
    { name: 'quiet', kind: 'flag', description: 'no progress lines on stderr' },
  ],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const stepDeg = args.options.step as number;
    if (!(stepDeg >= 0.5 && stepDeg <= 180)) {
      io.err(`--step: must be between 0.5 and 180 degrees, got ${stepDeg}`);
      return EXIT_BAD_INPUT;
    }
    const onTerrain = Boolean(args.options.terrain);
    const model = buildModel(s.vehicle, onTerrain ? s.terrain : { features: [] });
    const pose = onTerrain ? s.pose : { xM: 0, yM: 0, headingRad: 0 };
    const r = stabilityRose(model, pose, {
      stepRad: stepDeg * RAD_PER_DEG, // degrees at the CLI edge, radians in the core
      friction: s.friction,
      onProgress: progressReporter(io, 'rose', !args.options.quiet, 25),
    });
    if (args.options.json) io.out(toJsonText(roseJson(r, onTerrain)));
    else if (args.options.csv) {
      io.out(
        formatCsv(
          ['downhill_deg', 'first_lift_wheel', 'first_lift_deg', 'tip_deg', 'tip_edge', 'slide_deg'],
          r.directions.map((d) => [
            deg(d.downhillRad),
            d.firstLift?.wheel ?? null,
            deg(d.firstLift?.angleRad),
            deg(d.tip?.angleRad),
            d.tip ? d.tip.edge.join('-') : null,
            deg(d.slide?.angleRad),
          ]),
        ),
      );
    } else {
      io.out(`${s.name}: ${s.vehicle.name}, ${onTerrain ? 'on the scenario terrain' : 'level tilt table'}, every ${stepDeg}°`);
      for (const line of roseSummaryLines(r)) io.out(line);
      const filledNote = filledSpotWords(r.filledWheels);
      if (filledNote) io.out(filledNote);
      io.out('');
      io.out(
        formatTable(
          [
            { header: 'downhill', unit: '°', digits: 1 },
            { header: 'lifts' },
            { header: 'lift', unit: '° from level', digits: 1 },
            { header: 'tip', unit: '° from level', digits: 1 },
            { header: 'tip', unit: '° beyond the ground here', digits: 1 },
            { header: 'over' },
            { header: 'slides', unit: '° from level', digits: 1 },
          ],
          r.directions.map((d) => [
            deg(d.downhillRad),
            d.firstLift?.wheel ?? '',
            deg(d.firstLift?.fromLevelRad),
            deg(d.tip?.fromLevelRad),
            deg(d.tip?.beyondGroundRad),
            d.tip ? d.tip.edge.join('–') + (d.tipEdgeChanged ? ' (edge changes)' : '') + (d.tip.softFrom ? ' (soft)' : '') : '',
            deg(d.slide?.fromLevelRad),
          ]),
        ),
      );
      io.out('(edge changes): the tip edge differs from the direction before, so the tip angle may change quickly there.');
      io.out('(soft): the stance is nearly neutral before the tip; see --json tip.softFrom for where that begins.');
      io.out('');
      io.out(QUASI_STATIC_CAUTION);
    }
    return EXIT_OK;
  },
};
