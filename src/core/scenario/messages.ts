/**
 * Wording of scenario messages: how values and field paths are shown. Every message the
 * scenario parser produces goes through these helpers, so zod's own wording never reaches a user.
 */

const MAX_SHOWN_CHARS = 40;

/** A value as shown after "got": numbers as written (NaN, Infinity, -1.6), strings quoted. */
export function describeValue(v: unknown): string {
  if (v === undefined) return 'nothing';
  if (v === null) return 'null';
  if (typeof v === 'number') return Object.is(v, -0) ? '0' : String(v);
  if (typeof v === 'string') {
    const s = v.length > MAX_SHOWN_CHARS ? `${v.slice(0, MAX_SHOWN_CHARS)}…` : v;
    return JSON.stringify(s);
  }
  if (typeof v === 'boolean') return String(v);
  if (Array.isArray(v)) {
    if (v.length <= 4 && v.every((x) => typeof x === 'number' || typeof x === 'string' || typeof x === 'boolean' || x === null)) {
      return `[${v.map(describeValue).join(', ')}]`;
    }
    return `a list of ${v.length} items`;
  }
  if (typeof v === 'object') return 'an object';
  return `a ${typeof v}`;
}

/** A bound or derived value for a message: at most 4 decimals, or 4 significant digits below 1. */
export function formatLimit(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a === 0) return '0';
  const r = a >= 1 ? Math.round(v * 1e4) / 1e4 : Number(v.toPrecision(4));
  return String(r);
}

/** A value with its unit, e.g. "2.8 m"; a bare number when the unit is "". */
export function withUnit(v: number, unit: string): string {
  return unit ? `${formatLimit(v)} ${unit}` : formatLimit(v);
}

/** Field path as written in messages: `vehicle.track.front`, `terrain.features[2].type`. */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else out += out === '' ? String(seg) : `.${String(seg)}`;
  }
  return out === '' ? '(file)' : out;
}

/**
 * Why a text may not be used, or null: control characters (C0 but tab, line feed and carriage
 * return in multi-line text; DEL; C1) are refused, so a name can never drive a terminal (ESC,
 * BEL, OSC sequences) or hide part of itself. The message names the first one and where it is.
 */
export function controlCharProblem(text: string, multiline: boolean): string | null {
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    const control = c < 0x20 || (c >= 0x7f && c <= 0x9f);
    if (!control) continue;
    if (multiline && (c === 0x09 || c === 0x0a || c === 0x0d)) continue;
    const code = `U+${c.toString(16).toUpperCase().padStart(4, '0')}`;
    const name = CONTROL_NAMES[c] ?? (c >= 0x80 ? 'a C1 control' : 'a control character');
    return `must not contain control characters${multiline ? ' (other than tab and line breaks)' : ''}, got ${code} (${name}) at character ${i + 1}`;
  }
  return null;
}

const CONTROL_NAMES: Readonly<Record<number, string>> = {
  0x00: 'NUL',
  0x07: 'BEL',
  0x08: 'backspace',
  0x09: 'tab',
  0x0a: 'line feed',
  0x0d: 'carriage return',
  0x1b: 'ESC',
  0x7f: 'DEL',
  0x9b: 'CSI',
  0x9d: 'OSC',
};

/** The message for a number outside one of its bounds: "must be ≥ 10000 N/m, got 5e-324". */
export function boundMessage(op: string, bound: number, unit: string, got: unknown): string {
  return `must be ${op} ${withUnit(bound, unit)}, got ${describeValue(got)}`;
}
