/**
 * Hardening: scenario and CSV parsing under hostile input (fast-check, fixed seed, so every run
 * sees the same cases). Inputs are built by mutating the bundled demo scenarios
 * (assets/scenarios/*.json): keys deleted, renamed, retyped or added (prototype-pollution keys
 * included, at every level), huge and tiny numbers, NaN and Infinity written into the JSON text,
 * 10,000-level nesting, 1 MB strings, byte-order marks, bytes that are not UTF-8, truncated files,
 * garbage spliced in, and grids whose size does not match their heights.
 *
 * Contract checked for every input (the hardening issue): the entry point returns (never throws);
 * an accepted scenario is finite everywhere and one solve of it gives a typed outcome without
 * throwing and without NaN/Infinity; a rejected one carries messages that each name a field path
 * (`path: message`, path non-empty); no input takes more than PER_INPUT_MS; global state is
 * unchanged (no new keys on Object.prototype / Array.prototype, and the demo parses to the same
 * scenario before and after).
 */
import fc from 'fast-check';
import { readdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildModel, parseScenario, parseScenarioText, solveEquilibrium, type ParseResult } from '../../src/core/index';
import { MAX_CSV_ERRORS, gridFromCsv, parseCsvNumbers, profileFromCsv } from '../../src/core/scenario/csv';

const SEED = 7_2026_31;
/** Generated scenario inputs per run (the issue asks for at least 10,000). */
const SCENARIO_RUNS = 10_000;
/** Generated CSV inputs per run, on top of the scenario inputs. */
const CSV_RUNS = 4_000;
/** Bound on one input: parse, plus one solve when accepted (the issue: no hangs; the brief: 2 s). */
const PER_INPUT_MS = 2_000;
const STATUSES = ['converged', 'tipped', 'no-contact', 'not-converged', 'unstable'];

const SCENARIO_DIR = resolve(import.meta.dirname, '../../assets/scenarios');
const DEMO_FILES = readdirSync(SCENARIO_DIR)
  .filter((f) => f.endsWith('.json'))
  .sort();
const DEMO_TEXT = DEMO_FILES.map((f) => readFileSync(resolve(SCENARIO_DIR, f), 'utf8'));
const DEMOS: unknown[] = DEMO_TEXT.map((t) => JSON.parse(t));
const STOCK_TEXT = readFileSync(resolve(SCENARIO_DIR, 'side-hill-stock.json'), 'utf8');

// ---------------------------------------------------------------------------------------------
// Checks

/** Path of the first non-finite number in v (typed arrays included), or null. */
function firstNonFinite(v: unknown, path = '$', seen = new Set<unknown>()): string | null {
  if (typeof v === 'number') return Number.isFinite(v) ? null : path;
  if (v === null || typeof v !== 'object') return null;
  if (seen.has(v)) return null;
  seen.add(v);
  if (ArrayBuffer.isView(v)) {
    const a = v as unknown as ArrayLike<number>;
    for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) return `${path}[${i}]`;
    return null;
  }
  if (Array.isArray(v)) {
    for (let i = 0; i < v.length; i++) {
      const p = firstNonFinite(v[i], `${path}[${i}]`, seen);
      if (p) return p;
    }
    return null;
  }
  for (const [k, x] of Object.entries(v)) {
    const p = firstNonFinite(x, `${path}.${k}`, seen);
    if (p) return p;
  }
  return null;
}

interface Tally {
  inputs: number;
  calls: number;
  accepted: number;
  rejected: number;
  crashes: number;
  hangs: number;
  nanOutputs: number;
  unnamed: number;
  solved: Record<string, number>;
  maxMs: number;
  /** Total time inside the entry points and solves (ms). */
  totalMs: number;
  /** Longest message + path seen (a value echoed in full would make this huge). */
  maxMessageChars: number;
  failures: string[];
}

const newTally = (): Tally => ({
  inputs: 0,
  calls: 0,
  accepted: 0,
  rejected: 0,
  crashes: 0,
  hangs: 0,
  nanOutputs: 0,
  unnamed: 0,
  solved: {},
  maxMs: 0,
  totalMs: 0,
  maxMessageChars: 0,
  failures: [],
});

const short = (s: string, n = 160): string => (s.length > n ? `${s.slice(0, n)}… (${s.length} chars)` : s);

/**
 * Runs one entry point on one input and checks the contract. Returns a problem in words, or null.
 * Accepted scenarios are solved once (cold) at their own pose and tilt.
 */
function checkCall(t: Tally, what: string, call: () => ParseResult): string | null {
  t.calls++;
  const t0 = performance.now();
  let r: ParseResult;
  try {
    r = call();
  } catch (e) {
    t.crashes++;
    return `${what}: threw ${(e as Error)?.stack ?? String(e)}`;
  }
  let problem: string | null = null;
  if (r.ok) {
    t.accepted++;
    const bad = firstNonFinite(r.scenario, 'scenario');
    if (bad) {
      t.nanOutputs++;
      problem = `${what}: accepted with a non-finite value at ${bad}`;
    } else {
      try {
        const s = r.scenario;
        const model = buildModel(s.vehicle, s.terrain);
        const res = solveEquilibrium(model, s.pose, { tilt: s.tilt, friction: s.friction });
        t.solved[res.status] = (t.solved[res.status] ?? 0) + 1;
        const badR = firstNonFinite(res, 'result');
        if (!STATUSES.includes(res.status)) problem = `${what}: solve gave an unknown status ${String(res.status)}`;
        else if (badR) {
          t.nanOutputs++;
          problem = `${what}: solve of an accepted scenario gave a non-finite value at ${badR} (status ${res.status})`;
        } else if (res.status !== 'converged' && !(typeof res.reason === 'string' && res.reason.length > 0)) {
          problem = `${what}: ${res.status} without a reason`;
        }
      } catch (e) {
        t.crashes++;
        problem = `${what}: solve of an accepted scenario threw ${(e as Error)?.stack ?? String(e)}`;
      }
    }
  } else {
    t.rejected++;
    if (!Array.isArray(r.errors) || r.errors.length === 0) problem = `${what}: rejected without any message`;
    for (const e of r.errors ?? []) {
      t.maxMessageChars = Math.max(t.maxMessageChars, String(e.path).length + String(e.message).length);
      if (typeof e.path !== 'string' || e.path.length === 0 || typeof e.message !== 'string' || e.message.length === 0) {
        t.unnamed++;
        problem = `${what}: a message without a field path: ${short(JSON.stringify(e))}`;
        break;
      }
    }
  }
  const ms = performance.now() - t0;
  t.maxMs = Math.max(t.maxMs, ms);
  t.totalMs += ms;
  if (ms > PER_INPUT_MS) {
    t.hangs++;
    problem ??= `${what}: took ${ms.toFixed(0)} ms (> ${PER_INPUT_MS} ms)`;
  }
  return problem;
}

