/**
 * The stage's noise analysis (shared/engine/noise.ts) held to facts that need no noise figure of
 * the engine:
 * - the adjoint: z from (G + jωC)ᵀ·z = w gives, for a unit current injected between two nodes,
 *   the output a direct solve of (G + jωC)·x = r gives, and, read against the drive's columns,
 *   the differential gain the stage's reduced frequency model gives (two independent routes);
 * - Thevenin: the thermal noise current 4kT/RS across a source resistor is a voltage 4kT·RS in
 *   series with it, i.e. at the drive; a matched pair turns either drive alone into the
 *   differential gain (its differential common-mode gain is zero), so each source resistor adds
 *   exactly 4kT·RS to the input-referred power at every frequency and temperature [NG] (ngspice
 *   resnoise.c: 4kT·G at the circuit temperature);
 * - flicker noise KF·IB^AF/f: with nothing storing charge, the excess over the white density
 *   falls exactly as 1/f and is proportional to KF [NG] (ngspice bjtnoise.c);
 * - a stage that stores no charge has one white density at every frequency (KF = 0), and a load
 *   capacitance alone shapes the collectors' noise exactly as it shapes the gain (no Early
 *   effect: the collectors are driven by current sources), so the input-referred density is the
 *   same far above the bandwidth as below it.
 * Every design is invented; each test solves its own.
 */
import { describe, expect, test } from 'vitest';
import { analyze, solveCircuit, type SolvedCircuit } from '#shared/engine/analyze';
import { solveComplex, type ComplexVector } from '#shared/engine/complex-solve';
import { BOLTZMANN_J_PER_K, ZERO_CELSIUS_K } from '#shared/engine/constants';
import { inputNoiseVPerRtHz, outputAdjointAt, outputNoiseContributions, stageNoise, type StageNoise } from '#shared/engine/noise';
import { capacitanceStamp, magnitude, stageTransfersAt, stampJacobian } from '#shared/engine/small-signal';
import type { BjtModelCard } from '#shared/engine/bjt-parameters';
import type { Design } from '#shared/engine/types';
import { stageCircuit } from '#shared/engine/circuit';

/** An invented card with ohmic resistances, flicker noise and charge. */
const CARD: BjtModelCard = { IS: 2e-14, BF: 140, VAF: 70, RB: 150, RE: 1, RC: 12, KF: 4e-16, AF: 1.1, CJE: 8e-12, CJC: 3e-12, CJS: 1e-12, TF: 0.5e-9, TR: 40e-9 };

function design(extra: Partial<Design> = {}): Design {
  return {
    device: { family: 'npn', beta: 150, earlyVoltageV: 80, saturationCurrentA: 1e-14 },
    supply: { positiveV: 12, negativeV: -12 },
    collectorResistanceOhm: 10000,
    tail: { topology: 'simple-mirror', referenceResistanceOhm: 22000 },
    ...extra,
  } as Design;
}

const withCard = (extra: Partial<Design> = {}): Design => design({ device: { family: 'npn', model: CARD } as Design['device'], ...extra });

function noiseOf(solved: SolvedCircuit): StageNoise {
  return stageNoise(solved.op, solved.model, solved.design.temperatureC ?? 27);
}

/** The output v(c1) − v(c2) of a direct solve of (G + jωC)·x = r, r a unit current into b out of a. */
function directTransfer(noise: StageNoise, frequencyHz: number, a: number, b: number): { re: number; im: number } {
  const { n } = noise;
  const omega = 2 * Math.PI * frequencyHz;
  const aRe = noise.conductance.slice();
  const aIm = noise.capacitance ? noise.capacitance.map((c) => omega * c) : new Array<number>(n * n).fill(0);
  const r: ComplexVector = { re: new Array<number>(n).fill(0), im: new Array<number>(n).fill(0) };
  if (b >= 0) r.re[b] += 1;
  if (a >= 0) r.re[a] -= 1;
  const [x] = solveComplex(aRe, aIm, n, [r]);
  const [c1, c2] = noise.outputNodes;
  return { re: x.re[c1] - x.re[c2], im: x.im[c1] - x.im[c2] };
}

