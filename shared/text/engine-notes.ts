/**
 * The engine's sentences, written from the figures it returns: how each value was sized, the
 * tail's output resistance beside its textbook limit, what would hold the gain over the range,
 * the recommendation's summary and an undecided check's reason. The engine computes; this
 * module only rounds, picks a prefix and words (`recommend` fills the command line's text
 * fields with it).
 */
import type { InputWarning, OperatingPointProblem } from '../engine/analyze';
import type { GainRemedy, HeadroomLimit, MeasuredFacts, ProblemAt } from '../engine/option-evaluation';
import type { SizingStep } from '../engine/sizing';
import type { CurrentBound, WindowRequirement } from '../engine/current-window';
import { MODEL_LIMITED_ABOVE_DB, type MismatchKind, type MismatchShares } from '../engine/mismatch';
import type { OptionFacts, SelectionPolicy } from '../engine/types';
import { formatQuantity } from '../units/format-quantity';

const ohms = (r: number) => formatQuantity(r, 'Ohm');
const amps = (i: number) => formatQuantity(i, 'A');
const volts = (v: number) => formatQuantity(v, 'V');
/** A fraction as a percentage with one decimal, e.g. 0.2214 -> "22.1 %"; "over 99.9 %" for a gain all but gone. */
const percentText = (fraction: number) => (fraction > 0.999 ? 'over 99.9 %' : `${(fraction * 100).toFixed(1)} %`);

/** The textbook formula of RC for each way the pair is sized. */
const COLLECTOR_FORMULAS: Record<Extract<SizingStep, { step: 'collector' }>['formula'], string> = {
  degenerated: '|A|·(RE + 1/gm)',
  differential: '|Ad|·VT/IC',
  'single-ended': '2·|Ase|·VT/IC',
};

/** One sentence on a transistor out of the forward-active region or a dead reference branch. */
export function operatingPointProblemText(p: OperatingPointProblem): string {
  switch (p.problem) {
    case 'saturated':
      return `${p.transistor} is saturated: VCE = ${p.vceV.toFixed(3)} V and its current gain is ${percentText(p.currentGainLossFraction)} below its forward-active value (saturated: more than ${percentText(p.limitFraction)} below).`;
    case 'cut-off':
      return `${p.transistor} is cut off: its collector current is ${p.collectorCurrentA.toExponential(2)} A.`;
    case 'dead-reference':
      return 'The reference branch carries no current: the rails are too close for this tail.';
  }
}

/** An operating-point problem with the condition it appears at, e.g. "ICM 0 V, 27 °C: Q4 is saturated: …". */
export function problemAtText({ conditionLabel, problem }: ProblemAt): string {
  return `${conditionLabel}: ${operatingPointProblemText(problem)}`;
}

const INPUT_WARNINGS: Readonly<Record<InputWarning, string>> = {
  'no-early-voltage': "No Early voltage (VAF) given: output resistances then rest only on SPICE's GMIN, so the rejection figures mean little; enter the device's VAF.",
};

/** One sentence on a warning about the inputs themselves. */
export function inputWarningText(warning: InputWarning): string {
  return INPUT_WARNINGS[warning];
}

function signedFigure(x: number, unit: string): string {
  return `${x < 0 ? '−' : ''}${Math.abs(Number(x.toPrecision(4)))} ${unit}`;
}

/** A readable label for a condition, e.g. "ICM −2 V, 85 °C" (it also names the condition in figures and facts). */
export function conditionLabel(inputCommonModeV: number, temperatureC: number): string {
  return `ICM ${signedFigure(inputCommonModeV, 'V')}, ${signedFigure(temperatureC, '°C')}`;
}

/** " = 10.2 kΩ": a hand formula's value, where it is a resistance at all (the rails may leave it none). */
function hand(valueOhm: number): string {
  return valueOhm > 0 ? ` = ${ohms(valueOhm)}` : '';
}

/** The requirement that sets a bound of the tail-current window, or the picked current, in words. */
export function windowRequirementText(requirement: WindowRequirement | 'preferred' | 'fixed'): string {
  switch (requirement) {
    case 'noise':
      return 'the noise limit';
    case 'noise-base-current':
      return "the noise limit (the base current's noise in the source resistance)";
    case 'slew-rate':
      return 'the slew-rate target';
    case 'bandwidth':
      return 'the bandwidth target';
    case 'power-budget':
      return 'the power budget';
    case 'input-bias-current':
      return 'the input bias-current limit';
    case 'preferred':
      return "the policy's share of the power budget";
    case 'fixed':
      return 'the spec (a fixed tail current)';
  }
}

