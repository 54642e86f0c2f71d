/**
 * The corners a worst-case review signs off on beyond input common mode × temperature: each rail
 * at either end of its tolerance, the transistors' current gain at either end of its spread, and
 * the resistors' temperature coefficient, the pair's loads and the tail's resistors each at +tc
 * or −tc (two groups, since parts of two kinds or batches need not share a sign), moving each
 * resistor by tc·(T − 27 °C). A shift is stored resolved (the rail voltages, the scales), so a
 * SPICE check rebuilds the very circuit the engine solved (`shiftedDesign`).
 *
 * Five dimensions at two ends over four base corners are 128 circuits an option; the search
 * (option-evaluation.ts) takes, for each figure, the base corner where it is worst, moves each
 * dimension alone to one end there to see which way it worsens the figure, and solves the corner
 * with every dimension at its worsening end. That finds the worst of the 2^5 when each dimension
 * moves the figure the same way whatever the others do (monotone, no strong interaction), which
 * holds for these small spans (rails by a few per cent, resistors by a few tenths of a per cent,
 * the current gain through base currents); tests/unit/engine/sign-off-corners.test.ts holds it to
 * an exhaustive search on demo specs. Common practice, from memory: the "sensitivity-signed
 * corner" of worst-case circuit analysis.
 */
import { NOMINAL_TEMPERATURE_C } from './constants';
import { forwardBeta } from './device';
import { hasModelCard, resolvedParameters } from './bjt-parameters';
import { scaledDevice } from './stage-solve';
import type { Design, Spec, TailDesign } from './types';
import { formatQuantity } from '../units/format-quantity';

/** The dimensions, in the order of a sign vector. */
export const SHIFT_DIMENSIONS = ['positiveRail', 'negativeRail', 'beta', 'loadTempco', 'tailTempco'] as const;
export type ShiftDimension = (typeof SHIFT_DIMENSIONS)[number];

/** −1, 0 (nominal) or +1 per dimension: +1 is the rail's higher magnitude, the highest current gain, +tc. */
export type ShiftSigns = Readonly<Record<ShiftDimension, -1 | 0 | 1>>;

export const NO_SHIFT: ShiftSigns = { positiveRail: 0, negativeRail: 0, beta: 0, loadTempco: 0, tailTempco: 0 };

/** A shift resolved to the circuit's values (absent: nominal). */
export interface CornerShift {
  positiveV?: number;
  negativeV?: number;
  /** The pair's and tail's BF over the nominal (BF of the spread's end / nominal BF). */
  betaScale?: number;
  /** Scale of the pair's load and emitter resistors, and of the tail's resistors. */
  loadResistorScale?: number;
  tailResistorScale?: number;
}

/** The nominal current gain of the spec's device (the card's BF when it has one). */
function nominalBeta(spec: Spec): number {
  return spec.device.model && hasModelCard(spec.device) ? resolvedParameters(spec.device.model).BF : forwardBeta(spec.device);
}

/** The current gain's spread: the spec's, else half and twice the nominal (the spec's stated default). */
export function betaSpread(spec: Spec): { min: number; max: number } {
  const nominal = nominalBeta(spec);
  return { min: spec.betaRange?.min ?? nominal / 2, max: spec.betaRange?.max ?? 2 * nominal };
}

/** The dimensions that move anything at a temperature: a rail with a tolerance and a voltage, a spread, a tempco away from 27 °C. */
export function activeDimensions(spec: Spec, temperatureC: number): ShiftDimension[] {
  const tolerance = spec.supplyTolerance ?? { positivePercent: 5, negativePercent: 5 };
  const spread = betaSpread(spec);
  const tempco = (spec.resistors.tempcoPpmPerC ?? 0) * (temperatureC - NOMINAL_TEMPERATURE_C);
  return SHIFT_DIMENSIONS.filter((d) => {
    switch (d) {
      case 'positiveRail':
        return (tolerance.positivePercent ?? 0) > 0 && spec.supply.positiveV !== 0;
      case 'negativeRail':
        return (tolerance.negativePercent ?? 0) > 0 && spec.supply.negativeV !== 0;
      case 'beta':
        return spread.min !== spread.max;
      case 'loadTempco':
      case 'tailTempco':
        return tempco !== 0;
    }
  });
}

