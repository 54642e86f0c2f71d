/**
 * `analyze` against ngspice on designs whose tail transistor is saturated: a 100 kΩ (and 1 MΩ)
 * resistor in each pair emitter lets far less current through than the tail's reference asks,
 * so the tail's output transistor sits at a VCE of a few tens of millivolts. ngspice solves
 * these circuits; the engine must too (it used to give up on them), and agree with it.
 *
 * Tolerances: the contract's (currents 3 %, gains 5 %, power 5 %, tail output resistance 20 %)
 * and, since both sides solve the same model on the same netlist, a tight same-model bound of
 * 0.01 % on every figure (largest difference measured on these designs: 3.6e-5 %, the tail
 * output resistance; ngspice at the reference RELTOL of 1e-6).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { Design, DeviceParams } from '#shared/engine/types';
import { spiceFigures, startSpice, type SpiceFigures } from '../helpers/spice';

const CURRENT_TOLERANCE = 0.03;
const GAIN_TOLERANCE = 0.05;
const POWER_TOLERANCE = 0.05;
const TAIL_OUTPUT_RESISTANCE_TOLERANCE = 0.2;
const SAME_MODEL_TOLERANCE = 1e-4;
/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;
/** Below this VCE, V, the tail's output transistor is deep in saturation in the reference (the case under test). */
const SATURATED_VCE_V = 0.1;

/** An invented small-signal NPN (IS at 27 °C, BF, VAF). */
const DEVICE: DeviceParams = { family: 'npn', beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14 };

const TAILS: Design['tail'][] = [
  { topology: 'simple-mirror', referenceResistanceOhm: 10000 },
  { topology: 'degenerated-mirror', referenceResistanceOhm: 10000, emitterResistanceOhm: 470 },
  { topology: 'wilson', referenceResistanceOhm: 10000 },
  { topology: 'cascode', referenceResistanceOhm: 10000 },
];

const DESIGNS: Design[] = TAILS.flatMap((tail) =>
  [1e5, 1e6].map((pairEmitterResistanceOhm): Design => ({
    device: DEVICE,
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 10000,
    pairEmitterResistanceOhm,
    tail,
    inputCommonModeV: 0,
    temperatureC: 27,
  })),
);

/** The tail transistor whose collector is the tail node: the last one the stage lists. */
function tailOutputName(design: Design): string {
  return { resistor: '', 'simple-mirror': 'Q4', 'degenerated-mirror': 'Q4', widlar: 'Q4', wilson: 'Q5', cascode: 'Q6', ptat: 'Q9' }[design.tail.topology];
}

function expectRelative(what: string, predicted: number, reference: number, tolerance: number): void {
  const text = `${what}: analyze ${predicted} vs ngspice ${reference}`;
  expect(Number.isFinite(predicted), text).toBe(true);
  expect(Math.abs(predicted - reference) / Math.abs(reference), text).toBeLessThanOrEqual(tolerance);
}

describe('analyze solves designs with a saturated tail transistor, as ngspice does', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  describe.each(DESIGNS.map((design) => [`${design.tail.topology}, RE ${design.pairEmitterResistanceOhm} Ω`, design] as const))('%s', (_title, design) => {
    let reference: Promise<SpiceFigures> | undefined;
    const spice = (): Promise<SpiceFigures> => (reference ??= spiceFigures(design));

    test('reference: the tail output transistor is saturated in ngspice, and analyze calls it saturated', async () => {
      const name = tailOutputName(design);
      const fromSpice = (await spice()).transistors.find((q) => q.name === name);
      expect(fromSpice?.vceV).toBeLessThan(SATURATED_VCE_V);
      const fromEngine = analyze(design).transistors.find((q) => q.name === name);
      expect(fromEngine?.region).toBe('saturated');
    });

    test('currents, gains, power and tail output resistance within the contract tolerances', async () => {
      const s = await spice();
      const p = analyze(design);
      expectRelative('tailCurrentA', p.tailCurrentA, s.tailCurrentA, CURRENT_TOLERANCE);
      expectRelative('collectorCurrentA', p.collectorCurrentA, s.collectorCurrentA, CURRENT_TOLERANCE);
      expectRelative('differentialGain', p.differentialGain, s.differentialGain, GAIN_TOLERANCE);
      expectRelative('commonModeGain', p.commonModeGain, s.commonModeGain, GAIN_TOLERANCE);
      expectRelative('powerW', p.powerW, s.powerW, POWER_TOLERANCE);
      expectRelative('tailOutputResistanceOhm', p.tailOutputResistanceOhm, s.tailOutputResistanceOhm, TAIL_OUTPUT_RESISTANCE_TOLERANCE);
    });

    test('same model: every figure and node voltage within 0.01 %', async () => {
      const s = await spice();
      const p = analyze(design);
      for (const key of ['tailCurrentA', 'collectorCurrentA', 'collectorVoltageV', 'tailNodeVoltageV', 'differentialGain', 'singleEndedGain', 'commonModeGain', 'powerW', 'tailOutputResistanceOhm'] as const) {
        expectRelative(key, p[key], s[key], SAME_MODEL_TOLERANCE);
      }
    });
  });
});
