/** The filled-ground sentences: spans along a pass, a spot, headings and lines, in the reader's units. */
import { describe, expect, it } from 'vitest';
import { FILLED_GROUND_NOTE, filledHeadingsWords, filledLinesWords, filledPassWords, filledSpanWords, filledSpotWords } from '../../src/present/words';

describe('filled ground in words', () => {
  it('a span says from and to in the reader\'s distance unit; a one-station span says at', () => {
    const span = { wheel: 'FL' as const, startStation: 36, startDistanceM: 3.6, endStation: 47, endDistanceM: 4.7 };
    expect(filledSpanWords(span, 'metric')).toBe('FL stands on filled ground from 3.60 m to 4.70 m');
    // 1 ft = 0.3048 m exactly (NIST SP 811, appendix B.8): 3.6 m = 11.81 ft, 4.7 m = 15.42 ft.
    expect(filledSpanWords(span, 'imperial')).toBe('FL stands on filled ground from 11.81 ft to 15.42 ft');
    expect(filledSpanWords({ ...span, endStation: 36, endDistanceM: 3.6 }, 'metric')).toBe('FL stands on filled ground at 3.60 m');
  });

  it('a pass: every span, then the note; none when no span', () => {
    const spans = [
      { wheel: 'FL' as const, startStation: 1, startDistanceM: 0.1, endStation: 2, endDistanceM: 0.2 },
      { wheel: 'RL' as const, startStation: 29, startDistanceM: 2.9, endStation: 30, endDistanceM: 3 },
    ];
    expect(filledPassWords({ filledGround: spans }, 'metric')).toBe(
      `FL stands on filled ground from 0.10 m to 0.20 m; RL stands on filled ground from 2.90 m to 3.00 m. ${FILLED_GROUND_NOTE}`,
    );
    expect(filledPassWords({ filledGround: [] }, 'metric')).toBeNull();
    expect(filledPassWords({}, 'metric')).toBeNull();
  });

  it('a spot, headings and lines', () => {
    expect(filledSpotWords(['FL'])).toMatch(/^FL stands on filled ground here/);
    expect(filledSpotWords(['FL', 'FR', 'RL'])).toMatch(/^FL, FR and RL stand on filled ground here/);
    expect(filledSpotWords([])).toBeNull();
    expect(filledSpotWords(undefined)).toBeNull();
    const h = (deg: number, w: string[]) => ({ headingRad: (deg * Math.PI) / 180, filledWheels: w });
    expect(filledHeadingsWords([h(0, []), h(90, ['RR']), h(180, [])])).toMatch(/^At the heading 90\.0° a tyre stands on filled ground/);
    expect(filledHeadingsWords([h(0, ['FL']), h(90, ['RR']), h(180, [])])).toMatch(/^At 2 of 3 headings a tyre/);
    expect(filledHeadingsWords([h(0, ['FL']), h(90, ['RR'])])).toMatch(/^At every heading a tyre/);
    expect(filledHeadingsWords([h(0, []), { headingRad: 1 }])).toBeNull();
    expect(filledLinesWords([{ onFilledGround: true }, {}, { onFilledGround: false }])).toMatch(/^1 of 3 lines put a tyre on filled ground/);
    expect(filledLinesWords([{ onFilledGround: false }])).toBeNull();
  });
});
