/**
 * The PNP input pair (`device.family` "pnp", ENGINE-CONTRACT.md version 2, "Families"): the
 * mirror image of the NPN stage. The circuit: PNP pair and tail, the tail element from `t` to the
 * positive rail, loads and reference resistors to the negative rail, every substrate at the most
 * negative rail (common practice: the substrate at the lowest potential). The figures: a PNP
 * design and its NPN mirror image (rails and common mode negated) are the same circuit with
 * every voltage negated (the circuit's mirror symmetry, common practice), so they report the
 * same currents, gains and rejection, negated node voltages and offsets, and each rail's supply
 * rejection on the other rail. The one asymmetry is SPICE's own: a lateral PNP's substrate
 * junction (GMIN, 1 pS) sits at its base, a vertical NPN's at its collector (node-system.ts);
 * at a few volts it moves a base current by picoamperes, hence the bounds below (measured:
 * currents 1.4e-5 at the smallest bias current, common-mode gains 8e-6, differential gains 1e-8,
 * rejection 1e-4 dB).
 */
import { describe, expect, test } from 'vitest';
import { analyze } from '#shared/engine/analyze';
import { isTransistor, mirroredDesign, stageCircuit } from '#shared/engine/circuit';
import { spiceNetlist, PNP_MODEL_NAME } from '#shared/engine/netlist';
import { recommend } from '#shared/engine/recommend';
import type { AnalyzeResult, Design, TailDesign } from '#shared/engine/types';
import { validateSpec } from '#shared/validate';
import { loadRuleSet } from '../../../rules/index';

const PNP_DEVICE: Design['device'] = { family: 'pnp', beta: 80, earlyVoltageV: 45, saturationCurrentA: 2.5e-15 };

