/**
 * Verifying one option (or an override) in ngspice: the operating point, differential and
 * common-mode AC sweeps from 1 Hz to well past the rejection corner and the bandwidth, the tail's
 * output resistance and the trade-off figures (tradeoff-figures.ts: input, supply rejection,
 * bandwidth, noise, slew rate) at nominal conditions, then the operating point and the
 * spec-frequency AC runs at each corner of input common mode × temperature. Every simulated
 * figure is set beside the engine's stored prediction with its delta and the documented
 * tolerance (`VERIFICATION_TOLERANCES`).
 */
import type { RecommendOption } from '#shared/engine/recommend';
import type { Design } from '#shared/engine/types';
import type { DesignBinding } from '#shared/verification/binding';
import {
  FIGURE_GROUPS,
  VERIFICATION_TOLERANCES as TOL,
  type FigureGroup,
  type OptionVerification,
  type RejectionPoint,
  type VerifiedCondition,
  type VerifiedFigure,
} from '#shared/verification/types';
import { likelyCause, type FigureKind, type SaturatedTransistor } from '#shared/verification/causes';
import { spiceOnlyParameterMoves } from '#shared/devices/model-card';
import {
  REFERENCE_RELATIVE_TOLERANCE,
  complexMagnitude,
  dcFigures,
  dropFrequencyHz,
  saturatedTransistors,
  singleFrequencySweep,
  spiceAc,
  spiceOperatingPoint,
  type SpiceRunner,
} from './spice-analyses';
import { TAIL_TEST_SOURCE, type AcSweep, type NetlistCardSettings } from '#shared/engine/netlist';
import { singleEndedCmrrDbAt, solveStage } from '#shared/engine/analyze';
import { designStoresCharge } from '#shared/engine/circuit';
import { shiftedDesign } from '#shared/engine/sign-off-corners';
import { conditionLabel } from '#shared/text/engine-notes';
import { NOMINAL_TEMPERATURE_C } from '#shared/engine/constants';
import { formatQuantity } from '#shared/units/format-quantity';
import { absoluteFigure as absoluteNamed, percentFigure as percentNamed } from './figure-comparison';
import { tradeoffAnalyses, tradeoffFigures, type StoredPrediction } from './tradeoff-figures';

/** Points per decade of the nominal sweeps; every fifth point lands on the engine's 4-per-decade curve. */
const SWEEP_POINTS_PER_DECADE = 20;
/** The nominal sweeps run at least to 1 GHz, and to 100× the predicted rejection corner when that is higher. */
const MIN_SWEEP_STOP_HZ = 1e9;
const SWEEP_STOP_OVER_CORNER = 100;
const MAX_SWEEP_STOP_HZ = 1e12;
/** … and to 10× the predicted differential bandwidth, so its −3 dB point is inside the sweep. */
const SWEEP_STOP_OVER_BANDWIDTH = 10;
/** The engine's curve points fall every `SWEEP_POINTS_PER_DECADE / 4` sweep points. */
const CURVE_STRIDE = SWEEP_POINTS_PER_DECADE / 4;

/** Reports a step about to run: a readable description. */
export type StepReporter = (step: string) => Promise<void> | void;

/** Analyses of the nominal runs: op, the two sweeps, the two AC runs at the spec frequency, the tail. */
const NOMINAL_ANALYSES = 6;
/** Analyses at each corner: op and the two AC runs at the spec frequency. */
const CORNER_ANALYSES = 3;

/**
 * Analyses one option's verification runs (its progress steps): the nominal runs, the trade-off
 * figures (the searches' least count; progress is clamped to the option's share), each corner.
 */
export function analysesPerOption(option: Pick<RecommendOption, 'design' | 'predicted' | 'corners'>): number {
  const tradeoffs = option.design && option.predicted ? tradeoffAnalyses(option.design, option.predicted as StoredPrediction) : 0;
  return NOMINAL_ANALYSES + tradeoffs + CORNER_ANALYSES * option.corners.length;
}

