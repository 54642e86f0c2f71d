/**
 * The trade-off figures of one option at nominal conditions (ENGINE-CONTRACT.md, version 2 "New
 * outputs"), simulated with the contract's SPICE measures (spice-tradeoffs.ts) and set beside the
 * engine's stored prediction, each with the contract's tolerance:
 * - input bias current from the nominal `.op` already run; offset voltage, offset current and
 *   drift from `.dc` sweeps (only when the design's pair carries a mismatch: a matched pair's are
 *   zero by symmetry, and their spread is the Monte Carlo's);
 * - input resistance, supply rejection from each rail, linear input range;
 * - differential bandwidth from the nominal differential sweep already run;
 * - input noise density at the frequencies the stored prediction's `ac` entries carry (none when
 *   it has none); slew rate from `.tran` when the stored prediction has one, in a window set from
 *   it.
 * A figure the stored prediction lacks (an engine version before it) is simulated all the same
 * and listed as not predicted: its engine side stays empty, never recomputed now.
 */
import { solveCircuit } from '#shared/engine/analyze';
import { slewRun } from '#shared/engine/slew-rate';
import type { AnalyzeResult, Design } from '#shared/engine/types';
import type { NetlistCardSettings } from '#shared/engine/netlist';
import { pairIsMatched, stagePolarity } from '#shared/engine/circuit';
import { formatQuantity } from '#shared/units/format-quantity';
import { formatFigure } from '#shared/units/figures';
import { VERIFICATION_TOLERANCES as TOL, type VerifiedFigure } from '#shared/verification/types';
import { INPUT_SOURCES } from '#shared/engine/netlist';
import { absoluteFigure, flooredFigure, notCompared, percentFigure, type FigureName } from './figure-comparison';
import { dropFrequencyHz, type SpiceOperatingPoint, type SpiceRunner } from './spice-analyses';
import {
  StaysLinearError,
  spiceInputCurrentsA,
  spiceInputNoiseVPerRtHz,
  spiceInputResistanceOhm,
  spiceLinearInputRangeV,
  spiceOffsetDriftVPerC,
  spiceOffsetVoltageV,
  spicePsrrDb,
  spiceSlewRateVPerS,
} from './spice-tradeoffs';

/**
 * The stored prediction as it may have been stored: every trade-off figure absent on proposals
 * made before the engine predicted it, and the slew rate absent until the engine predicts it.
 */
export type StoredPrediction = Omit<AnalyzeResult, TradeoffKey | 'ac'> &
  Partial<Pick<AnalyzeResult, TradeoffKey>> & {
    ac?: (Omit<AnalyzeResult['ac'][number], 'inputNoiseVPerRtHz'> & { inputNoiseVPerRtHz?: number | null })[];
    slewRateVPerS?: number | null;
  };

type TradeoffKey =
  | 'inputBiasCurrentA'
  | 'inputOffsetCurrentA'
  | 'inputOffsetVoltageV'
  | 'offsetDriftVPerC'
  | 'linearInputRangeV'
  | 'psrrDb'
  | 'inputResistanceOhm'
  | 'differentialBandwidthHz';

/** The stored value, null when stored as null, undefined when the prediction lacks it. */
const storedValue = (value: number | null | undefined): number | null | undefined => value;

/** Marks a compared figure as not predicted when the stored prediction lacks it. */
function withPrediction(figure: VerifiedFigure, stored: number | null | undefined): VerifiedFigure {
  return stored === undefined ? notCompared(figure, 'not-predicted') : figure;
}

/** The noise frequencies the stored prediction carries, and its density at each (undefined: not predicted there). */
export function noiseFrequencies(predicted: StoredPrediction): { frequencyHz: number; predicted: number | undefined }[] {
  return (predicted.ac ?? [])
    .filter((entry) => entry.inputNoiseVPerRtHz !== null)
    .map((entry) => ({ frequencyHz: entry.frequencyHz, predicted: entry.inputNoiseVPerRtHz ?? undefined }));
}

/** Whether the slew rate is simulated: only when the stored prediction has one. */
export function predictsSlewRate(predicted: StoredPrediction): predicted is StoredPrediction & { slewRateVPerS: number } {
  return typeof predicted.slewRateVPerS === 'number' && predicted.slewRateVPerS > 0;
}

/** Settling periods of the slowest edge the fallback window covers, and time constants of the bandwidth pole. */
const SLEW_WINDOW_SLEWS = 20;
const SLEW_WINDOW_TIME_CONSTANTS = 10;
/** The drive's edge, s, and how many of the engine's settling times the first transient covers after it. */
const SLEW_EDGE_S = 1e-9;
const SLEW_WINDOW_SETTLINGS = 3;

/**
 * The first transient's window, s: three of the engine's own settling times of this design after
 * the 1 ns edge (the window only places ngspice's runs, which find their own settling inside it;
 * the figure compared is the stored one). Where the engine's run to settling fails, 20 × (output
 * swing / slew rate) plus ten time constants of the bandwidth pole, 10/(2π·BW), with the swing of
 * v(c1,c2) |Ad|·2 V capped at the fully switched 2·Itail·RC.
 */
