/**
 * The MOS input stage (mos-stage.ts, ENGINE-CONTRACT.md "Families") against hand analysis of the
 * square-law pair (GAMMA = 0, LAMBDA = 0 where a closed form needs it) and the contract's
 * mirror-image statement; SPICE's step limiting for MOSFETs against ngspice devsup.c's code.
 * The same stages against ngspice itself: tests/reference/mos-pair-agreement.test.ts.
 */
import { describe, expect, test } from 'vitest';
import { analyzeMos, mosStageCircuit, solveMosStage, type MosDesign } from '#shared/engine/mos-stage';
import { limitDrainV, limitGateV } from '#shared/engine/operating-point';
import { mosSpiceNetlist } from '#shared/engine/mos-netlist';
import { parseSpiceNumber } from '#shared/units/spice-number';
import { analyze } from '#shared/engine/index';
import type { Design } from '#shared/engine/types';
import { InputError } from '#shared/engine/errors';

const KP = 100e-6;
const VTO = 0.8;
const PAIR = { widthM: 40e-6, lengthM: 2e-6 };
const BETA = (KP * PAIR.widthM) / PAIR.lengthM;

function resistorDesign(overrides: Partial<MosDesign> = {}): MosDesign {
  return {
    device: { family: 'nmos', model: { VTO, KP, LAMBDA: 0, GAMMA: 0, PHI: 0.6 } },
    supply: { positiveV: 5, negativeV: -5 },
    drainResistanceOhm: 10_000,
    pair: PAIR,
    tail: { topology: 'resistor', resistanceOhm: 20_000 },
    ...overrides,
  };
}

describe('square-law pair with a resistor tail (hand analysis: Razavi, Design of Analog CMOS Integrated Circuits, ch. 4, the differential pair)', () => {
  // ID = β/2·(VGS − VTO)², VGS = 0 − v(t), 2·ID = (v(t) − VN)/R: with x = VGS − VTO,
  // β·R·x² + x − (VN' ) = 0 where VN' = 0 − VTO − VN (the gates at 0 V)
  const R = 20_000;
  const rest = 0 - VTO - -5;
  const x = (-1 + Math.sqrt(1 + 4 * BETA * R * rest)) / (2 * BETA * R);
  const idA = (BETA / 2) * x * x;
  const gmS = BETA * x;
  const r = analyzeMos(resistorDesign());
  // The bulk junctions carry GMIN·v (1e-12 S, ngspice's, mos-device.ts): the square law holds to about 1e-7 of the currents
  const near = (value: number, expected: number) => expect(Math.abs(value / expected - 1)).toBeLessThan(1e-6);

  test('tail current 2·ID, drain voltage VP − ID·RD, tail node VGS below the gates', () => {
    near(r.tailCurrentA, 2 * idA);
    near(r.drainCurrentA, idA);
    near(r.drainVoltageV, 5 - idA * 10_000);
    near(r.tailNodeVoltageV, -(VTO + x));
  });

  test('gm = β·(VGS − VTO) = √(2·β·ID); Ad = −gm·RD, Ase = Ad/2, Acm = −gm·RD/(1 + 2·gm·R)', () => {
    near(r.transconductanceS, gmS);
    near(r.transconductanceS, Math.sqrt(2 * BETA * idA));
    near(r.differentialGain, -gmS * 10_000);
    near(r.singleEndedGain, (-gmS * 10_000) / 2);
    near(r.commonModeGain, (-gmS * 10_000) / (1 + 2 * gmS * R));
    expect(r.cmrrDb.singleEnded).toBeCloseTo(20 * Math.log10((1 + 2 * gmS * R) / 2), 4);
  });

  test('a matched pair: zero differential common-mode gain, differential CMRR null; no corner without tail capacitance; no gate current', () => {
    expect(r.differentialCommonModeGain).toBe(0);
    expect(r.cmrrDb.differential).toBeNull();
    expect(r.cmrrCornerHz).toBeNull();
    expect(r.inputBiasCurrentA).toBe(0);
  });

  test('tail output resistance is the resistor; power is (VP − VN)·Itail (all current flows rail to rail)', () => {
    near(r.tailOutputResistanceOhm, R);
    near(r.powerW, 10 * r.tailCurrentA);
    expect(r.warnings).toEqual([]);
  });

  test('supply rejection: with λ = 0 the positive rail reaches c1 whole through RD (gain 1); the negative rail acts as a common-mode drive from the tail, gm·RD/(1 + 2·gm·R)', () => {
    expect(Math.abs(r.psrrDb.positive.singleEnded - 20 * Math.log10(Math.abs(r.singleEndedGain)))).toBeLessThan(1e-5);
    expect(Math.abs(r.psrrDb.negative.singleEnded - 20 * Math.log10(Math.abs(r.singleEndedGain) / ((gmS * 10_000) / (1 + 2 * gmS * R))))).toBeLessThan(1e-5);
    expect(r.psrrDb.positive.differential).toBeNull();
    expect(r.psrrDb.negative.differential).toBeNull();
  });

  test('a pair source resistor RS degenerates the gain: Ad = −gm·RD/(1 + gm·RS) (Razavi ch. 4)', () => {
    const rs = 1000;
    const d = analyzeMos(resistorDesign({ pairSourceResistanceOhm: rs }));
    const gm = d.transconductanceS;
    expect(Math.abs(d.differentialGain / ((-gm * 10_000) / (1 + gm * rs)) - 1)).toBeLessThan(1e-6);
  });
});

