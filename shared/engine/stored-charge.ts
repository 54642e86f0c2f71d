/**
 * The bipolar device's stored charges as functions of its junction voltages, for the transient
 * solve: the depletion charges of the base-emitter, base-collector and collector-substrate
 * junctions and the diffusion charges TF·IF and TR·IR, exactly as ngspice's BJT level 1 keeps
 * them in its transient state [SPICE] ngspice bjtload.c (charge storage section: qbe, qbc,
 * qsub). Their derivatives are the capacitances of junction-charges.ts (`transistorCapacitances`
 * at the same bias), so the transient's Newton Jacobian and the AC analysis share one set.
 */
import type { ChargeParameters, DepletionJunction, JunctionBias, TransportTerms } from './junction-charges';

/**
 * Depletion charge of a junction at voltage v (area-scaled zero-bias capacitance `czF`), C,
 * zero at v = 0 [SPICE] bjtload.c: below FC·VJ, VJ·CZ·(1 − (1 − v/VJ)^(1−M))/(1 − M); above, the
 * integral of the capacitance's tangent continuation, CZ·F1 + CZ/F2·(F3·(v − FC·VJ) +
 * M/(2·VJ)·(v² − (FC·VJ)²)), F1 = VJ·(1 − (1 − FC)^(1−M))/(1 − M), F2 = (1 − FC)^(1+M),
 * F3 = 1 − FC·(1 + M).
 */
export function depletionChargeC(junction: DepletionJunction, czF: number, fc: number, vV: number): number {
  if (czF === 0) return 0;
  const { potentialV: pv, exponent: m } = junction;
  const cornerV = fc * pv;
  if (vV < cornerV) {
    const arg = 1 - vV / pv;
    return (pv * czF * (1 - arg * Math.exp(-m * Math.log(arg)))) / (1 - m);
  }
  const xfc = Math.log(1 - fc);
  const f1 = (pv * (1 - Math.exp((1 - m) * xfc))) / (1 - m);
  const f2 = Math.exp((1 + m) * xfc);
  const f3 = 1 - fc * (1 + m);
  return czF * f1 + (czF / f2) * (f3 * (vV - cornerV) + (m / (2 * pv)) * (vV * vV - cornerV * cornerV));
}

/**
 * The substrate junction's charge at vsub = v(substrate) − v(internal collector), C [SPICE]
 * bjtload.c: VJS·CZ·(1 − (1 − vsub/VJS)^(1−MJS))/(1 − MJS) in reverse bias,
 * vsub·CZ·(1 + MJS·vsub/(2·VJS)) in forward bias.
 */
export function substrateChargeC(junction: DepletionJunction, czF: number, vsubV: number): number {
  if (czF === 0) return 0;
  const { potentialV: pv, exponent: m } = junction;
  if (vsubV < 0) {
    const arg = 1 - vsubV / pv;
    return (pv * czF * (1 - arg * Math.exp(-m * Math.log(arg)))) / (1 - m);
  }
  return vsubV * czF * (1 + (m * vsubV) / (2 * pv));
}

/** A transistor's stored charges at one bias, C. */
export interface TransistorCharges {
  /** Between the internal base and emitter: depletion plus TF times the forward current (over qb in forward bias). */
  baseEmitterC: number;
  /** Between the internal base and collector: depletion plus TR times the reverse current. */
  baseCollectorC: number;
  /** From the substrate to the internal collector. */
  substrateC: number;
}

/**
 * Every stored charge of one transistor (area factor `area`) at its bias [SPICE] bjtload.c:
 * qbe = TF·cbe + depletion(vbe), cbe = IF/qb when TF ≠ 0 and vbe > 0 (else IF);
 * qbc = TR·IR + depletion(vbc); qsub the substrate junction's.
 */
export function transistorCharges(c: ChargeParameters, transport: TransportTerms, bias: JunctionBias, area: number): TransistorCharges {
  const fc = c.forwardBiasCoefficient;
  const forwardA = bias.vbeV > 0 ? transport.forwardA / transport.qb : transport.forwardA;
  return {
    baseEmitterC: c.transitTimeForwardS * forwardA + depletionChargeC(c.baseEmitter, c.baseEmitter.zeroBiasF * area, fc, bias.vbeV),
    baseCollectorC: c.transitTimeReverseS * transport.reverseA + depletionChargeC(c.baseCollector, c.baseCollector.zeroBiasF * area, fc, bias.vbcV),
    substrateC: substrateChargeC(c.collectorSubstrate, c.collectorSubstrate.zeroBiasF * area, bias.vsubV),
  };
}
