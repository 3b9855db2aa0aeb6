/**
 * Outputs safe to open and readings no scale can show refused:
 * - CSV: a text cell beginning with = + - @, a tab or a carriage return is prefixed with a single
 *   quote (OWASP "CSV Injection" guidance), so a spreadsheet shows it as text and runs nothing;
 *   numbers (negative ones too) stay numbers.
 * - cg: non-finite, negative, past-the-format or self-contradicting readings are refused with a
 *   message naming the option and exit 2; `cg --into` never prints a scenario that `check` refuses.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { csvField, formatCsv } from '../../src/cli/analysisOutput';
import type { CliIO } from '../../src/cli/command';
import { runCli } from '../../src/cli/main';
import { parseScenario } from '../../src/core/index';
import { GRAVITY_MPS2 } from '../../src/core/solver/model';
import { printCounts, type Counts } from './safetyCounts';

const DEMO = 'assets/scenarios/ledge-crawler.json';

function capture() {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  return { io, out, err };
}

/** Splits one RFC 4180 line into its cells (quotes removed, doubled quotes undone). */
function cells(line: string): string[] {
  const out: string[] = [];
  let cur = '';
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (quoted) {
      if (ch === '"' && line[i + 1] === '"') {
        cur += '"';
        i++;
      }
      else if (ch === '"') quoted = false;
      else cur += ch;
    } else if (ch === '"') quoted = true;
    else if (ch === ',') {
      out.push(cur);
      cur = '';
    }
    else cur += ch;
  }
  out.push(cur);
  return out;
}

const PAYLOADS = ["=cmd|' /C calc'!A0", '+1+1', '-2+3+cmd|\' /C calc\'!A0', '@SUM(1+1)*cmd|\' /C calc\'!A0', '\t=1+1', '\r=1+1', '=HYPERLINK("http://127.0.0.1/","x")'];

const counts: Counts = { tried: 0, rejected: 0, accepted: 0, hung: 0, crashed: 0, lost: 0, executed: 0 };

describe('CSV cells (OWASP CSV injection guidance)', () => {
  it('every text cell that starts with = + - @ tab or CR gets a leading single quote; numbers stay numbers', () => {
    for (const p of PAYLOADS) {
      const f = csvField(p);
      const back = cells(f)[0];
      expect(back).toBe(`'${p}`);
    }
    expect(csvField(-1.25)).toBe('-1.25');
    expect(csvField('RL@5.2')).toBe('RL@5.2');
    expect(csvField('a,b')).toBe('"a,b"');
    // A whole row: no cell of it starts with a formula character.
    const text = formatCsv(['name', 'v'], PAYLOADS.map((p) => [p, -3]));
    for (const line of text.split('\n').slice(1)) {
      const [name, v] = cells(line);
      expect(name.startsWith("'")).toBe(true);
      expect(v).toBe('-3');
    }
  });

  it('compare --csv with a build named as a formula: no cell starts with = + - @', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-csv-'));
    for (const name of PAYLOADS.filter((p) => !/[\t\r]/.test(p))) {
      counts.tried++;
      const file = JSON.parse(readFileSync(DEMO, 'utf8'));
      file.builds = [{ ...file.builds[0], name }];
      const path = join(dir, 'f.json');
      writeFileSync(path, JSON.stringify(file));
      const c = capture();
      const code = await runCli(['compare', path, '--csv', '--quiet', '--rose-step', '90'], c.io);
      if (code === 2) {
        // Refused at parse time (a name rule): that is safe too, and must say why.
        expect(c.err.join('\n')).toMatch(/name/);
        counts.rejected++;
        continue;
      }
      expect(code).toBe(0);
      counts.accepted++;
      const rows = c.out.join('\n').split('\n').slice(1).map(cells);
      const ofBuild = rows.filter((r) => r[0] === `'${name}`);
      expect(ofBuild.length).toBeGreaterThan(0);
      for (const r of rows) for (const cell of r) if (/^[=+\-@\t\r]/.test(cell)) expect(Number.isFinite(Number(cell)), `cell ${JSON.stringify(cell)}`).toBe(true);
    }
  });
});

