/**
 * `analyze`'s input-referred noise density (`ac[].inputNoiseVPerRtHz`) against ngspice's
 * `inoise_spectrum` of `.noise v(c1,c2) VD` on the netlist the product writes
 * (`spiceInputNoiseVPerRtHz`, api/verification/spice-tradeoffs.ts): every topology at −40, 27 and
 * 125 °C, each once with the three-parameter device (IS, BF, VAF) and once with a model card
 * carrying RB, RE, RC, flicker noise (KF, AF), leakage and junction and diffusion capacitances
 * (with load, IS and beta mismatch); a source resistance in front of each base and a load
 * capacitance on each collector throughout. Frequencies: 10 Hz (where the card's flicker noise
 * dominates; without KF the density there is the mid-band one), 1 kHz, and ten times the
 * differential bandwidth (where the gain has fallen; the load capacitance shapes the collectors'
 * noise as it shapes the gain, so the input-referred density moves only through the device's own
 * capacitances).
 *
 * Contract tolerance (ENGINE-CONTRACT.md, "Additions, version 2"): noise density 5 %. Both sides
 * compute the same sources on the same small-signal circuit, so each density is also held to a
 * tight bound: 0.1 % (measured: at most 0.0005 % over these 36 circuits and three frequencies).
 *
 * Beside it, a handbook check: a bare pair (no ohmic resistances, no source resistance, no Early
 * effect, no flicker) whose input noise is each transistor's collector shot noise 2q·IC/gm² for
 * both halves plus the two loads' 4kT·RC referred through the gain gm·RC [GM] (Gray, Hurst, Lewis,
 * Meyer, Analysis and Design of Analog Integrated Circuits, noise chapter):
 *   vn² = 2·2kT·VT/IC + 2·4kT·RC/(gm·RC)²,  gm = IC/VT.
 * Under those conditions the pair's emitters are a virtual ground for the differential output and
 * the base shot noise, injected at the tail node, reaches both collectors alike, so the formula
 * holds to what the model adds to it (GMIN, IS in gm): tolerance 0.5 %.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { BOLTZMANN_J_PER_K, ZERO_CELSIUS_K, thermalVoltageV } from '#shared/engine/constants';
import { TOPOLOGIES } from '#shared/engine/topologies';
import type { Design, DeviceParams } from '#shared/engine/types';
import { spiceInputNoiseVPerRtHz } from '../../api/verification/spice-tradeoffs';
import { NETLIST_DEVICE, netlistDesign } from '../helpers/netlist-designs';
import { runSpice, startSpice } from '../helpers/spice';

const NOISE_TOLERANCE = 0.05;
const SAME_MODEL_NOISE_TOLERANCE = 1e-3;
const HANDBOOK_TOLERANCE = 0.005;

/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;

/** Where flicker noise dominates with the card's KF (Hz), and a mid-band frequency. */
const FLICKER_HZ = 10;
const MID_BAND_HZ = 1000;
/** The third frequency, this many times the differential bandwidth. */
const ABOVE_BANDWIDTH = 10;

/** An invented Fernhollow small-signal NPN card: ohmic resistances, flicker noise, leakage, charge. */
const NOISY_CARD: BjtModelCard = {
  IS: 1.1e-14, BF: 165, VAF: 92, RB: 180, RE: 1.2, RC: 15, KF: 1e-15, AF: 1, ISE: 1e-14, NE: 1.6,
  CJE: 9e-12, MJE: 0.35, CJC: 3.5e-12, MJC: 0.4, CJS: 1.5e-12, TF: 0.4e-9, TR: 50e-9,
};
/** An invented PNP card for the PTAT tail's mirror: its own flicker noise, base resistance and charge. */
const NOISY_PNP_CARD: BjtModelCard = { IS: 4e-15, BF: 80, VAF: 40, RB: 250, KF: 3e-15, AF: 1.1, CJE: 6e-12, CJC: 4e-12, CJS: 2e-12, TF: 1e-9, TR: 80e-9 };
const CARD_DEVICE: DeviceParams = { family: 'npn', model: NOISY_CARD, pnp: { model: NOISY_PNP_CARD } } as DeviceParams;

const TEMPERATURES_C = [-40, 27, 125] as const;
const DEVICES = [
  ['three-parameter device', { device: NETLIST_DEVICE, sourceResistanceOhm: 1000, loadCapacitanceF: 10e-12 }],
  ['card with RB, RE, RC, KF, AF', { device: CARD_DEVICE, sourceResistanceOhm: 470, loadCapacitanceF: 5e-12, collectorMismatch: 0.01, pairSaturationCurrentMismatch: 0.02, pairBetaMismatch: 0.05 }],
] as const satisfies readonly (readonly [string, Partial<Design>])[];

