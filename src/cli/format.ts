import type { OptionSpec } from './command';
import { parseUnits, unitSymbol, valueText, DEG_PER_RAD, type DisplayKind, type UnitSystem } from '../present/units';

/**
 * Readable fixed-width text for the terminal: tables with a unit in every numeric column header,
 * and aligned key/value blocks. Degrees and other display units are converted by the caller, at
 * the point of use; the core stays SI.
 */

export type Cell = string | number | boolean | null | undefined;

export interface TableColumn {
  readonly header: string;
  /** Shown in the header as "header (unit)". */
  readonly unit?: string;
  /** @default 'right' for numbers, 'left' otherwise (decided per column from its first non-empty cell) */
  readonly align?: 'left' | 'right';
  /** Decimals for numbers. @default 2 */
  readonly digits?: number;
}

export interface TableOptions {
  /** Spaces between columns. @default 2 */
  readonly gap?: number;
  /** Prefix of every line. @default '' */
  readonly indent?: string;
}

/** Shown for a missing value. */
export const EMPTY_CELL = '—';

/** Display width of a string in a monospace terminal (one column per code point). */
export function textWidth(s: string): number {
  let n = 0;
  for (const _ of s) n++;
  return n;
}

function pad(s: string, width: number, align: 'left' | 'right'): string {
  const fill = ' '.repeat(Math.max(0, width - textWidth(s)));
  return align === 'right' ? fill + s : s + fill;
}

/** A number with fixed decimals; "-0.00" shows as "0.00"; non-finite values as written. */
export function formatNumber(v: number, digits = 2): string {
  if (!Number.isFinite(v)) return String(v);
  const s = v.toFixed(digits);
  return /^-0(\.0*)?$/.test(s) ? s.slice(1) : s;
}

/** A number and its unit: "12.35 kN". */
export function formatQuantity(v: number, unit: string, digits = 2): string {
  return unit ? `${formatNumber(v, digits)} ${unit}` : formatNumber(v, digits);
}

function cellText(c: Cell, digits: number): string {
  if (c === null || c === undefined) return EMPTY_CELL;
  if (typeof c === 'number') return formatNumber(c, digits);
  if (typeof c === 'boolean') return c ? 'yes' : 'no';
  return c;
}

/** A fixed-width table: header line, a rule, then one line per row. No trailing spaces. */
export function formatTable(columns: readonly TableColumn[], rows: readonly (readonly Cell[])[], options: TableOptions = {}): string {
  const gap = ' '.repeat(options.gap ?? 2);
  const indent = options.indent ?? '';
  const headers = columns.map((c) => (c.unit ? `${c.header} (${c.unit})` : c.header));
  const texts = rows.map((r) => columns.map((c, j) => cellText(r[j], c.digits ?? 2)));
  const aligns = columns.map((c, j) => {
    if (c.align) return c.align;
    const first = rows.find((r) => r[j] !== null && r[j] !== undefined);
    return first && typeof first[j] === 'number' ? 'right' : 'left';
  });
  // Widths in one pass (no spread of a large row list into Math.max).
  const widths = columns.map((_, j) => {
    let w = textWidth(headers[j]);
    for (const t of texts) w = Math.max(w, textWidth(t[j]));
    return w;
  });
  const line = (cells: readonly string[]) => (indent + cells.map((s, j) => pad(s, widths[j], aligns[j])).join(gap)).trimEnd();
  return [line(headers), line(widths.map((w) => '-'.repeat(w))), ...texts.map(line)].join('\n');
}

/** Aligned "label  value" lines. */
export function formatKeyValues(pairs: readonly (readonly [label: string, value: string])[], options: TableOptions = {}): string {
  const indent = options.indent ?? '';
  const gap = ' '.repeat(options.gap ?? 2);
  let w = 0;
  for (const p of pairs) w = Math.max(w, textWidth(p[0]));
  return pairs.map(([k, v]) => `${indent}${pad(k, w, 'left')}${gap}${v}`.trimEnd()).join('\n');
}

/** Radians to degrees, for display only. */
export function radToDeg(rad: number): number {
  return rad * DEG_PER_RAD;
}

/** `--units metric|imperial` for a command's human output (the JSON stays SI). */
export const UNITS_OPTION: OptionSpec = {
  name: 'units',
  kind: 'string',
  choices: ['metric', 'imperial'],
  valueName: 'metric|imperial',
  description: "units of the printed tables (default: the scenario file's; --json stays SI)",
};

/** The units a command prints in: --units, else the scenario file's. */
export function outputUnits(options: Readonly<Record<string, unknown>>, fileUnits: UnitSystem): UnitSystem {
  return parseUnits(typeof options.units === 'string' ? options.units : undefined) ?? fileUnits;
}

/** A table column of a quantity: header "name (unit)", right-aligned, cells already rounded by src/present. */
export function quantityColumn(header: string, kind: DisplayKind, units: UnitSystem): TableColumn {
  const unit = unitSymbol(kind, units);
  return { header, ...(unit ? { unit } : {}), align: 'right' };
}

/** One wheel's load cell: rounded for its kind, "—" when the pose gives it none. */
export function loadCell(kind: DisplayKind, si: number | null | undefined, units: UnitSystem): string {
  return valueText(kind, si, units);
}
