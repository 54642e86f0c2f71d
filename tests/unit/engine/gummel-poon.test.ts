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

describe('the DC currents written out by hand from ngspice bjtload.c and bjttemp.c [SPICE]', () => {
  // bjttemp.c: factlog = (T/Tnom − 1)·EG/VT + XTI·ln(T/Tnom); IS·e^factlog; BF, BR × (T/Tnom)^XTB;
  // ISE·e^(factlog/NE) and ISC·e^(factlog/NC), each ÷ (T/Tnom)^XTB.
  // bjtload.c: a junction s·(e^(v/vtn) − 1), below −3·vtn −s·(1 + (3·vtn/(v·e))³); GMIN·v on the leakage
  // junctions; q1 = 1/(1 − vbc/VAF − vbe/VAR), q2 = cbe/IKF + cbc/IKR, qb = q1·(1 + √(1 + 4·q2))/2;
  // ic = (cbe − cbc)/qb − cbc/BR − cbcn, ib = cbe/BF + cben + cbc/BR + cbcn. Area A scales IS, ISE, ISC, IKF, IKR;
  // the reverse transport current's IS is IS·A·areab, areab defaulting to A (bjttemp.c BJTBCtSatCur,
  // bjtsetup.c), so cbc takes A twice: both ngspice builds the tests run do so.
  const FULL: BjtModelCard = { ...CARD, EG: 1.12, XTI: 3.2 };
  const GMIN = 1e-12;
  function byHand(vbe: number, vbc: number, area: number, celsius: number) {
    const t = celsius + 273.15;
    const ratio = t / 300.15;
    const vt = (1.380649e-23 * t) / 1.602176634e-19;
    const factlog = (ratio - 1) * (1.12 / vt) + 3.2 * Math.log(ratio);
    const beta = ratio ** 1.55;
    const is = 4.2e-15 * Math.exp(factlog) * area;
    const ise = ((2.1e-14 * Math.exp(factlog / 1.55)) / beta) * area;
    const isc = ((3e-14 * Math.exp(factlog / 1.8)) / beta) * area;
    const diode = (s: number, v: number, vtn: number) => (v >= -3 * vtn ? s * (Math.exp(v / vtn) - 1) : -s * (1 + ((3 * vtn) / (v * Math.E)) ** 3));
    const cbe = diode(is, vbe, 1.005 * vt);
    const cbc = diode(is * area, vbc, 1.01 * vt);
    const cben = diode(ise, vbe, 1.55 * vt) + GMIN * vbe;
    const cbcn = diode(isc, vbc, 1.8 * vt) + GMIN * vbc;
    const q1 = 1 / (1 - vbc / 74 - vbe / 18);
    const q2 = cbe / (0.045 * area) + cbc / (0.012 * area);
    const qb = (q1 * (1 + Math.sqrt(1 + 4 * q2))) / 2;
    return { ic: (cbe - cbc) / qb - cbc / (4.2 * beta) - cbcn, ib: cbe / (165 * beta) + cben + cbc / (4.2 * beta) + cbcn };
  }
  const rows = [
    { where: 'forward-active', vbe: 0.68, vbc: -4 },
    { where: 'saturated', vbe: 0.72, vbc: 0.55 },
    { where: 'reverse, VBC far below −3·NC·VT', vbe: 0.62, vbc: -12 },
    { where: 'both junctions off', vbe: -0.4, vbc: -9 },
  ];
  test.each(rows.flatMap((r) => [27, 125, -40].flatMap((celsius) => [1, 2.5].map((area) => ({ ...r, celsius, area })))))(
    '$where, VBE $vbe V, VBC $vbc V, $celsius °C, area $area: IC and IB to 1e-10',
    ({ vbe, vbc, celsius, area }) => {
      const ev = model(FULL, celsius).evaluate(vbe, vbc, area);
      const hand = byHand(vbe, vbc, area, celsius);
      expect(Math.abs(ev.icA - hand.ic)).toBeLessThanOrEqual(1e-10 * Math.max(Math.abs(hand.ic), Math.abs(hand.ib), 1e-15));
      expect(Math.abs(ev.ibA - hand.ib)).toBeLessThanOrEqual(1e-10 * Math.max(Math.abs(hand.ib), 1e-15));
    },
  );
});