const CASES = TOPOLOGIES.flatMap((topology) =>
  DEVICES.flatMap(([deviceName, overrides]) =>
    TEMPERATURES_C.map((temperatureC) => [`${topology}, ${deviceName}, ${temperatureC} °C`, netlistDesign(topology, { ...overrides, temperatureC })] as const),
  ),
);

/** The three frequencies of a design: flicker, mid-band, ten times its bandwidth. */
function frequenciesOf(design: Design): number[] {
  const bandwidthHz = analyze(design).differentialBandwidthHz;
  expect(bandwidthHz, 'the design has a bandwidth to go above').not.toBeNull();
  return [FLICKER_HZ, MID_BAND_HZ, ABOVE_BANDWIDTH * bandwidthHz!];
}

function relativeError(predicted: number, reference: number): number {
  return Math.abs(predicted - reference) / Math.abs(reference);
}

describe('analyze input-referred noise agrees with ngspice .noise on the same circuit', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  describe.each(CASES)('%s', (_title, design) => {
    let measured: Promise<{ frequenciesHz: number[]; spice: number[] }> | undefined;
    const reference = () =>
      (measured ??= (async () => {
        const frequenciesHz = frequenciesOf(design);
        return { frequenciesHz, spice: await spiceInputNoiseVPerRtHz(runSpice, design, frequenciesHz) };
      })());

    test('within 5 % at 10 Hz, 1 kHz and ten times the bandwidth; same model: within 0.1 %', async () => {
      const { frequenciesHz, spice } = await reference();
      const predicted = analyze({ ...design, frequenciesHz }).ac;
      frequenciesHz.forEach((frequencyHz, i) => {
        const p = predicted[i].inputNoiseVPerRtHz;
        expect(p, `density at ${frequencyHz} Hz`).not.toBeNull();
        const what = `at ${frequencyHz} Hz: analyze ${p} vs ngspice ${spice[i]} V/√Hz`;
        expect(relativeError(p!, spice[i]), what).toBeLessThanOrEqual(NOISE_TOLERANCE);
        expect(relativeError(p!, spice[i]), what).toBeLessThanOrEqual(SAME_MODEL_NOISE_TOLERANCE);
      });
    });

    test('reference: the third frequency is above the bandwidth (the gain has fallen), and with the card, 10 Hz is in the flicker noise', async () => {
      const { frequenciesHz, spice } = await reference();
      const result = analyze({ ...design, frequenciesHz });
      expect(result.ac[2].differentialGain).toBeLessThan(Math.abs(result.differentialGain) / 5);
      const [atFlickerHz, midBand] = spice;
      if (design.device.model) expect(atFlickerHz).toBeGreaterThan(1.5 * midBand);
      else expect(relativeError(atFlickerHz, midBand)).toBeLessThan(1e-3);
    });
  });
});

describe('handbook: a bare pair\u2019s input noise is its collector shot noise and its loads\u2019 thermal noise referred through the gain', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  const BARE_DEVICE: DeviceParams = { family: 'npn', beta: 150, saturationCurrentA: 2e-15 };
  const BARE = TEMPERATURES_C.flatMap((temperatureC) =>
    (['resistor', 'cascode'] as const).map((topology) => [`${topology} tail, ${temperatureC} °C`, netlistDesign(topology, { device: BARE_DEVICE, collectorResistanceOhm: 6800, temperatureC })] as const),
  );

  /** vn = √(2·2kT·VT/IC + 2·4kT·RC/(gm·RC)²), gm = IC/VT, IC each transistor's collector current. */
  function handbookVPerRtHz(design: Design, collectorCurrentA: number): number {
    const kT = BOLTZMANN_J_PER_K * ((design.temperatureC ?? 27) + ZERO_CELSIUS_K);
    const vt = thermalVoltageV(design.temperatureC ?? 27);
    const gm = collectorCurrentA / vt;
    const rc = design.collectorResistanceOhm;
    return Math.sqrt(2 * ((2 * kT * vt) / collectorCurrentA) + (2 * 4 * kT * rc) / (gm * rc) ** 2);
  }

  test.each(BARE)('%s: analyze and ngspice within 0.5 % of the formula', async (_title, design) => {
    const result = analyze({ ...design, frequenciesHz: [MID_BAND_HZ] });
    const expected = handbookVPerRtHz(design, result.collectorCurrentA);
    const [spice] = await spiceInputNoiseVPerRtHz(runSpice, design, [MID_BAND_HZ]);
    expect(relativeError(result.ac[0].inputNoiseVPerRtHz!, expected), `analyze ${result.ac[0].inputNoiseVPerRtHz} vs ${expected}`).toBeLessThanOrEqual(HANDBOOK_TOLERANCE);
    expect(relativeError(spice, expected), `ngspice ${spice} vs ${expected}`).toBeLessThanOrEqual(HANDBOOK_TOLERANCE);
  });
});
