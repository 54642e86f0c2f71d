/**
 * A bench measurement beside the estimates (pure): the decided design's predicted curve and, when
 * a SPICE verification has finished, the simulated one; the measured-minus-predicted difference
 * at the spec frequency, each curve read by linear interpolation in log-frequency (dB values), as
 * a Bode plot is read.
 */
import { formatDb } from '../units/figures';
import { formatQuantity } from '../units/format-quantity';
import type { OptionVerification, ProposalVerificationResult } from '../verification/types';
import { pointDb, type MeasuredPoint, type MeasurementKind, type MeasurementUnit } from './measurement-csv';

/** One point of a curve in dB. */
export interface DbPoint {
  frequencyHz: number;
  db: number;
}

/**
 * The value of a curve (frequencies strictly increasing) at `frequencyHz`, linear in log10(f)
 * between the two points around it: v = v₀ + (v₁ − v₀)·log(f/f₀)/log(f₁/f₀). null outside the
 * curve's span or for a frequency ≤ 0.
 */
export function interpolateLogFrequency(points: readonly DbPoint[], frequencyHz: number): number | null {
  if (!(frequencyHz > 0) || points.length === 0) return null;
  const first = points[0];
  const last = points[points.length - 1];
  if (frequencyHz < first.frequencyHz || frequencyHz > last.frequencyHz) return null;
  for (let i = 0; i < points.length - 1; i += 1) {
    const a = points[i];
    const b = points[i + 1];
    if (frequencyHz === a.frequencyHz) return a.db;
    if (frequencyHz < b.frequencyHz) {
      const t = Math.log(frequencyHz / a.frequencyHz) / Math.log(b.frequencyHz / a.frequencyHz);
      return a.db + (b.db - a.db) * t;
    }
  }
  return last.db;
}

/**
 * The predicted curve at a frequency; below its first point (1 Hz) it holds the first value: the
 * tail capacitance is the model's only reactive element, so the prediction is flat towards DC.
 */
function predictedAt(points: readonly DbPoint[], frequencyHz: number): number | null {
  if (points.length > 0 && frequencyHz > 0 && frequencyHz < points[0].frequencyHz) return points[0].db;
  return interpolateLogFrequency(points, frequencyHz);
}

/** What the measurement is compared with: the decided design's estimates. */
export interface MeasurementReference {
  /** The decided design: a ranked option, or the latest decision's own values (an override). */
  topology: string;
  source: 'option' | 'decision';
  /** Engine: single-ended rejection at nominal conditions against frequency, dB. */
  predictedCurve: DbPoint[];
  /** ngspice: the same figure from the latest finished verification; null when there is none. */
  simulatedCurve: DbPoint[] | null;
  /** Engine: the gain for the spec's output at low frequency, dB (20·log10 |A|). */
  predictedGainDb: number | null;
  /** ngspice: the same gain at nominal; null without a finished verification. */
  simulatedGainDb: number | null;
}

export interface MeasurementComparison {
  kind: MeasurementKind;
  /** Where the curves are compared. */
  atFrequencyHz: number | null;
  /** `spec`: the spec's rejection frequency; `lowest-measured`: the lowest measured frequency (a DC spec, or a gain). */
  basis: 'spec' | 'lowest-measured';
  measuredDb: number | null;
  predictedDb: number | null;
  simulatedDb: number | null;
  /** measured − predicted, dB; negative: the bench shows less than the estimate. */
  differenceFromPredictedDb: number | null;
  /** measured − simulated, dB. */
  differenceFromSimulatedDb: number | null;
  /** Why a figure is missing, in words (e.g. the spec frequency lies outside the measured span). */
  note: string | null;
}

/** The measured points in dB. */
export function measuredDbCurve(points: readonly MeasuredPoint[], unit: MeasurementUnit): DbPoint[] {
  return points.map((p) => ({ frequencyHz: p.frequencyHz, db: pointDb(p.value, unit) }));
}

