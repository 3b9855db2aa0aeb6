/** `plumbline pose FILE`: solve the scenario's pose (with its tilt) and print the tyre loads, travel and margins. */
import { solveEquilibrium, type Scenario, type SolveResult } from '../../core/index';
import { onFilledGround } from '../../core/ground/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { UNITS_OPTION, formatKeyValues, formatTable, outputUnits, quantityColumn } from '../format';
import { OF_STATIC_NOTE, angleText, fixed, forceText, percentText, shortText, valueText } from '../../present/units';
import { QUASI_STATIC_CAUTION } from '../../present/words';
import { loadScenarioFile, toJsonText } from '../load';
import { modelOf, radToDegRounded } from '../solveScenario';

/** Whether a loaded tyre's contact lies on imported ground that was filled in (not measured). */
export function onFilled(s: Scenario, r: SolveResult): boolean {
  const pts = r.wheels.filter((w) => !w.lifted).map((w) => [w.contactPointWorld[0], w.contactPointWorld[1]] as const);
  return s.terrain.features.some((f) => onFilledGround(f, pts));
}

/** The documented JSON form of a pose result: SI, angles in degrees, units in the key names. */
export function poseJson(r: SolveResult): object {
  const wheels: Record<string, object> = {};
  for (const w of r.wheels) {
    wheels[w.name] = {
      loadN: w.loadN,
      verticalLoadN: w.verticalLoadN,
      loadShare: w.loadShare,
      staticLoadN: w.staticLoadN,
      lifted: w.lifted,
      travelM: w.travelM,
      travelFraction: w.travelFraction,
      tyreDeflectionM: w.tyreDeflectionM,
      frictionDemand: w.frictionDemand,
      tangentialN: w.tangentialN,
      contactPointM: w.contactPointWorld,
      contactNormal: w.contactNormalWorld,
      centreM: w.centreWorld,
    };
  }
  return {
    status: r.status,
    standing: r.standing,
    reason: r.reason,
    // Where it does not stand: the support edge it goes over (wheels), when the solver saw one.
    tip: r.standing ? null : { edge: r.margins.weakestEdgeWheels },
    iterations: r.iterations,
    evaluations: r.evaluations,
    residualN: r.residualN,
    residualNm: r.residualNm,
    weightN: r.weightN,
    wheels,
    body: {
      heaveM: r.body.heaveM,
      rollDeg: radToDegRounded(r.body.rollRad, 6),
      pitchDeg: radToDegRounded(r.body.pitchRad, 6),
      rollToLevelDeg: radToDegRounded(r.body.rollToLevelRad, 6),
      pitchToLevelDeg: radToDegRounded(r.body.pitchToLevelRad, 6),
      cgM: r.body.cgWorld,
      plumbPointM: r.body.plumbPointWorld,
    },
    margins: {
      forceAngleDeg: radToDegRounded(r.margins.forceAngleRad, 6),
      forceAngleMeasurePerWeightM: r.margins.forceAngleMeasurePerWeightM,
      energyM: r.margins.energyM,
      staticM: r.margins.staticM,
      weakestEdge: r.margins.weakestEdgeWheels,
    },
    supportPolygonM: r.supportPolygonWorld,
  };
}

export const poseCommand: CommandSpec = {
  name: 'pose',
  summary: 'Solve how the vehicle stands at the scenario pose: load on each tyre, travel, margins.',
  description:
    'Quasi-static estimate: real margins are smaller (bounce, momentum, soft ground, driver input).\n' +
    'Exit 0 when it stands, 1 when it tips, loses contact or the solver does not converge (the result is still printed).',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [{ name: 'json', kind: 'flag', description: 'print one JSON object (SI units, angles in degrees)' }, UNITS_OPTION],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const model = modelOf(s);
    const r = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction });
    const filled = onFilled(s, r);
    if (args.options.json) io.out(toJsonText({ ...poseJson(r), onFilledGround: filled }));
    else {
      const u = outputUnits(args.options, s.units);
      io.out(`${s.name}: ${s.vehicle.name}`);
      if (!r.standing) {
        // No load table: the numbers of a pose that does not stand belong to no equilibrium.
        const edge = r.margins.weakestEdgeWheels.length > 0 ? `, over the ${r.margins.weakestEdgeWheels.join('–')} edge` : '';
        io.out(`goes over: this pose does not stand (${r.status}${edge}: ${r.reason})`);
      } else {
        io.out(
          formatTable(
            [
              { header: 'wheel' },
              quantityColumn('normal load', 'force', u),
              { header: 'of static', unit: '%', align: 'right' },
              quantityColumn('travel', 'short', u),
              { header: 'travel used', unit: '%', align: 'right' },
              { header: 'grip needed', unit: 'μ', align: 'right' },
              { header: 'state' },
            ],
            r.wheels.map((w) => {
              const load = w.loadN;
              const share = w.loadShare;
              const grip = w.frictionDemand;
              return [
                w.name,
                valueText('force', load, u),
                percentText(share).replace(' %', ''),
                valueText('short', w.travelM, u),
                w.travelFraction === null ? '—' : fixed(100 * w.travelFraction, 0),
                grip === null ? '—' : fixed(grip, 2),
                w.lifted ? 'LIFTED' : grip !== null && grip > s.friction ? 'SLIDES' : share !== null && share < 0.25 ? 'light' : '',
              ];
            }),
          ),
        );
        io.out(OF_STATIC_NOTE);
      }
      io.out('');
      io.out(
        formatKeyValues([
          ['status', `${r.status} (${r.reason})`],
          ['weight', forceText(r.weightN, u)],
          // Attitude and margins only of a pose that stands (elsewhere they describe no equilibrium).
          ...(r.standing
            ? ([
                ['body roll / pitch from level', `${angleText(r.body.rollToLevelRad)} / ${angleText(r.body.pitchToLevelRad)}`],
                ['force-angle margin', `${angleText(r.margins.forceAngleRad)} (weakest edge ${r.margins.weakestEdgeWheels.join('–') || 'none'})`],
                ['energy margin', `${shortText(r.margins.energyM, u)} (CG rise to tip)`],
                ['static margin', `${shortText(r.margins.staticM, u)} (plumb point inside the support)`],
              ] as [string, string][])
            : []),
        ]),
      );
      io.out('');
      if (filled) io.out('Caution: a tyre stands on ground that was filled in by the import (no data there): its load is a guess.');
      io.out(QUASI_STATIC_CAUTION);
    }
    if (!r.standing) {
      io.err(`plumbline: the vehicle does not stand at this pose: ${r.status} (${r.reason})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};
