/**
 * At the smallest resistances the schemas accept (1 mΩ), `analyze` still agrees with ngspice on
 * the same netlist: the bound keeps the node equations' terms within a range double precision
 * resolves (a 1e-300 Ω resistor, once accepted, put the power 20 % off). Contract tolerances
 * (currents 3 %, power 5 %) and the same-model bound of 0.01 % (tests/reference/spice-agreement.test.ts).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { Design } from '#shared/engine/types';
import { validateDesign } from '#shared/validate';
import { spiceFigures, startSpice } from '../helpers/spice';

const SAME_MODEL_TOLERANCE = 1e-4;
const ENGINE_START_TIMEOUT_MS = 120_000;
/** The schemas' smallest resistance, Ω. */
const SMALLEST_OHM = 1e-3;

const DEVICE = { family: 'npn' as const, beta: 150, earlyVoltageV: 90, saturationCurrentA: 8e-15 };
const DESIGNS: [string, Design][] = [
  ['collector resistors at 1 mΩ, simple mirror', { device: DEVICE, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: SMALLEST_OHM, tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 }, inputCommonModeV: 0 }],
  ['pair emitter resistors at 1 mΩ, resistor tail', { device: DEVICE, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 10000, pairEmitterResistanceOhm: SMALLEST_OHM, tail: { topology: 'resistor', resistanceOhm: 22000 }, inputCommonModeV: 0 }],
  ['Widlar emitter resistor at 1 mΩ', { device: DEVICE, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 10000, tail: { topology: 'widlar', referenceResistanceOhm: 47000, emitterResistanceOhm: SMALLEST_OHM }, inputCommonModeV: 0 }],
];

describe('analyze agrees with ngspice at the smallest resistances the schema accepts', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  test.each(DESIGNS)('%s: valid, and currents and power within 0.01 % of ngspice', async (_title, design) => {
    expect(validateDesign(design).ok).toBe(true);
    const s = await spiceFigures(design);
    const p = analyze(design);
    for (const key of ['tailCurrentA', 'collectorCurrentA', 'powerW', 'collectorVoltageV'] as const) {
      expect(Math.abs(p[key] - s[key]) / Math.abs(s[key]), `${key}: analyze ${p[key]} vs ngspice ${s[key]}`).toBeLessThanOrEqual(SAME_MODEL_TOLERANCE);
    }
  });
});
