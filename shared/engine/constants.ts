/** Physical and simulator constants. Each carries its source. */

/** Boltzmann constant, J/K, exact since 2019 [SI]. */
export const BOLTZMANN_J_PER_K = 1.380649e-23;
/** Elementary charge, C, exact since 2019 [SI]. */
export const ELEMENTARY_CHARGE_C = 1.602176634e-19;
/** 0 °C in kelvin [SI]. */
export const ZERO_CELSIUS_K = 273.15;
/** SPICE's nominal temperature TNOM, 27 °C, at which model parameters are given [SPICE]. */
export const NOMINAL_TEMPERATURE_C = 27;
/** Energy gap EG used in the IS temperature law, eV (SPICE's default for silicon) [SPICE]. */
export const ENERGY_GAP_EV = 1.11;
/** Saturation-current temperature exponent XTI (SPICE's default) [SPICE]. */
export const IS_TEMPERATURE_EXPONENT = 3;
/** Conductance SPICE places across every pn junction (option GMIN default), S [SPICE]. */
export const GMIN_S = 1e-12;
/** Reverse current gain BR, the SPICE default (the model is reduced to IS, BF, VAF) [SPICE]. */
export const REVERSE_BETA = 1;
/** Collector current at which `vbeOnV` is taken to hold when IS is absent (common practice). */
export const VBE_ON_REFERENCE_CURRENT_A = 1e-3;
/** Default VBE when neither IS nor vbeOnV is given (common practice for small-signal silicon). */
export const DEFAULT_VBE_ON_V = 0.65;
/** Default VCE(sat) (common practice for small-signal silicon at moderate current). */
export const DEFAULT_VCE_SAT_V = 0.2;

/** Thermal voltage kT/q in volts at a temperature in °C [SI]. */
export function thermalVoltageV(temperatureC: number): number {
  return (BOLTZMANN_J_PER_K * (temperatureC + ZERO_CELSIUS_K)) / ELEMENTARY_CHARGE_C;
}