// ---------------------------------------------------------------------------------------------
// Hostile values and mutations of the demo scenarios

const POLLUTION_KEYS = ['__proto__', 'constructor', 'prototype'] as const;
const ONE_MB = 1 << 20;
const LONG_STRING = 'x'.repeat(ONE_MB);
const DEEP = 10_000;

/** 10,000 levels of objects (built without recursion). */
function deepObject(levels: number): unknown {
  const root: Record<string, unknown> = {};
  let o = root;
  for (let i = 0; i < levels; i++) {
    const next: Record<string, unknown> = {};
    o.a = next;
    o = next;
  }
  return root;
}
function deepArray(levels: number): unknown {
  const root: unknown[] = [];
  let o = root;
  for (let i = 0; i < levels; i++) {
    const next: unknown[] = [];
    o.push(next);
    o = next;
  }
  return root;
}
const DEEP_OBJECT = deepObject(DEEP);
const DEEP_ARRAY = deepArray(DEEP);
const DEEP_TEXT_ARRAY = '['.repeat(DEEP) + ']'.repeat(DEEP);
const DEEP_TEXT_OBJECT = '{"a":'.repeat(DEEP) + '1' + '}'.repeat(DEEP);

/** Values described by tags (so fast-check never clones or prints a 10,000-level object). */
type ValueSpec =
  | { readonly t: 'value'; readonly v: unknown }
  | { readonly t: 'deep-object' }
  | { readonly t: 'deep-array' }
  | { readonly t: 'long-string' }
  | { readonly t: 'long-key' }
  | { readonly t: 'cycle' }
  | { readonly t: 'polluter'; readonly key: (typeof POLLUTION_KEYS)[number] };

const HOSTILE_NUMBERS = [
  1e308, -1e308, Number.MAX_VALUE, 5e-324, -5e-324, -0, 0, NaN, Infinity, -Infinity, 2 ** 53 + 2, -(2 ** 31), 1e-300, 1e300,
  0.1 + 0.2, 4_194_305, 4_194_304, 2048, 2049, 1e21, 1, -1, 360, 361, 90, 180, -180.0000001,
];
const HOSTILE_STRINGS = ['', ' ', '2.8', 'NaN', 'Infinity', '1e999', 'metric', 'imperial', 'grid', 'plane', 'solid', 'independent', 'left', 'disconnected', '__proto__', 'constructor', '\u0000', '\uFEFF', '\uD800', '\uDFFF\uD800', '🚙', 'null', 'true', '{}', '[]'];

const valueSpecArb: fc.Arbitrary<ValueSpec> = fc.oneof(
  { weight: 6, arbitrary: fc.constantFrom(...HOSTILE_NUMBERS).map((v): ValueSpec => ({ t: 'value', v })) },
  { weight: 2, arbitrary: fc.double().map((v): ValueSpec => ({ t: 'value', v })) },
  { weight: 1, arbitrary: fc.integer().map((v): ValueSpec => ({ t: 'value', v })) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 24 }).map((v): ValueSpec => ({ t: 'value', v })) },
  { weight: 2, arbitrary: fc.constantFrom(...HOSTILE_STRINGS).map((v): ValueSpec => ({ t: 'value', v })) },
  {
    weight: 2,
    arbitrary: fc
      .constantFrom<unknown>(null, undefined, true, false, [], {}, [1, 2], [NaN, 1], [1, 2, 3], [[0, 0]], { type: 'grid' }, { type: 'plane' })
      .map((v): ValueSpec => ({ t: 'value', v: structuredClone(v) })),
  },
  {
    weight: 2,
    arbitrary: fc
      .anything({
        maxDepth: 3,
        maxKeys: 4,
        withNullPrototype: true,
        withBigInt: true,
        withDate: true,
        withMap: true,
        withSet: true,
        withTypedArray: true,
        withSparseArray: true,
        withBoxedValues: true,
        withObjectString: true,
      })
      .map((v): ValueSpec => ({ t: 'value', v })),
  },
  { weight: 1, arbitrary: fc.constant<ValueSpec>({ t: 'deep-object' }) },
  { weight: 1, arbitrary: fc.constant<ValueSpec>({ t: 'deep-array' }) },
  { weight: 1, arbitrary: fc.constant<ValueSpec>({ t: 'long-string' }) },
  { weight: 1, arbitrary: fc.constant<ValueSpec>({ t: 'long-key' }) },
  { weight: 1, arbitrary: fc.constant<ValueSpec>({ t: 'cycle' }) },
  { weight: 2, arbitrary: fc.constantFrom(...POLLUTION_KEYS).map((key): ValueSpec => ({ t: 'polluter', key })) },
);

/** A value whose own key `key` would pollute a prototype if a parser assigned it naively. */
function polluter(key: (typeof POLLUTION_KEYS)[number]): unknown {
  const o: Record<string, unknown> = {};
  const inner = key === '__proto__' ? { polluted: 'yes' } : { prototype: { polluted: 'yes' }, polluted: 'yes' };
  Object.defineProperty(o, key, { value: inner, enumerable: true, writable: true, configurable: true });
  return o;
}

function materialise(spec: ValueSpec): unknown {
  switch (spec.t) {
    case 'value':
      return spec.v;
    case 'deep-object':
      return DEEP_OBJECT;
    case 'deep-array':
      return DEEP_ARRAY;
    case 'long-string':
      return LONG_STRING;
    case 'long-key': {
      const o: Record<string, unknown> = {};
      o[LONG_STRING] = 1;
      return o;
    }
    case 'cycle': {
      const o: Record<string, unknown> = { a: 1 };
      o.self = o;
      return o;
    }
    case 'polluter':
      return polluter(spec.key);
  }
}

type Op =
  | { readonly op: 'delete'; readonly at: number }
  | { readonly op: 'set'; readonly at: number; readonly value: ValueSpec }
  | { readonly op: 'rename'; readonly at: number; readonly to: string }
  | { readonly op: 'extra'; readonly at: number; readonly key: string; readonly value: ValueSpec }
  | { readonly op: 'copy'; readonly at: number; readonly from: number }
  | { readonly op: 'wrap'; readonly at: number; readonly inList: boolean }
  | { readonly op: 'grid'; readonly at: number; readonly cols: number; readonly rows: number; readonly count: number; readonly cell: ValueSpec };

