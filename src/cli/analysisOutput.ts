/**
 * Shared by the analysis commands (pass, rose, lines, compare, cg): CSV text, progress lines on
 * stderr, FROM:TO:STEP ranges, and the cautions printed under every result.
 */
import { DEG_PER_RAD } from '../present/units';
import { QUASI_STATIC_CAUTION } from '../present/words';
import type { CliIO } from './command';
import { UsageError } from './command';

/**
 * Text that a spreadsheet would read as a formula (or that starts with a tab or carriage return,
 * which some spreadsheets strip before reading the rest as one): OWASP "CSV Injection" guidance.
 */
const FORMULA_START = /^[=+\-@\t\r]/;

/**
 * One CSV field (RFC 4180): quoted when it holds a comma, quote or line break. A text cell that
 * begins with = + - @, a tab or a carriage return is neutralised as the OWASP CSV-injection
 * guidance says: prefixed with a single quote, so a spreadsheet shows it as text and never runs it.
 * Numbers are written as numbers (a negative number stays a number).
 */
export function csvField(v: string | number | boolean | null | undefined): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(Number(v.toPrecision(10))) : '';
  let s = String(v);
  if (FORMULA_START.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

/** CSV text: a header line, then one line per row. */
export function formatCsv(header: readonly string[], rows: readonly (readonly (string | number | boolean | null | undefined)[])[]): string {
  return [header.map(csvField).join(','), ...rows.map((r) => r.map(csvField).join(','))].join('\n');
}

/**
 * Progress on stderr, at most one line per `everyPercent` (never on stdout, so --json and --csv
 * stay clean). Returns the callback for the core's onProgress.
 */
export function progressReporter(io: CliIO, label: string, enabled: boolean, everyPercent = 10): (done: number, total: number) => void {
  let last = -1;
  return (done, total) => {
    if (!enabled || total <= 0) return;
    const pct = Math.floor((100 * done) / total);
    const bucket = Math.floor(pct / everyPercent);
    if (bucket === last && done !== total) return;
    last = bucket;
    io.err(`${label}: ${done}/${total} (${pct} %)`);
  };
}

/** FROM:TO:STEP (or a single value) in display units; throws a UsageError naming the option. */
export function parseRange(option: string, text: string): { from: number; to: number; step: number } {
  const parts = text.split(':').map((p) => p.trim());
  const nums = parts.map((p) => (p === '' ? NaN : Number(p)));
  if (!(parts.length === 1 || parts.length === 3) || nums.some((n) => !Number.isFinite(n))) {
    throw new UsageError(`--${option}: must be FROM:TO:STEP or one number, got "${text}"`);
  }
  if (parts.length === 1) return { from: nums[0], to: nums[0], step: 1 };
  const [from, to, step] = nums;
  if (to < from) throw new UsageError(`--${option}: TO must be ≥ FROM, got "${text}"`);
  if (!(step > 0)) throw new UsageError(`--${option}: STEP must be > 0, got "${text}"`);
  if ((to - from) / step > 10_000) throw new UsageError(`--${option}: at most 10000 steps (10001 values), got "${text}"`);
  return { from, to, step };
}

/** A comma-separated list of exactly n numbers. */
export function parseNumberList(option: string, text: string, n: number): number[] {
  const parts = text.split(',').map((p) => p.trim());
  const nums = parts.map((p) => (p === '' ? NaN : Number(p)));
  if (parts.length !== n || nums.some((x) => !Number.isFinite(x))) {
    throw new UsageError(`--${option}: must be ${n} numbers separated by commas, got "${text}"`);
  }
  return nums;
}

export const CAUTION = QUASI_STATIC_CAUTION;

export { DEG_PER_RAD };
/** Radians to degrees for output, rounded to `digits` decimals; null stays null. */
export function deg(rad: number | null | undefined, digits = 3): number | null {
  if (rad === null || rad === undefined || !Number.isFinite(rad)) return null;
  return Number((rad * DEG_PER_RAD).toFixed(digits));
}
/** A length rounded for output (m or the display unit), to `digits` decimals. */
export function round(v: number | null | undefined, digits = 4): number | null {
  if (v === null || v === undefined || !Number.isFinite(v)) return null;
  return Number(v.toFixed(digits));
}
