/**
 * The command registry. To add a command, write `src/cli/commands/NAME.ts` exporting a
 * `CommandSpec` and list it here; `main.ts` dispatches and builds `--help` from this list.
 */
import type { CommandSpec } from '../command';
import { checkCommand } from './check';
import { poseCommand } from './pose';
import { tiltCommand } from './tilt';

/** Every command, in the order `plumbline --help` lists them. */
export const COMMANDS: readonly CommandSpec[] = [checkCommand, poseCommand, tiltCommand];

export function findCommand(name: string): CommandSpec | undefined {
  return COMMANDS.find((c) => c.name === name);
}