export interface OptionToVerify {
  topology: string;
  source: 'option' | 'decision';
  /** Readable name for progress steps, e.g. "Wilson mirror" or "Override (Wilson mirror)". */
  name: string;
  option: RecommendOption;
  /** Whether the spec asks for a differential output (the gain compared is then Ad, else Ase). */
  differentialOutput: boolean;
  /** The spec frequency, Hz. */
  frequencyHz: number;
  /** Changes the netlist before it runs (tests use it to break one on purpose). */
  netlistHook?: (netlist: string) => string;
  /** What is simulated, recorded with the result (shared/verification/binding.ts). */
  binding?: DesignBinding;
  /**
   * The library card simulated with the design (its spec was filled from it and the design is
   * still its device): the card's parameters the design's device does not carry go into every
   * netlist, so SPICE simulates the whole card.
   */
  card?: { name: string; spiceOnlyParameters: Readonly<Record<string, number>> };
}

/** Figures read at a frequency or over time (charges matter); every other figure is the operating point's or low-frequency. */
const FREQUENCY_FIGURES = new Set(['cmrrAtFrequencyDb', 'cmrrCornerHz', 'differentialBandwidthHz', 'slewRateVPerS']);
const isFrequencyFigure = (key: string) => FREQUENCY_FIGURES.has(key) || key.startsWith('inputNoiseVPerRtHz@');

/** The nominal table's group of each established figure (the trade-off figures carry their own). */
const ESTABLISHED_GROUPS: Record<string, FigureGroup> = {
  tailCurrentA: 'bias',
  collectorCurrentA: 'bias',
  collectorVoltageV: 'bias',
  tailNodeVoltageV: 'bias',
  powerW: 'bias',
  differentialGain: 'gain',
  singleEndedGain: 'gain',
  commonModeGain: 'gain',
  cmrrSingleEndedDb: 'gain',
  cmrrAtFrequencyDb: 'gain',
  tailOutputResistanceOhm: 'gain',
  cmrrCornerHz: 'gain',
};

/** The nominal figures in the table's group order (stable within a group). */
function grouped(figures: VerifiedFigure[]): VerifiedFigure[] {
  const withGroup = figures.map((f) => (f.group || !ESTABLISHED_GROUPS[f.key] ? f : { ...f, group: ESTABLISHED_GROUPS[f.key] }));
  const rank = (f: VerifiedFigure) => (f.group ? FIGURE_GROUPS.indexOf(f.group) : FIGURE_GROUPS.length);
  return withGroup.map((f, i) => ({ f, i })).sort((a, b) => rank(a.f) - rank(b.f) || a.i - b.i).map(({ f }) => f);
}

/** Each figure outside tolerance gets its likely cause (shared/verification/causes.ts). */
function withCauses(figures: VerifiedFigure[], spiceOnly: readonly string[], saturated: readonly SaturatedTransistor[]): VerifiedFigure[] {
  return figures.map((figure) => {
    if (figure.agrees !== false) return figure;
    const kind: FigureKind = isFrequencyFigure(figure.key) ? 'ac' : 'dc';
    return { ...figure, cause: likelyCause(kind, spiceOnly, spiceOnlyParameterMoves, saturated) };
  });
}

function percentFigure(key: string, label: string, unit: string, predicted: number | null, simulated: number | null, tolerance: number): VerifiedFigure {
  return percentNamed({ key, label, unit }, predicted, simulated, tolerance);
}

function absoluteFigure(key: string, label: string, unit: string, predicted: number | null, simulated: number | null, tolerance: number, kind: 'db' | 'volts'): VerifiedFigure {
  return absoluteNamed({ key, label, unit }, predicted, simulated, tolerance, kind);
}

function withHook(run: SpiceRunner, hook: ((netlist: string) => string) | undefined): SpiceRunner {
  return hook ? (netlist, plot) => run(hook(netlist), plot) : run;
}

