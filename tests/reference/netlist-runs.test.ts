/**
 * ngspice (the registry build, and Debian's in its own pass) runs every netlist the writer makes
 * (shared/engine/netlist.ts): each topology's .op and AC analyses without errors, and the
 * figures checked against hand formulas (DOMAIN.md). Kept apart from the writer's own tests in
 * tests/unit/engine/netlist.test.ts, which read the text back and start no simulator.
 */
import { beforeAll, describe, expect, test, vi } from 'vitest';
import { isMosfet, isTransistor, stageCircuit } from '#shared/engine/circuit';
import { thermalVoltageV } from '#shared/engine/constants';
import { saturationCurrentAtA } from '#shared/engine/device';
import { TOPOLOGIES, type DeviceParams } from '#shared/engine/types';
import { netlistDesign as designFor } from '../helpers/netlist-designs';
import { runSpice, spiceAc, spiceFigures, spiceOperatingPoint, startSpice } from '../helpers/spice';

/** ngspice's first start (WebAssembly instantiation) takes about a second; allow for a slow machine. */
const ENGINE_START_TIMEOUT_MS = 120_000;

/** The same device without the Early effect, for hand formulas that assume none. */
const DEVICE_NO_EARLY: DeviceParams = { family: 'npn', beta: 165, saturationCurrentA: 1.1e-14 };

