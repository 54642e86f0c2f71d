/**
 * The MOS device model: SPICE level 1 (Shichman–Hodges) with body effect at DC, as ngspice's MOS
 * level 1 computes it (src/spicelib/devices/mos1/mos1load.c, mos1temp.c, mos1set.c [SPICE]), from
 * the design's card (`device.model` = VTO, KP, LAMBDA, GAMMA, PHI; mos-parameters.ts) and each
 * instance's W and L. Nothing else of level 1 is used: no LD (L is the effective length), no
 * TOX, no series resistances, no junction or gate capacitances; the bulk–drain and bulk–source
 * junctions carry ngspice's default IS = 1e-14 A (no JS, AD, AS) with GMIN across each.
 *
 * Polarity as ngspice's `type`: a PMOS is the NMOS equations on its negated terminal voltages,
 * its currents negated, as the bipolar PNP is in this engine (node-system.ts, `polarity`).
 * Only ngspice's temperature equations are not mirror images between the polarities (below).
 *
 * The node solver stamps it in the MOS stage (mos-stage.ts; node-system.ts, `stampMosfet`).
 */
import { BOLTZMANN_J_PER_K, ELEMENTARY_CHARGE_C, GMIN_S, NOMINAL_TEMPERATURE_C, ZERO_CELSIUS_K } from './constants';
import { resolvedMosParameters, type MosModelCard } from './mos-parameters';

export type MosFamily = 'nmos' | 'pmos';

/** ngspice's default bulk junction saturation current IS, A, used when the card gives no JS, AD, AS (mos1set.c) [SPICE]. */
export const MOS_JUNCTION_SATURATION_CURRENT_A = 1e-14;

/** REFTEMP, 27 °C in kelvin, the temperature ngspice's band-gap terms are referred to (const.h) [SPICE]. */
const REFERENCE_TEMPERATURE_K = 300.15;

/** The band gap at REFTEMP that mos1temp.c writes as a literal, eV [SPICE]. */
const REFERENCE_ENERGY_GAP_EV = 1.1150877;

/** exp() argument cap of ngspice's junction currents (MAX_EXP_ARG) [SPICE]. */
const MAX_EXP_ARGUMENT = 709;

/** Silicon band gap at a temperature, eV: 1.16 − 7.02e-4·T²/(T + 1108), T in K (mos1temp.c) [SPICE]. */
export function mosEnergyGapEV(temperatureK: number): number {
  return 1.16 - (7.02e-4 * temperatureK * temperatureK) / (temperatureK + 1108);
}

/**
 * ngspice's `pbfact` at a temperature, V: −2·VT·(1.5·ln(T/REFTEMP) + (Eg(REFTEMP)/(2·VT_REF) −
 * Eg(T)/(2·VT))), the shift of a potential 2·φF (PHI, the junction potential) between REFTEMP and
 * T beyond its proportional part (mos1temp.c) [SPICE].
 */
function potentialShiftV(temperatureK: number): number {
  const vtV = (BOLTZMANN_J_PER_K * temperatureK) / ELEMENTARY_CHARGE_C;
  const referenceVtV = (BOLTZMANN_J_PER_K * REFERENCE_TEMPERATURE_K) / ELEMENTARY_CHARGE_C;
  const argument = -mosEnergyGapEV(temperatureK) / (2 * vtV) + REFERENCE_ENERGY_GAP_EV / (2 * referenceVtV);
  return -2 * vtV * (1.5 * Math.log(temperatureK / REFERENCE_TEMPERATURE_K) + argument);
}

/** The card's parameters carried to one temperature as mos1temp.c does [SPICE]. Voltages in the model's own sign (×type). */
export interface MosTemperatureParameters {
  temperatureK: number;
  thermalVoltageV: number;
  /** KP(T) = KP·(T/TNOM)^−1.5, A/V². */
  transconductanceAPerV2: number;
  /** PHI(T), V. */
  surfacePotentialV: number;
  /**
   * tVbi: the flat-band-plus-2φF part of the threshold, V, signed as SPICE's VTO (negative for an
   * enhancement PMOS): VTO − type·γ·√PHI + (Eg(TNOM) − Eg(T))/2 + type·(PHI(T) − PHI)/2.
   */
  builtInV: number;
  /** tVto = tVbi + type·γ·√PHI(T): the zero-bias threshold at T, V, signed as VTO. */
  thresholdV: number;
  /** Bulk junction IS(T) = IS·exp(Eg(TNOM)/VT(TNOM) − Eg(T)/VT(T)), A. */
  junctionSaturationA: number;
}

