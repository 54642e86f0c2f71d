/**
 * The MOS device's parameter set: the SPICE level-1 (Shichman–Hodges) parameters the engine reads
 * from `device.model` for the "nmos" and "pmos" families (contract version 2, "Families"), by
 * their SPICE names in upper case, SI units, each with the default ngspice gives it when a card
 * leaves it out (ngspice's MOS level 1, src/spicelib/devices/mos1/mos1set.c [SPICE]). One home
 * for the list: the MOS device (mos-device.ts), and later the schema's and the netlist's MOS
 * parts, read it from here.
 *
 * The contract names these five and no other: the junction saturation current, the oxide
 * thickness, the overlap and junction capacitances, the series resistances and the flicker-noise
 * coefficient stay at ngspice's defaults (IS = 1e-14 A, no TOX, no capacitance, no resistance,
 * KF = 0), so a netlist that writes only these five describes the same device.
 */

/** The level-1 parameters `device.model` may carry for a MOS family, in the contract's order. */
export const MOS_PARAMETER_NAMES = ['VTO', 'KP', 'LAMBDA', 'GAMMA', 'PHI'] as const;

export type MosParameterName = (typeof MOS_PARAMETER_NAMES)[number];

/** A MOS model card as the design carries it: any subset of the parameters. */
export type MosModelCard = Partial<Record<MosParameterName, number>>;

/** Every parameter with a value: the card's, or ngspice's default. */
export type MosParameters = Record<MosParameterName, number>;

/** What each parameter is and its unit, for the schema, the forms and the notes. */
export interface MosParameterInfo {
  meaning: string;
  unit: string;
  /** ngspice's default. */
  default: number;
}

/**
 * Defaults: ngspice mos1set.c [SPICE] (the SPICE3 user's guide lists the same). VTO is signed as
 * SPICE writes it: positive for an enhancement NMOS, negative for an enhancement PMOS.
 */
export const MOS_PARAMETERS: Record<MosParameterName, MosParameterInfo> = {
  VTO: { meaning: 'zero-bias threshold voltage (negative for an enhancement PMOS)', unit: 'V', default: 0 },
  KP: { meaning: 'transconductance parameter µ·Cox', unit: 'A/V²', default: 2e-5 },
  LAMBDA: { meaning: 'channel-length modulation', unit: '1/V', default: 0 },
  GAMMA: { meaning: 'bulk threshold (body-effect) parameter', unit: '√V', default: 0 },
  PHI: { meaning: 'surface potential (twice the Fermi potential)', unit: 'V', default: 0.6 },
};

/** Every parameter of a MOS card at TNOM (27 °C): the card's values over ngspice's defaults; other names are ignored. */
export function resolvedMosParameters(card: MosModelCard): MosParameters {
  const out = Object.fromEntries(MOS_PARAMETER_NAMES.map((name) => [name, MOS_PARAMETERS[name].default])) as MosParameters;
  for (const name of MOS_PARAMETER_NAMES) {
    const given = card[name];
    if (given !== undefined) out[name] = given;
  }
  return out;
}
