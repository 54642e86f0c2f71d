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
