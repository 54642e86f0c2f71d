/**
 * `analyze`: predictions for one fully sized stage (ENGINE-CONTRACT.md). The operating point is
 * solved self-consistently and the small-signal stage as a whole (operating-point.ts,
 * small-signal.ts); this file turns the solution into the contract's figures.
 */
import { COLLECTOR_NODES, INPUT_NODES, RAIL_NODES, TAIL_NODE, pairIsMatched, stagePolarity, stageRails } from './circuit';
import { driveCurrentsA, inputOffset, linearInputRangeV, offsetDriftVPerC, withoutMismatch } from './input-transfer';
import { closedFormTailRout } from './closed-form';
import type { BjtEval, DeviceModel } from './device';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { mosfetCurrentsA, nodeVoltage, terminalCurrentsA, type IndexedCircuit } from './node-system';
import type { OperatingPoint } from './operating-point';
import { solveStageOperatingPoint, type SolvedOperatingPoint } from './stage-solve';
import { TRANSFER_PARTS, magnitude, smallSignalCurrentIntoA, smallSignalStage, stageTransfersAt, type SmallSignalStage, type StageTransfers } from './small-signal';
import { readOutput, transferMoveBound, transfersAtOmega, type ComplexPair, type FrequencyModel } from './frequency-response';
import { inputNoiseVPerRtHz, stageNoise } from './noise';
import { solvedSlewRateVPerS } from './slew-rate';
import type { AcEntry, AnalyzeResult, Design, RailRejection, Region, TransistorOperatingPoint } from './types';
import { inputWarningText, operatingPointProblemText } from '../text/engine-notes';

/**
 * Forward transport current (the collector current the base–emitter junction's bias drives)
 * below which a transistor counts as cut off, A (well under any useful bias).
 */
const CUT_OFF_CURRENT_A = 1e-10;
/**
 * A transistor counts as saturated when its small-signal current gain has fallen more than this
 * fraction below its forward-active value (`currentGainLossFraction`). With this model that is
 * VCE < VT·ln((1 + (1 + BF)/BR)·(1 − L)/L): about 0.20 V at 27 °C for BF = 120, 0.27 V at 125 °C,
 * 0.15 V at −55 °C (VT scales it); the product's choice, stated in docs/device-and-formulas.md.
 */
export const SATURATION_GAIN_LOSS_LIMIT = 0.05;

/** A solved circuit: the operating point and the small-signal responses. */
export interface SolvedCircuit {
  design: Design;
  model: DeviceModel;
  op: OperatingPoint;
  stage: SmallSignalStage;
}

/** A solved stage with the contract's figures. */
export interface StageSolution extends SolvedCircuit {
  result: AnalyzeResult;
  /** The operating-point problems as figures (`result` holds them worded). */
  problems: OperatingPointProblem[];
}

/**
 * The figures a full solve adds to a condition's: the searched corners (cmrrCornerHz,
 * differentialBandwidthHz) and the figures that take further operating points (the offset and
 * its current and drift, the linear range) or a transient (the slew rate).
 */
export type FullSolveField = 'cmrrCornerHz' | 'differentialBandwidthHz' | 'inputOffsetCurrentA' | 'inputOffsetVoltageV' | 'offsetDriftVPerC' | 'linearInputRangeV' | 'slewRateVPerS';

/** The figures of a stage solved at one condition of a spec: every figure but a full solve's own (FullSolveField). */
export type ConditionResult = Omit<AnalyzeResult, FullSolveField>;

/** A stage solved at one condition of a spec (a corner, a sweep point, a sizing step): its figures without the corner searches. */
export interface ConditionSolution extends SolvedCircuit {
  result: ConditionResult;
  problems: OperatingPointProblem[];
}

export { scaledDevice } from './stage-solve';

/** Small-signal transfers of a solved stage at a frequency (Hz). */
export type { StageTransfers } from './small-signal';