const keyArb = fc.oneof(
  { weight: 3, arbitrary: fc.constantFrom(...POLLUTION_KEYS) },
  { weight: 2, arbitrary: fc.string({ unit: 'binary', maxLength: 12 }) },
  {
    weight: 3,
    arbitrary: fc.constantFrom('mass', 'Mass', 'wheelbase', 'type', 'heights', 'cols', 'rows', 'units', 'version', 'name', 'x', 'y', '0', '', ' ', 'toString', 'valueOf', 'hasOwnProperty', '__defineGetter__', '$schema'),
  },
);
const gridSizeArb = fc.oneof(fc.constantFrom(-1, 0, 1, 2, 3, 2.5, NaN, 1e9, 2048, 2049, 4_194_304, 1e308), fc.integer({ min: 0, max: 40 }));
const opArb: fc.Arbitrary<Op> = fc.oneof(
  { weight: 3, arbitrary: fc.record({ op: fc.constant('delete' as const), at: fc.nat() }) },
  { weight: 6, arbitrary: fc.record({ op: fc.constant('set' as const), at: fc.nat(), value: valueSpecArb }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('rename' as const), at: fc.nat(), to: keyArb }) },
  { weight: 3, arbitrary: fc.record({ op: fc.constant('extra' as const), at: fc.nat(), key: keyArb, value: valueSpecArb }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('copy' as const), at: fc.nat(), from: fc.nat() }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('wrap' as const), at: fc.nat(), inList: fc.boolean() }) },
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('grid' as const),
      at: fc.nat(),
      cols: gridSizeArb,
      rows: gridSizeArb,
      count: fc.integer({ min: 0, max: 60 }),
      cell: valueSpecArb,
    }),
  },
);

/** Every (container, key) slot of a tree, depth first; containers are objects and arrays. */
function slots(root: unknown): { parent: Record<string, unknown> | unknown[]; key: string | number }[] {
  const out: { parent: Record<string, unknown> | unknown[]; key: string | number }[] = [];
  const stack: unknown[] = [root];
  const seen = new Set<unknown>();
  while (stack.length > 0 && out.length < 5000) {
    const n = stack.pop();
    if (n === null || typeof n !== 'object' || seen.has(n) || ArrayBuffer.isView(n)) continue;
    // Do not walk into the shared 10,000-level structures or huge lists.
    if (n === DEEP_OBJECT || n === DEEP_ARRAY) continue;
    seen.add(n);
    if (Array.isArray(n)) {
      for (let i = 0; i < n.length && i < 64; i++) {
        out.push({ parent: n, key: i });
        stack.push(n[i]);
      }
    } else if (Object.getPrototypeOf(n) === Object.prototype || Object.getPrototypeOf(n) === null) {
      for (const k of Object.keys(n)) {
        out.push({ parent: n as Record<string, unknown>, key: k });
        stack.push((n as Record<string, unknown>)[k]);
      }
    }
  }
  return out;
}
function containers(root: unknown): (Record<string, unknown> | unknown[])[] {
  const out: (Record<string, unknown> | unknown[])[] = [];
  if (root !== null && typeof root === 'object') out.push(root as Record<string, unknown>);
  for (const s of slots(root)) {
    const v = (s.parent as Record<string | number, unknown>)[s.key];
    if (v !== null && typeof v === 'object' && !ArrayBuffer.isView(v) && v !== DEEP_OBJECT && v !== DEEP_ARRAY) out.push(v as Record<string, unknown>);
  }
  return out;
}

/** Define (never assign): a "__proto__" key stays an own key, as JSON.parse makes it. */
function put(parent: Record<string, unknown> | unknown[], key: string | number, value: unknown): void {
  Object.defineProperty(parent, key, { value, enumerable: true, writable: true, configurable: true });
}

function applyOp(root: unknown, op: Op): unknown {
  const all = slots(root);
  switch (op.op) {
    case 'delete': {
      if (all.length === 0) return undefined;
      const s = all[op.at % all.length];
      if (Array.isArray(s.parent)) s.parent.splice(s.key as number, 1);
      else delete s.parent[s.key as string];
      return root;
    }
    case 'set': {
      if (all.length === 0) return materialise(op.value);
      const s = all[op.at % all.length];
      put(s.parent, s.key, materialise(op.value));
      return root;
    }
    case 'rename': {
      const objs = all.filter((s) => !Array.isArray(s.parent));
      if (objs.length === 0) return root;
      const s = objs[op.at % objs.length];
      const p = s.parent as Record<string, unknown>;
      const v = p[s.key as string];
      delete p[s.key as string];
      put(p, op.to, v);
      return root;
    }
    case 'extra': {
      const cs = containers(root);
      if (cs.length === 0) return root;
      const c = cs[op.at % cs.length];
      if (Array.isArray(c)) c.push(materialise(op.value));
      else put(c, op.key, materialise(op.value));
      return root;
    }
    case 'copy': {
      if (all.length < 2) return root;
      const a = all[op.at % all.length];
      const b = all[op.from % all.length];
      const v = (b.parent as Record<string | number, unknown>)[b.key];
      let copy: unknown;
      try {
        copy = structuredClone(v);
      } catch {
        copy = v;
      }
      put(a.parent, a.key, copy);
      return root;
    }
    case 'wrap': {
      if (all.length === 0) return op.inList ? [root] : { value: root };
      const s = all[op.at % all.length];
      const v = (s.parent as Record<string | number, unknown>)[s.key];
      put(s.parent, s.key, op.inList ? [v] : { value: v });
      return root;
    }
    case 'grid': {
      // A grid whose cols × rows does not (or does) match its heights, added to or put in place of a feature.
      const cell = materialise(op.cell);
      const heights: unknown[] = [];
      for (let i = 0; i < op.count; i++) heights.push(i % 7 === 3 ? cell : (i % 5) * 0.01);
      const grid = { type: 'grid', origin: [-5, -5], spacing: 0.5, cols: op.cols, rows: op.rows, heights };
      const features = (root as { terrain?: { features?: unknown } } | null)?.terrain?.features;
      if (Array.isArray(features)) {
        if (features.length > 0 && op.at % 2 === 0) features[op.at % features.length] = grid;
        else features.push(grid);
      } else if (root !== null && typeof root === 'object' && !Array.isArray(root)) {
        put(root as Record<string, unknown>, 'terrain', { features: [grid] });
      }
      return root;
    }
  }
}

