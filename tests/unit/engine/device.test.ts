/**
 * The bipolar device model of shared/engine/device.ts against the reduced Gummel-Poon equations
 * of ENGINE-CONTRACT.md / DOMAIN.md [SPICE], written out here:
 *   IC = IS·exp(VBE/VT)·(1 + VCB/VAF),  IB = IS·exp(VBE/VT)/BF   (forward active)
 * The model also carries SPICE's −1 terms, the reverse (BC) diode and GMIN across each junction;
 * the rows are biased (IC ≈ 1 ... 5 mA, VCB ≤ 5 V) so that those neglected terms stay below
 * 1e-6 of the currents, and the comparison is relative 1e-6.
 */
import { describe, expect, test } from 'vitest';
import { thermalVoltageV } from '#shared/engine/constants';
import { earlyVoltageOrInfinityV, nominalSaturationCurrentA, npnModel, saturationCurrentAtA } from '#shared/engine/device';
import type { DeviceParams } from '#shared/engine/types';

const RELATIVE_TOLERANCE = 1e-6;

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

interface ForwardRow {
  isA: number;
  beta: number;
  earlyVoltageV: number;
  vbeV: number;
  vcbV: number;
}

// Invented parts, biased in forward active at 27 °C (IC between about 1 and 5 mA).
const FORWARD_ROWS: ForwardRow[] = [
  { isA: 1e-15, beta: 120, earlyVoltageV: 80, vbeV: 0.72, vcbV: 2 },
  { isA: 6e-15, beta: 210, earlyVoltageV: 45, vbeV: 0.68, vcbV: 5 },
  { isA: 2e-16, beta: 60, earlyVoltageV: 300, vbeV: 0.76, vcbV: 0.5 },
  { isA: 3.3e-14, beta: 290, earlyVoltageV: 17, vbeV: 0.62, vcbV: 3.3 },
];

describe('forward-active currents: the reduced Gummel-Poon equations [SPICE]', () => {
  test.each(FORWARD_ROWS)(
    'IS $isA A, BF $beta, VAF $earlyVoltageV V at VBE $vbeV V, VCB $vcbV V: IC = IS·exp(VBE/VT)·(1 + VCB/VAF)',
    ({ isA, beta, earlyVoltageV, vbeV, vcbV }) => {
      const model = npnModel({ family: 'npn', beta, earlyVoltageV, saturationCurrentA: isA }, 27);
      const vtV = (1.380649e-23 * 300.15) / 1.602176634e-19; // [SI]
      const expectedIcA = isA * Math.exp(vbeV / vtV) * (1 + vcbV / earlyVoltageV); // [SPICE] reduced GP
      expect(relativeError(model.evaluate(vbeV, -vcbV, 1).icA, expectedIcA)).toBeLessThan(RELATIVE_TOLERANCE);
    },
  );

  test.each(FORWARD_ROWS)(
    'IS $isA A, BF $beta, VAF $earlyVoltageV V at VBE $vbeV V, VCB $vcbV V: IB = IS·exp(VBE/VT)/BF',
    ({ isA, beta, earlyVoltageV, vbeV, vcbV }) => {
      const model = npnModel({ family: 'npn', beta, earlyVoltageV, saturationCurrentA: isA }, 27);
      const vtV = (1.380649e-23 * 300.15) / 1.602176634e-19; // [SI]
      const expectedIbA = (isA * Math.exp(vbeV / vtV)) / beta; // [SPICE] reduced GP: no Early factor on IB
      expect(relativeError(model.evaluate(vbeV, -vcbV, 1).ibA, expectedIbA)).toBeLessThan(RELATIVE_TOLERANCE);
    },
  );

  test('the Early effect multiplies IC only: IB does not move with VCB, IC does by (1 + VCB/VAF) [SPICE]', () => {
    const model = npnModel({ family: 'npn', beta: 150, earlyVoltageV: 40, saturationCurrentA: 2e-15 }, 27);
    // IC ≈ 2.6 mA: GMIN·ΔVCB stays under 1e-6 of IB
    const low = model.evaluate(0.73, -1, 1);
    const high = model.evaluate(0.73, -6, 1);
    expect(relativeError(high.ibA, low.ibA)).toBeLessThan(RELATIVE_TOLERANCE);
    expect(relativeError(high.icA / low.icA, (1 + 6 / 40) / (1 + 1 / 40))).toBeLessThan(RELATIVE_TOLERANCE);
  });

  test('IS scales with the area factor (a 2× device carries 2× the current)', () => {
    const model = npnModel({ family: 'npn', beta: 150, earlyVoltageV: 40, saturationCurrentA: 2e-15 }, 27);
    expect(relativeError(model.evaluate(0.7, -3, 2).icA, 2 * model.evaluate(0.7, -3, 1).icA)).toBeLessThan(RELATIVE_TOLERANCE);
  });

  test.each([-40, 0, 60, 125])('at %s °C the model uses VT(T) and IS(T) [SI][SPICE]', (temperatureC) => {
    const model = npnModel({ family: 'npn', beta: 150, earlyVoltageV: 40, saturationCurrentA: 2e-15 }, temperatureC);
    expect(model.thermalVoltageV).toBe(thermalVoltageV(temperatureC));
    expect(model.saturationCurrentA).toBe(saturationCurrentAtA(2e-15, temperatureC));
  });
});

