/**
 * Reading the stage's figures out of ngspice: a DC operating point, AC sweeps, and the contract's
 * figures measured the way a bench would, on the netlist the product writes (`spiceNetlist`).
 * Every function takes a `SpiceRunner` (the server's worker-thread engine, or the tests' in-process
 * one), so the same measurement code serves verification jobs and the reference tests.
 *
 * ngspice's output names are lower-case: node voltages `v(c1)`, source currents `i(vp)`, the
 * current flowing into the source's + terminal (so a rail delivering current reads negative).
 */
import type { ResultType } from 'eecircuit-engine';
import { RAIL_NODES, designStoresCharge, isTransistor, stageCircuit, stagePolarity, stageRails, type CircuitElement, type ResistorElement } from '#shared/engine/circuit';
import {
  INPUT_SOURCES,
  SUPPLY_SOURCES,
  TAIL_TEST_SOURCE,
  spiceNetlist,
  type AcSweep,
  type NetlistCardSettings,
  type NetlistOptions,
  type NetlistSolverSettings,
} from '#shared/engine/netlist';
import type { Design } from '#shared/engine/types';

/** Runs one netlist and returns ngspice's raw result; throws with ngspice's message when the run fails or returns another plot than `expectedPlot`. */
export type SpiceRunner = (netlist: string, expectedPlot?: string) => Promise<ResultType>;

export interface Complex {
  re: number;
  im: number;
}

/**
 * ngspice RELTOL for reference runs. With the default 1e-3 the Newton iteration stops while the
 * operating point, and so each transistor's small-signal conductances, can still be up to ~1 %
 * off (seen on mirror Rout); 1e-6 makes the reference's own numerical error negligible.
 */
export const REFERENCE_RELATIVE_TOLERANCE = 1e-6;
const REFERENCE_SOLVER: NetlistSolverSettings = { relativeTolerance: REFERENCE_RELATIVE_TOLERANCE };

/** Low frequency at which gains and Rout are read, Hz (no reactive element matters there). */
export const LOW_FREQUENCY_HZ = 1;
/** Corner sweep: 1 Hz to 10 GHz at 50 points per decade, interpolated in log-frequency. */
export const CORNER_SWEEP: AcSweep = { startHz: 1, stopHz: 1e10, pointsPerDecade: 50 };
/** |v(c1) − v(c2)| below this fraction of |v(c1)| in the common-mode run counts as zero (matched pair). */
export const MATCHED_PAIR_RATIO = 1e-9;
/** A low-frequency gain's imaginary part must stay below this fraction of its magnitude. */
export const MAX_IMAGINARY_FRACTION = 0.02;

/** The plot name ngspice gives each analysis's result. */
export const PLOT_NAMES: Record<NetlistOptions['analysis'], string> = {
  op: 'Operating Point',
  'ac-differential': 'AC Analysis',
  'ac-common-mode': 'AC Analysis',
  'ac-tail': 'AC Analysis',
  'ac-rail': 'AC Analysis',
  'dc-differential': 'DC transfer characteristic',
  noise: 'Noise Spectral Density Curves',
  'tran-step': 'Transient Analysis',
};

/** The plot name in a result's header. */
export function plotName(result: ResultType): string {
  return /^Plotname:\s*(.*)$/m.exec(result.header)?.[1]?.trim() ?? '';
}

/** A DC operating point: node voltages by node name, source currents (into the + terminal) by source name, lower-case. */
export interface SpiceOperatingPoint {
  netlist: string;
  nodeVoltagesV: Record<string, number>;
  sourceCurrentsA: Record<string, number>;
}

function splitVariables<T>(names: string[], values: T[]): { nodes: Record<string, T>; sources: Record<string, T> } {
  const nodes: Record<string, T> = {};
  const sources: Record<string, T> = {};
  names.forEach((name, i) => {
    const match = /^([vi])\((.+)\)$/.exec(name.toLowerCase());
    if (!match) return;
    (match[1] === 'v' ? nodes : sources)[match[2]] = values[i];
  });
  return { nodes, sources };
}

