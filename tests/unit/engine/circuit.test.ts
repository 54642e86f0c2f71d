/**
 * The stage circuit of a design (shared/engine/circuit.ts), as ENGINE-CONTRACT.md describes it:
 * Q1/Q2 with bases at in1/in2 (both at the input common mode), collectors through RC1/RC2 to the
 * positive rail with RC2 = RC1·(1 + ε), Q2's IS scaled by 1 + δIS, optional equal emitter
 * resistors to the tail node t, Ct from t to ground only when given; and the solver's starting
 * guess from hand analysis (the tail node a VBE below the inputs, each collector half the tail
 * current's drop across RC below the rail).
 */
import { describe, expect, test } from 'vitest';
import { pairIsMatched, stageCircuit, type CircuitElement } from '#shared/engine/circuit';
import type { Design } from '#shared/engine/types';

const BASE: Design = {
  device: { beta: 120, earlyVoltageV: 80, saturationCurrentA: 1e-15 },
  supply: { positiveV: 12, negativeV: -12 },
  collectorResistanceOhm: 8200,
  tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
  inputCommonModeV: 1.5,
};

const pairLines = (elements: CircuitElement[]) =>
  elements
    .filter((e) => e.part === 'pair')
    .map((e) => (e.kind === 'npn' ? `${e.name} ${e.collector} ${e.base} ${e.emitter} area ${e.area}` : e.kind === 'resistor' ? `${e.name} ${e.nodes.join(' ')} ${e.resistanceOhm}` : `${e.name}`));

describe('the pair', () => {
  test('matched, no degeneration: emitters joined at t, loads from the positive rail, inputs and rails held', () => {
    const circuit = stageCircuit(BASE);
    expect(pairLines(circuit.elements)).toEqual(['RC1 vp c1 8200', 'RC2 vp c2 8200', 'Q1 c1 in1 t area 1', 'Q2 c2 in2 t area 1']);
    expect(circuit.fixedNodesV).toEqual({ 0: 0, vp: 12, vn: -12, in1: 1.5, in2: 1.5 });
    expect(circuit.elements.some((e) => e.kind === 'capacitor')).toBe(false);
  });

  test('load and IS mismatch: RC2 = RC1·(1 + ε), Q2\'s area 1 + δIS', () => {
    const circuit = stageCircuit({ ...BASE, collectorMismatch: 0.02, pairSaturationCurrentMismatch: -0.05 });
    expect(pairLines(circuit.elements)).toEqual(['RC1 vp c1 8200', `RC2 vp c2 ${8200 * 1.02}`, 'Q1 c1 in1 t area 1', 'Q2 c2 in2 t area 0.95']);
  });

  test('emitter degeneration: RE1 and RE2 from each emitter to t', () => {
    const circuit = stageCircuit({ ...BASE, pairEmitterResistanceOhm: 220 });
    expect(pairLines(circuit.elements)).toEqual(['RC1 vp c1 8200', 'RC2 vp c2 8200', 'Q1 c1 in1 e1 area 1', 'Q2 c2 in2 e2 area 1', 'RE1 e1 t 220', 'RE2 e2 t 220']);
  });

  test('the input common mode defaults to 0 V', () => {
    const { inputCommonModeV: _, ...design } = BASE;
    expect(stageCircuit(design as Design).fixedNodesV).toMatchObject({ in1: 0, in2: 0 });
  });

  test('tail capacitance: CT from t to ground, part of the tail, only when given', () => {
    const withCt = stageCircuit({ ...BASE, tailCapacitanceF: 4.7e-12 }).elements.filter((e) => e.kind === 'capacitor');
    expect(withCt).toEqual([{ kind: 'capacitor', name: 'CT', nodes: ['t', '0'], capacitanceF: 4.7e-12, part: 'tail' }]);
    expect(stageCircuit({ ...BASE, tailCapacitanceF: 0 }).elements.some((e) => e.kind === 'capacitor')).toBe(false);
  });

  test('the tail\'s own elements follow the pair', () => {
    const names = stageCircuit(BASE).elements.map((e) => e.name);
    expect(names).toEqual(['RC1', 'RC2', 'Q1', 'Q2', 'RREF', 'Q3', 'Q4']);
  });
});

