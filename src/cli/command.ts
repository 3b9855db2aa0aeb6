/**
 * What a CLI command is: its name, arguments, options and a `run` function. Each command lives in
 * one file in `src/cli/commands/` and is listed once in `src/cli/commands/index.ts`.
 */

/** Where a command reads and writes. Tests pass their own; `main.ts` passes the process's. */
export interface CliIO {
  /** Write one line (a newline is added) to standard output. */
  out(line: string): void;
  /** Write one line (a newline is added) to standard error. */
  err(line: string): void;
  /** Read a text file (UTF-8); throws with a readable message when it cannot. */
  readFile(path: string): string;
  /** A file's size in bytes (checked against the scenario size limit before reading); absent in tests that give text. */
  fileSize?(path: string): number;
  /** Read a file's bytes (scenario files: the encoding is read from them); absent: `readFile` is used. */
  readBytes?(path: string): Uint8Array;
}

export type OptionKind = 'flag' | 'string' | 'number';
export type OptionValue = string | number | boolean;

export interface OptionSpec {
  /** Long name without the dashes: `step` for `--step`. */
  readonly name: string;
  /** One-letter alias without the dash: `s` for `-s`. */
  readonly short?: string;
  readonly kind: OptionKind;
  /** Placeholder in the help text, e.g. `DEG`. */
  readonly valueName?: string;
  /** Allowed values of a string option. */
  readonly choices?: readonly string[];
  readonly description: string;
  /** Value when the option is not given (flags default to false). */
  readonly default?: OptionValue;
}

export interface ArgumentSpec {
  /** Placeholder in the help text, e.g. `FILE`. */
  readonly name: string;
  readonly description: string;
  /** @default false */
  readonly optional?: boolean;
  /** Takes all remaining arguments (last argument only). @default false */
  readonly variadic?: boolean;
}

export interface ParsedArgs {
  readonly positionals: readonly string[];
  /** By long option name; every declared option is present (its default, or false for flags, or undefined). */
  readonly options: Readonly<Record<string, OptionValue | undefined>>;
}

export interface CommandSpec {
  readonly name: string;
  /** One line for the command list. */
  readonly summary: string;
  /** Longer help text, printed under the usage line. */
  readonly description?: string;
  readonly args: readonly ArgumentSpec[];
  readonly options: readonly OptionSpec[];
  /** Returns the exit code: 0 success, 2 bad input, 1 failure. */
  run(args: ParsedArgs, io: CliIO): number | Promise<number>;
}

/** Exit codes used by every command. */
export const EXIT_OK = 0;
export const EXIT_FAILURE = 1;
export const EXIT_BAD_INPUT = 2;

/** A mistake in how the command was called (bad option, missing file name): exit 2 with the message. */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'UsageError';
  }
}
