import { describe, expect, test } from 'vitest';
import { axisSizeForLabels } from '../../../web/src/lib/plot-axes';

/** A stand-in for the canvas: 6 px a character, so a label's width is known by hand. */
const sixPerCharacter = (text: string) => [...text].length * 6;
const ROOM = { tick: 4, gap: 5, min: 64 };

describe('axisSizeForLabels', () => {
  test('short labels keep the least size', () => {
    // "10 µA": 5 characters, 30 px, plus 9 px of tick and gap, is under 64 px
    expect(axisSizeForLabels(['100 nA', '10 µA'], sixPerCharacter, ROOM)).toBe(64);
  });

  test('the widest label widens the axis by what it needs, tick and gap included', () => {
    // "10 nV/√Hz": 9 characters, 54 px, plus 9 px; "100 nV/√Hz": 10 characters, 60 px, plus 9 px = 69 px
    expect(axisSizeForLabels(['1 nV/√Hz', '10 nV/√Hz', '100 nV/√Hz'], sixPerCharacter, ROOM)).toBe(69);
  });

  test('ticks the chart left unlabelled (null or empty) take no room; a fraction of a pixel rounds up', () => {
    expect(axisSizeForLabels([null, '', '1 GV/s'], (t) => t.length * 10.25, { tick: 4, gap: 5, min: 0 })).toBe(71);
    expect(axisSizeForLabels([], sixPerCharacter, ROOM)).toBe(64);
  });
});