/** Runs `.op` on a design's netlist (reference RELTOL unless `solver` says otherwise). */
export async function spiceOperatingPoint(
  run: SpiceRunner,
  design: Design,
  solver: NetlistSolverSettings & NetlistCardSettings = REFERENCE_SOLVER,
): Promise<SpiceOperatingPoint> {
  const netlist = spiceNetlist(design, { analysis: 'op', ...solver });
  const result = await run(netlist, PLOT_NAMES.op);
  if (result.dataType !== 'real') throw new Error('ngspice .op returned complex data');
  const { nodes, sources } = splitVariables(
    result.data.map((d) => d.name),
    result.data.map((d) => d.values[0]),
  );
  return { netlist, nodeVoltagesV: { ...nodes, '0': 0 }, sourceCurrentsA: sources };
}

/** An AC sweep: frequencies, and per frequency the complex node voltages and source currents. */
export interface SpiceAc {
  netlist: string;
  frequenciesHz: number[];
  /** nodeVoltages[node][k]: v(node) at frequenciesHz[k]. */
  nodeVoltages: Record<string, Complex[]>;
  /** sourceCurrents[source][k]: i(source) at frequenciesHz[k], into the + terminal. */
  sourceCurrents: Record<string, Complex[]>;
}

export type AcOptions = Extract<NetlistOptions, { analysis: 'ac-differential' | 'ac-common-mode' | 'ac-tail' | 'ac-rail' }>;

/** Runs one AC analysis (differential, common-mode or tail drive) on a design's netlist (reference RELTOL unless `options` sets one). */
export async function spiceAc(run: SpiceRunner, design: Design, options: AcOptions): Promise<SpiceAc> {
  const netlist = spiceNetlist(design, { ...REFERENCE_SOLVER, ...options });
  const result = await run(netlist, PLOT_NAMES[options.analysis]);
  if (result.dataType !== 'complex') throw new Error('ngspice .ac returned real data');
  const toComplex = (values: { real: number; img: number }[]): Complex[] => values.map((z) => ({ re: z.real, im: z.img }));
  const frequency = result.data.find((d) => d.name.toLowerCase() === 'frequency');
  if (!frequency) throw new Error('ngspice .ac result has no frequency vector');
  const { nodes, sources } = splitVariables(
    result.data.map((d) => d.name),
    result.data.map((d) => toComplex(d.values)),
  );
  return { netlist, frequenciesHz: frequency.values.map((z) => z.real), nodeVoltages: nodes, sourceCurrents: sources };
}

export function complexMagnitude(z: Complex): number {
  return Math.hypot(z.re, z.im);
}

function subtract(a: Complex, b: Complex): Complex {
  return { re: a.re - b.re, im: a.im - b.im };
}

/** The signed low-frequency value of a transfer: its real part, after checking it is (nearly) real. */
function lowFrequencyReal(z: Complex, what: string): number {
  if (Math.abs(z.im) > MAX_IMAGINARY_FRACTION * complexMagnitude(z)) {
    throw new Error(`${what} is not real at low frequency: ${z.re} + j${z.im}`);
  }
  return z.re;
}

/** Bias of one transistor from the simulated node voltages. */
export interface SpiceTransistorBias {
  name: string;
  vbeV: number;
  vceV: number;
  vcbV: number;
}

/** The contract's figures, measured by simulation on the same netlist the product writes. */
export interface SpiceFigures {
  tailCurrentA: number;
  collectorCurrentA: number;
  collectorVoltageV: number;
  collector2VoltageV: number;
  tailNodeVoltageV: number;
  differentialGain: number;
  singleEndedGain: number;
  commonModeGain: number;
  differentialCommonModeGain: number;
  cmrrDb: { singleEnded: number; differential: number | null };
  tailOutputResistanceOhm: number;
  cmrrCornerHz: number | null;
  powerW: number;
  /** Reference-branch current (through RREF), 0 for a resistor tail, A. */
  referenceCurrentA: number;
  transistors: SpiceTransistorBias[];
}

function resistanceOf(elements: CircuitElement[], name: string): number {
  const element = elements.find((e) => e.name === name);
  if (!element || element.kind !== 'resistor') throw new Error(`no resistor ${name} in the stage circuit`);
  return element.resistanceOhm;
}

/**
 * First frequency where 20·log10|ratio| has fallen `dropDb` below its first value, interpolated
 * linearly in log10(f) between the two sweep points around it; null if never reached.
 */
