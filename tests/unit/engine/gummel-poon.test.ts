/**
 * The full Gummel-Poon device of shared/engine/device.ts against sources outside the code:
 * - its limits as the textbooks state them [GM]: at currents far above IKF the collector current
 *   grows as exp(VBE/(2·VT)) (high-level injection); with ISE/NE the base current at low currents
 *   follows ISE·exp(VBE/(NE·VT)); NF scales the exponent's slope to 1/(NF·VT);
 * - ngspice's temperature laws (bjttemp.c [SPICE]): BF(T) = BF·(T/Tnom)^XTB;
 * - calculus: the derivatives the Newton iteration and the small-signal solve use equal the
 *   currents' finite differences, for a full card, forward and reverse biased.
 * Values are invented (Fernhollow demo card); the agreement with ngspice itself is
 * tests/reference/full-model-dc.test.ts.
 */
import { describe, expect, test } from 'vitest';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { thermalVoltageV } from '#shared/engine/constants';
import { npnModel } from '#shared/engine/device';

const CARD: BjtModelCard = {
  IS: 4.2e-15, BF: 165, NF: 1.005, VAF: 74, IKF: 0.045, ISE: 2.1e-14, NE: 1.55, BR: 4.2, NR: 1.01, VAR: 18, IKR: 0.012,
  ISC: 3e-14, NC: 1.8, XTB: 1.55,
};

const model = (card: BjtModelCard, temperatureC = 27) => npnModel({ family: 'npn', model: card }, temperatureC);

describe('limits of the full model [GM]', () => {
  test('far above IKF the collector current rises e-fold per 2·VT of VBE (high-level injection)', () => {
    const m = model({ IS: 1e-15, BF: 100, IKF: 1e-3 });
    const vtV = thermalVoltageV(27);
    const vbeV = 1.1; // IS·exp(VBE/VT) ≈ 3 kA, more than six decades above IKF
    const ratio = m.evaluate(vbeV + 2 * vtV, -5, 1).icA / m.evaluate(vbeV, -5, 1).icA;
    expect(ratio).toBeCloseTo(Math.E, 2);
    // and the current stays near √(IS·IKF)·exp(VBE/(2·VT)) there
    expect(m.evaluate(vbeV, -5, 1).icA / (Math.sqrt(1e-15 * 1e-3) * Math.exp(vbeV / (2 * vtV)))).toBeCloseTo(1, 2);
  });

  test('at low currents the base current is the ISE/NE leakage, so beta falls', () => {
    const m = model({ IS: 1e-15, BF: 200, ISE: 1e-13, NE: 2 });
    const vtV = thermalVoltageV(27);
    // VBC = 0: no reverse current; GMIN·VBE (1e-12 S, as SPICE) beside the two base currents
    const low = m.evaluate(0.3, 0, 1);
    const leakA = 1e-13 * (Math.exp(0.3 / (2 * vtV)) - 1);
    const idealA = (1e-15 * (Math.exp(0.3 / vtV) - 1)) / 200;
    expect(Math.abs(low.ibA - leakA - idealA - 1e-12 * 0.3) / leakA).toBeLessThan(1e-9);
    expect(leakA).toBeGreaterThan(10 * idealA);
    const high = m.evaluate(0.7, 0, 1);
    expect(low.icA / low.ibA).toBeLessThan(0.1 * (high.icA / high.ibA));
  });

  test('NF sets the slope: IC rises e-fold per NF·VT of VBE', () => {
    const m = model({ IS: 1e-15, BF: 100, NF: 1.2 });
    const step = 1.2 * thermalVoltageV(27);
    expect(m.evaluate(0.7 + step, -2, 1).icA / m.evaluate(0.7, -2, 1).icA).toBeCloseTo(Math.E, 5);
  });

  test('BF and BR follow (T/Tnom)^XTB (ngspice bjttemp.c)', () => {
    const ratio = (125 + 273.15) / (27 + 273.15);
    expect(model(CARD, 125).beta / (165 * ratio ** 1.55)).toBeCloseTo(1, 12);
    expect(model({ ...CARD, XTB: 0 }, -40).beta).toBe(165);
  });

  test('area A scales the currents as A transistors in parallel (IS, ISE, ISC, IKF, IKR all times A)', () => {
    const m = model(CARD);
    const one = m.evaluate(0.78, -3, 1);
    const two = m.evaluate(0.78, -3, 2);
    // GMIN·v (a few pA here) is not scaled by the area, as in SPICE
    expect(two.icA / one.icA).toBeCloseTo(2, 6);
    expect(two.ibA / one.ibA).toBeCloseTo(2, 6);
  });
});

describe('derivatives equal finite differences of the currents', () => {
  test.each([
    { vbeV: 0.74, vbcV: -4, where: 'forward active, high injection' },
    { vbeV: 0.55, vbcV: -0.5, where: 'forward active, low current' },
    { vbeV: 0.72, vbcV: 0.62, where: 'saturated' },
    { vbeV: -2, vbcV: 0.7, where: 'reverse active' },
  ])('$where (vbe $vbeV V, vbc $vbcV V)', ({ vbeV, vbcV }) => {
    const m = model(CARD, 85);
    const h = 1e-7;
    const at = m.evaluate(vbeV, vbcV, 1);
    const dBe = (f: 'icA' | 'ibA') => (m.evaluate(vbeV + h, vbcV, 1)[f] - m.evaluate(vbeV - h, vbcV, 1)[f]) / (2 * h);
    const dBc = (f: 'icA' | 'ibA') => (m.evaluate(vbeV, vbcV + h, 1)[f] - m.evaluate(vbeV, vbcV - h, 1)[f]) / (2 * h);
    // rounding of a central difference: about 1e-16·|current|/h, so an absolute floor of 1e-10 S
    const close = (analytic: number, numeric: number) => expect(Math.abs(analytic - numeric)).toBeLessThanOrEqual(1e-5 * Math.abs(numeric) + 1e-10);
    close(at.dIcDVbeS, dBe('icA'));
    close(at.dIcDVbcS, dBc('icA'));
    close(at.dIbDVbeS, dBe('ibA'));
    close(at.dIbDVbcS, dBc('ibA'));
  });
});

describe('an empty card is no card', () => {
  test('a device whose model gives no parameter is the three-parameter device', () => {
    const plain = npnModel({ family: 'npn', beta: 150, earlyVoltageV: 60, saturationCurrentA: 2e-15 }, 50);
    const blank = npnModel({ family: 'npn', beta: 150, earlyVoltageV: 60, saturationCurrentA: 2e-15, model: { IS: undefined } }, 50);
    expect([blank.beta, blank.earlyVoltageV, blank.saturationCurrentA]).toEqual([plain.beta, plain.earlyVoltageV, plain.saturationCurrentA]);
    expect(blank.evaluate(0.7, -3, 1)).toEqual(plain.evaluate(0.7, -3, 1));
  });
});
