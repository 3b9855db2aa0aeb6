/**
 * Heights from CSV text: a height profile (two columns, distance and height) or a height grid
 * (one row of heights per grid row). Plain numbers only, in the scenario file's length unit;
 * the caller turns them into a terrain feature and validates it with parseScenario, so the
 * feature's own rules (point order, grid size, limits) are reported with the field's path.
 *
 * Accepted: a UTF-8 byte-order mark, CRLF or LF line ends, comma, semicolon or tab between
 * cells (one kind per file: the one on the most lines), blank lines and lines starting with # (skipped), and one header
 * row of words. Refused, with the row and column (1-based, as a spreadsheet counts): cells that
 * are not numbers (a decimal comma included) or overflow a double (1e999), empty cells, and rows whose length differs from
 * the first data row's.
 */

/** One problem in the CSV text. Row and column are 1-based line and cell numbers of the file. */
export interface CsvError {
  readonly row: number;
  /** Null for a problem with the whole row or file. */
  readonly column: number | null;
  readonly message: string;
}

export type CsvNumbersResult =
  | { readonly ok: true; readonly rows: number[][]; readonly header: string[] | null; readonly delimiter: string }
  | { readonly ok: false; readonly errors: CsvError[] };

/** Most problems listed; the rest are counted in one last message. */
export const MAX_CSV_ERRORS = 20;

/** A plain decimal number (JSON-like, with an optional leading + and exponent). */
const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** The separator found on the most lines (comma first on a tie), so a decimal comma in a ;-file is caught as one. */
function delimiterOf(lines: readonly string[]): string {
  let best = ',';
  let bestCount = 0;
  for (const d of [',', ';', '\t']) {
    let n = 0;
    for (const l of lines) if (l.includes(d)) n++;
    if (n > bestCount) {
      best = d;
      bestCount = n;
    }
  }
  return best;
}

function describe(cell: string): string {
  return cell.length > 24 ? `"${cell.slice(0, 24)}…"` : `"${cell}"`;
}

/** Every cell as a number, or every problem with its row and column. */
export function parseCsvNumbers(text: string): CsvNumbersResult {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split(/\r\n|\n|\r/);
  const content = lines.filter((l) => l.trim() !== '' && !l.trimStart().startsWith('#'));
  if (content.length === 0) return { ok: false, errors: [{ row: 1, column: null, message: 'no rows of numbers found' }] };
  const delimiter = delimiterOf(content);
  const errors: CsvError[] = [];
  let more = 0;
  const fail = (e: CsvError) => {
    if (errors.length < MAX_CSV_ERRORS) errors.push(e);
    else more++;
  };
  const rows: number[][] = [];
  let header: string[] | null = null;
  let width = -1;
  let widthRow = 0;
  for (let i = 0; i < lines.length; i++) {
    const line = lines[i];
    if (line.trim() === '' || line.trimStart().startsWith('#')) continue;
    const cells = line.split(delimiter).map((c) => c.trim());
    const rowNo = i + 1;
    // A first row with no number in it is a header.
    if (rows.length === 0 && header === null && width < 0 && cells.every((c) => !NUMBER.test(c))) {
      header = cells;
      continue;
    }
    if (width < 0) {
      width = cells.length;
      widthRow = rowNo;
    } else if (cells.length !== width) {
      fail({ row: rowNo, column: null, message: `has ${cells.length} cell${cells.length === 1 ? '' : 's'}, expected ${width} as in row ${widthRow}` });
      continue;
    }
    const out: number[] = [];
    for (let j = 0; j < cells.length; j++) {
      const c = cells[j];
      if (c === '') fail({ row: rowNo, column: j + 1, message: 'is empty, expected a number' });
      else if (!NUMBER.test(c)) fail({ row: rowNo, column: j + 1, message: `${describe(c)} is not a number${/^\d+,\d+$/.test(c) ? ' (use a decimal point)' : ''}` });
      else {
        const v = Number(c);
        // A literal like 1e999 parses to Infinity: out of the range of a double.
        if (!Number.isFinite(v)) fail({ row: rowNo, column: j + 1, message: `${describe(c)} is too large a number` });
        else out.push(v);
      }
    }
    rows.push(out);
  }
  if (more > 0) errors.push({ row: errors[errors.length - 1].row, column: null, message: `and ${more} more problem${more === 1 ? '' : 's'}` });
  if (errors.length > 0) return { ok: false, errors };
  if (rows.length === 0) return { ok: false, errors: [{ row: 1, column: null, message: 'only a header row, no numbers' }] };
  return { ok: true, rows, header, delimiter };
}

export type CsvProfileResult = { readonly ok: true; readonly points: [number, number][] } | { readonly ok: false; readonly errors: CsvError[] };

/** A height profile: two columns, distance along the axis then height. */
export function profileFromCsv(text: string): CsvProfileResult {
  const r = parseCsvNumbers(text);
  if (!r.ok) return r;
  if (r.rows[0].length !== 2) {
    return { ok: false, errors: [{ row: 1, column: null, message: `a profile needs 2 columns (distance, height), got ${r.rows[0].length}` }] };
  }
  return { ok: true, points: r.rows.map((x) => [x[0], x[1]]) };
}

export type CsvGridResult =
  | { readonly ok: true; readonly cols: number; readonly rows: number; readonly heights: number[] }
  | { readonly ok: false; readonly errors: CsvError[] };

/**
 * A height grid: each CSV row is one grid row (along y, the first at the grid origin), each cell
 * one node along x; heights row-major as the grid feature keeps them.
 */
export function gridFromCsv(text: string): CsvGridResult {
  const r = parseCsvNumbers(text);
  if (!r.ok) return r;
  const heights: number[] = [];
  for (const row of r.rows) for (const v of row) heights.push(v);
  return { ok: true, cols: r.rows[0].length, rows: r.rows.length, heights };
}

/** "row 3, column 2" for messages. */
export function csvPlace(e: CsvError): string {
  return e.column === null ? `row ${e.row}` : `row ${e.row}, column ${e.column}`;
}
