/**
 * `npm test` installs the OS packages it needs (scripts/ensure-os-packages.sh): with every tool present it
 * does nothing; with tools missing it installs Debian's chromium, gdal-bin and poppler-utils when it may (root or
 * password-less sudo), and otherwise stops with a message naming the packages. The install itself is
 * not run here (PLUMBLINE_OS_DRY_RUN): the script reports the command it would run.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const SCRIPT = 'scripts/ensure-os-packages.sh';

function run(env: Record<string, string>, asNobody = false) {
  const cmd = asNobody ? 'runuser' : 'bash';
  const args = asNobody ? ['-u', 'nobody', '--', 'env', ...Object.entries(env).map(([k, v]) => `${k}=${v}`), 'bash', copyForNobody()] : [SCRIPT];
  const r = spawnSync(cmd, args, { env: { ...process.env, ...env }, encoding: 'utf8' });
  return { status: r.status, err: r.stderr };
}

function copyForNobody(): string {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-os-'));
  chmodSync(dir, 0o755);
  const p = join(dir, 'ensure.sh');
  writeFileSync(p, readFileSync(SCRIPT));
  chmodSync(p, 0o755);
  return p;
}

function emptyBin(): string {
  const d = mkdtempSync(join(tmpdir(), 'plumbline-bin-'));
  chmodSync(d, 0o755);
  return d;
}

function fullBin(fillnodata: string): string {
  const d = emptyBin();
  for (const t of ['chromium', 'gdalinfo', 'gdal_grid', 'gdaldem', 'gdallocationinfo', fillnodata, 'pdftotext']) {
    writeFileSync(join(d, t), '#!/bin/sh\n');
    chmodSync(join(d, t), 0o755);
  }
  return d;
}

const isRoot = process.getuid?.() === 0;

describe('scripts/ensure-os-packages.sh', () => {
  it('is the first step of `npm test`', () => {
    const pkg = JSON.parse(readFileSync('package.json', 'utf8')) as { scripts: Record<string, string> };
    expect(pkg.scripts.test.startsWith('bash scripts/ensure-os-packages.sh && ')).toBe(true);
  });

  it('does nothing when every tool is there (gdal_fillnodata with or without .py)', () => {
    for (const f of ['gdal_fillnodata', 'gdal_fillnodata.py']) {
      const r = run({ PLUMBLINE_OS_BIN: fullBin(f), PLUMBLINE_OS_DRY_RUN: '1' });
      expect(r.status).toBe(0);
      expect(r.err).toBe('');
    }
  });

  it.skipIf(!isRoot)('names what is missing and, as root, runs apt-get update and install of chromium gdal-bin poppler-utils', () => {
    const r = run({ PLUMBLINE_OS_BIN: emptyBin(), PLUMBLINE_OS_DRY_RUN: '1' });
    expect(r.status).toBe(0);
    expect(r.err).toContain('missing chromium gdalinfo gdal_grid gdaldem gdallocationinfo gdal_fillnodata pdftotext');
    expect(r.err).toContain('would run: apt-get update && apt-get install -y chromium gdal-bin poppler-utils');
  });

  // Needs root to switch to an unprivileged user.
  it.skipIf(!isRoot)('without root or sudo: exits 1 with the command to run', () => {
    const r = run({ PLUMBLINE_OS_BIN: emptyBin() }, true);
    expect(r.status).toBe(1);
    expect(r.err).toContain('missing chromium');
    expect(r.err).toContain('sudo apt-get update && sudo apt-get install -y chromium gdal-bin poppler-utils');
  });

  it('.ci/run installs nothing itself: only npm ci and npm test', () => {
    const ci = readFileSync('.ci/run', 'utf8').split('\n').filter((l) => !l.trim().startsWith('#'));
    expect(ci.join('\n')).not.toMatch(/apt-get/);
    expect(ci.filter((l) => /^\s*npm /.test(l) || /\bnpm (ci|test)\b/.test(l)).map((l) => l.trim())).toEqual([
      'npm ci --no-audit --no-fund',
      'npm test 2>&1 | tee "$log"',
    ]);
    expect(readFileSync('.ci/run', 'utf8')).toContain('echo "${passed} passed, ${failed} failed"');
  });
});