type TextOp =
  | { readonly op: 'none' }
  | { readonly op: 'truncate'; readonly at: number }
  | { readonly op: 'splice'; readonly at: number; readonly garbage: string }
  | { readonly op: 'number'; readonly at: number; readonly literal: string }
  | { readonly op: 'string'; readonly at: number; readonly long: boolean }
  | { readonly op: 'bom'; readonly kind: number; readonly at: number }
  | { readonly op: 'bytes'; readonly at: readonly number[]; readonly bytes: readonly number[]; readonly latin1: boolean }
  | { readonly op: 'nest'; readonly at: number; readonly objects: boolean }
  | { readonly op: 'pollute'; readonly at: number; readonly key: (typeof POLLUTION_KEYS)[number] }
  | { readonly op: 'syntax'; readonly at: number; readonly junk: string };

const BAD_LITERALS = ['NaN', 'Infinity', '-Infinity', '1e999', '-1e999', '1e-400', '5e-325', '0x10', '01', '.5', '+1', '1.', '-', '1e', '--1', '1_000', '1,5', 'undefined', 'null', 'true', '"1"', '-0', '1e308', '5e-324'];
const BAD_BYTES = [0x80, 0xbf, 0xc0, 0xc1, 0xc3, 0xe2, 0xed, 0xf0, 0xf4, 0xf5, 0xfe, 0xff, 0x00, 0x1b];
const fractionArb = fc.double({ min: 0, max: 1, noNaN: true, maxExcluded: true });
const textOpArb: fc.Arbitrary<TextOp> = fc.oneof(
  { weight: 5, arbitrary: fc.constant<TextOp>({ op: 'none' }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('truncate' as const), at: fractionArb }) },
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('splice' as const),
      at: fractionArb,
      garbage: fc.oneof(fc.string({ unit: 'binary', minLength: 1, maxLength: 8 }), fc.constantFrom(',', '}', ']', '"', '\\', ':', '{"', '\u0000', '\uFFFD', '//x\n', '/* */')),
    }),
  },
  { weight: 4, arbitrary: fc.record({ op: fc.constant('number' as const), at: fc.nat(), literal: fc.constantFrom(...BAD_LITERALS) }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('string' as const), at: fc.nat(), long: fc.boolean() }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('bom' as const), kind: fc.integer({ min: 0, max: 5 }), at: fractionArb }) },
  {
    weight: 2,
    arbitrary: fc.record({
      op: fc.constant('bytes' as const),
      at: fc.array(fractionArb, { minLength: 1, maxLength: 4 }),
      bytes: fc.array(fc.constantFrom(...BAD_BYTES), { minLength: 1, maxLength: 4 }),
      latin1: fc.boolean(),
    }),
  },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('nest' as const), at: fc.nat(), objects: fc.boolean() }) },
  { weight: 2, arbitrary: fc.record({ op: fc.constant('pollute' as const), at: fc.nat(), key: fc.constantFrom(...POLLUTION_KEYS) }) },
  { weight: 1, arbitrary: fc.record({ op: fc.constant('syntax' as const), at: fractionArb, junk: fc.constantFrom(',', ',,', ',}', "'a'", 'a:1', '\n', '\t', '\u2028') }) },
);

const NUMBER_LITERAL = /-?\d+(?:\.\d+)?(?:[eE][+-]?\d+)?/g;
const STRING_LITERAL = /"(?:[^"\\]|\\.)*"/g;

function nthMatch(text: string, re: RegExp, n: number): RegExpExecArray | null {
  const all = [...text.matchAll(re)];
  return all.length === 0 ? null : (all[n % all.length] as RegExpExecArray);
}

