/**
 * The MOS level-1 device of shared/engine/mos-device.ts against sources outside the code. Each
 * check names its source:
 * - [SH] H. Shichman, D. Hodges, IEEE JSSC 3(3), 1968, the square law, from memory:
 *   saturation ID = (KP/2)·(W/L)·(VGS − VT)², linear ID = KP·(W/L)·((VGS − VT)·VDS − VDS²/2),
 *   body effect VT = VTO + γ·(√(φ − VBS) − √φ);
 * - [SPICE] ngspice mos1load.c, mos1temp.c, mos1noi.c: the factor (1 + λ·VDS) on both regions,
 *   the forward-bias branch of √(φ − VBS), the drain–source swap for VDS < 0, the bulk junctions
 *   with IS = 1e-14 A and GMIN, and the temperature equations, including their asymmetry
 *   between the polarities;
 * - [AM] Antognetti, Massobrio, Semiconductor Device Modeling with SPICE (MOS temperature
 *   dependence), from memory: 2φF(T) = (T/T0)·2φF(T0) − 3·VT·ln(T/T0) + Eg(T) − (T/T0)·Eg(T0),
 *   with Eg(T) = 1.16 − 7.02e-4·T²/(T + 1108) eV;
 * - calculus: the derivatives equal the currents' finite differences in every region, either
 *   polarity, at −40, 27 and 125 °C (except where ngspice's gmbs is not the slope: forward body
 *   bias, checked on its own);
 * - [NG] ngspice's channel thermal noise, 8/3·k·T·gm (the square-law textbooks' 2/3 factor);
 * - [RZ] Razavi, Design of Analog CMOS Integrated Circuits, common practice: a threshold that
 *   falls by about 2 mV/°C.
 * Agreement with ngspice itself: tests/reference/mos-device-agreement.test.ts.
 */
import { describe, expect, test } from 'vitest';
import { BOLTZMANN_J_PER_K, GMIN_S, ZERO_CELSIUS_K, thermalVoltageV } from '#shared/engine/constants';
import { mosDrainNoiseA2PerHz, mosModel, type MosEval, type MosFamily } from '#shared/engine/mos-device';
import type { MosModelCard } from '#shared/engine/mos-parameters';

/** Invented Fernhollow cards. */
const NMOS: MosModelCard = { VTO: 0.7, KP: 110e-6, LAMBDA: 0.04, GAMMA: 0.45, PHI: 0.8 };
const PMOS: MosModelCard = { VTO: -0.8, KP: 40e-6, LAMBDA: 0.05, GAMMA: 0.5, PHI: 0.75 };
/** Closed forms against the model's arithmetic: rounding only. */
const EXACT = 1e-12;

const relative = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);

