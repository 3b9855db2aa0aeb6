/**
 * Reading a scenario file's bytes or text up to the JSON data, the same way in the app and the
 * CLI: the size limit from the file size before anything is read or parsed; the encoding (UTF-8,
 * or UTF-16 with a byte-order mark, read; anything else refused with the encoding named); a scan of
 * the JSON text before it is parsed, which refuses duplicate keys (JSON.parse would keep the last
 * one silently) and a grid whose declared size is past the limit (before millions of heights
 * are built into arrays).
 */
import type { ScenarioError } from './types';
import { SCENARIO_LIMITS } from './schema';
import { formatPath } from './messages';

export type ReadResult<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly errors: ScenarioError[] };

const fail = (message: string, path = '(file)'): { ok: false; errors: ScenarioError[] } => ({ ok: false, errors: [{ path, message }] });

const MIB = 1024 * 1024;

/** The message for a file past the size limit (from its size in bytes, before it is read); null when it fits. */
export function fileSizeProblem(sizeBytes: number): string | null {
  const max = SCENARIO_LIMITS.fileBytes;
  if (sizeBytes <= max) return null;
  return `must be at most ${max} bytes (${max / MIB} MiB), got ${sizeBytes} bytes (${(sizeBytes / MIB).toFixed(1)} MiB)`;
}

/**
 * A scenario file's bytes → its text. UTF-8 (with or without a byte-order mark) and UTF-16 with a
 * byte-order mark are read; UTF-32, UTF-16 without a mark and bytes that are not valid UTF-8 are
 * refused with the encoding named.
 */
export function decodeScenarioBytes(bytes: Uint8Array): ReadResult<string> {
  const size = fileSizeProblem(bytes.length);
  if (size) return fail(size);
  const b = (i: number) => (i < bytes.length ? bytes[i] : -1);
  let encoding: 'utf-8' | 'utf-16le' | 'utf-16be' = 'utf-8';
  let start = 0;
  if ((b(0) === 0x00 && b(1) === 0x00 && b(2) === 0xfe && b(3) === 0xff) || (b(0) === 0xff && b(1) === 0xfe && b(2) === 0x00 && b(3) === 0x00)) {
    return fail('is UTF-32 text; save it as UTF-8 (or UTF-16 with a byte-order mark)');
  }
  if (b(0) === 0xef && b(1) === 0xbb && b(2) === 0xbf) start = 3;
  else if (b(0) === 0xff && b(1) === 0xfe) {
    encoding = 'utf-16le';
    start = 2;
  } else if (b(0) === 0xfe && b(1) === 0xff) {
    encoding = 'utf-16be';
    start = 2;
  } else {
    // JSON text begins with ASCII; a zero byte beside each character is UTF-16 without its mark.
    const n = Math.min(bytes.length, 1024);
    let evenZero = 0;
    let oddZero = 0;
    for (let i = 0; i < n; i++) {
      if (bytes[i] !== 0) continue;
      if (i % 2 === 0) evenZero++;
      else oddZero++;
    }
    if (evenZero + oddZero > 0) {
      const kind = oddZero > evenZero ? 'UTF-16 little-endian' : evenZero > oddZero ? 'UTF-16 big-endian' : 'binary data';
      return fail(
        kind === 'binary data'
          ? 'holds zero bytes: not a text file (save the scenario as UTF-8 JSON)'
          : `looks like ${kind} text without a byte-order mark; save it as UTF-8 (or UTF-16 with a byte-order mark)`,
      );
    }
  }
  try {
    const text = new TextDecoder(encoding, { fatal: true, ignoreBOM: true }).decode(bytes.subarray(start));
    return { ok: true, value: text };
  } catch {
    return fail(`is not valid ${encoding === 'utf-8' ? 'UTF-8' : encoding === 'utf-16le' ? 'UTF-16 little-endian' : 'UTF-16 big-endian'} text; save the scenario as UTF-8 JSON`);
  }
}

interface Frame {
  readonly object: boolean;
  /** Object: the current key; array: the current index. */
  seg: string | number;
  expectKey: boolean;
  keys: Set<string> | null;
  count: number;
  cols: number;
  rows: number;
}

/** The longest list the format has (grid heights); a longer one is refused while scanning. */
const MAX_LIST = Math.max(SCENARIO_LIMITS.gridNodes, SCENARIO_LIMITS.profilePoints, SCENARIO_LIMITS.pathStations);

function pathOf(stack: readonly Frame[], depth: number): string {
  const segs: (string | number)[] = [];
  for (let i = 0; i < depth; i++) segs.push(stack[i].seg);
  return formatPath(segs);
}

/**
 * Scan JSON text for what JSON.parse would hide or pay dearly for: a key given twice in one
 * object, a grid whose `cols × rows` is past the node limit, a list longer than any the format
 * allows. Stops at the first such problem (or at anything that is not JSON: JSON.parse then says
 * where). Allocation: one frame per open object or list.
 */