/**
 * The level-1 parameters at a temperature (°C), TNOM = 27 °C, as ngspice mos1temp.c [SPICE]:
 *   KP(T)   = KP / (T/TNOM)^1.5
 *   PHI(T)  = (T/REFTEMP)·(PHI − pbfact(TNOM))/(TNOM/REFTEMP) + pbfact(T)
 *   tVbi    = VTO − type·γ·√PHI + (Eg(TNOM) − Eg(T))/2 + type·(PHI(T) − PHI)/2
 *   tVto    = tVbi + type·γ·√PHI(T)
 * The band-gap term (Eg(TNOM) − Eg(T))/2 is not multiplied by `type`: it moves an NMOS's
 * threshold and a PMOS's the same way in sign, so above TNOM the NMOS threshold and the PMOS
 * threshold's magnitude do not move alike (ngspice's equations, kept as they are).
 */
export function mosTemperatureParameters(card: MosModelCard, family: MosFamily, temperatureC: number): MosTemperatureParameters {
  const p = resolvedMosParameters(card);
  if (!(p.PHI > 0)) throw new RangeError(`PHI must be positive (got ${p.PHI} V)`);
  const type = family === 'pmos' ? -1 : 1;
  const nominalK = NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K;
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const thermalVoltageV = (BOLTZMANN_J_PER_K * temperatureK) / ELEMENTARY_CHARGE_C;
  const nominalVtV = (BOLTZMANN_J_PER_K * nominalK) / ELEMENTARY_CHARGE_C;
  const ratio = temperatureK / nominalK;
  const nominalGapEV = mosEnergyGapEV(nominalK);
  const gapEV = mosEnergyGapEV(temperatureK);
  const surfacePotentialV = mosSurfacePotentialV(p.PHI, temperatureC);
  if (!(surfacePotentialV > 0)) throw new RangeError(`PHI at ${temperatureC} °C is not positive (${surfacePotentialV} V from PHI = ${p.PHI} V)`);
  const builtInV = p.VTO - type * p.GAMMA * Math.sqrt(p.PHI) + 0.5 * (nominalGapEV - gapEV) + type * 0.5 * (surfacePotentialV - p.PHI);
  return {
    temperatureK,
    thermalVoltageV,
    transconductanceAPerV2: p.KP / (ratio * Math.sqrt(ratio)),
    surfacePotentialV,
    builtInV,
    thresholdV: builtInV + type * p.GAMMA * Math.sqrt(surfacePotentialV),
    junctionSaturationA: MOS_JUNCTION_SATURATION_CURRENT_A * Math.exp(-gapEV / thermalVoltageV + nominalGapEV / nominalVtV),
  };
}

/**
 * PHI(T), V, from the card's PHI at TNOM (27 °C): brought back to REFTEMP, then carried to T
 * (mos1temp.c, `phio`) [SPICE]. It falls as T rises and may pass through zero for a small PHI.
 */
export function mosSurfacePotentialV(phiV: number, temperatureC: number): number {
  const nominalK = NOMINAL_TEMPERATURE_C + ZERO_CELSIUS_K;
  const temperatureK = temperatureC + ZERO_CELSIUS_K;
  const phiAtReferenceV = (phiV - potentialShiftV(nominalK)) / (nominalK / REFERENCE_TEMPERATURE_K);
  return (temperatureK / REFERENCE_TEMPERATURE_K) * phiAtReferenceV + potentialShiftV(temperatureK);
}

/** Which of ngspice's three regions the channel is in. */
export type MosRegion = 'cut-off' | 'saturation' | 'linear';

/**
 * One MOSFET's currents and derivatives at one bias point, at its terminals and in its real
 * polarity: a node solver stamps `channelA` from drain to source and the two junctions from
 * the bulk, with the derivatives as they stand (no sign to apply for a PMOS).
 */