/** A bound of the window: "≥ 640 µA for the noise limit (solved)". */
function boundText(b: CurrentBound): string {
  const value = Number.isFinite(b.currentA) ? amps(b.currentA) : 'no current';
  return `${b.side === 'lower' ? '≥' : '≤'} ${value} for ${windowRequirementText(b.requirement)} (${b.basis === 'solved' ? 'hand formula scaled to the solved circuit' : 'hand formula'})`;
}

/** The tail-current window as a fact's sentence; without a window, what set the current instead. */
function tailCurrentWindowFact(sized: MeasuredFacts['tailCurrentWindow']): string {
  if (!sized) return "No target bounds the tail current: it is the power budget's share, or the spec's or the designer's own.";
  const { window, pick } = sized;
  return tailCurrentWindowNote({ step: 'tail-current-window', bounds: window.bounds, lower: window.lower, upper: window.upper, empty: window.empty, currentA: pick.currentA, setBy: pick.setBy });
}

function tailCurrentWindowNote(s: Extract<SizingStep, { step: 'tail-current-window' }>): string {
  const bounds = s.bounds.map(boundText).join('; ');
  if (s.empty) {
    return `No tail current meets every target: ${windowRequirementText(s.lower!.requirement)} needs ${amps(s.lower!.currentA)} or more, ${windowRequirementText(s.upper!.requirement)} allows ${amps(s.upper!.currentA)} at most (${bounds}); sized at ${amps(s.currentA)}, the ceiling.`;
  }
  return `Tail current ${amps(s.currentA)}, set by ${windowRequirementText(s.setBy)}, inside the window the targets allow (${bounds}).`;
}

