/**
 * The transient integrator (shared/engine/transient.ts) on circuits whose response is known in
 * closed form (first-order linear circuits driven by a ramp: the solution of C·dv/dt + v/R = i(t)
 * written out), and on a reverse-biased junction, whose stored charge is ngspice's nonlinear
 * depletion charge [SPICE] bjtload.c: the charge the drive delivers through the resistor must
 * equal the charge the junction holds at the end (charge conservation). Values are invented.
 */
import { describe, expect, test } from 'vitest';
import { GROUND, type CircuitElement, type StageCircuit } from '#shared/engine/circuit';
import { npnModel } from '#shared/engine/device';
import { indexCircuit, nodeVoltage } from '#shared/engine/node-system';
import { gear2, integrateTransient, type TransientRun } from '#shared/engine/transient';
import { ConvergenceError } from '#shared/engine/operating-point';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import { resolvedParameters } from '#shared/engine/bjt-parameters';

const DEVICE = { family: 'npn', beta: 100, saturationCurrentA: 1e-15 } as const;
const MODEL = npnModel(DEVICE, 27);

/** A circuit of the given elements, `src` a fixed node the drive moves. */
function circuitOf(elements: CircuitElement[], fixed: Record<string, number> = {}): StageCircuit {
  return { fixedNodesV: { [GROUND]: 0, src: 0, ...fixed }, driveNodes: ['src', 'src'], elements, initialGuessV: {} };
}

/** A ramp on `src` from 0 to `toV` over `edgeS`, recorded until `stopS`. */
function rampRun(toV: number, edgeS: number, stopS: number, toleranceV: number, srcIndex: number, record: (tS: number, v: readonly number[]) => void): TransientRun {
  return {
    fixedVAt: (tS, fixedV) => {
      fixedV[srcIndex] = toV * Math.min(tS / edgeS, 1);
    },
    breakpointsS: [edgeS],
    maxStepAt: (tS) => (tS < edgeS ? edgeS / 20 : Infinity),
    firstStepS: edgeS / 1000,
    minStepS: 1e-18,
    toleranceV,
    onPoint: (tS, v) => {
      record(tS, v);
      return tS >= stopS;
    },
  };
}

describe('Gear-2 coefficients', () => {
  test.each([
    [1e-9, 1e-9],
    [2e-9, 0.5e-9],
    [0.3e-9, 1.7e-9],
  ])('step %s s after %s s: exact for the derivative of a quadratic', (h, hp) => {
    const q = (t: number) => 3 + 5e9 * t - 7e17 * t * t;
    const t1 = 4e-9;
    const [a0, a1, a2] = gear2(h, hp);
    const derivative = a0 * q(t1 + h) + a1 * q(t1) + a2 * q(t1 - hp);
    const exact = 5e9 - 2 * 7e17 * (t1 + h);
    expect(Math.abs(derivative - exact) / Math.abs(exact)).toBeLessThan(1e-9);
  });
});

describe('first-order circuits against their closed-form responses', () => {
  test('an RC node charged by a 100 ns ramp to 1 V (τ = 1 µs) follows (V/T)·(t − τ·(1 − e^(−t/τ))), then relaxes to 1 V', () => {
    const rOhm = 1000;
    const cF = 1e-9;
    const tau = rOhm * cF;
    const edgeS = 100e-9;
    const ic = indexCircuit(circuitOf([
      { kind: 'resistor', name: 'R1', nodes: ['src', 'out'], resistanceOhm: rOhm, part: 'pair' },
      { kind: 'capacitor', name: 'C1', nodes: ['out', GROUND], capacitanceF: cF, part: 'pair' },
    ]));
    const out = ic.nodeRef('out');
    const exact = (t: number) => {
      const vT = (1 / edgeS) * (edgeS - tau * (1 - Math.exp(-edgeS / tau)));
      if (t <= edgeS) return (1 / edgeS) * (t - tau * (1 - Math.exp(-t / tau)));
      return 1 + (vT - 1) * Math.exp(-(t - edgeS) / tau);
    };
    let worstV = 0;
    let largestSlope = 0;
    let last: [number, number] = [0, 0];
    let points = 0;
    const run = rampRun(1, edgeS, 5 * tau, 1e-7, -ic.nodeRef('src') - 1, (t, v) => {
      const vOut = nodeVoltage(ic, v as number[], out);
      worstV = Math.max(worstV, Math.abs(vOut - exact(t)));
      if (t > last[0]) largestSlope = Math.max(largestSlope, (vOut - last[1]) / (t - last[0]));
      last = [t, vOut];
      points += 1;
    });
    integrateTransient(ic, MODEL, null, 27, [0], run);
    expect(worstV).toBeLessThan(2e-5);
    // the steepest point is the end of the ramp: (V/T)·(1 − e^(−T/τ))
    const steepest = (1 / edgeS) * (1 - Math.exp(-edgeS / tau));
    expect(Math.abs(largestSlope / steepest - 1)).toBeLessThan(0.01);
    // the step grows once the ramp is over: far fewer points than a fixed step of edge/20 would need
    expect(points).toBeLessThan(500);
  });

  test('a capacitive divider conserves charge: C1 = 1 nF from the drive onto C2 = 3 nF ∥ 10 kΩ jumps by C1/(C1 + C2) of the step, then decays with τ = R·(C1 + C2)', () => {
    const c1F = 1e-9;
    const c2F = 3e-9;
    const rOhm = 10000;
    const tau = rOhm * (c1F + c2F);
    const edgeS = 10e-9;
    const ic = indexCircuit(circuitOf([
      { kind: 'capacitor', name: 'C1', nodes: ['src', 'm'], capacitanceF: c1F, part: 'pair' },
      { kind: 'capacitor', name: 'C2', nodes: ['m', GROUND], capacitanceF: c2F, part: 'pair' },
      { kind: 'resistor', name: 'R1', nodes: ['m', GROUND], resistanceOhm: rOhm, part: 'pair' },
    ]));
    const m = ic.nodeRef('m');
    // (C1 + C2)·dv/dt + v/R = C1·S during the ramp (slope S = V/T), then no drive
    const slope = 1 / edgeS;
    const atEdge = rOhm * c1F * slope * (1 - Math.exp(-edgeS / tau));
    const exact = (t: number) => (t <= edgeS ? rOhm * c1F * slope * (1 - Math.exp(-t / tau)) : atEdge * Math.exp(-(t - edgeS) / tau));
    let worstV = 0;
    let peakV = 0;
    const run = rampRun(1, edgeS, 3 * tau, 1e-7, -ic.nodeRef('src') - 1, (t, v) => {
      const vm = nodeVoltage(ic, v as number[], m);
      worstV = Math.max(worstV, Math.abs(vm - exact(t)));
      peakV = Math.max(peakV, vm);
    });
    integrateTransient(ic, MODEL, null, 27, [0], run);
    expect(worstV).toBeLessThan(2e-5);
    expect(Math.abs(peakV / (c1F / (c1F + c2F)) - 1)).toBeLessThan(0.01);
  });
});

