/**
 * Figures `analyze` reads off the solved operating point (shared/engine/analyze.ts), each against
 * its definition in the contract (ENGINE-CONTRACT.md) and Kirchhoff's current law: the
 * headroom margins, the power the rails deliver, each transistor's junction voltages and region,
 * the operating-point problems, and which transistor's gm is reported.
 */
import { describe, expect, test } from 'vitest';
import { analyze, solveCondition } from '#shared/engine/analyze';
import { thermalVoltageV } from '#shared/engine/constants';
import { linearInputRangeV } from '#shared/engine/input-transfer';
import { ConvergenceError } from '#shared/engine/operating-point';
import { solveStageOperatingPoint } from '#shared/engine/stage-solve';
import { TOPOLOGIES, type Design, type TailDesign, type TopologyId } from '#shared/engine/types';

/** The device's VCE(sat), V: set apart from the 0.2 V default so the margins must read it. */
const VCE_SAT_V = 0.25;
const DEVICE = { family: 'npn' as const, beta: 140, earlyVoltageV: 85, saturationCurrentA: 5e-15, vceSatV: VCE_SAT_V, pnp: { beta: 70, earlyVoltageV: 40, saturationCurrentA: 3e-15 } };
const TAILS: Record<TopologyId, TailDesign> = {
  resistor: { topology: 'resistor', resistanceOhm: 15000 },
  'simple-mirror': { topology: 'simple-mirror', referenceResistanceOhm: 27000 },
  'degenerated-mirror': { topology: 'degenerated-mirror', referenceResistanceOhm: 24000, emitterResistanceOhm: 1000 },
  widlar: { topology: 'widlar', referenceResistanceOhm: 6800, emitterResistanceOhm: 390 },
  wilson: { topology: 'wilson', referenceResistanceOhm: 24000 },
  cascode: { topology: 'cascode', referenceResistanceOhm: 24000 },
  ptat: { topology: 'ptat', emitterResistanceOhm: 220, startupResistanceOhm: 1.2e6, areaRatio: 8 },
};
/** The tail transistor whose collector is the tail node, as the contract's circuit table connects it. */
const OUTPUT_TRANSISTOR: Record<Exclude<TopologyId, 'resistor'>, string> = {
  'simple-mirror': 'Q4',
  'degenerated-mirror': 'Q4',
  widlar: 'Q4',
  wilson: 'Q5',
  cascode: 'Q6',
  ptat: 'Q9',
};

function designWith(topology: TopologyId, overrides: Partial<Design> = {}): Design {
  return { device: DEVICE, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 9100, tail: TAILS[topology], inputCommonModeV: 1, collectorMismatch: 0.04, ...overrides };
}

describe('headroom margins [contract]', () => {
  test.each([...TOPOLOGIES])('%s: the tail\'s margin and the pair\'s, each the least VCE less the device\'s VCE(sat)', (topology) => {
    const result = analyze(designWith(topology));
    const vce = (name: string) => result.transistors.find((q) => q.name === name)!.vceV;
    // RC2 = RC·1.04 drops more: Q2 has the smaller VCE, so the least is Q2's
    expect(vce('Q2')).toBeLessThan(vce('Q1'));
    expect(result.pairSaturationMarginV).toBeCloseTo(vce('Q2') - VCE_SAT_V, 12);
    const expected = topology === 'resistor' ? result.tailNodeVoltageV - -12 : vce(OUTPUT_TRANSISTOR[topology]) - VCE_SAT_V;
    expect(result.tailComplianceMarginV).toBeCloseTo(expected, 12);
  });
});

describe('each transistor\'s junction voltages', () => {
  test.each([...TOPOLOGIES])('%s: VBE = VCE − VCB for every transistor (the three are node differences), forward VBE of 0.5 to 0.8 V', (topology) => {
    for (const q of analyze(designWith(topology)).transistors) {
      expect(q.vbeV, q.name).toBeCloseTo(q.vceV - q.vcbV, 12);
      expect(q.vbeV, q.name).toBeGreaterThan(0.5);
      expect(q.vbeV, q.name).toBeLessThan(0.8);
    }
  });
});

describe('the power the rails deliver', () => {
  test('resistor tail: V+·I+ + V−·I−, with I+ through the two loads and I− = −(I+ + both base currents) by Kirchhoff\'s current law', () => {
    const result = analyze(designWith('resistor'));
    const iPlusA = (12 - result.collectorVoltageV) / 9100 + (12 - result.collector2VoltageV) / (9100 * 1.04);
    const baseA = result.transistors.reduce((sum, q) => sum + q.baseCurrentA, 0);
    expect(Math.abs(result.powerW / (12 * iPlusA + 12 * (iPlusA + baseA)) - 1)).toBeLessThan(1e-12);
  });
});

describe('the reported gm is Q1\'s', () => {
  test('with Q2\'s IS 30 % larger, gm is Q1\'s IC/VT less its Early term IC/(VAF + VCB) [SPICE], not Q2\'s', () => {
    const result = analyze(designWith('resistor', { collectorMismatch: 0, pairSaturationCurrentMismatch: 0.3 }));
    const q1 = result.transistors.find((q) => q.name === 'Q1')!;
    const q2 = result.transistors.find((q) => q.name === 'Q2')!;
    const vt = thermalVoltageV(27);
    const hand = (q: typeof q1) => q.collectorCurrentA / vt - q.collectorCurrentA / (85 + q.vcbV);
    expect(Math.abs(result.transconductanceS / hand(q1) - 1)).toBeLessThan(1e-3);
    expect(Math.abs(result.transconductanceS / hand(q2) - 1)).toBeGreaterThan(0.1);
  });
});

