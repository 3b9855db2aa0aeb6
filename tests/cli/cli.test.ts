/** The CLI: dispatch, `check`, help, exit codes; in-process and once as a real child process. */
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';
import { COMMANDS } from '../../src/cli/commands/index';

const DEMO = 'assets/scenarios/side-hill-stock.json';
const IMPERIAL = 'tests/fixtures/side-hill-stock-imperial.json';

function capture(overrides: Partial<CliIO> = {}) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = {
    out: (l) => void out.push(l),
    err: (l) => void err.push(l),
    readFile: (p) => readFileSync(p, 'utf8'),
    ...overrides,
  };
  return { io, out, err };
}

let dir = '';
let badFile = '';
let warnFile = '';
beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'plumbline-cli-'));
  const demo = JSON.parse(readFileSync(DEMO, 'utf8'));
  demo.vehicle.track.front = -1.6;
  demo.vehicle.cg.behindFrontAxle = 3.4;
  demo.vehicle.suspension.front.type = 'coil';
  demo.vehicle.colour = 'red';
  badFile = join(dir, 'bad.json');
  writeFileSync(badFile, JSON.stringify(demo, null, 2));
  const noBody = JSON.parse(readFileSync(DEMO, 'utf8'));
  delete noBody.vehicle.body;
  warnFile = join(dir, 'no-body.json');
  writeFileSync(warnFile, JSON.stringify(noBody));
});
afterAll(() => {
  if (dir) rmSync(dir, { recursive: true, force: true });
});

const BAD_LINES = [
  'vehicle.track.front: must be ≥ 0.3 m, got -1.6',
  'vehicle.suspension.front.type: must be "solid" or "independent", got "coil"',
  'vehicle.colour: unknown key',
  'vehicle.cg.behindFrontAxle: must lie within the wheelbase (0 to 3.1 m), got 3.4',
];

describe('plumbline check (in-process)', () => {
  it('a valid file: exit 0 and one summary line', async () => {
    const c = capture();
    expect(await runCli(['check', DEMO], c.io)).toBe(0);
    expect(c.out).toEqual([`${DEMO}: valid (vehicle "Corrigan Ridgeback (stock)", 1 feature)`]);
    expect(c.err).toEqual([]);
  });

  it('the imperial fixture is valid too', async () => {
    const c = capture();
    expect(await runCli(['check', IMPERIAL], c.io)).toBe(0);
    expect(c.out).toEqual([`${IMPERIAL}: valid (vehicle "Corrigan Ridgeback (stock)", 1 feature)`]);
  });

  it('an invalid file: exit 2, a count, then one "path: message" line per problem', async () => {
    const c = capture();
    expect(await runCli(['check', badFile], c.io)).toBe(2);
    expect(c.out).toEqual([]);
    expect(c.err[0]).toBe(`${badFile}: 4 errors`);
    expect(c.err.slice(1).sort()).toEqual([...BAD_LINES].sort());
  });

  it('warnings go to stderr and do not fail', async () => {
    const c = capture();
    expect(await runCli(['check', warnFile], c.io)).toBe(0);
    expect(c.err).toEqual([
      `${warnFile}: warning: vehicle.body: not given; using a rough outline derived from the vehicle: clearance results are only indicative`,
    ]);
  });

  it('--to imperial prints the file in imperial units; --si prints the core form', async () => {
    const c = capture();
    expect(await runCli(['check', '--to', 'imperial', DEMO], c.io)).toBe(0);
    const file = JSON.parse(c.out.join('\n'));
    expect(file.units).toBe('imperial');
    expect(file.vehicle.wheelbase).toBeCloseTo(3.1 / 0.0254, 10); // 122.047 in
    const d = capture();
    expect(await runCli(['check', '--si', DEMO], d.io)).toBe(0);
    expect(JSON.parse(d.out.join('\n')).vehicle.wheelbaseM).toBe(3.1);
  });

  it('a missing file: exit 2', async () => {
    const c = capture();
    expect(await runCli(['check', join(dir, 'nope.json')], c.io)).toBe(2);
    expect(c.err).toEqual([`plumbline: cannot read ${join(dir, 'nope.json')}: no such file`]);
  });

  it('usage mistakes: exit 2 with a message', async () => {
    const cases: [string[], string][] = [
      [['check'], 'plumbline: check: missing FILE; see plumbline check --help'],
      [['check', 'a.json', 'b.json'], 'plumbline: check: unexpected argument "b.json"'],
      [['check', '--frob', DEMO], 'plumbline: unknown option --frob for "check"; see plumbline check --help'],
      [['check', '--to', 'furlongs', DEMO], 'plumbline: --to: must be one of metric, imperial, got "furlongs"'],
      [['check', DEMO, '--to'], 'plumbline: --to needs a value (metric|imperial)'],
      [['levitate'], `plumbline: unknown command "levitate"; commands: ${COMMANDS.map((x) => x.name).join(', ')}`],
      [['--frob'], 'plumbline: unknown option --frob; run "plumbline --help"'],
    ];
    for (const [argv, line] of cases) {
      const c = capture();
      expect(await runCli(argv, c.io), argv.join(' ')).toBe(2);
      expect(c.err, argv.join(' ')).toEqual([line]);
    }
  });

  it('--help lists every command; COMMAND --help shows its usage', async () => {
    const c = capture();
    expect(await runCli(['--help'], c.io)).toBe(0);
    const text = c.out.join('\n');
    for (const cmd of COMMANDS) expect(text).toMatch(new RegExp(`^  ${cmd.name}  `, 'm'));
    expect(text).toContain('real margins are smaller');
    const d = capture();
    expect(await runCli(['check', '--help'], d.io)).toBe(0);
    expect(d.out.join('\n').split('\n')[0]).toBe('usage: plumbline check [options] FILE');
    const e = capture();
    expect(await runCli([], e.io)).toBe(2); // no command: help, but a failing exit
    expect(e.out.join('\n')).toContain('commands:');
  });

  it('an unexpected failure: exit 1 and "plumbline: <message>", never a throw', async () => {
    const c = capture({
      out: () => {
        throw new Error('stdout went away');
      },
    });
    expect(await runCli(['check', DEMO], c.io)).toBe(1);
    expect(c.err).toEqual(['plumbline: stdout went away']);
  });
});

describe('plumbline as a child process', () => {
  const tsx = join('node_modules', 'tsx', 'dist', 'cli.mjs');
  const run = (args: string[]) => spawnSync(process.execPath, [tsx, 'src/cli/main.ts', ...args], { encoding: 'utf8' });

  it('good file → exit 0 on stdout; bad file → exit 2 with the lines on stderr', () => {
    const good = run(['check', DEMO]);
    expect(good.status).toBe(0);
    expect(good.stdout).toBe(`${DEMO}: valid (vehicle "Corrigan Ridgeback (stock)", 1 feature)\n`);
    expect(good.stderr).toBe('');
    const bad = run(['check', badFile]);
    expect(bad.status).toBe(2);
    expect(bad.stdout).toBe('');
    const lines = bad.stderr.trimEnd().split('\n');
    expect(lines[0]).toBe(`${badFile}: 4 errors`);
    expect(lines.slice(1).sort()).toEqual([...BAD_LINES].sort());
    const unknown = run(['levitate']);
    expect(unknown.status).toBe(2);
  });

  it('the npm script runs the same entry', () => {
    const text = execFileSync('npm', ['run', '-s', 'cli', '--', 'check', DEMO], { encoding: 'utf8' });
    expect(text).toBe(`${DEMO}: valid (vehicle "Corrigan Ridgeback (stock)", 1 feature)\n`);
  });
});
