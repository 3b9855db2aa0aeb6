/**
 * The core is pure (RULES.md; EXAMPLES.md §1): nothing under src/core imports react, react-dom,
 * three, @react-three/*, zustand, node:* or Node's fs / path. Scans every source file's import,
 * export-from, dynamic import() and require() specifiers and lists the offenders.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(__dirname, '..', '..', '..');
const CORE = join(ROOT, 'src', 'core');

const FORBIDDEN: RegExp[] = [
  /^react(\/.*)?$/,
  /^react-dom(\/.*)?$/,
  /^three(\/.*)?$/,
  /^@react-three\//,
  /^zustand(\/.*)?$/,
  /^node:/,
  /^fs(\/.*)?$/,
  /^path(\/.*)?$/,
];

const SPECIFIER = [
  /\bimport\s+(?:type\s+)?[^'"]*?\bfrom\s*['"]([^'"]+)['"]/g,
  /\bimport\s*['"]([^'"]+)['"]/g,
  /\bexport\s+[^'"]*?\bfrom\s*['"]([^'"]+)['"]/g,
  /\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)/g,
  /\brequire\s*\(\s*['"]([^'"]+)['"]\s*\)/g,
];

function sourceFiles(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...sourceFiles(p));
    else if (/\.(ts|tsx|js|mjs|cjs|jsx)$/.test(name)) out.push(p);
  }
  return out;
}

function specifiers(text: string): string[] {
  const found: string[] = [];
  for (const re of SPECIFIER) for (const m of text.matchAll(re)) found.push(m[1]);
  return found;
}

describe('pure core', () => {
  it('the scanner catches each kind of import (so the check can fail)', () => {
    const sample = [
      "import * as THREE from 'three';",
      "import type { Vector3 } from 'three/src/math/Vector3';",
      "import 'react';",
      "export { create } from 'zustand/vanilla';",
      "const fs = await import('node:fs');",
      "const p = require('path');",
      "import { Canvas } from '@react-three/fiber';",
      "import { x } from './local';",
    ].join('\n');
    const bad = specifiers(sample).filter((s) => FORBIDDEN.some((re) => re.test(s)));
    expect(bad.sort()).toEqual(['@react-three/fiber', 'node:fs', 'path', 'react', 'three', 'three/src/math/Vector3', 'zustand/vanilla'].sort());
  });

  it('no file under src/core imports react, three, @react-three/*, zustand, node:*, fs or path', () => {
    const files = sourceFiles(CORE);
    expect(files.length).toBeGreaterThan(5);
    const offenders: string[] = [];
    for (const f of files) {
      for (const s of specifiers(readFileSync(f, 'utf8'))) {
        if (FORBIDDEN.some((re) => re.test(s))) offenders.push(`${relative(ROOT, f)}: ${s}`);
      }
    }
    expect(offenders, `impure imports in the core:\n${offenders.join('\n')}`).toEqual([]);
  });
});