const difference = (a: number | null, b: number | null) => (a === null || b === null ? null : a - b);

/**
 * Measured against predicted (and simulated): rejection at the spec frequency (at the lowest
 * measured frequency when the spec asks for DC), gain at the lowest measured frequency.
 */
export function compareMeasurement(input: {
  kind: MeasurementKind;
  unit: MeasurementUnit;
  points: readonly MeasuredPoint[];
  specFrequencyHz: number;
  reference: MeasurementReference | null;
}): MeasurementComparison {
  const measured = measuredDbCurve(input.points, input.unit);
  const lowest = measured[0]?.frequencyHz ?? null;
  const reference = input.reference;
  if (input.kind === 'gain') {
    const measuredDb = measured[0]?.db ?? null;
    const predictedDb = reference?.predictedGainDb ?? null;
    const simulatedDb = reference?.simulatedGainDb ?? null;
    return {
      kind: 'gain',
      atFrequencyHz: lowest,
      basis: 'lowest-measured',
      measuredDb,
      predictedDb,
      simulatedDb,
      differenceFromPredictedDb: difference(measuredDb, predictedDb),
      differenceFromSimulatedDb: difference(measuredDb, simulatedDb),
      note: predictedDb === null ? 'The decided design has no predicted gain to compare with.' : null,
    };
  }
  const basis = input.specFrequencyHz > 0 ? 'spec' : 'lowest-measured';
  const at = basis === 'spec' ? input.specFrequencyHz : lowest;
  const measuredDb = at === null ? null : interpolateLogFrequency(measured, at);
  const predictedDb = at === null || !reference ? null : predictedAt(reference.predictedCurve, at);
  const simulatedDb = at === null || !reference?.simulatedCurve ? null : interpolateLogFrequency(reference.simulatedCurve, at);
  let note: string | null = null;
  if (measuredDb === null && at !== null && measured.length > 0) {
    note = `The measurement spans ${formatQuantity(measured[0].frequencyHz, 'Hz')} to ${formatQuantity(measured[measured.length - 1].frequencyHz, 'Hz')}, which does not include the spec frequency ${formatQuantity(at, 'Hz')}.`;
  } else if (predictedDb === null) {
    note = reference ? `The predicted curve does not reach ${at === null ? 'the spec frequency' : formatQuantity(at, 'Hz')}.` : 'The decided design has no predicted curve to compare with.';
  }
  return {
    kind: 'cmrr',
    atFrequencyHz: at,
    basis,
    measuredDb,
    predictedDb,
    simulatedDb,
    differenceFromPredictedDb: difference(measuredDb, predictedDb),
    differenceFromSimulatedDb: difference(measuredDb, simulatedDb),
    note,
  };
}

/** The shapes the reference is read from (a stored proposal and its decisions; structural, so web and api share it). */
export interface ReferenceSources {
  options: readonly {
    topology: string;
    curves: { cmrrVsFrequency: readonly { frequencyHz: number; singleEndedDb: number }[] } | null;
    predicted: { differentialGain: number; singleEndedGain: number } | null;
  }[];
  /** The latest decision, or null. */
  decision: {
    kind: string;
    topology: string;
    evaluation: {
      curves: { cmrrVsFrequency: readonly { frequencyHz: number; singleEndedDb: number }[] } | null;
      predicted: { differentialGain: number; singleEndedGain: number } | null;
    } | null;
  } | null;
  /** The spec's output (the gain compared follows it). */
  output: 'differential' | 'single-ended';
  /** The latest whole-proposal verification's result when it finished, else null. */
  verification: Pick<ProposalVerificationResult, 'options'> | null;
}

const gainDb = (gain: number) => (gain !== 0 && Number.isFinite(gain) ? 20 * Math.log10(Math.abs(gain)) : null);

/** The simulated gain figure at nominal for the spec's output, from a verified option. */
function simulatedGain(option: OptionVerification | undefined, output: 'differential' | 'single-ended'): number | null {
  const key = output === 'differential' ? 'differentialGain' : 'singleEndedGain';
  const figure = option?.nominal?.figures.find((f) => f.key === key);
  return figure?.simulated ?? null;
}