describe('the square law at 27 °C [SH]', () => {
  test.each([
    // KP A/V², W m, L m, VTO V, λ 1/V, VGS V, VDS V
    [110e-6, 10e-6, 2e-6, 0.7, 0, 1.2, 2],
    [110e-6, 10e-6, 2e-6, 0.7, 0.04, 1.2, 2],
    [50e-6, 40e-6, 1e-6, 0.5, 0.1, 2.5, 3.5],
    [2e-5, 100e-6, 100e-6, 1, 0.02, 1.6, 5],
  ])('saturation: KP %s, W %s, L %s, VTO %s, λ %s at VGS %s V, VDS %s V: ID = (KP/2)(W/L)(VGS − VT)²(1 + λVDS)', (kp, w, l, vto, lambda, vgs, vds) => {
    const ev = mosModel({ VTO: vto, KP: kp, LAMBDA: lambda }, 'nmos', 27).evaluate(vgs, vds, 0, w, l);
    const expectedA = (kp / 2) * (w / l) * (vgs - vto) ** 2 * (1 + lambda * vds);
    expect(ev.region).toBe('saturation');
    expect(relative(ev.channelA, expectedA)).toBeLessThan(EXACT);
    // gm = KP·(W/L)·VOV·(1 + λVDS) = 2·ID/VOV, gds = λ·ID/(1 + λVDS) [SH]
    expect(relative(ev.gmS, (2 * expectedA) / (vgs - vto))).toBeLessThan(EXACT);
    expect(Math.abs(ev.gdsS - (lambda * expectedA) / (1 + lambda * vds))).toBeLessThan(EXACT * expectedA);
  });

  test.each([
    [110e-6, 10e-6, 2e-6, 0.7, 2.5, 0.3],
    [50e-6, 40e-6, 1e-6, 0.5, 3, 1.2],
  ])('linear, λ = 0: KP %s, W %s, L %s, VTO %s at VGS %s V, VDS %s V: ID = KP(W/L)((VGS − VT)VDS − VDS²/2)', (kp, w, l, vto, vgs, vds) => {
    const ev = mosModel({ VTO: vto, KP: kp }, 'nmos', 27).evaluate(vgs, vds, 0, w, l);
    expect(ev.region).toBe('linear');
    expect(relative(ev.channelA, kp * (w / l) * ((vgs - vto) * vds - (vds * vds) / 2))).toBeLessThan(EXACT);
  });

  test('linear with λ: ngspice multiplies the linear current by (1 + λ·VDS) too [SPICE mos1load.c], so ID and gds join saturation continuously', () => {
    const m = mosModel(NMOS, 'nmos', 27);
    const ev = m.evaluate(2.5, 0.3, 0, 10e-6, 2e-6);
    const textbookA = 110e-6 * 5 * ((2.5 - 0.7) * 0.3 - 0.045);
    expect(relative(ev.channelA, textbookA * (1 + 0.04 * 0.3))).toBeLessThan(EXACT);
    // at the edge VDS = VGS − VT: both sides of it within a rounding's step
    const vov = 1.8;
    const below = m.evaluate(2.5, vov * (1 - 1e-12), 0, 10e-6, 2e-6);
    const above = m.evaluate(2.5, vov * (1 + 1e-12), 0, 10e-6, 2e-6);
    expect([below.region, above.region]).toEqual(['linear', 'saturation']);
    expect(relative(below.channelA, above.channelA)).toBeLessThan(1e-9);
    expect(relative(below.gdsS, above.gdsS)).toBeLessThan(1e-9);
    expect(relative(below.gmS, above.gmS)).toBeLessThan(1e-9);
  });

  test('cut-off at VGS ≤ VT: no channel current, gm, gds or gmbs (level 1 has no subthreshold current)', () => {
    const ev = mosModel(NMOS, 'nmos', 27).evaluate(0.7, 2, 0, 10e-6, 2e-6);
    expect(ev.region).toBe('cut-off');
    expect([ev.channelA, ev.gmS, ev.gdsS, ev.gmbsS, ev.dChannelDVgsS, ev.dChannelDVdsS, ev.dChannelDVbsS]).toEqual([0, 0, 0, 0, 0, 0, 0]);
  });
});

describe('the body effect [SH, SPICE]', () => {
  test.each([0, -0.5, -1.5, -4])('VBS = %s V: VT = VTO + γ(√(φ − VBS) − √φ), and the current follows it', (vbs) => {
    const ev = mosModel(NMOS, 'nmos', 27).evaluate(2.5, 3, vbs, 10e-6, 2e-6);
    const vtV = 0.7 + 0.45 * (Math.sqrt(0.8 - vbs) - Math.sqrt(0.8));
    expect(Math.abs(ev.thresholdV - vtV)).toBeLessThan(EXACT);
    expect(relative(ev.channelA, 55e-6 * 5 * (2.5 - vtV) ** 2 * (1 + 0.04 * 3))).toBeLessThan(EXACT);
    // gmbs = gm·γ/(2√(φ − VBS)) [SH]
    expect(relative(ev.gmbsS, (ev.gmS * 0.45) / (2 * Math.sqrt(0.8 - vbs)))).toBeLessThan(EXACT);
  });

  test('forward body bias (VBS > 0): ngspice continues √(φ − VBS) by its tangent √φ − VBS/(2√φ), and its gmbs is gm·γ/(2·that), not the slope [SPICE mos1load.c]', () => {
    const m = mosModel(NMOS, 'nmos', 27);
    const vbs = 0.3;
    const s = Math.sqrt(0.8) - vbs / (2 * Math.sqrt(0.8));
    const ev = m.evaluate(1.5, 2, vbs, 10e-6, 2e-6);
    expect(Math.abs(ev.thresholdV - (0.7 + 0.45 * (s - Math.sqrt(0.8))))).toBeLessThan(EXACT);
    expect(relative(ev.gmbsS, (ev.gmS * 0.45) / (2 * s))).toBeLessThan(EXACT);
    // the slope of the current along VBS is gm·γ/(2√φ) (calculus); ngspice's gmbs is 23 % above it here
    const hV = 1e-6;
    const slope = (m.evaluate(1.5, 2, vbs + hV, 10e-6, 2e-6).channelA - m.evaluate(1.5, 2, vbs - hV, 10e-6, 2e-6).channelA) / (2 * hV);
    expect(relative(slope, (ev.gmS * 0.45) / (2 * Math.sqrt(0.8)))).toBeLessThan(1e-6);
    expect(ev.gmbsS / slope).toBeCloseTo(Math.sqrt(0.8) / s, 6);
  });
});

