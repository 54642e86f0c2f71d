/**
 * The MOS level-1 device (shared/engine/mos-device.ts) against ngspice's MOS level 1 on single
 * transistors: an NMOS and a PMOS card, at −40, 27 and 125 °C (`.temp`, `.options tnom=27`), each
 * terminal held by its own voltage source (source at ground), in every region: cut-off (by the
 * gate, and by the body effect), saturation, linear, both with the body tied to the source
 * (vbs = 0) and with the source above the bulk (vbs < 0, the body at a rail), drain and source
 * swapped (vds < 0), and a forward-biased body (vbs = +0.3 V, ngspice's straight-line branch of
 * √(φ − vbs)).
 *
 * Compared: the current into the drain terminal (channel and bulk–drain junction, ngspice's
 * `i(vd)` negated) and ngspice's `@m[gm]`, `@m[gds]`, `@m[gmbs]`. The same model on both sides,
 * so to 1e-4 relative, with 1e-15 A and 1e-15 S absolute where a figure is zero (cut-off).
 * Measured on both builds: channel figures within 1.2e-7; the drain current in cut-off, which is
 * the bulk–drain junction's leakage IS(T), within 4e-6 at −40 and 125 °C, where IS(T)'s exponent
 * (about 11 there) multiplies the two sides' different k/q (ngspice's CODATA 2014 constants,
 * the engine's exact SI 2019 ones: 3.4e-7 apart). Written with the band-gap term of the
 * threshold multiplied by the polarity, as a mirror-image model would have it, the PMOS rows
 * at −40 and 125 °C fail: the asymmetry is ngspice's.
 *
 * Beside it, the channel's thermal noise: `.noise v(d)` of a common-source stage loaded by RL
 * from a 5 V rail, whose output density is (4kT·(2/3)·gm + 4kT/RL)·(RL ∥ 1/gds)² [SPICE]
 * (mos1noi.c; the resistor's 4kT/R), gm and gds from the device model at the drain voltage
 * the stage settles to. Same model, so 1e-4 as well.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { BOLTZMANN_J_PER_K, ZERO_CELSIUS_K } from '#shared/engine/constants';
import { mosDrainNoiseA2PerHz, mosModel, type MosFamily } from '#shared/engine/mos-device';
import type { MosModelCard } from '#shared/engine/mos-parameters';
import { REFERENCE_SPICE_BUILD, runSpice, startSpice } from '../helpers/spice';

/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;
/** Same model on both sides. */
const SAME_MODEL_TOLERANCE = 1e-4;
/** Where ngspice's figure is zero (cut-off): the absolute floor, A or S. */
const ZERO_FLOOR = 1e-15;

/** Invented Fernhollow cards: an NMOS and a PMOS of a few-micron process. */
const CARDS: Record<MosFamily, MosModelCard> = {
  nmos: { VTO: 0.7, KP: 110e-6, LAMBDA: 0.04, GAMMA: 0.45, PHI: 0.8 },
  pmos: { VTO: -0.8, KP: 40e-6, LAMBDA: 0.05, GAMMA: 0.5, PHI: 0.75 },
};

interface Bias {
  name: string;
  /** NMOS-sense terminal voltages, V; a PMOS gets them negated. */
  vgsV: number;
  vdsV: number;
  vbsV: number;
  widthM: number;
  lengthM: number;
}

const BIASES: readonly Bias[] = [
  { name: 'cut-off', vgsV: 0.4, vdsV: 1.5, vbsV: 0, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'cut-off by the body effect (source 3 V above bulk)', vgsV: 0.95, vdsV: 1.5, vbsV: -3, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'saturation, body tied to source', vgsV: 1.2, vdsV: 2, vbsV: 0, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'saturation, source 1.5 V above bulk', vgsV: 1.8, vdsV: 3, vbsV: -1.5, widthM: 20e-6, lengthM: 1e-6 },
  { name: 'near the saturation edge', vgsV: 1.5, vdsV: 0.8, vbsV: 0, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'linear, body tied to source', vgsV: 2.5, vdsV: 0.3, vbsV: 0, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'linear, source 2 V above bulk', vgsV: 3, vdsV: 0.5, vbsV: -2, widthM: 4e-6, lengthM: 4e-6 },
  { name: 'drain and source swapped, linear', vgsV: 1.2, vdsV: -0.4, vbsV: -1, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'drain and source swapped, saturation', vgsV: 0.2, vdsV: -1.5, vbsV: -2, widthM: 10e-6, lengthM: 2e-6 },
  { name: 'forward-biased body (vbs = +0.3 V)', vgsV: 1.2, vdsV: 1.5, vbsV: 0.3, widthM: 10e-6, lengthM: 2e-6 },
];

const TEMPERATURES_C = [-40, 27, 125] as const;

/** SPICE's number: plain exponent notation, no unit suffix to misread (`1e-6`, not `1u`). */
const spice = (value: number): string => String(value);

/** The `.model` line of a card, level 1, each parameter by its SPICE name. */
function modelLine(name: string, family: MosFamily, card: MosModelCard): string {
  const parameters = Object.entries(card).map(([key, value]) => `${key.toLowerCase()}=${spice(value)}`);
  return `.model ${name} ${family} level=1 ${parameters.join(' ')}`;
}

