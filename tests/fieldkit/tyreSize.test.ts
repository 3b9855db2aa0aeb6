/**
 * Tyre and wheel sizes as the trade writes them (src/core/scenario/tyreSize.ts).
 * Diameters hand-computed from the size designation of ISO 4000-1 / ETRTO / Tire and Rim Association:
 * metric W/AR R D → D·25.4 + 2·W·AR/100 mm; flotation OD x W R D → OD in × 25.4 mm.
 * Backspacing = (rim width + 1)/2 + offset/25.4 in: common practice (REFERENCES.md "Wheel fitment").
 */
import { describe, expect, it } from 'vitest';
import { backspacingInOf, offsetMmOf, parseTyreSize, parseWheelSize, TYRE_STIFFNESS_ESTIMATE_N_PER_M } from '../../src/core/scenario/tyreSize';

// [typed, form, diameter mm (hand-computed), section width mm, rim in, construction]
const TABLE: [string, string, number, number, number, string][] = [
  ['315/70R17', 'metric', 17 * 25.4 + 2 * 0.7 * 315, 315, 17, 'radial'], // 431.8 + 441 = 872.8
  ['LT285/75R16', 'metric', 406.4 + 427.5, 285, 16, 'radial'], // 833.9
  ['P265/70R16', 'metric', 406.4 + 371, 265, 16, 'radial'], // 777.4
  ['255/85R16 123/120Q', 'metric', 406.4 + 433.5, 255, 16, 'radial'], // 839.9, load and speed suffix ignored
  ['285/75-16', 'metric', 406.4 + 427.5, 285, 16, 'bias'], // 833.9, a bias tyre
  ['lt 315 / 75 r 16', 'metric', 406.4 + 472.5, 315, 16, 'radial'], // 878.9, typed loosely
  ['35x12.50R17', 'flotation', 35 * 25.4, 12.5 * 25.4, 17, 'radial'], // 889.0, 317.5
  ['35x12.5-15', 'flotation', 889, 317.5, 15, 'bias'],
  ['37X13.50R17LT', 'flotation', 37 * 25.4, 13.5 * 25.4, 17, 'radial'], // 939.8, 342.9
  ['33 × 10.50 R 15', 'flotation', 33 * 25.4, 10.5 * 25.4, 15, 'radial'], // 838.2, 266.7
];

describe('tyre sizes', () => {
  it.each(TABLE)('%s → its diameter, width and rim as hand-computed', (typed, form, dMm, wMm, rim, cons) => {
    const r = parseTyreSize(typed);
    expect(r.ok, JSON.stringify(r)).toBe(true);
    if (r.ok !== true) return;
    expect(r.size.form).toBe(form);
    // Exact arithmetic on decimal inputs: 1e-9 m is float rounding only.
    expect(r.size.diameterM * 1000).toBeCloseTo(dMm, 6);
    expect(r.size.radiusM).toBeCloseTo(r.size.diameterM / 2, 12);
    expect(r.size.widthM! * 1000).toBeCloseTo(wMm, 6);
    expect(r.size.rimDiameterIn).toBe(rim);
    expect(r.size.construction).toBe(cons);
    expect(r.size.stiffnessNPerM).toBe(TYRE_STIFFNESS_ESTIMATE_N_PER_M);
    expect(r.size.stiffnessSource).toMatch(/from memory/);
  });

  it('the spec example: 315/70R17 is 872.8 mm across', () => {
    const r = parseTyreSize('315/70R17');
    expect(r.ok === true && Number((r.size.diameterM * 1000).toFixed(1))).toBe(872.8);
  });

  it('a bare 35 asks whether the diameter is meant, and says what it would be', () => {
    const r = parseTyreSize('35');
    expect(r.ok).toBe('ask');
    if (r.ok !== 'ask') return;
    expect(r.question).toMatch(/overall diameter in inches/);
    expect(r.question).toContain('889.0 mm');
    expect(r.ifYes.diameterM).toBeCloseTo(0.889, 12);
    expect(r.ifYes.widthM).toBeNull();
    // Not a 70 in tyre (35 read as a radius in inches), nor 35 mm.
    expect(r.ifYes.radiusM).toBeCloseTo(0.4445, 12);
  });

  it.each([
    ['', /give a tyre size/],
    ['315/70', /not a tyre size/],
    ['315/5R17', /not a tyre size|aspect ratio/],
    ['15x10R17', /must exceed the rim diameter/],
    ['35x40R17', /section width/],
    ['5', /not a tyre size|outside/],
    ['99', /outside 18–66 in/],
    ['banana', /not a tyre size/],
  ])('refuses %j with a message', (typed, msg) => {
    const r = parseTyreSize(typed);
    expect(r.ok).toBe(false);
    if (r.ok === false) expect(r.message).toMatch(msg);
  });
});

describe('wheel sizes: offset and backspacing (common practice)', () => {
  it('backspacing from offset, and back', () => {
    // REFERENCES.md "Wheel fitment" check values: 8 in rim, 0 offset → 4.5 in; +25.4 mm → 5.5 in; −12 mm → 4.03 in.
    expect(backspacingInOf(8, 0)).toBeCloseTo(4.5, 12);
    expect(backspacingInOf(8, 25.4)).toBeCloseTo(5.5, 12);
    expect(backspacingInOf(8, -12)).toBeCloseTo(4.5 - 12 / 25.4, 12);
    expect(Number(backspacingInOf(8, -12).toFixed(2))).toBe(4.03);
    for (const [w, o] of [[8, 25], [9, -12], [10, -44], [7.5, 40]]) expect(offsetMmOf(w, backspacingInOf(w, o))).toBeCloseTo(o, 9);
  });

  it.each([
    ['17x9 -12', 17, 9, -12, 5 - 12 / 25.4, 'offset'],
    ['17x9 ET-12', 17, 9, -12, 5 - 12 / 25.4, 'offset'],
    ['16 x 8 +25', 16, 8, 25, 4.5 + 25 / 25.4, 'offset'],
    ['17x8.5 offset 0', 17, 8.5, 0, 4.75, 'offset'],
    ['17x9 BS 4.5', 17, 9, (4.5 - 5) * 25.4, 4.5, 'backspacing'], // −12.7 mm
    ['15x10 backspacing 3.75 in', 15, 10, (3.75 - 5.5) * 25.4, 3.75, 'backspacing'], // −44.45 mm
  ])('%s', (typed, rimD, rimW, off, bs, given) => {
    const r = parseWheelSize(typed);
    expect(r.ok, JSON.stringify(r)).toBe(true);
    if (!r.ok) return;
    expect(r.wheel.rimDiameterIn).toBe(rimD);
    expect(r.wheel.rimWidthIn).toBe(rimW);
    expect(r.wheel.offsetMm).toBeCloseTo(off, 9);
    expect(r.wheel.backspacingIn).toBeCloseTo(bs, 9);
    expect(r.wheel.given).toBe(given);
    expect(r.wheel.rimWidthM).toBeCloseTo(rimW * 0.0254, 12);
    expect(r.wheel.offsetM).toBeCloseTo(off / 1000, 12);
  });

  it.each([['17x9', /give the offset/], ['17x9 BS 12', /within/], ['17', /not a wheel size/], ['17x9 -400', /outside/]])('refuses %j', (typed, msg) => {
    const r = parseWheelSize(typed);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.message).toMatch(msg);
  });
});