describe('starting guess', () => {
  test('the tail node one VBE below the inputs; each collector half the tail current\'s drop across RC below the rail', () => {
    // simple mirror: Iref = (24 − 0.7)/22 kΩ ≈ 1.06 mA, 0.53 mA per collector through 8.2 kΩ
    const circuit = stageCircuit(BASE, 0.7);
    const iTail = (24 - 0.7) / 22000;
    expect(circuit.initialGuessV.t).toBeCloseTo(0.8, 12);
    expect(circuit.initialGuessV.c1).toBeCloseTo(12 - (iTail / 2) * 8200, 9);
    expect(circuit.initialGuessV.c2).toBe(circuit.initialGuessV.c1);
    expect(circuit.initialGuessV.ref).toBeCloseTo(-12 + 0.7, 12);
    // a guess for every free node and no other: without degeneration there are no e1, e2
    expect(Object.keys(circuit.initialGuessV).sort()).toEqual(['c1', 'c2', 'ref', 't']);
  });

  test('a VBE of 0.65 V when the caller gives none', () => {
    expect(stageCircuit(BASE).initialGuessV.t).toBeCloseTo(1.5 - 0.65, 12);
  });

  test('collectors never guessed below 0.3 V above the tail node, however large the drop', () => {
    const circuit = stageCircuit({ ...BASE, collectorResistanceOhm: 100000 }, 0.7);
    expect(circuit.initialGuessV.c1).toBeCloseTo(0.8 + 0.3, 12);
  });

  test('with degeneration, each emitter at the tail guess and t lower by half the tail current across RE', () => {
    const circuit = stageCircuit({ ...BASE, pairEmitterResistanceOhm: 470 }, 0.7);
    const iTail = (24 - 0.7) / 22000;
    expect(circuit.initialGuessV.e1).toBeCloseTo(0.8, 12);
    expect(circuit.initialGuessV.e2).toBeCloseTo(0.8, 12);
    expect(circuit.initialGuessV.t).toBeCloseTo(0.8 - (iTail / 2) * 470, 12);
  });
});

describe('starting guess with the device\'s VBE at each current', () => {
  // VBE = VT·ln(I/IS), the forward junction [GM], at the room-temperature VT the guesses use
  const VT_V = 0.0259;
  const vbeAtV = (currentA: number) => VT_V * Math.log(currentA / 1e-15);

  test('simple mirror: the tail node the VBE of half the tail current below the inputs', () => {
    const circuit = stageCircuit(BASE, 0.7, vbeAtV);
    const iTail = (24 - (circuit.initialGuessV.ref + 12)) / 22000;
    expect(circuit.initialGuessV.t).toBeCloseTo(1.5 - vbeAtV(iTail / 2), 9);
  });

  test('resistor tail: the tail node and the tail current agree, I = (t − V−)/RT with t the VBE of I/2 below the inputs, to 0.1 mV', () => {
    const circuit = stageCircuit({ ...BASE, tail: { topology: 'resistor', resistanceOhm: 15000 } }, 0.7, vbeAtV);
    const t = circuit.initialGuessV.t;
    const iTail = (t + 12) / 15000;
    expect(Math.abs(t - (1.5 - vbeAtV(iTail / 2)))).toBeLessThan(1e-4);
  });
});

describe('a matched pair', () => {
  test('is one with no collector, IS, BF or VAF mismatch; any one of them makes it mismatched', () => {
    expect(pairIsMatched(BASE)).toBe(true);
    expect(pairIsMatched({ ...BASE, collectorMismatch: 0, pairSaturationCurrentMismatch: 0, pairBetaMismatch: 0, pairEarlyVoltageMismatch: 0 })).toBe(true);
    for (const field of ['collectorMismatch', 'pairSaturationCurrentMismatch', 'pairBetaMismatch', 'pairEarlyVoltageMismatch'] as const) {
      expect(pairIsMatched({ ...BASE, [field]: 1e-6 }), field).toBe(false);
      expect(pairIsMatched({ ...BASE, [field]: -0.01 }), field).toBe(false);
    }
  });
});
