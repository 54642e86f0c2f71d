/**
 * `analyze`'s slew rate against ngspice's `.tran` on the same circuit (ENGINE-CONTRACT.md,
 * "New outputs": the largest |d v(c1,c2)/dt| after the differential drive steps from −1 V to
 * +1 V in 1 ns, step ≤ 1/200 of the settling time), measured on the netlist the product writes
 * by the product's own measure (`spiceSlewRateVPerS`, api/verification/spice-tradeoffs.ts).
 *
 * Circuits: every topology at −40, 27 and 125 °C, loaded with 5 to 50 pF on each collector, half
 * of them with a device card carrying CJE, CJC, CJS, TF and TR (two with RB, RE, RC too), some
 * with pair emitter degeneration or a source resistance; then cards without any load capacitance
 * (the devices' own charges alone), one with a source resistance in front of them, a three-
 * parameter device with no capacitance anywhere (the output follows the 1 ns edge: the figure is
 * about |Ad|·2 V/ns, finite, as ngspice measures it), and two designs whose switched states
 * saturate the conducting pair transistor (checked in ngspice's own `.op` at +1 V).
 *
 * Tolerances: the contract's 10 %; and, since both sides solve the same model, a same-model bound
 * of 1 % (largest difference measured on these designs: 0.34 %, ngspice at RELTOL 1e-6 with its
 * step at 1/200 of the settling; the engine's own step control holds its figure within 0.3 %).
 *
 * Run time: ngspice's transients are the cost (two runs per design); the first run's window is
 * three times the engine's settling time past the edge, which only bounds where the reference
 * looks for its own settling (it measures that itself, in that window).
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze, solveCircuit } from '#shared/engine/analyze';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { spiceNetlist } from '#shared/engine/netlist';
import { slewRun } from '#shared/engine/slew-rate';
import type { Design, DeviceParams, TopologyId } from '#shared/engine/types';
import { spiceSlewRateVPerS } from '../../api/verification/spice-tradeoffs';
import { netlistDesign } from '../helpers/netlist-designs';
import { REFERENCE_RELATIVE_TOLERANCE, runSpice, startSpice } from '../helpers/spice';

const SLEW_TOLERANCE = 0.1;
const SAME_MODEL_TOLERANCE = 0.01;
/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;
/** The reference's first window past the edge, in multiples of the engine's settling time. */
const WINDOW_SETTLINGS = 3;
const EDGE_S = 1e-9;

/** Invented Fernhollow cards: charge parameters, and on A ohmic resistances too. */
const CARD_A: BjtModelCard = { IS: 1.4e-14, BF: 210, VAF: 62, RB: 120, RE: 1.5, RC: 20, CJE: 12e-12, VJE: 0.72, MJE: 0.36, CJC: 4.5e-12, VJC: 0.6, MJC: 0.42, CJS: 2.2e-12, VJS: 0.65, MJS: 0.4, TF: 0.45e-9, TR: 60e-9 };
const CARD_B: BjtModelCard = { IS: 6.5e-15, BF: 95, VAF: 118, CJE: 22e-12, VJE: 0.8, MJE: 0.3, CJC: 7e-12, VJC: 0.7, MJC: 0.33, CJS: 3e-12, TF: 0.7e-9, TR: 120e-9, FC: 0.6 };

function deviceOf(card: BjtModelCard): DeviceParams {
  return { family: 'npn', beta: card.BF!, earlyVoltageV: card.VAF!, saturationCurrentA: card.IS!, model: card } as DeviceParams;
}

const TEMPERATURES_C = [-40, 27, 125] as const;