export function dropFrequencyHz(frequenciesHz: number[], ratioDb: number[], dropDb: number): number | null {
  const targetDb = ratioDb[0] - dropDb;
  for (let k = 1; k < ratioDb.length; k += 1) {
    if (ratioDb[k] <= targetDb) {
      const fraction = (ratioDb[k - 1] - targetDb) / (ratioDb[k - 1] - ratioDb[k]);
      const logF = Math.log10(frequenciesHz[k - 1]) + fraction * (Math.log10(frequenciesHz[k]) - Math.log10(frequenciesHz[k - 1]));
      return 10 ** logF;
    }
  }
  return null;
}

/** The DC figures read from an operating point (see `spiceFigures` for how each is measured). */
export interface SpiceDcFigures {
  tailCurrentA: number;
  collectorCurrentA: number;
  collector2CurrentA: number;
  referenceCurrentA: number;
  powerW: number;
}

/**
 * DC figures from a simulated operating point: collector currents from the load drops, the tail
 * current by KCL at the pair (plus the base currents the input sources deliver), the reference
 * branch through RREF, and the power the rails deliver.
 */
export function dcFigures(design: Design, op: SpiceOperatingPoint): SpiceDcFigures {
  const circuit = stageCircuit(design);
  const { positiveV, negativeV } = design.supply;
  const v = op.nodeVoltagesV;
  const i = op.sourceCurrentsA;
  const [vin1, vin2] = INPUT_SOURCES.map((name) => name.toLowerCase());
  // In the direction the stage's transistors conduct: an NPN stage's loads and reference resistor
  // hang from the positive rail, a PNP stage's from the negative one, carrying current into it
  const polarity = stagePolarity(design);
  const loadRail = stageRails(design).load;
  const loadRailV = loadRail === RAIL_NODES.positive ? positiveV : negativeV;
  const collectorCurrentA = (polarity * (loadRailV - v.c1)) / resistanceOf(circuit.elements, 'RC1');
  const collector2CurrentA = (polarity * (loadRailV - v.c2)) / resistanceOf(circuit.elements, 'RC2');
  const reference = circuit.elements.find((e): e is ResistorElement => e.kind === 'resistor' && e.name === 'RREF');
  const referenceNode = reference?.nodes.find((node) => node !== loadRail);
  return {
    // the pair's emitter currents: collector currents plus the base currents the inputs deliver (a PNP pair's flow back into the sources)
    tailCurrentA: collectorCurrentA + collector2CurrentA - polarity * i[vin1] - polarity * i[vin2],
    collectorCurrentA,
    collector2CurrentA,
    referenceCurrentA: referenceNode ? (polarity * (loadRailV - v[referenceNode])) / resistanceOf(circuit.elements, 'RREF') : 0,
    powerW: -(positiveV * i[SUPPLY_SOURCES.positive.toLowerCase()] + negativeV * i[SUPPLY_SOURCES.negative.toLowerCase()]),
  };
}

/**
 * A sweep whose first point is `frequencyHz`: that frequency and a decade above. Not the
 * one-point `.ac dec 1 f f`, which ngspice-39 (Debian's build) answers with no point at all while
 * later builds return f; every build returns both points of this one, and only the first is read.
 */
export function singleFrequencySweep(frequencyHz: number): AcSweep {
  return { startHz: frequencyHz, stopHz: 10 * frequencyHz, pointsPerDecade: 1 };
}

/**
 * Measures the contract's figures by simulation: one `.op`, a differential and a common-mode
 * AC run (swept 1 Hz–10 GHz, for the CMRR corner, when anything in the circuit stores charge:
 * wiring or load capacitance, or the card's CJE, CJC, CJS, TF, TR), and an `ac-tail` run at t's operating-point voltage for
 * Rout = 1/|i(vtail)|.
 * - tailCurrentA = IE1 + IE2 = Σ (VP − v(ck))/RCk − Σ i(vink) (KCL at the pair: collector
 *   currents from the load drops plus the base currents the input sources deliver).
 * - powerW = −(VP·i(vp) + VN·i(vn)): i(·) flows into the + terminal, so a delivering rail reads < 0.
 * Gains are signed real parts at `frequencyHz` (default 1 Hz), checked to be nearly real.
 */