describe('drain and source swapped (VDS < 0) [SPICE mos1load.c]', () => {
  test('the device conducts from source to drain as if the drain were its source: vgd, vbd, −vds', () => {
    const m = mosModel(NMOS, 'nmos', 27);
    const reversed = m.evaluate(1.2, -0.4, -1, 10e-6, 2e-6);
    // the same transistor with its drain and source exchanged: VGS' = VGD, VDS' = −VDS, VBS' = VBD
    const forward = m.evaluate(1.6, 0.4, -0.6, 10e-6, 2e-6);
    expect(reversed.mode).toBe(-1);
    expect(forward.mode).toBe(1);
    expect(relative(reversed.channelA, -forward.channelA)).toBeLessThan(EXACT);
    expect([reversed.gmS, reversed.gdsS, reversed.gmbsS]).toEqual([forward.gmS, forward.gdsS, forward.gmbsS]);
  });
});

/** Central differences of the channel and junction currents, step 1 µV. */
function finiteDifferences(family: MosFamily, card: MosModelCard, temperatureC: number, vgs: number, vds: number, vbs: number) {
  const m = mosModel(card, family, temperatureC);
  const at = (g: number, d: number, b: number): MosEval => m.evaluate(g, d, b, 10e-6, 2e-6);
  const hV = 1e-6;
  const diff = (f: (ev: MosEval) => number, dg: number, dd: number, db: number) =>
    (f(at(vgs + dg * hV, vds + dd * hV, vbs + db * hV)) - f(at(vgs - dg * hV, vds - dd * hV, vbs - db * hV))) / (2 * hV);
  const channel = (ev: MosEval) => ev.channelA;
  return {
    ev: at(vgs, vds, vbs),
    dVgs: diff(channel, 1, 0, 0),
    dVds: diff(channel, 0, 1, 0),
    dVbs: diff(channel, 0, 0, 1),
    bulkSource: diff((ev) => ev.bulkSourceA, 0, 0, 1),
    // vbd = vbs − vds: raising vds lowers vbd
    bulkDrain: -diff((ev) => ev.bulkDrainA, 0, 1, 0),
  };
}

describe('the derivatives equal finite differences (calculus)', () => {
  const biases = [
    ['saturation', 1.8, 3, -1.5],
    ['saturation, body tied to source', 1.2, 2, 0],
    ['linear', 3, 0.5, -2],
    ['swapped, linear', 1.2, -0.4, -1],
    ['swapped, saturation', 0.2, -1.5, -2],
    ['junctions forward, 0.45 V', 1.5, 2, 0.45],
  ] as const;
  const cases = (['nmos', 'pmos'] as const).flatMap((family) =>
    [-40, 27, 125].flatMap((temperatureC) => biases.map(([name, vgs, vds, vbs]) => [family, temperatureC, name, vgs, vds, vbs] as const)),
  );

  test.each(cases)('%s at %s °C, %s', (family, temperatureC, name, vgs, vds, vbs) => {
    const sign = family === 'pmos' ? -1 : 1;
    const card = family === 'pmos' ? PMOS : NMOS;
    const fd = finiteDifferences(family, card, temperatureC, sign * vgs, sign * vds, sign * vbs);
    const scale = Math.abs(fd.ev.dChannelDVgsS) + Math.abs(fd.ev.dChannelDVdsS);
    expect(scale).toBeGreaterThan(0);
    expect(Math.abs(fd.ev.dChannelDVgsS - fd.dVgs)).toBeLessThan(1e-6 * scale);
    expect(Math.abs(fd.ev.dChannelDVdsS - fd.dVds)).toBeLessThan(1e-6 * scale);
    // ngspice's gmbs is not the slope with the body forward biased (checked on its own above)
    if (!name.startsWith('junctions forward')) expect(Math.abs(fd.ev.dChannelDVbsS - fd.dVbs)).toBeLessThan(1e-6 * scale);
    expect(relative(fd.ev.bulkSourceS, fd.bulkSource)).toBeLessThan(1e-4);
    expect(relative(fd.ev.bulkDrainS, fd.bulkDrain)).toBeLessThan(1e-4);
  });
});