/** One loaded circuit per topology (the shared netlist designs on ±9 V), each run at the three temperatures. */
const LOADED: [TopologyId, Partial<Design>][] = [
  ['resistor', { loadCapacitanceF: 22e-12 }],
  ['simple-mirror', { loadCapacitanceF: 5e-12, device: deviceOf(CARD_A) }],
  ['degenerated-mirror', { loadCapacitanceF: 50e-12, pairEmitterResistanceOhm: 330 }],
  ['widlar', { loadCapacitanceF: 10e-12, device: deviceOf(CARD_B), sourceResistanceOhm: 1000 }],
  ['wilson', { loadCapacitanceF: 15e-12, sourceResistanceOhm: 2200 }],
  ['cascode', { loadCapacitanceF: 5e-12, device: deviceOf(CARD_A), pairEmitterResistanceOhm: 150 }],
];

const CASES: [string, Design][] = [
  ...LOADED.flatMap(([topology, overrides]) =>
    TEMPERATURES_C.map((temperatureC): [string, Design] => [`${topology}, ${temperatureC} °C, load ${overrides.loadCapacitanceF! * 1e12} pF`, netlistDesign(topology, { ...overrides, temperatureC })]),
  ),
  ['resistor, no load capacitance, card A (its charges alone)', netlistDesign('resistor', { device: deviceOf(CARD_A) })],
  ['cascode, no load capacitance, card B, 125 °C', netlistDesign('cascode', { device: deviceOf(CARD_B), temperatureC: 125 })],
  ['simple mirror, no load capacitance, card B, 4.7 kΩ source resistance', netlistDesign('simple-mirror', { device: deviceOf(CARD_B), sourceResistanceOhm: 4700 })],
  ['widlar, no capacitance anywhere (the output follows the edge)', netlistDesign('widlar')],
];

/** Designs whose switched states saturate the conducting pair transistor: 10 kΩ loads over a 1.7 mA tail from a 9 V rail. */
const SATURATING: [string, Design][] = [
  ['resistor tail, 10 kΩ loads, 5 pF', netlistDesign('resistor', { collectorResistanceOhm: 10000, loadCapacitanceF: 5e-12 })],
  ['resistor tail, 10 kΩ loads, card A, −40 °C', netlistDesign('resistor', { collectorResistanceOhm: 10000, device: deviceOf(CARD_A), temperatureC: -40 })],
];

/** The reference figure, with the first window from the engine's settling time. */
async function referenceSlewVPerS(design: Design): Promise<number> {
  const { settlingS } = slewRun(solveCircuit(design), { untilSettled: true });
  return spiceSlewRateVPerS(runSpice, design, EDGE_S + WINDOW_SETTLINGS * settlingS);
}

function expectSlew(design: Design, referenceVPerS: number, tolerance: number): void {
  const predicted = analyze(design).slewRateVPerS;
  const text = `slewRateVPerS: analyze ${predicted} vs ngspice ${referenceVPerS}`;
  expect(predicted, text).not.toBeNull();
  expect(Math.abs(predicted! - referenceVPerS) / referenceVPerS, text).toBeLessThanOrEqual(tolerance);
}

describe('analyze slew rate agrees with ngspice .tran on the same circuit', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  describe.each([...CASES, ...SATURATING])('%s', (_title, design) => {
    let measured: Promise<number> | undefined;
    const spice = (): Promise<number> => (measured ??= referenceSlewVPerS(design));

    test('within the contract tolerance, 10 %', async () => {
      expectSlew(design, await spice(), SLEW_TOLERANCE);
    });

    test('same model: within 1 %', async () => {
      expectSlew(design, await spice(), SAME_MODEL_TOLERANCE);
    });
  });

  test.each(SATURATING)('%s: ngspice saturates Q1 in the switched state at +1 V (its base-collector junction forward biased)', async (_title, design) => {
    const netlist = spiceNetlist(design, { analysis: 'op', differentialInputV: 1, relativeTolerance: REFERENCE_RELATIVE_TOLERANCE });
    const result = await runSpice(netlist, 'Operating Point');
    const at = (node: string) => result.data.find((d) => d.name.toLowerCase() === `v(${node})`)!.values[0] as number;
    expect(at('in1') - at('c1')).toBeGreaterThan(0.4);
  });
});
