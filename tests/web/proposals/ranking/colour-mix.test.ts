import { describe, expect, test } from 'vitest';
import { mixHex } from '../../../../web/src/lib/colour-mix';

describe('mixHex', () => {
  test.each([
    ['#000000', '#ffffff', 0.5, '#808080'],
    ['#2f5d50', '#2f5d50', 0.3, '#2f5d50'],
    ['#102030', '#ffffff', 0, '#102030'],
    ['oklch(0.5 0.1 120)', '#ffffff', 0.5, 'oklch(0.5 0.1 120)'],
  ])('mixHex(%s, %s, %d) is %s', (a, b, t, expected) => expect(mixHex(a, b, t)).toBe(expected));
});