describe('input offset of the square-law pair (GAMMA = 0; equal loads need equal currents: Razavi ch. 14, offset of the differential pair, exact square law)', () => {
  test('a threshold mismatch δ alone: VGS2 = VGS1 + δ, so the offset is −δ', () => {
    const r = analyzeMos(resistorDesign({ pairThresholdMismatchV: 0.003 }));
    expect(Math.abs(r.inputOffsetVoltageV - -0.003)).toBeLessThan(1e-9);
  });

  test('a KP mismatch δβ alone: Vov2 = Vov1/√(1 + δβ), so the offset is Vov1·(1 − 1/√(1 + δβ))', () => {
    const r = analyzeMos(resistorDesign({ pairBetaMismatch: 0.02 }));
    const vov1 = Math.sqrt((2 * r.drainCurrentA) / BETA);
    // at the offset the two currents are equal, ID1 = ID2 = Itail/2 (the loads are equal); the
    // tail current there differs from the zero-input one by a few parts per million (the tail node moves)
    const vov1AtOffset = Math.sqrt(r.tailCurrentA / BETA);
    expect(Math.abs(r.inputOffsetVoltageV - vov1AtOffset * (1 - 1 / Math.sqrt(1.02)))).toBeLessThan(2e-6 * vov1);
  });

  test('a matched pair has no offset and no drift, exactly', () => {
    const r = analyzeMos(resistorDesign());
    expect(r.inputOffsetVoltageV).toBe(0);
    expect(r.offsetDriftVPerC).toBe(0);
  });
});

describe('simple mirror tail (hand analysis, square law: Razavi ch. 5, current mirrors)', () => {
  const ref = { widthM: 20e-6, lengthM: 2e-6 };
  const design = (lambda: number, outputWidthM: number): MosDesign =>
    resistorDesign({
      device: { family: 'nmos', model: { VTO, KP, LAMBDA: lambda, GAMMA: 0, PHI: 0.6 } },
      tail: { topology: 'simple-mirror', referenceResistanceOhm: 47_000, widthM: outputWidthM, lengthM: 2e-6, referenceWidthM: ref.widthM, referenceLengthM: ref.lengthM },
    });

  test('without λ the tail copies the reference current times the W/L ratio', () => {
    // Iref: (10 V − VGS)/R = β3/2·(VGS − VTO)², solved for VGS
    const b3 = (KP * ref.widthM) / ref.lengthM;
    const R = 47_000;
    const y = (-1 + Math.sqrt(1 + 2 * b3 * R * (10 - VTO))) / (b3 * R);
    const irefA = (b3 / 2) * y * y;
    expect(analyzeMos(design(0, 20e-6)).tailCurrentA / irefA - 1).toBeLessThan(1e-6);
    expect(Math.abs(analyzeMos(design(0, 40e-6)).tailCurrentA / (2 * irefA) - 1)).toBeLessThan(1e-6);
  });

  test('with λ the output resistance is 1/gds of M4, gds = λ·ID/(1 + λ·VDS) for level 1 (ngspice mos1load.c: λ·β·Vov²/2)', () => {
    const solved = solveMosStage(design(0.05, 20e-6));
    const r = analyzeMos(design(0.05, 20e-6));
    const vdsV = r.tailNodeVoltageV - -5;
    const expectedOhm = (1 + 0.05 * vdsV) / (0.05 * r.tailCurrentA);
    expect(Math.abs(r.tailOutputResistanceOhm / expectedOhm - 1)).toBeLessThan(1e-5);
    expect(solved.op.mosfets.every((ev) => ev.region === 'saturation')).toBe(true);
  });

  test('a mismatched pair has a differential common-mode gain and a finite differential CMRR', () => {
    const r = analyzeMos({ ...design(0.05, 20e-6), pairThresholdMismatchV: 0.005 });
    expect(r.differentialCommonModeGain).not.toBe(0);
    expect(r.cmrrDb.differential).not.toBeNull();
    expect(r.cmrrDb.differential!).toBeGreaterThan(r.cmrrDb.singleEnded);
  });

  test('a starved tail warns: M4 in its linear region when the gates sit near the negative rail', () => {
    const r = analyzeMos({ ...design(0.05, 20e-6), inputCommonModeV: -3.8 });
    expect(r.warnings.some((w) => w.startsWith('M4 is in the linear (triode) region'))).toBe(true);
  });

  test('a pair cut off (gates under a threshold above the negative rail: −4.2 V on −5 V, VTO 0.8 V) is refused at /inputCommonModeV: level 1 has no subthreshold current, so no gain', () => {
    expect(() => analyzeMos({ ...design(0.05, 20e-6), inputCommonModeV: -4.2 })).toThrow(InputError);
    expect(() => analyzeMos({ ...design(0.05, 20e-6), inputCommonModeV: -4.2 })).toThrow(/^\/inputCommonModeV: the pair is cut off/);
  });
});

