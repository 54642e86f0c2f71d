/**
 * Input-referred noise of the stage (ENGINE-CONTRACT.md, version 2: `ac[].inputNoiseVPerRtHz`),
 * as ngspice's `.noise v(c1,c2) VD` computes it [SPICE] ngspice noisean.c, nevalsrc.c: every
 * noise source is a current between two nodes of the small-signal circuit; its power reaches the
 * output v(c1) − v(c2) through |transfer|², the powers add (the sources are uncorrelated), and the
 * input-referred density is the output density over |differential gain|², square-rooted.
 *
 * The transfers come from one solve of the adjoint (transposed) system at each frequency: with
 * (G + jωC)·x = r the node equations and wᵀx the output, z solving (G + jωC)ᵀ·z = w gives
 * wᵀx = zᵀr, so a unit current into node b out of node a reaches the output as z_b − z_a. One
 * factorisation serves every source.
 *
 * The sources, as ngspice's models place them:
 * - each transistor [SPICE] ngspice bjtnoise.c: collector shot noise 2q·|IC| between the internal
 *   collector and the internal emitter; base shot noise 2q·|IB| and flicker noise KF·|IB|^AF/f
 *   between the internal base and the internal emitter (IC, IB the device's own DC currents, which
 *   the area already scales; the flicker term is not divided by the area); thermal noise of RC/A,
 *   RB/A, RE/A across each (A the area), at the circuit temperature;
 * - each resistor of the circuit (loads, source resistors, emitter and tail resistors) [SPICE]
 *   ngspice resnoise.c: thermal noise 4kT/R at the circuit temperature.
 * The drive sources are noiseless, and so are capacitors and the GMIN ngspice hangs on each
 * junction (the substrate GMIN included).
 */
import { COLLECTOR_NODES } from './circuit';
import { solveComplex, type ComplexVector } from './complex-solve';
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, ZERO_CELSIUS_K } from './constants';
import type { DeviceModel } from './device';
import type { NodeRef } from './node-system';
import type { OperatingPoint } from './operating-point';
import { capacitanceStamp, magnitude, stageTransfersAt, stampJacobian, type SmallSignalStage } from './small-signal';
import { zeros } from './linear-solve';

/** The smallest current ngspice raises to a power for the flicker term, A (its N_MINLOG) [SPICE] ngspice noisedef.h. */
const SMALLEST_FLICKER_CURRENT_A = 1e-38;

/** What makes a noise source's current. */
export type NoiseKind = 'thermal' | 'collector-shot' | 'base-shot' | 'flicker';

/** One noise current between nodes a and b (its direction does not matter: only its power counts). */
export interface NoiseSource {
  /** The element it belongs to: a resistor ("RC1"), a transistor's ohmic resistance ("Q1.RB") or a transistor ("Q1"). */
  element: string;
  kind: NoiseKind;
  a: NodeRef;
  b: NodeRef;
  /** Its current's power density, A²/Hz; for flicker noise the density at 1 Hz (it falls as 1/f). */
  densityA2PerHz: number;
}

/** What the noise analysis of a solved stage needs at every frequency. */
export interface StageNoise {
  n: number;
  /** G and C of the small-signal node equations, row-major (C null when nothing stores charge). */
  conductance: number[];
  capacitance: number[] | null;
  /** The output v(c1) − v(c2) as weights on free nodes. */
  outputNodes: NodeRef[];
  outputWeights: number[];
  sources: NoiseSource[];
}

/** A source's current power density at a frequency, A²/Hz. */
export function sourceDensityA2PerHz(source: NoiseSource, frequencyHz: number): number {
  return source.kind === 'flicker' ? source.densityA2PerHz / frequencyHz : source.densityA2PerHz;
}

/**
 * Every noise source of a solved stage at its operating point (`model`: the stage's device at
 * `temperatureC`, whose card gives KF and AF; a transistor's own model where it has one).
 */
