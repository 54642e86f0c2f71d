/**
 * The bipolar device model: SPICE's Gummel-Poon model at DC as ngspice's BJT level 1 computes it
 * (bjtload.c, bjttemp.c) from the design's card (`device.model`, or IS, BF and VAF with every
 * other parameter at SPICE's default), with GMIN across each junction as SPICE adds it [SPICE].
 * The ohmic resistances RB, RE, RC are the node system's (internal nodes); the junction charges
 * are the frequency analysis's. Callers use only `DeviceModel`, so another family (MOS) can join
 * behind the same interface.
 */
import { cardOf, resolvedParameters, type BjtParameters } from './bjt-parameters';
import type { DeviceParams } from './types';
import {
  DEFAULT_VCE_SAT_V,
  ENERGY_GAP_EV,
  GMIN_S,
  IS_TEMPERATURE_EXPONENT,
  NOMINAL_TEMPERATURE_C,
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
  /**
   * The transport terms behind them, which the diffusion charges are taken from [SPICE]
   * bjtload.c: the ideal forward and reverse currents IS·(exp(v/(N·VT)) − 1) and their slopes,
   * and the normalised base charge qb with its derivatives.
   */
  forwardA: number;
  forwardS: number;
  reverseA: number;
  reverseS: number;
  qb: number;
  dqbDVbe: number;
  dqbDVbc: number;
}

/** The ohmic resistances of one transistor of area 1, ohms (0: the terminal is the junction's node). */
export interface OhmicResistances {
  baseOhm: number;
  emitterOhm: number;
  collectorOhm: number;
}