/** Current leaving node `nodeName` into the elements of the circuit (the tail's alone when `onlyTail`), A: KCL bookkeeping over resistors, transistors and MOSFETs. */
export function currentIntoElementsA(op: OperatingPoint, nodeName: string, onlyTail: boolean): number {
  const ic = op.circuit;
  const node = ic.nodeRef(nodeName);
  const v = op.voltagesV;
  let totalA = 0;
  for (const r of ic.resistors) {
    if (onlyTail && !r.tail) continue;
    const ia = (nodeVoltage(ic, v, r.a) - nodeVoltage(ic, v, r.b)) * r.conductanceS;
    if (r.a === node) totalA += ia;
    if (r.b === node) totalA -= ia;
  }
  ic.transistors.forEach((q, i) => {
    if (onlyTail && !q.tail) return;
    const into = terminalCurrentsA(q, op.transistors[i]);
    if (q.ci === node) totalA += into.collectorA;
    if (q.bi === node) totalA += into.baseA;
    if (q.ei === node) totalA += into.emitterA;
  });
  ic.mosfets.forEach((m, i) => {
    if (onlyTail && !m.tail) return;
    const into = mosfetCurrentsA(op.mosfets[i]);
    if (m.d === node) totalA += into.drainA;
    if (m.s === node) totalA += into.sourceA;
    if (m.b === node) totalA += into.bodyA;
  });
  return totalA;
}

/**
 * How far a transistor's small-signal current gain has fallen below its forward-active value:
 * 1 − hfe/β0, with hfe = ∂IC/∂IB at constant VCE (both junctions move with the base) and
 * β0 = (∂IC/∂VBE)/(∂IB/∂VBE) at constant VBC (the gain the base–emitter junction alone gives).
 * Forward-active they differ only by the Early effect, VT/(VAF + VCB); once the base–collector
 * junction injects, its current (IS·exp(VBC/VT) over BR into the base) takes the gain away.
 */
export function currentGainLossFraction(ev: BjtEval): number {
  const hfe = (ev.dIcDVbeS + ev.dIcDVbcS) / (ev.dIbDVbeS + ev.dIbDVbcS);
  const forwardActiveBeta = ev.dIcDVbeS / ev.dIbDVbeS;
  return 1 - hfe / forwardActiveBeta;
}

/**
 * gm as SPICE reports it (@q[gm]): the hybrid-π transconductance, ∂/∂VBE at constant VCE of the
 * collector current less the base–collector junction's own current (SPICE's gμ branch), i.e.
 * ∂IC/∂VBE + ∂IC/∂VBC + ∂IB/∂VBC [SPICE] ngspice bjtload.c (gm = ∂IC/∂VBE|VBC − go, with
 * go = −∂IC/∂VBC − gμ and gμ = ∂IB/∂VBC). Forward-active it is IC/VT − IC/(VAF + VCB).
 */
export function spiceTransconductanceS(ev: BjtEval): number {
  return ev.dIcDVbeS + ev.dIcDVbcS + ev.dIbDVbcS;
}

/**
 * Region of a transistor from its own operating point: cut off when its base–emitter junction
 * drives under CUT_OFF_CURRENT_A (VT·∂IC/∂VBE, the forward transport current), else saturated
 * when its current gain is more than SATURATION_GAIN_LOSS_LIMIT below the forward-active value,
 * else forward-active. A saturated transistor may carry almost no collector current (its base
 * drive returns through the collector junction): it is still saturated, not cut off.
 */
function regionOf(ev: BjtEval, thermalVoltageV: number, gainLossFraction: number): Region {
  if (thermalVoltageV * ev.dIcDVbeS < CUT_OFF_CURRENT_A) return 'cut-off';
  if (gainLossFraction > SATURATION_GAIN_LOSS_LIMIT) return 'saturated';
  return 'forward-active';
}

function transistorOperatingPoints(ic: IndexedCircuit, op: OperatingPoint, thermalVoltageV: number): TransistorOperatingPoint[] {
  return ic.transistors.map((q, i) => {
    const v = op.voltagesV;
    // At the junctions (internal nodes), as SPICE reports vbe, vbc and vce: in the direction the
    // transistor conducts (a PNP's times −1), its currents likewise positive when it conducts
    const vc = q.polarity * nodeVoltage(ic, v, q.ci);
    const vb = q.polarity * nodeVoltage(ic, v, q.bi);
    const ve = q.polarity * nodeVoltage(ic, v, q.ei);
    const ev = op.transistors[i];
    const gainLossFraction = currentGainLossFraction(ev);
    return {
      name: q.name,
      collectorCurrentA: ev.icA,
      baseCurrentA: ev.ibA,
      vbeV: vb - ve,
      vceV: vc - ve,
      vcbV: vc - vb,
      region: regionOf(ev, thermalVoltageV, gainLossFraction),
      currentGainLossFraction: gainLossFraction,
    };
  });
}