/** One sentence on how a value was chosen. */
export function sizingNote(s: SizingStep): string {
  switch (s.step) {
    case 'designer-values':
      return 'Values given by the designer (override).';
    case 'tail-current-fixed':
      return `Tail current ${amps(s.currentA)}, fixed by the spec.`;
    case 'tail-current-from-budget': {
      const why = s.capped ? `capped at ${amps(s.capA)}` : `${s.powerUseFraction * 100} % of the ${formatQuantity(s.powerBudgetW, 'W')} budget across ${volts(s.railSpanV)}`;
      const split = s.referenceRatio > 0 ? `, shared with a reference branch of ${s.referenceRatio}× the tail current` : '';
      return `Tail current ${amps(s.currentA)}: ${why}${split}.`;
    }
    case 'tail-current-window':
      return tailCurrentWindowNote(s);
    case 'resistor-tail':
      return `RT ≈ (VICM − VBE − V−)/Itail${hand(s.handOhm)} at the mid input common mode, refined by solving the stage, snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'mirror-reference':
      return `RREF ≈ (V+ − V− − ${s.stackedVbe === 1 ? 'VBE' : '2·VBE'})/Itail${hand(s.handOhm)}, refined by solving the stage (base currents, Early effect), snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'degeneration-emitters':
      return `RE for about ${volts(s.dropV)} across each emitter resistor (half the room above compliance at the lowest input common mode, kept within 0.1–1 V), snapped to ${ohms(s.resistanceOhm)}.`;
    case 'degenerated-reference':
      return `RREF ≈ (V+ − V− − VBE − Itail·RE)/Itail${hand(s.handOhm)}, refined by solving the stage, snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'widlar-reference':
      return `RREF for a reference current of ${s.referenceRatio}× the tail current, (V+ − V− − VBE)/Iref${hand(s.handOhm)}, snapped to ${ohms(s.resistanceOhm)}.`;
    case 'widlar-emitter':
      return `RE from Iout·RE = VT·ln(Iref/Iout)${hand(s.handOhm)}, refined by solving the stage, snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'ptat-cell':
      return `PTAT (constant-gm) cell: Q4 at ${s.areaRatio}× Q3's emitter area, RE4 from Itail·RE4 = VT·ln(N)${hand(s.handOhm)}, refined by solving the stage (base currents, the start-up current, the PNP mirror's Early effect), snapped to ${ohms(s.resistanceOhm)} (${s.series}); the tail current then rises in proportion to absolute temperature, so gm = IC/VT, and a resistor-loaded gain, hold over temperature. Start-up RSU ${ohms(s.startupOhm)} feeds about ${Math.round(s.startupShare * 100)} % of the tail current into Q3.`;
    case 'temperature-degeneration':
      return `With gm alone the gain would move by ±${s.spreadPercent.toFixed(1)} % from ${signedFigure(s.temperatureMinC, '°C')} to ${signedFigure(s.temperatureMaxC, '°C')} (re = VT/IC grows with T), more than the ±${s.allowedPercent.toFixed(1)} % of the tolerance the sizing lets temperature take: pair emitter degeneration RE ≈ (re(Tmax) − re(Tmin))/(2·${s.allowedPercent.toFixed(1)} %) − re, snapped to ${ohms(s.resistanceOhm)} (${s.series}), so the gain rests on RC/(RE + re).`;
    case 'pair-degeneration':
      return `The gain alone would drop only ${volts(s.gainDropV)} across RC, less than the ${volts(s.neededDropV)} the output swing needs (${s.swingDropFactor}× its peak per collector): pair emitter degeneration RE ≈ RC/|A| − 1/gm, snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'collector':
      return `RC ≈ ${COLLECTOR_FORMULAS[s.formula]}${hand(s.handOhm)}, refined by solving the stage with the sized tail to ${ohms(s.exactOhm)}, snapped to ${ohms(s.resistanceOhm)} (${s.series}).`;
    case 'collector-short': {
      const [why, remedy] =
        s.limit === 'largest-resistance'
          ? [`RC stops at ${ohms(s.resistanceOhm)}, the largest resistance a design may have, at this tail current`, 'raise the power budget (or the tail current) or lower the target']
          : [`the gain peaks at RC ≈ ${ohms(s.resistanceOhm)}: a larger RC pulls the collectors down towards saturation (and the Early effect caps gm·RC)`, 'lower the target or widen the rails'];
      return `The gain target ${Number(s.targetGain.toPrecision(4))} V/V is out of reach for this option: ${why}, giving ${Number(s.reachedGain.toPrecision(4))} V/V; ${remedy}.`;
    }
  }
}

/** The solved tail output resistance beside its textbook limit, as one phrase. */
export function tailOutputResistanceNote(routOhm: number, closedForm: { valueOhm: number | null; formula: string }): string {
  const textbook = closedForm.valueOhm === null ? 'unbounded without an Early voltage' : `≈ ${ohms(closedForm.valueOhm)}`;
  return `${ohms(routOhm)} by node analysis (textbook ${closedForm.formula} ${textbook})`;
}

/** Each mismatch of the model, as the note names it. */
const MISMATCH_WORDS: Readonly<Record<MismatchKind, string>> = { load: 'load resistors', is: 'VBE', beta: 'beta', early: 'Early voltage' };

/**
 * What sets the differential worst case: each mismatch's share of its common-mode gain, largest
 * first; above MODEL_LIMITED_ABOVE_DB, plainly that the figure is limited only by the model.
 * Empty for a single-ended output.
 */
export function cmrrDifferentialLimitNote(worstCaseDb: number | null, shares: MismatchShares | null): string {
  if (worstCaseDb === null || shares === null) return '';
  const ranked = (Object.keys(shares) as MismatchKind[]).sort((a, b) => shares[b] - shares[a]);
  const parts = ranked.map((kind) => `${MISMATCH_WORDS[kind]} ${Math.round(shares[kind])} %`).join(', ');
  const setBy = `Shares of the worst-case common-mode gain by mismatch: ${parts}.`;
  if (!(worstCaseDb > MODEL_LIMITED_ABOVE_DB)) return setBy;
  return `${setBy} Limited only by the model: above ${MODEL_LIMITED_ABOVE_DB} dB, effects it leaves out (thermal gradients across the pair, leakage, source-impedance imbalance, layout) usually set the real figure, so read it as an upper bound to confirm on the bench.`;
}

/** What would hold the gain over the spec's range, in plain words (why each: option-evaluation.ts). */
export const GAIN_REMEDY_WORDS: Readonly<Record<GainRemedy, string>> = {
  'degeneration-or-rising-tail-current':
    'pair emitter degeneration (the gain then rests on RC/RE more than on IC/VT) or a tail current that rises with temperature (the PTAT (constant-gm) source, a ΔVBE cell, listed with a PNP in the spec)',
  'more-degeneration':
    'more pair emitter degeneration (the gain then rests on RC/RE more than on IC/VT); a tail current that rises with temperature, the PTAT source, needs an NPN pair (its mirror is of the opposite type)',
  'ptat-or-more-degeneration':
    'more pair emitter degeneration than this pair has (the gain then rests on RC/RE still more than on IC/VT) or a tail current that rises with temperature (the PTAT (constant-gm) source, a ΔVBE cell, listed with a PNP in the spec)',
  'beyond-ptat':
    "what the PTAT source does not cancel: the resistors' temperature coefficient (tighter-tempco loads and RE4), the current gain's drift (a device with less XTB) and its PNP mirror's Early effect",
  'current-source-tail': 'a current-source tail instead of the resistor (the tail current then stops following the input common mode)',
  'higher-resistance-tail': 'a tail with a higher output resistance (its current then moves less with the input common mode)',
};

/**
 * The words for what limits one end of the input common-mode range: the headroom it is and what
 * running out of it means. The tail's compliance runs out towards the rail its element returns
 * to (the negative one at an NPN stage's low end, the positive one at a PNP stage's high end); the
 * pair saturates with the output swing's peak towards its own inputs (negative at an NPN stage's
 * high end, positive at a PNP stage's low end).
 */
function headroomFacts(prefix: 'icmLow' | 'icmHigh', end: 'low' | 'high', limit: HeadroomLimit): Record<string, string> {
  const words =
    limit === 'tail-compliance'
      ? { headroom: "the tail source's compliance headroom", shortfall: `the tail node sits too close to the ${end === 'low' ? 'negative' : 'positive'} rail` }
      : { headroom: `the pair's collector headroom with the output swing's ${end === 'low' ? 'positive' : 'negative'} peak`, shortfall: 'the pair saturates' };
  return { [`${prefix}Headroom`]: words.headroom, [`${prefix}Shortfall`]: words.shortfall };
}

/**
 * An option's facts with their worded ones written from the figures beside them: the remedy's
 * words for its id, each operating-point problem with its condition, the tail output resistance
 * beside its textbook limit. Keys keep their order.
 */
export function wordedFacts(measured: MeasuredFacts): OptionFacts {
  const facts: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(measured)) {
    if (key === 'gainOverConditionsRemedyId') facts.gainOverConditionsRemedy = GAIN_REMEDY_WORDS[value as GainRemedy];
    else if (key === 'icmLowLimitId') Object.assign(facts, headroomFacts('icmLow', 'low', value as HeadroomLimit));
    else if (key === 'icmHighLimitId') Object.assign(facts, headroomFacts('icmHigh', 'high', value as HeadroomLimit));
    else if (key === 'operatingPointProblemsAt') facts.operatingPointProblems = (value as ProblemAt[]).map(problemAtText);
    else if (key === 'cmrrDifferentialSharesPercent') facts.cmrrDifferentialLimitNote = cmrrDifferentialLimitNote(measured.cmrrDifferentialWorstCaseDb, value as MismatchShares | null);
    else if (key === 'tailCurrentWindow') facts.tailCurrentWindowNote = tailCurrentWindowFact(measured.tailCurrentWindow);
    else facts[key] = value;
  }
  const closedForm = { valueOhm: measured.tailOutputResistanceClosedFormOhm, formula: measured.tailOutputResistanceFormula };
  facts.tailOutputResistanceNote = tailOutputResistanceNote(measured.tailOutputResistanceOhm, closedForm);
  facts.outputCmrrBasis = outputCmrrBasis(measured.isDifferentialOutput, measured.worstCmrrCorner);
  return facts as unknown as OptionFacts;
}

/** Which rejection figure judges the spec's output, in words, e.g. "single-ended, tail-limited, worst corner ICM −2 V, 85 °C". */
export function outputCmrrBasis(differentialOutput: boolean, worstSingleEndedCorner: string): string {
  return differentialOutput
    ? 'differential, mismatch-limited worst case: resistors at opposite tolerance extremes and 3σ VBE mismatch, at the governing corner'
    : `single-ended, tail-limited, worst corner ${worstSingleEndedCorner}`;
}

/** One sentence on why the recommendation is what it is. */
export function recommendationSummary(recommended: boolean, policy: SelectionPolicy, passingCount: number, total: number): string {
  if (!recommended) return `None of the ${total} options passes every blocking check; the ranking shows what each one lacks.`;
  const why = policy === 'simplest-sufficient' ? 'The simplest option that passes every blocking check' : 'The passing option with the highest rejection';
  return `${why} (${passingCount} of ${total} options pass).`;
}

/** The reason of a check an unsolved option cannot decide. */
export function undecidedReason(solverMessage: string): string {
  return `Not decided: this option could not be solved at the spec's conditions (${solverMessage}).`;
}