/** What the decided design predicts (and SPICE simulated), or null when nothing is decided. */
export function measurementReference(sources: ReferenceSources): MeasurementReference | null {
  const decision = sources.decision;
  if (!decision) return null;
  const own = decision.kind === 'override';
  const option = sources.options.find((o) => o.topology === decision.topology);
  const curves = own ? (decision.evaluation?.curves ?? null) : (option?.curves ?? null);
  const predicted = own ? (decision.evaluation?.predicted ?? null) : (option?.predicted ?? null);
  const verified = sources.verification?.options.find((o) => o.topology === decision.topology && o.source === (own ? 'decision' : 'option') && o.outcome === 'verified');
  const simulatedCurve = verified ? verified.rejectionCurve.filter((p) => p.frequencyHz > 0 && Number.isFinite(p.simulatedDb)).map((p) => ({ frequencyHz: p.frequencyHz, db: p.simulatedDb })).sort((a, b) => a.frequencyHz - b.frequencyHz) : null;
  const gain = predicted ? (sources.output === 'differential' ? predicted.differentialGain : predicted.singleEndedGain) : null;
  const simulated = verified ? simulatedGain(verified, sources.output) : null;
  return {
    topology: decision.topology,
    source: own ? 'decision' : 'option',
    predictedCurve: (curves?.cmrrVsFrequency ?? []).map((p) => ({ frequencyHz: p.frequencyHz, db: p.singleEndedDb })),
    simulatedCurve: simulatedCurve && simulatedCurve.length > 0 ? simulatedCurve : null,
    predictedGainDb: gain === null ? null : gainDb(gain),
    simulatedGainDb: simulated === null ? null : gainDb(simulated),
  };
}

/** "71.2 dB" with one decimal and a typeset minus (shared/units/figures.ts). */
const db = (value: number): string => formatDb(value);

/** How far above or below: "2.3 dB below the prediction (73.5 dB)", "level with the prediction". */
function against(differenceDb: number, otherDb: number, what: string): string {
  if (Math.abs(differenceDb) < 0.05) return `level with the ${what} (${db(otherDb)})`;
  return `${db(Math.abs(differenceDb))} ${differenceDb < 0 ? 'below' : 'above'} the ${what} (${db(otherDb)})`;
}

/**
 * The comparison in one sentence: "Measured 71.2 dB at 1 kHz, 2.3 dB below the prediction
 * (73.5 dB) and 1.9 dB below the SPICE simulation (73.1 dB)."
 */
export function comparisonSentence(comparison: MeasurementComparison): string {
  const { measuredDb, predictedDb, simulatedDb, atFrequencyHz } = comparison;
  const quantity = comparison.kind === 'cmrr' ? 'rejection' : 'gain';
  if (measuredDb === null || atFrequencyHz === null) return comparison.note ?? `No measured ${quantity} to compare.`;
  const where = `at ${formatQuantity(atFrequencyHz, 'Hz')}${comparison.basis === 'lowest-measured' && comparison.kind === 'cmrr' ? ' (the lowest measured frequency; the spec asks for DC)' : ''}`;
  const parts: string[] = [];
  if (predictedDb !== null && comparison.differenceFromPredictedDb !== null) parts.push(against(comparison.differenceFromPredictedDb, predictedDb, 'prediction'));
  if (simulatedDb !== null && comparison.differenceFromSimulatedDb !== null) parts.push(against(comparison.differenceFromSimulatedDb, simulatedDb, 'SPICE simulation'));
  const head = `Measured ${quantity === 'gain' ? 'gain ' : ''}${db(measuredDb)} ${where}`;
  if (parts.length === 0) return `${head}. ${comparison.note ?? 'There is no prediction to compare with.'}`;
  return `${head}, ${parts.join(' and ')}.`;
}