const at = (z: ComplexVector, node: number) => (node >= 0 ? { re: z.re[node], im: z.im[node] } : { re: 0, im: 0 });

describe('the adjoint solve', () => {
  test.each([
    ['a card with RB, RE, RC and charge, source resistance, 3 MHz', withCard({ sourceResistanceOhm: 1000, loadCapacitanceF: 4e-12, collectorMismatch: 0.02 }), 3e6],
    ['a three-parameter device, tail capacitance, 200 kHz', design({ tailCapacitanceF: 20e-12, loadCapacitanceF: 10e-12 }), 2e5],
  ])('%s: every source\u2019s transfer equals a direct solve with that current injected', (_title, d, frequencyHz) => {
    const noise = noiseOf(solveCircuit(d));
    const z = outputAdjointAt(noise, frequencyHz);
    expect(noise.sources.length).toBeGreaterThan(10);
    const direct = noise.sources.map((s) => directTransfer(noise, frequencyHz, s.a, s.b));
    // a source a matched pair keeps off the differential output (the reference branch) has a transfer of rounding size: compared on the largest's scale
    const largest = Math.max(...direct.map(magnitude));
    noise.sources.forEach((s, k) => {
      const adjoint = { re: at(z, s.b).re - at(z, s.a).re, im: at(z, s.b).im - at(z, s.a).im };
      const scale = Math.max(magnitude(direct[k]), 1e-9 * largest);
      expect(Math.abs(adjoint.re - direct[k].re) / scale, `${s.element} ${s.kind}`).toBeLessThan(1e-6);
      expect(Math.abs(adjoint.im - direct[k].im) / scale, `${s.element} ${s.kind}`).toBeLessThan(1e-6);
    });
  });

  test.each([
    ['drive at the bases (the device\u2019s capacitances on the drive nodes)', withCard({ loadCapacitanceF: 2e-12, collectorMismatch: 0.01 })],
    ['drive behind source resistors', withCard({ sourceResistanceOhm: 2200 })],
  ])('%s: the adjoint read against the drive gives the stage\u2019s differential gain at every frequency', (_title, d) => {
    const solved = solveCircuit(d);
    const noise = noiseOf(solved);
    const ic = solved.op.circuit;
    const g = stampJacobian(solved.op, false);
    const c = capacitanceStamp(solved.op, solved.model.parameters, 27)!;
    const driveNodes = stageCircuit(d).driveNodes;
    const columns = driveNodes.map((name) => -ic.nodeRef(name) - 1);
    for (const frequencyHz of [1, 1e5, 1e7, 1e9]) {
      const omega = 2 * Math.PI * frequencyHz;
      const z = outputAdjointAt(noise, frequencyHz);
      // r = −(G_drive + jωC_drive)·d, d = (+½, −½); the output is zᵀr (a transpose, no conjugate)
      let re = 0;
      let im = 0;
      for (let row = 0; row < g.n; row += 1) {
        const [k1, k2] = columns;
        const rRe = -(g.fixedColumns[row * g.nFixed + k1] * 0.5 - g.fixedColumns[row * g.nFixed + k2] * 0.5);
        const rIm = -omega * (c.fixedColumns[row * c.nFixed + k1] * 0.5 - c.fixedColumns[row * c.nFixed + k2] * 0.5);
        re += z.re[row] * rRe - z.im[row] * rIm;
        im += z.re[row] * rIm + z.im[row] * rRe;
      }
      const expected = stageTransfersAt(solved.stage, frequencyHz).differentialGain;
      const scale = magnitude(expected);
      expect(Math.abs(re - expected.re) / scale, `real part at ${frequencyHz} Hz`).toBeLessThan(1e-7);
      expect(Math.abs(im - expected.im) / scale, `imaginary part at ${frequencyHz} Hz`).toBeLessThan(1e-7);
    }
  });
});

