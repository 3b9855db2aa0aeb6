/**
 * Plumbline command line: `npm run -s cli -- COMMAND [options] ARGS`.
 * Exit codes: 0 success, 2 bad input (usage, invalid scenario), 1 anything else. Never an
 * uncaught exception: every failure is printed as `plumbline: <message>`.
 */
import { readFileSync, realpathSync, statSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseArgs as parseNodeArgs } from 'node:util';
import { EXIT_BAD_INPUT, EXIT_FAILURE, EXIT_OK, UsageError, type CliIO } from './command';
import { commandHelp, parseArgs } from './args';
import { COMMANDS, findCommand } from './commands/index';
import { formatKeyValues } from './format';

export const CLI_VERSION = '0.1.0';

/** The process's streams and file system. */
export const processIO: CliIO = {
  out: (line) => void process.stdout.write(`${line}\n`),
  err: (line) => void process.stderr.write(`${line}\n`),
  readFile: (path) => readFileSync(path, 'utf8'),
  fileSize: (path) => statSync(path).size,
  readBytes: (path) => readFileSync(path),
};

export function mainHelp(): string {
  return [
    'usage: plumbline COMMAND [options] ARGS',
    '',
    'Quasi-static tyre loads, wheel lift and tip-over for one vehicle build on user-defined terrain.',
    'Results are estimates: real margins are smaller. Keep to the vehicle maker\'s limits, local',
    'regulations and trained practice.',
    '',
    'commands:',
    formatKeyValues(COMMANDS.map((c) => [c.name, c.summary] as const), { indent: '  ' }),
    '',
    'options:',
    formatKeyValues([['-h, --help', 'show this help (or a command\'s: plumbline COMMAND --help)'], ['--version', 'print the version']], { indent: '  ' }),
  ].join('\n');
}

/** `--help` or `-h` anywhere before a `--` (node:util parseArgs tokens; other options are the command's). */
function wantsHelp(argv: readonly string[]): boolean {
  const { tokens } = parseNodeArgs({ args: [...argv], options: { help: { type: 'boolean', short: 'h' } }, strict: false, allowPositionals: true, tokens: true });
  return tokens.some((t) => t.kind === 'option' && t.name === 'help' && (t.rawName === '--help' || t.rawName === '-h') && argv[t.index] === t.rawName);
}

/** Run the CLI on `argv` (the arguments after the program name); resolves to the exit code. */
export async function runCli(argv: readonly string[], io: CliIO = processIO): Promise<number> {
  try {
    const [name, ...rest] = argv;
    if (name === undefined || name === '--help' || name === '-h' || name === 'help') {
      const target = name === 'help' && rest[0] ? findCommand(rest[0]) : undefined;
      io.out(target ? commandHelp(target) : mainHelp());
      return name === undefined ? EXIT_BAD_INPUT : EXIT_OK;
    }
    if (name === '--version') {
      io.out(CLI_VERSION);
      return EXIT_OK;
    }
    const command = findCommand(name);
    if (!command) {
      io.err(
        name.startsWith('-')
          ? `plumbline: unknown option ${name}; run "plumbline --help"`
          : `plumbline: unknown command "${name}"; commands: ${COMMANDS.map((c) => c.name).join(', ')}`,
      );
      return EXIT_BAD_INPUT;
    }
    if (wantsHelp(rest)) {
      io.out(commandHelp(command));
      return EXIT_OK;
    }
    const args = parseArgs(command, rest);
    return await command.run(args, io);
  } catch (e) {
    if (e instanceof UsageError) {
      io.err(`plumbline: ${e.message}`);
      return EXIT_BAD_INPUT;
    }
    const message = e instanceof Error ? e.message : String(e);
    try {
      io.err(`plumbline: ${message}`);
    } catch {
      // The error stream itself failed; the exit code still tells.
    }
    return EXIT_FAILURE;
  }
}

function isEntry(): boolean {
  const script = process.argv[1];
  if (!script) return false;
  try {
    return realpathSync(script) === realpathSync(fileURLToPath(import.meta.url));
  } catch {
    return false;
  }
}

if (isEntry()) {
  // A closed pipe (`plumbline ... | head`) is not an error.
  process.stdout.on('error', (e: NodeJS.ErrnoException) => {
    if (e.code === 'EPIPE') process.exit(process.exitCode ?? EXIT_OK);
  });
  runCli(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (e: unknown) => {
      process.stderr.write(`plumbline: ${e instanceof Error ? e.message : String(e)}\n`);
      process.exitCode = EXIT_FAILURE;
    },
  );
}
