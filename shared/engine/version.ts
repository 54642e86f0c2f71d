/** Version of the engine's figures: bump the minor for new fields, the major when a figure changes meaning. */
export const ENGINE_VERSION = '1.0.0';

/** The sentence every output carries: these are estimates. */
export const ESTIMATE_NOTICE =
  'Figures are engineering estimates from a simplified device model (IS, BF, VAF) and closed-form sizing; confirm them by SPICE simulation and bench measurement before committing a design.';
