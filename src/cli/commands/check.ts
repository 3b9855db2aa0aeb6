/** `plumbline check FILE`: validate a scenario file. */
import { scenarioToFile } from '../../core/index';
import { EXIT_BAD_INPUT, EXIT_OK, type CommandSpec } from '../command';
import { loadScenarioFile, toJsonText } from '../load';

export const checkCommand: CommandSpec = {
  name: 'check',
  summary: 'Validate a scenario file and list every problem in it.',
  description:
    'Exit 0 when the file is valid, 2 when it is not (one "path: message" line per problem on stderr).\n' +
    'Warnings (defaults used, odd but legal values) go to stderr and do not fail the check.',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [
    { name: 'si', kind: 'flag', description: 'print the validated scenario in SI units (the core form) as JSON' },
    {
      name: 'to',
      kind: 'string',
      choices: ['metric', 'imperial'],
      valueName: 'metric|imperial',
      description: 'print the scenario file rewritten in these units',
    },
  ],
  run(args, io) {
    const file = args.positionals[0];
    const r = loadScenarioFile(file, io);
    if (!r.ok) return EXIT_BAD_INPUT;
    const s = r.scenario;
    const n = s.terrain.features.length;
    if (args.options.si) io.out(toJsonText(s));
    else if (typeof args.options.to === 'string') io.out(toJsonText(scenarioToFile(s, args.options.to as 'metric' | 'imperial')));
    else io.out(`${file}: valid (vehicle ${JSON.stringify(s.vehicle.name)}, ${n} ${n === 1 ? 'feature' : 'features'})`);
    return EXIT_OK;
  },
};
