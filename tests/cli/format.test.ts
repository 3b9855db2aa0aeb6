/** Fixed-width tables for the terminal. Expected text written out by hand. */
import { describe, expect, it } from 'vitest';
import { formatKeyValues, formatNumber, formatQuantity, formatTable, radToDeg } from '../../src/cli/format';

describe('formatTable', () => {
  it('right-aligns numbers, left-aligns text, puts units in the headers', () => {
    const text = formatTable(
      [{ header: 'wheel' }, { header: 'load', unit: 'N', digits: 0 }, { header: 'share', digits: 3 }, { header: 'lifted' }],
      [
        ['FL', 5321.4, 1.0234, false],
        ['RR', 12.6, 0.002, true],
        ['RL', null, -0.0001, true],
      ],
    );
    expect(text).toBe(
      [
        'wheel  load (N)  share  lifted',
        '-----  --------  -----  ------',
        'FL         5321  1.023  no',
        'RR           13  0.002  yes',
        'RL            —  0.000  yes',
      ].join('\n'),
    );
  });
  it('honours indent, gap and explicit alignment', () => {
    expect(formatTable([{ header: 'a', align: 'right' }, { header: 'angle', unit: '°', align: 'left', digits: 1 }], [['x', 48.81]], { indent: '  ', gap: 1 })).toBe(
      ['  a angle (°)', '  - ---------', '  x 48.8'].join('\n'),
    );
  });
});

describe('number helpers', () => {
  it('formats', () => {
    expect(formatNumber(-0.0001, 2)).toBe('0.00');
    expect(formatNumber(2.345, 1)).toBe('2.3');
    expect(formatNumber(NaN)).toBe('NaN');
    expect(formatQuantity(1234.5, 'kg', 0)).toBe('1235 kg'); // toFixed rounds half away from zero here (1234.5 is exact)
    expect(radToDeg(Math.PI / 2)).toBe(90);
    expect(formatKeyValues([['mass', '2150 kg'], ['wheelbase', '3.10 m']])).toBe('mass       2150 kg\nwheelbase  3.10 m');
  });
});