/**
 * The contract's four transfers at a frequency (Hz), from the whole circuit: the devices'
 * junction and diffusion capacitances, the tail wiring capacitance and the loads.
 */
export function transfersAt(solution: Pick<StageSolution, 'stage'>, frequencyHz: number): StageTransfers {
  return stageTransfersAt(solution.stage, frequencyHz);
}

/** Single-ended CMRR in dB at a frequency: 20·log10|Ase/Acm|. */
export function singleEndedCmrrDbAt(solution: Pick<StageSolution, 'stage'>, frequencyHz: number): number {
  const t = transfersAt(solution, frequencyHz);
  return 20 * Math.log10(magnitude(t.singleEndedGain) / magnitude(t.commonModeGain));
}

/** "3 dB": the half-power drop, 10·log10(2) dB (|H|² halved). */
const HALF_POWER_DB = 10 * Math.log10(2);
/** Highest frequency the corner searches look at, Hz: above it a corner is reported as null. */
export const HIGHEST_CORNER_HZ = 1e10;
/** Lowest frequency the corner searches start from, Hz (a cascode's Rout with 1 nF can put the rejection corner below 1 Hz). */
const LOWEST_CORNER_HZ = 1e-4;
/** Search grid density before the corner is refined, points per decade. */
const CORNER_GRID_PER_DECADE = 1;
/** Relative accuracy of a corner frequency. */
const CORNER_RELATIVE_TOLERANCE = 1e-6;
/**
 * An interpolation step at most this long (relative, in f²) is the last: the next would move the
 * estimate by about this squared, far below CORNER_RELATIVE_TOLERANCE.
 */
const CORNER_FINAL_STEP = 1e-4;
/** Refinement steps at most (Brent's method; it needs three or four). */
const CORNER_MAX_STEPS = 60;

/** A figure whose 3 dB corner is searched: 20·log10|numerator| − 20·log10|denominator| (no denominator: 1). */
interface CornerFigure {
  numerator: keyof StageTransfers;
  denominator?: keyof StageTransfers;
}

const DIFFERENTIAL_GAIN: CornerFigure = { numerator: 'differentialGain' };
const SINGLE_ENDED_CMRR: CornerFigure = { numerator: 'singleEndedGain', denominator: 'commonModeGain' };

function figureDb(figure: CornerFigure, t: StageTransfers): number {
  const numerator = magnitude(t[figure.numerator]);
  return 20 * Math.log10(figure.denominator ? numerator / magnitude(t[figure.denominator]) : numerator);
}

/**
 * How far (relative) each transfer of a figure must move from its low-frequency value before the
 * figure can have fallen 3 dB: |H| ≤ |H0|/√2 needs |H − H0| ≥ (1 − 1/√2)·|H0|; a ratio |N|/|D|
 * falls by √2 only if N falls or D rises by δ with (1 − δ)/(1 + δ) = 1/√2, δ = 3 − 2√2.
 * Halved, so rounding never decides.
 */
const SINGLE_TRANSFER_MOVE = (1 - Math.SQRT1_2) / 2;
const RATIO_TRANSFER_MOVE = (3 - 2 * Math.SQRT2) / 2;

/** Whether the bound on a transfer's move keeps it within `move` (relative) of its low-frequency value at ω. */
function transferHolds(stage: SmallSignalStage, part: keyof StageTransfers, move: number, omega: number): boolean {
  const { drive, output } = TRANSFER_PARTS[part];
  return transferMoveBound(stage.frequency!, drive, output, omega) < move * magnitude(stage.low[part]);
}

/** Whether the bound on each transfer's move shows the figure cannot yet have fallen 3 dB at ω. */
function cannotHaveFallen(stage: SmallSignalStage, figure: CornerFigure, omega: number): boolean {
  if (!figure.denominator) return transferHolds(stage, figure.numerator, SINGLE_TRANSFER_MOVE, omega);
  return transferHolds(stage, figure.numerator, RATIO_TRANSFER_MOVE, omega) && transferHolds(stage, figure.denominator, RATIO_TRANSFER_MOVE, omega);
}