export function scanScenarioJson(text: string): ScenarioError[] {
  const stack: Frame[] = [];
  const n = text.length;
  let i = 0;
  /** A value begins in the innermost container: count it (lists) and check the list length. */
  const valueStarts = (): ScenarioError | null => {
    const top = stack[stack.length - 1];
    if (top && !top.object) {
      top.seg = top.count;
      top.count++;
      if (top.count > MAX_LIST) return { path: pathOf(stack, stack.length - 1), message: `must have at most ${MAX_LIST} values, got more` };
    }
    return null;
  };
  const gridCheck = (f: Frame): ScenarioError | null => {
    if (f.cols > 0 && f.rows > 0 && f.cols * f.rows > SCENARIO_LIMITS.gridNodes) {
      return { path: pathOf(stack, stack.length - 1), message: `cols × rows must be ≤ ${SCENARIO_LIMITS.gridNodes} nodes, got ${f.cols * f.rows}` };
    }
    return null;
  };
  while (i < n) {
    const c = text.charCodeAt(i);
    if (c === 0x20 || c === 0x0a || c === 0x0d || c === 0x09) {
      i++;
      continue;
    }
    const top = stack[stack.length - 1];
    if (c === 0x7b /* { */ || c === 0x5b /* [ */) {
      const e = valueStarts();
      if (e) return [e];
      const object = c === 0x7b;
      stack.push({ object, seg: object ? '' : 0, expectKey: object, keys: object ? new Set() : null, count: 0, cols: 0, rows: 0 });
      i++;
    } else if (c === 0x7d /* } */ || c === 0x5d /* ] */) {
      stack.pop();
      i++;
    } else if (c === 0x3a /* : */) {
      i++;
    } else if (c === 0x2c /* , */) {
      if (top?.object) top.expectKey = true;
      i++;
    } else if (c === 0x22 /* " */) {
      let j = i + 1;
      let escaped = false;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d === 0x5c) {
          escaped = true;
          j += 2;
          continue;
        }
        if (d === 0x22) break;
        j++;
      }
      if (j >= n) return [];
      if (top?.object && top.expectKey) {
        let key: string;
        try {
          key = escaped ? (JSON.parse(text.slice(i, j + 1)) as string) : text.slice(i + 1, j);
        } catch {
          return [];
        }
        top.expectKey = false;
        top.seg = key;
        if (top.keys!.has(key)) {
          return [{ path: pathOf(stack, stack.length), message: `duplicate key ${JSON.stringify(key)} in this object (each key once; JSON readers would keep only the last)` }];
        }
        top.keys!.add(key);
      } else {
        const e = valueStarts();
        if (e) return [e];
      }
      i = j + 1;
    } else {
      // A number or a literal (true, false, null).
      const e = valueStarts();
      if (e) return [e];
      let j = i;
      while (j < n) {
        const d = text.charCodeAt(j);
        if (d === 0x2c || d === 0x7d || d === 0x5d || d === 0x20 || d === 0x0a || d === 0x0d || d === 0x09) break;
        j++;
      }
      if (j === i) return [];
      if (top?.object && (top.seg === 'cols' || top.seg === 'rows')) {
        const v = Number(text.slice(i, j));
        if (Number.isInteger(v) && v > 0) {
          if (top.seg === 'cols') top.cols = v;
          else top.rows = v;
          const g = gridCheck(top);
          if (g) return [g];
        }
      }
      i = j;
    }
  }
  return [];
}

/** Control characters in a message (from a JSON error that quotes the file) shown as \u escapes. */
function escapeControls(s: string): string {
  // eslint-disable-next-line no-control-regex -- matching control characters is the point here
  return s.replace(/[\u0000-\u001f\u007f-\u009f]/g, (ch) => `\\u${ch.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

/** Line and column (1-based) of a character offset. */
function lineColumn(text: string, offset: number): { line: number; column: number } {
  let line = 1;
  let last = -1;
  for (let i = 0; i < offset && i < text.length; i++) {
    if (text.charCodeAt(i) === 10) {
      line++;
      last = i;
    }
  }
  return { line, column: offset - last };
}

/** A scenario file's text → JSON data: size, byte-order mark, the scan above, then JSON.parse. */
export function readScenarioJson(text: string): ReadResult<unknown> {
  if (typeof text !== 'string') return fail('must be text');
  if (text.length > SCENARIO_LIMITS.fileChars) return fail(`must be at most ${SCENARIO_LIMITS.fileChars} characters, got ${text.length}`);
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const scanned = scanScenarioJson(body);
  if (scanned.length > 0) return { ok: false, errors: scanned };
  try {
    return { ok: true, value: JSON.parse(body) as unknown };
  } catch (e) {
    const why = escapeControls(e instanceof Error ? e.message : String(e));
    const at = /position (\d+)/.exec(why);
    const lc = at ? lineColumn(body, Number(at[1])) : null;
    return fail(`not valid JSON${lc ? ` at line ${lc.line}, column ${lc.column}` : ''}: ${why}`);
  }
}
