import { describe, expect, test } from 'vitest';
import { cornerConditions, nominalCondition, TEMPERATURE_SWEEP_POINTS, temperatureSweep } from '#shared/engine/conditions';
import { conditionLabel } from '#shared/text/engine-notes';
import type { Spec } from '#shared/engine/types';

// Operating conditions: nominal at mid common mode and SPICE's nominal temperature TNOM = 27 °C
// (ngspice manual, ".options TNOM", default 27 °C) clamped into the spec's range; the four corners
// of common mode × temperature; a 7-point temperature sweep. Labels use the typographic minus
// U+2212 and four significant digits.

function spec(minV: number, maxV: number, min: number, max: number): Spec {
  return { inputCommonMode: { minV, maxV }, temperatureC: { min, max } } as Spec;
}

describe('conditionLabel', () => {
  test.each([
    [-2, 85, 'ICM \u22122 V, 85 °C'],
    [0, -40, 'ICM 0 V, \u221240 °C'],
    [1.23456, 27, 'ICM 1.235 V, 27 °C'],
    [-0.5, -12.34567, 'ICM \u22120.5 V, \u221212.35 °C'],
  ])('ICM %d V at %d °C reads %s', (icmV, temperatureC, label) => {
    expect(conditionLabel(icmV, temperatureC)).toBe(label);
  });
});

describe('nominalCondition', () => {
  test('mid common mode, 27 °C when the range holds it', () => {
    expect(nominalCondition(spec(-2, 3, 0, 70))).toEqual({ label: 'ICM 0.5 V, 27 °C', inputCommonModeV: 0.5, temperatureC: 27 });
  });

  test.each([
    [40, 85, 40],
    [-40, 10, 10],
    [27, 27, 27],
  ])('a range %d…%d °C clamps 27 °C to %d', (min, max, expected) => {
    expect(nominalCondition(spec(0, 0, min, max)).temperatureC).toBe(expected);
  });
});

describe('cornerConditions', () => {
  test('common-mode low and high, each at the lowest and highest temperature, in that order', () => {
    expect(cornerConditions(spec(-2, 3, -40, 85)).map((c) => [c.inputCommonModeV, c.temperatureC, c.label])).toEqual([
      [-2, -40, 'ICM \u22122 V, \u221240 °C'],
      [-2, 85, 'ICM \u22122 V, 85 °C'],
      [3, -40, 'ICM 3 V, \u221240 °C'],
      [3, 85, 'ICM 3 V, 85 °C'],
    ]);
  });
});

describe('temperatureSweep', () => {
  test('seven evenly spaced temperatures, both ends included, at the nominal common mode', () => {
    expect(TEMPERATURE_SWEEP_POINTS).toBe(7);
    // (85 − (−35)) / 6 = 20 °C steps
    const sweep = temperatureSweep(spec(-1, 2, -35, 85));
    expect(sweep.map((c) => c.temperatureC)).toEqual([-35, -15, 5, 25, 45, 65, 85]);
    expect(sweep.every((c) => c.inputCommonModeV === 0.5)).toBe(true);
    expect(sweep[0].label).toBe('ICM 0.5 V, \u221235 °C');
  });
});
