/**
 * The junction and diffusion capacitances of shared/engine/junction-charges.ts against ngspice's
 * own equations, evaluated by hand here [SPICE] ngspice bjtload.c (charge storage section):
 * - depletion: CZ·(1 − v/VJ)^−M below FC·VJ, CZ/F2·(F3 + M·v/VJ) above it, F2 = (1 − FC)^(1+M),
 *   F3 = 1 − FC·(1 + M);
 * - substrate: CZ·(1 − vsub/VJS)^−MJS when vsub < 0, CZ·(1 + MJS·vsub/VJS) when forward biased;
 * - diffusion: only when TF ≠ 0 and vbe > 0 is the forward term divided by qb,
 *   cbe = I_F/qb, gbe = (g_F − cbe·dqb/dvbe)/qb, geqcb = TF·(−cbe·dqb/dvbc)/qb; otherwise
 *   capbe = TF·g_F; capbc = TR·g_R.
 * At 27 °C (TNOM = TREF) bjttemp.c leaves CJ and VJ as the card gives them, so the card's
 * numbers go straight into the formulas. The bias is built by hand from the Gummel-Poon base
 * charge with no roll-off, q1 = 1/(1 − vbc/VAF − vbe/VAR), qb = q1, dqb/dvbe = q1²/VAR,
 * dqb/dvbc = q1²/VAF [SPICE] bjtload.c. Card values are invented.
 */
import { describe, expect, test } from 'vitest';
import { resolvedParameters, type BjtModelCard } from '#shared/engine/bjt-parameters';
import { thermalVoltageV } from '#shared/engine/constants';
import { chargeParameters, substrateCapacitanceF, transistorCapacitances, type JunctionBias, type TransportTerms } from '#shared/engine/junction-charges';

/** The transport terms and the junction voltages together (the evaluation and the bias it was made at). */
type TransportBias = TransportTerms & JunctionBias;

const CARD: BjtModelCard = {
  IS: 1e-14, BF: 150, VAF: 50, VAR: 10,
  CJE: 12e-12, VJE: 0.72, MJE: 0.36, CJC: 4.5e-12, VJC: 0.6, MJC: 0.42, CJS: 2.2e-12, VJS: 0.65, MJS: 0.4, FC: 0.5,
  TF: 0.45e-9, TR: 60e-9,
};

const RELATIVE = 1e-6;

/** The transport terms of ngspice's bjtload.c at (vbe, vbc), no IKF/IKR, by hand. */
function handBias(vbeV: number, vbcV: number, vsubV: number): TransportBias {
  const vtV = thermalVoltageV(27);
  const is = CARD.IS!;
  const q1 = 1 / (1 - vbcV / CARD.VAF! - vbeV / CARD.VAR!);
  return {
    vbeV,
    vbcV,
    vsubV,
    forwardA: is * (Math.exp(vbeV / vtV) - 1),
    forwardS: (is / vtV) * Math.exp(vbeV / vtV),
    reverseA: is * (Math.exp(vbcV / vtV) - 1),
    reverseS: (is / vtV) * Math.exp(vbcV / vtV),
    qb: q1,
    dqbDVbe: (q1 * q1) / CARD.VAR!,
    dqbDVbc: (q1 * q1) / CARD.VAF!,
  };
}

/** CZ·(1 − v/VJ)^−M, the reverse-biased depletion law. */
const powerLaw = (cz: number, vj: number, m: number, v: number) => cz * (1 - v / vj) ** -m;

