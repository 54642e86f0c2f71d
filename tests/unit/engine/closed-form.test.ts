import { describe, expect, test } from 'vitest';
import { closedFormTailRout, ROUT_FORMULAS } from '#shared/engine/closed-form';
import type { TailDesign, TransistorOperatingPoint } from '#shared/engine/types';

// The textbook limits of a tail's output resistance [GM: Gray, Hurst, Lewis, Meyer, "Analysis and
// Design of Analog Integrated Circuits", 5th ed., 4.2 (simple mirror ro), 4.3.2 (emitter
// degeneration ro(1 + gm(RE ∥ rπ))), 4.2.4/4.3.4 (Wilson and cascode about β·ro/2)], with
// SPICE's small-signal forms ro = (VAF + VCB)/IC, rπ = BF(1 + VCB/VAF)/gm, gm = IC/VT [SPICE].
// Expected values are worked by hand below from those formulas, never read from the engine.

const IC = 1e-3; // A
const VCB = 5; // V
const VAF = 100; // V
const BETA = 100;
const VT = 0.025; // V, a round thermal voltage so the hand figures are exact

function q(name: string): TransistorOperatingPoint {
  return { name, collectorCurrentA: IC, baseCurrentA: IC / BETA, vbeV: 0.65, vceV: VCB + 0.65, vcbV: VCB, region: 'forward-active', currentGainLossFraction: 0 };
}
const TRANSISTORS = ['Q3', 'Q4', 'Q5', 'Q6'].map(q);

// By hand: ro = (100 + 5) / 1 mA = 105 kΩ; gm = 1 mA / 25 mV = 40 mS;
// rπ = 100 × (1 + 5/100) / 40 mS = 2625 Ω.
const RO = 105_000;
const RPI = 2625;

describe('closedFormTailRout [GM]', () => {
  test('a resistor tail is its resistance', () => {
    const tail = { topology: 'resistor', resistanceOhm: 12_000 } as TailDesign;
    expect(closedFormTailRout(tail, [], BETA, VAF, VT)).toEqual({ valueOhm: 12_000, formula: 'R' });
  });

  test('a simple mirror is ro of its output transistor: 105 kΩ', () => {
    const tail = { topology: 'simple-mirror', referenceResistanceOhm: 10_000 } as TailDesign;
    const rout = closedFormTailRout(tail, TRANSISTORS, BETA, VAF, VT);
    expect(rout.formula).toBe('ro');
    expect(rout.valueOhm).toBeCloseTo(RO, 6);
  });

  test.each(['degenerated-mirror', 'widlar'] as const)('a %s is ro·(1 + gm·(RE ∥ rπ))', (topology) => {
    // RE = 1 kΩ: RE ∥ rπ = 1000 × 2625 / 3625 = 724.1379… Ω; gm × that = 28.9655…;
    // 105 kΩ × 29.9655… = 3.146379… MΩ
    const tail = { topology, referenceResistanceOhm: 10_000, emitterResistanceOhm: 1000 } as TailDesign;
    const rout = closedFormTailRout(tail, TRANSISTORS, BETA, VAF, VT);
    const parallel = (1000 * RPI) / (1000 + RPI);
    expect(parallel).toBeCloseTo(724.13793, 4);
    expect(rout.formula).toBe('ro·(1 + gm·(RE ∥ rπ))');
    expect(rout.valueOhm).toBeCloseTo(RO * (1 + 0.04 * parallel), 3);
    expect(rout.valueOhm! / 3_146_379.31).toBeCloseTo(1, 8);
  });

  test.each(['wilson', 'cascode'] as const)('a %s is β·ro/2: 5.25 MΩ', (topology) => {
    const tail = { topology, referenceResistanceOhm: 10_000 } as TailDesign;
    const rout = closedFormTailRout(tail, TRANSISTORS, BETA, VAF, VT);
    expect(rout.formula).toBe('β·ro/2');
    expect(rout.valueOhm).toBeCloseTo(5_250_000, 3);
  });

  test('without an Early effect (VAF infinite) ro is infinite, reported as no value', () => {
    const mirror = { topology: 'simple-mirror', referenceResistanceOhm: 10_000 } as TailDesign;
    expect(closedFormTailRout(mirror, TRANSISTORS, BETA, Infinity, VT).valueOhm).toBeNull();
    const wilson = { topology: 'wilson', referenceResistanceOhm: 10_000 } as TailDesign;
    expect(closedFormTailRout(wilson, TRANSISTORS, BETA, Infinity, VT).valueOhm).toBeNull();
    // rπ = β/gm = 2.5 kΩ without the VCB/VAF term; ro infinite, so the product is too
    const widlar = { topology: 'widlar', referenceResistanceOhm: 10_000, emitterResistanceOhm: 1000 } as TailDesign;
    expect(closedFormTailRout(widlar, TRANSISTORS, BETA, Infinity, VT).valueOhm).toBeNull();
  });

  test('a missing output transistor is an error naming it', () => {
    const tail = { topology: 'simple-mirror', referenceResistanceOhm: 10_000 } as TailDesign;
    expect(() => closedFormTailRout(tail, [q('Q3')], BETA, VAF, VT)).toThrow('no transistor Q4');
  });

  test('each limit has its formula text', () => {
    expect(ROUT_FORMULAS).toEqual({ resistor: 'R', ro: 'ro', 'degenerated-ro': 'ro·(1 + gm·(RE ∥ rπ))', 'beta-ro-half': 'β·ro/2' });
  });
});
