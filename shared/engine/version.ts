/** Version of the engine's figures: bump the minor for new fields, the major when a figure changes meaning. */
// 2.0.0: the full Gummel-Poon model and the devices' capacitances; transconductanceS is gm as SPICE
// reports it (VCE held), cmrrCornerHz comes from the whole circuit, saturation from each
// transistor's own gain loss: figures changed meaning, so every record of 1.0.0 says which engine made it.
// 2.1.0: each option's rejectionLimits (what limits the rejection at the spec frequency); the tail
// impedance at the spec frequency with the tail transistors' own capacitances; the rejection curve
// to where the gain has fallen 20 dB (at most 1 GHz).
// 3.0.0: the trade-off figures (input bias and offset currents, offset and drift, linear range,
// supply rejection, input resistance, noise, slew rate), the spec's trade-off targets and the
// tail-current window; the worst corner of every check now searched over the sign-off corners
// (rails, current gain, resistor tempco) as well as input common mode × temperature: figures changed meaning.
// 3.1.0: the ptat tail (its PNP mirror from device.pnp); each transistor's own card brings its own
// RB, RE, RC; the reverse transport current's IS takes the area twice as ngspice's does (a figure
// of a design with an area other than 1, i.e. an IS mismatch, moves by far under its tolerance).
// 3.2.0: the "pnp" device family (a PNP pair and tail fed from the other rail, the NPN stage's
// mirror image); the input common-mode checks' facts name what limits each end of the range.
export const ENGINE_VERSION = '3.2.0';

/** The sentence every output carries: these are estimates. */
export const ESTIMATE_NOTICE =
  'Figures are engineering estimates from the device model given (its SPICE card, or IS, BF and VAF alone) and sizing on preferred values; confirm them by SPICE simulation and bench measurement before committing a design.';
