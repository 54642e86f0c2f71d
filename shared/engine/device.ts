/**
 * The bipolar device model: SPICE's Gummel-Poon model reduced to IS, BF and VAF (NF = NR = 1,
 * BR = 1, VAR, IKF, IKR infinite, no leakage, no ohmic resistances), with GMIN across each
 * junction as SPICE adds it [SPICE]. Callers use only `DeviceModel`, so another family (MOS)
 * can join behind the same interface.
 */
import { cardOf, resolvedParameters } from './bjt-parameters';
import type { DeviceParams } from './types';
import {
  DEFAULT_VCE_SAT_V,
  ENERGY_GAP_EV,
  GMIN_S,
  IS_TEMPERATURE_EXPONENT,
  NOMINAL_TEMPERATURE_C,
  REVERSE_BETA,
  ZERO_CELSIUS_K,
  thermalVoltageV,
} from './constants';

/** Terminal currents (into the device) and their derivatives at one bias point. */
export interface BjtEval {
  /** Collector current into the collector, A. */
  icA: number;
  /** Base current into the base, A. */
  ibA: number;
  /** ∂ic/∂vbe, ∂ic/∂vbc, ∂ib/∂vbe, ∂ib/∂vbc, S. */
  dIcDVbeS: number;
  dIcDVbcS: number;
  dIbDVbeS: number;
  dIbDVbcS: number;
}

/** A device model at one temperature: everything the solvers need. */
export interface DeviceModel {
  thermalVoltageV: number;
  saturationCurrentA: number;
  beta: number;
  /** Forward Early voltage (Infinity when absent). */
  earlyVoltageV: number;
  vceSatV: number;
  /** Critical junction voltage for SPICE-style step limiting, V. */
  criticalVoltageV: number;
  /** Currents and derivatives for junction voltages vbe, vbc and an area factor. */
  evaluate(vbeV: number, vbcV: number, area: number): BjtEval;
}

/** IS at 27 °C: the card's, the given one, or the one that puts VBE at vbeOnV for 1 mA. */
export function nominalSaturationCurrentA(device: DeviceParams): number {
  return resolvedParameters(cardOf(device)).IS;
}

/** The forward Early voltage, infinite when omitted or 0 (as SPICE reads VAF = 0). */
export function earlyVoltageOrInfinityV(device: DeviceParams): number {
  return resolvedParameters(cardOf(device)).VAF;
}

/** The forward current gain BF: the card's, else `beta`. */
export function forwardBeta(device: DeviceParams): number {
  return resolvedParameters(cardOf(device)).BF;
}

/**
 * IS(T) = IS·(T/Tnom)^XTI·exp((EG/VT(T))·(T/Tnom − 1)), XTI = 3, EG = 1.11 eV [SPICE].
 */
export function saturationCurrentAtA(isNominalA: number, temperatureC: number): number {
  const ratio = (temperatureC + ZERO_CELSIUS_K) / (NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K);
  const vtV = thermalVoltageV(temperatureC);
  return isNominalA * ratio ** IS_TEMPERATURE_EXPONENT * Math.exp((ENERGY_GAP_EV / vtV) * (ratio - 1));
}

/** Builds the NPN device model at a temperature (°C). */
export function npnModel(device: DeviceParams, temperatureC: number): DeviceModel {
  const vtV = thermalVoltageV(temperatureC);
  const isA = saturationCurrentAtA(nominalSaturationCurrentA(device), temperatureC);
  const bf = forwardBeta(device);
  const inverseVafPerV = 1 / earlyVoltageOrInfinityV(device);
  // Local copies: module bindings are read in the innermost loop of every solve.
  const gminS = GMIN_S;
  const br = REVERSE_BETA;
  return {
    thermalVoltageV: vtV,
    saturationCurrentA: isA,
    beta: bf,
    earlyVoltageV: earlyVoltageOrInfinityV(device),
    vceSatV: device.vceSatV ?? DEFAULT_VCE_SAT_V,
    // vcrit = VT·ln(VT/(√2·IS)) as in SPICE's junction limiting [SPICE]
    criticalVoltageV: vtV * Math.log(vtV / (Math.SQRT2 * isA)),
    evaluate(vbeV, vbcV, area) {
      const scaledIsA = isA * area;
      const expBe = Math.exp(vbeV / vtV);
      const expBc = Math.exp(vbcV / vtV);
      const forwardA = scaledIsA * (expBe - 1);
      const reverseA = scaledIsA * (expBc - 1);
      const dForwardS = (scaledIsA * expBe) / vtV;
      const dReverseS = (scaledIsA * expBc) / vtV;
      // Base charge with VAR = IKF = ∞: 1/qb = 1 − vbc/VAF, so the Early factor is (1 + VCB/VAF)
      const earlyFactor = 1 - vbcV * inverseVafPerV;
      return {
        icA: (forwardA - reverseA) * earlyFactor - reverseA / br - gminS * vbcV,
        ibA: forwardA / bf + gminS * vbeV + reverseA / br + gminS * vbcV,
        dIcDVbeS: dForwardS * earlyFactor,
        dIcDVbcS: -dReverseS * earlyFactor - (forwardA - reverseA) * inverseVafPerV - dReverseS / br - gminS,
        dIbDVbeS: dForwardS / bf + gminS,
        dIbDVbcS: dReverseS / br + gminS,
      };
    },
  };
}

/** The device model for a family; today only "npn". */
export function deviceModel(device: DeviceParams, temperatureC: number): DeviceModel {
  return npnModel(device, temperatureC);
}