export interface MosEval {
  /** Channel current, A: into the drain, through the channel, out of the source (negative for a conducting PMOS). */
  channelA: number;
  /** ∂channelA/∂vgs, ∂channelA/∂vds, ∂channelA/∂vbs at the terminals, S (as ngspice stamps them). */
  dChannelDVgsS: number;
  dChannelDVdsS: number;
  dChannelDVbsS: number;
  /** Bulk–drain junction current from bulk to drain, A, with GMIN; its conductance ∂/∂vbd, S. */
  bulkDrainA: number;
  bulkDrainS: number;
  /** Bulk–source junction current from bulk to source, A, with GMIN; its conductance ∂/∂vbs, S. */
  bulkSourceA: number;
  bulkSourceS: number;
  /** Current into the drain terminal: channelA − bulkDrainA, A. */
  drainA: number;
  /**
   * ngspice's own small-signal figures, as `@m1[gm]`, `@m1[gds]`, `@m1[gmbs]` report them: the
   * derivatives of the channel current of the device in its conducting orientation (source and
   * drain swapped when `mode` is −1), all ≥ 0 for either polarity, S.
   */
  gmS: number;
  gdsS: number;
  gmbsS: number;
  /** 1 when vds ≥ 0 in the model's sign (×type), −1 when source and drain have swapped (mos1load.c) [SPICE]. */
  mode: 1 | -1;
  region: MosRegion;
  /** ngspice's `von`: the threshold at this body bias, V, signed as VTO (negative for a PMOS). */
  thresholdV: number;
  /** ngspice's `vdsat`: max(vgs − von, 0) in the conducting orientation, V, signed as VTO. */
  saturationVoltageV: number;
}

/** A MOS device model at one temperature: what a node solver needs. */
export interface MosModel {
  family: MosFamily;
  /** ngspice's `type`: +1 NMOS, −1 PMOS. */
  polarity: 1 | -1;
  parameters: MosTemperatureParameters;
  /** Critical junction voltage for SPICE-style step limiting of vbs and vbd, V: VT·ln(VT/(√2·IS)) (mos1temp.c) [SPICE]. */
  criticalVoltageV: number;
  /** Currents and derivatives for terminal voltages vgs, vds, vbs and the channel's W and L (metres). */
  evaluate(vgsV: number, vdsV: number, vbsV: number, widthM: number, lengthM: number): MosEval;
}

/**
 * A bulk junction as mos1load.c writes it [SPICE]: IS·(exp(v/VT) − 1) + GMIN·v above −3·VT,
 * GMIN·v − IS below (where the exponential has died out), the conductance IS·exp(v/VT)/VT + GMIN
 * or GMIN. Voltage and current in the model's sign.
 */
function bulkJunction(saturationA: number, vV: number, vtV: number): { iA: number; gS: number } {
  if (vV <= -3 * vtV) return { iA: GMIN_S * vV - saturationA, gS: GMIN_S };
  const ev = Math.exp(Math.min(MAX_EXP_ARGUMENT, vV / vtV));
  return { iA: saturationA * (ev - 1) + GMIN_S * vV, gS: (saturationA * ev) / vtV + GMIN_S };
}

/**
 * Builds the level-1 MOSFET of a family at a temperature (°C) from the design's card. The
 * channel, in the model's sign (each voltage ×type) and its conducting orientation (mos1load.c)
 * [SPICE]; with vds < 0 the drain acts as the source: vgd, vbd and −vds stand for vgs, vbs, vds,
 * and the current reverses.
 *   √(φ − vbs) for vbs ≤ 0; for vbs > 0 ngspice's straight-line continuation
 *   s = max(0, √φ − vbs/(2·√φ))                                  (φ = PHI(T))
 *   von = tVbi·type + γ·s,  vgst = vgs − von,  β = KP(T)·W/L
 *   cut-off   vgst ≤ 0:        id = 0
 *   saturation vgst ≤ vds:     id = β·(1 + λ·vds)·vgst²/2,          gm = β·(1 + λ·vds)·vgst, gds = λ·β·vgst²/2
 *   linear     vgst > vds:     id = β·(1 + λ·vds)·vds·(vgst − vds/2), gm = β·(1 + λ·vds)·vds,
 *                              gds = β·(1 + λ·vds)·(vgst − vds) + λ·β·vds·(vgst − vds/2)
 *   gmbs = gm·γ/(2·s)  (0 when s = 0)
 * LAMBDA multiplies the current in the linear region too, as ngspice does (the textbook puts it
 * on saturation alone), so the current and gds are continuous at vds = vgst. For vbs > 0, gmbs
 * is ngspice's gm·γ/(2·s) with the continued s, not the slope gm·γ/(2·√φ) of that continuation:
 * this engine stamps what ngspice stamps, so its small-signal figures are ngspice's.
 */