/** A device model at one temperature: everything the solvers need. */
export interface DeviceModel {
  thermalVoltageV: number;
  /** IS at this temperature, A. */
  saturationCurrentA: number;
  /** BF at this temperature. */
  beta: number;
  /** Forward Early voltage (Infinity when absent). */
  earlyVoltageV: number;
  vceSatV: number;
  /** Critical junction voltage for SPICE-style step limiting, V. */
  criticalVoltageV: number;
  /** RB, RE, RC of a transistor of area 1 (a transistor of area A has them divided by A) [SPICE]. */
  ohmic: OhmicResistances;
  /** Every parameter of the card at 27 °C (resolvedParameters), for what else reads them (the junction charges). */
  parameters: BjtParameters;
  /** Currents and derivatives for junction voltages vbe, vbc (internal nodes) and an area factor. */
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
 * IS(T) = IS·(T/Tnom)^XTI·exp((EG/VT(T))·(T/Tnom − 1)), XTI = 3, EG = 1.11 eV by default [SPICE].
 */
export function saturationCurrentAtA(isNominalA: number, temperatureC: number, energyGapEV = ENERGY_GAP_EV, isExponent = IS_TEMPERATURE_EXPONENT): number {
  const ratio = (temperatureC + ZERO_CELSIUS_K) / (NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K);
  return isNominalA * Math.exp((ratio - 1) * (energyGapEV / thermalVoltageV(temperatureC)) + isExponent * Math.log(ratio));
}

/**
 * A diode current s·(exp(v/vtn) − 1) and its derivative, as ngspice bjtload.c writes it: below
 * −3·vtn the exponential gives way to −s·(1 + (3·vtn/(v·e))³), which joins it smoothly [SPICE].
 */
function junction(saturationA: number, vV: number, vtnV: number): { iA: number; gS: number } {
  if (vV >= -3 * vtnV) {
    const ev = Math.exp(vV / vtnV);
    return { iA: saturationA * (ev - 1), gS: (saturationA * ev) / vtnV };
  }
  let arg = (3 * vtnV) / (vV * Math.E);
  arg = arg * arg * arg;
  return { iA: -saturationA * (1 + arg), gS: (saturationA * 3 * arg) / vV };
}

/**
 * Builds the NPN Gummel-Poon model at a temperature (°C) from the design's card (ngspice BJT
 * level 1, DC part). Temperature [SPICE] ngspice bjttemp.c: IS·exp(factlog) with
 * factlog = (T/Tnom − 1)·EG/VT + XTI·ln(T/Tnom); BF and BR times (T/Tnom)^XTB; ISE·exp(factlog/NE)
 * and ISC·exp(factlog/NC), each over (T/Tnom)^XTB. Currents [SPICE] ngspice bjtload.c:
 *   cbe = IS·(e^(vbe/(NF·VT)) − 1), cbc = IS·(e^(vbc/(NR·VT)) − 1),
 *   cben = ISE·(e^(vbe/(NE·VT)) − 1) + GMIN·vbe, cbcn = ISC·(e^(vbc/(NC·VT)) − 1) + GMIN·vbc,
 *   q1 = 1/(1 − vbc/VAF − vbe/VAR), q2 = cbe/IKF + cbc/IKR, qb = q1·(1 + √(1 + 4·q2))/2,
 *   ic = (cbe − cbc)/qb − cbc/BR − cbcn,  ib = cbe/BF + cben + cbc/BR + cbcn.
 * An area factor A scales IS, ISE, ISC, IKF and IKR (and divides RB, RE, RC); the reverse
 * transport current's IS takes it twice (area × areab, areab defaulting to area) [SPICE].
 */
export function npnModel(device: DeviceParams, temperatureC: number): DeviceModel {
  const p = resolvedParameters(cardOf(device));
  const vtV = thermalVoltageV(temperatureC);
  const ratio = (temperatureC + ZERO_CELSIUS_K) / (NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K);
  // ngspice bjttemp.c: factlog, bfactor [SPICE]
  const factlog = (ratio - 1) * (p.EG / vtV) + p.XTI * Math.log(ratio);
  const betaFactor = Math.exp(Math.log(ratio) * p.XTB);
  const isA = p.IS * Math.exp(factlog);
  const bf = p.BF * betaFactor;
  const br = p.BR * betaFactor;
  const iseA = (p.ISE * Math.exp(factlog / p.NE)) / betaFactor;
  const iscA = (p.ISC * Math.exp(factlog / p.NC)) / betaFactor;
  const vtfV = p.NF * vtV;
  const vtrV = p.NR * vtV;
  const vteV = p.NE * vtV;
  const vtcV = p.NC * vtV;
  const inverseVafPerV = 1 / p.VAF;
  const inverseVarPerV = 1 / p.VAR;
  const inverseIkfPerA = 1 / p.IKF;
  const inverseIkrPerA = 1 / p.IKR;
  const highInjection = inverseIkfPerA !== 0 || inverseIkrPerA !== 0;
  // Local copy: module bindings are read in the innermost loop of every solve.
  const gminS = GMIN_S;
  return {
    thermalVoltageV: vtV,
    saturationCurrentA: isA,
    beta: bf,
    earlyVoltageV: p.VAF,
    vceSatV: device.vceSatV ?? DEFAULT_VCE_SAT_V,
    // vcrit = VT·ln(VT/(√2·IS)) as in SPICE's junction limiting [SPICE]
    criticalVoltageV: vtV * Math.log(vtV / (Math.SQRT2 * isA)),
    ohmic: { baseOhm: p.RB, emitterOhm: p.RE, collectorOhm: p.RC },
    parameters: p,
    evaluate(vbeV, vbcV, area) {
      const be = junction(isA * area, vbeV, vtfV);
      // The reverse transport current's IS is IS·area·areab (areac for a lateral PNP), and an
      // instance's areab and areac default to its area [SPICE] (ngspice bjttemp.c BJTBCtSatCur,
      // bjtsetup.c): IS·area² (measured on both builds: at 125 °C an area-16 transistor's base
      // current moves by 4 % with it)
      const bc = junction(isA * area * area, vbcV, vtrV);
      let cbenA = gminS * vbeV;
      let gbenS = gminS;
      if (iseA !== 0) {
        const leak = junction(iseA * area, vbeV, vteV);
        cbenA += leak.iA;
        gbenS += leak.gS;
      }
      let cbcnA = gminS * vbcV;
      let gbcnS = gminS;
      if (iscA !== 0) {
        const leak = junction(iscA * area, vbcV, vtcV);
        cbcnA += leak.iA;
        gbcnS += leak.gS;
      }
      // Base charge qb and its derivatives (ngspice bjtload.c, "determine base charge terms") [SPICE]
      const q1 = 1 / (1 - vbcV * inverseVafPerV - vbeV * inverseVarPerV);
      let qb = q1;
      let dqbDVbe = q1 * qb * inverseVarPerV;
      let dqbDVbc = q1 * qb * inverseVafPerV;
      if (highInjection) {
        const oik = inverseIkfPerA / area;
        const oikr = inverseIkrPerA / area;
        const arg = Math.max(0, 1 + 4 * (oik * be.iA + oikr * bc.iA));
        const sqarg = arg !== 0 ? Math.sqrt(arg) : 1;
        qb = (q1 * (1 + sqarg)) / 2;
        dqbDVbe = q1 * (qb * inverseVarPerV + (oik * be.gS) / sqarg);
        dqbDVbc = q1 * (qb * inverseVafPerV + (oikr * bc.gS) / sqarg);
      }
      const transportA = be.iA - bc.iA;
      // go, gm as ngspice defines them: ∂ic/∂vbe = gm + go, ∂ic/∂vbc = −(go + gmu) [SPICE]
      const goS = (bc.gS + (transportA * dqbDVbc) / qb) / qb;
      const gmS = (be.gS - (transportA * dqbDVbe) / qb) / qb - goS;
      const gmuS = bc.gS / br + gbcnS;
      return {
        icA: transportA / qb - bc.iA / br - cbcnA,
        ibA: be.iA / bf + cbenA + bc.iA / br + cbcnA,
        dIcDVbeS: gmS + goS,
        dIcDVbcS: -(goS + gmuS),
        dIbDVbeS: be.gS / bf + gbenS,
        dIbDVbcS: gmuS,
        forwardA: be.iA,
        forwardS: be.gS,
        reverseA: bc.iA,
        reverseS: bc.gS,
        qb,
        dqbDVbe,
        dqbDVbc,
      };
    },
  };
}

/** The device model for a family; today only "npn". */
export function deviceModel(device: DeviceParams, temperatureC: number): DeviceModel {
  let byTemperature = modelsByDevice.get(device);
  if (!byTemperature) {
    byTemperature = new Map();
    modelsByDevice.set(device, byTemperature);
  }
  let model = byTemperature.get(temperatureC);
  if (!model) {
    model = npnModel(device, temperatureC);
    byTemperature.set(temperatureC, model);
  }
  return model;
}

/**
 * Models already built, by device object and temperature: one recommendation solves each sized
 * design at dozens of conditions that share a device and a few temperatures. A device object is
 * never changed once a design holds it (the engine builds new ones, as a mismatch's scaled BF
 * does), so its model stays what it was built as.
 */
const modelsByDevice = new WeakMap<DeviceParams, Map<number, DeviceModel>>();

/** The PNP a design's tail needs (`device.pnp`), as a device the model reads: IS, BF, VAF or a card. */
export type PnpDevice = NonNullable<DeviceParams['pnp']>;

/** The design's PNP device; a RangeError naming the field when the design has none. */
export function pnpDeviceOf(design: { device: DeviceParams; tail: { topology: string } }): PnpDevice {
  const given = design.device.pnp;
  if (!given) throw new RangeError(`the ${design.tail.topology} tail has PNP transistors: device.pnp (its IS, BF and VAF, or a model card) is required`);
  return given;
}