describe('nonlinear stored charge', () => {
  test('a junction reverse-biased through 10 kΩ takes exactly the depletion charge ngspice\u2019s law gives it at −2 V (not C(0)·2 V)', () => {
    // Q1's base on node b, its collector, emitter and substrate at ground: CJE and CJC both from b to ground
    const card: BjtModelCard = { IS: 1e-16, BF: 100, CJE: 20e-12, VJE: 0.7, MJE: 0.4, CJC: 10e-12, VJC: 0.6, MJC: 0.5 };
    const model = npnModel({ family: 'npn', model: card } as never, 27);
    const rOhm = 10000;
    const ic = indexCircuit(circuitOf([
      { kind: 'resistor', name: 'R1', nodes: ['src', 'b'], resistanceOhm: rOhm, part: 'pair' },
      { kind: 'npn', name: 'Q1', collector: GROUND, base: 'b', emitter: GROUND, substrate: GROUND, area: 1, part: 'pair' },
    ]));
    const b = ic.nodeRef('b');
    const srcIndex = -ic.nodeRef('src') - 1;
    // ∫ i dt through the resistor by the trapezoidal rule over the accepted points
    let deliveredC = 0;
    let last: [number, number] | null = null;
    let finalV = 0;
    const run = rampRun(-2, 1e-9, 5e-6, 1e-7, srcIndex, (t, v) => {
      const src = -2 * Math.min(t / 1e-9, 1);
      const currentA = (src - nodeVoltage(ic, v as number[], b)) / rOhm;
      if (last) deliveredC += ((currentA + last[1]) / 2) * (t - last[0]);
      last = [t, currentA];
      finalV = nodeVoltage(ic, v as number[], b);
    });
    integrateTransient(ic, model, resolvedParameters(card), 27, [0], run);
    expect(Math.abs(finalV + 2)).toBeLessThan(1e-6);
    // ngspice's depletion charge, VJ·CJ·(1 − (1 − v/VJ)^(1−M))/(1 − M), for both junctions at −2 V
    const held = (cj: number, vj: number, mj: number) => (vj * cj * (1 - (1 + 2 / vj) ** (1 - mj))) / (1 - mj);
    const expected = held(20e-12, 0.7, 0.4) + held(10e-12, 0.6, 0.5);
    expect(Math.abs(deliveredC / expected - 1)).toBeLessThan(2e-3);
    // a linear capacitance at zero bias would have taken −60 pC: far outside that
    expect(Math.abs(expected / (30e-12 * -2) - 1)).toBeGreaterThan(0.2);
  });
});

describe('a run that cannot meet its tolerance is given up early', () => {
  test('a tolerance no step can meet, no shortest step: a ConvergenceError after a few dozen tries, not thousands', () => {
    const ic = indexCircuit(circuitOf([
      { kind: 'resistor', name: 'R1', nodes: ['src', 'out'], resistanceOhm: 1000, part: 'pair' },
      { kind: 'capacitor', name: 'C1', nodes: ['out', GROUND], capacitanceF: 1e-9, part: 'pair' },
    ]));
    // 1e-30 V: far below the rounding of any node voltage, so every checked step is redone; and
    // no floor under the step, so only a limit on the redone steps ends the run
    const run = { ...rampRun(1, 100e-9, 5e-6, 1e-30, -ic.nodeRef('src') - 1, () => {}), minStepS: 0 };
    let tries = 0;
    const counted: TransientRun = { ...run, fixedVAt: (tS, fixedV) => { tries += 1; run.fixedVAt(tS, fixedV); } };
    expect(() => integrateTransient(ic, MODEL, null, 27, [0], counted)).toThrow(ConvergenceError);
    expect(tries).toBeLessThan(50);
  });

  test('a run that needs more steps than it allows: a ConvergenceError at that count', () => {
    const ic = indexCircuit(circuitOf([
      { kind: 'resistor', name: 'R1', nodes: ['src', 'out'], resistanceOhm: 1000, part: 'pair' },
      { kind: 'capacitor', name: 'C1', nodes: ['out', GROUND], capacitanceF: 1e-9, part: 'pair' },
    ]));
    const run = { ...rampRun(1, 100e-9, 5e-6, 1e-7, -ic.nodeRef('src') - 1, () => {}), maxSteps: 30 };
    expect(() => integrateTransient(ic, MODEL, null, 27, [0], run)).toThrow(/within 30 steps/);
  });
});
