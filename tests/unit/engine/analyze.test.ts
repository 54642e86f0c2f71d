/**
 * `analyze` (shared/engine/analyze.ts) against the textbook hand formulas of DOMAIN.md, at the
 * loose tolerances those limits deserve (each row names its limit), plus invariants and the
 * output contract of ENGINE-CONTRACT.md. Hand operating points are computed here from the
 * device equations (IS, BF, VAF) by fixed-point iteration; no expected value comes from the
 * engine. Where a small-signal check takes the engine's own collector current as the input of
 * the formula, the comment says so: that row checks the small-signal solve, not the bias.
 */
import { describe, expect, test } from 'vitest';
import { analyze, singleEndedCmrrDbAt, solveStage } from '#shared/engine/index';
import { TOPOLOGIES, type AnalyzeResult, type Design, type DeviceParams, type TailDesign, type TopologyId } from '#shared/engine/types';
import { CONTRACT_NUMBER_FIELDS } from '../../helpers/contract-fields';
import { firstNonFinitePath } from '#shared/engine/finite';

/** An invented small-signal NPN (not a catalogue part). */
const DEVICE: DeviceParams = { family: 'npn', beta: 150, earlyVoltageV: 90, saturationCurrentA: 4e-15, pnp: { beta: 90, earlyVoltageV: 55, saturationCurrentA: 2e-15 } };
const DEVICE_NO_EARLY: DeviceParams = { family: 'npn', beta: 150, saturationCurrentA: 4e-15, pnp: { beta: 90, saturationCurrentA: 2e-15 } };
const IS_A = 4e-15;
const BETA = 150;
const VAF_V = 90;
/** kT/q at 27 °C from the exact constants [SI]. */
const VT_V = (1.380649e-23 * 300.15) / 1.602176634e-19;

const TAILS: Record<TopologyId, TailDesign> = {
  resistor: { topology: 'resistor', resistanceOhm: 8200 },
  'simple-mirror': { topology: 'simple-mirror', referenceResistanceOhm: 18000 },
  'degenerated-mirror': { topology: 'degenerated-mirror', referenceResistanceOhm: 16000, emitterResistanceOhm: 750 },
  widlar: { topology: 'widlar', referenceResistanceOhm: 3900, emitterResistanceOhm: 120 },
  wilson: { topology: 'wilson', referenceResistanceOhm: 18000 },
  cascode: { topology: 'cascode', referenceResistanceOhm: 18000 },
  ptat: { topology: 'ptat', emitterResistanceOhm: 180, startupResistanceOhm: 1e6, areaRatio: 8 },
};

function designWith(overrides: Partial<Design> = {}): Design {
  return {
    device: DEVICE,
    supply: { positiveV: 10, negativeV: -10 },
    collectorResistanceOhm: 6800,
    tail: TAILS['simple-mirror'],
    inputCommonModeV: 0,
    ...overrides,
  };
}

/** VBE carrying `icA` (VT·ln(IC/IS), the −1 and Early factor neglected) [SPICE]. */
const vbeV = (icA: number): number => VT_V * Math.log(icA / IS_A);