export function noiseSources(op: OperatingPoint, model: DeviceModel, temperatureC: number): NoiseSource[] {
  const ic = op.circuit;
  const fourKT = 4 * BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K);
  const twoQ = 2 * ELEMENTARY_CHARGE_C;
  const sources: NoiseSource[] = [];
  // resistors of the circuit and each transistor's RB/A, RC/A, RE/A: 4kT·G
  for (const r of ic.resistors) {
    if (r.noiseless) continue;
    sources.push({ element: r.name, kind: 'thermal', a: r.a, b: r.b, densityA2PerHz: fourKT * r.conductanceS });
  }
  ic.transistors.forEach((q, k) => {
    const ev = op.transistors[k];
    const { KF, AF } = (q.model ?? model).parameters;
    sources.push({ element: q.name, kind: 'collector-shot', a: q.ci, b: q.ei, densityA2PerHz: twoQ * Math.abs(ev.icA) });
    sources.push({ element: q.name, kind: 'base-shot', a: q.bi, b: q.ei, densityA2PerHz: twoQ * Math.abs(ev.ibA) });
    if (KF !== 0) {
      const baseA = Math.max(Math.abs(ev.ibA), SMALLEST_FLICKER_CURRENT_A);
      sources.push({ element: q.name, kind: 'flicker', a: q.bi, b: q.ei, densityA2PerHz: KF * Math.exp(AF * Math.log(baseA)) });
    }
  });
  return sources;
}

/** Builds the noise analysis of a solved stage: its G and C at the operating point, its output and its sources. */
export function stageNoise(op: OperatingPoint, model: DeviceModel, temperatureC: number): StageNoise {
  const ic = op.circuit;
  const g = stampJacobian(op, false);
  const c = capacitanceStamp(op, model.parameters, temperatureC);
  return {
    n: g.n,
    conductance: g.matrix,
    capacitance: c ? c.matrix : null,
    outputNodes: COLLECTOR_NODES.map((name) => ic.nodeRef(name)),
    outputWeights: [1, -1],
    sources: noiseSources(op, model, temperatureC),
  };
}

/**
 * The adjoint solution at a frequency (Hz): z with (G + jωC)ᵀ·z = w, w the output's weights, so
 * z_k is the output's response to a unit current injected into free node k.
 */
export function outputAdjointAt(noise: StageNoise, frequencyHz: number): ComplexVector {
  const { n, conductance, capacitance } = noise;
  const omega = 2 * Math.PI * frequencyHz;
  const aRe = zeros(n * n);
  const aIm = zeros(n * n);
  for (let row = 0; row < n; row += 1) {
    for (let col = 0; col < n; col += 1) {
      aRe[col * n + row] = conductance[row * n + col];
      if (capacitance) aIm[col * n + row] = omega * capacitance[row * n + col];
    }
  }
  const w: ComplexVector = { re: zeros(n), im: zeros(n) };
  noise.outputNodes.forEach((node, i) => {
    w.re[node] += noise.outputWeights[i];
  });
  return solveComplex(aRe, aIm, n, [w])[0];
}

/** |z_b − z_a|²: the power transfer of a current from node a into node b (a fixed node is AC ground). */
function powerTransfer(z: ComplexVector, a: NodeRef, b: NodeRef): number {
  const re = (b >= 0 ? z.re[b] : 0) - (a >= 0 ? z.re[a] : 0);
  const im = (b >= 0 ? z.im[b] : 0) - (a >= 0 ? z.im[a] : 0);
  return re * re + im * im;
}

/** Each source's output noise density at a frequency (Hz), V²/Hz at v(c1) − v(c2), in the order of `noise.sources`. */
export function outputNoiseContributions(noise: StageNoise, frequencyHz: number): number[] {
  const z = outputAdjointAt(noise, frequencyHz);
  return noise.sources.map((s) => powerTransfer(z, s.a, s.b) * sourceDensityA2PerHz(s, frequencyHz));
}

/**
 * The input-referred noise density at a frequency (Hz), V/√Hz: the output density over the
 * differential gain's |Ad(f)|² (the gain from the differential drive, small-signal.ts), square
 * rooted. Null where the stage has no differential gain to refer to.
 */
export function inputNoiseVPerRtHz(noise: StageNoise, stage: SmallSignalStage, frequencyHz: number): number | null {
  const gain = magnitude(stageTransfersAt(stage, frequencyHz).differentialGain);
  if (!(gain > 0)) return null;
  const output = outputNoiseContributions(noise, frequencyHz).reduce((sum, x) => sum + x, 0);
  return Math.sqrt(output) / gain;
}
