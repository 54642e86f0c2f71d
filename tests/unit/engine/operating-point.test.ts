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
import { designResistances, hardFields, withHardFields } from '#shared/engine/convergence-hints';
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

describe('continuation and junction limiting, step by step', () => {
  const tail: Design['tail'] = { topology: 'cascode', referenceResistanceOhm: 10000 };

  test('gmin stepping counts a Newton solve at each of its eleven shunts (10 mS to 1 pS) and the last without: at least twelve steps', () => {
    const circuit = stageCircuit(designWith(tail));
    const ic = indexCircuit(circuit);
    const stepped = gminStepping(ic, deviceModel(DEVICE, 27), ic.freeNodes.map((name) => Math.max(Math.min(circuit.initialGuessV[name] ?? 0, 15), -15)));
    expect(stepped!.iterations).toBeGreaterThanOrEqual(12);
  });

  test('source stepping counts every step\'s solves: at least five (5 %, then doubling steps, to 100 %)', () => {
    const stepped = sourceStepping(indexCircuit(stageCircuit(designWith(tail))), deviceModel(DEVICE, 27));
    expect('v' in stepped && stepped.iterations).toBeGreaterThanOrEqual(5);
  });

  test('a start with every junction about 3 V forward is limited (SPICE\'s pnjlim) and converges from there, not from the fallback guess', () => {
    const circuit = stageCircuit(designWith(tail));
    const model = deviceModel(DEVICE, 27);
    const direct = solveOperatingPoint(circuit, model);
    const names = direct.circuit.freeNodes;
    const far = { ...direct, voltagesV: direct.voltagesV.map((v, k) => (/^(c|ref)/.test(names[k]) ? v + 3 : v - 3)) };
    const fromFar = solveOperatingPoint(circuit, model, far);
    // a failed start would count MAX_ITERATIONS (150) before the fallback
    expect(fromFar.iterations).toBeLessThan(150);
    fromFar.voltagesV.forEach((v, k) => expect(Math.abs(v - direct.voltagesV[k]), names[k]).toBeLessThan(SAME_SOLUTION_V));
  });
});

describe('Newton stops once its quadratic steps show the solution', () => {
  // A solve warm-started from the solution confirms it in two steps with the plain test (every
  // node moved under 0.1 nV): the early stop must have left no more than that to move
  test.each(TAILS.map((tail) => [tail.topology, tail] as const))('%s, ±15 V: the solution moves less than 10 pV in a confirming solve', (_name, tail) => {
    const circuit = stageCircuit({ ...designWith(tail), pairEmitterResistanceOhm: 0 });
    const model = deviceModel(DEVICE, 27);
    const solved = solveOperatingPoint(circuit, model);
    const confirmed = solveOperatingPoint(circuit, model, solved);
    expect(confirmed.iterations).toBe(2);
    solved.voltagesV.forEach((v, k) => expect(Math.abs(v - confirmed.voltagesV[k]), solved.circuit.freeNodes[k]).toBeLessThan(1e-11));
  });
});

describe('when the operating point cannot be found, the error names the fields that make it hard', () => {
  // 1 GΩ collector and cascode reference resistors around a 1 mΩ pair emitter resistor (the
  // schema's smallest): nanoamps through gigaohms beside a milliohm, terms twelve decades apart
  // in the node equations. ngspice (its 1 µV and 1 pA tolerances) finds this one; the engine's
  // continuation does not, and says so. (With a resistor tail the engine now solves it:
  // tests/reference/smallest-resistances.test.ts.)
  const hard: Design = {
    device: DEVICE,
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 1e9,
    pairEmitterResistanceOhm: 1e-3,
    tail: { topology: 'cascode', referenceResistanceOhm: 1e9 },
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
    // 1 mΩ is four decades below 10 Ω, 1 GΩ three decades above 1 MΩ
    expect(error.fields).toEqual(['/pairEmitterResistanceOhm', '/collectorResistanceOhm', '/tail/referenceResistanceOhm']);
    expect(error.message).toContain('/pairEmitterResistanceOhm, /collectorResistanceOhm, /tail/referenceResistanceOhm');
    expect(error.message).toMatch(/^the operating point did not converge \(gmin stepping failed, source stepping stalled at \d+(\.\d+)? % of the rails\); /);
    // a share of the rails in per cent, neither 0 nor all of them
    const stalledPercent = Number(/stalled at ([\d.]+) %/.exec(error.message)![1]);
    expect(stalledPercent).toBeGreaterThan(1);
    expect(stalledPercent).toBeLessThan(100);
  });

  test('with every resistance in the usual range, the largest is named (it sets the smallest current)', () => {
    expect(hardFields({ ...hard, collectorResistanceOhm: 4700, pairEmitterResistanceOhm: 0, tail: { topology: 'simple-mirror', referenceResistanceOhm: 220000 } })).toEqual([
      '/tail/referenceResistanceOhm',
    ]);
  });
});