describe('cg refuses absurd readings', () => {
  const kg = (n: number) => String(n / GRAVITY_MPS2);
  const level = [kg(5200), kg(5200), kg(4800), kg(4800)].join(',');
  const base = ['--wheelbase', '2.6', '--raised-axle', 'rear', '--raise', '0.5', '--radius', '0.35', '--locked'];
  const cases: { name: string; argv: string[]; message: RegExp }[] = [
    { name: 'readings of 1e308 (the sum overflows)', argv: ['cg', '--level', '1e308,1e308,1e308,1e308', '--wheelbase', '2.6', '--json'], message: /--level: reading 1 must be between 0 and 200000 kg, got 1e\+308/ },
    { name: 'a negative reading', argv: ['cg', '--level', '500,-10,500,500', '--wheelbase', '2.6'], message: /--level: reading 2 must be between 0/ },
    { name: 'Infinity', argv: ['cg', '--level', 'Infinity,1,1,1', '--wheelbase', '2.6'], message: /--level: must be 4 numbers/ },
    { name: 'NaN', argv: ['cg', '--level', 'NaN,1,1,1', '--wheelbase', '2.6'], message: /--level: must be 4 numbers/ },
    { name: 'all zero', argv: ['cg', '--level', '0,0,0,0', '--wheelbase', '2.6'], message: /add up to more than 0/ },
    { name: 'a wheelbase of 1e308 m', argv: ['cg', '--level', level, '--wheelbase', '1e308'], message: /--wheelbase: must be more than 0 and at most 20 m/ },
    { name: 'a raise longer than the wheelbase', argv: ['cg', '--level', level, ...base.map((a) => (a === '0.5' ? '3' : a)), '--raised-loads', '500,500'], message: /--raise: must be more than 0 and less than 2\.6 m/ },
    { name: 'raised readings heavier than the vehicle', argv: ['cg', '--level', level, ...base, '--raised-loads', '5000,5000'], message: /add up to 10000 kg, more than the whole vehicle weighs on --level \(2039\.4\d* kg\)/ },
    { name: 'a negative raised reading', argv: ['cg', '--level', level, ...base, '--raised-loads', '-1,1000'], message: /--raised-loads: reading 1 must be 0 or more/ },
    { name: 'raised readings putting the CG below the ground', argv: ['cg', '--level', level, ...base, '--raised-loads', '10,10'], message: /below the ground/ },
    { name: 'a tyre radius of 1e9 m', argv: ['cg', '--level', level, ...base.map((a) => (a === '0.35' ? '1e9' : a)), '--raised-loads', kg(5500) + ',' + kg(5500)], message: /--radius: must be more than 0 and at most 3 m/ },
  ];
  for (const c of cases) {
    it(`${c.name}: exit 2, a message, nothing on stdout`, async () => {
      counts.tried++;
      const io = capture();
      const code = await runCli(c.argv, io.io);
      expect(io.err.join('\n')).toMatch(c.message);
      expect(code).toBe(2);
      expect(io.out).toEqual([]);
      counts.rejected++;
    });
  }

  it('cg --into never prints a scenario that check refuses (mass 4 kg against 315 kg unsprung)', async () => {
    counts.tried++;
    const c = capture();
    expect(await runCli(['cg', '--level', '1,1,1,1', '--wheelbase', '2.4', '--into', DEMO], c.io)).toBe(2);
    expect(c.out).toEqual([]);
    // The mass's physical lower bound (the scenario field table) refuses it first; the unsprung-mass rule would too.
    expect(c.err.join('\n')).toMatch(/nothing printed[\s\S]*vehicle\.mass: must be ≥ 20 kg, got 4/);
    counts.rejected++;
    // A sound measurement still prints, and what it prints passes the same check.
    const ok = capture();
    expect(await runCli(['cg', '--level', level, '--wheelbase', '2.4', '--into', DEMO], ok.io)).toBe(0);
    const printed = parseScenario(JSON.parse(ok.out.join('\n')));
    expect(printed.ok).toBe(true);
  });

  it('prints the counts', () => {
    printCounts('cli outputs (CSV cells, cg readings)', counts);
    expect(counts.hung + counts.crashed + counts.lost + counts.executed).toBe(0);
    expect(counts.tried).toBe(counts.rejected + counts.accepted);
  });
});
