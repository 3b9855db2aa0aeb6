/** `plumbline pose FILE`: solve the scenario's pose (with its tilt) and print the tyre loads, travel and margins. */
import { solveEquilibrium, type SolveResult } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { formatKeyValues, formatTable } from '../format';
import { loadScenarioFile, toJsonText } from '../load';
import { displayUnits, modelOf, radToDegRounded } from '../solveScenario';

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
  options: [{ name: 'json', kind: 'flag', description: 'print one JSON object (SI units, angles in degrees)' }],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const s = loaded.scenario;
    const model = modelOf(s);
    const r = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction });
    if (args.options.json) io.out(toJsonText(poseJson(r)));
    else {
      const u = displayUnits(s.units);
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
              { header: 'load', unit: u.force, digits: 0 },
              { header: 'of static', unit: '%', digits: 0 },
              { header: 'travel', unit: u.length, digits: 3 },
              { header: 'travel used', unit: '%', digits: 0 },
              { header: 'grip needed', unit: 'μ', digits: 2 },
              { header: 'state' },
            ],
            r.wheels.map((w) => {
              const demand = w.frictionDemand ?? 0;
              const share = w.loadShare ?? 0;
              return [
                w.name,
                u.forceOf(w.loadN ?? 0),
                100 * share,
                u.lengthOf(w.travelM ?? 0),
                100 * (w.travelFraction ?? 0),
                demand,
                w.lifted ? 'LIFTED' : demand > s.friction ? 'SLIDES' : share < 0.25 ? 'light' : '',
              ];
            }),
          ),
        );
      }
      io.out('');
      io.out(
        formatKeyValues([
          ['status', `${r.status} (${r.reason})`],
          ['weight', `${u.forceOf(r.weightN).toFixed(0)} ${u.force}`],
          // Attitude and margins only of a pose that stands (elsewhere they describe no equilibrium).
          ...(r.standing
            ? ([
                ['body roll / pitch to level', `${radToDegRounded(r.body.rollToLevelRad, 2)}° / ${radToDegRounded(r.body.pitchToLevelRad, 2)}°`],
                ['force-angle margin', `${radToDegRounded(r.margins.forceAngleRad, 2)}° (weakest edge ${r.margins.weakestEdgeWheels.join('–') || 'none'})`],
                ['energy margin', `${u.lengthOf(r.margins.energyM).toFixed(3)} ${u.length}`],
                ['static margin', `${u.lengthOf(r.margins.staticM).toFixed(3)} ${u.length}`],
              ] as [string, string][])
            : []),
        ]),
      );
      io.out('');
      io.out('Caution: a quasi-static estimate on rigid ground. Real margins are smaller; follow the maker\'s limits, local rules and trained practice.');
    }
    if (!r.standing) {
      io.err(`plumbline: the vehicle does not stand at this pose: ${r.status} (${r.reason})`);
      return EXIT_FAILURE;
    }
    return EXIT_OK;
  },
};