describe('a PMOS stage is the mirror image of the NMOS one (ENGINE-CONTRACT.md "Families", at 27 °C)', () => {
  const tails: MosDesign['tail'][] = [
    { topology: 'resistor', resistanceOhm: 15_000 },
    { topology: 'simple-mirror', referenceResistanceOhm: 33_000, widthM: 20e-6, lengthM: 2e-6, referenceWidthM: 20e-6, referenceLengthM: 2e-6 },
    { topology: 'cascode', referenceResistanceOhm: 33_000, widthM: 20e-6, lengthM: 2e-6, referenceWidthM: 20e-6, referenceLengthM: 2e-6, cascodeWidthM: 20e-6, cascodeLengthM: 2e-6 },
  ];
  test.each(tails)('$topology: same currents, gains and rejection; negated node voltages', (tail) => {
    const card = { VTO: 0.7, KP: 80e-6, LAMBDA: 0.04, GAMMA: 0.45, PHI: 0.7 };
    const nmos: MosDesign = { device: { family: 'nmos', model: card }, supply: { positiveV: 6, negativeV: -4 }, drainResistanceOhm: 12_000, pair: PAIR, tail, inputCommonModeV: 0.5, drainMismatch: 0.02 };
    const pmos: MosDesign = { ...nmos, device: { family: 'pmos', model: { ...card, VTO: -0.7 } }, supply: { positiveV: 4, negativeV: -6 }, inputCommonModeV: -0.5 };
    const n = analyzeMos(nmos);
    const p = analyzeMos(pmos);
    const same = (a: number, b: number) => expect(Math.abs(a - b)).toBeLessThanOrEqual(1e-9 * Math.abs(b));
    same(p.tailCurrentA, n.tailCurrentA);
    same(p.drainCurrentA, n.drainCurrentA);
    same(p.drainVoltageV, -n.drainVoltageV);
    same(p.tailNodeVoltageV, -n.tailNodeVoltageV);
    same(p.differentialGain, n.differentialGain);
    same(p.commonModeGain, n.commonModeGain);
    same(p.differentialCommonModeGain, n.differentialCommonModeGain);
    same(p.tailOutputResistanceOhm, n.tailOutputResistanceOhm);
    same(p.powerW, n.powerW);
    expect(p.tailCurrentA).toBeGreaterThan(0);
  });

  test('every PMOS body sits at the positive rail, every NMOS body at the negative rail; tied to the sources when asked', () => {
    const card = { VTO: -0.7, KP: 80e-6 };
    const tail = tails[1];
    const pmos = mosStageCircuit({ device: { family: 'pmos', model: card }, supply: { positiveV: 5, negativeV: -5 }, drainResistanceOhm: 1e4, pair: PAIR, tail });
    const bodies = pmos.elements.flatMap((e) => (e.kind === 'pmos' ? [e.body] : []));
    expect(bodies).toEqual(['vp', 'vp', 'vp', 'vp']);
    const tied = mosStageCircuit({ device: { family: 'nmos', model: { VTO: 0.7, KP: 80e-6 } }, supply: { positiveV: 5, negativeV: -5 }, drainResistanceOhm: 1e4, pair: PAIR, tail, pairBodyTiedToSource: true });
    expect(tied.elements.flatMap((e) => (e.kind === 'nmos' ? [`${e.name}:${e.body}`] : []))).toEqual(['M1:t', 'M2:t', 'M3:vn', 'M4:vn']);
  });
});