describe('source resistors: 4kT·RS each at the input of a matched pair', () => {
  test.each([-40, 27, 125])('%s °C, at 10 Hz, 1 MHz and 100 MHz', (temperatureC) => {
    const sourceOhm = 1500;
    const solved = solveCircuit(withCard({ sourceResistanceOhm: sourceOhm, loadCapacitanceF: 3e-12, temperatureC }));
    const noise = noiseOf(solved);
    const fourKTR = 4 * BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K) * sourceOhm;
    for (const frequencyHz of [10, 1e6, 1e8]) {
      const gain = magnitude(stageTransfersAt(solved.stage, frequencyHz).differentialGain);
      const contributions = outputNoiseContributions(noise, frequencyHz);
      for (const name of ['RS1', 'RS2']) {
        const k = noise.sources.findIndex((s) => s.element === name);
        expect(k, name).toBeGreaterThanOrEqual(0);
        const inputReferred = contributions[k] / gain ** 2;
        expect(Math.abs(inputReferred / fourKTR - 1), `${name} at ${frequencyHz} Hz`).toBeLessThan(1e-6);
      }
    }
  });
});

describe('flicker noise', () => {
  const chargeless = (kf: number): Design => design({ device: { family: 'npn', model: { IS: 1e-14, BF: 150, VAF: 80, RB: 200, KF: kf, AF: 1.3 } } as Design['device'], sourceResistanceOhm: 600 });
  const densitySquared = (d: Design, frequencyHz: number): number => analyze({ ...d, frequenciesHz: [frequencyHz] }).ac[0].inputNoiseVPerRtHz! ** 2;

  test('the excess over the white density falls as 1/f, and doubles with KF', () => {
    const d = chargeless(1e-15);
    const white = densitySquared(chargeless(0), 1);
    const excess = [0.1, 1, 10, 1000].map((f) => (densitySquared(d, f) - white) * f);
    expect(excess[0]).toBeGreaterThan(white);
    for (const e of excess) expect(Math.abs(e / excess[0] - 1)).toBeLessThan(1e-6);
    const doubled = (densitySquared(chargeless(2e-15), 1) - white) * 1;
    expect(Math.abs(doubled / excess[0] - 2)).toBeLessThan(1e-6);
  });

  test('without KF a stage that stores no charge has one density at every frequency', () => {
    const d = chargeless(0);
    const solved = solveCircuit(d);
    expect(noiseOf(solved).capacitance).toBeNull();
    const densities = [1e-2, 1, 1e4, 1e9].map((f) => densitySquared(d, f));
    for (const x of densities) expect(Math.abs(x / densities[0] - 1)).toBeLessThan(1e-9);
  });
});

describe('a load capacitance shapes noise and gain alike', () => {
  test('no Early effect, the loads the only charge: the same input density far above the bandwidth as below it', () => {
    const d = design({ device: { family: 'npn', beta: 150, saturationCurrentA: 1e-14 }, loadCapacitanceF: 20e-12, sourceResistanceOhm: 1000 });
    const { differentialBandwidthHz } = analyze(d);
    expect(differentialBandwidthHz).not.toBeNull();
    const solved = solveCircuit(d);
    const noise = noiseOf(solved);
    const low = inputNoiseVPerRtHz(noise, solved.stage, 1)!;
    const high = inputNoiseVPerRtHz(noise, solved.stage, 100 * differentialBandwidthHz!)!;
    expect(magnitude(stageTransfersAt(solved.stage, 100 * differentialBandwidthHz!).differentialGain)).toBeLessThan(0.02 * Math.abs(analyze(d).differentialGain));
    expect(Math.abs(high / low - 1)).toBeLessThan(1e-6);
  });
});

describe('analyze', () => {
  test('every ac entry carries a density, none without frequencies', () => {
    const d = withCard({ sourceResistanceOhm: 470 });
    const result = analyze({ ...d, frequenciesHz: [10, 1e3, 1e6] });
    expect(result.ac.map((e) => e.inputNoiseVPerRtHz! > 0)).toEqual([true, true, true]);
    expect(analyze(d).ac).toEqual([]);
  });
});
