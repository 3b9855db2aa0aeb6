/**
 * The command registry. To add a command, write `src/cli/commands/NAME.ts` exporting a
 * `CommandSpec` and list it here; `main.ts` dispatches and builds `--help` from this list.
 */
import type { CommandSpec } from '../command';
import { checkCommand } from './check';
import { poseCommand } from './pose';
import { tiltCommand } from './tilt';
import { reportCommand } from './report';
import { passCommand } from './pass';
import { roseCommand } from './rose';
import { linesCommand } from './lines';
import { compareCommand } from './compare';
import { cgCommand } from './cg';
import { cardCommand } from './card';
import { groundCommand } from './ground';

/** Every command, in the order `plumbline --help` lists them. */
export const COMMANDS: readonly CommandSpec[] = [checkCommand, poseCommand, tiltCommand, reportCommand, passCommand, roseCommand, linesCommand, compareCommand, cgCommand, cardCommand, groundCommand];

export function findCommand(name: string): CommandSpec | undefined {
  return COMMANDS.find((c) => c.name === name);
}