describe('the SPICE netlist of a MOS stage', () => {
  test('a level-1 card with the design\'s parameters, M lines with W and L and the body, and a card of its own for a mismatched M2', () => {
    const netlist = mosSpiceNetlist({ ...resistorDesign(), pairThresholdMismatchV: 0.01, pairBetaMismatch: 0.02 }, { analysis: 'op' });
    const lines = netlist.split('\n');
    const words = (start: string) => lines.find((line) => line.startsWith(start))!.split(/[\s()]+/).filter(Boolean);
    const values = (start: string) => Object.fromEntries(words(start).filter((w) => w.includes('=')).map((w) => [w.split('=')[0], parseSpiceNumber(w.split('=')[1])]));
    expect(words('.model NMOS1 ').slice(0, 3)).toEqual(['.model', 'NMOS1', 'NMOS']);
    expect(values('.model NMOS1 ')).toEqual({ LEVEL: 1, VTO: 0.8, KP: 100e-6, LAMBDA: 0, GAMMA: 0, PHI: 0.6 });
    expect(words('M1 ').slice(0, 6)).toEqual(['M1', 'c1', 'in1', 't', 'vn', 'NMOS1']);
    expect(values('M1 ')).toEqual({ W: 40e-6, L: 2e-6 });
    expect(words('M2 ').slice(0, 6)).toEqual(['M2', 'c2', 'in2', 't', 'vn', 'NMOS1_M2']);
    const own = values('.model NMOS1_M2 ');
    expect(own.VTO).toBeCloseTo(0.81, 12);
    expect(own.KP).toBeCloseTo(102e-6, 15);
  });
});

describe("SPICE's step limiting for MOSFETs (ngspice devsup.c, DEVfetlim and DEVlimvds, read from its source)", () => {
  test('fetlim: a device well on (vold ≥ VTO + 3.5) may rise by at most 2·|vold − VTO| + 2', () => {
    expect(limitGateV(30, 5, 1)).toBe(5 + 10);
    expect(limitGateV(14, 5, 1)).toBe(14);
  });
  test('fetlim: a device well on falling stays at VTO + 2 or above when it would go below VTO + 3.5, else falls at most |vold − VTO| + 1', () => {
    expect(limitGateV(0, 5, 1)).toBe(3);
    // vold − (|vold − VTO| + 1) is VTO − 1, below VTO + 3.5: a fall that stays above VTO + 3.5 is never cut
    expect(limitGateV(4.6, 10, 1)).toBe(4.6);
  });
  test('fetlim: in the middle region a step stops at VTO + 4 going up and VTO − 0.5 going down', () => {
    expect(limitGateV(10, 2, 1)).toBe(5);
    expect(limitGateV(-10, 2, 1)).toBe(0.5);
  });
  test('fetlim: an off device turning on stops at VTO + 0.5', () => {
    expect(limitGateV(3, 0, 1)).toBe(1.5);
    expect(limitGateV(-20, 0, 1)).toBe(0 - 4);
  });
  test('limvds: below 3.5 V a rise stops at 4 V and a fall at −0.5 V; above, a rise at 3·vold + 2 and a fall below 3.5 V at 2 V', () => {
    expect(limitDrainV(10, 1)).toBe(4);
    expect(limitDrainV(-3, 1)).toBe(-0.5);
    expect(limitDrainV(100, 5)).toBe(17);
    expect(limitDrainV(0, 5)).toBe(2);
    expect(limitDrainV(4, 5)).toBe(4);
  });
});

describe('the bipolar stage is untouched by the MOS element (common practice: a regression check)', () => {
  test('an NPN design solves as before: no MOSFETs in its circuit', () => {
    const design: Design = { device: { family: 'npn', beta: 120, earlyVoltageV: 80, saturationCurrentA: 1e-15 }, supply: { positiveV: 12, negativeV: -12 }, collectorResistanceOhm: 8200, tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 } };
    const r = analyze(design);
    expect(r.tailCurrentA).toBeGreaterThan(1e-3);
  });
});
