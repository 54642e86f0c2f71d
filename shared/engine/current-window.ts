/**
 * The window of tail current an option may run at (issue "the whole decision the tail current
 * sets"): lower bounds from the noise, slew-rate and bandwidth targets, upper bounds from the power
 * budget, the input bias current and the noise target's base-current term, each named by the
 * requirement that sets it. The hand formulas of DOMAIN.md give the first window; once the option
 * is sized and solved there, each bound is recomputed with the hand formula scaled to the solved
 * figure (the circuit's own noise, slew rate, bandwidth and bias current at that current), which
 * keeps the formula's dependence on the current and takes its level from the circuit.
 *
 * Hand formulas (Gray, Hurst, Lewis, Meyer, Analysis and Design of Analog Integrated Circuits;
 * DOMAIN.md "The rest of the decision"), for a tail current I split evenly (IC = I/2):
 * - noise density, input-referred, both halves: en² = α/I + β0 + γ·I with α = 8q·VT² (collector
 *   shot 2qIC through gm = IC/VT) + 16kT·VT/Ad (each load's 4kT·RC through the differential gain
 *   Ad = gm·RC held at its target), β0 = 8kT·(RS + RB) (thermal), γ = 2q·RS²/β (base shot in RS);
 * - slew rate on the differential output: 2·I/CL;
 * - bandwidth into CL at a held gain: 1/(2π·RC·CL) with RC = 2VT·Ad/I;
 * - bias current per input: I/(2β), with the lowest current gain the spec allows.
 */
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, NOMINAL_TEMPERATURE_C, ZERO_CELSIUS_K } from './constants';
import { forwardBeta } from './device';
import { resolvedParameters, hasModelCard } from './bjt-parameters';
import type { Spec } from './types';

/** What sets a bound of the window. */
export type WindowRequirement = 'noise' | 'slew-rate' | 'bandwidth' | 'power-budget' | 'input-bias-current' | 'noise-base-current';

/** One bound: the current, whether it is a floor or a ceiling, and whether the solved circuit has calibrated it. */
export interface CurrentBound {
  requirement: WindowRequirement;
  side: 'lower' | 'upper';
  currentA: number;
  basis: 'hand' | 'solved';
}

/** The window: every bound, the tightest of each side, and whether they collide. */
export interface CurrentWindow {
  bounds: CurrentBound[];
  lower: CurrentBound | null;
  upper: CurrentBound | null;
  empty: boolean;
}

/** The solved figures at a current that calibrate the bounds (null: not computed or none). */
export interface SolvedAtCurrent {
  currentA: number;
  noiseVPerRtHz: number | null;
  slewRateVPerS: number | null;
  bandwidthHz: number | null;
  inputBiasCurrentA: number | null;
}

/** The lowest current gain the spec allows: its current-gain spread's minimum, half the nominal when left out (the spec's stated default). */
export function lowestBeta(spec: Spec): number {
  const nominal = spec.device.model && hasModelCard(spec.device) ? resolvedParameters(spec.device.model).BF : forwardBeta(spec.device);
  return spec.betaRange?.min ?? nominal / 2;
}

/** The differential gain a sized option holds: the target for a differential output, twice it for a single-ended one. */
function differentialGainTarget(spec: Spec): number {
  return spec.gain.output === 'differential' ? spec.gain.target : 2 * spec.gain.target;
}

/** The noise model's three coefficients at the nominal temperature: en² = α/I + β0 + γ·I. */
function noiseCoefficients(spec: Spec): { alpha: number; beta0: number; gamma: number } {
  const kelvin = NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K;
  const kT = BOLTZMANN_J_PER_K * kelvin;
  const vt = kT / ELEMENTARY_CHARGE_C;
  const rs = spec.sourceResistanceOhm ?? 0;
  const rb = spec.device.model && hasModelCard(spec.device) ? resolvedParameters(spec.device.model).RB : 0;
  const beta = spec.device.model && hasModelCard(spec.device) ? resolvedParameters(spec.device.model).BF : forwardBeta(spec.device);
  return {
    alpha: 8 * ELEMENTARY_CHARGE_C * vt * vt + (16 * kT * vt) / differentialGainTarget(spec),
    beta0: 8 * kT * (rs + rb),
    gamma: (2 * ELEMENTARY_CHARGE_C * rs * rs) / beta,
  };
}

/**
 * Where s²·(α/I + β0 + γ·I) ≤ en²: between the roots of γ·I² − (en²/s² − β0)·I + α = 0. Null when
 * no current meets it (the thermal floor alone, or the two terms at their best, exceed it).
 */
function noiseRange(alpha: number, beta0: number, gamma: number, limit2: number): { low: number; high: number } | null {
  const room = limit2 - beta0;
  if (!(room > 0)) return null;
  if (gamma === 0) return { low: alpha / room, high: Number.POSITIVE_INFINITY };
  const disc = room * room - 4 * gamma * alpha;
  if (disc < 0) return null;
  const root = Math.sqrt(disc);
  // the smaller root as 2α/(room + √…), free of cancellation
  return { low: (2 * alpha) / (room + root), high: (room + root) / (2 * gamma) };
}

/** The largest tail current the power budget allows after the reference branches (the budget in full), A. */
function powerCeilingA(spec: Spec, referenceRatio: number): number {
  return spec.powerBudgetW / ((spec.supply.positiveV - spec.supply.negativeV) * (1 + referenceRatio));
}

/**
 * The window for an option. `solved`: the option's figures solved at one current, to calibrate
 * each hand bound (scale the formula to the circuit's figure there); without it the hand
 * formulas alone. A bound whose target the spec leaves out is absent; a noise target no current
 * meets gives a floor above every ceiling (an empty window naming noise).
 */
