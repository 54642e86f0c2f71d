/**
 * Sizing meets a tail current fixed by the spec, as closely as snapping to E192 allows. Each
 * tail resistor is refined against an exact solve to 0.1 % (the sizing's stated tolerance),
 * then snapped to the nearest E192 member [IEC60063], which moves it by at most half the
 * widest gap between neighbours in log terms, ln(1.04/1.02)/2 ≈ 0.97 %. A current set through
 * one resistor moves by at most as much (I ∝ 1/R at most). A Widlar source's output current
 * follows its emitter resistor more weakly: from Iout·RE = VT·ln(Iref/Iout) [GM],
 * d ln Iout / d ln RE = −1/(1 + 1/ln(Iref/Iout)), 0.62 at the reference ratio of 5 the sizing
 * uses (its stated design choice), and its reference resistor is snapped before RE is refined.
 */
import { describe, expect, test } from 'vitest';
import { recommend } from '#shared/engine/index';
import { TOPOLOGIES } from '#shared/engine/topologies';
import { E_SERIES } from '#shared/units/e-series';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const ruleSet = await loadRuleSet();

/** Half the widest E192 gap, as a log ratio (1.02 to 1.04). */
const HALF_GAP = Math.max(...[...E_SERIES.E192, 10].slice(1).map((b, i) => Math.log(b / E_SERIES.E192[i]) / 2));
const TUNE_TOLERANCE = 1e-3;
const WIDLAR_REFERENCE_RATIO = 5;
const WIDLAR_SENSITIVITY = 1 / (1 + 1 / Math.log(WIDLAR_REFERENCE_RATIO));

/** Invented front ends of Quillfen Instruments: tail current, rails, gain, device. */
const CASES = [
  { tailCurrentA: 2e-4, railV: 12, gain: 40, beta: 150, earlyVoltageV: 80 },
  { tailCurrentA: 5e-4, railV: 9, gain: 80, beta: 250, earlyVoltageV: 50 },
  { tailCurrentA: 1e-3, railV: 15, gain: 20, beta: 100, earlyVoltageV: 120 },
  { tailCurrentA: 1.5e-3, railV: 40, gain: 120, beta: 90, earlyVoltageV: 150 },
];

describe.each(CASES)('tail current fixed at $tailCurrentA A, ±$railV V rails, E192', (c) => {
  const validated = validateSpec({
    title: 'Quillfen fixed-current front end',
    device: { beta: c.beta, earlyVoltageV: c.earlyVoltageV, saturationCurrentA: 1e-14, pnp: { beta: c.beta / 2, earlyVoltageV: c.earlyVoltageV / 2, saturationCurrentA: 5e-15 } },
    supply: { positiveV: c.railV, negativeV: -c.railV },
    topologies: [...TOPOLOGIES],
    gain: { target: c.gain, output: 'differential' },
    cmrr: { minDb: 60 },
    inputCommonMode: { minV: -1, maxV: 1 },
    powerBudgetW: 1,
    tailCurrentA: c.tailCurrentA,
    resistors: { series: 'E192' },
    monteCarlo: { samples: 100, seed: 1 },
  });
  if (!validated.ok) throw new Error(JSON.stringify(validated.errors));
  // recommended afresh in each test, so a mutation run knows which tests exercise which code
  const result = () => recommend(validated.value, ruleSet);

  test('Widlar: within 0.62 × half the widest E192 gap + 0.1 % (about 0.7 %)', async () => {
    const widlar = (await result()).options.find((o) => o.topology === 'widlar');
    const bound = Math.expm1(WIDLAR_SENSITIVITY * HALF_GAP) + TUNE_TOLERANCE;
    const error = widlar!.predicted!.tailCurrentA / c.tailCurrentA - 1;
    expect(Math.abs(error), `${(error * 100).toFixed(3)} % off`).toBeLessThanOrEqual(bound);
  });

  test('every other tail: within half the widest E192 gap + 0.1 % (about 1.1 %)', async () => {
    const others = (await result()).options.filter((o) => o.topology !== 'widlar');
    // every tail of the catalogue but the Widlar source appears, passing or not
    expect(others.map((o) => o.topology).sort()).toEqual(TOPOLOGIES.filter((t) => t !== 'widlar').sort());
    const bound = Math.expm1(HALF_GAP) + TUNE_TOLERANCE;
    for (const option of others) {
      const error = option.predicted!.tailCurrentA / c.tailCurrentA - 1;
      expect(Math.abs(error), `${option.topology}: ${(error * 100).toFixed(3)} % off`).toBeLessThanOrEqual(bound);
    }
  });
});
