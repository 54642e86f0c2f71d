/**
 * The trade-off figures of a stage measured by simulation (ENGINE-CONTRACT.md, version 2 "New
 * outputs"), each the way the contract's "SPICE measure" column says, on the netlist the product
 * writes: input bias and offset currents from `.op`, the offset voltage and linear input range
 * from `.dc` sweeps of the one differential source, supply rejection from `.ac` on each rail,
 * input resistance from the differential `.ac` drive current, noise from `.noise`, slew rate
 * from `.tran`. Every function takes a `SpiceRunner`, so verification jobs and reference tests
 * read ngspice the same way; each takes the library card's SPICE-only parameters (`card`) too, so a
 * verification simulates the whole card as its other analyses do.
 */
import { COLLECTOR_NODES, INPUT_NODES, RAIL_NODES, pairIsMatched, stagePolarity } from '#shared/engine/circuit';
import { INPUT_SOURCES, spiceNetlist, type NetlistCardSettings, type NetlistOptions } from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';
import { withoutMismatch } from '#shared/engine/input-transfer';
import {
  LOW_FREQUENCY_HZ,
  PLOT_NAMES,
  REFERENCE_RELATIVE_TOLERANCE,
  complexMagnitude,
  singleFrequencySweep,
  spiceAc,
  type Complex,
  type SpiceRunner,
} from './spice-analyses';

/** A real-valued sweep (`.dc`, `.noise`, `.tran`): the swept axis and every other vector, by lower-case name. */
export interface SpiceSweep {
  netlist: string;
  axis: number[];
  vectors: Record<string, number[]>;
}

/** Runs a real-valued analysis (reference RELTOL) and returns its axis (first vector) and the others by name. */
export async function spiceSweep(
  run: SpiceRunner,
  design: Design,
  options: Extract<NetlistOptions, { analysis: 'dc-differential' | 'noise' | 'tran-step' }>,
  card: NetlistCardSettings = {},
): Promise<SpiceSweep> {
  const netlist = spiceNetlist(design, { relativeTolerance: REFERENCE_RELATIVE_TOLERANCE, ...options, ...card });
  const result = await run(netlist, PLOT_NAMES[options.analysis]);
  if (result.dataType !== 'real') throw new Error(`ngspice ${options.analysis} returned complex data`);
  const [axis, ...rest] = result.data;
  const vectors: Record<string, number[]> = {};
  for (const d of rest) vectors[d.name.toLowerCase()] = d.values;
  return { netlist, axis: axis.values, vectors };
}

/** v(c1) − v(c2) along a sweep. */
function outputOf(sweep: SpiceSweep): number[] {
  const [c1, c2] = COLLECTOR_NODES.map((node) => sweep.vectors[`v(${node})`]);
  return c1.map((v, k) => v - c2[k]);
}

/**
 * The DC currents of in1 and in2 (from the drive), A, at a differential DC input (V): into the
 * inputs for an NPN pair, out of them for a PNP pair (the direction its transistors conduct, as
 * analyze reports them).
 */
export async function spiceInputCurrentsA(run: SpiceRunner, design: Design, differentialInputV = 0, card: NetlistCardSettings = {}): Promise<[number, number]> {
  const polarity = stagePolarity(design);
  const netlist = spiceNetlist(design, { analysis: 'op', differentialInputV, relativeTolerance: REFERENCE_RELATIVE_TOLERANCE, ...card });
  const result = await run(netlist, PLOT_NAMES.op);
  const current = (source: string): number => {
    const vector = result.data.find((d) => d.name.toLowerCase() === `i(${source.toLowerCase()})`);
    if (!vector) throw new Error(`ngspice .op has no current of ${source}`);
    // i(source) flows into its + terminal: the current it sends into the circuit is the negative
    return -polarity * (vector.values[0] as number);
  };
  return [current(INPUT_SOURCES[0]), current(INPUT_SOURCES[1])];
}

/** Sweep points of a first search for a zero or a crossing, and how much finer each refinement is. */
const SEARCH_POINTS = 200;
const REFINE_FACTOR = 100;

/** The first k ≥ 1 where f changes sign between k − 1 and k (a zero at k counts), or −1. */
function firstSignChange(values: number[]): number {
  for (let k = 1; k < values.length; k += 1) if (values[k] === 0 || Math.sign(values[k]) !== Math.sign(values[k - 1])) return k;
  return -1;
}

/** Linear interpolation of the zero of f between two sweep points. */
function interpolatedZero(x0: number, f0: number, x1: number, f1: number): number {
  return f1 === f0 ? x1 : x0 + (f0 / (f0 - f1)) * (x1 - x0);
}