export function slewWindowS(design: Design, predicted: StoredPrediction & { slewRateVPerS: number }): number {
  try {
    const { settlingS } = slewRun(solveCircuit(design), { untilSettled: true });
    if (settlingS > 0) return SLEW_EDGE_S + SLEW_WINDOW_SETTLINGS * settlingS;
  } catch {
    // fall back to the prediction's own figures below
  }
  const swingV = Math.min(2 * Math.abs(predicted.differentialGain), 2 * predicted.tailCurrentA * design.collectorResistanceOhm);
  const poleS = predicted.differentialBandwidthHz ? SLEW_WINDOW_TIME_CONSTANTS / (2 * Math.PI * predicted.differentialBandwidthHz) : 0;
  return (SLEW_WINDOW_SLEWS * swingV) / predicted.slewRateVPerS + poleS;
}

/** Analyses the trade-off figures take beyond the nominal runs (the searches' least; progress is clamped). */
export function tradeoffAnalyses(design: Design, predicted: StoredPrediction): number {
  const offset = pairIsMatched(design) ? 0 : 3 + 1 + 6;
  const linearRange = 5;
  const supply = 3;
  const inputResistance = 1;
  return offset + linearRange + supply + inputResistance + noiseFrequencies(predicted).length + (predictsSlewRate(predicted) ? 2 : 0);
}

export interface TradeoffInputs {
  run: SpiceRunner;
  design: Design;
  predicted: StoredPrediction;
  /** The nominal `.op` already simulated (its input-source currents give the bias current). */
  op: SpiceOperatingPoint;
  /** The nominal differential sweep already simulated: frequencies and |Ad| at each. */
  sweep: { frequenciesHz: number[]; differentialGain: number[] };
  card: NetlistCardSettings;
  /** Reports the analysis about to run (a progress step). */
  step: (what: string) => Promise<void> | void;
}

const name = (key: string, label: string, unit: string, group: FigureName['group']): FigureName => ({ key, label, unit, group });

const offsetBasis = `${TOL.offsetVoltagePercent} % of ngspice’s, at least ${formatQuantity(TOL.offsetVoltageFloorV, 'V')}`;
const driftBasis = `${TOL.offsetDriftPercent} % of ngspice’s, at least ${formatFigure(TOL.offsetDriftFloorVPerC, 'V/°C')}`;

/** Input figures: bias current, offset voltage, offset current and drift (compared only on a mismatched pair), input resistance, linear range. */
async function inputFigures({ run, design, predicted, op, card, step }: TradeoffInputs): Promise<VerifiedFigure[]> {
  const [vin1, vin2] = INPUT_SOURCES.map((source) => source.toLowerCase());
  // i(source) flows into its + terminal: the current it sends into the circuit is the negative
  // (a PNP pair's base currents leave the inputs: reported in the direction it conducts)
  const biasA = (-stagePolarity(design) * (op.sourceCurrentsA[vin1] + op.sourceCurrentsA[vin2])) / 2;
  const figures = [withPrediction(percentFigure(name('inputBiasCurrentA', 'Input bias current', 'A', 'input'), predicted.inputBiasCurrentA ?? null, biasA, TOL.biasCurrentPercent), predicted.inputBiasCurrentA)];

  const offsetName = name('inputOffsetVoltageV', 'Input offset voltage', 'V', 'input');
  const offsetCurrentName = name('inputOffsetCurrentA', 'Input offset current', 'A', 'input');
  const driftName = name('offsetDriftVPerC', 'Offset drift', 'V/°C', 'input');
  if (pairIsMatched(design)) {
    figures.push(
      notCompared(flooredFigure(offsetName, predicted.inputOffsetVoltageV ?? null, null, TOL.offsetVoltagePercent, TOL.offsetVoltageFloorV, offsetBasis), 'matched-pair'),
      notCompared(percentFigure(offsetCurrentName, predicted.inputOffsetCurrentA ?? null, null, TOL.offsetCurrentPercent), 'matched-pair'),
      notCompared(flooredFigure(driftName, predicted.offsetDriftVPerC ?? null, null, TOL.offsetDriftPercent, TOL.offsetDriftFloorVPerC, driftBasis), 'matched-pair'),
    );
  } else {
    await step('input offset voltage and current (.dc sweeps of the differential drive)');
    const offsetV = await spiceOffsetVoltageV(run, design, card);
    const [at1, at2] = await spiceInputCurrentsA(run, design, offsetV, card);
    await step('offset drift (the offset at ±1 °C)');
    const driftVPerC = await spiceOffsetDriftVPerC(run, design, card);
    figures.push(
      withPrediction(flooredFigure(offsetName, predicted.inputOffsetVoltageV ?? null, offsetV, TOL.offsetVoltagePercent, TOL.offsetVoltageFloorV, offsetBasis), predicted.inputOffsetVoltageV),
      withPrediction(percentFigure(offsetCurrentName, predicted.inputOffsetCurrentA ?? null, at1 - at2, TOL.offsetCurrentPercent), predicted.inputOffsetCurrentA),
      withPrediction(flooredFigure(driftName, predicted.offsetDriftVPerC ?? null, driftVPerC, TOL.offsetDriftPercent, TOL.offsetDriftFloorVPerC, driftBasis), predicted.offsetDriftVPerC),
    );
  }

  await step('input resistance');
  const rinOhm = await spiceInputResistanceOhm(run, design, card);
  figures.push(withPrediction(percentFigure(name('inputResistanceOhm', 'Input resistance (differential)', 'Ohm', 'input'), predicted.inputResistanceOhm ?? null, rinOhm, TOL.inputResistancePercent), predicted.inputResistanceOhm));

  await step('linear input range (.dc sweeps, 1 % from the gain line)');
  let rangeV: number | null;
  try {
    rangeV = await spiceLinearInputRangeV(run, design, card);
  } catch (error) {
    // Linear within 1 % to ±20 V: no range to read, as the engine's null says past twice the rails' span.
    if (!(error instanceof StaysLinearError)) throw error;
    rangeV = null;
  }
  const storedRange = storedValue(predicted.linearInputRangeV);
  figures.push(withPrediction(percentFigure(name('linearInputRangeV', 'Linear input range (within 1 %)', 'V', 'input'), storedRange ?? null, rangeV, TOL.linearRangePercent), storedRange));
  return figures;
}

