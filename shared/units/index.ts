/**
 * The units layer's public surface (the one deliberate barrel): SI prefixes, parsing and
 * formatting quantities at the edges, the figure formatter (dB, %, margins), SPICE numbers and
 * the preferred-number series.
 */
export { SI_PREFIXES, type SiPrefix } from './si-prefixes';
export { UNIT_SYMBOLS, unitSymbolFor, type UnitSymbol } from './unit-symbols';
export { parseQuantity, type ParseQuantityResult } from './parse-quantity';
export { formatQuantity } from './format-quantity';
export { E_SERIES, isOnSeries, seriesTolerance, snapToSeries } from './e-series';
export { formatDb, formatDeviationPercent, formatFigure, formatFixed, formatMargin, formatPercent, formatRatio, formatSignedQuantity, formatSignificant, formatTargetDb, formatTolerance } from './figures';
export { formatSpiceNumber, parseSpiceNumber, readSpiceNumber } from './spice-number';