/**
 * The lowest frequency where each figure has fallen 3 dB below its low-frequency value: a
 * logarithmic grid up to HIGHEST_CORNER_HZ finds the first grid point at or below the target,
 * then Brent's method refines the crossing between it and the grid point before
 * (refinedCornerHz). Grid points where a bound on the transfers' move (transferMoveBound) shows the figure
 * cannot have fallen 3 dB yet are passed without a solve: each figure's scan starts at the last
 * of them, so it finds the crossing a solve at every grid point would. Null where the figure never falls 3 dB there, and for every
 * figure when nothing in the circuit stores charge.
 */
function cornersHz(stage: SmallSignalStage, figures: readonly CornerFigure[]): (number | null)[] {
  if (!stage.frequency) return figures.map(() => null);
  const steps = Math.round(Math.log10(HIGHEST_CORNER_HZ / LOWEST_CORNER_HZ) * CORNER_GRID_PER_DECADE);
  const gridLogF = (i: number) => Math.log10(LOWEST_CORNER_HZ) + i / CORNER_GRID_PER_DECADE;
  // the stage keeps what it solved (SmallSignalStage.solvedAt): a grid point serves every figure
  const gridTransfers = (i: number) => transfersAt({ stage }, 10 ** gridLogF(i));
  return figures.map((figure) => {
    const target = figureDb(figure, stage.low) - HALF_POWER_DB;
    let first = 0;
    while (first < steps && cannotHaveFallen(stage, figure, 2 * Math.PI * 10 ** gridLogF(first + 1))) first += 1;
    // a grid point the bound passed is above the target: only the lowest needs a solve to tell
    if (first === 0 && !(figureDb(figure, gridTransfers(0)) - target > 0)) return 10 ** gridLogF(0);
    for (let i = first + 1; i <= steps; i += 1) {
      if (figureDb(figure, gridTransfers(i)) - target <= 0) return refinedCornerHz(stage, figure, 10 ** gridLogF(i - 1), 10 ** gridLogF(i));
    }
    return null;
  });
}

/** The lowest frequency where |differentialGain| is 3 dB below its low-frequency value (the contract's `differentialBandwidthHz`); null above 10 GHz or when nothing stores charge. */
export function differentialBandwidthHzOf(stage: SmallSignalStage): number | null {
  return cornersHz(stage, [DIFFERENTIAL_GAIN])[0];
}

/** The frequency where the single-ended CMRR has fallen 3 dB (the contract's `cmrrCornerHz`); null above 10 GHz or when nothing stores charge. */
export function cmrrCornerHzOf(stage: SmallSignalStage): number | null {
  return cornersHz(stage, [SINGLE_ENDED_CMRR])[0];
}

/** |z|². */
const powerOf = (z: ComplexPair): number => z.re * z.re + z.im * z.im;

/** The figure as a power ratio: |N|²/|D|² (|N|² without a denominator). */
function figurePower(figure: CornerFigure, t: StageTransfers): number {
  const power = powerOf(t[figure.numerator]);
  return figure.denominator ? power / powerOf(t[figure.denominator]) : power;
}

/** One of a solve's transfers, [drive][output] as TRANSFER_PARTS places it. */
function partOf(t: ComplexPair[][], part: keyof StageTransfers): ComplexPair {
  const { drive, output } = TRANSFER_PARTS[part];
  return t[drive][output];
}

/**
 * The figure's power ratio at a frequency (Hz) from a solve of only the drives it reads,
 * uncached: a refinement's frequencies serve no other figure.
 */
function solvedFigurePower(model: FrequencyModel, figure: CornerFigure, frequencyHz: number): number {
  const { numerator, denominator } = figure;
  const driveCount = Math.max(TRANSFER_PARTS[numerator].drive, denominator ? TRANSFER_PARTS[denominator].drive : 0) + 1;
  const t = transfersAtOmega(model, 2 * Math.PI * frequencyHz, driveCount);
  const power = powerOf(partOf(t, numerator));
  return denominator ? power / powerOf(partOf(t, denominator)) : power;
}

/**
 * The corner between two grid frequencies (the figure above its target at `aboveHz`, at or below
 * at `belowHz`): the root of 2 − P0/P(f) in v = f², P the figure as a power ratio (figurePower,
 * P0 at low frequency), which is 3 dB down where it is 0. For a single pole or zero P0/P is
 * 1 + f²/fc², linear in f², so the interpolation steps land on the corner at once; a real stage
 * is close to that near its corner.
 */
