/**
 * The operating point's continuation methods (SPICE's, ngspice cktop.c): gmin stepping and source
 * stepping, each on its own, reach the operating point of a stage whose tail transistor is
 * saturated (a 100 kΩ resistor in each pair emitter), the one the direct Newton solve finds and
 * tests/reference/saturated-tail-agreement.test.ts holds against ngspice.
 */
import { describe, expect, test } from 'vitest';
import { stageCircuit } from '#shared/engine/circuit';
import { deviceModel } from '#shared/engine/device';
import { indexCircuit } from '#shared/engine/node-system';
import { analyze } from '#shared/engine/analyze';
import { hardFields } from '#shared/engine/convergence-hints';
import { ConvergenceError, gminStepping, solveOperatingPoint, sourceStepping } from '#shared/engine/operating-point';
import type { Design } from '#shared/engine/types';

/** Node voltages agree to this, V: both converge to the engine's 0.1 nV step tolerance. */
const SAME_SOLUTION_V = 1e-8;

const DEVICE = { family: 'npn' as const, beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14 };
const TAILS: Design['tail'][] = [
  { topology: 'resistor', resistanceOhm: 10000 },
  { topology: 'simple-mirror', referenceResistanceOhm: 10000 },
  { topology: 'degenerated-mirror', referenceResistanceOhm: 10000, emitterResistanceOhm: 470 },
  { topology: 'widlar', referenceResistanceOhm: 10000, emitterResistanceOhm: 470 },
  { topology: 'wilson', referenceResistanceOhm: 10000 },
  { topology: 'cascode', referenceResistanceOhm: 10000 },
];

function designWith(tail: Design['tail']): Design {
  return { device: DEVICE, supply: { positiveV: 15, negativeV: -15 }, collectorResistanceOhm: 10000, pairEmitterResistanceOhm: 1e5, tail, inputCommonModeV: 0 };
}

describe.each(TAILS.map((tail) => [tail.topology, tail] as const))('continuation, %s tail, 100 kΩ pair emitter resistors', (_name, tail) => {
  test('gmin stepping from the hand guess reaches the direct solution', () => {
    const circuit = stageCircuit(designWith(tail));
    const model = deviceModel(DEVICE, 27);
    const direct = solveOperatingPoint(circuit, model);
    const ic = indexCircuit(circuit);
    const stepped = gminStepping(ic, model, ic.freeNodes.map((name) => Math.max(Math.min(circuit.initialGuessV[name] ?? 0, 15), -15)));
    expect(stepped).not.toBeNull();
    stepped!.v.forEach((v, k) => expect(Math.abs(v - direct.voltagesV[k]), ic.freeNodes[k]).toBeLessThan(SAME_SOLUTION_V));
  });

  test('source stepping from all nodes at 0 V reaches the direct solution', () => {
    const circuit = stageCircuit(designWith(tail));
    const model = deviceModel(DEVICE, 27);
    const direct = solveOperatingPoint(circuit, model);
    const ic = indexCircuit(circuit);
    const stepped = sourceStepping(ic, model);
    expect('v' in stepped).toBe(true);
    if ('v' in stepped) stepped.v.forEach((v, k) => expect(Math.abs(v - direct.voltagesV[k]), ic.freeNodes[k]).toBeLessThan(SAME_SOLUTION_V));
  });
});

describe('when the operating point cannot be found, the error names the fields that make it hard', () => {
  // 1 GΩ collector and tail resistors around a 2 Ω pair emitter resistor: nanoamps through
  // gigaohms beside two ohms, terms nine decades apart in the node equations (the solver's
  // success on such a design turns on rounding: 1 Ω happens to converge, 2 Ω and 0.01 Ω do not)
  const hard: Design = {
    device: DEVICE,
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 1e9,
    pairEmitterResistanceOhm: 2,
    tail: { topology: 'resistor', resistanceOhm: 1e9 },
    inputCommonModeV: 0,
  };

  test('analyze gives up with a ConvergenceError naming the resistances outside the usual range, furthest out first', () => {
    let caught: unknown;
    try {
      analyze(hard);
    } catch (error) {
      caught = error;
    }
    expect(caught).toBeInstanceOf(ConvergenceError);
    const error = caught as ConvergenceError;
    // 1 GΩ is three decades above 1 MΩ, 2 Ω 0.7 decade below 10 Ω
    expect(error.fields).toEqual(['/collectorResistanceOhm', '/tail/resistanceOhm', '/pairEmitterResistanceOhm']);
    expect(error.message).toContain('/collectorResistanceOhm, /tail/resistanceOhm, /pairEmitterResistanceOhm');
    expect(error.message).toContain('gmin stepping');
  });

  test('with every resistance in the usual range, the largest is named (it sets the smallest current)', () => {
    expect(hardFields({ ...hard, collectorResistanceOhm: 4700, pairEmitterResistanceOhm: 0, tail: { topology: 'simple-mirror', referenceResistanceOhm: 220000 } })).toEqual([
      '/tail/referenceResistanceOhm',
    ]);
  });
});
