/**
 * The bipolar device's stored charge as small-signal capacitances at an operating point: the
 * depletion capacitances of the base-emitter, base-collector and collector-substrate junctions
 * (CJE/VJE/MJE, CJC/VJC/MJC, CJS/VJS/MJS, linearised above FC·VJ in forward bias) and the
 * diffusion capacitances of the forward and reverse transport currents (TF, TR), as ngspice's
 * BJT level 1 computes them for an AC analysis [SPICE] ngspice bjtload.c (charge storage
 * section) and bjttemp.c (junction capacitances and potentials over temperature). XCJC is 1 (the
 * whole of CJC at the internal base), the substrate junction at ngspice's default place for the
 * type (an NPN's vertical, CJS from the internal collector; a PNP's lateral, from the internal
 * base: node-system.ts `sc`), XTF = ITF = PTF = 0 (no bias-dependent transit time, no excess phase).
 *
 * Every parameter comes from `resolvedParameters(cardOf(device))`; a three-parameter device
 * has no capacitance at all (CJE = CJC = CJS = TF = TR = 0 by default).
 */
import type { BjtParameters } from './bjt-parameters';
import type { BjtEval } from './device';
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, NOMINAL_TEMPERATURE_C, ZERO_CELSIUS_K } from './constants';

/** ngspice's reference temperature for the junction-potential law, K [SPICE] (const.h REFTEMP). */
const REFERENCE_TEMPERATURE_K = 27 + ZERO_CELSIUS_K;
/** ngspice limits a grading exponent to this so the depletion charge stays finite [SPICE] bjttemp.c. */
const MAX_GRADING_EXPONENT = 0.999;
/** ngspice limits FC to this [SPICE] bjttemp.c. */
const MAX_FC = 0.9999;
/** The silicon band gap's temperature law in the junction-potential formula, eV and K [SPICE] bjttemp.c. */
const GAP_AT_ZERO_EV = 1.16;
const GAP_ALPHA_EV_PER_K = 7.02e-4;
const GAP_BETA_K = 1108;
const GAP_AT_REFERENCE_EV = 1.1150877;
/** Temperature coefficient of a depletion capacitance in ngspice's law, 1/K [SPICE] bjttemp.c. */
const CAPACITANCE_TEMPERATURE_COEFFICIENT = 4e-4;

/** One junction's depletion parameters at the circuit temperature (per unit area). */
export interface DepletionJunction {
  /** Zero-bias capacitance at temperature, F. */
  zeroBiasF: number;
  /** Built-in potential at temperature, V. */
  potentialV: number;
  /** Grading exponent. */
  exponent: number;
}

/** The device's charge parameters at one temperature. */
export interface ChargeParameters {
  baseEmitter: DepletionJunction;
  baseCollector: DepletionJunction;
  collectorSubstrate: DepletionJunction;
  /** FC: forward-bias fraction of the potential above which the depletion charge is linearised. */
  forwardBiasCoefficient: number;
  transitTimeForwardS: number;
  transitTimeReverseS: number;
  /** True when every capacitance and transit time is zero: the device stores no charge. */
  none: boolean;
}

/** kT/q·(1.5·ln(T/TREF) + q/k·(−EG(T)/(2T) + EG(TREF)/(2·TREF))), the shift of a junction potential, times −2 [SPICE] bjttemp.c pbfact. */
function potentialShiftV(temperatureK: number): number {
  const vtV = (BOLTZMANN_J_PER_K * temperatureK) / ELEMENTARY_CHARGE_C;
  const gapEv = GAP_AT_ZERO_EV - (GAP_ALPHA_EV_PER_K * temperatureK * temperatureK) / (temperatureK + GAP_BETA_K);
  const argument = (-gapEv * ELEMENTARY_CHARGE_C) / (2 * BOLTZMANN_J_PER_K * temperatureK) + (GAP_AT_REFERENCE_EV * ELEMENTARY_CHARGE_C) / (BOLTZMANN_J_PER_K * 2 * REFERENCE_TEMPERATURE_K);
  return -2 * vtV * (1.5 * Math.log(temperatureK / REFERENCE_TEMPERATURE_K) + argument);
}