describe('depletion and diffusion capacitances, ngspice bjtload.c by hand', () => {
  test('forward-active at 0.65 V: the base-emitter depletion on its FC tangent, the diffusion term divided by qb', () => {
    const c = chargeParameters(resolvedParameters(CARD), 27);
    const bias = handBias(0.65, -5, -8);
    const got = transistorCapacitances(c, bias, bias, 1);
    // 0.65 V > FC·VJE = 0.36 V: the tangent continuation
    const f2 = (1 - 0.5) ** (1 + 0.36);
    const f3 = 1 - 0.5 * (1 + 0.36);
    const depletionBe = (12e-12 / f2) * (f3 + (0.36 * 0.65) / 0.72);
    const cbe = bias.forwardA / bias.qb;
    const gbe = (bias.forwardS - cbe * bias.dqbDVbe) / bias.qb;
    expect(got.baseEmitterF / (0.45e-9 * gbe + depletionBe) - 1).toBeCloseTo(0, 6);
    expect(got.baseEmitterPerVbcF / ((0.45e-9 * -cbe * bias.dqbDVbc) / bias.qb) - 1).toBeCloseTo(0, 6);
    expect(got.baseCollectorF / (60e-9 * bias.reverseS + powerLaw(4.5e-12, 0.6, 0.42, -5)) - 1).toBeCloseTo(0, 6);
    expect(got.collectorSubstrateF / powerLaw(2.2e-12, 0.65, 0.4, -8) - 1).toBeCloseTo(0, 6);
  });

  test('an area factor of 3 triples every depletion capacitance', () => {
    const c = chargeParameters(resolvedParameters({ ...CARD, TF: 0, TR: 0 }), 27);
    const bias = handBias(0.2, -3, -6);
    const got = transistorCapacitances(c, bias, bias, 3);
    expect(got.baseEmitterF / (3 * powerLaw(12e-12, 0.72, 0.36, 0.2)) - 1).toBeCloseTo(0, 6);
    expect(got.baseCollectorF / (3 * powerLaw(4.5e-12, 0.6, 0.42, -3)) - 1).toBeCloseTo(0, 6);
    expect(got.collectorSubstrateF / (3 * powerLaw(2.2e-12, 0.65, 0.4, -6)) - 1).toBeCloseTo(0, 6);
  });

  test.each([
    ['reverse-biased base-emitter junction', -0.4],
    ['base-emitter junction at exactly 0 V', 0],
  ])('%s: the forward diffusion term is TF·g_F, not divided by qb, and no vbc term', (_name, vbeV) => {
    const c = chargeParameters(resolvedParameters(CARD), 27);
    const bias = handBias(vbeV, -5, -8);
    // qb differs from 1 here (VAF, VAR finite), so the forward-bias form would give another figure
    expect(Math.abs(bias.qb - 1)).toBeGreaterThan(0.05);
    const got = transistorCapacitances(c, bias, bias, 1);
    expect(got.baseEmitterF / (0.45e-9 * bias.forwardS + powerLaw(12e-12, 0.72, 0.36, vbeV)) - 1).toBeCloseTo(0, 6);
    expect(got.baseEmitterPerVbcF).toBe(0);
  });

  test('a forward-biased substrate junction follows the linear law CZ·(1 + MJS·vsub/VJS); 0 V gives CZ', () => {
    const c = chargeParameters(resolvedParameters(CARD), 27);
    expect(substrateCapacitanceF(c.collectorSubstrate, 2.2e-12, 0.3) / (2.2e-12 * (1 + (0.4 * 0.3) / 0.65)) - 1).toBeCloseTo(0, 6);
    expect(substrateCapacitanceF(c.collectorSubstrate, 2.2e-12, 0) / 2.2e-12 - 1).toBeCloseTo(0, 6);
    expect(substrateCapacitanceF(c.collectorSubstrate, 2.2e-12, -2) / powerLaw(2.2e-12, 0.65, 0.4, -2) - 1).toBeCloseTo(0, 6);
  });

  test('at 27 °C the card\u2019s CJ and VJ hold unchanged (TNOM = TREF in bjttemp.c)', () => {
    const c = chargeParameters(resolvedParameters(CARD), 27);
    expect(Math.abs(c.baseEmitter.zeroBiasF / 12e-12 - 1)).toBeLessThan(RELATIVE);
    expect(Math.abs(c.baseEmitter.potentialV / 0.72 - 1)).toBeLessThan(RELATIVE);
    expect(Math.abs(c.baseCollector.potentialV / 0.6 - 1)).toBeLessThan(RELATIVE);
    expect(Math.abs(c.collectorSubstrate.zeroBiasF / 2.2e-12 - 1)).toBeLessThan(RELATIVE);
  });
});

