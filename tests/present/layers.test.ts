/**
 * The layers (DEVELOPERS.md "Layout"): src/core imports nothing from any other layer; src/present
 * is pure (no React, three, zustand or DOM); src/view imports nothing from src/app; the display
 * factors live in one file of the presentation layer (and the scenario file's own table); nothing
 * in src spreads an array of unbounded size into Math.min / Math.max / push (a call's arguments
 * are limited to about 100 000: "Maximum call stack size exceeded").
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const ROOT = join(__dirname, '..', '..');
const SRC = join(ROOT, 'src');

function files(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (statSync(p).isDirectory()) out.push(...files(p));
    else if (/\.(ts|tsx)$/.test(name)) out.push(p);
  }
  return out;
}

const SPECIFIER = /\b(?:import|export)\s+(?:type\s+)?(?:[^'";]*?\bfrom\s*)?['"]([^'"]+)['"]|\bimport\s*\(\s*['"]([^'"]+)['"]\s*\)/g;

function specifiers(text: string): string[] {
  const out: string[] = [];
  for (const m of text.matchAll(SPECIFIER)) out.push(m[1] ?? m[2]);
  return out;
}

/** Files under `from` importing (relatively) anything under one of `to`. */
function crossings(from: string, to: readonly string[]): string[] {
  const bad: string[] = [];
  for (const f of files(join(SRC, from))) {
    for (const s of specifiers(readFileSync(f, 'utf8'))) {
      if (!s.startsWith('.')) continue;
      const target = relative(SRC, resolve(dirname(f), s));
      if (to.some((t) => target === t || target.startsWith(`${t}/`) || (t === '..' && target.startsWith('..')))) bad.push(`${relative(ROOT, f)}: ${s}`);
    }
  }
  return bad;
}

/** Spreads as a direct argument of Math.min / Math.max / push / unshift / fromCharCode (found by matching brackets). */
export function argumentSpreads(text: string): string[] {
  const found: string[] = [];
  const call = /(Math\.min|Math\.max|\.push|\.unshift|String\.fromCharCode)\s*\(/g;
  for (const m of text.matchAll(call)) {
    let depth = 0;
    for (let i = m.index! + m[0].length - 1; i < text.length; i++) {
      const c = text[i];
      if (c === '(' || c === '[' || c === '{') depth++;
      else if (c === ')' || c === ']' || c === '}') {
        depth--;
        if (depth === 0) break;
      } else if (depth === 1 && text.startsWith('...', i)) {
        found.push(text.slice(m.index!, Math.min(text.length, m.index! + 80)).split('\n')[0]);
        break;
      }
    }
  }
  return found;
}

describe('layers', () => {
  it('the checks can fail (a sample of each kind)', () => {
    expect(argumentSpreads('const a = Math.min(...zs); b.push(...xs); Math.max(f(x), ...ys.map((y) => g(y)))')).toHaveLength(3);
    expect(argumentSpreads('Math.max(a, b); out.push([...p, k]); f(...xs)')).toHaveLength(0);
    expect(specifiers("import { a } from '../app/x';\nexport * from './y';\nimport type { T } from \"../z\";")).toEqual(['../app/x', './y', '../z']);
  });

  it('src/core imports nothing from another layer', () => {
    expect(crossings('core', ['..'])).toEqual([]);
  });

  it('src/view imports nothing from src/app', () => {
    expect(crossings('view', ['app'])).toEqual([]);
  });

  it('src/present imports only the core and its own files, and no React, three, zustand or DOM', () => {
    expect(crossings('present', ['app', 'view', 'store', 'cli', 'report', 'worker'])).toEqual([]);
    const bad: string[] = [];
    for (const f of files(join(SRC, 'present'))) {
      const text = readFileSync(f, 'utf8');
      for (const s of specifiers(text)) if (/^(react|react-dom|three|@react-three\/|zustand|node:)/.test(s)) bad.push(`${relative(ROOT, f)}: ${s}`);
      if (/\b(document|window)\./.test(text)) bad.push(`${relative(ROOT, f)}: DOM`);
    }
    expect(bad).toEqual([]);
  });

  it('the display factors are written in src/present/units.ts (and the scenario file table) only', () => {
    const literal = /0\.0254|0\.3048|0\.45359237|4\.44822|Math\.PI\s*\/\s*180|180\s*\/\s*Math\.PI/;
    const bad: string[] = [];
    for (const f of files(SRC)) {
      const rel = relative(SRC, f);
      if (rel === join('present', 'units.ts') || rel.startsWith(join('core', 'scenario'))) continue;
      readFileSync(f, 'utf8')
        .split('\n')
        .forEach((line, i) => {
          if (literal.test(line) && !/^\s*(\*|\/\/)/.test(line)) bad.push(`${rel}:${i + 1}: ${line.trim()}`);
        });
    }
    expect(bad).toEqual([]);
  });

  it('no array is spread into Math.min / Math.max / push anywhere in src', () => {
    const bad: string[] = [];
    for (const f of files(SRC)) for (const s of argumentSpreads(readFileSync(f, 'utf8'))) bad.push(`${relative(ROOT, f)}: ${s}`);
    expect(bad).toEqual([]);
  });
});
