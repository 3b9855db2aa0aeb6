/**
 * Argument parsing with node:util `parseArgs`: `--name value`, `--name=value`, `-n value`, flags,
 * and `--`. One step before it: a value option takes the next argument as its value even when that
 * begins with a dash (`--offset -1:1:0.02`, `-x -2`), which `parseArgs` would call ambiguous; the
 * pair is handed to it as `--name=value`.
 */
import { parseArgs as parseNodeArgs, type ParseArgsConfig } from 'node:util';
import { UsageError, type CommandSpec, type OptionSpec, type OptionValue, type ParsedArgs } from './command';

function findOption(spec: CommandSpec, token: string): OptionSpec | undefined {
  if (token.startsWith('--')) {
    const name = token.slice(2);
    return spec.options.find((o) => o.name === name);
  }
  const short = token.slice(1);
  return spec.options.find((o) => o.short === short);
}

function convert(opt: OptionSpec, raw: string): OptionValue {
  if (opt.kind === 'number') {
    const v = raw.trim() === '' ? NaN : Number(raw);
    if (!Number.isFinite(v)) throw new UsageError(`--${opt.name}: must be a number, got "${raw}"`);
    return v;
  }
  if (opt.choices && !opt.choices.includes(raw)) {
    throw new UsageError(`--${opt.name}: must be one of ${opt.choices.join(', ')}, got "${raw}"`);
  }
  return raw;
}

/** `--name value` and `-n value` of value options joined as `--name=value` (see the file comment). */
function joinValues(spec: CommandSpec, argv: readonly string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const token = argv[i];
    if (token === '--') {
      for (let j = i; j < argv.length; j++) out.push(argv[j]);
      break;
    }
    const opt = token.startsWith('-') && token !== '-' && !token.includes('=') ? findOption(spec, token) : undefined;
    if (opt && opt.kind !== 'flag' && i + 1 < argv.length) out.push(`--${opt.name}=${argv[++i]}`);
    else out.push(token);
  }
  return out;
}

/** A `parseArgs` error in our words (the option it names, the command's help to see). */
function usageErrorOf(spec: CommandSpec, e: unknown): UsageError {
  const err = e as { code?: string; message?: string };
  const named = /'(-[^' ]+)/.exec(err.message ?? '')?.[1] ?? '';
  const opt = named ? findOption(spec, named.split('=')[0]) : undefined;
  switch (err.code) {
    case 'ERR_PARSE_ARGS_UNKNOWN_OPTION':
      return new UsageError(`unknown option ${named} for "${spec.name}"; see plumbline ${spec.name} --help`);
    case 'ERR_PARSE_ARGS_INVALID_OPTION_VALUE':
      if (opt?.kind === 'flag') return new UsageError(`--${opt.name} takes no value`);
      if (opt) return new UsageError(`--${opt.name} needs a value (${opt.valueName ?? 'VALUE'})`);
      return new UsageError(`${err.message ?? 'bad option'}; see plumbline ${spec.name} --help`);
    default:
      return new UsageError(`${err.message ?? String(e)}; see plumbline ${spec.name} --help`);
  }
}

/** Parse a command's arguments (everything after the command name) against its spec. */
export function parseArgs(spec: CommandSpec, argv: readonly string[]): ParsedArgs {
  const config: NonNullable<ParseArgsConfig['options']> = {};
  for (const o of spec.options) config[o.name] = { type: o.kind === 'flag' ? 'boolean' : 'string', ...(o.short ? { short: o.short } : {}) };
  let parsed: { values: Record<string, string | boolean | (string | boolean)[] | undefined>; positionals: string[] };
  try {
    parsed = parseNodeArgs({ args: joinValues(spec, argv), options: config, strict: true, allowPositionals: true });
  } catch (e) {
    throw usageErrorOf(spec, e);
  }
  const options: Record<string, OptionValue | undefined> = Object.create(null);
  for (const o of spec.options) {
    const given = parsed.values[o.name];
    if (given === undefined) options[o.name] = o.default ?? (o.kind === 'flag' ? false : undefined);
    else if (o.kind === 'flag') options[o.name] = true;
    else options[o.name] = convert(o, String(given));
  }
  const positionals = parsed.positionals;
  const required = spec.args.filter((a) => !a.optional).length;
  const variadic = spec.args.some((a) => a.variadic);
  if (positionals.length < required) {
    throw new UsageError(`${spec.name}: missing ${spec.args[positionals.length].name}; see plumbline ${spec.name} --help`);
  }
  if (!variadic && positionals.length > spec.args.length) {
    throw new UsageError(`${spec.name}: unexpected argument "${positionals[spec.args.length]}"`);
  }
  return { positionals, options };
}

/** Usage line and option list for `plumbline COMMAND --help`. */
export function commandHelp(spec: CommandSpec): string {
  const argWords = spec.args.map((a) => {
    const w = a.variadic ? `${a.name}...` : a.name;
    return a.optional ? `[${w}]` : w;
  });
  const lines = [`usage: plumbline ${spec.name}${spec.options.length ? ' [options]' : ''} ${argWords.join(' ')}`.trimEnd(), '', spec.summary];
  if (spec.description) lines.push('', spec.description);
  if (spec.args.length) {
    lines.push('', 'arguments:');
    const w = spec.args.reduce((m, a) => Math.max(m, a.name.length), 0);
    for (const a of spec.args) lines.push(`  ${a.name.padEnd(w)}  ${a.description}`);
  }
  const opts = [...spec.options, { name: 'help', short: 'h', kind: 'flag', description: 'show this help' } as OptionSpec];
  const words = opts.map((o) => {
    const value = o.kind === 'flag' ? '' : ` ${o.valueName ?? (o.choices ? o.choices.join('|') : 'VALUE')}`;
    return `${o.short ? `-${o.short}, ` : '    '}--${o.name}${value}`;
  });
  const w = words.reduce((m, s) => Math.max(m, s.length), 0);
  lines.push('', 'options:');
  opts.forEach((o, i) => {
    const def = o.default !== undefined && o.kind !== 'flag' ? ` (default ${String(o.default)})` : '';
    lines.push(`  ${words[i].padEnd(w)}  ${o.description}${def}`);
  });
  return lines.join('\n');
}