describe('junction capacitances and potentials over temperature [SPICE] ngspice bjttemp.c (TLEVC = 0), written out by hand', () => {
  // bjttemp.c: vt = kT/q; Eg(T) = 1.16 − 7.02e-4·T²/(T + 1108) eV; arg = −Eg(T)/(2kT/q) + 1.1150877/(2k·300.15/q);
  // pbfact(T) = −2·vt·(1.5·ln(T/300.15) + arg); pbo = (VJ − pbfact(TNOM))/(TNOM/300.15);
  // VJ(T) = (T/300.15)·pbo + pbfact(T); CJ(T) = CJ·(1 + M·(4e-4·(T − 300.15) − (VJ(T) − pbo)/pbo))
  //   / (1 + M·(4e-4·(TNOM − 300.15) − (VJ − pbo)/pbo)); TNOM = 27 °C = 300.15 K here (ngspice's default)
  const K_OVER_Q = 1.380649e-23 / 1.602176634e-19; // CODATA 2018 exact values [SI]
  const pbfact = (kelvin: number) => {
    const vt = K_OVER_Q * kelvin;
    const gap = 1.16 - (7.02e-4 * kelvin * kelvin) / (kelvin + 1108);
    const arg = -gap / (2 * K_OVER_Q * kelvin) + 1.1150877 / (2 * K_OVER_Q * 300.15);
    return -2 * vt * (1.5 * Math.log(kelvin / 300.15) + arg);
  };
  function byHand(cj: number, vj: number, m: number, celsius: number) {
    const t = celsius + 273.15;
    const pbo = (vj - pbfact(300.15)) / 1;
    const vjT = (t / 300.15) * pbo + pbfact(t);
    const cjT = (cj * (1 + m * (4e-4 * (t - 300.15) - (vjT - pbo) / pbo))) / (1 + m * (4e-4 * 0 - (vj - pbo) / pbo));
    return { zeroBiasF: cjT, potentialV: vjT };
  }
  const card: BjtModelCard = { CJE: 12e-12, VJE: 0.8, MJE: 0.36, CJC: 5e-12, VJC: 0.65, MJC: 0.42, CJS: 3e-12, VJS: 0.6, MJS: 0.3 };

  test.each([-55, -40, 27, 85, 125])('at %s °C: each junction\'s zero-bias capacitance and potential to 1e-12', (celsius) => {
    const charges = chargeParameters(resolvedParameters(card), celsius);
    const rows: [keyof typeof charges, number, number, number][] = [
      ['baseEmitter', 12e-12, 0.8, 0.36],
      ['baseCollector', 5e-12, 0.65, 0.42],
      ['collectorSubstrate', 3e-12, 0.6, 0.3],
    ];
    for (const [name, cj, vj, m] of rows) {
      const junction = charges[name] as { zeroBiasF: number; potentialV: number; exponent: number };
      const hand = byHand(cj, vj, m, celsius);
      expect(Math.abs(junction.zeroBiasF / hand.zeroBiasF - 1), `${name} CJ`).toBeLessThan(1e-12);
      expect(Math.abs(junction.potentialV / hand.potentialV - 1), `${name} VJ`).toBeLessThan(1e-12);
      expect(junction.exponent).toBe(m);
    }
  });

  test('the potential falls and the capacitance rises with temperature (about −1.5 to −2.5 mV/K for VJ near 0.7 V, common practice)', () => {
    const cold = chargeParameters(resolvedParameters(card), -40).baseEmitter;
    const hot = chargeParameters(resolvedParameters(card), 125).baseEmitter;
    const slope = (hot.potentialV - cold.potentialV) / 165;
    expect(slope).toBeLessThan(-1.5e-3);
    expect(slope).toBeGreaterThan(-2.5e-3);
    expect(hot.zeroBiasF).toBeGreaterThan(cold.zeroBiasF);
  });

  test('a device stores charge when any one of CJE, CJC, CJS, TF or TR is not zero, and none when all are', () => {
    expect(chargeParameters(resolvedParameters({}), 27).none).toBe(true);
    for (const key of ['CJE', 'CJC', 'CJS', 'TF', 'TR'] as const) {
      expect(chargeParameters(resolvedParameters({ [key]: 1e-12 }), 27).none, key).toBe(false);
    }
  });
});