describe('regions and operating-point problems', () => {
  // Rails 0.5 V apart feeding a simple mirror through 1 MΩ: tens of nanoamps in the reference,
  // the pair starved (cut off) and the output transistor Q4 pulled into saturation
  const starved = designWith('simple-mirror', { supply: { positiveV: 0.3, negativeV: -0.2 }, collectorResistanceOhm: 10000, inputCommonModeV: 0, collectorMismatch: 0, tail: { topology: 'simple-mirror', referenceResistanceOhm: 1e6 } });

  test('a starved stage: the pair cut off (picoamps), Q4 saturated, Q3 forward-active; the problems name them in order', () => {
    const result = analyze(starved);
    const region = Object.fromEntries(result.transistors.map((q) => [q.name, q.region]));
    expect(region).toEqual({ Q1: 'cut-off', Q2: 'cut-off', Q3: 'forward-active', Q4: 'saturated' });
    expect(result.operatingPointProblems).toHaveLength(3);
    expect(result.operatingPointProblems[0]).toMatch(/^Q1 is cut off/);
    expect(result.operatingPointProblems[1]).toMatch(/^Q2 is cut off/);
    expect(result.operatingPointProblems[2]).toMatch(/^Q4 is saturated/);
    expect(result.warnings.slice(0, 3)).toEqual(result.operatingPointProblems);
  });

  test.each([...TOPOLOGIES])('%s at a sensible bias: every transistor forward-active, no problem', (topology) => {
    const result = analyze(designWith(topology));
    expect(result.transistors.every((q) => q.region === 'forward-active')).toBe(true);
    expect(result.operatingPointProblems).toEqual([]);
  });
});

describe('the ac entries [contract]', () => {
  test('a mismatched pair: each entry\'s rejections are 20·log10 of its own gains\' ratios; a matched pair\'s differential one is null', () => {
    const card = { IS: 5e-15, BF: 140, VAF: 85, CJE: 6e-12, CJC: 2e-12, CJS: 2e-12 };
    const mismatched = analyze(designWith('simple-mirror', { device: { ...DEVICE, model: card }, frequenciesHz: [1e3, 1e6] }));
    for (const entry of mismatched.ac) {
      expect(entry.cmrrDb.singleEnded).toBeCloseTo(20 * Math.log10(entry.singleEndedGain / entry.commonModeGain), 10);
      expect(entry.cmrrDb.differential!).toBeCloseTo(20 * Math.log10(entry.differentialGain / entry.differentialCommonModeGain), 10);
    }
    const matched = analyze(designWith('simple-mirror', { device: { ...DEVICE, model: card }, frequenciesHz: [1e3, 1e6], collectorMismatch: 0 }));
    for (const entry of matched.ac) {
      expect(entry.differentialCommonModeGain).toBe(0);
      expect(entry.cmrrDb.differential).toBeNull();
    }
  });
});

describe('a condition\'s solve', () => {
  test("leaves a full solve's own figures out (the two searched corners, the offset, its current and drift, the linear range) where the full solve finds them", () => {
    const design = designWith('cascode', { tailCapacitanceF: 10e-12, loadCapacitanceF: 5e-12, collectorMismatch: 0.02 });
    const full = analyze(design) as unknown as Record<string, unknown>;
    const condition = solveCondition(design).result as Record<string, unknown>;
    for (const field of ['cmrrCornerHz', 'differentialBandwidthHz', 'inputOffsetVoltageV', 'inputOffsetCurrentA', 'offsetDriftVPerC', 'linearInputRangeV']) {
      expect(full[field], field).not.toBeNull();
      expect(field in condition, field).toBe(false);
    }
    // the cheap ones are in both, equal
    expect(condition.inputBiasCurrentA).toBe(full.inputBiasCurrentA);
    expect(condition.psrrDb).toEqual(full.psrrDb);
  });
});

describe('a linear-range search the solver cannot finish', () => {
  // 1 GΩ collectors and a 10 GΩ tail: no operating point of this stage converges, so the search's
  // first solve at a nonzero input (warm-started from a solvable stage's) fails
  const solvable: Design = {
    device: { family: 'npn', beta: 210, earlyVoltageV: 62, saturationCurrentA: 1.4e-14 },
    supply: { positiveV: 15, negativeV: -15 },
    collectorResistanceOhm: 1e9,
    pairEmitterResistanceOhm: 1e-3,
    tail: { topology: 'resistor', resistanceOhm: 1e9 },
    inputCommonModeV: 0,
  };
  const unsolvable: Design = { ...solvable, tail: { topology: 'resistor', resistanceOhm: 1e10 } };

  test('leaves the linear range null (a ConvergenceError on the way is no figure, not a failed analysis)', () => {
    expect(() => analyze(unsolvable)).toThrow(ConvergenceError);
    const base = solveStageOperatingPoint(solvable);
    expect(linearInputRangeV(unsolvable, base, analyze(solvable).differentialGain)).toBeNull();
  });

  test('the solvable stage answers with every figure, its linear range included', () => {
    const result = analyze(solvable);
    expect(result.tailCurrentA).toBeGreaterThan(0);
    // an undegenerated pair's 1 % point is about 0.35·VT (GHLM, the emitter-coupled pair's transfer): here within a factor of two of it
    expect(result.linearInputRangeV).toBeGreaterThan(0.5 * 0.35 * thermalVoltageV(27));
    expect(result.linearInputRangeV).toBeLessThan(2 * 0.35 * thermalVoltageV(27));
  });
});