/** One netlist: every bias on its own transistor m<i>, sources vd<i>, vg<i>, vb<i>, the source at ground. */
function biasNetlist(family: MosFamily, temperatureC: number): string {
  const sign = family === 'pmos' ? -1 : 1;
  const lines = [`level-1 ${family} at ${temperatureC} C`, '.options tnom=27 reltol=1e-6', `.temp ${temperatureC}`];
  BIASES.forEach((b, i) => {
    lines.push(
      `vd${i} d${i} 0 ${spice(sign * b.vdsV)}`,
      `vg${i} g${i} 0 ${spice(sign * b.vgsV)}`,
      `vb${i} b${i} 0 ${spice(sign * b.vbsV)}`,
      `m${i} d${i} g${i} 0 b${i} dev w=${spice(b.widthM)} l=${spice(b.lengthM)}`,
    );
  });
  lines.push(modelLine('dev', family, CARDS[family]));
  lines.push(`.save all ${BIASES.flatMap((_, i) => ['gm', 'gds', 'gmbs'].map((v) => `@m${i}[${v}]`)).join(' ')}`);
  lines.push('.op', '.end', '');
  return lines.join('\n');
}

function scalar(result: Awaited<ReturnType<typeof runSpice>>, name: string): number {
  const vector = result.data.find((d) => d.name.toLowerCase() === name);
  if (!vector) throw new Error(`ngspice returned no ${name} (vectors: ${result.data.map((d) => d.name).join(', ')})`);
  return vector.values[0] as number;
}

/** |a − b| within the tolerance relative to b, or within the floor where b is (near) zero. */
function expectAgreement(predicted: number, reference: number, what: string): void {
  const bound = Math.max(SAME_MODEL_TOLERANCE * Math.abs(reference), ZERO_FLOOR);
  expect(Math.abs(predicted - reference), `${what}: ${predicted} against ngspice's ${reference}`).toBeLessThanOrEqual(bound);
}

beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

describe(`the level-1 MOSFET against ${REFERENCE_SPICE_BUILD} ngspice`, () => {
  const runs = (['nmos', 'pmos'] as const).flatMap((family) => TEMPERATURES_C.map((temperatureC) => [family, temperatureC] as const));

  test.each(runs)('%s at %s °C: drain current, gm, gds, gmbs in every region', async (family, temperatureC) => {
    const result = await runSpice(biasNetlist(family, temperatureC), 'Operating Point');
    const model = mosModel(CARDS[family], family, temperatureC);
    const sign = family === 'pmos' ? -1 : 1;
    const regions = new Set<string>();
    BIASES.forEach((b, i) => {
      const ev = model.evaluate(sign * b.vgsV, sign * b.vdsV, sign * b.vbsV, b.widthM, b.lengthM);
      regions.add(`${ev.region}${ev.mode === -1 ? ' swapped' : ''}`);
      // i(vd) is the current into the source's + terminal: the drain's current, negated
      expectAgreement(ev.drainA, -scalar(result, `i(vd${i})`), `${b.name}: drain current`);
      expectAgreement(ev.gmS, scalar(result, `@m${i}[gm]`), `${b.name}: gm`);
      expectAgreement(ev.gdsS, scalar(result, `@m${i}[gds]`), `${b.name}: gds`);
      expectAgreement(ev.gmbsS, scalar(result, `@m${i}[gmbs]`), `${b.name}: gmbs`);
    });
    // The biases reach every region in both orientations at every temperature
    expect([...regions].sort()).toEqual(['cut-off', 'linear', 'linear swapped', 'saturation', 'saturation swapped']);
  });

  const RAIL_V = 5;
  const LOAD_OHM = 20_000;
  const GATE_V = 1.25;
  const FREQUENCY_HZ = 1000;

  /** The drain voltage of the common-source stage (NMOS sense), by bisection of RAIL − RL·Id(vd) = vd on the model. */
  function stageDrainV(family: MosFamily, temperatureC: number): number {
    const model = mosModel(CARDS[family], family, temperatureC);
    const sign = family === 'pmos' ? -1 : 1;
    let lowV = 0;
    let highV = RAIL_V;
    for (let k = 0; k < 100; k += 1) {
      const midV = (lowV + highV) / 2;
      const idA = sign * model.evaluate(sign * GATE_V, sign * midV, 0, 10e-6, 2e-6).drainA;
      if (RAIL_V - LOAD_OHM * idA > midV) lowV = midV;
      else highV = midV;
    }
    return (lowV + highV) / 2;
  }

  test.each(runs)('%s at %s °C: output noise of a common-source stage, 4kT·(2/3)·gm + 4kT/RL through RL ∥ ro', async (family, temperatureC) => {
    const sign = family === 'pmos' ? -1 : 1;
    const netlist = [
      `common-source ${family} at ${temperatureC} C`,
      '.options tnom=27 reltol=1e-6',
      `.temp ${temperatureC}`,
      `vdd p 0 ${spice(sign * RAIL_V)}`,
      `rl p d ${LOAD_OHM}`,
      `vg g 0 dc ${spice(sign * GATE_V)} ac 1`,
      'm1 d g 0 0 dev w=10e-6 l=2e-6',
      modelLine('dev', family, CARDS[family]),
      `.noise v(d) vg lin 1 ${FREQUENCY_HZ} ${FREQUENCY_HZ}`,
      '.end',
      '',
    ].join('\n');
    const result = await runSpice(netlist, 'Noise Spectral Density Curves');
    const spiceDensity = scalar(result, 'onoise_spectrum');
    const drainV = stageDrainV(family, temperatureC);
    const ev = mosModel(CARDS[family], family, temperatureC).evaluate(sign * GATE_V, sign * drainV, 0, 10e-6, 2e-6);
    expect(ev.region).toBe('saturation');
    const kT = BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K);
    const outputOhm = 1 / (1 / LOAD_OHM + ev.gdsS);
    const density = Math.sqrt((mosDrainNoiseA2PerHz(ev, temperatureC) + (4 * kT) / LOAD_OHM) * outputOhm * outputOhm);
    expectAgreement(density, spiceDensity, 'output noise density, V/√Hz');
  });
});