describe('ngspice runs the netlists', () => {
  beforeAll(startSpice, ENGINE_START_TIMEOUT_MS);

  test.each(TOPOLOGIES)('%s: .op and every AC analysis run without errors', async (topology) => {
    const design = designFor(topology, { pairEmitterResistanceOhm: 82, collectorMismatch: 0.01, pairSaturationCurrentMismatch: 0.02, tailCapacitanceF: 3.3e-12 });
    const op = await spiceOperatingPoint(design);
    const tailNodes = stageCircuit(design).elements.flatMap((e) => (isTransistor(e) ? [e.collector, e.base, e.emitter] : isMosfet(e) ? [e.drain, e.gate, e.source] : e.nodes));
    for (const node of tailNodes) expect(Number.isFinite(op.nodeVoltagesV[node]), `v(${node})`).toBe(true);
    const sweep = { startHz: 1, stopHz: 1e6, pointsPerDecade: 5 };
    for (const options of [
      { analysis: 'ac-differential', ...sweep },
      { analysis: 'ac-common-mode', ...sweep },
      { analysis: 'ac-tail', tailNodeV: op.nodeVoltagesV.t, ...sweep },
    ] as const) {
      const ac = await spiceAc(design, options);
      expect(ac.frequenciesHz).toHaveLength(31);
      expect(ac.frequenciesHz[0]).toBeCloseTo(1, 9);
    }
  });

  test('concurrent runs are serialised: each caller gets its own circuit\'s result', async () => {
    const designs = [5100, 6800, 8200, 10000].map((resistanceOhm) => designFor('resistor', { tail: { topology: 'resistor', resistanceOhm } }));
    const together = await Promise.all(designs.map((design) => spiceOperatingPoint(design)));
    for (const [index, design] of designs.entries()) {
      const alone = await spiceOperatingPoint(design);
      expect(together[index].nodeVoltagesV).toEqual(alone.nodeVoltagesV);
    }
    expect(new Set(together.map((op) => op.nodeVoltagesV.c1)).size).toBe(designs.length);
  });

  test('a failing netlist rejects with ngspice\'s message, and the next run still works', async () => {
    const broken = ['broken', 'R1 a 0 1k', 'Q1 a b 0 NOSUCHMODEL', '.op', '.end'].join('\n');
    const quiet = vi.spyOn(console, 'error').mockImplementation(() => undefined); // the engine echoes ngspice's stderr
    try {
      await expect(runSpice(broken)).rejects.toThrow(/could not find a valid modelname/);
    } finally {
      quiet.mockRestore();
    }
    const op = await spiceOperatingPoint(designFor('resistor'));
    expect(op.nodeVoltagesV.vp).toBe(9);
  });

  // [SPICE] IS(T) = IS·(T/Tnom)^3·exp((EG/VT)·(T/Tnom − 1)): Q1's IS read back from the simulated bias
  // (IC from the RC1 drop, IC = IS(T)·exp(VBE/VT)·(1 + VCB/VAF)) shows `.options temp/tnom` took effect.
  test.each([-40, 27, 85])('temperature %s °C: ngspice uses IS(T) of device.ts', async (temperatureC) => {
    const design = designFor('resistor', { temperatureC });
    const { nodeVoltagesV: v } = await spiceOperatingPoint(design);
    const icA = (9 - v.c1) / 6200;
    const vbeV = v.in1 - v.t;
    const vcbV = v.c1 - v.in1;
    const isA = icA / (Math.exp(vbeV / thermalVoltageV(temperatureC)) * (1 + vcbV / 92));
    expect(isA / saturationCurrentAtA(1.1e-14, temperatureC)).toBeCloseTo(1, 2);
  });

  test('area factor: with equal VBE and no Early effect, IC2/IC1 = 1 + δ', async () => {
    const design = designFor('simple-mirror', { device: DEVICE_NO_EARLY, pairSaturationCurrentMismatch: 0.02 });
    const { nodeVoltagesV: v } = await spiceOperatingPoint(design);
    expect((9 - v.c2) / (9 - v.c1)).toBeCloseTo(1.02, 4);
  });

  test('power: −(VP·i(vp) + VN·i(vn)) equals VP·(IRC1 + IRC2) + |VN|·IRT for a resistor tail, and is positive', async () => {
    const design = designFor('resistor');
    const figures = await spiceFigures(design);
    const { nodeVoltagesV: v } = await spiceOperatingPoint(design);
    const byHandW = 9 * ((9 - v.c1) / 6200 + (9 - v.c2) / 6200) + 9 * ((v.t + 9) / 5100);
    expect(figures.powerW).toBeGreaterThan(0);
    expect(figures.powerW / byHandW).toBeCloseTo(1, 6);
  });

  test('ac-tail of a resistor tail reads back its resistance', async () => {
    const figures = await spiceFigures(designFor('resistor'));
    expect(figures.tailOutputResistanceOhm / 5100).toBeCloseTo(1, 6);
  });

  // [GM] simple mirror: Iout ≈ Iref/(1 + 2/β)·(1 + (VCE4 − VBE)/VA); in SPICE's form VCE4 − VBE = VCB4.
  test('[GM] simple mirror: Iout ≈ Iref/(1 + 2/β)·(1 + VCB4/VA), within 1 %', async () => {
    const design = designFor('simple-mirror');
    const figures = await spiceFigures(design);
    const vcb4V = figures.transistors.find((q) => q.name === 'Q4')!.vcbV;
    expect(figures.tailCurrentA / ((figures.referenceCurrentA / (1 + 2 / 165)) * (1 + vcb4V / 92))).toBeCloseTo(1, 2);
  });

  test('[GM] simple mirror without Early effect: Iout ≈ Iref/(1 + 2/β), within 1 %', async () => {
    const figures = await spiceFigures(designFor('simple-mirror', { device: DEVICE_NO_EARLY }));
    expect(figures.tailCurrentA / (figures.referenceCurrentA / (1 + 2 / 165))).toBeCloseTo(1, 2);
  });

  test('[GM] Wilson without Early effect: Iout ≈ Iref·(1 − 2/(β² + 2β + 2)), within 1 %', async () => {
    const figures = await spiceFigures(designFor('wilson', { device: DEVICE_NO_EARLY }));
    const beta = 165;
    expect(figures.tailCurrentA / (figures.referenceCurrentA * (1 - 2 / (beta * beta + 2 * beta + 2)))).toBeCloseTo(1, 2);
  });

  test('[GM] Widlar without Early effect: Iout·RE = VT·ln(Iref/Iout) (base currents neglected), within 2 %', async () => {
    const figures = await spiceFigures(designFor('widlar', { device: DEVICE_NO_EARLY }));
    const vtV = thermalVoltageV(27);
    let ioutA = figures.referenceCurrentA / 10;
    for (let i = 0; i < 200; i += 1) ioutA = (vtV * Math.log(figures.referenceCurrentA / ioutA)) / 270;
    expect(Math.abs(figures.tailCurrentA / ioutA - 1)).toBeLessThan(0.02);
  });

  test.each(['resistor', 'simple-mirror', 'cascode'] as const)('[SS] %s without Early effect: |Ad| ≈ gm·RC and |Ase| ≈ gm·RC/2, within 5 %', async (topology) => {
    const figures = await spiceFigures(designFor(topology, { device: DEVICE_NO_EARLY }));
    const gmS = figures.collectorCurrentA / thermalVoltageV(27);
    expect(Math.abs(Math.abs(figures.differentialGain) / (gmS * 6200) - 1)).toBeLessThan(0.05);
    expect(Math.abs(Math.abs(figures.singleEndedGain) / ((gmS * 6200) / 2) - 1)).toBeLessThan(0.05);
    expect(figures.differentialGain).toBeLessThan(0);
  });

  // [SS] with the pair's own ro in SPICE's form, ro = (VAF + VCB)/IC [SPICE]: about 5 % below gm·RC here.
  test.each(['resistor', 'wilson'] as const)('[SS][SPICE] %s: |Ad| ≈ gm·(RC ∥ ro), within 2 %', async (topology) => {
    const figures = await spiceFigures(designFor(topology));
    const gmS = figures.collectorCurrentA / thermalVoltageV(27);
    const roOhm = (92 + figures.transistors.find((q) => q.name === 'Q1')!.vcbV) / figures.collectorCurrentA;
    expect(Math.abs(Math.abs(figures.differentialGain) / ((gmS * 6200 * roOhm) / (6200 + roOhm)) - 1)).toBeLessThan(0.02);
  });

  test('[SS] resistor tail: Acm ≈ −RC/(2·Rout), within 5 %', async () => {
    const figures = await spiceFigures(designFor('resistor'));
    expect(Math.abs(figures.commonModeGain / (-6200 / (2 * 5100)) - 1)).toBeLessThan(0.05);
  });

  test('[DOMAIN tail capacitance] resistor tail: the CMRR corner is near 1/(2π·Rout·Ct), within 10 %', async () => {
    const figures = await spiceFigures(designFor('resistor', { tailCapacitanceF: 10e-12 }));
    expect(Math.abs(figures.cmrrCornerHz! / (1 / (2 * Math.PI * 5100 * 10e-12)) - 1)).toBeLessThan(0.1);
  });

  test('a matched pair has no differential common-mode gain (differential CMRR null)', async () => {
    const figures = await spiceFigures(designFor('wilson'));
    expect(figures.differentialCommonModeGain).toBe(0);
    expect(figures.cmrrDb.differential).toBeNull();
    expect(figures.cmrrCornerHz).toBeNull();
  });
});
