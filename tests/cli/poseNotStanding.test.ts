/**
 * `pose` on a pose that does not stand: the demo side hill tilted 45° more, left side down (its
 * rigid side-tip bound is well below that: SSF-type bound atan((T/2)/h) with T 1.51 m, h ≈ 0.95 m
 * is about 38.4°; NHTSA 2001). No load table and no loads as if real: --json has the status, the
 * tip edge and null loads per wheel; exit 1.
 */
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { runCli } from '../../src/cli/main';
import type { CliIO } from '../../src/cli/command';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-pose-'));
const file = join(dir, 'over.json');
const demo = JSON.parse(readFileSync('assets/scenarios/side-hill-stock.json', 'utf8'));
demo.tilt = { angle: 45, downhill: 'left' };
writeFileSync(file, JSON.stringify(demo));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function run(args: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const io: CliIO = { out: (l) => void out.push(l), err: (l) => void err.push(l), readFile: (p) => readFileSync(p, 'utf8') };
  return { code: runCli(args, io), out, err };
}

describe('pose past the tip', () => {
  it('--json: status, standing false, the tip edge, loadN null per wheel; exit 1', async () => {
    const r = run(['pose', '--json', file]);
    expect(await r.code).toBe(1);
    const j = JSON.parse(r.out.join('\n'));
    expect(j.standing).toBe(false);
    expect(['tipped', 'unstable', 'not-converged']).toContain(j.status);
    expect(j.tip.edge).toEqual(['FL', 'RL']);
    for (const w of ['FL', 'FR', 'RL', 'RR']) {
      expect(j.wheels[w].loadN).toBeNull();
      expect(j.wheels[w].frictionDemand).toBeNull();
      expect(j.wheels[w].travelM).toBeNull();
    }
  });

  it('human output: "goes over", no load table; exit 1', async () => {
    const r = run(['pose', file]);
    expect(await r.code).toBe(1);
    const text = r.out.join('\n');
    expect(text).toMatch(/goes over: this pose does not stand/);
    expect(text).not.toMatch(/grip needed|travel used|of static/);
    expect(text).not.toMatch(/force-angle margin/);
  });
});
