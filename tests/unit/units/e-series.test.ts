import fc from 'fast-check';
import { describe, expect, test } from 'vitest';
import type { ResistorSeries } from '#shared/engine/types';
import { E_SERIES, isOnSeries, seriesTolerance, snapToSeries } from '#shared/units/e-series';
import { logUniform } from '../../helpers/arbitraries';

const SERIES: ResistorSeries[] = ['E24', 'E96', 'E192'];

/** round(10^(i/n), 2): the E96/E192 rule [IEC60063]. */
function formulaValue(index: number, count: number): number {
  return Math.round(10 ** (index / count) * 100) / 100;
}

describe('E-series tables', () => {
  // [IEC60063] series sizes: n values per decade
  test.each([
    ['E24', 24],
    ['E96', 96],
    ['E192', 192],
  ] as const)('%s has %i values per decade [IEC60063]', (series, count) => {
    expect(E_SERIES[series]).toHaveLength(count);
  });

  test.each(SERIES)('%s ascends strictly within [1, 10)', (series) => {
    const values = E_SERIES[series];
    expect(values[0]).toBe(1);
    values.forEach((v, i) => {
      expect(v).toBeLessThan(10);
      if (i > 0) expect(v).toBeGreaterThan(values[i - 1]);
    });
  });

  // [IEC60063] E24, from memory: the historical values that differ from round(10^(i/24), 1)
  test('E24 is the historical list [IEC60063, from memory]', () => {
    expect(E_SERIES.E24).toEqual([
      1.0, 1.1, 1.2, 1.3, 1.5, 1.6, 1.8, 2.0, 2.2, 2.4, 2.7, 3.0, 3.3, 3.6, 3.9, 4.3, 4.7, 5.1, 5.6, 6.2, 6.8, 7.5,
      8.2, 9.1,
    ]);
  });

  // [IEC60063] the historical E24 values, each listed in the brief; the formula would give the second number
  test.each([
    [2.7, 2.6],
    [3.0, 2.9],
    [3.3, 3.2],
    [3.6, 3.5],
    [3.9, 3.8],
    [4.3, 4.2],
    [4.7, 4.6],
    [5.1, 5.1],
    [5.6, 5.6],
    [6.2, 6.2],
    [6.8, 6.8],
    [8.2, 8.3],
    [9.1, 9.1],
  ])('E24 holds %d (round(10^(i/24), 1) gives %d) [IEC60063]', (historical, formula) => {
    const index = E_SERIES.E24.indexOf(historical);
    expect(index).toBeGreaterThanOrEqual(0);
    expect(Math.round(10 ** (index / 24) * 10) / 10).toBe(formula);
  });

  // [IEC60063] E96 = round(10^(i/96), 2) for every i, no exception
  test.each(E_SERIES.E96.map((value, index) => [index, value]))('E96[%i] = %d = round(10^(i/96), 2) [IEC60063]', (index, value) => {
    expect(value).toBe(formulaValue(index, 96));
  });

  // [IEC60063] E192 = round(10^(i/192), 2) except index 185: 9.20 where the formula gives 9.19 (from memory)
  test.each(E_SERIES.E192.map((value, index) => [index, value]))('E192[%i] = %d [IEC60063]', (index, value) => {
    expect(value).toBe(index === 185 ? 9.2 : formulaValue(index, 192));
  });

  test('the one E192 exception: 9.20, where the formula gives 9.19 [IEC60063, from memory]', () => {
    expect(formulaValue(185, 192)).toBe(9.19);
    expect(E_SERIES.E192[185]).toBe(9.2);
    expect(E_SERIES.E192).not.toContain(9.19);
  });

  test('E96 is every other E192 value [IEC60063]', () => {
    expect(E_SERIES.E192.filter((_, i) => i % 2 === 0)).toEqual(E_SERIES.E96);
  });

  // Common practice: E24 parts ±5 %, E96 ±1 %, E192 ±0.5 %
  test.each([
    ['E24', 0.05],
    ['E96', 0.01],
    ['E192', 0.005],
  ] as const)('%s is usually sold at ±%d (common practice)', (series, tolerance) => {
    expect(seriesTolerance(series)).toBe(tolerance);
  });
});