function applyTextOp(text: string, op: TextOp): string {
  const pos = (f: number) => Math.floor(f * (text.length + 1));
  switch (op.op) {
    case 'none':
      return text;
    case 'truncate':
      return text.slice(0, pos(op.at));
    case 'splice': {
      const p = pos(op.at);
      return text.slice(0, p) + op.garbage + text.slice(p);
    }
    case 'number': {
      const m = nthMatch(text, NUMBER_LITERAL, op.at);
      return m ? text.slice(0, m.index) + op.literal + text.slice(m.index + m[0].length) : text + op.literal;
    }
    case 'string': {
      const m = nthMatch(text, STRING_LITERAL, op.at);
      const s = op.long ? `"${LONG_STRING}"` : '""';
      return m ? text.slice(0, m.index) + s + text.slice(m.index + m[0].length) : s;
    }
    case 'bom': {
      const p = pos(op.at);
      switch (op.kind) {
        case 0:
          return '\uFEFF' + text;
        case 1:
          return '\uFEFF\uFEFF' + text;
        case 2:
          return text.slice(0, p) + '\uFEFF' + text.slice(p);
        case 3:
          // UTF-8 BOM bytes read as Latin-1.
          return '\u00EF\u00BB\u00BF' + text;
        case 4: {
          // UTF-16LE file (with its BOM) read as UTF-8.
          const u16 = new Uint8Array(2 + text.length * 2);
          u16[0] = 0xff;
          u16[1] = 0xfe;
          for (let i = 0; i < text.length; i++) {
            u16[2 + 2 * i] = text.charCodeAt(i) & 0xff;
            u16[3 + 2 * i] = text.charCodeAt(i) >> 8;
          }
          return new TextDecoder('utf-8').decode(u16);
        }
        default:
          return '\uFFFE' + text;
      }
    }
    case 'bytes': {
      // Bytes that are not UTF-8 spliced into the UTF-8 file, read back as a browser's File.text() does.
      const enc = new TextEncoder().encode(text);
      const at = [...op.at].map((f) => Math.floor(f * (enc.length + 1))).sort((a, b) => a - b);
      const bytes = new Uint8Array(enc.length + at.length);
      let from = 0;
      at.forEach((p, i) => {
        bytes.set(enc.subarray(from, p), from + i);
        bytes[p + i] = op.bytes[i % op.bytes.length];
        from = p;
      });
      bytes.set(enc.subarray(from), from + at.length);
      return op.latin1 ? new TextDecoder('latin1').decode(bytes) : new TextDecoder('utf-8').decode(bytes);
    }
    case 'nest': {
      const m = nthMatch(text, NUMBER_LITERAL, op.at);
      const deep = op.objects ? DEEP_TEXT_OBJECT : DEEP_TEXT_ARRAY;
      return m ? text.slice(0, m.index) + deep + text.slice(m.index + m[0].length) : deep;
    }
    case 'pollute': {
      // An own "__proto__" (or "constructor", "prototype") key right after one of the objects' "{".
      const opens = [...text.matchAll(/\{/g)];
      const value = op.key === '__proto__' ? '{"polluted":"yes"}' : '{"prototype":{"polluted":"yes"},"polluted":"yes"}';
      if (opens.length === 0) return `{"${op.key}":${value}}`;
      const p = opens[op.at % opens.length].index! + 1;
      const after = text.slice(p).trimStart();
      const sep = after.startsWith('}') ? '' : ',';
      return text.slice(0, p) + `"${op.key}":${value}${sep}` + text.slice(p);
    }
    case 'syntax': {
      const p = pos(op.at);
      return text.slice(0, p) + op.junk + text.slice(p);
    }
  }
}

/** A non-finite number anywhere in v (the shared deep structures hold none). */
function hasNonFinite(v: unknown, seen = new Set<unknown>()): boolean {
  if (typeof v === 'number') return !Number.isFinite(v);
  if (v === null || typeof v !== 'object' || v === DEEP_OBJECT || v === DEEP_ARRAY || seen.has(v)) return false;
  seen.add(v);
  if (ArrayBuffer.isView(v)) return false; // written as an object of indices by JSON.stringify
  return Object.values(v).some((x) => hasNonFinite(x, seen));
}

const NON_FINITE_MARK = '\u0000nonfinite:';
/** JSON text that keeps NaN and ±Infinity as bare words (`{"mass": NaN}`), as a hand-edited file might; null when the value has no JSON text. */
function toJsonLikeText(v: unknown): string | null {
  try {
    // The replacer is slow on the 10,000-level structures: only used when there is a number to keep.
    if (!hasNonFinite(v)) return JSON.stringify(v) ?? null;
    const text = JSON.stringify(v, (_k, x) => (typeof x === 'number' && !Number.isFinite(x) ? `${NON_FINITE_MARK}${String(x)}` : x));
    if (text === undefined) return null;
    // eslint-disable-next-line no-control-regex -- the NUL marker is this replacer's own
    return text.replace(/"\u0000nonfinite:(NaN|Infinity|-Infinity)"/g, '$1');
  } catch {
    return null; // a cycle or a BigInt
  }
}

interface ScenarioInput {
  readonly demo: number;
  readonly ops: readonly Op[];
  readonly text: readonly TextOp[];
  /** Also (or only) as a value handed to parseScenario. */
  readonly asValue: boolean;
}
const scenarioInputArb: fc.Arbitrary<ScenarioInput> = fc.record({
  demo: fc.nat({ max: DEMOS.length - 1 }),
  ops: fc.array(opArb, { minLength: 0, maxLength: 4 }),
  text: fc.array(textOpArb, { minLength: 1, maxLength: 2 }),
  asValue: fc.boolean(),
});

function describeInput(inp: ScenarioInput): string {
  return JSON.stringify({ demo: DEMO_FILES[inp.demo], ops: inp.ops, text: inp.text, asValue: inp.asValue }, (_k, x) =>
    typeof x === 'number' && !Number.isFinite(x) ? String(x) : typeof x === 'bigint' ? `${x}n` : x,
  );
}

// ---------------------------------------------------------------------------------------------
// Global state

function protoKeys(): string {
  return [Object.prototype, Array.prototype, Function.prototype, String.prototype, Number.prototype]
    .map((p) => Reflect.ownKeys(p).map(String).sort().join(','))
    .join('|');
}
let protoBefore = '';
let demoBefore: ParseResult;
beforeAll(() => {
  protoBefore = protoKeys();
  demoBefore = parseScenarioText(STOCK_TEXT);
  expect(demoBefore.ok).toBe(true);
});
afterAll(() => {
  // Global state unchanged after every input of this file.
  expect(protoKeys()).toBe(protoBefore);
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  expect(parseScenarioText(STOCK_TEXT)).toEqual(demoBefore);
});

function expectGlobalsClean(): void {
  expect(protoKeys()).toBe(protoBefore);
  expect(({} as Record<string, unknown>).polluted).toBeUndefined();
  expect(Object.prototype.hasOwnProperty.call(Object.prototype, 'polluted')).toBe(false);
  expect(parseScenarioText(STOCK_TEXT)).toEqual(demoBefore);
}

function printTally(title: string, t: Tally, extra = ''): void {
  console.log(
    `[hardening] ${title}: ${t.inputs} inputs tried, ${t.calls} entry-point calls: ${t.accepted} accepted, ` +
      `${t.rejected} rejected with a message; crashes ${t.crashes}, hangs (> ${PER_INPUT_MS} ms) ${t.hangs}, ` +
      `NaN outputs ${t.nanOutputs}, messages without a path ${t.unnamed}; slowest input ${t.maxMs.toFixed(1)} ms, ${(t.totalMs / 1000).toFixed(1)} s in all; ` +
      `longest message ${t.maxMessageChars} chars; solves of accepted: ${JSON.stringify(t.solved)}${extra}`,
  );
}

// ---------------------------------------------------------------------------------------------

describe('scenario parsing under hostile input (fast-check, fixed seed)', () => {
  it(`${SCENARIO_RUNS} mutated demo scenarios: each accepted and finite (and solves to a typed outcome) or rejected with field paths; none throws or hangs`, () => {
    const t = newTally();
    fc.assert(
      fc.property(scenarioInputArb, (inp) => {
        t.inputs++;
        let value: unknown = structuredClone(DEMOS[inp.demo]);
        for (const op of inp.ops) value = applyOp(value, op);
        const problems: string[] = [];
        // As JSON text, through parseScenarioText (text mutations applied to the written form).
        let text = toJsonLikeText(value) ?? DEMO_TEXT[inp.demo];
        for (const op of inp.text) text = applyTextOp(text, op);
        const p1 = checkCall(t, 'parseScenarioText', () => parseScenarioText(text));
        if (p1) problems.push(p1);
        // As a value, through parseScenario; it must not change its input either.
        if (inp.asValue) {
          const before = toJsonLikeText(value);
          const p2 = checkCall(t, 'parseScenario', () => parseScenario(value));
          if (p2) problems.push(p2);
          if (before !== null && toJsonLikeText(value) !== before) problems.push('parseScenario changed its input');
        }
        if (({} as Record<string, unknown>).polluted !== undefined) problems.push('Object.prototype was polluted');
        if (problems.length > 0) {
          t.failures.push(`${problems.join('; ')}\n  input: ${short(describeInput(inp), 2000)}`);
          throw new Error(problems.join('; '));
        }
      }),
      { seed: SEED, numRuns: SCENARIO_RUNS, endOnFailure: true },
    );
    printTally('scenario fuzz', t);
    expect(t.inputs).toBeGreaterThanOrEqual(SCENARIO_RUNS);
    expect(t.crashes).toBe(0);
    expect(t.hangs).toBe(0);
    expect(t.nanOutputs).toBe(0);
    expect(t.unnamed).toBe(0);
    expect(t.failures).toEqual([]);
    // The mix is worth running: both outcomes occur in numbers.
    expect(t.accepted).toBeGreaterThan(SCENARIO_RUNS / 50);
    expect(t.rejected).toBeGreaterThan(SCENARIO_RUNS / 2);
    expectGlobalsClean();
  }, 600_000);
});

// Named cases: the kinds of input the issue lists, each once, with the exact input visible here.
describe('scenario parsing: named hostile inputs', () => {
  const stock = (): Record<string, any> => JSON.parse(STOCK_TEXT);
  const named: { name: string; text?: () => string; value?: () => unknown; accept?: boolean; paths?: string[] }[] = [
    { name: 'NaN as a bare word in the text ({"mass": NaN})', text: () => STOCK_TEXT.replace(/"mass":\s*[\d.]+/, '"mass": NaN'), paths: ['(file)'] },
    { name: 'Infinity as a bare word in the text', text: () => STOCK_TEXT.replace(/"wheelbase":\s*[\d.]+/, '"wheelbase": Infinity'), paths: ['(file)'] },
    { name: '1e999 (overflows to Infinity in JSON.parse)', text: () => STOCK_TEXT.replace(/"wheelbase":\s*[\d.]+/, '"wheelbase": 1e999'), paths: ['vehicle.wheelbase'] },
    { name: '1e308 wheelbase', value: () => ({ ...stock(), vehicle: { ...stock().vehicle, wheelbase: 1e308 } }), paths: ['vehicle.wheelbase'] },
    // Below the physical lower bounds (fields.ts PHYSICAL_MIN): refused at the field, never "converged" on nonsense.
    { name: '5e-324 tyre width (smallest positive double) is refused at the field', value: () => { const s = stock(); s.vehicle.tyre.width = 5e-324; return s; }, paths: ['vehicle.tyre.width'] },
    { name: '5e-324 N/m tyre stiffness is refused at the field', value: () => { const s = stock(); s.vehicle.tyre.stiffness = 5e-324; return s; }, paths: ['vehicle.tyre.stiffness'] },
    { name: 'a 1e-9 kg vehicle is refused at the field', value: () => { const s = stock(); s.vehicle.mass = 1e-9; return s; }, paths: ['vehicle.mass'] },
    { name: '-0 pose heading is accepted', value: () => ({ ...stock(), pose: { ...(stock().pose ?? {}), heading: -0 } }), accept: true },
    { name: '10,000 levels of arrays in the text', text: () => STOCK_TEXT.replace(/"notes":\s*"[^"]*"/, `"notes": ${DEEP_TEXT_ARRAY}`).replace(/^\{/, `{"deep": ${DEEP_TEXT_ARRAY},`) },
    { name: '10,000 levels of objects as a value', value: () => ({ ...stock(), deep: DEEP_OBJECT }) },
    { name: 'a 1 MB name', value: () => ({ ...stock(), name: LONG_STRING }), paths: ['name'] },
    { name: 'a 1 MB key', value: () => ({ ...stock(), [LONG_STRING]: 1 }) },
    { name: 'a 1 MB file of one string', text: () => JSON.stringify(LONG_STRING), paths: ['(file)'] },
    {
      name: '"__proto__", "constructor" and "prototype" keys in the text at every level',
      text: () => STOCK_TEXT.replace(/\{/g, '{"__proto__":{"polluted":"yes"},"constructor":{"prototype":{"polluted":"yes"}},"prototype":{"polluted":"yes"},'),
    },
    { name: 'a UTF-8 byte-order mark is accepted', text: () => '\uFEFF' + STOCK_TEXT, accept: true },
    { name: 'two byte-order marks', text: () => '\uFEFF\uFEFF' + STOCK_TEXT, paths: ['(file)'] },
    { name: 'bytes that are not UTF-8 in a string (read with replacement characters)', text: () => new TextDecoder().decode(Uint8Array.from([...new TextEncoder().encode(STOCK_TEXT.slice(0, 30)), 0xc3, 0x28, 0xff, ...new TextEncoder().encode(STOCK_TEXT.slice(30))])) },
    { name: 'a truncated file', text: () => STOCK_TEXT.slice(0, Math.floor(STOCK_TEXT.length / 2)), paths: ['(file)'] },
    { name: 'an empty file', text: () => '', paths: ['(file)'] },
    {
      name: 'a grid of 3 × 3 with 8 heights',
      value: () => { const s = stock(); s.terrain.features.push({ type: 'grid', origin: [0, 0], spacing: 0.5, cols: 3, rows: 3, heights: [0, 0, 0, 0, 0, 0, 0, 0] }); return s; },
      paths: [`terrain.features[1].heights`],
    },
    {
      name: 'a grid of 1e9 × 1e9',
      value: () => { const s = stock(); s.terrain.features.push({ type: 'grid', origin: [0, 0], spacing: 0.5, cols: 1e9, rows: 1e9, heights: [] }); return s; },
      paths: [`terrain.features[1]`],
    },
    { name: 'a cycle', value: () => { const s = stock(); s.vehicle.self = s; return s; } },
    { name: 'a BigInt, a Map and a Date', value: () => ({ ...stock(), version: 1n, pose: new Map(), notes: new Date(0) }) },
  ];
  for (const c of named) {
    it(c.name, () => {
      const t = newTally();
      const r = c.text ? parseScenarioText(c.text()) : parseScenario(c.value!());
      const problem = checkCall(t, c.name, () => r);
      expect(problem).toBeNull();
      if (c.accept !== undefined) expect(r.ok, JSON.stringify(r.ok ? r.warnings : r.errors).slice(0, 500)).toBe(c.accept);
      if (c.paths) {
        expect(r.ok).toBe(false);
        if (!r.ok) for (const p of c.paths) expect(r.errors.map((e) => e.path)).toContain(p);
      }
      expectGlobalsClean();
    });
  }
});

// ---------------------------------------------------------------------------------------------
// CSV (src/core/scenario/csv.ts): profile and grid heights from a survey or a spreadsheet.

interface CsvInput {
  readonly rows: number;
  readonly cols: number;
  readonly seed: number;
  readonly delimiter: string;
  readonly eol: string;
  readonly header: boolean;
  readonly kind: 'numbers' | 'profile' | 'grid';
  readonly muts: readonly CsvMut[];
}
type CsvMut =
  | { readonly m: 'ragged'; readonly row: number; readonly delta: number }
  | { readonly m: 'cell'; readonly row: number; readonly col: number; readonly value: string }
  | { readonly m: 'bom'; readonly kind: number }
  | { readonly m: 'bytes'; readonly at: number; readonly byte: number; readonly latin1: boolean }
  | { readonly m: 'truncate'; readonly at: number }
  | { readonly m: 'line'; readonly row: number; readonly text: string }
  | { readonly m: 'long' };

const BAD_CELLS = ['', ' ', 'NaN', 'nan', 'Infinity', '-Infinity', 'inf', '1e999', '-1e999', '1e-400', '5e-324', '-0', '1,5', '0x10', '1_0', '"1"', "'1'", '1e', '.', '-', '+', '1.2.3', '١٢', '\uFEFF1', '1\u00A0', '\u0000', 'null', '1e308', '--1', '#1', '=1+1', '@SUM(A1)'];
const csvMutArb: fc.Arbitrary<CsvMut> = fc.oneof(
  { weight: 3, arbitrary: fc.record({ m: fc.constant('ragged' as const), row: fc.nat(), delta: fc.constantFrom(-2, -1, 1, 2) }) },
  {
    weight: 5,
    arbitrary: fc.record({
      m: fc.constant('cell' as const),
      row: fc.nat(),
      col: fc.nat(),
      value: fc.oneof(fc.constantFrom(...BAD_CELLS), fc.string({ unit: 'binary', maxLength: 6 }), fc.double().map(String)),
    }),
  },
  { weight: 1, arbitrary: fc.record({ m: fc.constant('bom' as const), kind: fc.integer({ min: 0, max: 3 }) }) },
  { weight: 2, arbitrary: fc.record({ m: fc.constant('bytes' as const), at: fractionArb, byte: fc.constantFrom(...BAD_BYTES), latin1: fc.boolean() }) },
  { weight: 1, arbitrary: fc.record({ m: fc.constant('truncate' as const), at: fractionArb }) },
  { weight: 2, arbitrary: fc.record({ m: fc.constant('line' as const), row: fc.nat(), text: fc.constantFrom('', '#note', 'a,b', ';;;', '\t', ',', 'x', '1;2,3', ' , ') }) },
  { weight: 1, arbitrary: fc.constant<CsvMut>({ m: 'long' }) },
);
const csvInputArb: fc.Arbitrary<CsvInput> = fc.record({
  rows: fc.integer({ min: 0, max: 30 }),
  cols: fc.integer({ min: 1, max: 12 }),
  seed: fc.nat(),
  delimiter: fc.constantFrom(',', ';', '\t'),
  eol: fc.constantFrom('\n', '\r\n', '\r'),
  header: fc.boolean(),
  kind: fc.constantFrom('numbers' as const, 'profile' as const, 'grid' as const),
  muts: fc.array(csvMutArb, { minLength: 0, maxLength: 4 }),
});

/** A CSV text: either taken from a demo grid (trials-course) or made from the seed, then mutated. */
function csvText(inp: CsvInput): string {
  const cols = inp.kind === 'profile' ? 2 : inp.cols;
  const lines: string[][] = [];
  let x = inp.seed % 9973;
  for (let r = 0; r < inp.rows; r++) {
    const row: string[] = [];
    for (let c = 0; c < cols; c++) {
      x = (x * 1103515245 + 12345) % 2147483648;
      row.push(inp.kind === 'profile' && c === 0 ? (r * 0.25).toFixed(2) : ((x % 2000) / 1000 - 0.5).toFixed(3));
    }
    lines.push(row);
  }
  let extraLines: { at: number; text: string }[] = [];
  let pre = '';
  let post = (s: string) => s;
  for (const mu of inp.muts) {
    switch (mu.m) {
      case 'ragged':
        if (lines.length > 0) {
          const row = lines[mu.row % lines.length];
          if (mu.delta < 0) row.splice(0, Math.min(-mu.delta, row.length));
          else for (let i = 0; i < mu.delta; i++) row.push('0.1');
        }
        break;
      case 'cell':
        if (lines.length > 0) {
          const row = lines[mu.row % lines.length];
          if (row.length > 0) row[mu.col % row.length] = mu.value;
        }
        break;
      case 'bom':
        pre = ['\uFEFF', '\uFEFF\uFEFF', '\u00EF\u00BB\u00BF', '\uFFFE'][mu.kind];
        break;
      case 'bytes': {
        const prev = post;
        post = (s) => {
          const b = Array.from(new TextEncoder().encode(prev(s)));
          b.splice(Math.floor(mu.at * (b.length + 1)), 0, mu.byte);
          return new TextDecoder(mu.latin1 ? 'latin1' : 'utf-8').decode(Uint8Array.from(b));
        };
        break;
      }
      case 'truncate': {
        const prev = post;
        post = (s) => {
          const t = prev(s);
          return t.slice(0, Math.floor(mu.at * (t.length + 1)));
        };
        break;
      }
      case 'line':
        extraLines.push({ at: mu.row, text: mu.text });
        break;
      case 'long':
        if (lines.length > 0) lines[0][0] = LONG_STRING.slice(0, 1 << 18) + '1';
        else lines.push(['1'.repeat(1 << 18)]);
        break;
    }
  }
  const out = lines.map((r) => r.join(inp.delimiter));
  extraLines = extraLines.sort((a, b) => b.at - a.at);
  for (const e of extraLines) out.splice(e.at % (out.length + 1), 0, e.text);
  if (inp.header) out.unshift(inp.kind === 'profile' ? `distance${inp.delimiter}height` : 'heights');
  return post(pre + out.join(inp.eol));
}

/** A cell that reads as a plain number but overflows a double (1e999, or 400 digits): Number() gives ±Infinity. */
function hasOverflowingLiteral(text: string): boolean {
  return text.split(/[,;\t\r\n]/).some((c) => /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/.test(c.trim()) && !Number.isFinite(Number(c.trim())));
}

describe('CSV heights under hostile input (fast-check, fixed seed)', () => {
  it(`${CSV_RUNS} generated CSV files: numbers finite or errors with row and column; the feature built from them goes through parseScenario with field paths`, () => {
    const t = newTally();
    const csvNonFinite: string[] = [];
    let csvOk = 0;
    let csvRejected = 0;
    const stockFile = JSON.parse(STOCK_TEXT) as Record<string, any>;
    fc.assert(
      fc.property(csvInputArb, (inp) => {
        t.inputs++;
        const text = csvText(inp);
        const problems: string[] = [];
        const t0 = performance.now();
        let r: ReturnType<typeof parseCsvNumbers> | ReturnType<typeof profileFromCsv> | ReturnType<typeof gridFromCsv>;
        try {
          r = inp.kind === 'numbers' ? parseCsvNumbers(text) : inp.kind === 'profile' ? profileFromCsv(text) : gridFromCsv(text);
        } catch (e) {
          t.crashes++;
          throw new Error(`CSV parser threw on ${short(JSON.stringify(text), 400)}: ${(e as Error).stack}`, { cause: e });
        }
        const ms = performance.now() - t0;
        t.maxMs = Math.max(t.maxMs, ms);
        if (ms > PER_INPUT_MS) {
          t.hangs++;
          problems.push(`CSV took ${ms.toFixed(0)} ms`);
        }
        if (!r.ok) {
          csvRejected++;
          if (r.errors.length === 0 || r.errors.length > MAX_CSV_ERRORS + 1) problems.push(`CSV: ${r.errors.length} errors`);
          for (const e of r.errors) {
            t.maxMessageChars = Math.max(t.maxMessageChars, e.message.length);
            const placeOk = Number.isInteger(e.row) && e.row >= 1 && (e.column === null || (Number.isInteger(e.column) && e.column >= 1));
            if (!placeOk || e.message.length === 0) {
              t.unnamed++;
              problems.push(`CSV error without a place: ${JSON.stringify(e)}`);
            }
          }
        } else {
          csvOk++;
          const numbers: number[] = 'heights' in r ? r.heights : 'points' in r ? r.points.flat() : r.rows.flat();
          const nonFinite = numbers.filter((v) => !Number.isFinite(v));
          if (nonFinite.length > 0) csvNonFinite.push(text);
          if ('cols' in r && r.cols * r.rows !== r.heights.length) problems.push(`grid ${r.cols} × ${r.rows} with ${r.heights.length} heights`);
          // The feature, as the app builds it, through the scenario parser (and one solve).
          if (inp.kind !== 'numbers') {
            const file = structuredClone(stockFile);
            const feature =
              'cols' in r
                ? { type: 'grid', origin: [-5, -5], spacing: 0.25, cols: r.cols, rows: r.rows, heights: r.heights }
                : { type: 'profile', axis: inp.seed % 2 === 0 ? 'x' : 'y', points: (r as { points: [number, number][] }).points };
            file.terrain.features.push(feature);
            const p = checkCall(t, 'parseScenario(CSV feature)', () => parseScenario(file));
            if (p) problems.push(p);
            // The same grid, told one column too many: must be refused, naming the heights.
            if ('cols' in r && r.heights.length > 0) {
              const wrong = structuredClone(stockFile);
              wrong.terrain.features.push({ ...feature, cols: r.cols + 1 });
              const pw = parseScenario(wrong);
              if (pw.ok || !pw.errors.some((e) => e.path.startsWith('terrain.features[1]'))) {
                problems.push(`a ${r.cols + 1} × ${r.rows} grid with ${r.heights.length} heights was not refused at terrain.features[1]`);
              }
            }
          }
        }
        if (problems.length > 0) throw new Error(`${problems.join('; ')}\n  csv: ${short(JSON.stringify(text), 600)}`);
      }),
      { seed: SEED + 1, numRuns: CSV_RUNS, endOnFailure: true },
    );
    printTally('CSV fuzz (pipeline: CSV → feature → parseScenario → solve)', t, `; CSV parser: ${csvOk} ok, ${csvRejected} rejected with row/column; CSV results with a non-finite number ${csvNonFinite.length}`);
    expect(t.inputs).toBe(CSV_RUNS);
    expect(t.crashes).toBe(0);
    expect(t.hangs).toBe(0);
    expect(t.nanOutputs).toBe(0);
    expect(t.unnamed).toBe(0);
    // No CSV result carries a non-finite number (cells overflowing a double were the regression below).
    expect(csvNonFinite.map((s) => `${hasOverflowingLiteral(s) ? 'overflowing cell: ' : ''}${short(JSON.stringify(s), 300)}`)).toEqual([]);
    expect(csvOk).toBeGreaterThan(CSV_RUNS / 20);
    expect(csvRejected).toBeGreaterThan(CSV_RUNS / 5);
    expectGlobalsClean();
  }, 600_000);

  // Regression, found by this CSV fuzz: a cell that overflows a double ("1e999", or 400 digits)
  // matched the CSV number pattern and came back from parseCsvNumbers as Infinity (reported to the
  // lead; since fixed in csv.ts by its author). The scenario parser refused the resulting feature
  // either way, naming the height's path (checked below on the file form directly).
  it('regression: a cell "1e999" is refused by parseCsvNumbers with its row and column', () => {
    const r = parseCsvNumbers('0,0.1\n1,1e999\n2,0.2');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => [e.row, e.column])).toEqual([[2, 2]]);
  });
  it('regression: a cell of 400 digits is refused by parseCsvNumbers with its row and column', () => {
    const r = parseCsvNumbers(`0,0.1\n1,${'1'.repeat(400)}`);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => [e.row, e.column])).toEqual([[2, 2]]);
  });
  it('an Infinity height in a grid feature (what that CSV used to give) is refused naming its path', () => {
    const file = JSON.parse(STOCK_TEXT);
    file.terrain.features.push({ type: 'grid', origin: [0, 0], spacing: 0.5, cols: 2, rows: 2, heights: [0, 0.1, 1, Infinity] });
    const r = parseScenario(file);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => `${e.path}: ${e.message}`)).toContain('terrain.features[1].heights[3]: must be a finite number in m, got Infinity');
  });
  it('NaN, Infinity and hex cells are refused with their row and column', () => {
    const r = parseCsvNumbers('0,NaN\n1,Infinity\n2,0x10\n3,-Infinity');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.map((e) => `${e.row}:${e.column}`)).toEqual(['1:2', '2:2', '3:2', '4:2']);
  });
});
