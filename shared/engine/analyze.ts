/**
 * `analyze`: predictions for one fully sized stage (ENGINE-CONTRACT.md). The operating point is
 * solved self-consistently and the small-signal stage as a whole (operating-point.ts,
 * small-signal.ts); this file turns the solution into the contract's figures.
 */
import { COLLECTOR_NODES, RAIL_NODES, TAIL_NODE, stageCircuit } from './circuit';
import { closedFormTailRout } from './closed-form';
import { deviceModel, type DeviceModel } from './device';
import { NOMINAL_TEMPERATURE_C } from './constants';
import { nodeVoltage, type IndexedCircuit } from './node-system';
import { ConvergenceError, solveOperatingPoint, type OperatingPoint } from './operating-point';
import { withHardFields } from './convergence-hints';
import { magnitude, smallSignalStage, transferAt, type Complex, type SmallSignalStage } from './small-signal';
import type { AnalyzeResult, Design, Region, TransistorOperatingPoint } from './types';
import { inputWarningText, operatingPointProblemText } from '../text/engine-notes';

/** Collector current below which a transistor counts as cut off, A (well under any useful bias). */
const CUT_OFF_CURRENT_A = 1e-10;
/** A differential common-mode gain below this fraction of the common-mode gain is "zero" (matched pair). */
const MATCHED_PAIR_RATIO = 1e-9;

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

/** Small-signal transfers of a solved stage at a frequency (Hz). */
export interface StageTransfers {
  differentialGain: Complex;
  singleEndedGain: Complex;
  commonModeGain: Complex;
  differentialCommonModeGain: Complex;
}

/** Current leaving node `nodeName` into the elements of the circuit, A (KCL bookkeeping). */
function currentIntoElementsA(op: OperatingPoint, nodeName: string, onlyTail: boolean): number {
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
    const ev = op.transistors[i];
    if (q.ci === node) totalA += ev.icA;
    if (q.bi === node) totalA += ev.ibA;
    if (q.ei === node) totalA -= ev.icA + ev.ibA;
  });
  return totalA;
}

function transistorOperatingPoints(ic: IndexedCircuit, op: OperatingPoint, vceSatV: number): TransistorOperatingPoint[] {
  return ic.transistors.map((q, i) => {
    const v = op.voltagesV;
    // At the junctions (internal nodes), as SPICE reports vbe, vbc and vce
    const vc = nodeVoltage(ic, v, q.ci);
    const vb = nodeVoltage(ic, v, q.bi);
    const ve = nodeVoltage(ic, v, q.ei);
    const ev = op.transistors[i];
    const vceV = vc - ve;
    let region: Region = 'forward-active';
    if (ev.icA < CUT_OFF_CURRENT_A) region = 'cut-off';
    else if (vceV < vceSatV) region = 'saturated';
    return { name: q.name, collectorCurrentA: ev.icA, baseCurrentA: ev.ibA, vbeV: vb - ve, vceV, vcbV: vc - vb, region };
  });
}

/** The four low-frequency transfers of the contract at a frequency, with the tail capacitance. */
export function transfersAt(solution: Pick<StageSolution, 'stage' | 'design'>, frequencyHz: number): StageTransfers {
  const { stage, design } = solution;
  const omegaCtS = 2 * Math.PI * frequencyHz * (design.tailCapacitanceF ?? 0);
  const { collector1, betweenCollectors } = stage.outputs;
  return {
    differentialGain: transferAt(stage, stage.differential, betweenCollectors, omegaCtS),
    singleEndedGain: transferAt(stage, stage.differential, collector1, omegaCtS),
    commonModeGain: transferAt(stage, stage.commonMode, collector1, omegaCtS),
    differentialCommonModeGain: transferAt(stage, stage.commonMode, betweenCollectors, omegaCtS),
  };
}

/** Single-ended CMRR in dB at a frequency: 20·log10|Ase/Acm|. */
export function singleEndedCmrrDbAt(solution: Pick<StageSolution, 'stage' | 'design'>, frequencyHz: number): number {
  const t = transfersAt(solution, frequencyHz);
  return 20 * Math.log10(magnitude(t.singleEndedGain) / magnitude(t.commonModeGain));
}

/**
 * Frequency where the single-ended CMRR has fallen 3 dB because of Ct, in closed form. Both
 * transfers share the denominator 1 + jωCt·u (u = z[t]), so
 * Ase/Acm = (h0 + jw·A)/(g0 + jw·B) with w = ωCt, A = h0·u − x_d[t]·z[c1], B = g0·u − x_c[t]·z[c1];
 * |Ase/Acm|² = |h0/g0|²/2 gives w² = g0²·h0²/(h0²·B² − 2·g0²·A²). Null when Ct = 0 or never reached.
 */
function cmrrCornerHz(stage: SmallSignalStage, tailCapacitanceF: number): number | null {
  if (!(tailCapacitanceF > 0)) return null;
  const c1 = stage.index(COLLECTOR_NODES[0]);
  const t = stage.tailIndex;
  const u = stage.tailInjection[t];
  const zOut = stage.tailInjection[c1];
  const h0 = stage.differential[c1];
  const g0 = stage.commonMode[c1];
  const a = h0 * u - stage.differential[t] * zOut;
  const b = g0 * u - stage.commonMode[t] * zOut;
  const denominator = h0 * h0 * b * b - 2 * g0 * g0 * a * a;
  if (!(denominator > 0)) return null;
  const omegaCt = Math.sqrt((g0 * g0 * h0 * h0) / denominator);
  return omegaCt / (2 * Math.PI * tailCapacitanceF);
}