export function mosModel(card: MosModelCard, family: MosFamily, temperatureC: number): MosModel {
  const t = mosTemperatureParameters(card, family, temperatureC);
  const p = resolvedMosParameters(card);
  const type: 1 | -1 = family === 'pmos' ? -1 : 1;
  const vtV = t.thermalVoltageV;
  const phiV = t.surfacePotentialV;
  const sqrtPhi = Math.sqrt(phiV);
  const gamma = p.GAMMA;
  const lambdaPerV = p.LAMBDA;
  const vbiV = t.builtInV * type;
  const isA = t.junctionSaturationA;
  return {
    family,
    polarity: type,
    parameters: t,
    criticalVoltageV: vtV * Math.log(vtV / (Math.SQRT2 * isA)),
    evaluate(vgsV, vdsV, vbsV, widthM, lengthM) {
      if (!(widthM > 0 && lengthM > 0)) throw new RangeError(`a MOSFET's W and L must be positive (got W = ${widthM} m, L = ${lengthM} m)`);
      // The model's sign: a PMOS sees its voltages negated [SPICE]
      const vgs = type * vgsV;
      const vds = type * vdsV;
      const vbs = type * vbsV;
      const vbd = vbs - vds;
      const bs = bulkJunction(isA, vbs, vtV);
      const bd = bulkJunction(isA, vbd, vtV);
      const mode: 1 | -1 = vds >= 0 ? 1 : -1;
      // The conducting orientation: gate and bulk voltages from the electrode acting as source
      const vgsOwn = mode === 1 ? vgs : vgs - vds;
      const vbsOwn = mode === 1 ? vbs : vbd;
      const vdsOwn = vds * mode;
      let s: number;
      if (vbsOwn <= 0) s = Math.sqrt(phiV - vbsOwn);
      else s = Math.max(0, sqrtPhi - vbsOwn / (2 * sqrtPhi));
      const vonV = vbiV + gamma * s;
      const vgst = vgsOwn - vonV;
      const bodyFactor = s <= 0 ? 0 : gamma / (2 * s);
      const beta = (t.transconductanceAPerV2 * widthM) / lengthM;
      let cdrain = 0;
      let gm = 0;
      let gds = 0;
      let region: MosRegion = 'cut-off';
      if (vgst > 0) {
        const betap = beta * (1 + lambdaPerV * vdsOwn);
        if (vgst <= vdsOwn) {
          region = 'saturation';
          cdrain = betap * vgst * vgst * 0.5;
          gm = betap * vgst;
          gds = lambdaPerV * beta * vgst * vgst * 0.5;
        } else {
          region = 'linear';
          cdrain = betap * vdsOwn * (vgst - 0.5 * vdsOwn);
          gm = betap * vdsOwn;
          gds = betap * (vgst - vdsOwn) + lambdaPerV * beta * vdsOwn * (vgst - 0.5 * vdsOwn);
        }
      }
      const gmbs = gm * bodyFactor;
      // Terminal derivatives of mode·cdrain: for mode −1, cdrain(vgd, vbd, −vds) with
      // vgd = vgs − vds and vbd = vbs − vds, as ngspice stamps the reversed device [SPICE]
      const dVgs = mode === 1 ? gm : -gm;
      const dVds = mode === 1 ? gds : gm + gmbs + gds;
      const dVbs = mode === 1 ? gmbs : -gmbs;
      // Back to the real polarity: currents ×type; derivatives (×type twice) unchanged
      const channelA = type * mode * cdrain;
      const bulkDrainA = type * bd.iA;
      return {
        channelA,
        dChannelDVgsS: dVgs,
        dChannelDVdsS: dVds,
        dChannelDVbsS: dVbs,
        bulkDrainA,
        bulkDrainS: bd.gS,
        bulkSourceA: type * bs.iA,
        bulkSourceS: bs.gS,
        drainA: channelA - bulkDrainA,
        gmS: gm,
        gdsS: gds,
        gmbsS: gmbs,
        mode,
        region,
        thresholdV: type * vonV,
        saturationVoltageV: type * Math.max(vgst, 0),
      };
    },
  };
}

/**
 * The channel's thermal noise, a current density from drain to source, A²/Hz: 4·k·T·(2/3)·|gm|
 * with ngspice's gm, at the device temperature T (mos1noi.c, the noise level below 3 it
 * uses by default [SPICE]); the "8/3·k·T·gm" of the square-law textbooks. It holds in every
 * region as ngspice computes it (in the linear region too, where gm is the linear one, and 0
 * in cut-off). Flicker noise is KF·…/f with KF = 0 by default; a card of the five parameters
 * has none, so this is the whole drain noise of a device without series resistances.
 */
export function mosDrainNoiseA2PerHz(ev: Pick<MosEval, 'gmS'>, temperatureC: number): number {
  return 4 * BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K) * (2 / 3) * Math.abs(ev.gmS);
}