export function currentWindow(spec: Spec, referenceRatio: number, solved?: SolvedAtCurrent): CurrentWindow {
  const bounds: CurrentBound[] = [];
  const basisOf = (figure: number | null | undefined): CurrentBound['basis'] => (solved && figure !== null && figure !== undefined && figure > 0 ? 'solved' : 'hand');
  bounds.push({ requirement: 'power-budget', side: 'upper', currentA: powerCeilingA(spec, referenceRatio), basis: 'hand' });
  const loadF = spec.loadCapacitanceF ?? 0;
  const maxNoise = spec.noise?.maxVPerRtHz;
  if (maxNoise !== undefined && spec.noise?.atFrequencyHz !== undefined) {
    const { alpha, beta0, gamma } = noiseCoefficients(spec);
    // the circuit's noise over the formula's at the solved current scales the whole formula
    const at = solved?.currentA;
    const scale2 = basisOf(solved?.noiseVPerRtHz) === 'solved' ? solved!.noiseVPerRtHz! ** 2 / (alpha / at! + beta0 + gamma * at!) : 1;
    const range = noiseRange(alpha, beta0, gamma, (maxNoise * maxNoise) / scale2);
    const basis = basisOf(solved?.noiseVPerRtHz);
    if (range === null) bounds.push({ requirement: 'noise', side: 'lower', currentA: Number.POSITIVE_INFINITY, basis });
    else {
      bounds.push({ requirement: 'noise', side: 'lower', currentA: range.low, basis });
      if (Number.isFinite(range.high)) bounds.push({ requirement: 'noise-base-current', side: 'upper', currentA: range.high, basis });
    }
  }
  if (spec.slewRateMinVPerS !== undefined && loadF > 0) {
    const basis = basisOf(solved?.slewRateVPerS);
    const currentA = basis === 'solved' ? (solved!.currentA * spec.slewRateMinVPerS) / solved!.slewRateVPerS! : (spec.slewRateMinVPerS * loadF) / 2;
    bounds.push({ requirement: 'slew-rate', side: 'lower', currentA, basis });
  }
  if (spec.bandwidthMinHz !== undefined && loadF > 0) {
    const basis = basisOf(solved?.bandwidthHz);
    const vt = (BOLTZMANN_J_PER_K * (NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K)) / ELEMENTARY_CHARGE_C;
    const currentA = basis === 'solved' ? (solved!.currentA * spec.bandwidthMinHz) / solved!.bandwidthHz! : 2 * Math.PI * spec.bandwidthMinHz * loadF * 2 * vt * differentialGainTarget(spec);
    bounds.push({ requirement: 'bandwidth', side: 'lower', currentA, basis });
  }
  if (spec.inputBiasCurrentMaxA !== undefined) {
    const basis = basisOf(solved?.inputBiasCurrentA);
    // the solved bias current is at the nominal current gain: the lowest gain raises it by their ratio
    const nominalBeta = spec.device.model && hasModelCard(spec.device) ? resolvedParameters(spec.device.model).BF : forwardBeta(spec.device);
    const currentA =
      basis === 'solved'
        ? (solved!.currentA * spec.inputBiasCurrentMaxA) / ((solved!.inputBiasCurrentA! * nominalBeta) / lowestBeta(spec))
        : 2 * lowestBeta(spec) * spec.inputBiasCurrentMaxA;
    bounds.push({ requirement: 'input-bias-current', side: 'upper', currentA, basis });
  }
  const lowers = bounds.filter((b) => b.side === 'lower');
  const uppers = bounds.filter((b) => b.side === 'upper');
  const lower = lowers.length ? lowers.reduce((a, b) => (b.currentA > a.currentA ? b : a)) : null;
  const upper = uppers.length ? uppers.reduce((a, b) => (b.currentA < a.currentA ? b : a)) : null;
  return { bounds, lower, upper, empty: lower !== null && upper !== null && lower.currentA > upper.currentA };
}

/** How far inside a bound the picked current stays, as a factor (design choice: the corners move the figures by about this much). */
export const WINDOW_MARGIN = 1.25;

/** The picked current and what set it. */
export interface PickedCurrent {
  currentA: number;
  /** `preferred`: the policy's own current (the budget share, capped) lay inside the window. */
  setBy: WindowRequirement | 'preferred' | 'fixed';
}

/**
 * The policy's current inside the window: its preferred current when that lies at least
 * WINDOW_MARGIN inside both bounds, else moved to WINDOW_MARGIN inside the bound it crossed (the
 * window's geometric middle when it is narrower than that); with an empty window, the ceiling (the
 * power budget and the bias current are limits, not aims) and the floor's requirement then fails.
 */
export function pickCurrent(window: CurrentWindow, preferredA: number, fixedA?: number): PickedCurrent {
  if (fixedA !== undefined) return { currentA: fixedA, setBy: 'fixed' };
  const { lower, upper } = window;
  if (window.empty) return { currentA: upper!.currentA, setBy: upper!.requirement };
  const floorA = lower ? lower.currentA * WINDOW_MARGIN : 0;
  const ceilingA = upper ? upper.currentA / WINDOW_MARGIN : Number.POSITIVE_INFINITY;
  if (floorA > ceilingA) return { currentA: Math.sqrt(lower!.currentA * upper!.currentA), setBy: lower!.requirement };
  if (preferredA < floorA) return { currentA: floorA, setBy: lower!.requirement };
  if (preferredA > ceilingA) return { currentA: ceilingA, setBy: upper!.requirement };
  return { currentA: preferredA, setBy: 'preferred' };
}