describe('snapToSeries', () => {
  test.each([
    [4700, 'E24', 4700],
    [4800, 'E24', 4700],
    [5000, 'E24', 5100],
    [9600, 'E24', 10000], // ln(10/9.6) < ln(9.6/9.1): across the decade
    [0.95, 'E24', 0.91],
    [1, 'E24', 1],
    [22e-6, 'E24', 22e-6],
    [8190, 'E96', 8250],
    [8200, 'E96', 8250],
    [1e9, 'E96', 1e9],
    [9190, 'E192', 9200],
    [9200, 'E192', 9200],
    [123456, 'E192', 123000], // 1.23 beats 1.24 in log distance
  ] as const)('%d snaps to %s value %d', (valueOhm, series, expectedOhm) => {
    expect(snapToSeries(valueOhm, series)).toBe(expectedOhm);
  });

  test.each([0, -4700, NaN, Infinity])('rejects %d', (valueOhm) => {
    expect(() => snapToSeries(valueOhm, 'E24')).toThrow(RangeError);
  });

  // Between neighbours a and b the nearest in log distance changes at the geometric mean √(a·b),
  // below the arithmetic mean (a + b)/2 (common practice for preferred numbers; members from
  // [IEC60063]). Values between the two means snap upwards; each pair below sits on either side
  // of √(a·b), computed by hand: √1.1 = 1.04881, √(9.1·10) = 9.53939, √(1.0·1.02) = 1.00995,
  // √(9.76·10) = 9.87927, √(4.7·5.1) = 4.89592.
  test.each([
    [1048, 'E24', 1000],
    [1049, 'E24', 1100], // above √1.1 kΩ = 1048.8 Ω, below the linear midpoint 1050 Ω
    [1050, 'E24', 1100],
    [9.539, 'E24', 9.1],
    [9.54, 'E24', 10], // √(9.1·10) = 9.5394 < 9.54 < 9.55
    [4.895e6, 'E24', 4.7e6],
    [4.896e6, 'E24', 5.1e6], // √(4.7·5.1) MΩ = 4.8959 MΩ < 4.896 MΩ < 4.9 MΩ
    [100.99, 'E96', 100],
    [100.997, 'E96', 102], // √(1.00·1.02)·100 Ω = 100.995 Ω < 100.997 Ω < 101 Ω
    [9879, 'E96', 9760],
    [9879.5, 'E96', 10000], // √(9.76·10) kΩ = 9879.27 Ω < 9879.5 Ω < 9880 Ω
    [0.0048959, 'E24', 0.0047],
    [0.004896, 'E24', 0.0051],
  ] as const)('%d Ω snaps to %s value %d Ω: the boundary is the geometric mean (common practice)', (valueOhm, series, expectedOhm) => {
    expect(snapToSeries(valueOhm, series)).toBe(expectedOhm);
  });

  /** Log-uniform over 24 decades, drawn as a decade and a mantissa, as resistances are spread. */
  const logUniformOhm = logUniform(-9, 15);

  test('the snapped value is on the series and no member is closer in log distance', () => {
    fc.assert(
      fc.property(logUniformOhm, fc.constantFrom(...SERIES), (valueOhm, series) => {
        const snappedOhm = snapToSeries(valueOhm, series);
        expect(isOnSeries(snappedOhm, series)).toBe(true);
        const bestDistance = Math.abs(Math.log(snappedOhm / valueOhm));
        const decade = Math.floor(Math.log10(valueOhm));
        const closerMembers = [decade - 1, decade, decade + 1]
          .flatMap((d) => E_SERIES[series].map((mantissa) => mantissa * 10 ** d))
          .filter((memberOhm) => Math.abs(Math.log(memberOhm / valueOhm)) < bestDistance - 1e-12);
        expect(closerMembers).toEqual([]);
      }),
      { numRuns: 3000 },
    );
  });

  test('snapping is idempotent', () => {
    fc.assert(
      fc.property(logUniformOhm, fc.constantFrom(...SERIES), (valueOhm, series) => {
        const snappedOhm = snapToSeries(valueOhm, series);
        expect(snapToSeries(snappedOhm, series)).toBe(snappedOhm);
      }),
      { numRuns: 3000 },
    );
  });
});

describe('isOnSeries', () => {
  test.each([
    [4700, 'E24', true],
    [4701, 'E24', false],
    [0.01, 'E24', true],
    [8200, 'E96', false],
    [8250, 'E96', true],
    [9200, 'E192', true],
    [9190, 'E192', false],
    [0, 'E24', false],
    [-4700, 'E24', false],
    [NaN, 'E96', false],
  ] as const)('%d on %s: %s', (valueOhm, series, expected) => {
    expect(isOnSeries(valueOhm, series)).toBe(expected);
  });

  test('a relative tolerance admits nearby values', () => {
    expect(isOnSeries(4701, 'E24', 1e-3)).toBe(true);
    expect(isOnSeries(4701, 'E24', 1e-4)).toBe(false);
  });
});