/**
 * A junction's capacitance and potential at temperature (ngspice's TLEVC = 0 law) [SPICE] bjttemp.c:
 *   pbo = (VJ − pbfact(TNOM))/(TNOM/TREF),  VJ(T) = (T/TREF)·pbo + pbfact(T),
 *   CJ(T) = CJ·[1 + M·(4e-4·(T − TREF) − (VJ(T) − pbo)/pbo)] / [1 + M·(4e-4·(TNOM − TREF) − (VJ − pbo)/pbo)].
 */
function junctionAt(zeroBiasF: number, potentialV: number, exponent: number, temperatureK: number, nominalK: number): DepletionJunction {
  const m = Math.min(exponent, MAX_GRADING_EXPONENT);
  const nominalRatio = nominalK / REFERENCE_TEMPERATURE_K;
  const pbo = (potentialV - potentialShiftV(nominalK)) / nominalRatio;
  const oldGrading = (potentialV - pbo) / pbo;
  const atTemperatureV = (temperatureK / REFERENCE_TEMPERATURE_K) * pbo + potentialShiftV(temperatureK);
  const newGrading = (atTemperatureV - pbo) / pbo;
  const capacitanceF =
    (zeroBiasF / (1 + m * (CAPACITANCE_TEMPERATURE_COEFFICIENT * (nominalK - REFERENCE_TEMPERATURE_K) - oldGrading))) *
    (1 + m * (CAPACITANCE_TEMPERATURE_COEFFICIENT * (temperatureK - REFERENCE_TEMPERATURE_K) - newGrading));
  return { zeroBiasF: capacitanceF, potentialV: atTemperatureV, exponent: m };
}

/** The charge parameters of a device at a temperature (°C), TNOM = 27 °C. */
export function chargeParameters(p: BjtParameters, temperatureC: number): ChargeParameters {
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const nominalK = NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K;
  return {
    baseEmitter: junctionAt(p.CJE, p.VJE, p.MJE, temperatureK, nominalK),
    baseCollector: junctionAt(p.CJC, p.VJC, p.MJC, temperatureK, nominalK),
    collectorSubstrate: junctionAt(p.CJS, p.VJS, p.MJS, temperatureK, nominalK),
    forwardBiasCoefficient: Math.min(p.FC, MAX_FC),
    // TF and TR have no temperature coefficient unless TTF1/TTR1 are given (not in this model) [SPICE] bjttemp.c.
    transitTimeForwardS: p.TF,
    transitTimeReverseS: p.TR,
    none: p.CJE === 0 && p.CJC === 0 && p.CJS === 0 && p.TF === 0 && p.TR === 0,
  };
}

/**
 * Depletion capacitance of a junction at voltage v (area-scaled zero-bias value `czF`) [SPICE] bjtload.c:
 * CZ·(1 − v/VJ)^−M below FC·VJ; above, the tangent continuation CZ/F2·(F3 + M·v/VJ),
 * F2 = (1 − FC)^(1+M), F3 = 1 − FC·(1 + M).
 */
export function depletionCapacitanceF(junction: DepletionJunction, czF: number, fc: number, vV: number): number {
  // Stryker disable next-line ConditionalExpression: equivalent, both laws below give 0 for CZ = 0 (VJ > 0, FC < 1)
  if (czF === 0) return 0;
  const { potentialV: pv, exponent: m } = junction;
  // Stryker disable next-line EqualityOperator: equivalent, the tangent continuation equals the power law at v = FC·VJ
  if (vV < fc * pv) return czF * Math.exp(-m * Math.log(1 - vV / pv));
  const f2 = Math.exp((1 + m) * Math.log(1 - fc));
  const f3 = 1 - fc * (1 + m);
  return (czF / f2) * (f3 + (m * vV) / pv);
}

/**
 * The substrate junction's capacitance at vsub = v(substrate) − v(internal collector)
 * [SPICE] bjtload.c: CZ·(1 − vsub/VJS)^−MJS in reverse bias, CZ·(1 + MJS·vsub/VJS) in forward bias.
 */