const db = (ratio: number) => 20 * Math.log10(ratio);

/** Simulated rejection at the spec frequency from the two AC runs' first point. */
interface AcFigures {
  differentialGain: number;
  singleEndedGain: number;
  commonModeGain: number;
  cmrrSingleEndedDb: number;
  /** null for a matched pair (no differential common-mode gain). */
  cmrrDifferentialDb: number | null;
}

export async function acAt(run: SpiceRunner, design: Design, sweep: AcSweep, card: NetlistCardSettings = {}) {
  const differential = await spiceAc(run, design, { analysis: 'ac-differential', ...sweep, relativeTolerance: REFERENCE_RELATIVE_TOLERANCE, ...card });
  const commonMode = await spiceAc(run, design, { analysis: 'ac-common-mode', ...sweep, relativeTolerance: REFERENCE_RELATIVE_TOLERANCE, ...card });
  const figuresAt = (k: number): AcFigures => {
    const d1 = differential.nodeVoltages.c1[k];
    const d2 = differential.nodeVoltages.c2[k];
    const c1 = commonMode.nodeVoltages.c1[k];
    const c2 = commonMode.nodeVoltages.c2[k];
    const ad = complexMagnitude({ re: d1.re - d2.re, im: d1.im - d2.im });
    const adcm = complexMagnitude({ re: c1.re - c2.re, im: c1.im - c2.im });
    const ase = complexMagnitude(d1);
    const acm = complexMagnitude(c1);
    return {
      differentialGain: ad,
      singleEndedGain: ase,
      commonModeGain: acm,
      cmrrSingleEndedDb: db(ase / acm),
      cmrrDifferentialDb: adcm <= 1e-9 * acm ? null : db(ad / adcm),
    };
  };
  return { frequenciesHz: differential.frequenciesHz, figuresAt };
}

/** DC figures at one condition, with the node voltages the comparison shows and the transistors SPICE finds saturated. */
async function dcAt(run: SpiceRunner, design: Design, card: NetlistCardSettings) {
  const op = await spiceOperatingPoint(run, design, { relativeTolerance: REFERENCE_RELATIVE_TOLERANCE, ...card });
  return { ...dcFigures(design, op), op, collectorVoltageV: op.nodeVoltagesV.c1, tailNodeVoltageV: op.nodeVoltagesV.t, saturated: saturatedTransistors(design, op) };
}