function refinedCornerHz(stage: SmallSignalStage, figure: CornerFigure, aboveHz: number, belowHz: number): number {
  const lowPower = figurePower(figure, stage.low);
  const model = stage.frequency!;
  const shortfall = (v: number) => 2 - lowPower / solvedFigurePower(model, figure, Math.sqrt(v));
  const a = aboveHz * aboveHz;
  const b = belowHz * belowHz;
  // the ends are grid points, solved (and kept) by the scan
  const fa = 2 - lowPower / figurePower(figure, transfersAt({ stage }, Math.sqrt(a)));
  const fb = 2 - lowPower / figurePower(figure, transfersAt({ stage }, Math.sqrt(b)));
  // The grid decided on the figure in dB; should rounding put an end exactly on the corner, that end is it
  if (!(fa > 0)) return aboveHz;
  if (fb > 0) return belowHz;
  // A first step through the two ends and v = 0, where the shortfall is exactly 1 (P = P0):
  // inverse quadratic interpolation, exact for a single pole and close for a dominant one
  const x = a * (1 / (1 - fa)) * (fb / (fb - fa)) + b * (1 / (1 - fb)) * (fa / (fa - fb));
  if (!(x > a && x < b)) return Math.sqrt(refineCrossing(shortfall, a, fa, b, fb));
  const fx = shortfall(x);
  if (fx === 0) return Math.sqrt(x);
  // Brent's method from there: x the best estimate, the end of the other sign the bracket's other side, the third point the previous one
  return Math.sqrt(fx > 0 ? refineCrossing(shortfall, a, fa, x, fx, b, fb) : refineCrossing(shortfall, b, fb, x, fx, a, fa));
}

/**
 * The crossing of f between a (f(a) > 0) and b (f(b) ≤ 0), to CORNER_RELATIVE_TOLERANCE of x:
 * Brent's method (inverse quadratic or secant steps, bisection when they stall), which keeps
 * the crossing bracketed (R. P. Brent, Algorithms for Minimization without Derivatives, 1973,
 * ch. 4).
 */
