/**
 * The stored charges of shared/engine/stored-charge.ts against ngspice's charge equations
 * [SPICE] ngspice bjtload.c (charge storage section), checked two independent ways:
 * - each depletion charge is the integral from 0 of the capacitance law ngspice states,
 *   CZ·(1 − v/VJ)^−M below FC·VJ and CZ/F2·(F3 + M·v/VJ) above it (F2 = (1 − FC)^(1+M),
 *   F3 = 1 − FC·(1 + M)), integrated here by Simpson's rule;
 * - the charges' derivatives are the capacitances ngspice's AC analysis uses
 *   (transistorCapacitances), by central differences, diffusion terms included: the transient's
 *   Jacobian and its charges must belong together or Newton converges to the wrong point.
 * Card values are invented.
 */
import { describe, expect, test } from 'vitest';
import { resolvedParameters, type BjtModelCard } from '#shared/engine/bjt-parameters';
import { npnModel } from '#shared/engine/device';
import { chargeParameters, transistorCapacitances } from '#shared/engine/junction-charges';
import { depletionChargeC, substrateChargeC, transistorCharges } from '#shared/engine/stored-charge';

const CARD: BjtModelCard = {
  IS: 1e-14, BF: 150, VAF: 50, VAR: 10, IKF: 0.05,
  CJE: 12e-12, VJE: 0.72, MJE: 0.36, CJC: 4.5e-12, VJC: 0.6, MJC: 0.42, CJS: 2.2e-12, VJS: 0.65, MJS: 0.4, FC: 0.5,
  TF: 0.45e-9, TR: 60e-9,
};

/** ngspice's depletion capacitance law, written out. */
function handCapacitanceF(cz: number, vj: number, m: number, fc: number, v: number): number {
  if (v < fc * vj) return cz * (1 - v / vj) ** -m;
  return (cz / (1 - fc) ** (1 + m)) * (1 - fc * (1 + m) + (m * v) / vj);
}

/** ∫₀^v f by Simpson's rule on 2000 panels. */
function integral(f: (x: number) => number, v: number): number {
  const n = 2000;
  const h = v / n;
  let sum = f(0) + f(v);
  for (let k = 1; k < n; k += 1) sum += (k % 2 ? 4 : 2) * f(k * h);
  return (sum * h) / 3;
}

const relative = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('depletion charges are the integrals of ngspice\u2019s capacitance laws', () => {
  const c = chargeParameters(resolvedParameters(CARD), 27);

  test.each([-8, -1, -0.2, 0.2, 0.36, 0.5, 0.8])('base-emitter junction at %s V (FC·VJE = 0.36 V: power law below, tangent above)', (v) => {
    const expected = integral((x) => handCapacitanceF(12e-12, 0.72, 0.36, 0.5, x), v);
    expect(relative(depletionChargeC(c.baseEmitter, 12e-12, 0.5, v), expected)).toBeLessThan(1e-9);
  });

  test.each([-5, -0.1, 0.4])('substrate junction at %s V: power law reverse-biased, linear capacitance forward-biased', (v) => {
    const law = (x: number) => (x < 0 ? 2.2e-12 * (1 - x / 0.65) ** -0.4 : 2.2e-12 * (1 + (0.4 * x) / 0.65));
    expect(relative(substrateChargeC(c.collectorSubstrate, 2.2e-12, v), integral(law, v))).toBeLessThan(1e-9);
  });

  test('no zero-bias capacitance, no charge', () => {
    expect(depletionChargeC(c.baseEmitter, 0, 0.5, 0.3)).toBe(0);
    expect(substrateChargeC(c.collectorSubstrate, 0, -3)).toBe(0);
  });
});

describe('a transistor\u2019s charges differentiate to the capacitances of the AC analysis', () => {
  const temperatureC = 85;
  const c = chargeParameters(resolvedParameters(CARD), temperatureC);
  const model = npnModel({ family: 'npn', model: CARD } as never, temperatureC);
  const chargesAt = (vbeV: number, vbcV: number, vsubV: number, area: number) =>
    transistorCharges(c, model.evaluate(vbeV, vbcV, area), { vbeV, vbcV, vsubV }, area);
  const DV = 1e-6;

  test.each([
    ['forward-active', 0.68, -4, -6, 1],
    ['saturated (both junctions forward)', 0.75, 0.55, -1, 1],
    ['cut off', -0.3, -9, -12, 2],
    ['forward-active, area 3', 0.62, -1.5, -3, 3],
  ])('%s', (_name, vbeV, vbcV, vsubV, area) => {
    const caps = transistorCapacitances(c, model.evaluate(vbeV, vbcV, area), { vbeV, vbcV, vsubV }, area);
    const dVbe = (chargesAt(vbeV + DV, vbcV, vsubV, area).baseEmitterC - chargesAt(vbeV - DV, vbcV, vsubV, area).baseEmitterC) / (2 * DV);
    const dVbc = (chargesAt(vbeV, vbcV + DV, vsubV, area).baseEmitterC - chargesAt(vbeV, vbcV - DV, vsubV, area).baseEmitterC) / (2 * DV);
    const dBc = (chargesAt(vbeV, vbcV + DV, vsubV, area).baseCollectorC - chargesAt(vbeV, vbcV - DV, vsubV, area).baseCollectorC) / (2 * DV);
    const dSub = (chargesAt(vbeV, vbcV, vsubV + DV, area).substrateC - chargesAt(vbeV, vbcV, vsubV - DV, area).substrateC) / (2 * DV);
    expect(relative(dVbe, caps.baseEmitterF)).toBeLessThan(1e-5);
    expect(relative(dBc, caps.baseCollectorF)).toBeLessThan(1e-5);
    expect(relative(dSub, caps.collectorSubstrateF)).toBeLessThan(1e-5);
    // the forward charge's dependence on vbc (base-width modulation) exists only in forward bias
    if (caps.baseEmitterPerVbcF === 0) expect(Math.abs(dVbc)).toBeLessThan(1e-9 * caps.baseEmitterF);
    else expect(relative(dVbc, caps.baseEmitterPerVbcF)).toBeLessThan(1e-4);
  });
});
