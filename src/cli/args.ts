/** Hand-written argument parsing: `--name value`, `--name=value`, `-n value`, flags, and `--`. */
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

/** Parse a command's arguments (everything after the command name) against its spec. */
export function parseArgs(spec: CommandSpec, argv: readonly string[]): ParsedArgs {
  const options: Record<string, OptionValue | undefined> = Object.create(null);
  for (const o of spec.options) options[o.name] = o.default ?? (o.kind === 'flag' ? false : undefined);
  const positionals: string[] = [];
  let onlyPositionals = false;
  for (let i = 0; i < argv.length; i++) {
    const token = argv[i];
    if (onlyPositionals || token === '-' || !token.startsWith('-')) {
      positionals.push(token);
      continue;
    }
    if (token === '--') {
      onlyPositionals = true;
      continue;
    }
    const eq = token.startsWith('--') ? token.indexOf('=') : -1;
    const key = eq >= 0 ? token.slice(0, eq) : token;
    const opt = findOption(spec, key);
    if (!opt) throw new UsageError(`unknown option ${key} for "${spec.name}"; see plumbline ${spec.name} --help`);
    if (opt.kind === 'flag') {
      if (eq >= 0) throw new UsageError(`--${opt.name} takes no value`);
      options[opt.name] = true;
      continue;
    }
    let raw: string;
    if (eq >= 0) raw = token.slice(eq + 1);
    else {
      if (i + 1 >= argv.length) throw new UsageError(`--${opt.name} needs a value (${opt.valueName ?? 'VALUE'})`);
      raw = argv[++i];
    }
    options[opt.name] = convert(opt, raw);
  }
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