/** A transistor out of the forward-active region, or a reference branch carrying no current (worded at the edge). */
export type OperatingPointProblem =
  | { problem: 'saturated'; transistor: string; vceV: number; vceSatV: number }
  | { problem: 'cut-off'; transistor: string; collectorCurrentA: number }
  | { problem: 'dead-reference' };

/** A warning about the inputs themselves (not the operating point). */
export type InputWarning = 'no-early-voltage';

/** Transistors out of the forward-active region and a dead reference branch. */
function operatingPointProblems(transistors: TransistorOperatingPoint[], vceSatV: number, referenceCurrentA: number, hasReference: boolean): OperatingPointProblem[] {
  const problems: OperatingPointProblem[] = [];
  for (const q of transistors) {
    if (q.region === 'saturated') problems.push({ problem: 'saturated', transistor: q.name, vceV: q.vceV, vceSatV });
    else if (q.region === 'cut-off') problems.push({ problem: 'cut-off', transistor: q.name, collectorCurrentA: q.collectorCurrentA });
  }
  if (hasReference && !(referenceCurrentA > 0)) problems.push({ problem: 'dead-reference' });
  return problems;
}

function inputWarnings(earlyVoltageV: number): InputWarning[] {
  return Number.isFinite(earlyVoltageV) ? [] : ['no-early-voltage'];
}

/** Starting-guess VBE: the device's VBE at a rough tail-current estimate (rails over the largest resistor). */
function vbeGuessV(design: Design, model: DeviceModel): number {
  const tail = design.tail;
  const tailOhm = tail.topology === 'resistor' ? tail.resistanceOhm : tail.referenceResistanceOhm;
  const currentA = Math.max((design.supply.positiveV - design.supply.negativeV) / (2 * tailOhm), 1e-9);
  return model.thermalVoltageV * Math.log(currentA / model.saturationCurrentA);
}

/**
 * Solves a design and keeps the internals that sweeps and sensitivities reuse. `warmStart`: a
 * solved stage of the same topology whose operating point seeds the Newton iteration.
 */
export function solveStage(design: Design, warmStart?: SolvedCircuit): StageSolution {
  const solved = solveCircuit(design, warmStart);
  return { ...solved, ...stageFigures(solved) };
}

/**
 * Solves the operating point and the small-signal stage only (no figures): for sensitivities,
 * where only transfers are read. `warmStart` as in solveStage.
 */
export function solveCircuit(design: Design, warmStart?: SolvedCircuit): SolvedCircuit {
  const temperatureC = design.temperatureC ?? NOMINAL_TEMPERATURE_C;
  const model = deviceModel(design.device, temperatureC);
  let op: OperatingPoint;
  try {
    op = solveOperatingPoint(stageCircuit(design, vbeGuessV(design, model)), model, warmStart?.op);
  } catch (error) {
    throw error instanceof ConvergenceError ? withHardFields(error, design) : error;
  }
  return { design, model, op, stage: smallSignalStage(op) };
}

/** The contract's figures of a solved circuit, and its operating-point problems as figures. */
function stageFigures({ design, model, op, stage }: SolvedCircuit): { result: AnalyzeResult; problems: OperatingPointProblem[] } {
  const ic = op.circuit;
  const v = op.voltagesV;
  const transistors = transistorOperatingPoints(ic, op, model.vceSatV);
  const q1 = transistors.find((q) => q.name === 'Q1')!;
  const pair = transistors.filter((q) => q.name === 'Q1' || q.name === 'Q2');
  const tailNodeRef = ic.nodeRef(TAIL_NODE);
  const outputTransistors = transistors.filter((_, i) => ic.transistors[i].tail && ic.transistors[i].c === tailNodeRef);
  const tailNodeV = nodeVoltage(ic, v, tailNodeRef);
  const referenceCurrentA = currentIntoElementsA(op, RAIL_NODES.positive, true);
  const positiveA = currentIntoElementsA(op, RAIL_NODES.positive, false);
  const negativeA = currentIntoElementsA(op, RAIL_NODES.negative, false);
  const low = transfersAt({ stage, design }, 0);
  const cmrrSingleDb = 20 * Math.log10(Math.abs(low.singleEndedGain.re / low.commonModeGain.re));
  const matched = Math.abs(low.differentialCommonModeGain.re) <= MATCHED_PAIR_RATIO * Math.abs(low.commonModeGain.re);
  const closedForm = closedFormTailRout(design.tail, transistors, model.beta, model.earlyVoltageV, model.thermalVoltageV);
  const problems = operatingPointProblems(transistors, model.vceSatV, referenceCurrentA, design.tail.topology !== 'resistor');
  const problemTexts = problems.map(operatingPointProblemText);
  const result: AnalyzeResult = {
    tailCurrentA: currentIntoElementsA(op, TAIL_NODE, true),
    collectorCurrentA: q1.collectorCurrentA,
    collectorVoltageV: nodeVoltage(ic, v, ic.nodeRef(COLLECTOR_NODES[0])),
    tailNodeVoltageV: tailNodeV,
    transconductanceS: op.transistors[ic.transistors.findIndex((q) => q.name === 'Q1')].dIcDVbeS,
    tailOutputResistanceOhm: stage.tailOutputResistanceOhm,
    differentialGain: low.differentialGain.re,
    singleEndedGain: low.singleEndedGain.re,
    commonModeGain: low.commonModeGain.re,
    differentialCommonModeGain: matched ? 0 : low.differentialCommonModeGain.re,
    cmrrDb: {
      singleEnded: cmrrSingleDb,
      differential: matched ? null : 20 * Math.log10(Math.abs(low.differentialGain.re / low.differentialCommonModeGain.re)),
    },
    cmrrCornerHz: cmrrCornerHz(stage, design.tailCapacitanceF ?? 0),
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
        ? tailNodeV - design.supply.negativeV
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