function refineCrossing(f: (x: number) => number, a: number, fa: number, b: number, fb: number, c = a, fc = fa): number {
  // b: the best estimate; c: the other end of the bracket; a: the previous b
  let d = b - a;
  let e = d;
  for (let step = 0; step < CORNER_MAX_STEPS; step += 1) {
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    // half the bracket to within the tolerance: in v = f², (CORNER_RELATIVE_TOLERANCE / 2)·v keeps f to CORNER_RELATIVE_TOLERANCE / 2
    const tolerance = (CORNER_RELATIVE_TOLERANCE / 2) * Math.abs(b);
    const half = (c - b) / 2;
    if (Math.abs(half) <= tolerance || fb === 0) return b;
    if (Math.abs(e) >= tolerance && Math.abs(fa) > Math.abs(fb)) {
      // Interpolate: secant when only two points are distinct, else inverse quadratic
      const s = fb / fa;
      let p: number;
      let q: number;
      if (a === c) {
        p = 2 * half * s;
        q = 1 - s;
      } else {
        const r = fb / fc;
        const t = fa / fc;
        p = s * (2 * half * t * (t - r) - (b - a) * (r - 1));
        q = (t - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      // Accept the step only when it stays well inside the bracket and shrinks fast enough
      if (2 * p < Math.min(3 * half * q - Math.abs(tolerance * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
        // An interpolation step this small lands on the crossing to well within the tolerance
        // (the steps converge superlinearly): take it without solving there to confirm
        if (Math.abs(d) <= CORNER_FINAL_STEP * Math.abs(b)) return b + d;
      } else {
        d = half;
        e = d;
      }
    } else {
      d = half;
      e = d;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tolerance ? d : Math.sign(half) * tolerance;
    fb = f(b);
    // Keep the crossing between b and c
    if (fb > 0 === fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
  }
  return b;
}

/**
 * The `ac` entries at the design's frequencies, each with its input-referred noise (noise.ts);
 * `matched`: the pair is matched (pairIsMatched).
 */
function acEntries({ design, model, op, stage }: SolvedCircuit, matched: boolean): AcEntry[] {
  const frequenciesHz = design.frequenciesHz ?? [];
  const noise = frequenciesHz.length > 0 ? stageNoise(op, model, design.temperatureC ?? NOMINAL_TEMPERATURE_C) : null;
  return frequenciesHz.map((frequencyHz) => {
    const t = transfersAt({ stage }, frequencyHz);
    const differentialGain = magnitude(t.differentialGain);
    const singleEndedGain = magnitude(t.singleEndedGain);
    const commonModeGain = magnitude(t.commonModeGain);
    const differentialCommonModeGain = magnitude(t.differentialCommonModeGain);
    return {
      frequencyHz,
      differentialGain,
      singleEndedGain,
      commonModeGain,
      differentialCommonModeGain: matched ? 0 : differentialCommonModeGain,
      cmrrDb: {
        singleEnded: 20 * Math.log10(singleEndedGain / commonModeGain),
        differential: matched ? null : 20 * Math.log10(differentialGain / differentialCommonModeGain),
      },
      inputNoiseVPerRtHz: inputNoiseVPerRtHz(noise!, stage, frequencyHz),
    };
  });
}

/** A transistor out of the forward-active region, or a reference branch carrying no current (worded at the edge). */
export type OperatingPointProblem =
  | { problem: 'saturated'; transistor: string; vceV: number; currentGainLossFraction: number; limitFraction: number }
  | { problem: 'cut-off'; transistor: string; collectorCurrentA: number }
  | { problem: 'dead-reference' };

/** A warning about the inputs themselves (not the operating point). */
export type InputWarning = 'no-early-voltage';

/** Transistors out of the forward-active region and a dead reference branch. */
function operatingPointProblems(transistors: TransistorOperatingPoint[], referenceCurrentA: number, hasReference: boolean): OperatingPointProblem[] {
  const problems: OperatingPointProblem[] = [];
  for (const q of transistors) {
    if (q.region === 'saturated') {
      problems.push({ problem: 'saturated', transistor: q.name, vceV: q.vceV, currentGainLossFraction: q.currentGainLossFraction, limitFraction: SATURATION_GAIN_LOSS_LIMIT });
    }
    else if (q.region === 'cut-off') problems.push({ problem: 'cut-off', transistor: q.name, collectorCurrentA: q.collectorCurrentA });
  }
  if (hasReference && !(referenceCurrentA > 0)) problems.push({ problem: 'dead-reference' });
  return problems;
}

function inputWarnings(earlyVoltageV: number): InputWarning[] {
  return Number.isFinite(earlyVoltageV) ? [] : ['no-early-voltage'];
}

/**
 * Solves a design and keeps the internals that sweeps and sensitivities reuse. `warmStart`: a
 * solved stage of the same topology whose operating point seeds the Newton iteration.
 */
export function solveStage(design: Design, warmStart?: SolvedCircuit): StageSolution {
  const solved = solveCircuit(design, warmStart);
  const { result, problems } = conditionFigures(solved);
  const [differentialBandwidthHz, cmrrCornerHz] = cornersHz(solved.stage, [DIFFERENTIAL_GAIN, SINGLE_ENDED_CMRR]);
  return { ...solved, result: { ...result, cmrrCornerHz, differentialBandwidthHz, ...transferFigures(solved), slewRateVPerS: solvedSlewRateVPerS(solved) }, problems };
}

/**
 * Solves a design as solveStage does, without the corner searches (about a quarter of a plain
 * solve): for the conditions, sweeps and sizing steps, which read only the other figures.
 */
export function solveCondition(design: Design, warmStart?: SolvedCircuit): ConditionSolution {
  const solved = solveCircuit(design, warmStart);
  return { ...solved, ...conditionFigures(solved) };
}

/**
 * Solves the operating point and the small-signal stage only (no figures): for sensitivities,
 * where only transfers are read. `warmStart` as in solveStage.
 */
/** The tail current of a design's operating point alone, A (no small-signal solve): a sweep that reads nothing else. */
export function solvedTailCurrentA(design: Design): number {
  return currentIntoElementsA(solveStageOperatingPoint(design).op, TAIL_NODE, true);
}

export function solveCircuit(design: Design, warmStart?: SolvedCircuit): SolvedCircuit {
  const { model, op, driveNodes } = solveStageOperatingPoint(design, warmStart?.op);
  return { design, model, op, stage: smallSignalStage(op, driveNodes, model.parameters, design.temperatureC ?? NOMINAL_TEMPERATURE_C) };
}

/** dB of a gain's magnitude over another's; null where the second is zero. */
function rejectionDb(gain: number, leak: number): number | null {
  return leak === 0 ? null : 20 * Math.log10(Math.abs(gain / leak));
}

/**
 * Supply rejection from each rail at low frequency (ENGINE-CONTRACT.md `psrrDb`): the
 * differential (single-ended) gain over the gain from the rail's small-signal voltage to
 * v(c1,c2) (v(c1)); a matched pair moves both collectors alike, so its differential figure is null.
 */
function supplyRejectionDb(stage: SmallSignalStage, matched: boolean): AnalyzeResult['psrrDb'] {
  const { collector1, betweenCollectors } = stage.outputs;
  const rail = (response: number[]): RailRejection => ({
    singleEnded: rejectionDb(stage.low.singleEndedGain.re, readOutput(response, collector1)) ?? Number.POSITIVE_INFINITY,
    differential: matched ? null : rejectionDb(stage.low.differentialGain.re, readOutput(response, betweenCollectors)),
  });
  return { positive: rail(stage.supply.positive), negative: rail(stage.supply.negative) };
}

/**
 * Small-signal differential input resistance (ENGINE-CONTRACT.md `inputResistanceOhm`): under
 * the differential drive (+½ on drive1, −½ on drive2), v(in1) − v(in2) over the current drive1
 * sends into the circuit; with source resistors that current flows through RS1 into in1, and
 * v(in1) − v(in2) is read behind them, so they stay outside the figure.
 */
function inputResistanceOhm(op: OperatingPoint, stage: SmallSignalStage): number {
  const ic = op.circuit;
  const [drive1, drive2] = stage.driveNodes.map((name) => ic.nodeRef(name));
  const x = stage.differential;
  const fixed = (ref: number) => (ref === drive1 ? 0.5 : ref === drive2 ? -0.5 : 0);
  const [in1, in2] = INPUT_NODES.map((name) => ic.nodeRef(name)).map((ref) => (ref >= 0 ? x[ref] : fixed(ref)));
  return Math.abs((in1 - in2) / smallSignalCurrentIntoA(op, drive1, x, fixed));
}

/** The figures that take further operating points: the offset, its current and drift, and the linear range. */
function transferFigures({ design, model, op, stage }: SolvedCircuit): Pick<AnalyzeResult, 'inputOffsetCurrentA' | 'inputOffsetVoltageV' | 'offsetDriftVPerC' | 'linearInputRangeV'> {
  const base: SolvedOperatingPoint = { model, op, driveNodes: stage.driveNodes };
  const gain = stage.low.differentialGain.re;
  const offset = inputOffset(design, base, gain);
  const [in1A, in2A] = driveCurrentsA(offset.at);
  let symmetric = base;
  let symmetricGain = gain;
  const plain = withoutMismatch(design);
  if (!pairIsMatched(design)) {
    symmetric = solveStageOperatingPoint(plain, op);
    symmetricGain = smallSignalStage(symmetric.op, symmetric.driveNodes).low.differentialGain.re;
  }
  return {
    inputOffsetVoltageV: offset.offsetV,
    // a matched pair's two input currents are equal by symmetry: rounding decides nothing; a PNP
    // pair's base currents leave the inputs, reported in the direction its transistors conduct
    inputOffsetCurrentA: pairIsMatched(design) ? 0 : stagePolarity(design) * (in1A - in2A),
    offsetDriftVPerC: offsetDriftVPerC(design, offset),
    linearInputRangeV: linearInputRangeV(plain, symmetric, symmetricGain),
  };
}


/**
 * The four low-frequency gains and the rejection they give, as every stage (bipolar or MOS)
 * reports them: a matched pair's differential common-mode gain is 0 exactly and its differential
 * rejection null (`pairIsMatched`).
 */
export function lowFrequencyFigures(stage: SmallSignalStage, matched: boolean): Pick<AnalyzeResult, 'differentialGain' | 'singleEndedGain' | 'commonModeGain' | 'differentialCommonModeGain' | 'cmrrDb'> {
  const low = stage.low;
  return {
    differentialGain: low.differentialGain.re,
    singleEndedGain: low.singleEndedGain.re,
    commonModeGain: low.commonModeGain.re,
    differentialCommonModeGain: matched ? 0 : low.differentialCommonModeGain.re,
    cmrrDb: {
      singleEnded: 20 * Math.log10(Math.abs(low.singleEndedGain.re / low.commonModeGain.re)),
      differential: matched ? null : 20 * Math.log10(Math.abs(low.differentialGain.re / low.differentialCommonModeGain.re)),
    },
  };
}
/**
 * The figures of a solved circuit that need nothing but its solve (ConditionResult: every
 * figure but a full solve's own, FullSolveField), and its operating-point problems as figures.
 */
function conditionFigures(solved: SolvedCircuit): { result: ConditionResult; problems: OperatingPointProblem[] } {
  const { design, model, op, stage } = solved;
  const ic = op.circuit;
  const v = op.voltagesV;
  const transistors = transistorOperatingPoints(ic, op, model.thermalVoltageV);
  const q1 = transistors.find((q) => q.name === 'Q1')!;
  const pair = transistors.filter((q) => q.name === 'Q1' || q.name === 'Q2');
  const tailNodeRef = ic.nodeRef(TAIL_NODE);
  const outputTransistors = transistors.filter((_, i) => ic.transistors[i].tail && ic.transistors[i].c === tailNodeRef);
  const tailNodeV = nodeVoltage(ic, v, tailNodeRef);
  // Currents in the direction the stage's transistors conduct: a PNP stage's tail delivers its
  // current into t, and its reference branch returns to the negative rail (circuit.ts, stageRails)
  const polarity = stagePolarity(design);
  const rails = stageRails(design);
  const referenceCurrentA = polarity * currentIntoElementsA(op, rails.load, true);
  const positiveA = currentIntoElementsA(op, RAIL_NODES.positive, false);
  const negativeA = currentIntoElementsA(op, RAIL_NODES.negative, false);
  const matched = pairIsMatched(design);
  const closedForm = closedFormTailRout(design.tail, transistors, model.beta, model.earlyVoltageV, model.thermalVoltageV);
  const problems = operatingPointProblems(transistors, referenceCurrentA, design.tail.topology !== 'resistor');
  const problemTexts = problems.map(operatingPointProblemText);
  const inputCurrentsA = driveCurrentsA({ model, op, driveNodes: stage.driveNodes });
  const result: ConditionResult = {
    tailCurrentA: polarity * currentIntoElementsA(op, TAIL_NODE, true),
    collectorCurrentA: q1.collectorCurrentA,
    collectorVoltageV: nodeVoltage(ic, v, ic.nodeRef(COLLECTOR_NODES[0])),
    tailNodeVoltageV: tailNodeV,
    transconductanceS: spiceTransconductanceS(op.transistors[ic.transistors.findIndex((q) => q.name === 'Q1')]),
    tailOutputResistanceOhm: stage.tailOutputResistanceOhm,
    ...lowFrequencyFigures(stage, matched),
    ac: acEntries({ design, model, op, stage }, matched),
    inputBiasCurrentA: (polarity * (inputCurrentsA[0] + inputCurrentsA[1])) / 2,
    psrrDb: supplyRejectionDb(stage, matched),
    inputResistanceOhm: inputResistanceOhm(op, stage),
    // Power delivered by the rails: Σ V·I, I the current each rail sends into the circuit.
    powerW: design.supply.positiveV * positiveA + design.supply.negativeV * negativeA,
    warnings: [...problemTexts, ...inputWarnings(model.earlyVoltageV).map(inputWarningText)],
    operatingPointProblems: problemTexts,
    tailOutputResistanceClosedForm: closedForm,
    transistors,
    collector2VoltageV: nodeVoltage(ic, v, ic.nodeRef(COLLECTOR_NODES[1])),
    referenceCurrentA,
    tailComplianceMarginV:
      design.tail.topology === 'resistor'
        ? polarity * (tailNodeV - nodeVoltage(ic, v, ic.nodeRef(rails.tail)))
        : Math.min(...outputTransistors.map((q) => q.vceV - model.vceSatV)),
    pairSaturationMarginV: Math.min(...pair.map((q) => q.vceV - model.vceSatV)),
  };
  return { result, problems };
}

/**
 * Predicts a fully sized design's operating point, gains, rejection, tail output resistance,
 * CMRR corner and power (ENGINE-CONTRACT.md, `analyze`). Pure: same input, same output.
 */
export function analyze(design: Design): AnalyzeResult {
  return solveStage(design).result;
}