/**
 * The contract's input offset voltage: the differential DC input at the drive that makes
 * v(c1) = v(c2), the interpolated zero of v(c1,c2) in a `.dc` sweep of VD. A sweep over ±0.1 V
 * (then ±1 V, ±10 V) finds the crossing; two sweeps each a hundred times finer around it refine it.
 */
export async function spiceOffsetVoltageV(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<number> {
  let low = Number.NaN;
  let high = Number.NaN;
  for (const spanV of [0.1, 1, 10]) {
    const sweep = await spiceSweep(run, design, { analysis: 'dc-differential', startV: -spanV, stopV: spanV, stepV: (2 * spanV) / SEARCH_POINTS }, card);
    const out = outputOf(sweep);
    const k = firstSignChange(out);
    if (k > 0) {
      low = sweep.axis[k - 1];
      high = sweep.axis[k];
      break;
    }
  }
  if (!Number.isFinite(low)) throw new Error('v(c1) − v(c2) does not cross zero within ±10 V of differential input');
  let zeroV = (low + high) / 2;
  for (let pass = 0; pass < 2; pass += 1) {
    const stepV = (high - low) / REFINE_FACTOR;
    const sweep = await spiceSweep(run, design, { analysis: 'dc-differential', startV: low, stopV: high + stepV / 2, stepV }, card);
    const out = outputOf(sweep);
    const k = firstSignChange(out);
    if (k < 0) break;
    zeroV = interpolatedZero(sweep.axis[k - 1], out[k - 1], sweep.axis[k], out[k]);
    low = sweep.axis[k - 1];
    high = sweep.axis[k];
  }
  return zeroV;
}

/** Half-width of the one sweep that finds a Monte Carlo run's offset, V: several σ of any pair's offset. */
export const OFFSET_WINDOW_V = 0.02;

/**
 * One circuit's input offset voltage from a single `.dc` sweep of VD over ±20 mV in 0.2 mV steps,
 * the zero of v(c1,c2) interpolated linearly between the two points around it (the Monte Carlo's
 * per-run measure: one analysis instead of the three or more of the search above). Over 0.2 mV
 * the transfer is straight to a few parts in 10⁴ (its curvature scale is 2·VT ≈ 52 mV), so the
 * interpolation stays within a microvolt of the refined zero (tests/reference). An offset outside
 * the window falls back to the full search.
 */
export async function spiceOffsetInWindowV(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<number> {
  const sweep = await spiceSweep(run, design, { analysis: 'dc-differential', startV: -OFFSET_WINDOW_V, stopV: OFFSET_WINDOW_V * (1 + 0.5 / SEARCH_POINTS), stepV: (2 * OFFSET_WINDOW_V) / SEARCH_POINTS }, card);
  const out = outputOf(sweep);
  const k = firstSignChange(out);
  if (k < 0) return spiceOffsetVoltageV(run, design, card);
  return interpolatedZero(sweep.axis[k - 1], out[k - 1], sweep.axis[k], out[k]);
}

/** Input bias, offset current and offset voltage as the contract measures them. */
export interface SpiceInputFigures {
  inputBiasCurrentA: number;
  inputOffsetCurrentA: number;
  inputOffsetVoltageV: number;
}

/** Bias current (mean of the two at zero input), offset voltage, and offset current (in1 − in2 at the offset input). */
export async function spiceInputFigures(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<SpiceInputFigures> {
  const [bias1, bias2] = await spiceInputCurrentsA(run, design, 0, card);
  const inputOffsetVoltageV = await spiceOffsetVoltageV(run, design, card);
  const [at1, at2] = await spiceInputCurrentsA(run, design, inputOffsetVoltageV, card);
  return { inputBiasCurrentA: (bias1 + bias2) / 2, inputOffsetVoltageV, inputOffsetCurrentA: at1 - at2 };
}

/** The contract's drift: (offset at T + 1 °C − offset at T − 1 °C) / 2, V/°C. */
export async function spiceOffsetDriftVPerC(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<number> {
  const temperatureC = design.temperatureC ?? 27;
  const above = await spiceOffsetVoltageV(run, { ...design, temperatureC: temperatureC + 1 }, card);
  const below = await spiceOffsetVoltageV(run, { ...design, temperatureC: temperatureC - 1 }, card);
  return (above - below) / 2;
}

/** Thrown when the stage stays within 1 % of its gain line to ±20 V of differential input: no linear range to read. */
export class StaysLinearError extends Error {}

/** How far v(c1,c2) may depart from differentialGain × the input within the linear range: 1 %. */
export const LINEAR_RANGE_ERROR = 0.01;

/**
 * The contract's linear input range: on the design without mismatches, the largest differential
 * DC amplitude at which v(c1,c2) stays within 1 % of differentialGain × input, the smaller of the
 * two signs. The gain is the 1 Hz differential `.ac` gain of that design; `.dc` sweeps of VD
 * from 0 outwards (0.2 V, then 2 V, then 20 V) find the first point past 1 %, and a sweep a
 * hundred times finer between the two points around it is interpolated.
 */
export async function spiceLinearInputRangeV(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<number> {
  const symmetric = withoutMismatch(design);
  const ac = await spiceAc(run, symmetric, { analysis: 'ac-differential', ...singleFrequencySweep(LOW_FREQUENCY_HZ), ...card });
  const gain = ac.nodeVoltages.c1[0].re - ac.nodeVoltages.c2[0].re;
  const excess = (sweep: SpiceSweep): number[] =>
    outputOf(sweep).map((out, k) => (sweep.axis[k] === 0 ? -LINEAR_RANGE_ERROR : Math.abs(out - gain * sweep.axis[k]) / Math.abs(gain * sweep.axis[k]) - LINEAR_RANGE_ERROR));
  const rangeFor = async (sign: 1 | -1): Promise<number> => {
    for (const spanV of [0.2, 2, 20]) {
      const stepV = spanV / SEARCH_POINTS;
      const sweep = await spiceSweep(run, symmetric, sign > 0 ? { analysis: 'dc-differential', startV: stepV, stopV: spanV, stepV } : { analysis: 'dc-differential', startV: -stepV, stopV: -spanV, stepV: -stepV }, card);
      const e = excess(sweep);
      // a point past 1 % already at the first step: look between 0 and it
      const k = e[0] > 0 ? 0 : firstSignChange(e);
      if (k < 0) continue;
      const from = k === 0 ? 0 : sweep.axis[k - 1];
      const to = sweep.axis[k];
      const fine = (to - from) / REFINE_FACTOR;
      const refined = await spiceSweep(run, symmetric, { analysis: 'dc-differential', startV: from === 0 ? fine : from, stopV: to + fine / 2, stepV: Math.abs(fine) * Math.sign(to - from) }, card);
      const r = excess(refined);
      const j = r[0] > 0 ? 0 : firstSignChange(r);
      if (j <= 0) return Math.abs(refined.axis[Math.max(j, 0)]);
      return Math.abs(interpolatedZero(refined.axis[j - 1], r[j - 1], refined.axis[j], r[j]));
    }
    throw new StaysLinearError('the stage stays linear within 1 % to ±20 V of differential input');
  };
  return Math.min(await rangeFor(1), await rangeFor(-1));
}

/** Supply rejection from each rail, dB, single-ended (to c1) and differential (to c1 − c2); null where that gain is zero. */
export interface SpicePsrr {
  positive: { singleEnded: number; differential: number | null };
  negative: { singleEnded: number; differential: number | null };
}

/**
 * The contract's PSRR: 20·log10 of |differentialGain| (or |singleEndedGain|) over the gain from
 * the rail's AC source to v(c1,c2) (or v(c1)), all at 1 Hz. A matched pair (pairIsMatched) moves
 * both collectors alike: its differential rejection is null, as the engine reports it.
 */
export async function spicePsrrDb(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<SpicePsrr> {
  const sweep = { ...singleFrequencySweep(LOW_FREQUENCY_HZ), ...card };
  const drive = await spiceAc(run, design, { analysis: 'ac-differential', ...sweep });
  const ad = complexMagnitude(difference(drive.nodeVoltages.c1[0], drive.nodeVoltages.c2[0]));
  const ase = complexMagnitude(drive.nodeVoltages.c1[0]);
  const matched = pairIsMatched(design);
  const rejection = async (rail: keyof typeof RAIL_NODES) => {
    const ac = await spiceAc(run, design, { analysis: 'ac-rail', rail, ...sweep });
    const c1 = ac.nodeVoltages.c1[0];
    return {
      singleEnded: 20 * Math.log10(ase / complexMagnitude(c1)),
      differential: matched ? null : 20 * Math.log10(ad / complexMagnitude(difference(c1, ac.nodeVoltages.c2[0]))),
    };
  };
  return { positive: await rejection('positive'), negative: await rejection('negative') };
}

function difference(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/**
 * The contract's input resistance: v(in1) − v(in2) over the current the differential drive sends
 * into in1, at 1 Hz (the source resistors, between the drive and in1/in2, are outside it).
 */
export async function spiceInputResistanceOhm(run: SpiceRunner, design: Design, card: NetlistCardSettings = {}): Promise<number> {
  const ac = await spiceAc(run, design, { analysis: 'ac-differential', ...singleFrequencySweep(LOW_FREQUENCY_HZ), ...card });
  const [in1, in2] = INPUT_NODES.map((node) => ac.nodeVoltages[node][0]);
  // i(VIN1) flows into the source's + terminal; the drive's current into the circuit is its negative
  const current = ac.sourceCurrents[INPUT_SOURCES[0].toLowerCase()][0];
  return complexMagnitude(difference(in1, in2)) / complexMagnitude(current);
}

/**
 * The contract's input-referred noise density at each frequency, V/√Hz: ngspice's
 * `inoise_spectrum` of `.noise v(c1,c2) VD`, one run per frequency (its first point).
 */
export async function spiceInputNoiseVPerRtHz(run: SpiceRunner, design: Design, frequenciesHz: readonly number[], card: NetlistCardSettings = {}): Promise<number[]> {
  const densities: number[] = [];
  for (const frequencyHz of frequenciesHz) {
    const sweep = await spiceSweep(run, design, { analysis: 'noise', ...singleFrequencySweep(frequencyHz) }, card);
    densities.push(sweep.vectors.inoise_spectrum[0]);
  }
  return densities;
}

/** When the step starts, s: the drive holds −1 V until then, then rises in 1 ns. */
const STEP_DELAY_S = 1e-9;

/** A refinement that moves the largest difference quotient by less than this (relative) is the last. */
const SLEW_REFINED = 0.01;
/** Each refinement's step over the one before, and the refinements at most. */
const SLEW_REFINE_FACTOR = 4;
const SLEW_MAX_REFINEMENTS = 4;

/**
 * The contract's slew rate: the largest |d v(c1,c2)/dt| after VD steps from −1 V to +1 V in 1 ns.
 * A first `.tran` of `windowS` finds when the output settles (within 1 % of its final swing); the
 * next runs to twice that with a step (and largest internal step) of 1/200 of it, as the contract
 * asks at the least, and the largest difference quotient between its points is read. A stage that
 * follows the 1 ns edge itself peaks within a few picoseconds, which a step of 1/200 of the
 * settling time can straddle (the quotient then averages the peak away, by 30 % seen on stages
 * with little capacitance): the step is cut by four, within the contract's "at most", until the
 * figure moves by less than 1 %.
 */
export async function spiceSlewRateVPerS(run: SpiceRunner, design: Design, windowS: number, card: NetlistCardSettings = {}): Promise<number> {
  const settle = async (stopS: number, stepS: number) => {
    const sweep = await spiceSweep(run, design, { analysis: 'tran-step', fromV: -1, toV: 1, delayS: STEP_DELAY_S, stepS, stopS }, card);
    const out = outputOf(sweep);
    const final = out[out.length - 1];
    const swing = Math.abs(final - out[0]);
    let settledAt = sweep.axis[sweep.axis.length - 1];
    for (let k = out.length - 1; k >= 0 && Math.abs(out[k] - final) <= 0.01 * swing; k -= 1) settledAt = sweep.axis[k];
    return { sweep, out, settledAt };
  };
  const largestOf = ({ sweep, out }: { sweep: SpiceSweep; out: number[] }): number => {
    let largest = 0;
    for (let k = 1; k < out.length; k += 1) {
      const dt = sweep.axis[k] - sweep.axis[k - 1];
      if (dt > 0) largest = Math.max(largest, Math.abs(out[k] - out[k - 1]) / dt);
    }
    return largest;
  };
  const first = await settle(windowS, windowS / 400);
  const settlingS = Math.max(first.settledAt - STEP_DELAY_S, 1e-9);
  let stepS = settlingS / 200;
  let largest = largestOf(await settle(STEP_DELAY_S + 2 * settlingS, stepS));
  for (let refinement = 0; refinement < SLEW_MAX_REFINEMENTS; refinement += 1) {
    stepS /= SLEW_REFINE_FACTOR;
    const finer = largestOf(await settle(STEP_DELAY_S + 2 * settlingS, stepS));
    const moved = Math.abs(finer - largest) / finer;
    largest = finer;
    if (moved < SLEW_REFINED) break;
  }
  return largest;
}
