/**
 * CSV heights: the parser's accepted forms and its messages (row and column as a spreadsheet
 * counts them, 1-based). Expected values are written out by hand from the CSV text.
 */
import { describe, expect, it } from 'vitest';


import { csvPlace, gridFromCsv, MAX_CSV_ERRORS, parseCsvNumbers, profileFromCsv } from '../../../src/core/scenario/csv';
import { parseScenario, scenarioToFile } from '../../../src/core';
import demo from '../../../assets/scenarios/side-hill-stock.json';

describe('parseCsvNumbers', () => {
  it('reads comma-separated numbers with a header, a BOM and CRLF line ends', () => {
    const r = parseCsvNumbers('\uFEFFdistance,height\r\n0,0\r\n1.5,0.25\r\n3,-1e-2\r\n');
    expect(r).toEqual({ ok: true, rows: [[0, 0], [1.5, 0.25], [3, -0.01]], header: ['distance', 'height'], delimiter: ',' });
  });

  it('takes semicolons or tabs, skips blank and # lines', () => {
    const a = parseCsvNumbers('# survey 3\n0;1\n\n2;3\n');
    expect(a.ok && a.rows).toEqual([[0, 1], [2, 3]]);
    expect(a.ok && a.delimiter).toBe(';');
    const b = parseCsvNumbers('0\t1\n2\t3');
    expect(b.ok && b.rows).toEqual([[0, 1], [2, 3]]);
  });

  it('names the row and column of a cell that is not a number (rows counted in the file, header included)', () => {
    const r = parseCsvNumbers('s,z\n0,0\n1,abc\n2,1,5\n3,\n4,0,5');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toEqual([
      { row: 3, column: 2, message: '"abc" is not a number' },
      { row: 4, column: null, message: 'has 3 cells, expected 2 as in row 2' },
      { row: 5, column: 2, message: 'is empty, expected a number' },
      { row: 6, column: null, message: 'has 3 cells, expected 2 as in row 2' },
    ]);
    expect(r.errors.map(csvPlace)).toEqual(['row 3, column 2', 'row 4', 'row 5, column 2', 'row 6']);
  });

  it('points at a decimal comma', () => {
    const r = parseCsvNumbers('0;1,5\n1;2');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0]).toEqual({ row: 1, column: 2, message: '"1,5" is not a number (use a decimal point)' });
  });

  it('refuses an empty file, or a header alone', () => {
    expect(parseCsvNumbers('')).toEqual({ ok: false, errors: [{ row: 1, column: null, message: 'no rows of numbers found' }] });
    expect(parseCsvNumbers('\uFEFF\n\n')).toEqual({ ok: false, errors: [{ row: 1, column: null, message: 'no rows of numbers found' }] });
    expect(parseCsvNumbers('a,b\n')).toEqual({ ok: false, errors: [{ row: 1, column: null, message: 'only a header row, no numbers' }] });
  });

  it('lists at most MAX_CSV_ERRORS problems and counts the rest', () => {
    const text = Array.from({ length: 30 }, (_, i) => `${i},x`).join('\n');
    const r = parseCsvNumbers(text);
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors).toHaveLength(MAX_CSV_ERRORS + 1);
    expect(r.errors[MAX_CSV_ERRORS].message).toBe('and 10 more problems');
  });

  it('does not take Infinity, NaN, hex or a literal that overflows a double as numbers', () => {
    const r = parseCsvNumbers('0,Infinity\n1,NaN\n2,0x10\n3,1e999\n4,-2e308\n5,1.7e308');
    expect(r.ok).toBe(false);
    if (r.ok) return;
    // 1.7e308 is below Number.MAX_VALUE (1.797…e308, IEEE 754 binary64) and is kept.
    expect(r.errors.map((e) => [e.row, e.column])).toEqual([[1, 2], [2, 2], [3, 2], [4, 2], [5, 2]]);
    expect(r.errors[3].message).toBe('"1e999" is too large a number');
  });
});

describe('profileFromCsv and gridFromCsv', () => {
  it('a profile needs two columns', () => {
    expect(profileFromCsv('0,0\n1,0.2')).toEqual({ ok: true, points: [[0, 0], [1, 0.2]] });
    const r = profileFromCsv('0,0,1\n1,0.2,1');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors[0].message).toBe('a profile needs 2 columns (distance, height), got 3');
  });

  it('a grid is row-major, one CSV row per grid row', () => {
    expect(gridFromCsv('0,0.1,0.2\n0.3,0.4,0.5')).toEqual({ ok: true, cols: 3, rows: 2, heights: [0, 0.1, 0.2, 0.3, 0.4, 0.5] });
  });

  it('the feature built from CSV goes through parseScenario, which names the field of a rule it breaks', () => {
    // Points out of order: the profile rule is the scenario format's, not the CSV parser's.
    const csv = profileFromCsv('0,0\n2,0.1\n1,0.2');
    expect(csv.ok).toBe(true);
    if (!csv.ok) return;
    const p = parseScenario(demo);
    if (!p.ok) throw new Error('demo');
    const file = scenarioToFile(p.scenario, 'metric') as { terrain: { features: unknown[] } };
    file.terrain.features.push({ type: 'profile', axis: 'x', points: csv.points });
    const r = parseScenario(file);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.errors.some((e) => e.path.startsWith(`terrain.features[${file.terrain.features.length - 1}].points`))).toBe(true);
  });
});