export async function spiceFigures(run: SpiceRunner, design: Design, options: { frequencyHz?: number } = {}): Promise<SpiceFigures> {
  const frequencyHz = options.frequencyHz ?? LOW_FREQUENCY_HZ;
  const circuit = stageCircuit(design);
  const op = await spiceOperatingPoint(run, design);
  const v = op.nodeVoltagesV;
  const { tailCurrentA, collectorCurrentA, referenceCurrentA, powerW } = dcFigures(design, op);

  const hasCapacitance = designStoresCharge(design);
  const atFrequency = singleFrequencySweep(frequencyHz);
  const sweep: AcSweep = hasCapacitance ? { ...CORNER_SWEEP, startHz: frequencyHz } : atFrequency;
  const differential = await spiceAc(run, design, { analysis: 'ac-differential', ...sweep });
  const commonMode = await spiceAc(run, design, { analysis: 'ac-common-mode', ...sweep });
  const tail = await spiceAc(run, design, {
    analysis: 'ac-tail',
    tailNodeV: v.t,
    ...atFrequency,
  });

  // The drives are v(in1 − in2) = 1 and v_cm = 1, so node voltages are the transfers themselves.
  const ad = subtract(differential.nodeVoltages.c1[0], differential.nodeVoltages.c2[0]);
  const ase = differential.nodeVoltages.c1[0];
  const acm = commonMode.nodeVoltages.c1[0];
  const adcm = subtract(commonMode.nodeVoltages.c1[0], commonMode.nodeVoltages.c2[0]);
  const matched = complexMagnitude(adcm) <= MATCHED_PAIR_RATIO * complexMagnitude(acm);

  let cmrrCornerHz: number | null = null;
  if (hasCapacitance) {
    const cmrrDb = differential.frequenciesHz.map(
      (_, k) => 20 * Math.log10(complexMagnitude(differential.nodeVoltages.c1[k]) / complexMagnitude(commonMode.nodeVoltages.c1[k])),
    );
    cmrrCornerHz = dropFrequencyHz(differential.frequenciesHz, cmrrDb, 3);
  }

  // in the direction each transistor conducts (a PNP's voltages turned round), as analyze reports them
  const transistors = circuit.elements.filter(isTransistor).map((q) => {
    const polarity = q.kind === 'pnp' ? -1 : 1;
    return { name: q.name, vbeV: polarity * (v[q.base] - v[q.emitter]), vceV: polarity * (v[q.collector] - v[q.emitter]), vcbV: polarity * (v[q.collector] - v[q.base]) };
  });

  return {
    tailCurrentA,
    collectorCurrentA,
    collectorVoltageV: v.c1,
    collector2VoltageV: v.c2,
    tailNodeVoltageV: v.t,
    differentialGain: lowFrequencyReal(ad, 'differential gain'),
    singleEndedGain: lowFrequencyReal(ase, 'single-ended gain'),
    commonModeGain: lowFrequencyReal(acm, 'common-mode gain'),
    differentialCommonModeGain: matched ? 0 : lowFrequencyReal(adcm, 'differential common-mode gain'),
    cmrrDb: {
      singleEnded: 20 * Math.log10(complexMagnitude(ase) / complexMagnitude(acm)),
      differential: matched ? null : 20 * Math.log10(complexMagnitude(ad) / complexMagnitude(adcm)),
    },
    tailOutputResistanceOhm: 1 / complexMagnitude(tail.sourceCurrents[TAIL_TEST_SOURCE.toLowerCase()][0]),
    cmrrCornerHz,
    powerW,
    referenceCurrentA,
    transistors,
  };
}

/**
 * The transistors whose base-collector junction SPICE's operating point forward-biases (VBC > 0
 * at the terminals: saturated, or at the edge of it), with that VBC, in circuit order.
 */
export function saturatedTransistors(design: Design, op: SpiceOperatingPoint): { name: string; vbcV: number }[] {
  const v = op.nodeVoltagesV;
  return stageCircuit(design)
    .elements.filter(isTransistor)
    .map((q) => ({ name: q.name, vbcV: (q.kind === 'pnp' ? -1 : 1) * (v[q.base.toLowerCase()] - v[q.collector.toLowerCase()]) }))
    .filter((q) => Number.isFinite(q.vbcV) && q.vbcV > 0);
}