describe('derivatives against central finite differences', () => {
  // Step 0.1 mV: truncation (h/VT)²/6 ≈ 2.5e-6 and rounding well under 1e-5 even for the
  // picosiemens-sized ∂IB/∂VBC in forward active; compared at relative 1e-4.
  const STEP_V = 1e-4;
  const DERIVATIVE_TOLERANCE = 1e-4;

  test.each([
    { label: 'forward active', vbeV: 0.7, vbcV: -4 },
    { label: 'forward active, low current', vbeV: 0.55, vbcV: -0.8 },
    { label: 'saturated (BC forward-biased)', vbeV: 0.72, vbcV: 0.45 },
    { label: 'edge of saturation (VCB = 0)', vbeV: 0.66, vbcV: 0 },
  ])('$label: VBE $vbeV V, VBC $vbcV V', ({ vbeV, vbcV }) => {
    const model = npnModel({ family: 'npn', beta: 135, earlyVoltageV: 55, saturationCurrentA: 4e-15 }, 27);
    const at = model.evaluate(vbeV, vbcV, 1);
    const dBe = (f: 'icA' | 'ibA') => (model.evaluate(vbeV + STEP_V, vbcV, 1)[f] - model.evaluate(vbeV - STEP_V, vbcV, 1)[f]) / (2 * STEP_V);
    const dBc = (f: 'icA' | 'ibA') => (model.evaluate(vbeV, vbcV + STEP_V, 1)[f] - model.evaluate(vbeV, vbcV - STEP_V, 1)[f]) / (2 * STEP_V);
    expect(relativeError(at.dIcDVbeS, dBe('icA'))).toBeLessThan(DERIVATIVE_TOLERANCE);
    expect(relativeError(at.dIcDVbcS, dBc('icA'))).toBeLessThan(DERIVATIVE_TOLERANCE);
    expect(relativeError(at.dIbDVbeS, dBe('ibA'))).toBeLessThan(DERIVATIVE_TOLERANCE);
    expect(relativeError(at.dIbDVbcS, dBc('ibA'))).toBeLessThan(DERIVATIVE_TOLERANCE);
  });

  test.each(FORWARD_ROWS)('gm = IC/VT in forward active [GM]: IS $isA A, VBE $vbeV V, VCB $vcbV V', ({ isA, beta, earlyVoltageV, vbeV, vcbV }) => {
    const model = npnModel({ family: 'npn', beta, earlyVoltageV, saturationCurrentA: isA }, 27);
    const at = model.evaluate(vbeV, -vcbV, 1);
    expect(relativeError(at.dIcDVbeS, at.icA / model.thermalVoltageV)).toBeLessThan(RELATIVE_TOLERANCE); // [GM] gm = IC/VT
  });

  test.each(FORWARD_ROWS)('output conductance is IC/(VAF + VCB) [SPICE]: IS $isA A, VAF $earlyVoltageV V, VCB $vcbV V', ({ isA, beta, earlyVoltageV, vbeV, vcbV }) => {
    const model = npnModel({ family: 'npn', beta, earlyVoltageV, saturationCurrentA: isA }, 27);
    const at = model.evaluate(vbeV, -vcbV, 1);
    // ∂IC/∂VBC = −IC/(VAF + VCB) at fixed VBE, i.e. ro = (VAF + VCB)/IC [SPICE]
    expect(relativeError(-at.dIcDVbcS, at.icA / (earlyVoltageV + vcbV))).toBeLessThan(RELATIVE_TOLERANCE);
  });
});

describe('Early voltage omitted or 0 means infinite [SPICE]', () => {
  const base: DeviceParams = { family: 'npn', beta: 140, saturationCurrentA: 5e-15 };

  test.each([
    { label: 'omitted', device: base, expected: Infinity },
    { label: '0', device: { ...base, earlyVoltageV: 0 }, expected: Infinity },
    { label: '75 V', device: { ...base, earlyVoltageV: 75 }, expected: 75 },
  ])('VAF $label reads as $expected', ({ device, expected }) => {
    expect(earlyVoltageOrInfinityV(device)).toBe(expected);
    expect(npnModel(device, 27).earlyVoltageV).toBe(expected);
  });

  test.each([
    { label: 'omitted', device: base },
    { label: '0', device: { ...base, earlyVoltageV: 0 } },
  ])('VAF $label: IC does not move with VCB and ∂IC/∂VBC is only GMIN-sized', ({ device }) => {
    const model = npnModel(device, 27);
    const low = model.evaluate(0.69, -0.5, 1);
    const high = model.evaluate(0.69, -25, 1);
    expect(relativeError(high.icA, low.icA)).toBeLessThan(RELATIVE_TOLERANCE);
    expect(Math.abs(low.dIcDVbcS)).toBeLessThan(1e-10); // GMIN is 1e-12 S [SPICE]; an Early term would be ~IC/VAF
  });
});

describe('IS from vbeOnV when IS is absent', () => {
  test.each([0.6, 0.65, 0.72])('vbeOnV %s V: the model carries 1 mA at that VBE and 27 °C', (vbeOnV) => {
    const model = npnModel({ family: 'npn', beta: 100, vbeOnV }, 27);
    expect(relativeError(model.evaluate(vbeOnV, 0, 1).icA, 1e-3)).toBeLessThan(RELATIVE_TOLERANCE);
  });

  test('without IS or vbeOnV the default VBE is 0.65 V at 1 mA (common practice)', () => {
    const vtV = (1.380649e-23 * 300.15) / 1.602176634e-19; // [SI]
    expect(relativeError(nominalSaturationCurrentA({ family: 'npn', beta: 100 }), 1e-3 * Math.exp(-0.65 / vtV))).toBeLessThan(1e-12);
  });

  test('a given IS wins over vbeOnV', () => {
    expect(nominalSaturationCurrentA({ family: 'npn', beta: 100, saturationCurrentA: 7e-15, vbeOnV: 0.5 })).toBe(7e-15);
  });
});
