/**
 * Display units (src/present/units.ts) against their definitions, and the rounding rules.
 * Sources: International Yard and Pound Agreement (1959): 1 in = 0.0254 m, 1 lb = 0.45359237 kg;
 * 3rd CGPM (1901): gn = 9.80665 m/s², so 1 lbf = 4.4482216152605 N (NIST SP 811, appendix B.8,
 * lists 4.448222 N); 1° = π/180 rad.
 */
import { describe, expect, it } from 'vitest';
import {
  DISPLAY_UNITS,
  NO_VALUE,
  angleText,
  changeText,
  forceText,
  fromDisplay,
  percentText,
  quantityText,
  scaleText,
  significant,
  toDisplay,
  type DisplayKind,
} from '../../src/present/units';

describe('display units', () => {
  it('converts by the exact definitions', () => {
    // NIST SP 811 B.8: 1 lbf = 4.448222 N (rounded there; exact from the 1959 pound and gn).
    expect(toDisplay('force', 4.4482216152605, 'imperial')).toBeCloseTo(1, 14);
    expect(toDisplay('force', 1000, 'metric')).toBe(1);
    expect(toDisplay('length', 0.0254, 'imperial')).toBeCloseTo(1, 14);
    expect(toDisplay('short', 0.0254, 'metric')).toBeCloseTo(25.4, 12);
    expect(toDisplay('distance', 0.3048, 'imperial')).toBeCloseTo(1, 14);
    expect(toDisplay('mass', 0.45359237, 'imperial')).toBeCloseTo(1, 14);
    // A corner scale reads force / gn: 9.80665 N is 1 kg, and 1 lbf is 1 lb.
    expect(toDisplay('scale', 9.80665, 'metric')).toBeCloseTo(1, 14);
    expect(toDisplay('scale', 4.4482216152605, 'imperial')).toBeCloseTo(1, 14);
    // 1 lbf/in = 4.4482216152605 / 0.0254 N/m = 175.126835… N/m (from the definitions).
    expect(toDisplay('stiffness', 4.4482216152605 / 0.0254, 'imperial')).toBeCloseTo(1, 12);
    expect(toDisplay('stiffness', 45000, 'metric')).toBeCloseTo(45, 12);
    // 1 N·m/deg = 180/π N·m/rad; 1 lbf·ft/deg = 4.4482216152605 × 0.3048 × 180/π N·m/rad.
    expect(toDisplay('rollStiffness', 180 / Math.PI, 'metric')).toBeCloseTo(1, 12);
    expect(toDisplay('rollStiffness', 4.4482216152605 * 0.3048 * (180 / Math.PI), 'imperial')).toBeCloseTo(1, 12);
    expect(toDisplay('angle', Math.PI, 'imperial')).toBeCloseTo(180, 12);
  });

  it('goes there and back for every kind and system', () => {
    for (const units of ['metric', 'imperial'] as const) {
      for (const kind of Object.keys(DISPLAY_UNITS[units]) as DisplayKind[]) {
        expect(fromDisplay(kind, toDisplay(kind, 1234.5, units), units)).toBeCloseTo(1234.5, 9);
      }
    }
  });

  it('rounds loads to 3 significant figures and angles to 0.1°', () => {
    expect(significant(12345)).toBe('12300');
    expect(significant(12.04)).toBe('12.0');
    expect(significant(0.04567)).toBe('0.0457');
    expect(significant(-999.6)).toBe('-1000');
    expect(significant(0)).toBe('0');
    expect(forceText(5210.7, 'metric')).toBe('5.21 kN');
    expect(forceText(5210.7, 'imperial')).toBe('1170 lbf'); // 5210.7 / 4.44822 = 1171.4
    expect(scaleText(9806.65, 'metric')).toBe('1000 kg');
    expect(angleText((31.26 * Math.PI) / 180)).toBe('31.3°');
    expect(angleText(-1e-6)).toBe('0.0°');
    expect(quantityText('short', 0.0449, 'metric')).toBe('45 mm');
    expect(quantityText('short', 0.0449, 'imperial')).toBe('1.8 in');
  });

  it('prints a dash for a load that does not exist (a pose that does not stand)', () => {
    expect(forceText(null, 'metric')).toBe(NO_VALUE);
    expect(scaleText(undefined, 'imperial')).toBe(NO_VALUE);
    expect(percentText(null)).toBe(NO_VALUE);
    expect(forceText(Number.NaN, 'metric')).toBe(NO_VALUE);
  });

  it('signs changes, with no sign on a change that rounds to zero', () => {
    expect(changeText('angle', (1.24 * Math.PI) / 180, 'metric')).toBe('+1.2°');
    expect(changeText('angle', (-0.04 * Math.PI) / 180, 'metric')).toBe('0.0°');
    expect(changeText('short', -0.035, 'metric')).toBe('-35 mm');
    expect(changeText('ratio', -0.113, 'metric')).toBe('-0.113');
    expect(changeText('angle', (0.5 * Math.PI) / 180, 'metric', false)).toBe('+0.5');
  });
});