describe('the resistances a convergence hint can name', () => {
  const DESIGN: Design = {
    device: DEVICE,
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 4700,
    pairEmitterResistanceOhm: 100,
    tail: { topology: 'widlar', referenceResistanceOhm: 27000, emitterResistanceOhm: 1200 },
    inputCommonModeV: 0,
  };
  const error = () => new ConvergenceError('the operating point did not converge');

  test('every resistance of the design with its JSON path; the tail\u2019s topology is no resistance, a pair emitter resistance of 0 is none', () => {
    expect(designResistances(DESIGN)).toEqual([
      { path: '/collectorResistanceOhm', valueOhm: 4700 },
      { path: '/pairEmitterResistanceOhm', valueOhm: 100 },
      { path: '/tail/referenceResistanceOhm', valueOhm: 27000 },
      { path: '/tail/emitterResistanceOhm', valueOhm: 1200 },
    ]);
    expect(designResistances({ ...DESIGN, pairEmitterResistanceOhm: 0 }).map((r) => r.path)).not.toContain('/pairEmitterResistanceOhm');
  });

  test('inside the usual range the largest resistance is named, wherever it sits; on a tie the first in the design\u2019s order', () => {
    expect(hardFields({ ...DESIGN, collectorResistanceOhm: 470000 })).toEqual(['/collectorResistanceOhm']);
    expect(hardFields({ ...DESIGN, collectorResistanceOhm: 27000 })).toEqual(['/collectorResistanceOhm']);
    expect(withHardFields(error(), DESIGN).message).toBe(
      'the operating point did not converge; the fields that make it hard: /tail/referenceResistanceOhm (the largest resistance)',
    );
  });

  test.each([
    ['exactly 10 Ω is usual', 10, false],
    ['exactly 1 MΩ is usual', 1e6, false],
    ['9.9 Ω is below the usual range', 9.9, true],
    ['1.01 MΩ is above the usual range', 1.01e6, true],
  ])('%s', (_name, valueOhm, outside) => {
    const hinted = withHardFields(error(), { ...DESIGN, collectorResistanceOhm: valueOhm });
    expect(hinted).toBeInstanceOf(ConvergenceError);
    if (outside) {
      expect(hinted.fields).toEqual(['/collectorResistanceOhm']);
      expect(hinted.message).toBe('the operating point did not converge; the fields that make it hard: /collectorResistanceOhm (outside the usual 10 Ω to 1 MΩ)');
    } else {
      expect(hinted.message).toMatch(/\(the largest resistance\)$/);
    }
  });
});

describe('starting points', () => {
  const design = designWith({ topology: 'widlar', referenceResistanceOhm: 10000, emitterResistanceOhm: 470 });

  test('a warm start at the solution itself converges at the second Newton iteration (the first that can confirm a step) to the same voltages', () => {
    const circuit = stageCircuit(design);
    const model = deviceModel(DEVICE, 27);
    const cold = solveOperatingPoint(circuit, model);
    expect(cold.iterations).toBeGreaterThan(2);
    const warm = solveOperatingPoint(circuit, model, cold);
    expect(warm.iterations).toBe(2);
    warm.voltagesV.forEach((v, k) => expect(Math.abs(v - cold.voltagesV[k]), cold.circuit.freeNodes[k]).toBeLessThan(SAME_SOLUTION_V));
  });

  test('a warm start from a circuit with other nodes is not used: the hand guess gives the same solution in the same iterations', () => {
    const model = deviceModel(DEVICE, 27);
    const other = solveOperatingPoint(stageCircuit(designWith({ topology: 'cascode', referenceResistanceOhm: 10000 })), model);
    const circuit = stageCircuit(design);
    const cold = solveOperatingPoint(circuit, model);
    const fromOther = solveOperatingPoint(circuit, model, other);
    expect(fromOther.iterations).toBe(cold.iterations);
    expect(fromOther.voltagesV).toEqual(cold.voltagesV);
  });

  test('every transistor is evaluated at the solution: its currents are the ones the node voltages give', () => {
    const circuit = stageCircuit(design);
    const op = solveOperatingPoint(circuit, deviceModel(DEVICE, 27));
    expect(op.transistors).toHaveLength(op.circuit.transistors.length);
    // KCL at the tail node t: the pair's emitter currents leave through Q4 (the Widlar output)
    const byName = Object.fromEntries(op.circuit.transistors.map((q, i) => [q.name, op.transistors[i]]));
    const emitterA = (name: string) => byName[name].icA + byName[name].ibA;
    // the pair emitters reach t through the 100 kΩ resistors: their currents add to Q4's collector current
    expect(Math.abs(emitterA('Q1') + emitterA('Q2') - byName.Q4.icA) / byName.Q4.icA).toBeLessThan(1e-6);
  });
});

describe('the convergence error', () => {
  test('names itself and carries no fields until a hint adds them', () => {
    const error = new ConvergenceError('did not converge');
    expect(error).toBeInstanceOf(Error);
    expect(error.name).toBe('ConvergenceError');
    expect(error.fields).toEqual([]);
    expect(new ConvergenceError('x', ['/collectorResistanceOhm']).fields).toEqual(['/collectorResistanceOhm']);
  });
});