/** Runs every analysis of one option and compares; a failing simulation becomes the option's error. */
export async function verifyOption(runSpice: SpiceRunner, target: OptionToVerify, onStep: StepReporter): Promise<OptionVerification> {
  const t0 = performance.now();
  const run = withHook(runSpice, target.netlistHook);
  const { option } = target;
  const base: Omit<OptionVerification, 'outcome' | 'error' | 'agrees' | 'disagreements' | 'elapsedMs'> = {
    topology: target.topology,
    source: target.source,
    ...(target.binding ? { binding: target.binding } : {}),
    ...(target.card ? { card: { name: target.card.name, spiceOnlyParameters: Object.keys(target.card.spiceOnlyParameters) } } : {}),
    nominal: null,
    corners: [],
    rejectionCurve: [],
  };
  const failed = (message: string): OptionVerification => ({
    ...base,
    outcome: 'error',
    error: message,
    agrees: false,
    disagreements: 0,
    elapsedMs: performance.now() - t0,
  });
  if (!option.design || !option.predicted) return failed(option.error ?? 'The engine could not size or solve this option, so there is nothing to simulate.');
  const design = option.design;
  const predicted = option.predicted;
  const gainKey = target.differentialOutput ? 'differentialGain' : 'singleEndedGain';
  const gainLabel = target.differentialOutput ? 'Differential gain |Ad|' : 'Single-ended gain |Ase|';
  const card: NetlistCardSettings = target.card ? { spiceOnlyParameters: target.card.spiceOnlyParameters } : {};
  const spiceOnly = Object.keys(card.spiceOnlyParameters ?? {});
  try {
    const nominalLabel = conditionLabel(design.inputCommonModeV ?? 0, design.temperatureC ?? NOMINAL_TEMPERATURE_C);
    await onStep(`${target.name}: operating point`);
    const dc = await dcAt(run, design, card);

    const predictedCornerHz = predicted.cmrrCornerHz;
    const predictedBandwidthHz = (predicted as StoredPrediction).differentialBandwidthHz ?? 0;
    const stopHz = Math.min(MAX_SWEEP_STOP_HZ, Math.max(MIN_SWEEP_STOP_HZ, (predictedCornerHz ?? 0) * SWEEP_STOP_OVER_CORNER, predictedBandwidthHz * SWEEP_STOP_OVER_BANDWIDTH));
    await onStep(`${target.name}: differential and common-mode sweeps, 1 Hz to ${stopHz.toExponential(0)} Hz`);
    const sweep = await acAt(run, design, { startHz: 1, stopHz, pointsPerDecade: SWEEP_POINTS_PER_DECADE }, card);
    const low = sweep.figuresAt(0);
    const singleDb = sweep.frequenciesHz.map((_, k) => sweep.figuresAt(k).cmrrSingleEndedDb);
    const hasCapacitance = designStoresCharge(design);
    const simulatedCornerHz = hasCapacitance ? dropFrequencyHz(sweep.frequenciesHz, singleDb, 3) : null;
    const atSpec = await acAt(run, design, singleFrequencySweep(target.frequencyHz), card);

    await onStep(`${target.name}: tail output resistance`);
    const tail = await spiceAc(run, design, {
      analysis: 'ac-tail',
      tailNodeV: dc.tailNodeVoltageV,
      ...singleFrequencySweep(1),
      relativeTolerance: REFERENCE_RELATIVE_TOLERANCE,
      ...card,
    });
    const routOhm = 1 / complexMagnitude(tail.sourceCurrents[TAIL_TEST_SOURCE.toLowerCase()][0]);

    const tradeoffs = await tradeoffFigures({
      run,
      design,
      predicted: predicted as StoredPrediction,
      op: dc.op,
      sweep: { frequenciesHz: sweep.frequenciesHz, differentialGain: sweep.frequenciesHz.map((_, k) => sweep.figuresAt(k).differentialGain) },
      card,
      step: (what) => onStep(`${target.name}: ${what}`),
    });

    const predictedCurve = option.curves?.cmrrVsFrequency ?? [];
    const rejectionCurve: RejectionPoint[] = [];
    for (let k = 0; k < sweep.frequenciesHz.length; k += CURVE_STRIDE) {
      const frequencyHz = sweep.frequenciesHz[k];
      const match = predictedCurve.find((p) => Math.abs(p.frequencyHz / frequencyHz - 1) < 1e-6);
      rejectionCurve.push({ frequencyHz, simulatedDb: singleDb[k], predictedDb: match ? match.singleEndedDb : null });
    }

    // The nominal rejection at the spec frequency is not among the stored figures (the ranking keeps
    // the worst corner's); the engine, deterministic, gives it again from the same design.
    const predictedAtSpecDb = singleEndedCmrrDbAt(solveStage(design), target.frequencyHz);
    const nominal: VerifiedCondition = {
      label: nominalLabel,
      inputCommonModeV: design.inputCommonModeV ?? 0,
      temperatureC: design.temperatureC ?? NOMINAL_TEMPERATURE_C,
      figures: grouped(withCauses([
        percentFigure('tailCurrentA', 'Tail current', 'A', predicted.tailCurrentA, dc.tailCurrentA, TOL.currentPercent),
        percentFigure('collectorCurrentA', 'Collector current Q1', 'A', predicted.collectorCurrentA, dc.collectorCurrentA, TOL.currentPercent),
        absoluteFigure('collectorVoltageV', 'Collector voltage Q1', 'V', predicted.collectorVoltageV, dc.collectorVoltageV, TOL.voltageV, 'volts'),
        absoluteFigure('tailNodeVoltageV', 'Tail node voltage', 'V', predicted.tailNodeVoltageV, dc.tailNodeVoltageV, TOL.voltageV, 'volts'),
        percentFigure('differentialGain', 'Differential gain |Ad|', '', Math.abs(predicted.differentialGain), low.differentialGain, TOL.gainPercent),
        percentFigure('singleEndedGain', 'Single-ended gain |Ase|', '', Math.abs(predicted.singleEndedGain), low.singleEndedGain, TOL.gainPercent),
        percentFigure('commonModeGain', 'Common-mode gain |Acm|', '', Math.abs(predicted.commonModeGain), low.commonModeGain, TOL.gainPercent),
        absoluteFigure('cmrrSingleEndedDb', 'CMRR, single-ended, low frequency', 'dB', predicted.cmrrDb.singleEnded, low.cmrrSingleEndedDb, TOL.singleEndedCmrrDb, 'db'),
        absoluteFigure(
          'cmrrAtFrequencyDb',
          `CMRR, single-ended, at ${formatQuantity(target.frequencyHz, 'Hz')}`,
          'dB',
          predictedAtSpecDb,
          atSpec.figuresAt(0).cmrrSingleEndedDb,
          TOL.singleEndedCmrrDb,
          'db',
        ),
        percentFigure('tailOutputResistanceOhm', 'Tail output resistance', 'Ohm', predicted.tailOutputResistanceOhm, routOhm, TOL.tailOutputResistancePercent),
        percentFigure('cmrrCornerHz', 'Rejection corner (−3 dB)', 'Hz', predictedCornerHz, simulatedCornerHz, TOL.cornerFrequencyPercent),
        percentFigure('powerW', 'Power', 'W', predicted.powerW, dc.powerW, TOL.powerPercent),
        ...tradeoffs,
      ], spiceOnly, dc.saturated)),
    };

    const corners: VerifiedCondition[] = [];
    for (const corner of option.corners) {
      // a sign-off corner moves the rails, the current gain and the resistors too (stored resolved)
      const cornerDesign: Design = shiftedDesign({ ...design, inputCommonModeV: corner.inputCommonModeV, temperatureC: corner.temperatureC }, corner.shift);
      await onStep(`${target.name}: corner ${corner.label}`);
      const cornerDc = await dcAt(run, cornerDesign, card);
      const cornerAc = await acAt(run, cornerDesign, singleFrequencySweep(target.frequencyHz), card);
      const ac = cornerAc.figuresAt(0);
      corners.push({
        label: corner.label,
        inputCommonModeV: corner.inputCommonModeV,
        temperatureC: corner.temperatureC,
        figures: withCauses([
          percentFigure('tailCurrentA', 'Tail current', 'A', corner.tailCurrentA, cornerDc.tailCurrentA, TOL.currentPercent),
          percentFigure('gain', gainLabel, '', corner.gain, ac[gainKey], TOL.gainPercent),
          absoluteFigure('cmrrAtFrequencyDb', `CMRR, single-ended, at ${formatQuantity(target.frequencyHz, 'Hz')}`, 'dB', corner.cmrrAtFrequencyDb, ac.cmrrSingleEndedDb, TOL.singleEndedCmrrDb, 'db'),
          percentFigure('powerW', 'Power', 'W', corner.powerW, cornerDc.powerW, TOL.powerPercent),
        ], spiceOnly, cornerDc.saturated),
      });
    }

    const all = [nominal, ...corners].flatMap((c) => c.figures);
    const disagreements = all.filter((f) => f.agrees === false).length;
    return { ...base, nominal, corners, rejectionCurve, outcome: 'verified', error: null, agrees: disagreements === 0, disagreements, elapsedMs: performance.now() - t0 };
  } catch (error) {
    return failed(error instanceof Error ? error.message : String(error));
  }
}
