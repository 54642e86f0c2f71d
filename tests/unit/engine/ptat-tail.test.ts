/**
 * The PTAT (constant-gm) tail against its hand analysis [GM: the ΔVBE cell of self-biased
 * references, cited from memory]: with ideal devices (current gains of 10,000 on model cards, no Early effect, a
 * start-up current a millionth of the cell's) each branch carries I = VT·ln(N)/R, so the tail
 * current rises in proportion to absolute temperature, gm = IC/VT holds, and a resistor-loaded
 * pair's gain gm·RC holds with it. ngspice's agreement on the same circuit, with real devices, is
 * tests/reference/spice-agreement.test.ts and the other reference files.
 */
import { describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { Design } from '#shared/engine/types';

/** kT/q from the exact SI constants [SI]. */
const vt = (celsius: number) => (1.380649e-23 * (celsius + 273.15)) / 1.602176634e-19;

/** Invented values; the devices near-ideal so the hand formula is the circuit's own limit. */
function ideal(areaRatio: number, emitterOhm: number, temperatureC: number, outputAreaRatio?: number): Design {
  return {
    device: { family: 'npn', model: { IS: 5e-15, BF: 10000 }, pnp: { model: { IS: 3e-15, BF: 10000 } } },
    supply: { positiveV: 9, negativeV: -9 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'ptat', emitterResistanceOhm: emitterOhm, startupResistanceOhm: 1e9, areaRatio, ...(outputAreaRatio !== undefined ? { outputAreaRatio } : {}) },
    inputCommonModeV: 0,
    temperatureC,
  };
}

describe('the tail current is VT·ln(N)/R (times the output area ratio) [GM]', () => {
  test.each([
    [8, 220, -40],
    [8, 220, 27],
    [8, 220, 125],
    [4, 120, 27],
    [24, 1000, 85],
  ])('N = %d, R = %d Ω, %d °C: within 0.3 % (the base currents, 1/10,000 each, and the start-up current are what is left)', (n, r, t) => {
    const hand = (vt(t) * Math.log(n)) / r;
    const result = analyze(ideal(n, r, t));
    expect(Math.abs(result.tailCurrentA / hand - 1)).toBeLessThan(3e-3);
  });

  test('an output area ratio of 2 doubles the tail current', () => {
    const one = analyze(ideal(8, 220, 27)).tailCurrentA;
    const two = analyze(ideal(8, 220, 27, 2)).tailCurrentA;
    expect(two / one).toBeCloseTo(2, 2);
  });
});

describe('constant gm: the current rises as T, the gain holds', () => {
  test('tail current at 125 °C over −40 °C is the kelvin ratio, 398.15/233.15, within 0.3 %', () => {
    const hot = analyze(ideal(8, 220, 125)).tailCurrentA;
    const cold = analyze(ideal(8, 220, -40)).tailCurrentA;
    expect(Math.abs(hot / cold / (398.15 / 233.15) - 1)).toBeLessThan(3e-3);
  });

  test('differential gain gm·RC the same from −40 to 125 °C within 0.3 %, where a fixed current would move it by the kelvin ratio', () => {
    const gains = [-40, 27, 125].map((t) => Math.abs(analyze(ideal(8, 220, t)).differentialGain));
    for (const g of gains) expect(Math.abs(g / gains[1] - 1)).toBeLessThan(3e-3);
    // the hand value: IC·RC/VT with IC = VT·ln(N)/(2R) per collector, i.e. RC·ln(N)/(2R)
    expect(Math.abs(gains[1] / ((10000 * Math.log(8)) / (2 * 220)) - 1)).toBeLessThan(1e-2);
  });
});
