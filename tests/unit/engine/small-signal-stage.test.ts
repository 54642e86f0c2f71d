/**
 * The small-signal stage (shared/engine/small-signal.ts) held to circuit facts that need no
 * engine figure: a matched pair driven differentially answers antisymmetrically (v(c1) = −v(c2),
 * so c1 − c2 is twice c1 and c1 + c2 is nothing) [GM] (Gray & Meyer, the emitter-coupled pair's
 * differential half circuit); a stage in which nothing stores charge has the same transfers at
 * every frequency (no capacitance, no pole). Every design is invented; each test solves its own.
 */
import { describe, expect, test } from 'vitest';
import { analyze, solveStage } from '#shared/engine/analyze';
import { outputWeights, stageTransfersAt } from '#shared/engine/small-signal';
import { readOutput } from '#shared/engine/frequency-response';
import type { Design } from '#shared/engine/types';

/** A resistor-tail stage of a three-parameter device: nothing in it stores charge. */
function chargeless(extra: Partial<Design> = {}): Design {
  return {
    device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'resistor', resistanceOhm: 22000 },
    ...extra,
  } as Design;
}

describe('named output weights', () => {
  test('a matched pair driven differentially: c1 − c2 reads twice c1, c1 + c2 reads nothing', () => {
    const { stage } = solveStage(chargeless());
    const c1 = readOutput(stage.differential, outputWeights(stage, { c1: 1 }));
    const between = readOutput(stage.differential, outputWeights(stage, { c1: 1, c2: -1 }));
    const sum = readOutput(stage.differential, outputWeights(stage, { c1: 1, c2: 1 }));
    expect(Math.abs(c1)).toBeGreaterThan(1);
    expect(Math.abs(between / (2 * c1) - 1)).toBeLessThan(1e-9);
    expect(Math.abs(sum)).toBeLessThan(1e-9 * Math.abs(c1));
    const weights = outputWeights(stage, { c2: -1, c1: 1 });
    expect(weights.weights).toEqual([-1, 1]);
    expect(weights.nodes).toEqual([stage.index('c2'), stage.index('c1')]);
  });
});

describe('a stage that stores no charge', () => {
  test('its transfers at 1 kHz and 1 GHz are those at 0 Hz, and analyze’s ac entries are flat', () => {
    const design = chargeless({ frequenciesHz: [1e3, 1e9] });
    const { stage } = solveStage(design);
    expect(stage.frequency).toBeNull();
    for (const f of [1e3, 1e9]) {
      const t = stageTransfersAt(stage, f);
      expect(t.singleEndedGain.re).toBe(stage.low.singleEndedGain.re);
      expect(t.commonModeGain.re).toBe(stage.low.commonModeGain.re);
      expect(t.singleEndedGain.im).toBe(0);
    }
    const result = analyze(design);
    expect(result.ac).toHaveLength(2);
    for (const entry of result.ac) {
      expect(entry.singleEndedGain).toBe(Math.abs(result.singleEndedGain));
      expect(entry.commonModeGain).toBe(Math.abs(result.commonModeGain));
      expect(entry.cmrrDb.singleEnded).toBeCloseTo(result.cmrrDb.singleEnded, 12);
    }
    // and no corner: nothing falls 3 dB
    expect(result.cmrrCornerHz).toBeNull();
    expect(result.differentialBandwidthHz).toBeNull();
  });
});

describe('the tail\'s output resistance: the tail\'s own elements, a unit current into t', () => {
  test('a resistor tail is its resistor, whatever the pair: 22 kΩ to 1e-12', () => {
    const { stage } = solveStage(chargeless({ collectorResistanceOhm: 4700, pairEmitterResistanceOhm: 330 }));
    expect(Math.abs(stage.tailOutputResistanceOhm / 22000 - 1)).toBeLessThan(1e-12);
  });

  test('a simple mirror: Q4\'s ro = (VAF + VCB)/IC to 1 % [GM] (the output transistor alone at its own bias)', () => {
    const solution = solveStage(chargeless({ tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 } }));
    const q4 = solution.result.transistors.find((q) => q.name === 'Q4')!;
    const roOhm = (80 + q4.vcbV) / q4.collectorCurrentA;
    expect(Math.abs(solution.stage.tailOutputResistanceOhm / roOhm - 1)).toBeLessThan(0.01);
  });

  test('a cascode: far above a simple mirror at the same current, about β·ro/2 [GM] (within a factor of two)', () => {
    const cascode = solveStage(chargeless({ tail: { topology: 'cascode', referenceResistanceOhm: 22000 } }));
    const q6 = cascode.result.transistors.find((q) => q.name === 'Q6')!;
    const roOhm = (80 + q6.vcbV) / q6.collectorCurrentA;
    const ratio = cascode.stage.tailOutputResistanceOhm / ((150 * roOhm) / 2);
    expect(ratio).toBeGreaterThan(0.5);
    expect(ratio).toBeLessThan(2);
  });
});

describe('device capacitances in the stage', () => {
  // An invented card: each capacitance alone on the cascode, and the transfer at 10 MHz must move from its 0 Hz value
  const base = { family: 'npn' as const, beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 };
  test.each(['CJE', 'CJC', 'CJS', 'TF'] as const)('%s alone makes the common-mode gain move with frequency (it is stamped)', (key) => {
    const value = key === 'TF' ? 1e-9 : 5e-12;
    const { stage } = solveStage(chargeless({ device: { ...base, model: { IS: 1e-14, BF: 150, VAF: 80, [key]: value } }, tail: { topology: 'cascode', referenceResistanceOhm: 22000 } }));
    expect(stage.frequency).not.toBeNull();
    const low = stageTransfersAt(stage, 0).commonModeGain;
    const high = stageTransfersAt(stage, 1e7).commonModeGain;
    expect(Math.hypot(high.re - low.re, high.im - low.im)).toBeGreaterThan(0.01 * Math.hypot(low.re, low.im));
  });
});
