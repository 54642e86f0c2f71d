/**
 * The operating conditions a spec asks the design to hold over: nominal, the four corners of
 * input common-mode × temperature, and sweeps for plots.
 */
import { NOMINAL_TEMPERATURE_C } from './constants';
import type { Spec } from './types';
import { conditionLabel } from '../text/engine-notes';
import { resolveShift, shiftLabel, specNominalBeta, type CornerShift, type ShiftSigns } from './sign-off-corners';

export interface Condition {
  label: string;
  inputCommonModeV: number;
  temperatureC: number;
  /** The rails, current gain and resistor tempco moved off nominal (sign-off-corners.ts); absent: nominal. */
  shift?: CornerShift;
}

/** A condition with rails, current gain and resistor tempco moved to the ends a sign vector names, labelled with them. */
export function shiftedCondition(spec: Spec, base: Condition, signs: ShiftSigns): Condition {
  const shift = resolveShift(spec, base.temperatureC, signs);
  const words = shiftLabel(shift, specNominalBeta(spec));
  const plain = conditionLabel(base.inputCommonModeV, base.temperatureC);
  return { label: words ? `${plain}, ${words}` : plain, inputCommonModeV: base.inputCommonModeV, temperatureC: base.temperatureC, ...(words ? { shift } : {}) };
}

/** Points in the temperature sweep (endpoints included). */
export const TEMPERATURE_SWEEP_POINTS = 7;

function condition(inputCommonModeV: number, temperatureC: number): Condition {
  return { label: conditionLabel(inputCommonModeV, temperatureC), inputCommonModeV, temperatureC };
}

/** Nominal: mid input common-mode range, 27 °C (SPICE's TNOM) clamped into the temperature range. */
export function nominalCondition(spec: Spec): Condition {
  const { min, max } = spec.temperatureC;
  const temperatureC = Math.min(Math.max(NOMINAL_TEMPERATURE_C, min), max);
  return condition((spec.inputCommonMode.minV + spec.inputCommonMode.maxV) / 2, temperatureC);
}

/** The four corners: input common-mode min/max × temperature min/max. */
export function cornerConditions(spec: Spec): Condition[] {
  const { minV, maxV } = spec.inputCommonMode;
  const { min, max } = spec.temperatureC;
  return [condition(minV, min), condition(minV, max), condition(maxV, min), condition(maxV, max)];
}

/** Temperatures from min to max at the nominal input common mode. */
export function temperatureSweep(spec: Spec): Condition[] {
  const icmV = nominalCondition(spec).inputCommonModeV;
  const { min, max } = spec.temperatureC;
  return Array.from({ length: TEMPERATURE_SWEEP_POINTS }, (_, i) =>
    condition(icmV, min + ((max - min) * i) / (TEMPERATURE_SWEEP_POINTS - 1)),
  );
}