const TAILS: TailDesign[] = [
  { topology: 'resistor', resistanceOhm: 10000 },
  { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
  { topology: 'degenerated-mirror', referenceResistanceOhm: 22000, emitterResistanceOhm: 470 },
  { topology: 'widlar', referenceResistanceOhm: 4700, emitterResistanceOhm: 1000 },
  { topology: 'wilson', referenceResistanceOhm: 22000 },
  { topology: 'cascode', referenceResistanceOhm: 22000 },
];

function pnpDesign(tail: TailDesign, overrides: Partial<Design> = {}): Design {
  return {
    device: PNP_DEVICE,
    supply: { positiveV: 12, negativeV: -5 },
    collectorResistanceOhm: 8200,
    tail,
    inputCommonModeV: 2,
    collectorMismatch: 0.01,
    pairSaturationCurrentMismatch: 0.02,
    pairBetaMismatch: -0.03,
    loadCapacitanceF: 2e-12,
    frequenciesHz: [1e3, 1e6],
    ...overrides,
  };
}

/** Relative bound for currents, resistances and the common-mode residues (the substrate GMIN's picoamperes over the smallest bias current). */
const CURRENT_BOUND = 5e-5;
/** Relative bound for gains and voltages. */
const GAIN_BOUND = 1e-6;
/** Bound for rejection, dB. */
const REJECTION_BOUND_DB = 1e-3;

function expectClose(what: string, actual: number | null, expected: number | null, relative: number): void {
  expect(actual === null, `${what}: ${actual} vs ${expected}`).toBe(expected === null);
  if (actual === null || expected === null) return;
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(relative * Math.abs(expected) + 1e-12);
}

function expectWithinDb(what: string, actual: number | null, expected: number | null): void {
  expect(actual === null, `${what}: ${actual} vs ${expected}`).toBe(expected === null);
  if (actual === null || expected === null) return;
  expect(Math.abs(actual - expected), `${what}: ${actual} vs ${expected}`).toBeLessThanOrEqual(REJECTION_BOUND_DB);
}

describe('the PNP stage circuit is the NPN one mirrored', () => {
  test('every transistor a PNP with its substrate at vn; loads and the reference resistor to vn; the tail transistors’ emitters at vp', () => {
    const circuit = stageCircuit(pnpDesign(TAILS[1], { loadCapacitanceF: 0 }));
    const transistors = circuit.elements.filter(isTransistor);
    expect(transistors.map((q) => `${q.kind} ${q.name} ${q.collector} ${q.base} ${q.emitter} ${q.substrate}`)).toEqual([
      'pnp Q1 c1 in1 t vn',
      'pnp Q2 c2 in2 t vn',
      'pnp Q3 ref ref vp vn',
      'pnp Q4 t ref vp vn',
    ]);
    const resistors = circuit.elements.filter((e) => e.kind === 'resistor').map((e) => (e.kind === 'resistor' ? `${e.name} ${e.nodes.join(' ')}` : ''));
    expect(resistors).toEqual(['RC1 vn c1', 'RC2 vn c2', 'RREF vn ref']);
    expect(circuit.fixedNodesV).toEqual({ 0: 0, vp: 12, vn: -5, in1: 2, in2: 2 });
  });

  test('the starting guess is the mirror image’s negated: the tail node a VEB above the inputs, the reference node a VEB below V+', () => {
    const design = pnpDesign(TAILS[1]);
    const pnp = stageCircuit(design, 0.7).initialGuessV;
    const npn = stageCircuit(mirroredDesign(design), 0.7).initialGuessV;
    expect(pnp.t).toBeCloseTo(2 + 0.7, 12);
    expect(pnp.ref).toBeCloseTo(12 - 0.7, 12);
    for (const [node, valueV] of Object.entries(npn)) expect(pnp[node], node).toBe(-valueV);
  });

  test('the netlist writes one PNP card, QPNP, and a mismatched Q2 its own PNP card', () => {
    const netlist = spiceNetlist(pnpDesign(TAILS[0]), { analysis: 'op' });
    expect(netlist).toContain(`.model ${PNP_MODEL_NAME} PNP (IS=2.5e-15 BF=80 VAF=45)`);
    expect(netlist).toMatch(new RegExp(`^\\.model ${PNP_MODEL_NAME}_Q2 PNP \\(IS=2.5e-15 BF=77\\.6 VAF=45\\)$`, 'm'));
    expect(netlist).toMatch(/^Q1 c1 in1 t vn QPNP$/m);
    expect(netlist).toMatch(/^RT t vp /m);
    expect(netlist).not.toContain('QNPN');
  });

  test('the PTAT tail is refused for a PNP stage (its mirror would need the opposite device)', () => {
    const ptat: TailDesign = { topology: 'ptat', emitterResistanceOhm: 270, startupResistanceOhm: 1.5e6, areaRatio: 8 };
    expect(() => stageCircuit(pnpDesign(ptat))).toThrow(/needs an NPN stage/);
  });
});

describe('a PNP design reports what its NPN mirror image reports (mirror symmetry, common practice)', () => {
  const samePositive: (keyof AnalyzeResult)[] = ['tailCurrentA', 'collectorCurrentA', 'inputBiasCurrentA', 'inputOffsetCurrentA', 'referenceCurrentA', 'powerW', 'tailOutputResistanceOhm', 'inputResistanceOhm', 'transconductanceS'];
  const sameGain: (keyof AnalyzeResult)[] = ['differentialGain', 'singleEndedGain', 'linearInputRangeV', 'tailComplianceMarginV', 'pairSaturationMarginV'];
  // the common-mode leaks are small residues: the substrate GMIN is a part of them (a few 1e-6 of them)
  const sameResidue: (keyof AnalyzeResult)[] = ['commonModeGain', 'differentialCommonModeGain'];
  const negatedVoltage: (keyof AnalyzeResult)[] = ['collectorVoltageV', 'collector2VoltageV', 'tailNodeVoltageV', 'inputOffsetVoltageV', 'offsetDriftVPerC'];

  test.each(TAILS.map((tail) => [tail.topology, tail] as const))('%s tail', (_topology, tail) => {
    const design = pnpDesign(tail);
    const pnp = analyze(design);
    const npn = analyze(mirroredDesign(design));
    expect(pnp.tailCurrentA).toBeGreaterThan(0);
    expect(pnp.inputBiasCurrentA).toBeGreaterThan(0);
    for (const key of samePositive) expectClose(key, pnp[key] as number, npn[key] as number, CURRENT_BOUND);
    for (const key of sameGain) expectClose(key, pnp[key] as number, npn[key] as number, GAIN_BOUND);
    for (const key of sameResidue) expectClose(key, pnp[key] as number, npn[key] as number, CURRENT_BOUND);
    for (const key of negatedVoltage) expectClose(`${key} (negated)`, pnp[key] as number, -(npn[key] as number), GAIN_BOUND);
    expectWithinDb('cmrrDb.singleEnded', pnp.cmrrDb.singleEnded, npn.cmrrDb.singleEnded);
    expectWithinDb('cmrrDb.differential', pnp.cmrrDb.differential, npn.cmrrDb.differential);
    // the PNP stage's positive rail is its mirror image's negative one
    for (const [rail, mirrorRail] of [['positive', 'negative'], ['negative', 'positive']] as const) {
      expectWithinDb(`psrrDb.${rail}.singleEnded`, pnp.psrrDb[rail].singleEnded, npn.psrrDb[mirrorRail].singleEnded);
      expectWithinDb(`psrrDb.${rail}.differential`, pnp.psrrDb[rail].differential, npn.psrrDb[mirrorRail].differential);
    }
    pnp.ac.forEach((entry, k) => {
      expectClose(`ac[${k}].differentialGain`, entry.differentialGain, npn.ac[k].differentialGain, GAIN_BOUND);
      expectClose(`ac[${k}].commonModeGain`, entry.commonModeGain, npn.ac[k].commonModeGain, CURRENT_BOUND);
      expectClose(`ac[${k}].inputNoiseVPerRtHz`, entry.inputNoiseVPerRtHz, npn.ac[k].inputNoiseVPerRtHz, CURRENT_BOUND);
    });
    expect(pnp.warnings).toEqual(npn.warnings);
    expect(pnp.transistors.map((q) => q.region)).toEqual(npn.transistors.map((q) => q.region));
  });
});

describe('recommend for a PNP spec sizes and judges the mirror image of its NPN spec (mirror symmetry, common practice)', () => {
  /** Rails and input range off-centre, so a check that read the NPN direction would show. */
  const PNP_SPEC = {
    title: 'Sallowmere sensor front end, PNP input',
    device: { family: 'pnp', beta: 90, earlyVoltageV: 50, saturationCurrentA: 2e-15 },
    supply: { positiveV: 12, negativeV: -9 },
    gain: { target: 50 },
    cmrr: { minDb: 70 },
    inputCommonMode: { minV: -6, maxV: 2 },
    outputSwingVpp: 2,
    topologies: ['resistor', 'simple-mirror', 'widlar', 'cascode'],
  };
  const NPN_MIRROR = { ...PNP_SPEC, device: { ...PNP_SPEC.device, family: 'npn' }, supply: { positiveV: 9, negativeV: -12 }, inputCommonMode: { minV: -2, maxV: 6 } };
  /** A rule at one end of the input range is the other end's in the mirror image. */
  const MIRRORED_RULE: Record<string, string> = { 'input-common-mode-low': 'input-common-mode-high', 'input-common-mode-high': 'input-common-mode-low' };

  test('the same tails and loads, the same verdicts (the input range’s ends swapped), the same headroom margins', async () => {
    const rules = await loadRuleSet();
    const [pnp, npn] = await Promise.all(
      [PNP_SPEC, NPN_MIRROR].map((document) => {
        const checked = validateSpec(document);
        if (!checked.ok) throw new Error(checked.errors.map((e) => `${e.path}: ${e.message}`).join('; '));
        return recommend(checked.value, rules);
      }),
    );
    expect(pnp.recommended).toBe(npn.recommended);
    for (const option of pnp.options) {
      const mirror = npn.options.find((o) => o.topology === option.topology)!;
      if (!option.design || !option.predicted || !mirror.design || !mirror.predicted) throw new Error(`${option.topology}: no design (${option.error ?? mirror.error})`);
      expect(option.design.tail, option.topology).toEqual(mirror.design.tail);
      expect(option.design.collectorResistanceOhm).toBe(mirror.design.collectorResistanceOhm);
      expect(option.design.device.family).toBe('pnp');
      expectClose(`${option.topology} tailCurrentA`, option.predicted.tailCurrentA, mirror.predicted.tailCurrentA, CURRENT_BOUND);
      for (const check of option.checks) {
        const other = mirror.checks.find((c) => c.rule === (MIRRORED_RULE[check.rule] ?? check.rule))!;
        expect(`${option.topology} ${check.rule}: ${check.passed}`).toBe(`${option.topology} ${check.rule}: ${other.passed}`);
      }
      const facts = option.figures!;
      const mirrorFacts = mirror.figures!;
      expectClose(`${option.topology} icmLowMarginV`, facts.icmLowMarginV, mirrorFacts.icmHighMarginV, 1e-4);
      expectClose(`${option.topology} icmHighMarginV`, facts.icmHighMarginV, mirrorFacts.icmLowMarginV, 1e-4);
      expectClose(`${option.topology} swingMarginV`, facts.swingMarginV, mirrorFacts.swingMarginV, 1e-4);
      expect(facts.icmLowShortfall).toBe('the pair saturates');
      expect(facts.icmHighShortfall).toBe('the tail node sits too close to the positive rail');
    }
  }, 60_000);
});