/** The shift of a sign vector at a temperature, resolved from the spec. */
export function resolveShift(spec: Spec, temperatureC: number, signs: ShiftSigns): CornerShift {
  const tolerance = spec.supplyTolerance ?? { positivePercent: 5, negativePercent: 5 };
  const shift: CornerShift = {};
  if (signs.positiveRail !== 0) shift.positiveV = spec.supply.positiveV * (1 + (signs.positiveRail * (tolerance.positivePercent ?? 0)) / 100);
  if (signs.negativeRail !== 0) shift.negativeV = spec.supply.negativeV * (1 + (signs.negativeRail * (tolerance.negativePercent ?? 0)) / 100);
  if (signs.beta !== 0) {
    const spread = betaSpread(spec);
    shift.betaScale = (signs.beta > 0 ? spread.max : spread.min) / nominalBeta(spec);
  }
  const tempco = ((spec.resistors.tempcoPpmPerC ?? 0) * 1e-6 * (temperatureC - NOMINAL_TEMPERATURE_C));
  if (signs.loadTempco !== 0) shift.loadResistorScale = 1 + signs.loadTempco * tempco;
  if (signs.tailTempco !== 0) shift.tailResistorScale = 1 + signs.tailTempco * tempco;
  return shift;
}

/** Whether a shift moves nothing. */
export function isNominalShift(shift: CornerShift | undefined): boolean {
  return !shift || Object.keys(shift).length === 0;
}

/** The tail's resistors scaled. */
function scaledTail(tail: TailDesign, scale: number): TailDesign {
  const scaled = { ...tail } as Record<string, unknown>;
  for (const field of ['resistanceOhm', 'referenceResistanceOhm', 'emitterResistanceOhm'] as const) {
    const value = scaled[field];
    if (typeof value === 'number') scaled[field] = value * scale;
  }
  return scaled as unknown as TailDesign;
}

/** A design at a shifted corner: its rails, its device's BF (pair and tail alike), its resistors scaled. */
export function shiftedDesign(design: Design, shift: CornerShift | undefined): Design {
  if (isNominalShift(shift)) return design;
  const s = shift!;
  const load = s.loadResistorScale ?? 1;
  return {
    ...design,
    supply: { positiveV: s.positiveV ?? design.supply.positiveV, negativeV: s.negativeV ?? design.supply.negativeV },
    device: s.betaScale !== undefined ? scaledDevice(design.device, s.betaScale) : design.device,
    collectorResistanceOhm: design.collectorResistanceOhm * load,
    ...(design.pairEmitterResistanceOhm ? { pairEmitterResistanceOhm: design.pairEmitterResistanceOhm * load } : {}),
    tail: s.tailResistorScale !== undefined ? scaledTail(design.tail, s.tailResistorScale) : design.tail,
  };
}

/** "V+ 12.6 V, V− −11.4 V, BF 80, loads +0.58 %, tail −0.58 %": what a shift moves, for a corner's label; '' for none. */
export function shiftLabel(shift: CornerShift | undefined, nominalBf: number): string {
  if (isNominalShift(shift)) return '';
  const s = shift!;
  const parts: string[] = [];
  if (s.positiveV !== undefined) parts.push(`V+ ${formatQuantity(s.positiveV, 'V')}`);
  if (s.negativeV !== undefined) parts.push(`V− ${formatQuantity(s.negativeV, 'V').replace(/^-/, '−')}`);
  if (s.betaScale !== undefined) parts.push(`BF ${Number((nominalBf * s.betaScale).toPrecision(3))}`);
  const percent = (scale: number) => `${scale >= 1 ? '+' : '−'}${Number((Math.abs(scale - 1) * 100).toPrecision(2))} %`;
  if (s.loadResistorScale !== undefined) parts.push(`loads ${percent(s.loadResistorScale)}`);
  if (s.tailResistorScale !== undefined) parts.push(`tail resistors ${percent(s.tailResistorScale)}`);
  return parts.join(', ');
}

/** The nominal BF of a spec's device, for labels. */
export function specNominalBeta(spec: Spec): number {
  return nominalBeta(spec);
}