/** Supply rejection from each rail: single-ended always; differential where either side has one (a matched pair's is null in both). */
async function supplyFigures({ run, design, predicted, card, step }: TradeoffInputs): Promise<VerifiedFigure[]> {
  await step('supply rejection from each rail');
  const psrr = await spicePsrrDb(run, design, card);
  const figures: VerifiedFigure[] = [];
  for (const rail of ['positive', 'negative'] as const) {
    const stored = predicted.psrrDb?.[rail];
    const railWord = rail === 'positive' ? 'positive rail' : 'negative rail';
    figures.push(withPrediction(absoluteFigure(name(`psrrDb.${rail}.singleEnded`, `PSRR, ${railWord}, single-ended`, 'dB', 'supply'), stored?.singleEnded ?? null, psrr[rail].singleEnded, TOL.psrrDb, 'db'), stored?.singleEnded));
    const storedDifferential = stored ? stored.differential : undefined;
    if ((storedDifferential ?? null) !== null || psrr[rail].differential !== null) {
      figures.push(
        withPrediction(
          absoluteFigure(name(`psrrDb.${rail}.differential`, `PSRR, ${railWord}, differential`, 'dB', 'supply'), storedDifferential ?? null, psrr[rail].differential, TOL.psrrDb, 'db'),
          storedDifferential,
        ),
      );
    }
  }
  return figures;
}

/** Bandwidth (from the nominal sweep), input noise at the stored `ac` frequencies, slew rate when predicted. */
async function speedFigures({ run, design, predicted, sweep, card, step }: TradeoffInputs): Promise<VerifiedFigure[]> {
  const gainDb = sweep.differentialGain.map((g) => 20 * Math.log10(g));
  const bandwidthHz = dropFrequencyHz(sweep.frequenciesHz, gainDb, 3);
  const storedBandwidth = storedValue(predicted.differentialBandwidthHz);
  const figures = [withPrediction(percentFigure(name('differentialBandwidthHz', 'Differential bandwidth (−3 dB)', 'Hz', 'speed'), storedBandwidth ?? null, bandwidthHz, TOL.bandwidthPercent), storedBandwidth)];

  if (predictsSlewRate(predicted)) {
    await step('slew rate (transient of a ±1 V step)');
    const slewVPerS = await spiceSlewRateVPerS(run, design, slewWindowS(design, predicted), card);
    figures.push(percentFigure(name('slewRateVPerS', 'Slew rate', 'V/s', 'speed'), predicted.slewRateVPerS, slewVPerS, TOL.slewRatePercent));
  }

  const noise = noiseFrequencies(predicted);
  if (noise.length > 0) {
    await step(`input noise density at ${noise.map((n) => formatQuantity(n.frequencyHz, 'Hz')).join(', ')}`);
    const densities = await spiceInputNoiseVPerRtHz(run, design, noise.map((n) => n.frequencyHz), card);
    noise.forEach((n, k) => {
      const figure = percentFigure(name(`inputNoiseVPerRtHz@${n.frequencyHz}`, `Input noise density at ${formatQuantity(n.frequencyHz, 'Hz')}`, 'V/√Hz', 'speed'), n.predicted ?? null, densities[k], TOL.noiseDensityPercent);
      figures.push(withPrediction(figure, n.predicted));
    });
  }
  return figures;
}

/** Every trade-off figure at nominal conditions, in the table's groups (input, supply, speed). */
export async function tradeoffFigures(inputs: TradeoffInputs): Promise<VerifiedFigure[]> {
  return [...(await inputFigures(inputs)), ...(await supplyFigures(inputs)), ...(await speedFigures(inputs))];
}
