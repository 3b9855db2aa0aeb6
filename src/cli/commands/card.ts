/** `plumbline card FILE -o card.html`: the one-page limit card of the vehicle as given and of each build. */
import { basename } from 'node:path';
import { writeFileSync } from 'node:fs';
import { collectCards, renderCardsHtml, DEFAULT_OPERATING_FRACTION } from '../../report/card';
import { RAD_PER_DEG, parseUnits } from '../../present/units';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, type CommandSpec } from '../command';
import { loadScenarioFile } from '../load';
import { todayText, toolVersion } from './report';

export const cardCommand: CommandSpec = {
  name: 'card',
  summary: 'Write the limit card (HTML, one printed page per configuration): the slopes at which it lifts a wheel and tips.',
  description:
    'One page for the vehicle as given and one for each build in the file (A4 or Letter): the build in the\n' +
    'trade\'s terms, the slope from level at which a wheel lifts and at which it tips (left, right, nose and\n' +
    'tail down), an operating line (a fraction of the lift slope, at most 15°: common practice), the load\n' +
    'assumed, the date and the caution; and the worst heading on the scenario\'s own ground (the vehicle turned\n' +
    'on its spot, every --heading-step degrees, on the terrain as it is, not a level table) with the extra tilt\n' +
    'to the tip and to the first lift, more than the ground here and from level. In the file\'s units unless\n' +
    '--units. Quasi-static estimates: real margins are smaller.',
  args: [{ name: 'FILE', description: 'scenario file (JSON)' }],
  options: [
    { name: 'output', short: 'o', kind: 'string', valueName: 'FILE', description: 'where to write the HTML (default: stdout)' },
    { name: 'fraction', kind: 'number', valueName: 'SHARE', description: 'operating line as a share of the slope at which a wheel lifts (at most 15°)', default: DEFAULT_OPERATING_FRACTION },
    { name: 'as-given', kind: 'flag', description: 'only the vehicle as given, not its builds' },
    { name: 'date', kind: 'string', valueName: 'YYYY-MM-DD', description: 'date printed on the card (default: today)' },
    { name: 'heading-step', kind: 'number', valueName: 'DEG', description: 'heading step of the sweep on the scenario\'s ground', default: 5 },
    { name: 'units', kind: 'string', choices: ['metric', 'imperial'], valueName: 'metric|imperial', description: 'units the card is written in (default: the scenario file\'s)' },
  ],
  run(args, io) {
    const file = args.positionals[0];
    const loaded = loadScenarioFile(file, io);
    if (!loaded.ok) return EXIT_BAD_INPUT;
    const fraction = args.options.fraction as number;
    if (!(fraction > 0 && fraction <= 1)) {
      io.err(`--fraction: must be > 0 and ≤ 1, got ${fraction}`);
      return EXIT_BAD_INPUT;
    }
    const step = args.options['heading-step'] as number;
    if (!(step >= 1 && step <= 90)) {
      io.err(`--heading-step: must be between 1 and 90 degrees, got ${step}`);
      return EXIT_BAD_INPUT;
    }
    const cards = collectCards(loaded.scenario, {
      fraction,
      max: args.options['as-given'] ? 1 : undefined,
      headingStepRad: step * RAD_PER_DEG,
      units: parseUnits(args.options.units as string | undefined) ?? loaded.scenario.units,
    });
    const html = renderCardsHtml(cards, {
      dateText: typeof args.options.date === 'string' ? args.options.date : todayText(),
      toolVersion: toolVersion(),
      fileName: basename(file),
    });
    const out = args.options.output;
    if (typeof out === 'string' && out !== '-') {
      try {
        writeFileSync(out, html);
      } catch (e) {
        io.err(`plumbline: cannot write ${out}: ${e instanceof Error ? e.message : String(e)}`);
        return EXIT_FAILURE;
      }
      io.err(`wrote ${out} (${cards.length} card${cards.length === 1 ? '' : 's'})`);
    } else io.out(html);
    return EXIT_OK;
  },
};