function relativeError(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

const db = (ratio: number): number => 20 * Math.log10(Math.abs(ratio));

/** Itail = (VICM − VBE − VN − Itail/2·RE)/R with VBE from the pair's own current [DOMAIN/GM]. */
function resistorTailHandA(vicmV: number, negativeV: number, rOhm: number, pairReOhm: number): number {
  let iA = 1e-3;
  for (let k = 0; k < 60; k += 1) iA = (vicmV - vbeV(iA / 2) - negativeV) / (rOhm + pairReOhm / 2);
  return iA;
}

/** Simple mirror: Iref = (VP − VBE − VN)/Rref, Iout = Iref/(1 + 2/β)·(1 + (VCE4 − VBE)/VA) [GM]. */
function simpleMirrorHandA(d: Design, rRefOhm: number, earlyV: number): { refA: number; outA: number; tailNodeV: number } {
  const { positiveV: vp, negativeV: vn } = d.supply;
  let refA = 1e-3;
  let outA = 1e-3;
  let tailNodeV = 0;
  for (let k = 0; k < 60; k += 1) {
    const vbe3 = vbeV(refA / (1 + 2 / BETA));
    refA = (vp - vbe3 - vn) / rRefOhm;
    tailNodeV = (d.inputCommonModeV ?? 0) - vbeV(outA / 2);
    outA = (refA / (1 + 2 / BETA)) * (1 + (tailNodeV - vn - vbe3) / earlyV);
  }
  return { refA, outA, tailNodeV };
}

/** Widlar: Iout·RE = VT·ln(Iref·k/Iout), solved by bisection; k = 1 is the textbook form [GM]. */
function widlarHandA(d: Design, rRefOhm: number, reOhm: number, earlyV: number): number {
  const { positiveV: vp, negativeV: vn } = d.supply;
  let refA = 1e-3;
  for (let k = 0; k < 60; k += 1) refA = (vp - vbeV(refA) - vn) / rRefOhm; // base currents neglected [GM]
  const vbe3 = vbeV(refA);
  const earlyFactor = (outA: number) => 1 + ((d.inputCommonModeV ?? 0) - vbeV(outA / 2) - vn - vbe3) / earlyV; // (1 + VCB4/VAF) [SPICE]
  let lo = 1e-9;
  let hi = refA * earlyFactor(refA);
  for (let k = 0; k < 200; k += 1) {
    const mid = (lo + hi) / 2;
    if (mid * reOhm < VT_V * Math.log((refA * earlyFactor(mid)) / mid)) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}

describe('bias: tail currents against the hand formulas', () => {
  test.each([
    { label: '±10 V, VICM 0', vicmV: 0, positiveV: 10, negativeV: -10, rOhm: 9100, pairReOhm: 0 },
    { label: 'single 15 V rail, VICM 2.5 V', vicmV: 2.5, positiveV: 15, negativeV: 0, rOhm: 3300, pairReOhm: 0 },
    { label: '±12 V, VICM −1 V, 270 Ω pair degeneration', vicmV: -1, positiveV: 12, negativeV: -12, rOhm: 15000, pairReOhm: 270 },
  ])('resistor tail, $label: Itail ≈ (VICM − VBE − VN − Itail/2·RE)/R within 0.5 % [DOMAIN/GM]', ({ vicmV, positiveV, negativeV, rOhm, pairReOhm }) => {
    const d = designWith({
      supply: { positiveV, negativeV },
      collectorResistanceOhm: 3300,
      tail: { topology: 'resistor', resistanceOhm: rOhm },
      inputCommonModeV: vicmV,
      pairEmitterResistanceOhm: pairReOhm,
    });
    // Neglected: α (IE vs IC, ~1/β on a ~VT·ln term) and the Early factor on VBE: a few mV of several volts
    expect(relativeError(analyze(d).tailCurrentA, resistorTailHandA(vicmV, negativeV, rOhm, pairReOhm))).toBeLessThan(0.005);
  });

  test.each([
    { label: '±10 V, Rref 18 kΩ', supply: { positiveV: 10, negativeV: -10 }, rRefOhm: 18000, vicmV: 0 },
    { label: '±5 V, Rref 4.3 kΩ', supply: { positiveV: 5, negativeV: -5 }, rRefOhm: 4300, vicmV: 1 },
    { label: '0/24 V, Rref 47 kΩ, VICM 8 V', supply: { positiveV: 24, negativeV: 0 }, rRefOhm: 47000, vicmV: 8 },
  ])('simple mirror, $label: Iout ≈ Iref/(1 + 2/β)·(1 + (VCE4 − VBE)/VA) within 1 % [GM]', ({ supply, rRefOhm, vicmV }) => {
    const d = designWith({ supply, tail: { topology: 'simple-mirror', referenceResistanceOhm: rRefOhm }, inputCommonModeV: vicmV, collectorResistanceOhm: 2200 });
    const hand = simpleMirrorHandA(d, rRefOhm, VAF_V);
    const result = analyze(d);
    expect(relativeError(result.tailCurrentA, hand.outA)).toBeLessThan(0.01);
    expect(relativeError(result.referenceCurrentA, hand.refA)).toBeLessThan(0.01);
  });

  test.each([
    { label: 'VAF infinite (textbook form)', device: DEVICE_NO_EARLY, earlyV: Infinity },
    { label: 'VAF 90 V (Early factor on IC4 added [SPICE])', device: DEVICE, earlyV: VAF_V },
  ])('Widlar, $label: Iout·RE ≈ VT·ln(Iref/Iout) within 3 % [GM]', ({ device, earlyV }) => {
    const tail = { topology: 'widlar' as const, referenceResistanceOhm: 3900, emitterResistanceOhm: 120 };
    const d = designWith({ device, tail });
    // Base currents neglected: ~1/β in Iref, scaled down by VT/(Iout·RE + VT) in Iout
    expect(relativeError(analyze(d).tailCurrentA, widlarHandA(d, 3900, 120, earlyV))).toBeLessThan(0.03);
  });

  test('Wilson: Iout ≈ Iref·(1 − 2/(β² + 2β + 2)), Iref = (VP − VN − 2·VBE)/Rref, within 2 % [GM]', () => {
    const d = designWith({ device: DEVICE_NO_EARLY, tail: TAILS.wilson });
    let refA = 1e-3;
    for (let k = 0; k < 60; k += 1) refA = (10 - -10 - 2 * vbeV(refA)) / 18000;
    const expectedA = refA * (1 - 2 / (BETA ** 2 + 2 * BETA + 2)); // [GM]
    expect(relativeError(analyze(d).tailCurrentA, expectedA)).toBeLessThan(0.02);
  });

  test.each([...TOPOLOGIES])('%s: power = (V+ − V−)·(Itail + Iref) within 1 % (the pair base currents come from the inputs)', (topology) => {
    const d = designWith({ tail: TAILS[topology] });
    const result = analyze(d);
    // Energy bookkeeping: the rails carry the tail and reference currents; the pair's base
    // currents (Itail/β) come from the input sources, hence 1 %.
    const spanV = d.supply.positiveV - d.supply.negativeV;
    expect(relativeError(result.powerW, spanV * (result.tailCurrentA + result.referenceCurrentA))).toBeLessThan(0.01);
  });
});

describe('small-signal gains against the hand formulas', () => {
  test.each([...TOPOLOGIES])('%s: |Ad| ≈ gm·RC within 5 %, and gm·(RC ∥ ro) within 0.5 % [SS][SPICE]', (topology) => {
    const d = designWith({ tail: TAILS[topology] });
    const result = analyze(d);
    // gm = IC/VT [GM] from the engine's own Q1 current: this row checks the small-signal solve.
    const gmS = result.collectorCurrentA / VT_V;
    // transconductanceS is gm as SPICE reports it, at constant VCE: with IC = IS·exp(VBE/VT)·(1 + VCB/VAF)
    // a rise of VBE also lowers VCB, so gm = IC/VT − IC/(VAF + VCB) [SPICE]
    const vcbV = result.collectorVoltageV - (d.inputCommonModeV ?? 0);
    expect(relativeError(result.transconductanceS, gmS - result.collectorCurrentA / (VAF_V + vcbV))).toBeLessThan(1e-6);
    const rcOhm = d.collectorResistanceOhm;
    expect(relativeError(Math.abs(result.differentialGain), gmS * rcOhm)).toBeLessThan(0.05); // [SS] Ad = −gm·RC, pair ro neglected
    // The pair's own ro = (VAF + VCB)/IC [SPICE] loads each collector: |Ad| = gm·(RC ∥ ro)
    const roOhm = (VAF_V + (result.collectorVoltageV - (d.inputCommonModeV ?? 0))) / result.collectorCurrentA;
    expect(relativeError(Math.abs(result.differentialGain), gmS * ((rcOhm * roOhm) / (rcOhm + roOhm)))).toBeLessThan(0.005);
    expect(result.differentialGain).toBeLessThan(0); // v(c1 − c2)/v(in1 − in2) inverts [SS]
  });

  test.each([100, 470, 2200])('pair emitter degeneration RE %s Ω: |Ad| ≈ RC/(RE + 1/gm) within 6 % [SS]', (reOhm) => {
    const d = designWith({ tail: TAILS['simple-mirror'], pairEmitterResistanceOhm: reOhm });
    const result = analyze(d);
    // gm = IC/VT [GM] from the engine's own Q1 current (this row checks the small-signal solve);
    // the limit neglects α (1/β) and the pair's ro (RC/ro ≈ 4 % here)
    const gmS = result.collectorCurrentA / VT_V;
    expect(relativeError(Math.abs(result.differentialGain), d.collectorResistanceOhm / (reOhm + 1 / gmS))).toBeLessThan(0.06);
  });

  test.each([...TOPOLOGIES])('%s, matched pair: Ase = Ad/2 (invariant)', (topology) => {
    const result = analyze(designWith({ tail: TAILS[topology] }));
    expect(relativeError(result.singleEndedGain, result.differentialGain / 2)).toBeLessThan(1e-9);
  });

  const RESISTOR_ROWS = [
    { label: 'R 8.2 kΩ, ±10 V', rOhm: 8200, supply: { positiveV: 10, negativeV: -10 }, rcOhm: 6800 },
    { label: 'R 47 kΩ, ±15 V', rOhm: 47000, supply: { positiveV: 15, negativeV: -15 }, rcOhm: 33000 },
    { label: 'R 1.5 kΩ, ±5 V', rOhm: 1500, supply: { positiveV: 5, negativeV: -5 }, rcOhm: 1200 },
  ];

  test.each(RESISTOR_ROWS)('resistor tail, $label: Acm ≈ −RC/(2·Rout) within 3 % [SS]', ({ rOhm, supply, rcOhm }) => {
    const result = analyze(designWith({ supply, collectorResistanceOhm: rcOhm, tail: { topology: 'resistor', resistanceOhm: rOhm } }));
    expect(result.tailOutputResistanceOhm).toBeCloseTo(rOhm, 3); // Rout = R [DOMAIN]
    // [SS] Acm = −gm·RC/(1 + 2·gm·Rout/α) ≈ −RC/(2·Rout); the limit drops 1/β and 1/(2·gm·R): < 1 % here
    expect(result.commonModeGain).toBeLessThan(0);
    expect(relativeError(result.commonModeGain, -rcOhm / (2 * rOhm))).toBeLessThan(0.03);
  });

  test.each(RESISTOR_ROWS)('resistor tail, $label: single-ended CMRR ≈ gm·Rout within 1 dB [SS]', ({ rOhm, supply, rcOhm }) => {
    const d = designWith({ supply, collectorResistanceOhm: rcOhm, tail: { topology: 'resistor', resistanceOhm: rOhm } });
    const gmS = resistorTailHandA(0, supply.negativeV, rOhm, 0) / 2 / VT_V; // hand bias, gm = IC/VT [GM]
    const result = analyze(d);
    expect(Math.abs(result.cmrrDb.singleEnded - db(gmS * rOhm))).toBeLessThan(1); // [SS] CMRR ≈ gm·Rout
    expect(result.cmrrDb.singleEnded).toBeCloseTo(db(result.singleEndedGain / result.commonModeGain), 9); // definition
  });
});

describe('tail output resistance against the textbook limits', () => {
  /** Hand bias of a mirror-type tail: output current, tail-node voltage, VCB of the output transistor. */
  function mirrorHand(topology: TopologyId): { outA: number; vcbOutV: number } {
    const d = designWith({ tail: TAILS[topology] });
    const vn = d.supply.negativeV;
    const span = d.supply.positiveV - vn;
    const tail = TAILS[topology];
    if (tail.topology === 'simple-mirror') {
      const hand = simpleMirrorHandA(d, tail.referenceResistanceOhm, VAF_V);
      return { outA: hand.outA, vcbOutV: hand.tailNodeV - vn - vbeV(hand.outA) };
    }
    if (tail.topology === 'degenerated-mirror') {
      let refA = 1e-3;
      for (let k = 0; k < 60; k += 1) refA = (span - vbeV(refA)) / (tail.referenceResistanceOhm + tail.emitterResistanceOhm);
      const tailNodeV = -vbeV(refA / 2);
      return { outA: refA, vcbOutV: tailNodeV - (vn + refA * tail.emitterResistanceOhm + vbeV(refA)) };
    }
    if (tail.topology === 'wilson' || tail.topology === 'cascode') {
      let refA = 1e-3;
      for (let k = 0; k < 60; k += 1) refA = (span - 2 * vbeV(refA)) / tail.referenceResistanceOhm;
      const tailNodeV = -vbeV(refA / 2);
      return { outA: refA, vcbOutV: tailNodeV - (vn + 2 * vbeV(refA)) }; // base of Q5/Q6 two VBE above V−
    }
    throw new Error(`no hand bias for ${topology}`);
  }

  test.each([
    // [GM] Rout = ro, ro = (VAF + VCB)/IC [SPICE]; exact apart from the pair's tiny loading
    { topology: 'simple-mirror' as const, tolerance: 0.02, limit: (ro: number) => ro },
    // [GM] ro·(1 + gm·(RE ∥ rπ)); DOMAIN: ignores the impedance driving the bases, so 30 %
    {
      topology: 'degenerated-mirror' as const,
      tolerance: 0.3,
      limit: (ro: number, gm: number) => {
        const re = 750;
        const rpi = BETA / gm;
        return ro * (1 + gm * ((re * rpi) / (re + rpi)));
      },
    },
    // [GM] β·ro/2; DOMAIN: "within 30 %" is what the docs allow for Wilson
    { topology: 'wilson' as const, tolerance: 0.3, limit: (ro: number) => (BETA * ro) / 2 },
    // [GM, from memory] four-transistor cascode mirror ≈ β·ro/2
    { topology: 'cascode' as const, tolerance: 0.3, limit: (ro: number) => (BETA * ro) / 2 },
  ])('$topology: Rout against its textbook limit within $tolerance (relative)', ({ topology, tolerance, limit }) => {
    const hand = mirrorHand(topology);
    const roOhm = (VAF_V + hand.vcbOutV) / hand.outA; // [SPICE]
    const gmS = hand.outA / VT_V; // [GM]
    const result = analyze(designWith({ tail: TAILS[topology] }));
    expect(relativeError(result.tailOutputResistanceOhm, limit(roOhm, gmS))).toBeLessThan(tolerance);
  });

  test('Wilson and cascode tails are far above the simple mirror (β/2-ish), which is far above the resistor (invariant)', () => {
    const rout = (t: TopologyId) => analyze(designWith({ tail: TAILS[t] })).tailOutputResistanceOhm;
    expect(rout('wilson')).toBeGreaterThan(20 * rout('simple-mirror'));
    expect(rout('cascode')).toBeGreaterThan(20 * rout('simple-mirror'));
    expect(rout('simple-mirror')).toBeGreaterThan(5 * rout('resistor'));
  });
});

describe('tail capacitance: the CMRR corner', () => {
  test.each([2e-12, 4.7e-11, 1e-9])('resistor tail, Ct %s F: corner ≈ 1/(2π·Rout·Ct) within 30 % [DOMAIN]', (ctF) => {
    const rOhm = 8200;
    const result = analyze(designWith({ tail: { topology: 'resistor', resistanceOhm: rOhm }, tailCapacitanceF: ctF }));
    expect(result.cmrrCornerHz).not.toBeNull();
    expect(relativeError(result.cmrrCornerHz!, 1 / (2 * Math.PI * rOhm * ctF))).toBeLessThan(0.3);
  });

  test.each([...TOPOLOGIES])('%s, Ct 10 pF: at cmrrCornerHz the single-ended CMRR is 3 dB below its low-frequency value [contract]', (topology) => {
    const solution = solveStage(designWith({ tail: TAILS[topology], tailCapacitanceF: 1e-11 }));
    const dropDb = singleEndedCmrrDbAt(solution, 0) - singleEndedCmrrDbAt(solution, solution.result.cmrrCornerHz!);
    expect(dropDb).toBeCloseTo(10 * Math.log10(2), 3); // −3.01 dB: |H|² halved
  });

  test('no tail capacitance: cmrrCornerHz is null [contract]', () => {
    expect(analyze(designWith({ tailCapacitanceF: 0 })).cmrrCornerHz).toBeNull();
  });

  test('the higher Rout, the lower the corner at the same Ct [DOMAIN]', () => {
    const corner = (t: TopologyId) => analyze(designWith({ tail: TAILS[t], tailCapacitanceF: 1e-11 })).cmrrCornerHz!;
    expect(corner('simple-mirror')).toBeLessThan(corner('resistor'));
    expect(corner('wilson')).toBeLessThan(corner('simple-mirror'));
  });
});

describe('warnings', () => {
  test('a saturated pair (RC too large for the current) gives a warning naming Q1', () => {
    // ≈ 1.2 mA tail, 0.6 mA per side: 30 kΩ would drop 18 V from a 10 V rail
    const result = analyze(designWith({ tail: { topology: 'resistor', resistanceOhm: 8200 }, collectorResistanceOhm: 30000 }));
    expect(result.warnings.some((w) => /\bQ1\b/.test(w) && /saturat/i.test(w))).toBe(true);
  });

  test.each([...TOPOLOGIES])('%s at a sensible bias: no warnings', (topology) => {
    expect(analyze(designWith({ tail: TAILS[topology] })).warnings).toEqual([]);
  });
});

describe('differential output: matched and mismatched pairs', () => {
  test.each([...TOPOLOGIES])('%s, matched pair: differentialCommonModeGain 0 and cmrrDb.differential null [contract]', (topology) => {
    const result = analyze(designWith({ tail: TAILS[topology] }));
    expect(result.differentialCommonModeGain).toBe(0);
    expect(result.cmrrDb.differential).toBeNull();
  });

  test.each([0.003, 0.01, -0.02, 0.05])('resistor tail, ε = %s: differential CMRR ≈ 2·gm·Rout/ε within 3 dB [SS]', (epsilon) => {
    const rOhm = 8200;
    const result = analyze(designWith({ tail: { topology: 'resistor', resistanceOhm: rOhm }, collectorMismatch: epsilon }));
    const gmS = resistorTailHandA(0, -10, rOhm, 0) / 2 / VT_V; // hand bias [GM]
    expect(result.cmrrDb.differential).not.toBeNull();
    expect(Math.abs(result.cmrrDb.differential! - db((2 * gmS * rOhm) / epsilon))).toBeLessThan(3); // [SS]
    expect(result.cmrrDb.differential!).toBeCloseTo(db(result.differentialGain / result.differentialCommonModeGain), 9); // definition
  });

  test('differential CMRR falls as the load mismatch grows (invariant)', () => {
    const cmrr = (e: number) => analyze(designWith({ tail: TAILS.resistor, collectorMismatch: e })).cmrrDb.differential!;
    expect(cmrr(0.001)).toBeGreaterThan(cmrr(0.01));
    expect(cmrr(0.01)).toBeGreaterThan(cmrr(0.1));
  });
});

describe('determinism and the output contract', () => {
  const DESIGNS: [string, Design][] = [
    ...TOPOLOGIES.map((t): [string, Design] => [t, designWith({ tail: TAILS[t] })]),
    ['wilson with load mismatch and tail capacitance', designWith({ tail: TAILS.wilson, collectorMismatch: 0.004, tailCapacitanceF: 3.3e-12 })],
    ['resistor with pair degeneration at 85 °C', designWith({ tail: TAILS.resistor, pairEmitterResistanceOhm: 100, temperatureC: 85 })],
    ['simple mirror with VAF omitted (infinite) and Ct', designWith({ device: DEVICE_NO_EARLY, tailCapacitanceF: 3e-12 })],
    ['cascode with VAF omitted and load mismatch', designWith({ device: DEVICE_NO_EARLY, tail: TAILS.cascode, collectorMismatch: 0.01 })],
    ['simple mirror from vbeOnV (no IS), single supply', designWith({ device: { family: 'npn', beta: 200, vbeOnV: 0.62, earlyVoltageV: 60 }, supply: { positiveV: 12, negativeV: 0 }, inputCommonModeV: 4 })],
  ];

  test.each(DESIGNS)('%s: the same design analysed twice gives byte-identical JSON', (_label, design) => {
    expect(JSON.stringify(analyze(structuredClone(design)))).toBe(JSON.stringify(analyze(structuredClone(design))));
  });

  test.each(DESIGNS)('%s: analyze does not modify its input', (_label, design) => {
    const copy = structuredClone(design);
    analyze(design);
    expect(design).toEqual(copy);
  });



  test.each(DESIGNS)('%s: every contract field is present with its type, and no NaN or Infinity anywhere', (_label, design) => {
    const result: AnalyzeResult = analyze(design);
    for (const field of CONTRACT_NUMBER_FIELDS) expect(typeof result[field], field).toBe('number');
    expect(typeof result.cmrrDb.singleEnded).toBe('number');
    expect(result.cmrrDb.differential === null || typeof result.cmrrDb.differential === 'number').toBe(true);
    expect('differential' in result.cmrrDb).toBe(true);
    expect('cmrrCornerHz' in result).toBe(true);
    expect(result.cmrrCornerHz === null || typeof result.cmrrCornerHz === 'number').toBe(true);
    expect(Array.isArray(result.warnings)).toBe(true);
    for (const w of result.warnings) expect(typeof w).toBe('string');
    expect(firstNonFinitePath(result)).toBeNull();
    // JSON keeps every field: nothing undefined that would vanish on the command line
    expect(Object.keys(JSON.parse(JSON.stringify(result))).sort()).toEqual(Object.keys(result).sort());
  });
});

describe('solveStage with a warm start (sizing and mismatch sensitivities reuse a nearby solution)', () => {
  // A warm start only seeds the Newton iteration: the solution must be the cold one.
  const HIGH_RAIL_TAILS: Record<TopologyId, (k: number) => TailDesign> = {
    resistor: (k) => ({ topology: 'resistor', resistanceOhm: 40000 * k }),
    'simple-mirror': (k) => ({ topology: 'simple-mirror', referenceResistanceOhm: 40000 * k }),
    'degenerated-mirror': (k) => ({ topology: 'degenerated-mirror', referenceResistanceOhm: 40000 * k, emitterResistanceOhm: 500 }),
    widlar: (k) => ({ topology: 'widlar', referenceResistanceOhm: 8000, emitterResistanceOhm: 50 * k }),
    wilson: (k) => ({ topology: 'wilson', referenceResistanceOhm: 40000 * k }),
    cascode: (k) => ({ topology: 'cascode', referenceResistanceOhm: 40000 * k }),
    ptat: (k) => ({ topology: 'ptat', emitterResistanceOhm: 300 * k, startupResistanceOhm: 4e6, areaRatio: 8 }),
  };
  const highRail = (tail: TailDesign, overrides: Partial<Design> = {}): Design =>
    designWith({ supply: { positiveV: 40, negativeV: -40 }, collectorResistanceOhm: 2000, tail, ...overrides });

  function expectSameSolution(warm: AnalyzeResult, cold: AnalyzeResult): void {
    expect(relativeError(warm.tailCurrentA, cold.tailCurrentA)).toBeLessThan(1e-9);
    expect(relativeError(warm.collectorVoltageV, cold.collectorVoltageV)).toBeLessThan(1e-9);
    expect(relativeError(warm.differentialGain, cold.differentialGain)).toBeLessThan(1e-9);
  }

  const tuningRows = TOPOLOGIES.flatMap((topology) => [0.2, 5].map((k) => ({ topology, k })));
  test.each(tuningRows)('$topology, ±40 V: warm-started from the tail resistor ×$k (a resistor being tuned), the solve equals the cold one', ({ topology, k }) => {
    const target = highRail(HIGH_RAIL_TAILS[topology](1));
    expectSameSolution(solveStage(target, solveStage(highRail(HIGH_RAIL_TAILS[topology](k)))).result, solveStage(target).result);
  });

  test.each([...TOPOLOGIES])('%s, ±40 V: warm-started from RC ×20 and from the matched pair, the mismatched solve equals the cold one', (topology) => {
    const target = highRail(HIGH_RAIL_TAILS[topology](1), { collectorMismatch: 1e-3 });
    const cold = solveStage(target).result;
    expectSameSolution(solveStage(target, solveStage({ ...target, collectorResistanceOhm: 40000 })).result, cold);
    expectSameSolution(solveStage(target, solveStage({ ...target, collectorMismatch: 0 })).result, cold);
  });

  // Robustness: a warm start from another input common mode (the corners of a ±10 V input range)
  // must not turn a solvable design into a ConvergenceError; the cold solve converges.
  test('simple mirror, ±40 V: warm-started from VICM 0 V, the solve at VICM +10 V equals the cold solve (falls back rather than failing)', () => {
    const nominal = highRail(HIGH_RAIL_TAILS['simple-mirror'](1));
    const corner: Design = { ...nominal, inputCommonModeV: 10 };
    expectSameSolution(solveStage(corner, solveStage(nominal)).result, solveStage(corner).result);
  });
});