describe('the bulk junctions: ngspice\'s default IS = 1e-14 A with GMIN across each [SPICE mos1load.c, mos1temp.c]', () => {
  test('at 27 °C: reverse biased, −IS + GMIN·V; forward, IS·(exp(V/VT) − 1) + GMIN·V; the drain current carries the bulk–drain one', () => {
    const ev = mosModel(NMOS, 'nmos', 27).evaluate(0, 2, 0.3, 10e-6, 2e-6);
    const vtV = thermalVoltageV(27);
    expect(relative(ev.bulkSourceA, 1e-14 * (Math.exp(0.3 / vtV) - 1) + GMIN_S * 0.3)).toBeLessThan(EXACT);
    expect(relative(ev.bulkDrainA, -1e-14 + GMIN_S * (0.3 - 2))).toBeLessThan(EXACT);
    expect(ev.drainA).toBe(-ev.bulkDrainA); // cut off: the drain's only current is the junction's
  });

  test('IS(T) = IS·exp(Eg(T0)/VT(T0) − Eg(T)/VT(T)), the band gap alone (no T³ term, unlike the bipolar IS law)', () => {
    const eg = (tK: number) => 1.16 - (7.02e-4 * tK * tK) / (tK + 1108);
    const isA = 1e-14 * Math.exp(eg(300.15) / thermalVoltageV(27) - eg(398.15) / thermalVoltageV(125));
    const ev = mosModel(NMOS, 'nmos', 125).evaluate(0, 2, -1, 10e-6, 2e-6);
    expect(relative(ev.bulkSourceA, -isA - GMIN_S)).toBeLessThan(1e-9);
  });
});

describe('temperature [SPICE mos1temp.c, AM]', () => {
  const eg = (tK: number) => 1.16 - (7.02e-4 * tK * tK) / (tK + 1108);
  /** 2φF at T from its value at T0 = 300.15 K [AM]. */
  const phiAt = (phiV: number, tK: number) => {
    const r = tK / 300.15;
    const vtV = (BOLTZMANN_J_PER_K * tK) / 1.602176634e-19;
    return r * phiV - 3 * vtV * Math.log(r) + eg(tK) - r * eg(300.15);
  };

  test.each([-40, 27, 85, 125])('at %s °C: KP ∝ (T/TNOM)^−1.5, PHI(T) as the Fermi potential moves, NMOS VT = VTO + ΔEg/2 + ΔPHI/2 + γ(√PHI(T) − √PHI)', (temperatureC) => {
    const tK = temperatureC + ZERO_CELSIUS_K;
    const t = mosModel(NMOS, 'nmos', temperatureC).parameters;
    expect(relative(t.transconductanceAPerV2, 110e-6 * (tK / 300.15) ** -1.5)).toBeLessThan(EXACT);
    const phiV = phiAt(0.8, tK);
    // mos1temp.c's literal 1.1150877 eV for Eg(REFTEMP) stands where [AM] has Eg(T0): 1e-7 V apart
    expect(Math.abs(t.surfacePotentialV - phiV)).toBeLessThan(1e-6);
    const vtV = 0.7 + (eg(300.15) - eg(tK)) / 2 + (phiV - 0.8) / 2 + 0.45 * (Math.sqrt(phiV) - Math.sqrt(0.8));
    expect(Math.abs(t.thresholdV - vtV)).toBeLessThan(1e-6);
  });

  test('the threshold\'s magnitude falls with temperature, by 0.5 to 3 mV/°C (common practice, about −2 mV/°C [RZ])', () => {
    const slope = (card: MosModelCard, family: MosFamily) =>
      (Math.abs(mosModel(card, family, 85).parameters.thresholdV) - Math.abs(mosModel(card, family, 25).parameters.thresholdV)) / 60;
    expect(slope(NMOS, 'nmos')).toBeLessThan(-0.5e-3);
    expect(slope(NMOS, 'nmos')).toBeGreaterThan(-3e-3);
    expect(slope(PMOS, 'pmos')).toBeLessThan(-0.5e-3);
    expect(slope(PMOS, 'pmos')).toBeGreaterThan(-3e-3);
  });
});

