/**
 * The bipolar device's full parameter set: the SPICE Gummel-Poon parameters the engine reads from
 * `device.model` (contract version 2, "The full bipolar model"), by their SPICE names in upper
 * case, SI units, each with the default ngspice gives it when a card leaves it out (ngspice's BJT
 * level 1, src/spicelib/devices/bjt/bjtsetup.c [SPICE]). One home for the list: the schemas'
 * `device.model` part, the card reader's notes and the netlists all read it from here.
 *
 * Infinity stands for SPICE's "infinite" (VAF, IKF, VAR, IKR: a card writes 0 or leaves them
 * out); `resolvedParameters` maps a 0 on those to Infinity as SPICE reads it.
 */
import type { DeviceParams } from './types';
import { DEFAULT_VBE_ON_V, NOMINAL_TEMPERATURE_C, VBE_ON_REFERENCE_CURRENT_A, thermalVoltageV } from './constants';

/** The Gummel-Poon parameters `device.model` may carry, in the contract's order. */
export const BJT_PARAMETER_NAMES = [
  'IS', 'BF', 'NF', 'VAF', 'IKF', 'ISE', 'NE', 'BR', 'NR', 'VAR', 'IKR', 'ISC', 'NC',
  'RB', 'RE', 'RC',
  'CJE', 'VJE', 'MJE', 'CJC', 'VJC', 'MJC', 'CJS', 'VJS', 'MJS', 'FC', 'TF', 'TR',
  'EG', 'XTI', 'XTB', 'KF', 'AF',
] as const;

export type BjtParameterName = (typeof BJT_PARAMETER_NAMES)[number];

/** A model card as the design carries it: any subset of the parameters. */
export type BjtModelCard = Partial<Record<BjtParameterName, number>>;

/** Every parameter with a value: the card's, or ngspice's default. */
export type BjtParameters = Record<BjtParameterName, number>;

/** What each parameter is and its unit, for the schema, the forms and the notes. */
export interface BjtParameterInfo {
  meaning: string;
  unit: string;
  /** ngspice's default (Infinity for "infinite"). */
  default: number;
  /** Parameters for which SPICE reads 0 as infinite. */
  zeroMeansInfinite?: true;
}

/** Defaults: ngspice bjtsetup.c [SPICE] (the SPICE3 user's guide lists the same). */
export const BJT_PARAMETERS: Record<BjtParameterName, BjtParameterInfo> = {
  IS: { meaning: 'transport saturation current', unit: 'A', default: 1e-16 },
  BF: { meaning: 'ideal maximum forward current gain', unit: 'A/A', default: 100 },
  NF: { meaning: 'forward current emission coefficient', unit: '', default: 1 },
  VAF: { meaning: 'forward Early voltage', unit: 'V', default: Infinity, zeroMeansInfinite: true },
  IKF: { meaning: 'corner of forward gain high-current roll-off', unit: 'A', default: Infinity, zeroMeansInfinite: true },
  ISE: { meaning: 'base-emitter leakage saturation current', unit: 'A', default: 0 },
  NE: { meaning: 'base-emitter leakage emission coefficient', unit: '', default: 1.5 },
  BR: { meaning: 'ideal maximum reverse current gain', unit: 'A/A', default: 1 },
  NR: { meaning: 'reverse current emission coefficient', unit: '', default: 1 },
  VAR: { meaning: 'reverse Early voltage', unit: 'V', default: Infinity, zeroMeansInfinite: true },
  IKR: { meaning: 'corner of reverse gain high-current roll-off', unit: 'A', default: Infinity, zeroMeansInfinite: true },
  ISC: { meaning: 'base-collector leakage saturation current', unit: 'A', default: 0 },
  NC: { meaning: 'base-collector leakage emission coefficient', unit: '', default: 2 },
  RB: { meaning: 'base resistance', unit: 'Ω', default: 0 },
  RE: { meaning: 'emitter resistance', unit: 'Ω', default: 0 },
  RC: { meaning: 'collector resistance', unit: 'Ω', default: 0 },
  CJE: { meaning: 'base-emitter zero-bias depletion capacitance', unit: 'F', default: 0 },
  VJE: { meaning: 'base-emitter built-in potential', unit: 'V', default: 0.75 },
  MJE: { meaning: 'base-emitter junction grading exponent', unit: '', default: 0.33 },
  CJC: { meaning: 'base-collector zero-bias depletion capacitance', unit: 'F', default: 0 },
  VJC: { meaning: 'base-collector built-in potential', unit: 'V', default: 0.75 },
  MJC: { meaning: 'base-collector junction grading exponent', unit: '', default: 0.33 },
  CJS: { meaning: 'collector-substrate zero-bias capacitance', unit: 'F', default: 0 },
  VJS: { meaning: 'substrate junction built-in potential', unit: 'V', default: 0.75 },
  MJS: { meaning: 'substrate junction grading exponent', unit: '', default: 0 },
  FC: { meaning: 'forward-bias depletion capacitance coefficient', unit: '', default: 0.5 },
  TF: { meaning: 'ideal forward transit time', unit: 's', default: 0 },
  TR: { meaning: 'ideal reverse transit time', unit: 's', default: 0 },
  EG: { meaning: 'energy gap for the temperature effect on IS', unit: 'eV', default: 1.11 },
  XTI: { meaning: 'temperature exponent for IS', unit: '', default: 3 },
  XTB: { meaning: 'forward and reverse beta temperature exponent', unit: '', default: 0 },
  KF: { meaning: 'flicker-noise coefficient', unit: '', default: 0 },
  AF: { meaning: 'flicker-noise exponent', unit: '', default: 1 },
};

