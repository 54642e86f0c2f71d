/**
 * Saturation and gm against ngspice on the netlist the product writes.
 *
 * - `transconductanceS` is Q1's gm as ngspice reports it (`@q1[gm]`: the hybrid-π gm, VCE held),
 *   forward-active and saturated; held to the same-model bound of spice-agreement.test.ts (0.01 %).
 *   Saturated, gm with VBC held would exceed it by go, many times over.
 * - A transistor is called saturated where its current gain has left its forward-active value:
 *   the reference is ngspice's DC current gain IC/IB (`@q[ic]`, `@q[ib]`) against the
 *   forward-active BF·(1 + VCB/VAF) of the same model [SPICE], so the warning follows the
 *   transistor's own operating point (VT scales it), not a fixed VCE.
 * - A tail transistor with its base driven and VCE of a few tens of mV is saturated, not cut off.
 */
import { beforeAll, describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import type { Design, DeviceParams } from '#shared/engine/types';
import { spiceOperatingPoint, spiceTransistorVectors, startSpice } from '../helpers/spice';

/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;
/** Same model on both sides: the bound spice-agreement.test.ts holds currents and gains to. */
const SAME_MODEL_TOLERANCE = 1e-4;

const DEVICE: DeviceParams = { family: 'npn', beta: 120, earlyVoltageV: 80, saturationCurrentA: 1e-15 };
const DEVICE_B: DeviceParams = { family: 'npn', beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14 };

const resistorTailDesign = (temperatureC: number, collectorResistanceOhm: number, device: DeviceParams = DEVICE): Design => ({
  device,
  supply: { positiveV: 5, negativeV: -5 },
  collectorResistanceOhm,
  tail: { topology: 'resistor', resistanceOhm: 4300 },
  inputCommonModeV: 0,
  temperatureC,
});

/** The resistor-tail design at `temperatureC` whose Q1 sits at `vceV` (RC found by bisection on the solved operating point). */
function designWithPairVce(temperatureC: number, vceV: number, device: DeviceParams = DEVICE): Design {
  let lowOhm = 1000;
  let highOhm = 20000;
  for (let k = 0; k < 60; k += 1) {
    const midOhm = Math.sqrt(lowOhm * highOhm);
    const q1 = analyze(resistorTailDesign(temperatureC, midOhm, device)).transistors.find((q) => q.name === 'Q1')!;
    if (q1.vceV > vceV) lowOhm = midOhm;
    else highOhm = midOhm;
  }
  return resistorTailDesign(temperatureC, Math.sqrt(lowOhm * highOhm), device);
}

/** ngspice's DC current gain of a transistor against the forward-active BF·(1 + VCB/VAF) of the same model [SPICE]. */
async function spiceCurrentGainLoss(design: Design, transistor: string, collectorNode: string, baseNode: string): Promise<number> {
  const vectors = await spiceTransistorVectors(design, ['ic', 'ib']);
  const op = await spiceOperatingPoint(design);
  const { ic, ib } = vectors[transistor];
  const vcbV = op.nodeVoltagesV[collectorNode] - op.nodeVoltagesV[baseNode];
  const forwardActiveBeta = design.device.beta! * (1 + vcbV / design.device.earlyVoltageV!);
  return 1 - ic! / ib! / forwardActiveBeta;
}

beforeAll(async () => {
  await startSpice();
}, ENGINE_START_TIMEOUT_MS);

describe('transconductanceS is gm as ngspice reports it (VCE held)', () => {
  const cases: [string, () => Design][] = [
    ['simple mirror, forward-active, 27 °C', () => ({ ...resistorTailDesign(27, 8200), tail: { topology: 'simple-mirror', referenceResistanceOhm: 10000 } })],
    ['cascode, forward-active, −40 °C', () => ({ ...resistorTailDesign(-40, 6800, DEVICE_B), supply: { positiveV: 12, negativeV: -12 }, tail: { topology: 'cascode', referenceResistanceOhm: 22000 } })],
    ['resistor tail, pair deep in saturation (VCE ≈ 50 mV), 27 °C', () => designWithPairVce(27, 0.05)],
    ['resistor tail, pair at the edge of saturation (VCE ≈ 0.21 V), 125 °C', () => designWithPairVce(125, 0.21)],
  ];
  test.each(cases)('%s', async (_title, makeDesign) => {
    const design = makeDesign();
    const result = analyze(design);
    const { Q1 } = await spiceTransistorVectors(design, ['gm', 'go']);
    expect(Math.abs(result.transconductanceS / Q1.gm! - 1)).toBeLessThan(SAME_MODEL_TOLERANCE);
  });
});

describe('saturation is called where the current gain has left its forward-active value', () => {
  test(`at 125 °C with VCE ≈ 0.21 V the pair's current gain is well over 5 % down in ngspice, and analyze warns`, async () => {
    const design = designWithPairVce(125, 0.21);
    const lossFraction = await spiceCurrentGainLoss(design, 'Q1', 'c1', 'in1');
    expect(lossFraction).toBeGreaterThan(0.15);
    const result = analyze(design);
    expect(result.transistors.find((q) => q.name === 'Q1')!.region).toBe('saturated');
    expect(result.warnings.some((w) => /^Q1 is saturated/.test(w))).toBe(true);
    // The engine's small-signal loss and ngspice's DC one describe the same injection: within a fifth of each other.
    expect(Math.abs((result.transistors.find((q) => q.name === 'Q1') as unknown as { currentGainLossFraction: number }).currentGainLossFraction / lossFraction - 1)).toBeLessThan(0.2);
  });

  test('at −55 °C with VCE ≈ 0.19 V (below the old fixed 0.2 V) the current gain is within 1 % of forward-active in ngspice, and analyze does not warn', async () => {
    const design = designWithPairVce(-55, 0.19);
    const lossFraction = await spiceCurrentGainLoss(design, 'Q1', 'c1', 'in1');
    expect(Math.abs(lossFraction)).toBeLessThan(0.01);
    const result = analyze(design);
    expect(result.transistors.find((q) => q.name === 'Q1')!.region).toBe('forward-active');
    expect(result.warnings).toEqual([]);
  });

  test('a mirror output transistor at VCE ≈ 18 mV with its base driven is saturated, not cut off', async () => {
    // ±5 V, the input common mode 0.25 V above the negative rail: the pair barely conducts, so
    // Q4 (base driven by the reference branch) is pulled to the rail and carries almost nothing.
    const design: Design = { ...resistorTailDesign(27, 10000), tail: { topology: 'simple-mirror', referenceResistanceOhm: 10000 }, inputCommonModeV: -4.75 };
    const op = await spiceOperatingPoint(design);
    const vectors = await spiceTransistorVectors(design, ['ic', 'ib']);
    const [vRefV, vTailV] = [op.nodeVoltagesV.ref, op.nodeVoltagesV.t];
    expect(vRefV - -5).toBeGreaterThan(0.6); // Q4's base–emitter junction conducts (ngspice)
    expect(vTailV - -5).toBeLessThan(0.05); // … with its collector all but at its emitter
    expect(vectors.Q4.ic! / vectors.Q4.ib!).toBeLessThan(0.01 * DEVICE.beta!); // its current gain is gone: saturated
    const result = analyze(design);
    expect(result.transistors.find((q) => q.name === 'Q4')!.region).toBe('saturated');
    expect(result.warnings.some((w) => /^Q4 is saturated/.test(w))).toBe(true);
    expect(result.warnings.some((w) => /^Q4 is cut off/.test(w))).toBe(false);
  });
});
