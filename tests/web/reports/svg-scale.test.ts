/**
 * Scales and paths of the report's SVG plots, checked against plain arithmetic: a base-10 log
 * scale puts each decade an equal distance apart, round ticks are 1, 2 or 5 × 10ⁿ apart, and a
 * missing value breaks the line instead of drawing it to zero.
 */
import { describe, expect, test } from 'vitest';
import { linearScale, linePath, logScale, niceDomain, niceTicks, stepPath } from '../../../web/src/features/proposals/lib/svg-scale';

describe('svg scales', () => {
  test('a log scale spaces decades equally', () => {
    const sx = logScale([1, 1e4], [0, 400]);
    expect([1, 10, 100, 1000, 1e4].map((f) => Math.round(sx(f)))).toEqual([0, 100, 200, 300, 400]);
  });

  test('a linear scale maps the ends and flips for a y axis', () => {
    const sy = linearScale([20, 140], [238, 12]);
    expect(sy(20)).toBe(238);
    expect(sy(140)).toBe(12);
    expect(sy(80)).toBe(125);
  });

  test('round ticks and a domain widened to them', () => {
    expect(niceTicks(39.3, 121.8, 6)).toEqual([40, 60, 80, 100, 120]);
    expect(niceDomain(39.3, 121.8, 6)).toEqual([20, 140]);
    expect(niceTicks(0, 187, 4)).toEqual([0, 50, 100, 150]);
  });

  test('a missing value breaks the line; a histogram outline closes on the axis', () => {
    const s = linearScale([0, 10], [0, 10]);
    expect(linePath([1, 2, 3, 4], [1, null, 3, 4], s, s)).toBe('M1.0,1.0M3.0,3.0L4.0,4.0');
    expect(stepPath([0, 1, 2], [3, 5], s, s)).toBe('M0.0,0.0L0.0,3.0L1.0,3.0L1.0,5.0L2.0,5.0L2.0,0.0');
  });
});