describe('polarity [SPICE]', () => {
  const mirrorCard: MosModelCard = { ...NMOS, VTO: -NMOS.VTO! };
  const biases = [
    [1.8, 3, -1.5],
    [3, 0.5, -2],
    [1.2, -0.4, -1],
    [0.4, 1, 0],
  ] as const;

  test.each(biases)('at 27 °C a PMOS with VTO negated is the NMOS mirrored: VGS %s, VDS %s, VBS %s negated give every current negated, every derivative the same', (vgs, vds, vbs) => {
    const n = mosModel(NMOS, 'nmos', 27).evaluate(vgs, vds, vbs, 10e-6, 2e-6);
    const p = mosModel(mirrorCard, 'pmos', 27).evaluate(-vgs, -vds, -vbs, 10e-6, 2e-6);
    for (const key of ['channelA', 'bulkDrainA', 'bulkSourceA', 'drainA', 'thresholdV', 'saturationVoltageV'] as const) expect(p[key], key).toBeCloseTo(-n[key], 15);
    for (const key of ['dChannelDVgsS', 'dChannelDVdsS', 'dChannelDVbsS', 'bulkDrainS', 'bulkSourceS', 'gmS', 'gdsS', 'gmbsS'] as const) expect(p[key], key).toBeCloseTo(n[key], 15);
    expect([p.region, p.mode]).toEqual([n.region, n.mode]);
  });

  test.each([-40, 125])('at %s °C the two are not mirror images: the PMOS threshold magnitude is the NMOS one less Eg(TNOM) − Eg(T) (the band-gap term is not multiplied by the polarity)', (temperatureC) => {
    const eg = (tK: number) => 1.16 - (7.02e-4 * tK * tK) / (tK + 1108);
    const n = mosModel(NMOS, 'nmos', temperatureC).parameters.thresholdV;
    const p = mosModel(mirrorCard, 'pmos', temperatureC).parameters.thresholdV;
    expect(Math.abs(-p - (n - (eg(300.15) - eg(temperatureC + ZERO_CELSIUS_K))))).toBeLessThan(EXACT);
    // about 29 mV at 125 °C and 16 mV at −40 °C
    expect(Math.abs(-p - n)).toBeGreaterThan(0.015);
  });
});

describe('noise [NG]', () => {
  test('the channel thermal noise in saturation is 8/3·kT·gm with gm = KP·(W/L)·VOV·(1 + λVDS)', () => {
    const ev = mosModel(NMOS, 'nmos', 85).evaluate(2.2, 3, 0, 10e-6, 2e-6);
    const vovV = 2.2 - ev.thresholdV;
    const gmS = 110e-6 * (358.15 / 300.15) ** -1.5 * 5 * vovV * (1 + 0.04 * 3);
    expect(relative(mosDrainNoiseA2PerHz(ev, 85), (8 / 3) * BOLTZMANN_J_PER_K * 358.15 * gmS)).toBeLessThan(EXACT);
  });

  test('none in cut-off; a PMOS\'s is positive as its gm is', () => {
    expect(mosDrainNoiseA2PerHz(mosModel(NMOS, 'nmos', 27).evaluate(0.3, 2, 0, 10e-6, 2e-6), 27)).toBe(0);
    expect(mosDrainNoiseA2PerHz(mosModel(PMOS, 'pmos', 27).evaluate(-2, -3, 0, 10e-6, 2e-6), 27)).toBeGreaterThan(0);
  });
});

describe('bad input', () => {
  test('W or L not positive, and PHI not positive, are refused by name', () => {
    const m = mosModel(NMOS, 'nmos', 27);
    expect(() => m.evaluate(1, 1, 0, 0, 2e-6)).toThrow(/W and L must be positive/);
    expect(() => m.evaluate(1, 1, 0, 10e-6, -1e-6)).toThrow(/W and L must be positive/);
    expect(() => mosModel({ PHI: 0 }, 'nmos', 27)).toThrow(/PHI must be positive/);
  });
});