export function substrateCapacitanceF(junction: DepletionJunction, czF: number, vsubV: number): number {
  // Stryker disable next-line ConditionalExpression: equivalent, both laws below give 0 for CZ = 0 (VJS > 0)
  if (czF === 0) return 0;
  const { potentialV: pv, exponent: m } = junction;
  // Stryker disable next-line EqualityOperator: equivalent, both laws give CZ at vsub = 0
  if (vsubV < 0) return czF * Math.exp(-m * Math.log(1 - vsubV / pv));
  return czF * (1 + (m * vsubV) / pv);
}

/**
 * The transport terms the diffusion capacitances are taken from: those of the device's own
 * evaluation at the junction voltages (`BjtEval`, device.ts), so the charges and the currents
 * come from one computation.
 */
export type TransportTerms = Pick<BjtEval, 'forwardA' | 'forwardS' | 'reverseA' | 'reverseS' | 'qb' | 'dqbDVbe' | 'dqbDVbc'>;

/** The junction voltages at the internal nodes, V. */
export interface JunctionBias {
  vbeV: number;
  vbcV: number;
  /** v(substrate) − v(the node the substrate junction meets: an NPN's internal collector, a PNP's internal base), V. */
  vsubV: number;
}

/** A transistor's small-signal capacitances at its operating point. */
export interface TransistorCapacitances {
  /** Between the internal base and emitter: depletion plus forward diffusion, F. */
  baseEmitterF: number;
  /** Between the internal base and collector: depletion plus reverse diffusion, F. */
  baseCollectorF: number;
  /** From the substrate junction's node (an NPN's internal collector, a PNP's internal base) to the substrate, F. */
  collectorSubstrateF: number;
  /**
   * The forward diffusion charge's dependence on vbc (base-width modulation): a current
   * jω·this·vbc from the internal base into the internal emitter, F [SPICE] bjtload.c geqcb.
   */
  baseEmitterPerVbcF: number;
}

/** Every capacitance of one transistor (area factor `area`) at its bias [SPICE] bjtload.c. */
export function transistorCapacitances(c: ChargeParameters, transport: TransportTerms, bias: JunctionBias, area: number): TransistorCapacitances {
  const tf = c.transitTimeForwardS;
  const tr = c.transitTimeReverseS;
  const fc = c.forwardBiasCoefficient;
  let forwardS = transport.forwardS;
  let perVbcF = 0;
  // The forward diffusion charge TF·(forward current)/qb in forward bias; its derivatives in vbe and vbc.
  // (ngspice also skips this when TF = 0; both terms are multiplied by TF, so they are 0 then anyway.)
  if (bias.vbeV > 0) {
    const forwardOverQbA = transport.forwardA / transport.qb;
    forwardS = (transport.forwardS - forwardOverQbA * transport.dqbDVbe) / transport.qb;
    perVbcF = (tf * -forwardOverQbA * transport.dqbDVbc) / transport.qb;
  }
  return {
    baseEmitterF: tf * forwardS + depletionCapacitanceF(c.baseEmitter, c.baseEmitter.zeroBiasF * area, fc, bias.vbeV),
    baseCollectorF: tr * transport.reverseS + depletionCapacitanceF(c.baseCollector, c.baseCollector.zeroBiasF * area, fc, bias.vbcV),
    collectorSubstrateF: substrateCapacitanceF(c.collectorSubstrate, c.collectorSubstrate.zeroBiasF * area, bias.vsubV),
    baseEmitterPerVbcF: perVbcF,
  };
}

/**
 * Each transistor's charge parameters at a temperature: its own model's card (a PNP's, or a
 * mismatched pair transistor's, whose charges are the stage's) or the stage's `parameters`;
 * null for every one when `parameters` is null (the device's charges left out). Computed once
 * per card.
 */
export function chargeParametersOf(
  transistors: readonly { model?: { parameters: BjtParameters } }[],
  parameters: BjtParameters | null,
  temperatureC: number,
): (ChargeParameters | null)[] {
  if (!parameters) return transistors.map(() => null);
  const byCard = new Map<BjtParameters, ChargeParameters>();
  return transistors.map((q) => {
    const card = q.model?.parameters ?? parameters;
    let charges = byCard.get(card);
    if (!charges) {
      charges = chargeParameters(card, temperatureC);
      byCard.set(card, charges);
    }
    return charges;
  });
}