/** IS at 27 °C for a design without `device.model`: the given one, or the one that puts VBE at vbeOnV for 1 mA. */
function nominalIsA(device: DeviceParams): number {
  if (device.saturationCurrentA !== undefined && device.saturationCurrentA > 0) return device.saturationCurrentA;
  const vbeOnV = device.vbeOnV ?? DEFAULT_VBE_ON_V;
  return VBE_ON_REFERENCE_CURRENT_A * Math.exp(-vbeOnV / thermalVoltageV(NOMINAL_TEMPERATURE_C));
}

/**
 * Whether the device carries a model card: `device.model` with at least one parameter given. An
 * empty object, or one of blank fields (a form's untouched card section), is no card: the
 * three-parameter device applies.
 */
export function hasModelCard(device: { model?: BjtModelCard }): boolean {
  return device.model !== undefined && Object.values(device.model).some((value) => value !== undefined);
}

/**
 * The device's card: `device.model` when it has a parameter, else the three-parameter device (IS, BF, VAF)
 * written as a card. Only the parameters given (nothing defaulted).
 */
export function cardOf(device: DeviceParams): BjtModelCard {
  if (device.model && hasModelCard(device)) return { ...device.model };
  const card: BjtModelCard = { IS: nominalIsA(device), BF: device.beta ?? BJT_PARAMETERS.BF.default };
  if (device.earlyVoltageV !== undefined) card.VAF = device.earlyVoltageV;
  return card;
}

/** Every parameter at its default, built once (resolvedParameters copies it). */
const DEFAULT_PARAMETERS = Object.fromEntries(BJT_PARAMETER_NAMES.map((name) => [name, BJT_PARAMETERS[name].default])) as BjtParameters;

/** Every parameter at 27 °C (TNOM): the card's values over ngspice's defaults, 0 read as infinite where SPICE does. */
export function resolvedParameters(card: BjtModelCard): BjtParameters {
  const out = { ...DEFAULT_PARAMETERS };
  // Only the card's own parameters (a card is a few of the names): the defaults stand for the rest
  for (const name of Object.keys(card)) {
    if (!Object.hasOwn(BJT_PARAMETERS, name)) continue;
    const given = card[name as BjtParameterName];
    if (given !== undefined && !(BJT_PARAMETERS[name as BjtParameterName].zeroMeansInfinite && given === 0)) out[name as BjtParameterName] = given;
  }
  return out;
}

/** The parameters that make a device store charge: junction capacitances and transit times. */
const CHARGE_PARAMETERS = ['CJE', 'CJC', 'CJS', 'TF', 'TR'] as const satisfies readonly BjtParameterName[];

/** Whether a card stores charge (a non-zero CJE, CJC, CJS, TF or TR), so its stage's figures move with frequency. */
export function cardStoresCharge(card: BjtModelCard): boolean {
  const p = resolvedParameters(card);
  return CHARGE_PARAMETERS.some((name) => p[name] !== 0);
}
